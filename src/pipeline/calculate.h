// The whole calculation for one cross-section: one mesh, the heat-loss run and the
// surface-temperature run, and the junction's numbers read off both.
#pragma once

#include <functional>
#include <memory>
#include <optional>
#include <string>
#include <vector>

#include "geometry/cross_section.h"
#include "mesh/mesh_cross_section.h"
#include "results/convergence.h"
#include "results/field_results.h"
#include "results/junction_results.h"
#include "results/calculation.h"
#include "results/run.h"
#include "solver/solve_temperatures.h"
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
  /// In a batch (sweep, comparison, project): a variant whose geometry matches an earlier one's is
  /// solved on that one's meshes (calculate_on_ladder) instead of meshing and refining its own.
  bool reuse_meshes = true;
  /// Also the first-order sensitivities of the final level (results/sensitivity.h): one adjoint
  /// solve with the surface-temperature run's factorisation, and integrals over the fields.
  bool sensitivities = false;
};

/// The meshes one calculation refined through, level by level, and what the geometry stage found.
/// A variant of the section that differs only in its materials' conductivities (same_geometry) can
/// be solved on them: no meshing, no refinement, the symbolic factorisation kept.
struct MeshLadder {
  std::vector<TriMesh> levels;
  std::vector<std::string> geometry_warnings;      ///< the planar subdivision's warnings
  std::optional<Point> fixed_temperature_jump;     ///< two fixed temperatures meeting, if any
};

/// Solves variants on one ladder, keeping each level's matrix pattern and symbolic factorisation
/// between them. Not shared between threads: one per worker.
class LadderSolver {
 public:
  LadderSolver(std::shared_ptr<const MeshLadder> ladder, SolveOptions options);
  const MeshLadder& ladder() const { return *ladder_; }
  /// The conduction of level `level` with these conductivities (same pattern, analysis kept).
  SteadyConduction& conduction(std::size_t level, const std::vector<double>& triangle_conductivity);

 private:
  std::shared_ptr<const MeshLadder> ladder_;
  SolveOptions options_;
  std::vector<std::unique_ptr<SteadyConduction>> conduction_;
};

/// Solves both runs on a given mesh and reads off all results (no convergence data); with
/// `conduction` (already holding this mesh's conductivities) its factorisation is reused.
Calculation calculate_on_mesh(const CrossSection& section, TriMesh mesh, const CalculationOptions& options,
                              SteadyConduction* conduction = nullptr);

/// Runs both calculations, refining the mesh until the target accuracy is met (or once on a
/// fixed mesh). Throws InputError for problems in the section; a numerical failure is
/// thrown as std::runtime_error with the solver's message. With `record`, the meshes of every
/// level are kept there for variants.
Calculation calculate(const CrossSection& section, const CalculationOptions& options, MeshLadder* record = nullptr);

/// The same calculation for a variant of the section the ladder was made for (same geometry, other
/// conductivities): the levels are the ladder's meshes, each solved with the variant's own
/// conductivities, so the errors are estimated from the variant's own values level by level; when
/// the ladder ends before the target is met, the refinement goes on from its last mesh with the
/// variant's own error indicator.
Calculation calculate_on_ladder(const CrossSection& section, const CalculationOptions& options, LadderSolver& solver);

/// The chord tolerance for circles and arcs (relative to the radius) that suits an accuracy target:
/// a tenth of the relative accuracy asked of L2D, so faceting stays well inside the target.
inline double arc_tolerance_for(const AccuracyTarget& target) { return 0.1 * target.coupling_relative; }

/// Conductivity per triangle from the material of each triangle.
std::vector<double> triangle_conductivities(const CrossSection& section, const TriMesh& mesh);

}  // namespace edgeflux
