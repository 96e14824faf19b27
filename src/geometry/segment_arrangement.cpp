// Splitting region edges into a non-crossing set.
#include "geometry/segment_arrangement.h"

#include <algorithm>
#include <cmath>
#include <tuple>

#include "geometry/cross_section.h"
#include "geometry/polygon.h"

namespace edgeflux {

std::vector<Segment> region_segments(const CrossSection& section) {
  std::vector<Segment> segments;
  for (const Region& region : section.regions) {
    const std::size_t n = region.outline.size();
    for (std::size_t i = 0; i < n; ++i) segments.push_back({region.outline[i], region.outline[(i + 1) % n]});
  }
  return segments;
}

std::vector<Segment> segment_arrangement(const std::vector<Segment>& segments, double tolerance) {
  // All end points, merged within the tolerance: every split point snaps to one of these or to a
  // crossing point, so equal points are bit-identical.
  std::vector<Point> vertices;
  auto snap = [&](Point p) {
    for (Point v : vertices)
      if (distance(v, p) <= tolerance) return v;
    vertices.push_back(p);
    return p;
  };
  std::vector<Segment> snapped;
  for (const Segment& s : segments) {
    const Segment t{snap(s.a), snap(s.b)};
    if (distance(t.a, t.b) > tolerance) snapped.push_back(t);
  }
  // Split points per segment: end points of others lying on it, and proper crossings.
  std::vector<std::vector<Point>> cuts(snapped.size());
  for (std::size_t i = 0; i < snapped.size(); ++i) {
    const Segment& s = snapped[i];
    for (Point v : vertices)
      if (distance_to_segment(v, s.a, s.b) <= tolerance && distance(v, s.a) > tolerance && distance(v, s.b) > tolerance)
        cuts[i].push_back(v);
  }
  for (std::size_t i = 0; i < snapped.size(); ++i) {
    for (std::size_t j = i + 1; j < snapped.size(); ++j) {
      const Segment &s = snapped[i], &t = snapped[j];
      if (!segments_intersect(s.a, s.b, t.a, t.b)) continue;
      const Point r = s.b - s.a, q = t.b - t.a;
      if (std::abs(cross(r, q)) <= 1e-12 * norm(r) * norm(q)) continue;  // parallel: handled by end points
      // An axis-parallel edge keeps its exact coordinate at the crossing, so the pieces of a
      // horizontal or vertical edge stay exactly horizontal or vertical.
      Point crossing = intersection_point(s.a, s.b, t.a, t.b);
      for (const Segment* u : {&s, &t}) {
        if (u->a.y == u->b.y) crossing.y = u->a.y;
        if (u->a.x == u->b.x) crossing.x = u->a.x;
      }
      const Point x = snap(crossing);
      for (std::size_t k : {i, j}) {
        const Segment& u = snapped[k];
        if (distance(x, u.a) > tolerance && distance(x, u.b) > tolerance) cuts[k].push_back(x);
      }
    }
  }
  std::vector<Segment> pieces;
  for (std::size_t i = 0; i < snapped.size(); ++i) {
    const Segment& s = snapped[i];
    std::vector<Point> along = cuts[i];
    const Point d = s.b - s.a;
    std::sort(along.begin(), along.end(), [&](Point p, Point q) { return dot(p - s.a, d) < dot(q - s.a, d); });
    Point from = s.a;
    along.push_back(s.b);
    for (Point to : along) {
      if (distance(from, to) <= tolerance) continue;
      // Canonical direction so duplicates compare equal.
      Segment piece = std::tie(from.x, from.y) < std::tie(to.x, to.y) ? Segment{from, to} : Segment{to, from};
      pieces.push_back(piece);
      from = to;
    }
  }
  std::sort(pieces.begin(), pieces.end(), [](const Segment& p, const Segment& q) {
    return std::tie(p.a.x, p.a.y, p.b.x, p.b.y) < std::tie(q.a.x, q.a.y, q.b.x, q.b.y);
  });
  pieces.erase(std::unique(pieces.begin(), pieces.end(),
                           [](const Segment& p, const Segment& q) {
                             return p.a.x == q.a.x && p.a.y == q.a.y && p.b.x == q.b.x && p.b.y == q.b.y;
                           }),
               pieces.end());
  return pieces;
}

}  // namespace edgeflux
