// The whole calculation for one cross-section: one mesh, the heat-loss run and the
// surface-temperature run, and the junction's numbers read off both.
#pragma once

#include <functional>
#include <string>

#include "geometry/cross_section.h"
#include "mesh/mesh_cross_section.h"
#include "results/convergence.h"
#include "results/field_results.h"
#include "results/junction_results.h"
#include "results/calculation.h"
#include "results/run.h"
#include "solver/thermal_problem.h"

namespace edgeflux {

struct CalculationOptions {
  std::optional<double> density;                        ///< overrides the file's <mesh density>
  std::optional<MeshSettings::Mesher> mesher;           ///< overrides the file's <mesh mesher>
  SolveOptions solve;
  /// Refine adaptively until every reported quantity meets `target` (default); when false, solve
  /// once on the mesh of the given density.
  bool adaptive = true;
  AccuracyTarget target;
  int max_levels = 14;
  int max_nodes = static_cast<int>(node_limit);  ///< refinement stops before exceeding it
  std::function<void(const std::string&)> progress;     ///< told of each stage, may be empty
};

/// Solves both runs on a given mesh and reads off all results (no convergence data).
Calculation calculate_on_mesh(const CrossSection& section, TriMesh mesh, const CalculationOptions& options);

/// Runs both calculations, refining the mesh until the target accuracy is met (or once on a
/// fixed mesh). Throws InputError for problems in the section; a numerical failure is
/// thrown as std::runtime_error with the solver's message.
Calculation calculate(const CrossSection& section, const CalculationOptions& options);

/// The chord tolerance for circles and arcs (relative to the radius) that suits an accuracy target:
/// a tenth of the relative accuracy asked of L2D, so faceting stays well inside the target.
inline double arc_tolerance_for(const AccuracyTarget& target) { return 0.1 * target.coupling_relative; }

/// Conductivity per triangle from the material of each triangle.
std::vector<double> triangle_conductivities(const CrossSection& section, const TriMesh& mesh);

}  // namespace edgeflux
