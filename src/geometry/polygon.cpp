// Polygon and segment predicates used by validation and meshing.
#include "geometry/polygon.h"

#include <algorithm>
#include <cmath>

namespace edgeflux {

double signed_area(std::span<const Point> outline) {
  double twice_area = 0.0;
  const std::size_t n = outline.size();
  for (std::size_t i = 0; i < n; ++i) twice_area += cross(outline[i], outline[(i + 1) % n]);
  return 0.5 * twice_area;
}

bool contains(std::span<const Point> outline, Point p) {
  bool inside = false;
  const std::size_t n = outline.size();
  for (std::size_t i = 0, j = n - 1; i < n; j = i++) {
    const Point a = outline[i], b = outline[j];
    if ((a.y > p.y) != (b.y > p.y)) {
      const double x_cross = a.x + (p.y - a.y) * (b.x - a.x) / (b.y - a.y);
      if (p.x < x_cross) inside = !inside;
    }
  }
  return inside;
}

double distance_to_segment(Point p, Point a, Point b) {
  const Point ab = b - a;
  const double length_sq = dot(ab, ab);
  if (length_sq == 0.0) return distance(p, a);
  const double t = std::clamp(dot(p - a, ab) / length_sq, 0.0, 1.0);
  return distance(p, a + t * ab);
}

namespace {
int orientation(Point a, Point b, Point c) {
  const double v = cross(b - a, c - a);
  const double scale = std::max({std::abs(b.x - a.x), std::abs(b.y - a.y), std::abs(c.x - a.x),
                                 std::abs(c.y - a.y)});
  const double eps = 1e-14 * scale * scale;
  return v > eps ? 1 : (v < -eps ? -1 : 0);
}
bool on_segment(Point a, Point b, Point p) {
  return std::min(a.x, b.x) <= p.x && p.x <= std::max(a.x, b.x) && std::min(a.y, b.y) <= p.y &&
         p.y <= std::max(a.y, b.y);
}
}  // namespace

bool segments_intersect(Point a, Point b, Point c, Point d) {
  const int o1 = orientation(a, b, c), o2 = orientation(a, b, d);
  const int o3 = orientation(c, d, a), o4 = orientation(c, d, b);
  if (o1 != o2 && o3 != o4) return true;
  if (o1 == 0 && on_segment(a, b, c)) return true;
  if (o2 == 0 && on_segment(a, b, d)) return true;
  if (o3 == 0 && on_segment(c, d, a)) return true;
  if (o4 == 0 && on_segment(c, d, b)) return true;
  return false;
}

std::pair<int, int> first_self_intersection(std::span<const Point> outline) {
  const int n = static_cast<int>(outline.size());
  for (int i = 0; i < n; ++i) {
    const Point a = outline[i], b = outline[(i + 1) % n];
    for (int j = i + 1; j < n; ++j) {
      const bool adjacent = (j == i + 1) || (i == 0 && j == n - 1);
      const Point c = outline[j], d = outline[(j + 1) % n];
      if (adjacent) {
        // Adjacent edges share one point; they are bad only when they fold back onto each other.
        const Point shared = (j == i + 1) ? b : a;
        const Point u = ((j == i + 1) ? a : b) - shared, v = ((j == i + 1) ? d : c) - shared;
        if (std::abs(cross(u, v)) <= 1e-14 * norm(u) * norm(v) && dot(u, v) > 0) return {i, j};
        continue;
      }
      if (segments_intersect(a, b, c, d)) return {i, j};
    }
  }
  return {-1, -1};
}

Point intersection_point(Point a, Point b, Point c, Point d) {
  const Point r = b - a, s = d - c;
  const double t = cross(c - a, s) / cross(r, s);
  return a + t * r;
}

}  // namespace edgeflux
