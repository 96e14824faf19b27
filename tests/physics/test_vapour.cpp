// Tests of saturation vapour pressure, its inverse, dew point and humidity classes (ISO 13788).
#include <doctest/doctest.h>

#include <cmath>
#include <limits>
#include <stdexcept>

#include "physics/vapour.h"

using namespace edgeflux;

TEST_CASE("saturation vapour pressure at check temperatures") {
  // Check values computed from the ISO 13788 saturation-pressure formulas, to 0.1 Pa.
  CHECK(std::abs(saturation_vapour_pressure(0.0) - 610.5) <= 0.1);
  CHECK(std::abs(saturation_vapour_pressure(10.0) - 1227.3) <= 0.1);
  CHECK(std::abs(saturation_vapour_pressure(20.0) - 2337.0) <= 0.1);
  CHECK(std::abs(saturation_vapour_pressure(-10.0) - 259.3) <= 0.1);  // ice branch
}

TEST_CASE("saturation vapour pressure is continuous and rising across 0 °C") {
  // Both ISO 13788 branches give 610.5 Pa at 0 °C, so the curve has no jump there.
  const double below = saturation_vapour_pressure(-1e-9);
  const double at = saturation_vapour_pressure(0.0);
  CHECK(std::abs(at - below) <= 1e-6);
  double previous = saturation_vapour_pressure(-40.0);
  for (double theta = -39.5; theta <= 50.0; theta += 0.5) {
    const double p = saturation_vapour_pressure(theta);
    CHECK(p > previous);
    previous = p;
  }
}

TEST_CASE("saturation temperature inverts saturation pressure on both branches") {
  for (double theta = -40.0; theta <= 50.0; theta += 0.25) {
    CAPTURE(theta);
    CHECK(std::abs(saturation_temperature(saturation_vapour_pressure(theta)) - theta) <= 1e-9);
  }
  SUBCASE("ice branch") {
    CHECK(std::abs(saturation_temperature(saturation_vapour_pressure(-17.3)) - (-17.3)) <= 1e-9);
  }
  SUBCASE("water branch") {
    CHECK(std::abs(saturation_temperature(saturation_vapour_pressure(23.7)) - 23.7) <= 1e-9);
  }
  SUBCASE("branch point") {
    CHECK(std::abs(saturation_temperature(610.5)) <= 1e-12);  // ISO 13788: psat(0 °C) = 610.5 Pa
  }
}

TEST_CASE("dew point of indoor air at 20 °C and 50 %") {
  // Check value computed from the ISO 13788 formulas: 9.27 °C.
  const double p = vapour_pressure(20.0, 0.5);
  CHECK(std::abs(p - 0.5 * saturation_vapour_pressure(20.0)) <= 1e-12);
  CHECK(std::abs(dew_point(p) - 9.27) <= 0.01);
}

TEST_CASE("interior vapour pressure from humidity classes") {
  // Δp per class at θe ≤ 0 °C of 270/540/810/1080/1350 Pa, zero at 20 °C, pi = pe + 1.10·Δp
  // (ISO 13788 humidity classes, values from memory).
  CHECK(vapour_pressure_excess(1, -5.0) == 270.0);
  CHECK(vapour_pressure_excess(2, 0.0) == 540.0);
  CHECK(vapour_pressure_excess(3, -20.0) == 810.0);
  CHECK(vapour_pressure_excess(4, -5.0) == 1080.0);
  CHECK(vapour_pressure_excess(5, -5.0) == 1350.0);
  // Linear fall between 0 and 20 °C (from memory): half of 540 at 10 °C, a quarter of 1080 at 15 °C.
  CHECK(std::abs(vapour_pressure_excess(2, 10.0) - 270.0) <= 1e-9);
  CHECK(std::abs(vapour_pressure_excess(4, 15.0) - 270.0) <= 1e-9);
  CHECK(vapour_pressure_excess(5, 20.0) == 0.0);
  CHECK(vapour_pressure_excess(5, 25.0) == 0.0);

  // pe values below are arbitrary inputs below saturation; expected pi by hand from the
  // formula above (from memory): 300 + 1.10·810 = 1191 Pa; 1000 + 1.10·270 = 1297 Pa.
  CHECK(std::abs(interior_vapour_pressure_from_class(3, -5.0, 300.0) - 1191.0) <= 1e-9);
  CHECK(std::abs(interior_vapour_pressure_from_class(2, 10.0, 1000.0) - 1297.0) <= 1e-9);
  CHECK(interior_vapour_pressure_from_class(5, 25.0, 1500.0) == 1500.0);
}

TEST_CASE("vapour functions reject out-of-domain arguments") {
  const double nan = std::numeric_limits<double>::quiet_NaN();
  CHECK_THROWS_AS(saturation_vapour_pressure(nan), std::invalid_argument);
  CHECK_THROWS_AS(saturation_vapour_pressure(-150.0), std::invalid_argument);
  CHECK_THROWS_AS(saturation_vapour_pressure(150.0), std::invalid_argument);
  CHECK_THROWS_AS(saturation_temperature(0.0), std::invalid_argument);
  CHECK_THROWS_AS(saturation_temperature(-10.0), std::invalid_argument);
  CHECK_THROWS_AS(saturation_temperature(1e7), std::invalid_argument);
  CHECK_THROWS_AS(dew_point(nan), std::invalid_argument);
  CHECK_THROWS_AS(vapour_pressure(20.0, 1.2), std::invalid_argument);
  CHECK_THROWS_WITH_AS(vapour_pressure(20.0, 50.0), doctest::Contains("0.5"),
                       std::invalid_argument);
  CHECK_THROWS_AS(vapour_pressure(20.0, -0.1), std::invalid_argument);
  CHECK_THROWS_AS(vapour_pressure_excess(0, -5.0), std::invalid_argument);
  CHECK_THROWS_AS(vapour_pressure_excess(6, -5.0), std::invalid_argument);
  CHECK_THROWS_AS(vapour_pressure_excess(3, nan), std::invalid_argument);
  CHECK_THROWS_AS(interior_vapour_pressure_from_class(3, -5.0, -1.0), std::invalid_argument);
  // pe above saturation at θe (psat(−5 °C) ≈ 401 Pa) means exterior RH above 100 %.
  CHECK_THROWS_AS(interior_vapour_pressure_from_class(3, -5.0, 500.0), std::invalid_argument);
}
