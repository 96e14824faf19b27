// One call from a cross-section to its mesh: picks the mesher, paints materials, tags surfaces.
#pragma once

#include "geometry/cross_section.h"
#include "mesh/tri_mesh.h"

namespace edgeflux {

struct MeshOptions {
  MeshSettings::Mesher mesher = MeshSettings::Mesher::automatic;
  double density = 1.0;  ///< > 0; 2 roughly doubles the elements along every length
  std::size_t max_nodes = 2'000'000;  ///< the mesher stops with an InputError beyond this
};

/// Meshes the section. Throws InputError for an area enclosed by the model but covered by no
/// region, and for a surface path that does not lie on the outer boundary.
/// Deterministic: the same section and options give the same mesh.
TriMesh mesh_cross_section(const CrossSection& section, const MeshOptions& options);

/// A finer mesh of the same section: every edge of a marked triangle is halved (its midpoint
/// becomes a node), then the triangulation is rebuilt through all nodes and repaired for shape.
/// `marked` has one entry per triangle of `previous`. Delaunay meshes only.
TriMesh refine_mesh(const CrossSection& section, const TriMesh& previous, const std::vector<char>& marked,
                    std::size_t max_nodes = 2'000'000);

/// Uniform refinement: every triangle split into four through its edge midpoints. Keeps angles,
/// grading, regions and surface tags; O(n), for very fine meshes.
TriMesh subdivide_mesh(const TriMesh& mesh);

/// True when every region edge and surface segment is parallel to an axis, so the structured
/// right-triangle grid (the five-point finite-difference stencil) can represent the section exactly.
bool is_rectilinear(const CrossSection& section);

}  // namespace edgeflux
