// Fields the scheme must reproduce exactly: a layered wall with surface resistances and a linear
// field; plus conservation and determinism.
#include <doctest/doctest.h>

#include <cmath>

#include "../support/fixtures.h"
#include "../test_support.h"
#include "input/read_detail_file.h"
#include "solver/solve_temperatures.h"

using namespace edgeflux;

namespace {
// Three layers, 1 m high, inside on the left. Layer values are arbitrary: the check is exact
// algebra (ISO 6946 clause 6: Φ = ΔT / (Rsi + Σ d/λ + Rse) for a plane element).
const std::string layered_wall = test::layered_wall(
    {{"plaster", 0.7, 15}, {"masonry", 0.99, 175}, {"insulation", 0.035, 160}}, 1000, 20, -5, R"(
  <probes>
    <probe name="x0" at="0,500"/> <probe name="x15" at="15,300"/> <probe name="x100" at="100,700"/>
    <probe name="x190" at="190,500"/> <probe name="x270" at="270,100"/> <probe name="x350" at="350,900"/>
  </probes>)");

double analytic_wall_temperature(double x_mm, double q) {
  // θ(x) = θi − q (Rsi + ∫0^x dx/λ), piecewise linear.
  const double d[3] = {15, 175, 160}, lambda[3] = {0.7, 0.99, 0.035};
  double resistance = 0.13, start = 0.0;
  for (int k = 0; k < 3; ++k) {
    const double inside_layer = std::clamp(x_mm - start, 0.0, d[k]);
    resistance += inside_layer * 1e-3 / lambda[k];
    start += d[k];
  }
  return 20.0 - q * resistance;
}
}  // namespace

TEST_CASE("layered wall: Φ = ΔT/(Rsi + Σd/λ + Rse) to 1e-6 and temperatures linear in each layer") {
  const double total_resistance = 0.13 + 0.015 / 0.7 + 0.175 / 0.99 + 0.160 / 0.035 + 0.04;
  const double q = 25.0 / total_resistance;  // W/m² = W/m for a 1 m high wall
  for (auto mesher : {MeshSettings::Mesher::grid, MeshSettings::Mesher::delaunay}) {
    CalculationOptions options;
    options.mesher = mesher;
    const Calculation calc = calculate(parse_detail_text(layered_wall, "layered_wall.xml"), options);
    CAPTURE(calc.mesh.mesher);
    CHECK(calc.heat_loss.field.environments[0].heat_flow == doctest::Approx(q).epsilon(1e-6));
    CHECK(calc.heat_loss.field.environments[1].heat_flow == doctest::Approx(-q).epsilon(1e-6));
    CHECK(*calc.heat_loss.field.coupling_2d == doctest::Approx(1.0 / total_resistance).epsilon(1e-6));
    for (const ProbeReading& p : calc.heat_loss.field.probes) {
      CAPTURE(p.name);
      CHECK(p.temperature == doctest::Approx(analytic_wall_temperature(p.at.x * 1000.0, q)).epsilon(1e-8));
    }
  }
}

TEST_CASE("a linear field is reproduced exactly on an unstructured mesh, and the balance closes to 1e-9") {
  // A homogeneous square made of two polygons of the same material so that the
  // Delaunay mesh has slanted interior edges; fixed 0 °C on the left, 10 °C on the right.
  const std::string text = test::detail_xml(R"(
  <materials><material id="m" conductivity="1.7" source="test value"/></materials>
  <regions>
    <polygon material="m" points="0,0 400,0 130,400 0,400"/>
    <polygon material="m" points="400,0 400,400 130,400"/>
  </regions>
  <environments>
    <environment id="cold" temperature="0"/>
    <environment id="warm" temperature="10"/>
  </environments>
  <boundaries>
    <fixed-temperature environment="cold" path="0,400 0,0"/>
    <fixed-temperature environment="warm" path="400,0 400,400"/>
  </boundaries>)");
  CalculationOptions options;
  options.mesher = MeshSettings::Mesher::delaunay;
  const Calculation calc = calculate(parse_detail_text(text, "linear.xml"), options);
  double worst = 0.0;
  for (int i = 0; i < calc.mesh.n_points(); ++i)
    worst = std::max(worst, std::abs(calc.heat_loss.temperature[i] - 10.0 * calc.mesh.points[i].x / 0.4));
  CHECK(worst < 1e-10);
  // Exact flow: λ ΔT h / L = 1.7 · 10 · 0.4 / 0.4 W/m (Fourier's law, common practice).
  CHECK(calc.heat_loss.field.environments[1].heat_flow == doctest::Approx(17.0).epsilon(1e-9));
  CHECK(std::abs(calc.heat_loss.field.balance.relative) < 1e-9);
}

TEST_CASE("the same input gives identical meshes and temperatures twice") {
  for (auto mesher : {MeshSettings::Mesher::grid, MeshSettings::Mesher::delaunay}) {
    CalculationOptions options;
    options.mesher = mesher;
    const Calculation a = test::solve_file("tests/reference/iso10211_case2.xml", options);
    const Calculation b = test::solve_file("tests/reference/iso10211_case2.xml", options);
    REQUIRE(a.mesh.n_points() == b.mesh.n_points());
    REQUIRE(a.mesh.n_triangles() == b.mesh.n_triangles());
    bool same = true;
    for (int i = 0; i < a.mesh.n_points(); ++i)
      same = same && a.mesh.points[i].x == b.mesh.points[i].x && a.mesh.points[i].y == b.mesh.points[i].y &&
             a.heat_loss.temperature[i] == b.heat_loss.temperature[i];
    for (int t = 0; t < a.mesh.n_triangles(); ++t) same = same && a.mesh.triangles[t] == b.mesh.triangles[t];
    CHECK(same);
  }
}

TEST_CASE("the three linear solvers agree to 1e-8 K") {
  const CrossSection section = read_detail_file(test::source_path("tests/reference/iso10211_case2.xml"));
  CalculationOptions options;
  const Calculation reference = calculate(section, options);
  for (auto solver : {LinearSolver::simplicial_ldlt, LinearSolver::conjugate_gradient}) {
    options.solve.solver = solver;
    const Calculation other = calculate(section, options);
    double worst = 0.0;
    for (int i = 0; i < reference.mesh.n_points(); ++i)
      worst = std::max(worst, std::abs(reference.heat_loss.temperature[i] - other.heat_loss.temperature[i]));
    CAPTURE(other.heat_loss.info.solver);
    CHECK(worst < 1e-8);
  }
}

TEST_CASE("layers whose λ span ten orders of magnitude (1e-5 to 1e5) still give Φ = ΔT/(Rsi + Σd/λ + Rse) to 1e-6") {
  // ISO 6946 clause 6, layers in series (exact for the finite-volume solution); the widest span
  // the reader accepts (docs/detail-format.md, Limits).
  const std::string wall = test::layered_wall(
      {{"a", 1e-5, 100}, {"b", 0.1, 100}, {"c", 1.0, 100}, {"d", 100.0, 100}, {"e", 1e5, 100}}, 1000, 20, 0);
  const Calculation calc = calculate(parse_detail_text(wall, "contrast.xml"), {});
  const double resistance = 0.13 + 0.04 + 0.1 / 1e-5 + 0.1 / 0.1 + 0.1 / 1.0 + 0.1 / 100.0 + 0.1 / 1e5;
  CHECK(*calc.heat_loss.field.coupling_2d == doctest::Approx(1.0 / resistance).epsilon(1e-6));
  CHECK(std::abs(calc.heat_loss.field.balance.relative) < 1e-4);  // ISO 10211 energy-balance criterion
}
