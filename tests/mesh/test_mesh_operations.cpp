// Mesh operations on hand-built meshes: Delaunay edge flips and uniform subdivision.
#include <doctest/doctest.h>

#include <cmath>
#include <set>

#include "mesh/delaunay_flips.h"
#include "mesh/refine_mesh.h"

using namespace edgeflux;

namespace {

double twice_area(const TriMesh& m, int t) {
  const auto& v = m.triangles[t];
  return cross(m.points[v[1]] - m.points[v[0]], m.points[v[2]] - m.points[v[0]]);
}

/// A flat rhombus split along its long diagonal: the two angles opposite that diagonal are obtuse
/// (about 143° each), so the diagonal is not Delaunay; all four outer edges are boundary edges.
TriMesh flat_rhombus() {
  TriMesh m;
  m.points = {{0, 0}, {1, -0.3}, {2, 0}, {1, 0.3}};
  m.triangles = {{0, 1, 2}, {0, 2, 3}};
  m.triangle_region = {0, 0};
  m.triangle_material = {0, 0};
  m.boundary_edges = {{0, 1, 5, 0, -1}, {1, 2, -1, 0, -1}, {2, 3, -1, 1, -1}, {3, 0, 7, 1, -1}};
  return m;
}

}  // namespace

TEST_CASE("Delaunay flips: the long diagonal of a flat rhombus becomes the short one, once (exact geometry)") {
  TriMesh m = flat_rhombus();
  CHECK(flip_to_delaunay(m) == 1);
  REQUIRE(m.triangles.size() == 2);
  // The shared edge is now 1–3 (the short diagonal): both triangles hold nodes 1 and 3.
  for (const auto& t : m.triangles) {
    const std::set<int> nodes(t.begin(), t.end());
    CHECK(nodes.count(1) == 1);
    CHECK(nodes.count(3) == 1);
  }
  for (int t = 0; t < 2; ++t) CHECK(twice_area(m, t) > 0);  // still counter-clockwise
  CHECK(twice_area(m, 0) + twice_area(m, 1) == doctest::Approx(2 * 0.6).epsilon(1e-14));  // diagonals 2 and 0.6: area 0.6 (exact)
  // Boundary edges keep their surface tags and name a triangle that has them.
  for (const BoundaryEdge& e : m.boundary_edges) {
    const auto& t = m.triangles[e.triangle];
    const std::set<int> nodes(t.begin(), t.end());
    CHECK(nodes.count(e.a) == 1);
    CHECK(nodes.count(e.b) == 1);
  }
  CHECK(m.boundary_edges[0].surface == 5);
  CHECK(m.boundary_edges[3].surface == 7);
  CHECK(flip_to_delaunay(m) == 0);  // already Delaunay
}

TEST_CASE("Delaunay flips leave an edge between two regions alone (the region boundary is a constraint)") {
  TriMesh m = flat_rhombus();
  m.triangle_region = {0, 1};
  CHECK(flip_to_delaunay(m) == 0);
  CHECK(m.triangles[0] == std::array<int, 3>{0, 1, 2});
}

TEST_CASE("uniform subdivision: four triangles per triangle, the same area, one new node per edge (exact)") {
  TriMesh m = flat_rhombus();
  m.mesher = "delaunay";
  const TriMesh fine = subdivide_mesh(m);
  CHECK(fine.triangles.size() == 8);
  CHECK(fine.points.size() == 4 + 5);  // 4 nodes and 5 edges
  double area = 0.0;
  for (int t = 0; t < fine.n_triangles(); ++t) {
    CHECK(twice_area(fine, t) > 0);
    area += twice_area(fine, t);
  }
  CHECK(area == doctest::Approx(twice_area(m, 0) + twice_area(m, 1)).epsilon(1e-14));
  CHECK(fine.boundary_edges.size() == 8);  // each boundary edge halved
  int tagged = 0;
  for (const BoundaryEdge& e : fine.boundary_edges) tagged += e.surface == 5 || e.surface == 7;
  CHECK(tagged == 4);  // both halves of both tagged edges keep their surface
  CHECK(fine.triangle_region.size() == 8);
}
