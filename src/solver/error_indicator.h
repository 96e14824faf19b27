// A-posteriori error indicator for the finite-volume field: where the computed heat flux jumps.
#pragma once

#include <vector>

#include "solver/thermal_problem.h"

namespace edgeflux {

/// Per triangle, η_T² = Σ over its edges of (|e| / 2) · |e| · J_e², with J_e the jump of the normal
/// heat flux λ ∂θ/∂n across an interior edge (shared half and half by its two triangles), or the
/// residual λ ∂θ/∂n − (θenv − θ)/Rs on a surface edge. The exact field has continuous normal flux,
/// so large jumps mark where the mesh is too coarse (the classical residual estimator for P1).
/// Units: (W/m)², #T entries.
std::vector<double> flux_jump_indicator(const TriMesh& mesh, const ThermalProblem& problem,
                                        const std::vector<double>& temperature, const LoadCase& load);

/// Heat-flux density q = −λ∇θ in each triangle, W/m², #T entries.
std::vector<Point> triangle_heat_flux(const TriMesh& mesh, const std::vector<double>& conductivity,
                                      const std::vector<double>& temperature);

}  // namespace edgeflux
