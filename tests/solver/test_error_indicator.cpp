// The flux-jump error indicator on hand-built meshes: zero where the discrete field is exact,
// positive where the flux jumps.
#include <doctest/doctest.h>

#include "solver/error_indicator.h"

using namespace edgeflux;

namespace {

/// The unit square as 2 × 2 squares, each cut into two counter-clockwise triangles; its boundary
/// edges are adiabatic (surface −1) except where `surface` says.
TriMesh square_mesh() {
  TriMesh m;
  for (int j = 0; j <= 2; ++j)
    for (int i = 0; i <= 2; ++i) m.points.push_back({0.5 * i, 0.5 * j});
  auto id = [](int i, int j) { return 3 * j + i; };
  for (int j = 0; j < 2; ++j)
    for (int i = 0; i < 2; ++i) {
      m.triangles.push_back({id(i, j), id(i + 1, j), id(i + 1, j + 1)});
      m.triangles.push_back({id(i, j), id(i + 1, j + 1), id(i, j + 1)});
    }
  m.triangle_region.assign(m.triangles.size(), 0);
  m.triangle_material.assign(m.triangles.size(), 0);
  return m;
}

}  // namespace

TEST_CASE("flux jumps vanish for a linear field in one material and appear across a conductivity change (exact)") {
  const TriMesh m = square_mesh();
  std::vector<double> linear;
  for (Point p : m.points) linear.push_back(3.0 - 2.0 * p.x + 0.5 * p.y);
  ThermalProblem uniform{std::vector<double>(m.triangles.size(), 1.7), {}};
  const auto eta = flux_jump_indicator(m, uniform, linear, {});
  REQUIRE(eta.size() == m.triangles.size());
  for (double e : eta) CHECK(e == doctest::Approx(0.0).scale(1.0));  // no interior jump, no surface edge

  // The same field with λ doubled in the right half: the normal flux jumps across x = 0.5.
  ThermalProblem split = uniform;
  for (std::size_t t = 0; t < m.triangles.size(); ++t) {
    const auto& v = m.triangles[t];
    if (m.points[v[0]].x + m.points[v[1]].x + m.points[v[2]].x > 1.5) split.triangle_conductivity[t] = 3.4;
  }
  const auto jumped = flux_jump_indicator(m, split, linear, {});
  double total = 0.0;
  for (std::size_t t = 0; t < m.triangles.size(); ++t) {
    CHECK(jumped[t] >= 0.0);
    total += jumped[t];
  }
  // Jump of λ ∂θ/∂x across x = 0.5: (3.4 − 1.7)·2 = 3.4 W/m² on two edges of length 0.5; each edge's
  // (|e|/2)·|e|·J² is shared half and half by its two triangles: 2 × 0.25·0.5·3.4² in all (exact).
  CHECK(total == doctest::Approx(2 * 0.25 * 0.5 * 3.4 * 3.4).epsilon(1e-12));
}
