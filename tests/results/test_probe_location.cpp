// Probe location through the triangle grid: a linear field is read back exactly anywhere in the
// mesh, on edges and at nodes, and nothing is returned outside it.
#include <doctest/doctest.h>

#include <random>
#include <vector>

#include "results/field_results.h"

using namespace edgeflux;

namespace {

/// An L-shaped mesh of right triangles, graded so cells of the grid hold triangles of very
/// different sizes: nx × ny squares over [0, 1] × [0, 1], less the top-right quarter.
TriMesh l_shaped_mesh(int nx, int ny) {
  TriMesh mesh;
  auto coordinate = [](int i, int n) { const double t = double(i) / n; return t * t; };  // fine near 0
  for (int j = 0; j <= ny; ++j)
    for (int i = 0; i <= nx; ++i) mesh.points.push_back({coordinate(i, nx), coordinate(j, ny)});
  auto node = [&](int i, int j) { return j * (nx + 1) + i; };
  for (int j = 0; j < ny; ++j)
    for (int i = 0; i < nx; ++i) {
      if (mesh.points[node(i, j)].x >= 0.5 && mesh.points[node(i, j)].y >= 0.5) continue;
      mesh.triangles.push_back({node(i, j), node(i + 1, j), node(i + 1, j + 1)});
      mesh.triangles.push_back({node(i, j), node(i + 1, j + 1), node(i, j + 1)});
    }
  mesh.triangle_region.assign(mesh.triangles.size(), 0);
  mesh.triangle_material.assign(mesh.triangles.size(), 0);
  return mesh;
}

double linear_field(Point p) { return 3.0 + 20.0 * p.x - 7.0 * p.y; }

}  // namespace

TEST_CASE("probe location: a linear field is interpolated exactly; points outside give nothing") {
  // Linear interpolation on triangles reproduces a linear field exactly (common practice), so
  // every located point must read back the field to rounding, wherever the grid put it.
  const TriMesh mesh = l_shaped_mesh(60, 40);
  std::vector<double> temperature;
  for (Point p : mesh.points) temperature.push_back(linear_field(p));

  std::mt19937 random(4);
  std::uniform_real_distribution<double> unit(0.0, 1.0);
  std::vector<Point> inside, outside;
  for (int k = 0; k < 20000; ++k) {
    // The missing quarter starts at the first nodes past 0.5: x = (43/60)² ≈ 0.514, y = (29/40)²
    // ≈ 0.526. Points in a thin band along its edges are left out; they would test nothing new.
    const Point p{unit(random), unit(random)};
    if (p.x < 0.51 || p.y < 0.52) inside.push_back(p);
    else if (p.x > 0.52 && p.y > 0.53) outside.push_back(p);
  }
  // Nodes and edge midpoints lie on several triangles at once.
  for (int t = 0; t < mesh.n_triangles(); t += 7) {
    const auto& tri = mesh.triangles[t];
    inside.push_back(mesh.points[tri[0]]);
    inside.push_back(0.5 * (mesh.points[tri[1]] + mesh.points[tri[2]]));
  }
  outside.push_back({-0.01, 0.2});
  outside.push_back({0.3, 1.0001});
  outside.push_back({2.0, 2.0});

  const auto values = temperatures_at(mesh, temperature, inside);
  for (std::size_t k = 0; k < inside.size(); ++k) {
    CAPTURE(inside[k].x);
    CAPTURE(inside[k].y);
    REQUIRE(values[k].has_value());
    CHECK(*values[k] == doctest::Approx(linear_field(inside[k])).epsilon(1e-12));
  }
  const auto none = temperatures_at(mesh, temperature, outside);
  for (std::size_t k = 0; k < outside.size(); ++k) {
    CAPTURE(outside[k].x);
    CAPTURE(outside[k].y);
    CHECK_FALSE(none[k].has_value());
  }
  // The one-point form gives the same answer.
  CHECK(*temperature_at(mesh, temperature, inside[0]) == doctest::Approx(linear_field(inside[0])).epsilon(1e-12));
}
