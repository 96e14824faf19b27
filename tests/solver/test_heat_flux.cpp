// Heat-flux density per triangle, q = −λ∇θ, against the exact flux through a layered wall.
#include <doctest/doctest.h>

#include <cmath>

#include "../support/fixtures.h"
#include "../test_support.h"
#include "solver/error_indicator.h"

using namespace edgeflux;

TEST_CASE("heat-flux density of a layered wall is the 1D flux in every triangle") {
  const Calculation calc = calculate(parse_detail_text(test::detail_xml(test::two_layer_wall_body()), "wall.xml"), {});
  // 1D layered wall: q = ΔT / (Rsi + Σ d/λ + Rse) (exact for the finite-volume solution,
  // which is linear in each layer).
  const double q_1d = 25.0 / (0.13 + 0.2 / 0.8 + 0.1 / 0.035 + 0.04);
  const auto flux = triangle_heat_flux(calc.mesh, calc.heat_loss.problem.triangle_conductivity, calc.heat_loss.temperature);
  REQUIRE(flux.size() == calc.mesh.triangles.size());
  for (const Point& q : flux) {
    CHECK(q.x == doctest::Approx(q_1d).epsilon(1e-9));  // heat flows from x = 0 (inside) to x = 0.3 (outside)
    CHECK(std::abs(q.y) < 1e-9 * q_1d);
  }
  // The same flux over the 1 m height is the heat flow the solver reports.
  CHECK(calc.heat_loss.field.environments[0].heat_flow == doctest::Approx(q_1d * 1.0).epsilon(1e-9));
}
