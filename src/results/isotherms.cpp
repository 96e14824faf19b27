#include "results/isotherms.h"

#include <algorithm>
#include <map>

namespace edgeflux {

std::vector<FieldVertex> clip_to_level(const std::vector<FieldVertex>& poly, double level, bool keep_above) {
  std::vector<FieldVertex> out;
  const std::size_t n = poly.size();
  for (std::size_t i = 0; i < n; ++i) {
    const FieldVertex& c = poly[i];
    const FieldVertex& d = poly[(i + 1) % n];
    const bool c_in = keep_above ? c.second >= level : c.second <= level;
    const bool d_in = keep_above ? d.second >= level : d.second <= level;
    if (c_in) out.push_back(c);
    if (c_in != d_in) {
      const double t = (level - c.second) / (d.second - c.second);
      out.push_back({c.first + t * (d.first - c.first), level});
    }
  }
  return out;
}


IsothermLines isotherm_lines(const TriMesh& mesh, const std::vector<double>& T, double level) {
  std::vector<std::pair<std::pair<int, int>, std::pair<int, int>>> segments;  // edge keys of both ends
  for (const auto& tri : mesh.triangles) {
    std::pair<int, int> ends[2];
    int n = 0;
    for (int i = 0; i < 3; ++i) {
      const int a = tri[i], b = tri[(i + 1) % 3];
      if ((T[a] >= level) != (T[b] >= level) && n < 2) ends[n++] = {std::min(a, b), std::max(a, b)};
    }
    if (n == 2) segments.push_back({ends[0], ends[1]});
  }
  auto point_of = [&](std::pair<int, int> e) {
    const double t = (level - T[e.first]) / (T[e.second] - T[e.first]);
    const Point w = mesh.points[e.first] + t * (mesh.points[e.second] - mesh.points[e.first]);
    return w;
  };
  std::multimap<std::pair<int, int>, int> by_edge;
  for (std::size_t i = 0; i < segments.size(); ++i) by_edge.emplace(segments[i].first, i), by_edge.emplace(segments[i].second, i);
  std::vector<bool> used(segments.size(), false);
  IsothermLines iso{level, {}};
  for (std::size_t s = 0; s < segments.size(); ++s) {
    if (used[s]) continue;
    used[s] = true;
    std::vector<std::pair<int, int>> forward{segments[s].second}, backward{segments[s].first};
    for (auto* chain : {&forward, &backward}) {
      for (;;) {
        auto [lo, hi] = by_edge.equal_range(chain->back());
        int next = -1;
        for (auto it = lo; it != hi; ++it)
          if (!used[it->second]) { next = it->second; break; }
        if (next < 0) break;
        used[next] = true;
        chain->push_back(segments[next].first == chain->back() ? segments[next].second : segments[next].first);
      }
    }
    std::vector<Point> line;
    for (auto it = backward.rbegin(); it != backward.rend(); ++it) line.push_back(point_of(*it));
    for (const auto& e : forward) line.push_back(point_of(e));
    iso.lines.push_back(std::move(line));
  }
  return iso;
}

}  // namespace edgeflux
