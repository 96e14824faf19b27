// From a raw painted triangulation to the solver's mesh: drop the outside, find the outer boundary
// and give each boundary edge its surface and cut-off.
#include "mesh/mesh_cross_section.h"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <unordered_map>

#include "geometry/polygon.h"
#include "mesh/mesh_edges.h"
#include "mesh/delaunay_triangulation.h"
#include "mesh/grid_triangulation.h"
#include "mesh/raw_triangulation.h"
#include "mesh/refine_mesh.h"

namespace edgeflux {
namespace {

struct EdgeKey {
  int lo, hi;
  bool operator==(const EdgeKey&) const = default;
};
struct EdgeKeyHash {
  std::size_t operator()(const EdgeKey& k) const {
    return std::hash<long long>()((static_cast<long long>(k.lo) << 32) ^ k.hi);
  }
};

/// For every triangle side, the triangle across it (-1 on the hull).
std::vector<std::array<int, 3>> triangle_neighbours(const std::vector<std::array<int, 3>>& triangles) {
  std::unordered_map<EdgeKey, int, EdgeKeyHash> first_owner;
  first_owner.reserve(triangles.size() * 2);
  std::vector<std::array<int, 3>> neighbours(triangles.size(), {-1, -1, -1});
  for (int t = 0; t < static_cast<int>(triangles.size()); ++t) {
    for (int k = 0; k < 3; ++k) {
      const int a = triangles[t][k], b = triangles[t][(k + 1) % 3];
      const EdgeKey key{std::min(a, b), std::max(a, b)};
      auto [it, inserted] = first_owner.try_emplace(key, 3 * t + k);
      if (!inserted) {
        const int u = it->second / 3, side = it->second % 3;
        neighbours[u][side] = t;
        neighbours[t][k] = u;
      }
    }
  }
  return neighbours;
}

}  // namespace

bool is_rectilinear(const CrossSection& section) {
  auto axis_parallel = [](Point a, Point b) { return a.x == b.x || a.y == b.y; };
  for (const Region& region : section.regions) {
    if (!region.islands.empty()) return false;
    for (std::size_t i = 0; i < region.outline.size(); ++i)
      if (!axis_parallel(region.outline[i], region.outline[(i + 1) % region.outline.size()])) return false;
  }
  for (const Surface& surface : section.surfaces)
    for (std::size_t i = 0; i + 1 < surface.path.size(); ++i)
      if (!axis_parallel(surface.path[i], surface.path[i + 1])) return false;
  return true;
}

namespace {

/// The finishing step shared by all meshers: compaction, boundary edges, surface and cut-off tags.
TriMesh finish_mesh(const CrossSection& section, const RawTriangulation& raw, const std::string& mesher) {
  const auto neighbours = triangle_neighbours(raw.triangles);
  std::unordered_map<EdgeKey, TaggedEdge, EdgeKeyHash> tags;
  for (const TaggedEdge& e : raw.tagged) tags.emplace(EdgeKey{std::min(e.a, e.b), std::max(e.a, e.b)}, e);

  TriMesh mesh;
  mesh.mesher = mesher;
  std::vector<int> new_index(raw.points.size(), -1);
  std::vector<int> new_triangle(raw.triangles.size(), -1);
  for (int t = 0; t < static_cast<int>(raw.triangles.size()); ++t) {
    const int region = raw.triangle_region[t];
    if (region < 0) continue;
    // Every triangle is kept, even one whose area rounds to zero in doubles (the triangulation's
    // exact predicates made it valid): dropping it would open a false boundary inside the section.
    // Its conductance is zero (see triangle_conductance).
    const auto& raw_tri = raw.triangles[t];
    std::array<int, 3> tri{};
    for (int k = 0; k < 3; ++k) {
      int& v = new_index[raw_tri[k]];
      if (v < 0) v = mesh.n_points(), mesh.points.push_back(raw.points[raw_tri[k]]);
      tri[k] = v;
    }
    new_triangle[t] = mesh.n_triangles();
    mesh.triangles.push_back(tri);
    mesh.triangle_region.push_back(region);
    mesh.triangle_material.push_back(static_cast<int>(section.regions[region].material));
  }
  for (int t = 0; t < static_cast<int>(raw.triangles.size()); ++t) {
    if (new_triangle[t] < 0) continue;
    for (int k = 0; k < 3; ++k) {
      const int u = neighbours[t][k];
      if (u >= 0 && new_triangle[u] >= 0) continue;
      const int a = raw.triangles[t][k], b = raw.triangles[t][(k + 1) % 3];
      BoundaryEdge edge{new_index[a], new_index[b], -1, new_triangle[t]};
      if (const auto it = tags.find({std::min(a, b), std::max(a, b)}); it != tags.end())
        edge.surface = it->second.surface, edge.cut_off = it->second.cut_off;
      mesh.boundary_edges.push_back(edge);
    }
  }
  for (int node : raw.probe_nodes) mesh.probe_nodes.push_back(node < 0 ? -1 : new_index[node]);
  return mesh;
}

}  // namespace

TriMesh mesh_cross_section(const CrossSection& section, const PlanarSubdivision& subdivision, const MeshOptions& options) {
  using Mesher = MeshSettings::Mesher;
  if (options.mesher == Mesher::grid && !is_rectilinear(section))
    throw_input_error({section.file, 0}, "mesh", "the grid mesher needs every region edge and surface "
                      "parallel to an axis", "use mesher=\"delaunay\" or \"automatic\"");
  // Measured on ISO 10211 Case 2 (docs/method.md): the graded Delaunay mesh reaches a given
  // heat-flow error with fewer nodes than the tensor grid, whose refinement near a corner runs
  // along whole grid lines, so automatic means Delaunay; the grid stays available on request.
  if (options.mesher == Mesher::grid)
    return finish_mesh(section, grid_triangulation(section, subdivision, options), "grid");
  // Very fine meshes: Delaunay refinement costs tens of µs per node, uniform subdivision a fraction
  // of that with the same grading and angles, so fine densities mesh at most at density 4 and
  // subdivide (each subdivision doubles the elements along every length).
  MeshOptions coarse = options;
  int subdivisions = 0;
  while (coarse.density > 4.0) coarse.density /= 2.0, ++subdivisions;
  TriMesh mesh = finish_mesh(section, delaunay_triangulation(section, subdivision, coarse), "delaunay");
  for (int k = 0; k < subdivisions; ++k) mesh = subdivide_mesh(mesh);
  return mesh;
}

TriMesh mesh_cross_section(const CrossSection& section, const MeshOptions& options) {
  return mesh_cross_section(section, planar_subdivision(section), options);
}

TriMesh subdivide_mesh(const TriMesh& mesh) {
  TriMesh fine;
  fine.mesher = mesh.mesher;
  fine.points = mesh.points;
  const EdgeTable edges = edge_table(mesh);
  std::vector<int> midpoint(edges.ends.size());
  fine.probe_nodes = mesh.probe_nodes;
  fine.points.reserve(mesh.points.size() + edges.ends.size());
  for (std::size_t e = 0; e < edges.ends.size(); ++e) {
    midpoint[e] = static_cast<int>(fine.points.size());
    fine.points.push_back(0.5 * (mesh.points[edges.ends[e][0]] + mesh.points[edges.ends[e][1]]));
  }
  fine.triangles.reserve(4 * mesh.triangles.size());
  fine.triangle_region.reserve(4 * mesh.triangles.size());
  fine.triangle_material.reserve(4 * mesh.triangles.size());
  for (int t = 0; t < mesh.n_triangles(); ++t) {
    const auto [a, b, c] = mesh.triangles[t];
    const int ab = midpoint[edges.of_triangle[t][0]], bc = midpoint[edges.of_triangle[t][1]],
              ca = midpoint[edges.of_triangle[t][2]];
    for (const std::array<int, 3>& child : {std::array<int, 3>{a, ab, ca}, {ab, b, bc}, {ca, bc, c}, {ab, bc, ca}}) {
      fine.triangles.push_back(child);
      fine.triangle_region.push_back(mesh.triangle_region[t]);
      fine.triangle_material.push_back(mesh.triangle_material[t]);
    }
  }
  // A boundary edge a→b of triangle t splits into a→m and m→b, owned by the children at a and b.
  for (const BoundaryEdge& e : mesh.boundary_edges) {
    const auto& tri = mesh.triangles[e.triangle];
    int side = 0;
    while (!(tri[side] == e.a && tri[(side + 1) % 3] == e.b)) ++side;
    const int m = midpoint[edges.of_triangle[e.triangle][side]];
    auto child_at = [&](int node) {
      for (int k = 0; k < 3; ++k)
        if (tri[k] == node) return 4 * e.triangle + k;
      return -1;
    };
    fine.boundary_edges.push_back({e.a, m, e.surface, child_at(e.a), e.cut_off});
    fine.boundary_edges.push_back({m, e.b, e.surface, child_at(e.b), e.cut_off});
  }
  return fine;
}

}  // namespace edgeflux
