// Small exact-enough predicates on polygons and segments, in metres.
#pragma once

#include <span>
#include <vector>

#include "core/point.h"

namespace edgeflux {

/// Signed area, m²: positive when the outline runs counter-clockwise.
double signed_area(std::span<const Point> outline);

/// True when p lies strictly inside or on the boundary is undefined; callers test points that
/// are not on any edge (cell and triangle centroids). Even-odd rule.
bool contains(std::span<const Point> outline, Point p);

/// Distance from p to the segment ab, m.
double distance_to_segment(Point p, Point a, Point b);

/// The point of the segment ab nearest to p.
Point nearest_on_segment(Point p, Point a, Point b);

/// True when the closed segments ab and cd share a point.
bool segments_intersect(Point a, Point b, Point c, Point d);

/// Indices (i, j), i < j, of a pair of edges of a closed outline that touch or cross, or {-1, -1}
/// when the outline is simple. Edge i runs from point i to point i+1 (cyclic). Adjacent edges count
/// only when they fold back onto each other (or one has zero length). Found by a sweep in
/// O(n log n): the pair is the first one met from the left (smallest x, then y), not the first in
/// index order.
std::pair<int, int> first_self_intersection(std::span<const Point> outline);

/// The point where segments ab and cd cross (assumes they do and are not parallel).
Point intersection_point(Point a, Point b, Point c, Point d);

}  // namespace edgeflux
