// Steady conduction: node temperatures for every load case, from one factorisation per set of
// surface resistances; the conduction matrix and the symbolic analysis are shared between sets.
#pragma once

#include <memory>

#include "solver/thermal_problem.h"

namespace edgeflux {

/// The conduction matrix of one mesh, assembled once, solved for one or more sets of surface
/// resistances (the heat-loss and the surface-temperature run): (K + R) T = r for each load case,
/// K the conduction matrix, R the surface-resistance (Robin) terms, fixed-temperature nodes
/// eliminated. Numerical failure is reported in SolveInfo, not thrown.
class SteadyConduction {
 public:
  SteadyConduction(const TriMesh& mesh, const std::vector<double>& triangle_conductivity, SolveOptions options = {});
  ~SteadyConduction();
  SteadyConduction(const SteadyConduction&) = delete;
  SteadyConduction& operator=(const SteadyConduction&) = delete;

  /// New conductivities on the same mesh (a variant of the section with other materials): the
  /// matrix is assembled again into the same pattern, so the symbolic analysis is kept.
  void set_conductivity(const std::vector<double>& triangle_conductivity);

  /// Temperatures for each load case with these surface resistances (one per surface, 0 = fixed).
  Solution solve(const std::vector<double>& surface_resistance, const std::vector<LoadCase>& load_cases);

  /// Responses to heat sources at the nodes (W/m per node) with every environment at 0 °C and
  /// fixed-temperature nodes held at 0: z = (K + R)⁻¹ s. With the resistances of the last solve its
  /// factorisation is used again (an adjoint solve costs one forward and back substitution).
  /// Throws std::runtime_error when the system cannot be solved.
  std::vector<std::vector<double>> solve_sources(const std::vector<double>& surface_resistance,
                                                 const std::vector<std::vector<double>>& nodal_sources);

 private:
  struct State;
  std::unique_ptr<State> state_;
};

/// One-off convenience: assemble, factorise and solve.
Solution solve_temperatures(const TriMesh& mesh, const ThermalProblem& problem, const std::vector<LoadCase>& load_cases,
                            const SolveOptions& options = {});

/// For each node, the fixed-temperature surfaces it lies on (empty for most nodes).
std::vector<std::vector<int>> fixed_surfaces_per_node(const TriMesh& mesh, const std::vector<double>& surface_resistance);

}  // namespace edgeflux
