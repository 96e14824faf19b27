// Tests of ψ = L2D − Σ U·l and of the temperature factor fRsi (ISO 10211, ISO 14683).
#include <doctest/doctest.h>

#include <cmath>
#include <limits>
#include <stdexcept>
#include <vector>

#include "physics/layer_stack.h"
#include "physics/linear_transmittance.h"

using namespace edgeflux;

TEST_CASE("ψ is L2D less the flanking one-dimensional losses") {
  // ISO 10211 / ISO 14683 definition; hand computation: 0.95 − (0.30·1.2 + 0.25·1.5)
  // = 0.95 − 0.735 = 0.215 W/(m·K).
  const std::vector<FlankingContribution> flanking{{0.30, 1.2}, {0.25, 1.5}};
  CHECK(std::abs(linear_transmittance(0.95, flanking) - 0.215) <= 1e-12);
  // Without flanking elements ψ equals L2D (same definition).
  CHECK(linear_transmittance(0.42, {}) == 0.42);
}

TEST_CASE("ψ may be negative when the lengths overcount the flanking area") {
  // External dimensions at an external corner count the corner twice (ISO 14683), so ψe < 0
  // is normal. Hand computation: 0.50 − 2·(0.25·1.2) = −0.10 W/(m·K).
  const std::vector<FlankingContribution> flanking{{0.25, 1.2}, {0.25, 1.2}};
  CHECK(std::abs(linear_transmittance(0.50, flanking) - (-0.10)) <= 1e-12);
}

TEST_CASE("internal and external ψ of an external corner differ by 2·U·d") {
  // ISO 14683: ψa − ψb = Σ U·(lb − la); for an external corner of two equal walls of thickness
  // d, internal legs are shorter by d, so ψi = ψe + 2·U·d.
  const double u = 0.28;
  const double d = 0.36;
  const double external_leg = 1.5;
  const double l2d = 0.95;
  const std::vector<FlankingContribution> external{{u, external_leg}, {u, external_leg}};
  const std::vector<FlankingContribution> internal{{u, external_leg - d}, {u, external_leg - d}};
  const double psi_e = linear_transmittance(l2d, external);
  const double psi_i = linear_transmittance(l2d, internal);
  CHECK(std::abs(psi_i - (psi_e + 2.0 * u * d)) <= 1e-12);
}

TEST_CASE("ψ rejects negative or non-finite inputs") {
  const double inf = std::numeric_limits<double>::infinity();
  const std::vector<FlankingContribution> negative_u{{0.3, 1.0}, {-0.3, 1.0}};
  const std::vector<FlankingContribution> negative_length{{0.3, -1.0}};
  CHECK_THROWS_AS(linear_transmittance(-0.1, {}), std::invalid_argument);
  CHECK_THROWS_AS(linear_transmittance(inf, {}), std::invalid_argument);
  CHECK_THROWS_WITH_AS(linear_transmittance(0.5, negative_u),
                       doctest::Contains("flanking element 1"), std::invalid_argument);
  CHECK_THROWS_AS(linear_transmittance(0.5, negative_length), std::invalid_argument);
}

TEST_CASE("temperature factor of a given surface temperature") {
  // fRsi = (θsi − θe)/(θi − θe) (ISO 10211); hand computation: (12.62 + 5)/25 = 0.7048.
  CHECK(std::abs(temperature_factor(12.62, 20.0, -5.0) - 0.7048) <= 1e-12);
  CHECK(temperature_factor(20.0, 20.0, -5.0) == 1.0);  // surface at room temperature
  CHECK(temperature_factor(-5.0, 20.0, -5.0) == 0.0);  // surface at outdoor temperature
}

TEST_CASE("surface temperature of a temperature factor in another climate (ISO 13788: θsi = θe + fRsi·(θi − θe))") {
  // Hand computation: fRsi 0.7048 at 20 / −5 °C is 12.62 °C; at 21 / −10 °C it is −10 + 0.7048·31 = 11.8488 °C.
  CHECK(surface_temperature_for_factor(0.7048, 20.0, -5.0) == doctest::Approx(12.62).epsilon(1e-12));
  CHECK(surface_temperature_for_factor(0.7048, 21.0, -10.0) == doctest::Approx(11.8488).epsilon(1e-12));
  for (double t : {-5.0, 3.3, 12.62, 20.0})  // the exact inverse of temperature_factor
    CHECK(surface_temperature_for_factor(temperature_factor(t, 20.0, -5.0), 20.0, -5.0) == doctest::Approx(t).epsilon(1e-14));
}

TEST_CASE("plain wall: fRsi = 1 − Rsi·U with Rsi = 0.25") {
  // Known result (ISO 13788, ISO 10211): in 1D the heat flux is q = U·(θi − θe) and the inner
  // surface sits Rsi·q below θi, so fRsi = 1 − Rsi·U exactly; tolerance covers rounding only.
  const double rsi = 0.25;  // ISO 13788 clause 4
  const double rse = 0.04;  // ISO 6946:2017 Table 7
  const double theta_i = 20.0;
  const double theta_e = -5.0;
  // Layer conductivities as in ISO 10456:2007 Table 3 (from memory); insulation values typical.
  const std::vector<std::vector<Layer>> walls{
      {{0.240, 0.6}},                                               // solid masonry, no insulation
      {{0.015, 0.80}, {0.200, 2.3}, {0.100, 0.035}, {0.010, 1.0}},  // insulated concrete
      {{0.0125, 0.25}, {0.160, 0.040}, {0.015, 0.13}},              // insulated timber frame
  };
  for (std::size_t w = 0; w < walls.size(); ++w) {
    CAPTURE(w);
    const double u = thermal_transmittance(rsi, walls[w], rse);
    const double q = u * (theta_i - theta_e);
    const double theta_si = theta_i - rsi * q;
    CHECK(temperature_factor(theta_si, theta_i, theta_e) ==
          doctest::Approx(1.0 - rsi * u).epsilon(1e-12));
  }
}

TEST_CASE("temperature factor is undefined for equal interior and exterior temperatures") {
  const double nan = std::numeric_limits<double>::quiet_NaN();
  CHECK_THROWS_AS(temperature_factor(15.0, 20.0, 20.0), std::invalid_argument);
  CHECK_THROWS_WITH_AS(temperature_factor(15.0, 20.0, 20.0), doctest::Contains("equal"),
                       std::invalid_argument);
  CHECK_THROWS_AS(temperature_factor(nan, 20.0, -5.0), std::invalid_argument);
  CHECK_THROWS_AS(temperature_factor(15.0, nan, -5.0), std::invalid_argument);
}
