// Tests of the series thermal resistance and U-value of a layer stack (ISO 6946).
#include <doctest/doctest.h>

#include <cmath>
#include <limits>
#include <stdexcept>
#include <vector>

#include "physics/layer_stack.h"

using namespace edgeflux;

namespace {

// A plastered, externally insulated concrete wall. Conductivities: lime-sand plaster 0.80,
// reinforced concrete (1 %) 2.3, cement-sand render 1.0 (ISO 10456:2007 Table 3, from memory);
// mineral wool 0.035 is a typical declared value, not a normative one.
const std::vector<Layer> insulated_wall{
    {0.015, 0.80}, {0.200, 2.3}, {0.100, 0.035}, {0.010, 1.0}};

}  // namespace

TEST_CASE("thermal resistance of a layer stack is the sum of d/λ") {
  // Hand computation: 0.015/0.80 + 0.200/2.3 + 0.100/0.035 + 0.010/1.0
  //                 = 0.01875 + 0.0869565 + 2.8571429 + 0.0100 = 2.9728494 m²K/W.
  CHECK(std::abs(thermal_resistance(insulated_wall) - 2.9728494) <= 1e-7);
  const std::vector<Layer> one{{0.24, 0.6}};
  CHECK(std::abs(thermal_resistance(one) - 0.4) <= 1e-15);  // hand computation: 0.24/0.6
  CHECK(thermal_resistance({}) == 0.0);
}

TEST_CASE("U-value follows ISO 6946: U = 1/(Rsi + Σ d/λ + Rse)") {
  // Rsi 0.13, Rse 0.04 (ISO 6946:2017 Table 7). Hand computation:
  // 1/(0.13 + 2.9728494 + 0.04) = 1/3.1428494 = 0.3181826 W/(m²K).
  CHECK(std::abs(thermal_transmittance(0.13, insulated_wall, 0.04) - 0.3181826) <= 1e-7);
  // Surface films alone: 1/(0.13 + 0.04) = 5.882353 W/(m²K) (hand computation).
  CHECK(std::abs(thermal_transmittance(0.13, {}, 0.04) - 5.882353) <= 1e-6);
}

TEST_CASE("a larger surface resistance lowers U") {
  const double heat_loss_run = thermal_transmittance(0.13, insulated_wall, 0.04);
  const double temperature_run = thermal_transmittance(0.25, insulated_wall, 0.04);
  CHECK(temperature_run < heat_loss_run);
}

TEST_CASE("bad layers and surface resistances are rejected") {
  const double nan = std::numeric_limits<double>::quiet_NaN();
  const std::vector<Layer> zero_thickness{{0.1, 0.5}, {0.0, 0.5}};
  const std::vector<Layer> negative_conductivity{{0.1, -0.5}};
  const std::vector<Layer> zero_conductivity{{0.1, 0.0}};
  const std::vector<Layer> nan_thickness{{nan, 1.0}};
  CHECK_THROWS_AS(thermal_resistance(zero_thickness), std::invalid_argument);
  CHECK_THROWS_WITH_AS(thermal_resistance(zero_thickness), doctest::Contains("layer 1"),
                       std::invalid_argument);
  CHECK_THROWS_AS(thermal_resistance(negative_conductivity), std::invalid_argument);
  CHECK_THROWS_AS(thermal_resistance(zero_conductivity), std::invalid_argument);
  CHECK_THROWS_AS(thermal_resistance(nan_thickness), std::invalid_argument);
  CHECK_THROWS_AS(thermal_transmittance(-0.13, insulated_wall, 0.04), std::invalid_argument);
  CHECK_THROWS_AS(thermal_transmittance(0.13, insulated_wall, nan), std::invalid_argument);
  CHECK_THROWS_AS(thermal_transmittance(0.0, {}, 0.0), std::invalid_argument);
}
