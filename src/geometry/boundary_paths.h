// Surface paths and cut-offs laid along the outline of the subdivision.
#pragma once

#include <array>
#include <vector>

#include "geometry/cross_section.h"
#include "geometry/planar_subdivision.h"

namespace edgeflux {

/// The points of surface paths and cut-offs after snapping, in local grid steps.
struct SnappedMarks {
  std::vector<std::vector<GridPoint>> paths;       ///< per surface, its path points
  std::vector<std::array<GridPoint, 2>> cut_offs;  ///< per flanking element, the cut-off's ends
};

/// Gives every boundary edge the surface whose path runs along it, and the flanking element whose
/// cut-off runs along it. A path segment from P to Q takes the outline's own way from P to Q: the
/// chain of boundary edges whose corners all lie within 0.02 mm of the straight line PQ, so a path
/// may run along a sloped or rounded-off edge and may pass outline corners it does not name.
/// Throws InputError naming the surface (or element), the segment and the point where the outline
/// leaves it, or the two surfaces that claim one edge, or a cut-off along a surface.
void lay_boundary_paths(const CrossSection& section, const SnappedMarks& marks, PlanarSubdivision& subdivision);

}  // namespace edgeflux
