// Tests of equivalent conductivities of frame cavities and air layers (ISO 10077-2, ISO 6946).
#include <doctest/doctest.h>

#include <cmath>
#include <limits>
#include <stdexcept>

#include "physics/cavity.h"

using namespace edgeflux;

TEST_CASE("frame cavity where conduction through the air dominates") {
  // ISO 10077-2 formula (clause from memory), hand computation for d = 10 mm, b = 20 mm:
  // ha = max(0.025/0.010, 0.73·10^(1/3)) = max(2.5, 1.5727) = 2.5 W/(m²K);
  // hr = 2.11·(1 − 0.5 + √1.25) = 3.4141 W/(m²K); λeq = d·(ha + hr) = 0.059141 W/(m·K).
  CHECK(std::abs(frame_cavity_conductivity(0.010, 0.020) - 0.059141) <= 1e-6);
}

TEST_CASE("frame cavity where convection dominates") {
  // Same formula (from memory), d = 50 mm, b = 10 mm: ha = max(0.5, 1.5727) = 1.5727 W/(m²K);
  // hr = 2.11·(1 − 5 + √26) = 2.3189 W/(m²K); λeq = 0.05·3.8917 = 0.194583 W/(m·K).
  CHECK(std::abs(frame_cavity_conductivity(0.050, 0.010) - 0.194583) <= 1e-6);
}

TEST_CASE("slightly ventilated frame cavity takes twice the unventilated value") {
  // ISO 10077-2 (from memory): slit 2–10 mm doubles λeq.
  CHECK(std::abs(slightly_ventilated_frame_cavity_conductivity(0.010, 0.020) - 2.0 * 0.059141) <=
        2e-6);
}

TEST_CASE("frame cavity rejects non-positive sizes") {
  CHECK_THROWS_AS(frame_cavity_conductivity(0.0, 0.02), std::invalid_argument);
  CHECK_THROWS_AS(frame_cavity_conductivity(0.01, -0.02), std::invalid_argument);
  CHECK_THROWS_AS(frame_cavity_conductivity(std::numeric_limits<double>::quiet_NaN(), 0.02),
                  std::invalid_argument);
}

TEST_CASE("air layer resistance at the rows of ISO 6946:2017 Table 8") {
  CHECK(std::abs(air_layer_resistance(0.005) - 0.11) <= 1e-12);  // ISO 6946:2017 Table 8
  CHECK(std::abs(air_layer_resistance(0.007) - 0.13) <= 1e-12);  // ISO 6946:2017 Table 8
  CHECK(std::abs(air_layer_resistance(0.010) - 0.15) <= 1e-12);  // ISO 6946:2017 Table 8
  CHECK(std::abs(air_layer_resistance(0.015) - 0.17) <= 1e-12);  // ISO 6946:2017 Table 8
  CHECK(std::abs(air_layer_resistance(0.025) - 0.18) <= 1e-12);  // ISO 6946:2017 Table 8
  CHECK(std::abs(air_layer_resistance(0.100) - 0.18) <= 1e-12);  // ISO 6946:2017 Table 8, ≥ 25 mm
}

TEST_CASE("air layer resistance is interpolated linearly between rows") {
  // Linear interpolation between Table 8 rows (ISO 6946 practice), hand computation:
  // 6 mm: (0.11 + 0.13)/2 = 0.12; 12.5 mm: (0.15 + 0.17)/2 = 0.16; 20 mm: (0.17 + 0.18)/2 = 0.175.
  CHECK(std::abs(air_layer_resistance(0.006) - 0.12) <= 1e-12);
  CHECK(std::abs(air_layer_resistance(0.0125) - 0.16) <= 1e-12);
  CHECK(std::abs(air_layer_resistance(0.020) - 0.175) <= 1e-12);
  // λeq = d/R: 0.020/0.175 = 0.1142857 W/(m·K) (hand computation).
  CHECK(std::abs(air_layer_conductivity(0.020) - 0.1142857) <= 1e-7);
}

TEST_CASE("air layers thinner than the first table row are rejected") {
  CHECK_THROWS_AS(air_layer_resistance(0.004), std::invalid_argument);
  CHECK_THROWS_AS(air_layer_resistance(0.0), std::invalid_argument);
  CHECK_THROWS_AS(air_layer_resistance(std::numeric_limits<double>::infinity()),
                  std::invalid_argument);
  CHECK_THROWS_AS(air_layer_conductivity(-0.01), std::invalid_argument);
}

TEST_CASE("an irregular cavity becomes the rectangle of its area with its bounding rectangle's aspect ratio (ISO 10077-2, "
          "rule from memory; values by hand)") {
  // An L-shaped cavity in a 20 × 10 mm bounding rectangle (d = 20 mm along the heat flow), area 150 mm²:
  // d' = √(150·20/10) = 17.3205 mm, b' = √(150·10/20) = 8.6603 mm;
  // horizontal: ha = max(0.025/0.0173205, 0.73·10^(1/3)) = max(1.44338, 1.57274) = 1.57274 W/(m²K);
  // hr = 2.11·(1 − 2 + √5) = 2.60810 W/(m²K); λeq = 0.0173205·(1.57274 + 2.60810) = 0.072414 W/(m·K).
  const FrameCavity h = frame_cavity(0.020, 0.010, 150e-6, CavityHeatFlow::horizontal, CavityVentilation::unventilated);
  CHECK(h.depth == doctest::Approx(0.0173205).epsilon(1e-5));
  CHECK(h.width == doctest::Approx(0.0086603).epsilon(1e-5));
  CHECK(h.convection == doctest::Approx(1.57274).epsilon(1e-5));
  CHECK(h.radiation == doctest::Approx(2.60810).epsilon(1e-5));
  CHECK(h.conductivity == doctest::Approx(0.072414).epsilon(1e-4));
  // Upward: ha = max(1.44338, 1.14·10^(1/3) = 2.45606) = 2.45606; λeq = 0.0173205·(2.45606 + 2.60810) = 0.087714.
  CHECK(frame_cavity(0.020, 0.010, 150e-6, CavityHeatFlow::upward, CavityVentilation::unventilated).conductivity ==
        doctest::Approx(0.087714).epsilon(1e-4));
  // Downward: ha = C1/d' = 1.44338; λeq = 0.0173205·(1.44338 + 2.60810) = 0.070174.
  CHECK(frame_cavity(0.020, 0.010, 150e-6, CavityHeatFlow::downward, CavityVentilation::unventilated).conductivity ==
        doctest::Approx(0.070174).epsilon(1e-4));
  // Slightly ventilated: twice the unventilated value.
  CHECK(frame_cavity(0.020, 0.010, 150e-6, CavityHeatFlow::horizontal, CavityVentilation::slightly_ventilated).conductivity ==
        doctest::Approx(2 * 0.072414).epsilon(1e-4));
  // A rectangle is its own equivalent rectangle.
  CHECK(frame_cavity(0.010, 0.020, 200e-6, CavityHeatFlow::horizontal, CavityVentilation::unventilated).conductivity ==
        doctest::Approx(0.059141).epsilon(1e-5));
  CHECK_THROWS_AS(frame_cavity(0.010, 0.020, 300e-6, CavityHeatFlow::horizontal, CavityVentilation::unventilated),
                  std::invalid_argument);
}
