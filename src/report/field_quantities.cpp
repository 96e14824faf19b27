// Boundary loops and the walk along the interior surfaces.
#include "report/field_quantities.h"

#include <algorithm>
#include <map>

namespace edgeflux {

std::vector<std::vector<int>> boundary_loops(const TriMesh& mesh) {
  // Follow each edge to the edge leaving its end node.
  std::multimap<int, int> leaving;  // node → boundary edge index
  for (std::size_t i = 0; i < mesh.boundary_edges.size(); ++i) leaving.emplace(mesh.boundary_edges[i].a, static_cast<int>(i));
  std::vector<bool> used(mesh.boundary_edges.size(), false);
  std::vector<std::vector<int>> loops;
  for (std::size_t first = 0; first < mesh.boundary_edges.size(); ++first) {
    if (used[first]) continue;
    std::vector<int> loop;
    for (int e = static_cast<int>(first); e >= 0 && !used[e];) {
      used[e] = true;
      loop.push_back(e);
      int next = -1;
      auto [lo, hi] = leaving.equal_range(mesh.boundary_edges[e].b);
      for (auto it = lo; it != hi; ++it)
        if (!used[it->second]) { next = it->second; break; }
      e = next;
    }
    loops.push_back(std::move(loop));
  }
  return loops;
}

std::vector<SurfaceSample> interior_surface_walk(const CrossSection& section, const TriMesh& mesh) {
  auto is_interior = [&](const BoundaryEdge& e) {
    return e.surface >= 0 && section.environments[section.surfaces[e.surface].environment].side == Side::interior;
  };
  std::vector<std::vector<int>> chains;
  for (const std::vector<int>& loop : boundary_loops(mesh)) {
    // Start the loop where a stretch of interior surface begins, so no stretch is split in two.
    const std::size_t n = loop.size();
    std::size_t start = 0;
    for (std::size_t k = 0; k < n; ++k)
      if (is_interior(mesh.boundary_edges[loop[k]]) && !is_interior(mesh.boundary_edges[loop[(k + n - 1) % n]])) { start = k; break; }
    std::vector<int> chain;
    for (std::size_t k = 0; k < n; ++k) {
      const int e = loop[(start + k) % n];
      if (is_interior(mesh.boundary_edges[e])) {
        chain.push_back(e);
      } else if (!chain.empty()) {
        chains.push_back(chain);
        chain.clear();
      }
    }
    if (!chain.empty()) chains.push_back(chain);
  }
  std::stable_sort(chains.begin(), chains.end(), [&](const std::vector<int>& a, const std::vector<int>& b) {
    return mesh.boundary_edges[a.front()].surface < mesh.boundary_edges[b.front()].surface;
  });

  std::vector<SurfaceSample> walk;
  double distance_so_far = 0.0;
  for (std::size_t c = 0; c < chains.size(); ++c) {
    const BoundaryEdge& head = mesh.boundary_edges[chains[c].front()];
    walk.push_back({distance_so_far, static_cast<int>(c), head.a, head.surface, mesh.points[head.a]});
    for (int e : chains[c]) {
      const BoundaryEdge& edge = mesh.boundary_edges[e];
      distance_so_far += distance(mesh.points[edge.a], mesh.points[edge.b]);
      walk.push_back({distance_so_far, static_cast<int>(c), edge.b, edge.surface, mesh.points[edge.b]});
    }
  }
  return walk;
}

}  // namespace edgeflux
