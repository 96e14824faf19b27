// Sweeps and comparisons: many calculations in parallel give exactly the serial results.
#include <doctest/doctest.h>

#include "../test_support.h"
#include "pipeline/variants.h"
#include "report/variants_page.h"

using namespace edgeflux;

TEST_CASE("a parallel sweep equals the serial sweep, and ψ falls with the bracket's λ (physical trend)") {
  const std::string file = test::source_path("tests/data/bracket-wall.xml");
  const std::vector<ParameterRange> ranges = {{"lambda_plate", 1.0, 50.0, 3}};
  CalculationOptions options;
  const auto serial = run_sweep(file, ranges, options, 1);
  const auto parallel = run_sweep(file, ranges, options, 2);
  REQUIRE(serial.size() == 3);
  for (std::size_t i = 0; i < serial.size(); ++i) {
    REQUIRE(serial[i].error.empty());
    CHECK(serial[i].coupling_2d == parallel[i].coupling_2d);  // bit-identical
    CHECK(serial[i].psi[0].psi == parallel[i].psi[0].psi);
    CHECK(serial[i].temperature_factor == parallel[i].temperature_factor);
  }
  CHECK(serial[0].psi[0].psi < serial[1].psi[0].psi);
  CHECK(serial[1].psi[0].psi < serial[2].psi[0].psi);
  CHECK(serial[0].temperature_factor > serial[2].temperature_factor);
}

TEST_CASE("a comparison keeps the window's glazing and frame apart from its opaque surfaces, in the words every output uses") {
  const auto variants = run_comparison({test::source_path("details/intermediate-floor-external-insulation.xml"),
                                        test::source_path("details/window-reveal.xml")},
                                       {}, 2, {});
  REQUIRE(variants.size() == 2);
  REQUIRE(variants[0].verdicts.size() == 1);
  CHECK(variants[0].verdicts[0].kind == SurfaceKind::opaque);
  REQUIRE(variants[1].verdicts.size() == 2);
  CHECK(variants[1].verdicts[0].kind == SurfaceKind::opaque);
  CHECK(variants[1].verdicts[1].kind == SurfaceKind::glazing);
  // The frame is judged by the condensation criterion (surface RH 100 %), not the opaque mould criterion (ISO 13788).
  CHECK(variants[1].verdicts[1].criteria[0].criterion == "ISO 13788, 100 % surface RH");
  CHECK(variants[1].verdicts[1].required_temperature_factor < variants[1].verdicts[0].required_temperature_factor);
  for (const VariantSummary& v : variants) CHECK(v.input_sha256.size() == 64);
  const std::string page = variants_page("Comparison", variants, {}, "2000-01-01 00:00 UTC");
  CHECK(page.find("glazing and frames") != std::string::npos);
  CHECK(page.find(criterion_statement(variants[1].verdicts[1].criteria[0], variants[1].verdicts[1].temperature_factor)) != std::string::npos);
  CHECK(page.find("2000-01-01 00:00 UTC") != std::string::npos);
  CHECK(page.find("counter(pages)") != std::string::npos);
  CHECK(page.find(variants[0].input_sha256.substr(0, 12)) != std::string::npos);
  CHECK(page.find("passes") == std::string::npos);
  const std::string csv = variants_csv(variants, {});
  CHECK(csv.find("frsi_glazing,required_frsi_glazing,criteria_glazing") != std::string::npos);
}
