// Contours of a nodal field: isotherm lines and the clipping of field polygons at a level, on
// hand-built meshes with fields whose contours are known exactly.
#include <doctest/doctest.h>

#include <cmath>

#include "results/isotherms.h"

using namespace edgeflux;

namespace {

/// The unit square as an n × n grid of squares, each split into two triangles (counter-clockwise).
TriMesh unit_square(int n) {
  TriMesh mesh;
  for (int j = 0; j <= n; ++j)
    for (int i = 0; i <= n; ++i) mesh.points.push_back({static_cast<double>(i) / n, static_cast<double>(j) / n});
  auto id = [n](int i, int j) { return j * (n + 1) + i; };
  for (int j = 0; j < n; ++j)
    for (int i = 0; i < n; ++i) {
      mesh.triangles.push_back({id(i, j), id(i + 1, j), id(i + 1, j + 1)});
      mesh.triangles.push_back({id(i, j), id(i + 1, j + 1), id(i, j + 1)});
    }
  return mesh;
}

double polygon_area(const std::vector<FieldVertex>& p) {
  double a = 0.0;
  for (std::size_t i = 0; i < p.size(); ++i) a += cross(p[i].first, p[(i + 1) % p.size()].first);
  return 0.5 * a;
}

}  // namespace

TEST_CASE("isotherms of a linear field are straight, whole lines at the exact place (exact: T = 2x + y)") {
  const TriMesh mesh = unit_square(4);
  std::vector<double> T;
  for (Point p : mesh.points) T.push_back(2.0 * p.x + p.y);
  // T = 1.3: the line 2x + y = 1.3 from (0.65, 0) to (0.15, 1), one polyline across the mesh.
  const IsothermLines iso = isotherm_lines(mesh, T, 1.3);
  REQUIRE(iso.lines.size() == 1);
  for (Point p : iso.lines[0]) CHECK(2.0 * p.x + p.y == doctest::Approx(1.3).epsilon(1e-12));
  const Point a = iso.lines[0].front(), b = iso.lines[0].back();
  const Point low = a.y < b.y ? a : b, high = a.y < b.y ? b : a;
  CHECK(low.x == doctest::Approx(0.65).epsilon(1e-12));
  CHECK(low.y == doctest::Approx(0.0).epsilon(1e-12));
  CHECK(high.x == doctest::Approx(0.15).epsilon(1e-12));
  CHECK(high.y == doctest::Approx(1.0).epsilon(1e-12));
  // Levels outside the field's range have no line.
  CHECK(isotherm_lines(mesh, T, 3.5).lines.empty());
  CHECK(isotherm_lines(mesh, T, -0.5).lines.empty());
}

TEST_CASE("isotherms of a radial field close into loops (exact: T = |x − c|)") {
  const TriMesh mesh = unit_square(40);
  std::vector<double> T;
  for (Point p : mesh.points) T.push_back(std::hypot(p.x - 0.5, p.y - 0.5));
  const IsothermLines iso = isotherm_lines(mesh, T, 0.3);
  REQUIRE(iso.lines.size() == 1);
  const auto& line = iso.lines[0];
  CHECK(distance(line.front(), line.back()) < 1e-12);  // closed: chained all the way round
  // Interpolated points lie within the linear interpolation error of the circle r = 0.3: h²/(8r) for h = 1/40.
  for (Point p : line) CHECK(std::abs(std::hypot(p.x - 0.5, p.y - 0.5) - 0.3) < 1.0 / 1600 / (8 * 0.3) * 2);
}

TEST_CASE("clipping a field polygon at a level keeps the exact part above or below it") {
  // Triangle (0,0) (1,0) (0,1) with T = x: the part with T ≤ 0.5 has area 1/2 − (1/2)(1/2)²= 3/8.
  const std::vector<FieldVertex> triangle{{{0, 0}, 0.0}, {{1, 0}, 1.0}, {{0, 1}, 0.0}};
  const auto below = clip_to_level(triangle, 0.5, false), above = clip_to_level(triangle, 0.5, true);
  CHECK(polygon_area(below) == doctest::Approx(3.0 / 8.0).epsilon(1e-14));
  CHECK(polygon_area(above) == doctest::Approx(1.0 / 8.0).epsilon(1e-14));
  for (const FieldVertex& v : above) CHECK(v.second >= 0.5);
  CHECK(clip_to_level(triangle, 2.0, true).empty());
  CHECK(polygon_area(clip_to_level(triangle, 2.0, false)) == doctest::Approx(0.5).epsilon(1e-14));
}
