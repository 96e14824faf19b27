#include "geometry/outline_runs.h"

#include <algorithm>
#include <cmath>
#include <numbers>
#include <unordered_map>

namespace edgeflux {

namespace {

struct Directed {
  int from = 0, to = 0;
  int region = -1;  ///< the region on its left
};

std::int64_t cross_steps(GridPoint a, GridPoint b, GridPoint c) {
  return (b.x - a.x) * (c.y - a.y) - (b.y - a.y) * (c.x - a.x);
}

/// Douglas–Peucker: keeps the ends and every point farther than `tolerance` from the simplified line.
void simplify(std::vector<Point>& points, std::size_t first, std::size_t last, double tolerance, std::vector<char>& keep) {
  if (last <= first + 1) return;
  const Point a = points[first], b = points[last];
  const double length = distance(a, b);
  double worst = -1.0;
  std::size_t at = first;
  for (std::size_t i = first + 1; i < last; ++i) {
    const double d = length > 0 ? std::abs(cross(b - a, points[i] - a)) / length : distance(points[i], a);
    if (d > worst) worst = d, at = i;
  }
  if (worst <= tolerance) return;
  keep[at] = 1;
  simplify(points, first, at, tolerance, keep);
  simplify(points, at, last, tolerance, keep);
}

}  // namespace

std::vector<OutlineRun> outline_runs(const PlanarSubdivision& sub, double corner_degrees) {
  // Boundary edges turned so that the section lies on their left; every boundary vertex then has
  // one edge out (the subdivision refuses parts that touch at a single point).
  std::vector<Directed> edges;
  for (const SubdivisionEdge& e : sub.edges) {
    if (e.left >= 0 && e.right >= 0) continue;
    if (e.left >= 0) edges.push_back({e.a, e.b, e.left});
    else edges.push_back({e.b, e.a, e.right});
  }
  std::unordered_map<int, int> out_of;
  for (int k = 0; k < static_cast<int>(edges.size()); ++k) out_of[edges[k].from] = k;

  auto direction = [&](const Directed& e) {
    const GridPoint a = sub.vertices[e.from], b = sub.vertices[e.to];
    return std::atan2(static_cast<double>(b.y - a.y), static_cast<double>(b.x - a.x));
  };
  auto turn = [&](const Directed& in, const Directed& out) {  // degrees, 0 = straight on
    double t = direction(out) - direction(in);
    while (t > std::numbers::pi) t -= 2 * std::numbers::pi;
    while (t < -std::numbers::pi) t += 2 * std::numbers::pi;
    return std::abs(t) * 180.0 / std::numbers::pi;
  };

  // Loops, each starting at its lowest-left vertex; loops ordered by that vertex.
  std::vector<char> used(edges.size(), 0);
  std::vector<std::vector<int>> loops;
  for (int k = 0; k < static_cast<int>(edges.size()); ++k) {
    if (used[k]) continue;
    std::vector<int> loop;
    for (int e = k; !used[e]; e = out_of.at(edges[e].to)) used[e] = 1, loop.push_back(e);
    const auto first = std::min_element(loop.begin(), loop.end(), [&](int a, int b) {
      const GridPoint p = sub.vertices[edges[a].from], q = sub.vertices[edges[b].from];
      return std::pair(p.x, p.y) < std::pair(q.x, q.y);
    });
    std::rotate(loop.begin(), first, loop.end());
    loops.push_back(std::move(loop));
  }
  std::sort(loops.begin(), loops.end(), [&](const std::vector<int>& a, const std::vector<int>& b) {
    const GridPoint p = sub.vertices[edges[a[0]].from], q = sub.vertices[edges[b[0]].from];
    return std::pair(p.x, p.y) < std::pair(q.x, q.y);
  });

  std::vector<OutlineRun> runs;
  for (std::vector<int>& loop : loops) {
    const int n = static_cast<int>(loop.size());
    std::vector<char> corner(n, 0);  // corner[i]: the loop turns sharply where edge i starts
    int first_corner = -1;
    for (int i = 0; i < n; ++i)
      if (turn(edges[loop[(i + n - 1) % n]], edges[loop[i]]) > corner_degrees) {
        corner[i] = 1;
        if (first_corner < 0) first_corner = i;
      }
    const bool closed = first_corner < 0;
    const int start = closed ? 0 : first_corner;
    OutlineRun run;
    double longest = -1.0;
    auto finish = [&](int end_vertex) {
      run.points.push_back(sub.metres(sub.vertices[end_vertex]));
      run.closed = closed;
      runs.push_back(std::move(run));
      run = OutlineRun{};
      longest = -1.0;
    };
    for (int j = 0; j < n; ++j) {
      const int i = (start + j) % n;
      const Directed& e = edges[loop[i]];
      if (j > 0 && corner[i]) finish(e.from);
      const GridPoint a = sub.vertices[e.from], b = sub.vertices[e.to];
      // Keep a point only where the run bends (exactly collinear grid points are dropped).
      const bool bends = run.points.empty() ||
                         cross_steps(sub.vertices[edges[loop[(i + n - 1) % n]].from], a, b) != 0;
      if (bends) run.points.push_back(sub.metres(a));
      const double length = distance(sub.metres(a), sub.metres(b));
      run.length += length;
      if (length > longest) longest = length, run.region = e.region;
    }
    finish(closed ? edges[loop[start]].from : edges[loop[(start + n - 1) % n]].to);
    if (closed) runs.back().points.pop_back();  // the loop's first point is not repeated
  }
  // Points that only record grid rounding (a turned straight edge is a staircase of grid steps
  // within one step of the line) are dropped: one grid step of tolerance.
  for (OutlineRun& run : runs) {
    if (run.closed || run.points.size() < 3) continue;
    std::vector<char> keep(run.points.size(), 0);
    keep.front() = keep.back() = 1;
    simplify(run.points, 0, run.points.size() - 1, 1.0 / grid_steps_per_metre, keep);
    std::vector<Point> kept;
    for (std::size_t i = 0; i < run.points.size(); ++i)
      if (keep[i]) kept.push_back(run.points[i]);
    run.points = std::move(kept);
  }
  return runs;
}

}  // namespace edgeflux
