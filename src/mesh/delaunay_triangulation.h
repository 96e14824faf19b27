// The graded constrained Delaunay triangulation of a section's planar subdivision (CGAL inside).
#pragma once

#include "geometry/cross_section.h"
#include "geometry/planar_subdivision.h"
#include "mesh/mesh_cross_section.h"
#include "mesh/raw_triangulation.h"

namespace edgeflux {

/// A constrained Delaunay triangulation of the subdivision's edges, refined to the size field and
/// the angle bound of the options; painted from the subdivision's face seeds.
RawTriangulation delaunay_triangulation(const CrossSection& section, const PlanarSubdivision& subdivision,
                                        const MeshOptions& options);

}  // namespace edgeflux
