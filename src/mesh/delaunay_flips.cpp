// Lawson flips within regions (see the header).
#include "mesh/delaunay_flips.h"

#include <cmath>
#include <unordered_map>
#include <vector>

#include "mesh/mesh_edges.h"

namespace edgeflux {
namespace {

/// cot of the angle at p in triangle (p, q, r).
double cot_at(Point p, Point q, Point r) {
  const Point u = q - p, v = r - p;
  return dot(u, v) / std::abs(cross(u, v));
}

}  // namespace

int flip_to_delaunay(TriMesh& mesh) {
  const int n = mesh.n_triangles();
  // neighbour[t][k]: the triangle across side k = (tri[k], tri[k+1]), -1 on the boundary.
  std::vector<std::array<int, 3>> neighbour(n, {-1, -1, -1});
  {
    const EdgeTable edges = edge_table(mesh);
    for (int t = 0; t < n; ++t)
      for (int k = 0; k < 3; ++k) {
        const auto& on = edges.triangles[edges.of_triangle[t][k]];
        neighbour[t][k] = on[0] == t ? on[1] : on[0];
      }
  }
  auto side_of = [&](int t, int a, int b) {  // the side of t from a to b
    for (int k = 0; k < 3; ++k)
      if (mesh.triangles[t][k] == a && mesh.triangles[t][(k + 1) % 3] == b) return k;
    return -1;
  };
  std::vector<std::array<int, 2>> todo;  // (triangle, side)
  todo.reserve(3 * static_cast<std::size_t>(n));
  for (int t = 0; t < n; ++t)
    for (int k = 0; k < 3; ++k)
      if (neighbour[t][k] > t) todo.push_back({t, k});
  int flips = 0;
  while (!todo.empty()) {
    const auto [t, k] = todo.back();
    todo.pop_back();
    const int u = neighbour[t][k];
    if (u < 0 || mesh.triangle_region[u] != mesh.triangle_region[t]) continue;
    const int a = mesh.triangles[t][k], b = mesh.triangles[t][(k + 1) % 3], c = mesh.triangles[t][(k + 2) % 3];
    const int j = side_of(u, b, a);
    const int d = mesh.triangles[u][(j + 2) % 3];
    const Point pa = mesh.points[a], pb = mesh.points[b], pc = mesh.points[c], pd = mesh.points[d];
    // Opposite angles sum to more than 180° exactly when cot γ + cot δ < 0; the margin keeps
    // nearly cocircular pairs (a square's diagonal) from flipping back and forth.
    if (!(cot_at(pc, pa, pb) + cot_at(pd, pb, pa) < -1e-9)) continue;
    // t = (a, b, c) and u = (b, a, d) become t = (a, d, c) and u = (d, b, c).
    const int t_bc = neighbour[t][(k + 1) % 3], t_ca = neighbour[t][(k + 2) % 3];
    const int u_ad = neighbour[u][(j + 1) % 3], u_db = neighbour[u][(j + 2) % 3];
    mesh.triangles[t] = {a, d, c};
    mesh.triangles[u] = {d, b, c};
    neighbour[t] = {u_ad, u, t_ca};
    neighbour[u] = {u_db, t_bc, t};
    auto repoint = [&](int outer, int from, int to) {
      if (outer < 0) return;
      for (int& x : neighbour[outer])
        if (x == from) x = to;
    };
    repoint(u_ad, u, t);
    repoint(t_bc, t, u);
    ++flips;
    todo.push_back({t, 0});
    todo.push_back({t, 2});
    todo.push_back({u, 0});
    todo.push_back({u, 1});
  }
  if (flips == 0) return 0;
  // A boundary edge's triangle may have been flipped away from it: look its owner up among the
  // boundary sides (an edge of the boundary is a side of exactly one triangle).
  std::unordered_map<long long, int> boundary_side;
  for (int t = 0; t < n; ++t)
    for (int k = 0; k < 3; ++k)
      if (neighbour[t][k] < 0)
        boundary_side[(static_cast<long long>(mesh.triangles[t][k]) << 32) | mesh.triangles[t][(k + 1) % 3]] = t;
  for (BoundaryEdge& e : mesh.boundary_edges)
    if (side_of(e.triangle, e.a, e.b) < 0) e.triangle = boundary_side.at((static_cast<long long>(e.a) << 32) | e.b);
  return flips;
}

}  // namespace edgeflux
