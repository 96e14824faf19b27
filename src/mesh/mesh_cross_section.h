// One call from a cross-section to its mesh: picks the mesher, paints materials, tags surfaces.
#pragma once

#include "geometry/cross_section.h"
#include "mesh/tri_mesh.h"

namespace edgeflux {

struct MeshOptions {
  MeshSettings::Mesher mesher = MeshSettings::Mesher::automatic;
  double density = 1.0;  ///< > 0; 2 roughly doubles the elements along every length
};

/// Meshes the section. Throws InputError for an area enclosed by the model but covered by no
/// region, and for a surface path that does not lie on the outer boundary.
/// Deterministic: the same section and options give the same mesh.
TriMesh mesh_cross_section(const CrossSection& section, const MeshOptions& options);

/// True when every region edge and surface segment is parallel to an axis, so the structured
/// right-triangle grid (the five-point finite-difference stencil) can represent the section exactly.
bool is_rectilinear(const CrossSection& section);

}  // namespace edgeflux
