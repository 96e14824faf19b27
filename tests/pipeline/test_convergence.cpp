// Adaptive refinement and its error bars: the bars must contain the difference to converged
// reference values, refinement must terminate, and the conformity check must pass.
#include <doctest/doctest.h>

#include <cmath>
#include <filesystem>
#include <sys/wait.h>

#include "../support/run_program.h"
#include "../support/fixtures.h"
#include "../test_support.h"
#include "validation/iso10211_conformity.h"

using namespace edgeflux;

TEST_CASE("Richardson estimate: a fitted rate between 0.5 and 0.6 is used as is, so the bar is exact (exact algebra)") {
  const std::vector<int> nodes = {1000, 1800, 3300};
  std::vector<double> values;
  for (int n : nodes) values.push_back(2.0 + 3.0 * std::pow(n, -0.55));
  const ErrorEstimate e = richardson_estimate(nodes, values);
  CHECK(e.observed_rate == doctest::Approx(0.55).epsilon(1e-6));
  CHECK(e.error == doctest::Approx(3.0 * std::pow(3300.0, -0.55)).epsilon(1e-6));
  // With only two levels there is no fit: the bar takes the slowest rate, 0.5.
  const ErrorEstimate two = richardson_estimate({1000, 1800}, {values[0], values[1]});
  const double change = values[1] - values[0];
  CHECK(two.error == doctest::Approx(std::abs(change) * std::pow(1800.0, -0.5) / (std::pow(1000.0, -0.5) - std::pow(1800.0, -0.5))).epsilon(1e-12));
}

TEST_CASE("Richardson estimate: exact for Q = Q∞ + C N^-0.5, observed rate recovered for N^-1 (exact algebra)") {
  const std::vector<int> nodes = {1000, 1800, 3300};
  std::vector<double> slow, fast;
  for (int n : nodes) slow.push_back(2.0 + 3.0 / std::sqrt(n)), fast.push_back(2.0 + 3.0 / n);
  const ErrorEstimate e = richardson_estimate(nodes, slow);
  CHECK(e.error == doctest::Approx(3.0 / std::sqrt(3300.0)).epsilon(1e-9));
  CHECK(e.observed_rate == doctest::Approx(0.5).epsilon(1e-6));
  const ErrorEstimate f = richardson_estimate(nodes, fast);
  CHECK(f.observed_rate == doctest::Approx(1.0).epsilon(1e-6));
  // The rate behind the bar stops at 0.6: a fast-converging error is overstated, never understated.
  CHECK(f.error >= 3.0 / 3300.0);
  // The change is the larger of the last one and the one before, scaled by (N_prev/N_last)^a.
  const double a = 0.6;
  const double change = std::max(3.0 * (1.0 / 1800 - 1.0 / 3300), 3.0 * (1.0 / 1000 - 1.0 / 1800) * std::pow(1800.0 / 3300, a));
  CHECK(f.error == doctest::Approx(change * std::pow(3300.0, -a) / (std::pow(1800.0, -a) - std::pow(3300.0, -a))).epsilon(1e-9));
}

TEST_CASE("Case 2: the heat-flow error bar contains the difference to the converged 9.4915 W/m, at two targets") {
  // Computed reference: converged Φ = 9.4915 W/m from two independent fine-mesh calculations
  // (quadratic finite elements; a second-order finite-volume code) agreeing to 1e-4 W/m.
  for (double target : {1e-3, 1e-4}) {
    CalculationOptions options;
    options.target.coupling_relative = target;
    const Calculation calc = test::solve_file("tests/reference/iso10211_case2.xml", options);
    REQUIRE(calc.convergence.target_met);
    REQUIRE(calc.convergence.coupling_2d);
    const double flow_bar = calc.convergence.coupling_2d->error * 20.0;  // L2D × ΔT
    const double flow = calc.heat_loss.field.environments[0].heat_flow;
    CAPTURE(target);
    CAPTURE(flow);
    CAPTURE(flow_bar);
    CHECK(std::abs(flow - 9.4915) <= flow_bar + 1e-4);
    CHECK(flow_bar <= target * 9.4915 * 1.0001);  // and the bar meets the target it claims
  }
}

TEST_CASE("external corner: the error bar of S contains the difference to the fine-mesh 0.5587 ± 0.0003") {
  const std::string text = test::isothermal_corner(1);
  for (double target : {1e-3, 1e-4}) {
    CalculationOptions options;
    options.target.coupling_relative = target;
    const Calculation calc = calculate(parse_detail_text(text, "corner.xml"), options);
    REQUIRE(calc.convergence.target_met);
    const double shape = calc.heat_loss.field.environments[0].heat_flow - 10.0;  // λ = 1, ΔT = 1, a/t = b/t = 5
    const double bar = calc.convergence.coupling_2d->error;
    CAPTURE(target);
    CAPTURE(shape);
    CAPTURE(bar);
    CHECK(std::abs(shape - 0.5587) <= bar + 0.0003);  // computed fine-mesh reference 0.5587 ± 0.0003
  }
}

TEST_CASE("Case 1: each probe's error bar contains its difference to the series solution") {
  const Calculation calc = test::solve_file("tests/reference/iso10211_case1.xml");
  REQUIRE(calc.convergence.target_met);
  CHECK(calc.convergence.singular_heat_flow);  // 20 °C meets 0 °C at the top corner
  REQUIRE(calc.convergence.probes.size() == calc.heat_loss.field.probes.size());
  for (std::size_t i = 0; i < calc.convergence.probes.size(); ++i) {
    const ProbeReading& p = calc.heat_loss.field.probes[i];
    const double exact = iso10211_case1_series(p.at.x, p.at.y, 2.0);  // Incropera & DeWitt series
    CAPTURE(p.name);
    CHECK(std::abs(p.temperature - exact) <= calc.convergence.probes[i].error + 1e-6);
  }
}

TEST_CASE("refinement terminates on every shipped detail, example and reference file") {
  for (const char* folder : {"examples", "tests/reference", "details"}) {
    for (const std::string& file : test::detail_files_in(folder)) {
      CAPTURE(file);
      const Calculation calc = calculate(read_detail_file(file), {});
      CHECK(calc.convergence.target_met);
      CHECK(calc.convergence.levels.size() >= 3);
      CHECK(calc.mesh.n_points() < 2'000'000);
    }
  }
}

TEST_CASE("the conformity subcommand passes and names the classification (ISO 10211 Annex C, Cases 1 and 2)") {
  const auto [exit_code, output] = test::run_program("conformity -q");
  CHECK(exit_code == 0);
  CHECK(output.find("0 outside tolerance") != std::string::npos);
  CHECK(output.find("high-precision method") != std::string::npos);
  const ConformityReport report = iso10211_conformity();
  CHECK(report.rows.size() == 38);  // 28 points of Case 1, 9 points and the heat flow of Case 2
  CHECK(report.passed());
}
