// Sweeps and comparisons: many calculations in parallel give exactly the serial results.
#include <doctest/doctest.h>

#include "../test_support.h"
#include "pipeline/variants.h"

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
