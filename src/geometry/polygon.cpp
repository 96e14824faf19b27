// Polygon and segment predicates used by validation and meshing.
#include "geometry/polygon.h"

#include <algorithm>
#include <cmath>
#include <iterator>
#include <set>

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

Point nearest_on_segment(Point p, Point a, Point b) {
  const Point ab = b - a;
  const double length_sq = dot(ab, ab);
  if (length_sq == 0.0) return a;
  return a + std::clamp(dot(p - a, ab) / length_sq, 0.0, 1.0) * ab;
}

double distance_to_segment(Point p, Point a, Point b) { return distance(p, nearest_on_segment(p, a, b)); }

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

namespace {

/// Edges of a closed outline as left-to-right segments (lexicographic in x, then y), for the sweep.
struct SweepEdge {
  Point left, right;
  int index;  // edge i runs from outline point i to point i+1
};

bool lex_less(Point p, Point q) { return p.x < q.x || (p.x == q.x && p.y < q.y); }

bool are_adjacent(int i, int j, int n) { return std::abs(i - j) == 1 || std::abs(i - j) == n - 1; }

/// Outline edges i and j (adjacent) fold back onto each other: collinear and pointing the same way
/// from their shared point.
bool adjacent_edges_fold(std::span<const Point> outline, int i, int j) {
  const int n = static_cast<int>(outline.size());
  const int first = (j == i + 1) ? i : j;  // the edge that ends at the shared point
  const Point shared = outline[(first + 1) % n];
  const Point u = outline[first] - shared, v = outline[(first + 2) % n] - shared;
  return std::abs(cross(u, v)) <= 1e-14 * norm(u) * norm(v) && dot(u, v) > 0;
}

}  // namespace

std::pair<int, int> first_self_intersection(std::span<const Point> outline) {
  const int n = static_cast<int>(outline.size());
  if (n < 3) return {-1, -1};
  auto ordered = [](int i, int j) { return std::pair<int, int>{std::min(i, j), std::max(i, j)}; };

  // Adjacent edges meet at their shared point by construction; they are bad only when they fold.
  for (int i = 0; i < n; ++i) {
    const Point a = outline[i], b = outline[(i + 1) % n];
    if (a.x == b.x && a.y == b.y) return ordered(i, (i + 1) % n);  // a zero-length edge folds
    if (adjacent_edges_fold(outline, i, (i + 1) % n)) return ordered(i, (i + 1) % n);
  }
  // A point visited twice: the two edges leaving it touch there. The sweep below never holds
  // both at once, so this is found by sorting.
  std::vector<int> by_position(n);
  for (int i = 0; i < n; ++i) by_position[i] = i;
  std::sort(by_position.begin(), by_position.end(), [&](int i, int j) {
    return lex_less(outline[i], outline[j]) || (!lex_less(outline[j], outline[i]) && i < j);
  });
  for (int k = 0; k + 1 < n; ++k) {
    const Point p = outline[by_position[k]], q = outline[by_position[k + 1]];
    if (p.x == q.x && p.y == q.y) return ordered(by_position[k], by_position[k + 1]);
  }

  // Shamos–Hoey sweep, O(n log n): if two edges meet, the leftmost meeting point is reached while
  // they are neighbours in the bottom-to-top order of the edges the sweep line cuts, so each edge
  // is tested only against its neighbours when it enters the order and when a neighbour leaves.
  std::vector<SweepEdge> edges(n);
  for (int i = 0; i < n; ++i) {
    const Point a = outline[i], b = outline[(i + 1) % n];
    edges[i] = lex_less(a, b) ? SweepEdge{a, b, i} : SweepEdge{b, a, i};
  }
  struct Event {
    Point at;
    bool enters;
    int edge;
  };
  std::vector<Event> events;
  events.reserve(2 * n);
  for (int i = 0; i < n; ++i) events.push_back({edges[i].left, true, i}), events.push_back({edges[i].right, false, i});
  // At one point, edges leave before others enter: two edges that only pass through a shared
  // outline point (end of one, start of the next) are then never compared.
  std::sort(events.begin(), events.end(), [](const Event& p, const Event& q) {
    if (lex_less(p.at, q.at)) return true;
    if (lex_less(q.at, p.at)) return false;
    if (p.enters != q.enters) return !p.enters;
    return p.edge < q.edge;
  });

  std::pair<int, int> found{-1, -1};
  // Order of the edges cut by the sweep line, bottom to top. The set only ever compares the entering
  // edge with edges already in it; the entering one starts at the sweep point, which lies within
  // the x-range of every edge in the set. A start point on another edge is itself a meeting point.
  auto below = [&](int i, int j) {
    const SweepEdge &e = edges[i], &f = edges[j];
    const bool f_later = lex_less(e.left, f.left);
    const SweepEdge& old = f_later ? e : f;
    const SweepEdge& young = f_later ? f : e;
    int side = orientation(old.left, old.right, young.left);
    if (side == 0) {
      if (!are_adjacent(i, j, n) && found.first < 0) found = ordered(i, j);
      side = orientation(old.left, old.right, young.right);  // same start: order by direction
      if (side == 0) {
        if (found.first < 0) found = ordered(i, j);  // collinear and overlapping
        return i < j;
      }
    }
    // side > 0: the young edge lies above the old one.
    return f_later ? side > 0 : side < 0;
  };
  std::set<int, decltype(below)> cut(below);
  std::vector<std::set<int, decltype(below)>::iterator> where(n, cut.end());
  auto meet = [&](int i, int j) {
    if (found.first >= 0 || are_adjacent(i, j, n)) return;
    if (segments_intersect(edges[i].left, edges[i].right, edges[j].left, edges[j].right)) found = ordered(i, j);
  };
  for (const Event& ev : events) {
    if (ev.enters) {
      const auto [it, inserted] = cut.insert(ev.edge);
      if (found.first >= 0) return found;
      if (!inserted) return ordered(ev.edge, *it);
      where[ev.edge] = it;
      if (it != cut.begin()) meet(*std::prev(it), ev.edge);
      if (std::next(it) != cut.end()) meet(ev.edge, *std::next(it));
    } else {
      const auto it = where[ev.edge];
      if (it != cut.begin() && std::next(it) != cut.end()) meet(*std::prev(it), *std::next(it));
      cut.erase(it);
    }
    if (found.first >= 0) return found;
  }
  return {-1, -1};
}

Point intersection_point(Point a, Point b, Point c, Point d) {
  const Point r = b - a, s = d - c;
  const double t = cross(c - a, s) / cross(r, s);
  return a + t * r;
}

}  // namespace edgeflux
