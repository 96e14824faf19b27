// The section as a planar subdivision on the resolution grid: the edges where the material changes
// or the section ends, which region paints each side, and which surface or cut-off lies along each
// boundary edge. The mesher takes its constraints from here and nothing else.
#pragma once

#include <string>
#include <vector>

#include "geometry/cross_section.h"
#include "geometry/resolution_grid.h"

namespace edgeflux {

/// An edge of the subdivision, between two vertices.
struct SubdivisionEdge {
  int a = 0, b = 0;           ///< vertex indices
  int left = -1, right = -1;  ///< region painting each side, looking from a to b; -1 = outside the section
  int surface = -1;           ///< index into CrossSection::surfaces, boundary edges only
  int cut_off = -1;           ///< index into CrossSection::flanking_elements whose cut-off runs here
};

/// A point strictly inside a painted face, in local grid steps, and the region painting it.
struct FaceSeed {
  Point at;
  int region = -1;
  double room = 0.0;  ///< twice the area of the triangle it is the centroid of (grid steps²): larger, better for a label
};

/// All coordinates are local grid steps: grid point `origin` is (0, 0). Local coordinates are
/// small integers, so midpoints of edges, halved again and again, stay exact in doubles and on
/// their edge.
struct PlanarSubdivision {
  GridPoint origin;                     ///< absolute grid index of the local origin
  std::vector<GridPoint> vertices;      ///< #V, local grid steps
  std::vector<SubdivisionEdge> edges;   ///< edges with different regions on their two sides; none cross
  std::vector<FaceSeed> seeds;          ///< at least one in every painted face
  std::vector<GridPoint> probes;        ///< per CrossSection::probes entry, its position on the grid
  std::vector<std::string> warnings;    ///< likely drawing slips found on the way (with coordinates)

  /// Metres of a local grid position.
  Point metres(Point local) const {
    return {(static_cast<double>(origin.x) + local.x) / grid_steps_per_metre,
            (static_cast<double>(origin.y) + local.y) / grid_steps_per_metre};
  }
  Point metres(GridPoint local) const { return {grid_to_metres(origin.x + local.x), grid_to_metres(origin.y + local.y)}; }
};

/// Builds the subdivision of a validated section: points within 0.01 mm of an edge they do not end
/// on are moved onto it, every point is rounded to the grid, crossings and near contacts are
/// resolved by iterated snap rounding, and each face takes the last region (in file order) whose
/// outline encloses it. Surface paths and cut-offs are laid along the outline. Throws InputError for
/// what a drawing gets wrong: an enclosed area no region covers, parts that touch only at a point,
/// a part connected to no surface, a surface path or cut-off that does not follow the outline, a
/// probe outside the section. O(n log n) in the number of points. With `for_solving` false (a
/// drawing being imported: no surfaces yet) paths, cut-offs, probes and the check that heat can
/// flow through every part are left out.
PlanarSubdivision planar_subdivision(const CrossSection& section, bool for_solving = true);

}  // namespace edgeflux
