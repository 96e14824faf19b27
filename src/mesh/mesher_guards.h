// What keeps the mesher from running away: the sharpest corners of a section, refusing tips no
// mesh can fill, the refinement budget, and the node estimate checked before refinement starts.
// Each failure is a MeshLimitError naming the place and the fix.
#pragma once

#include <cstddef>
#include <string>
#include <vector>

#include "geometry/cross_section.h"
#include "geometry/planar_subdivision.h"
#include "mesh/mesh_cross_section.h"
#include "mesh/size_field.h"

namespace edgeflux {

/// The angles at which the subdivision's edges meet.
struct SharpAngles {
  double smallest = 180.0;  ///< degrees
  Point where{};            ///< local grid steps
  /// Extra nodes that sharp angles cost: inside a wedge of angle α the well-shaped elements at
  /// distance r from the tip are about r·α large, so the wedge takes about ln(L/r₀)/α of them.
  /// Measured on a 5 m taper: 12/α (α in radians) for α of 0.06–0.3°.
  double wedge_nodes = 0.0;
};

/// The smallest angle at which the subdivision's edges meet, and the nodes sharp wedges cost.
SharpAngles sharp_angles(const PlanarSubdivision& sub);

/// Throws MeshLimitError("file: mesh: problem. Fix: fix").
[[noreturn]] void throw_mesh_limit(const CrossSection& section, const std::string& problem, const std::string& fix);

/// Refuses a section whose region edges meet at less than 0.05°, before meshing.
void reject_unmeshable_angle(const CrossSection& section, const PlanarSubdivision& sub, const SharpAngles& sharp);

/// How far refinement may go: the node limit, and a budget of a few times what the element sizes
/// ask for. Delaunay refinement always terminates, but it can cascade (many sharp corners, or
/// corners that the estimate misjudges); the budget ends that after seconds instead of minutes.
struct RefinementBudget {
  std::size_t max_vertices;   ///< the documented node limit
  std::size_t budget;         ///< ≤ max_vertices
  double expected;            ///< what the sizes ask for
};

/// The budget for a mesh expected to have `expected` nodes under the node limit `max_vertices`.
RefinementBudget make_budget(double expected, std::size_t max_vertices);

/// "the smallest angle between region edges is … at …", for messages.
std::string smallest_angle_text(const CrossSection& section, const PlanarSubdivision& sub, const SharpAngles& sharp);

/// Fails at once when the element sizes and sharp corners together ask for more nodes than the
/// limit, naming the feature that asks for the smallest elements.
void check_node_estimate(const CrossSection& section, const PlanarSubdivision& sub, double size_nodes,
                         const SharpAngles& sharp, double extent, const std::vector<SizeSeed>& seeds,
                         std::size_t max_vertices);

}  // namespace edgeflux
