// The triangle locator: points inside, on edges and corners, and outside a hand-built mesh; linear
// fields interpolate exactly.
#include <doctest/doctest.h>

#include "mesh/triangle_locator.h"

using namespace edgeflux;

namespace {

/// An L-shaped mesh: the unit square split into 2 × 2 squares, the upper right one left out,
/// each square cut into two counter-clockwise triangles.
TriMesh l_shape() {
  TriMesh mesh;
  for (int j = 0; j <= 2; ++j)
    for (int i = 0; i <= 2; ++i) mesh.points.push_back({0.5 * i, 0.5 * j});
  auto id = [](int i, int j) { return 3 * j + i; };
  for (auto [i, j] : {std::pair{0, 0}, std::pair{1, 0}, std::pair{0, 1}}) {
    mesh.triangles.push_back({id(i, j), id(i + 1, j), id(i + 1, j + 1)});
    mesh.triangles.push_back({id(i, j), id(i + 1, j + 1), id(i, j + 1)});
  }
  return mesh;
}

}  // namespace

TEST_CASE("triangle locator: inside, on edges and corners, in the notch and outside (exact geometry)") {
  const TriMesh mesh = l_shape();
  const TriangleLocator locator(mesh);
  std::vector<double> field;  // linear: reproduced exactly by piecewise-linear interpolation
  for (Point p : mesh.points) field.push_back(3.0 * p.x - 2.0 * p.y + 1.0);
  for (Point p : {Point{0.1, 0.2}, Point{0.9, 0.1}, Point{0.25, 0.75}, Point{0.5, 0.5}, Point{0.0, 0.0}, Point{1.0, 0.5},
                  Point{0.5, 1.0}, Point{0.25, 0.25}, Point{0.75, 0.5}}) {
    CAPTURE(p.x);
    CAPTURE(p.y);
    const auto at = locator.locate(p);
    REQUIRE(at);
    const auto& l = at->barycentric;
    CHECK(l[0] + l[1] + l[2] == doctest::Approx(1.0).epsilon(1e-14));
    for (double b : l) CHECK(b >= -1e-9);
    CHECK(*locator.value_at(field, p) == doctest::Approx(3.0 * p.x - 2.0 * p.y + 1.0).epsilon(1e-13));
  }
  // The notch (upper right square) and points beyond the mesh belong to no triangle.
  for (Point p : {Point{0.75, 0.75}, Point{0.51, 0.51}, Point{-0.01, 0.5}, Point{0.5, 1.01}, Point{2.0, 2.0}}) {
    CAPTURE(p.x);
    CAPTURE(p.y);
    CHECK(!locator.locate(p));
    CHECK(locator.triangle_at(p) == -1);
    CHECK(!locator.value_at(field, p));
  }
}
