// Local refinement by longest-edge bisection and Delaunay flips: conforming, exact in area,
// boundary and regions, Delaunay within each region, and the smallest angle bounded by half the
// starting mesh's.
#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <map>
#include <numbers>
#include <set>
#include <utility>

#include "../test_support.h"
#include "mesh/mesh_cross_section.h"
#include "mesh/mesh_edges.h"
#include "mesh/refine_mesh.h"

using namespace edgeflux;

namespace {

double signed_area(const TriMesh& mesh, int t) {
  const Point a = mesh.points[mesh.triangles[t][0]], b = mesh.points[mesh.triangles[t][1]], c = mesh.points[mesh.triangles[t][2]];
  return 0.5 * ((b.x - a.x) * (c.y - a.y) - (c.x - a.x) * (b.y - a.y));
}

double smallest_angle_degrees(const TriMesh& mesh) {
  double smallest = 180.0;
  for (const auto& tri : mesh.triangles)
    for (int k = 0; k < 3; ++k) {
      const Point p = mesh.points[tri[k]], q = mesh.points[tri[(k + 1) % 3]], r = mesh.points[tri[(k + 2) % 3]];
      const Point u = q - p, v = r - p;
      const double angle = std::atan2(std::abs(u.x * v.y - u.y * v.x), u.x * v.x + u.y * v.y);
      smallest = std::min(smallest, angle * 180.0 / std::numbers::pi);
    }
  return smallest;
}

/// Area per material and boundary length per surface (-1: adiabatic).
std::pair<std::map<int, double>, std::map<int, double>> measures(const TriMesh& mesh) {
  std::map<int, double> area, length;
  for (int t = 0; t < mesh.n_triangles(); ++t) area[mesh.triangle_material[t]] += signed_area(mesh, t);
  for (const BoundaryEdge& e : mesh.boundary_edges) length[e.surface] += distance(mesh.points[e.a], mesh.points[e.b]);
  return {area, length};
}

/// Every edge lies on one or two triangles; the edges on one are exactly the boundary edges, in
/// the triangles' direction, and each boundary edge names a triangle that has it.
void check_conforming(const TriMesh& mesh) {
  std::map<std::pair<int, int>, int> directed;
  for (const auto& tri : mesh.triangles)
    for (int k = 0; k < 3; ++k) ++directed[{tri[k], tri[(k + 1) % 3]}];
  std::set<std::pair<int, int>> once;
  int repeated = 0;
  for (const auto& [edge, count] : directed) {
    repeated += count != 1;  // a directed edge twice: overlapping or inverted triangles
    if (!directed.count({edge.second, edge.first})) once.insert(edge);
  }
  CHECK(repeated == 0);
  std::set<std::pair<int, int>> boundary;
  int wrong_owner = 0;
  for (const BoundaryEdge& e : mesh.boundary_edges) {
    boundary.insert({e.a, e.b});
    const auto& tri = mesh.triangles.at(e.triangle);
    bool has = false;
    for (int k = 0; k < 3; ++k) has = has || (tri[k] == e.a && tri[(k + 1) % 3] == e.b);
    wrong_owner += !has;
  }
  CHECK(wrong_owner == 0);
  CHECK(boundary == once);
}

/// Deterministic marks: every triangle whose index hashes below `share`, or all within `radius`
/// of `centre` (refinement concentrated at a point, as around a corner).
std::vector<char> marks(const TriMesh& mesh, double share, Point centre, double radius) {
  std::vector<char> marked(mesh.n_triangles(), 0);
  for (int t = 0; t < mesh.n_triangles(); ++t) {
    const std::uint32_t h = static_cast<std::uint32_t>(t) * 2654435761u;
    const auto& tri = mesh.triangles[t];
    const Point c = (1.0 / 3.0) * (mesh.points[tri[0]] + mesh.points[tri[1]] + mesh.points[tri[2]]);
    marked[t] = (h % 1000 < share * 1000) || distance(c, centre) < radius;
  }
  return marked;
}

/// Edges inside one region whose opposite angles sum to more than 180° (cot γ + cot δ < 0): a
/// negative conductance in the linear-element matrix (exact algebra of K(i,j) = −λ(cot γ + cot δ)/2).
int non_delaunay_edges(const TriMesh& mesh) {
  const EdgeTable edges = edge_table(mesh);
  int count = 0;
  for (std::size_t e = 0; e < edges.ends.size(); ++e) {
    const int t = edges.triangles[e][0], u = edges.triangles[e][1];
    if (u < 0 || mesh.triangle_region[t] != mesh.triangle_region[u]) continue;
    double cot_sum = 0.0;
    for (int w : {t, u}) {
      int opposite = 0;
      while (mesh.triangles[w][opposite] == edges.ends[e][0] || mesh.triangles[w][opposite] == edges.ends[e][1]) ++opposite;
      const Point p = mesh.points[mesh.triangles[w][opposite]];
      const Point a = mesh.points[edges.ends[e][0]] - p, b = mesh.points[edges.ends[e][1]] - p;
      cot_sum += dot(a, b) / std::abs(a.x * b.y - a.y * b.x);
    }
    count += cot_sum < -1e-9;
  }
  return count;
}

}  // namespace

TEST_CASE("bisection refinement keeps the mesh conforming, its areas, boundary and regions, and its angles") {
  for (const char* file : {"tests/reference/iso10211_case2.xml", "examples/intermediate-floor.xml"}) {
    CAPTURE(file);
    const CrossSection section = read_detail_file(test::source_path(file));
    MeshOptions options;
    options.mesher = MeshSettings::Mesher::delaunay;
    TriMesh mesh = mesh_cross_section(section, options);
    const auto [area0, length0] = measures(mesh);
    const double angle0 = smallest_angle_degrees(mesh);
    const Point corner = mesh.points[mesh.boundary_edges.front().a];
    for (int level = 0; level < 4; ++level) {
      CAPTURE(level);
      const std::vector<char> marked = marks(mesh, 0.15, corner, 0.01);
      const TriMesh fine = refine_mesh(section, mesh, marked);
      // Every side of a marked triangle is halved: its midpoint is a node of the fine mesh.
      std::set<std::pair<double, double>> nodes;
      for (Point p : fine.points) nodes.insert({p.x, p.y});
      int missing = 0, clockwise = 0;
      for (int t = 0; t < mesh.n_triangles(); ++t)
        if (marked[t])
          for (int k = 0; k < 3; ++k) {
            const Point m = 0.5 * (mesh.points[mesh.triangles[t][k]] + mesh.points[mesh.triangles[t][(k + 1) % 3]]);
            missing += nodes.count({m.x, m.y}) != 1;
          }
      CHECK(missing == 0);
      CHECK(fine.n_points() > mesh.n_points());
      for (int t = 0; t < fine.n_triangles(); ++t) clockwise += !(signed_area(fine, t) > 0.0);
      CHECK(clockwise == 0);  // every triangle counter-clockwise, none degenerate
      check_conforming(fine);
      // Exact algebra: halving edges at their midpoints keeps every area and boundary length
      // (to rounding), material by material and surface by surface.
      const auto [area, length] = measures(fine);
      for (const auto& [material, a] : area0) CHECK(area.at(material) == doctest::Approx(a).epsilon(1e-12));
      for (const auto& [surface, l] : length0) CHECK(length.at(surface) == doctest::Approx(l).epsilon(1e-12));
      // Longest-edge bisection: the smallest angle is at least half the first mesh's (Rosenberg
      // and Stenger, Math. Comp. 29 (1975); from memory).
      CHECK(smallest_angle_degrees(fine) >= 0.5 * angle0);
      // Flipped back to Delaunay within each region: no negative conductance inside a material.
      CHECK(non_delaunay_edges(fine) == 0);
      mesh = fine;
    }
  }
}

TEST_CASE("bisection refinement past the node limit is a mesh-limit error naming the count") {
  const CrossSection section = read_detail_file(test::source_path("tests/reference/iso10211_case2.xml"));
  const TriMesh mesh = mesh_cross_section(section, MeshOptions{});
  const std::vector<char> all(mesh.n_triangles(), 1);
  try {
    refine_mesh(section, mesh, all, static_cast<std::size_t>(mesh.n_points()) + 10);
    FAIL("no error");
  } catch (const MeshLimitError& e) {
    CHECK(e.reason().find("more than the limit of " + std::to_string(mesh.n_points() + 10)) != std::string::npos);
  }
}
