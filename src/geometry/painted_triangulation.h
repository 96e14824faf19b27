// The triangulation of the snapped segments with every face painted: the working data of the
// geometry stage, shared by the steps that build the subdivision and check its topology.
#pragma once

#include <vector>

#include "geometry/exact_geometry.h"
#include "geometry/resolution_grid.h"

namespace edgeflux {

/// Triangles of the constrained triangulation grouped into faces (triangles joined across sides
/// that are no segment), each face painted by the region that owns it.
struct PaintedTriangulation {
  std::vector<GridPoint> points;       ///< #P, local grid steps
  std::vector<std::array<int, 2>> segments;  ///< snapped pieces of region outlines (point indices)
  SegmentTriangulation triangulation;
  std::vector<int> face;               ///< #T, the face each triangle belongs to
  std::vector<int> owner;              ///< per face: the region painting it, -1 = none
  std::vector<char> unbounded;         ///< per face: reaches the convex hull without crossing a segment

  int n_faces() const { return static_cast<int>(owner.size()); }
  /// Region on side k of triangle t's neighbour (or -1 beyond the hull).
  int owner_across(int t, int k) const {
    const int u = triangulation.neighbour[t][k];
    return u < 0 ? -1 : owner[face[u]];
  }
};

}  // namespace edgeflux
