// Local refinement of a mesh by edge bisection: the marked triangles are split into four, their
// neighbours into two or three so the mesh stays conforming (no node in the middle of an edge).
//
// Each triangle is split across its longest edge first; a triangle that has any edge to split has
// its longest edge split too (the closure below), and the other split edges are then halves'
// sides. This is longest-edge bisection: the smallest angle of every triangle it makes is at least
// half the smallest angle of the mesh it started from (Rivara's bound), however many levels it
// runs, and it never needs to look at the geometry again: every new node is the midpoint of an
// existing edge, and region edges and surfaces are straight, so they are kept exactly. Regions,
// materials and surface tags pass from each triangle and boundary edge to its parts. Edge flips
// then make the mesh Delaunay again inside each region (delaunay_flips.h). Linear time.
#include <fmt/format.h>

#include <algorithm>
#include <array>
#include <vector>

#include "core/error.h"
#include "mesh/mesh_cross_section.h"
#include "mesh/delaunay_flips.h"
#include "mesh/mesh_edges.h"
#include "mesh/refine_mesh.h"

namespace edgeflux {
namespace {

double squared_length(const TriMesh& mesh, const std::array<int, 2>& ends) {
  const Point d = mesh.points[ends[1]] - mesh.points[ends[0]];
  return d.x * d.x + d.y * d.y;
}

}  // namespace

TriMesh refine_mesh(const CrossSection& section, const TriMesh& previous, const std::vector<char>& marked,
                    std::size_t max_nodes) {
  const EdgeTable edges = edge_table(previous);
  const int n_triangles = previous.n_triangles(), n_edges = static_cast<int>(edges.ends.size());

  // The side each triangle is split across first: its longest (ties: the lower edge number, so
  // both triangles on an edge agree and the result is deterministic).
  std::vector<int> longest(n_triangles);
  for (int t = 0; t < n_triangles; ++t) {
    int best = 0;
    for (int k = 1; k < 3; ++k) {
      const double lk = squared_length(previous, edges.ends[edges.of_triangle[t][k]]);
      const double lb = squared_length(previous, edges.ends[edges.of_triangle[t][best]]);
      if (lk > lb || (lk == lb && edges.of_triangle[t][k] < edges.of_triangle[t][best])) best = k;
    }
    longest[t] = best;
  }

  // Every side of a marked triangle is split; then, until nothing changes, a triangle with a split
  // side has its longest side split as well, which may pass the need on to the triangle across.
  std::vector<char> split(n_edges, 0);
  std::vector<int> todo;
  for (int t = 0; t < n_triangles; ++t)
    if (marked[t])
      for (int k = 0; k < 3; ++k) split[edges.of_triangle[t][k]] = 1, todo.push_back(t);
  for (int t = 0; t < n_triangles; ++t)
    if (!marked[t]) todo.push_back(t);
  while (!todo.empty()) {
    const int t = todo.back();
    todo.pop_back();
    const auto& sides = edges.of_triangle[t];
    const int first = sides[longest[t]];
    if (split[first] || !(split[sides[0]] || split[sides[1]] || split[sides[2]])) continue;
    split[first] = 1;
    for (int u : edges.triangles[first])
      if (u >= 0 && u != t) todo.push_back(u);
  }

  TriMesh fine;
  fine.mesher = previous.mesher;
  fine.points = previous.points;
  fine.probe_nodes = previous.probe_nodes;
  std::vector<int> midpoint(n_edges, -1);
  for (int e = 0; e < n_edges; ++e) {
    if (!split[e]) continue;
    midpoint[e] = static_cast<int>(fine.points.size());
    fine.points.push_back(0.5 * (previous.points[edges.ends[e][0]] + previous.points[edges.ends[e][1]]));
  }
  if (fine.points.size() > max_nodes) {
    const std::string problem =
        fmt::format("the refined mesh would have {} nodes, more than the limit of {}", fine.points.size(), max_nodes);
    throw MeshLimitError(format_input_error({section.file, 0}, "mesh", problem, "lower the accuracy target"), problem);
  }

  // Split each triangle. With v1–v2 its longest side (m its midpoint) and v0 the corner opposite,
  // all counter-clockwise: halves (v0, v1, m) and (v0, m, v2); a split side v0–v1 or v2–v0 halves
  // the half it belongs to again.
  std::vector<int> first_child(n_triangles + 1, 0);
  fine.triangles.reserve(2 * static_cast<std::size_t>(n_triangles));
  auto add = [&](int t, std::array<int, 3> tri) {
    fine.triangles.push_back(tri);
    fine.triangle_region.push_back(previous.triangle_region[t]);
    fine.triangle_material.push_back(previous.triangle_material[t]);
  };
  for (int t = 0; t < n_triangles; ++t) {
    first_child[t] = fine.n_triangles();
    const int r = longest[t];
    const auto& tri = previous.triangles[t];
    const int v1 = tri[r], v2 = tri[(r + 1) % 3], v0 = tri[(r + 2) % 3];
    const int m = midpoint[edges.of_triangle[t][r]];
    if (m < 0) {  // no side split (the closure split the longest side of every triangle with one)
      add(t, tri);
      continue;
    }
    const int m01 = midpoint[edges.of_triangle[t][(r + 2) % 3]];  // side v0–v1
    const int m20 = midpoint[edges.of_triangle[t][(r + 1) % 3]];  // side v2–v0
    if (m01 < 0) {
      add(t, {v0, v1, m});
    } else {
      add(t, {v0, m01, m});
      add(t, {m01, v1, m});
    }
    if (m20 < 0) {
      add(t, {v0, m, v2});
    } else {
      add(t, {v0, m, m20});
      add(t, {m, v2, m20});
    }
  }
  first_child[n_triangles] = fine.n_triangles();

  // Boundary edges: a split edge becomes its two halves, each on the part of its triangle that
  // has it (with the same direction: the section stays on its left).
  auto child_with = [&](int parent, int a, int b) {
    for (int c = first_child[parent]; c < first_child[parent + 1]; ++c)
      for (int k = 0; k < 3; ++k)
        if (fine.triangles[c][k] == a && fine.triangles[c][(k + 1) % 3] == b) return c;
    return -1;
  };
  fine.boundary_edges.reserve(2 * previous.boundary_edges.size());
  for (const BoundaryEdge& e : previous.boundary_edges) {
    const auto& tri = previous.triangles[e.triangle];
    int side = 0;
    while (side < 3 && !(tri[side] == e.a && tri[(side + 1) % 3] == e.b)) ++side;
    const int m = side < 3 ? midpoint[edges.of_triangle[e.triangle][side]] : -1;
    if (m < 0) {
      fine.boundary_edges.push_back({e.a, e.b, e.surface, child_with(e.triangle, e.a, e.b), e.cut_off});
    } else {
      fine.boundary_edges.push_back({e.a, m, e.surface, child_with(e.triangle, e.a, m), e.cut_off});
      fine.boundary_edges.push_back({m, e.b, e.surface, child_with(e.triangle, m, e.b), e.cut_off});
    }
  }
  flip_to_delaunay(fine);
  return fine;
}

}  // namespace edgeflux
