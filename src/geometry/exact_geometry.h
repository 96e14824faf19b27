// Exact computational geometry on the resolution grid: iterated snap rounding, box overlaps and the
// constrained Delaunay triangulation of non-crossing segments. Plain data in and out; the only place
// in geometry/ that includes CGAL.
#pragma once

#include <array>
#include <cmath>
#include <utility>
#include <vector>

#include "geometry/resolution_grid.h"

namespace edgeflux {

/// The grid point whose pixel (the unit square centred on it, half-open) contains p; p in grid steps.
inline GridPoint grid_point(Point p) {
  return {static_cast<std::int64_t>(std::floor(p.x + 0.5)), static_cast<std::int64_t>(std::floor(p.y + 0.5))};
}

/// Iterated snap rounding (Hobby's snap rounding, iterated after Halperin and Packer) of segments
/// given in grid steps. A pixel is hot when it holds an end point of any segment, a point of
/// `hot_points` or a crossing; every segment becomes the polyline through the centres of the hot
/// pixels it passes, repeated until no piece passes a hot pixel it does not end in. Segments that
/// run along each other pass the same pixels and so become the same pieces. Afterwards no two
/// pieces cross or overlap partly, and none passes within half a step of a point it does not end at.
/// Returns one polyline per segment, in input order (a single point when the segment lies in one
/// pixel). Deterministic.
std::vector<std::vector<GridPoint>> snap_rounded(const std::vector<std::array<Point, 2>>& segments,
                                                 const std::vector<Point>& hot_points);

/// An axis-parallel box, closed.
struct Box {
  double x_min, y_min, x_max, y_max;
};

/// All pairs (i, j) with box a[i] and box b[j] overlapping (touching counts). O((n + k) log² n)
/// for n boxes and k pairs.
std::vector<std::pair<int, int>> overlapping_boxes(const std::vector<Box>& a, const std::vector<Box>& b);

/// All pairs (i, j), i < j, of overlapping boxes of one set.
std::vector<std::pair<int, int>> overlapping_boxes(const std::vector<Box>& boxes);

/// A triangulation whose triangles never cross a given segment, with its adjacency.
struct SegmentTriangulation {
  std::vector<std::array<int, 3>> triangles;  ///< #T, point indices, counter-clockwise
  /// #T: the triangle across side k (from triangles[t][k] to triangles[t][(k + 1) % 3]), -1 on the
  /// convex hull.
  std::vector<std::array<int, 3>> neighbour;
  /// #T: the segment along side k, or -1.
  std::vector<std::array<int, 3>> segment;
  /// Per query point: the triangle containing it (on a side: either triangle), -1 outside the hull.
  std::vector<int> located;
};

/// Constrained Delaunay triangulation of distinct grid points and of segments between them (indices
/// into `points`) that neither cross nor pass through another point. O(n log n) expected.
/// Throws std::logic_error when a segment is found split by a point (the precondition broken).
SegmentTriangulation segment_triangulation(const std::vector<GridPoint>& points,
                                           const std::vector<std::array<int, 2>>& segments,
                                           const std::vector<Point>& queries);

}  // namespace edgeflux
