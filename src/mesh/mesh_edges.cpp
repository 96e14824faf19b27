// Edge numbering: per lower end node, the edges to higher nodes (a node has few).
#include "mesh/mesh_edges.h"

#include <algorithm>

namespace edgeflux {

EdgeTable edge_table(const TriMesh& mesh) {
  const int n_points = mesh.n_points(), n_triangles = mesh.n_triangles();
  // Per lower end node, the edges to higher nodes: counted, then filled (a node has few edges).
  std::vector<int> start(n_points + 1, 0);
  for (const auto& tri : mesh.triangles)
    for (int k = 0; k < 3; ++k) ++start[std::min(tri[k], tri[(k + 1) % 3]) + 1];
  for (int v = 0; v < n_points; ++v) start[v + 1] += start[v];
  std::vector<int> other(start[n_points]), id(start[n_points]), fill(start.begin(), start.end() - 1);
  EdgeTable table;
  table.of_triangle.resize(n_triangles);
  table.triangles.reserve(start[n_points] / 2 + n_points);
  table.ends.reserve(start[n_points] / 2 + n_points);
  for (int t = 0; t < n_triangles; ++t) {
    for (int k = 0; k < 3; ++k) {
      const int a = std::min(mesh.triangles[t][k], mesh.triangles[t][(k + 1) % 3]);
      const int b = std::max(mesh.triangles[t][k], mesh.triangles[t][(k + 1) % 3]);
      int edge = -1;
      for (int i = start[a]; i < fill[a]; ++i)
        if (other[i] == b) edge = id[i];
      if (edge < 0) {
        edge = static_cast<int>(table.ends.size());
        table.ends.push_back({a, b});
        table.triangles.push_back({t, -1});
        other[fill[a]] = b, id[fill[a]] = edge, ++fill[a];
      } else {
        table.triangles[edge][1] = t;
      }
      table.of_triangle[t][k] = edge;
    }
  }
  return table;
}

}  // namespace edgeflux
