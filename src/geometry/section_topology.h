// What a drawing gets wrong topologically: uncovered enclosed areas, parts touching at a point,
// parts connected to nothing, slots open to the outside, regions that vanish.
#pragma once

#include <array>
#include <vector>

#include "geometry/cross_section.h"
#include "geometry/painted_triangulation.h"
#include "geometry/planar_subdivision.h"

namespace edgeflux {

/// Throws InputError when an area enclosed by the section is covered by no region (it would be an
/// adiabatic hole the user did not draw), naming its extent.
void check_enclosed_gaps(const CrossSection& section, const PlanarSubdivision& subdivision,
                         const PaintedTriangulation& painted);

/// Throws InputError when painted parts touch only at a point: the heat passing through a contact
/// of zero width depends on the mesh, not on the construction.
void check_point_contacts(const CrossSection& section, const PlanarSubdivision& subdivision,
                          const PaintedTriangulation& painted);

/// Throws InputError for a region outline that collapses at the grid's resolution; warns about a
/// region that later regions paint over entirely.
void check_region_visibility(const CrossSection& section, PlanarSubdivision& subdivision,
                             const std::vector<char>& owns_area, const std::vector<char>& is_member);

/// Throws InputError for a part of the section (regions joined along edges) that no surface
/// touches: its temperature would be undefined; and when no part joins environments at different
/// temperatures: no heat flows. Warns when the section falls into several parts that each touch a
/// surface. `edge_triangles` gives, per subdivision edge, the triangle on its
/// left and on its right (-1 beyond the hull).
void check_separate_parts(const CrossSection& section, PlanarSubdivision& subdivision,
                          const PaintedTriangulation& painted, const std::vector<std::array<int, 2>>& edge_triangles);

/// Warns about narrow slots (facing boundary edges less than 3 mm apart across the outside):
/// modelled as adiabatic, a gap drawn by mistake changes the heat flow without a word.
void warn_narrow_slots(const CrossSection& section, PlanarSubdivision& subdivision);

}  // namespace edgeflux
