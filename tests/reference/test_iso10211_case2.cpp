// ISO 10211 validation Case 2: composite section with an aluminium profile.
#include <doctest/doctest.h>

#include <cmath>

#include "../support/transformed_section.h"
#include "../test_support.h"

using namespace edgeflux;

namespace {
struct Point9 { const char* name; double standard; double converged; };
// Standard: ISO 10211:2017 Annex C, Case 2 (tolerance 0.1 K). Converged: computed
// references from two independent fine-mesh calculations agreeing to 1e-4 W/m.
constexpr Point9 points[] = {{"A", 7.1, 7.064},   {"B", 0.8, 0.761},   {"C", 7.9, 7.897},
                             {"D", 6.3, 6.272},   {"E", 0.8, 0.827},   {"F", 16.4, 16.408},
                             {"G", 16.3, 16.334}, {"H", 16.8, 16.767}, {"I", 18.3, 18.334}};
constexpr double standard_heat_flow = 9.5;     // W/m, ISO 10211 Annex C Case 2, tolerance 0.1 W/m
constexpr double converged_heat_flow = 9.4915; // W/m, computed reference (two fine-mesh calculations agreeing to 1e-4 W/m)

void check_case2(const Calculation& calc, double point_tolerance_to_converged) {
  for (const Point9& p : points) {
    CAPTURE(p.name);
    const double t = test::probe(calc, p.name);
    CHECK(std::abs(t - p.standard) <= 0.1);
    CHECK(std::abs(t - p.converged) <= point_tolerance_to_converged);
  }
  const double flow = calc.heat_loss.field.environments[0].heat_flow;
  CHECK(std::abs(flow - standard_heat_flow) <= 0.1);
  CHECK(std::abs(calc.heat_loss.field.balance.relative) < 1e-9);
}
}  // namespace

TEST_CASE("ISO 10211 Case 2 at default settings: standard's tolerances and 0.1 % of the converged flow") {
  const Calculation calc = test::solve_file("tests/reference/iso10211_case2.xml");
  check_case2(calc, 0.05);
  const double flow = calc.heat_loss.field.environments[0].heat_flow;
  MESSAGE("Case 2 default: Φ = ", flow, " W/m with ", calc.mesh.n_points(), " nodes (", calc.mesh.mesher, ")");
  CHECK(std::abs(flow - converged_heat_flow) <= 1e-3 * converged_heat_flow);
}

TEST_CASE("ISO 10211 Case 2 on fixed meshes of both kinds: the flow error falls with every doubling of density") {
  for (auto mesher : {MeshSettings::Mesher::grid, MeshSettings::Mesher::delaunay}) {
    double previous_error = 1e9;
    for (double density : {1.0, 2.0, 4.0}) {
      CalculationOptions options;
      options.density = density;
      options.mesher = mesher;
      options.adaptive = false;
      const Calculation calc = test::solve_file("tests/reference/iso10211_case2.xml", options);
      CAPTURE(calc.mesh.mesher);
      CAPTURE(density);
      check_case2(calc, 0.05);
      const double error = std::abs(calc.heat_loss.field.environments[0].heat_flow - converged_heat_flow);
      CHECK(error < previous_error);
      previous_error = error;
    }
    CHECK(previous_error <= 1e-3 * converged_heat_flow);  // 0.1 % at density 4 with either mesher
  }
}

TEST_CASE("ISO 10211 Case 2 turned by 17°, 30° and 36.87° (rectangles as rotated polygons, 12-digit coordinates) "
          "and moved far away still passes") {
  const CrossSection section = read_detail_file(test::source_path("tests/reference/iso10211_case2.xml"));
  for (double degrees : {17.0, 30.0, 36.8698976458440}) {
    CAPTURE(degrees);
    const Calculation calc = calculate(test::turned_section(section, degrees, {12345.678, -9876.543}), {});
    check_case2(calc, 0.05);
    const double flow = calc.heat_loss.field.environments[0].heat_flow;
    CHECK(std::abs(flow - converged_heat_flow) <= 1e-3 * converged_heat_flow);
  }
}
