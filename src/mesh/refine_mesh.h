// Finer meshes of the same section: adaptive longest-edge bisection of marked triangles, and
// uniform subdivision into four.
#pragma once

#include <cstddef>
#include <vector>

#include "geometry/cross_section.h"
#include "mesh/mesh_cross_section.h"
#include "mesh/tri_mesh.h"

namespace edgeflux {

/// A finer mesh of the same section: every edge of a marked triangle is halved (its midpoint
/// becomes a node), and neighbours are bisected across their longest edges until the mesh is
/// conforming again (longest-edge bisection: angles stay at least half the starting mesh's); edge
/// flips inside each region then restore the Delaunay property.
/// `marked` has one entry per triangle of `previous`. Throws MeshLimitError past `max_nodes`.
TriMesh refine_mesh(const CrossSection& section, const TriMesh& previous, const std::vector<char>& marked,
                    std::size_t max_nodes = node_limit);

/// Uniform refinement: every triangle split into four through its edge midpoints. Keeps angles,
/// grading, regions and surface tags; O(n), for very fine meshes.
TriMesh subdivide_mesh(const TriMesh& mesh);

}  // namespace edgeflux
