// The structured right-triangle grid of a rectilinear section (the five-point stencil).
#pragma once

#include "geometry/cross_section.h"
#include "geometry/planar_subdivision.h"
#include "mesh/mesh_cross_section.h"
#include "mesh/raw_triangulation.h"

namespace edgeflux {

/// Right triangles on the grid lines of every distinct coordinate, subdivided to the sizes the
/// options ask for; needs is_rectilinear(section).
RawTriangulation grid_triangulation(const CrossSection& section, const PlanarSubdivision& subdivision,
                                    const MeshOptions& options);

}  // namespace edgeflux
