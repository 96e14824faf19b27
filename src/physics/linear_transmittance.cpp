// ψ as the 2D coupling coefficient less the flanking 1D losses, and the temperature factor fRsi.
#include "physics/linear_transmittance.h"

#include <cmath>
#include <stdexcept>

#include <fmt/format.h>

namespace edgeflux {

double linear_transmittance(double coupling_coefficient_2d,
                            std::span<const FlankingContribution> flanking) {
  if (!std::isfinite(coupling_coefficient_2d) || coupling_coefficient_2d < 0.0) {
    throw std::invalid_argument(fmt::format(
        "thermal coupling coefficient L2D must be a finite value >= 0 W/(m·K), got {}",
        coupling_coefficient_2d));
  }
  // ψ is the heat loss the junction adds on top of what the flanking elements would lose if
  // heat flowed straight through them; it may be negative when the lengths overcount the area.
  double one_dimensional = 0.0;
  for (std::size_t j = 0; j < flanking.size(); ++j) {
    const FlankingContribution& element = flanking[j];
    if (!std::isfinite(element.u_value) || element.u_value < 0.0) {
      throw std::invalid_argument(fmt::format(
          "flanking element {}: U-value must be a finite value >= 0 W/(m²K), got {}", j,
          element.u_value));
    }
    if (!std::isfinite(element.length) || element.length < 0.0) {
      throw std::invalid_argument(fmt::format(
          "flanking element {}: length must be a finite value >= 0 m, got {}", j, element.length));
    }
    one_dimensional += element.u_value * element.length;
  }
  return coupling_coefficient_2d - one_dimensional;
}

double temperature_factor(double surface_temperature, double interior_temperature,
                          double exterior_temperature) {
  if (!std::isfinite(surface_temperature) || !std::isfinite(interior_temperature) ||
      !std::isfinite(exterior_temperature)) {
    throw std::invalid_argument(fmt::format(
        "temperature factor needs finite temperatures, got surface {} °C, interior {} °C, "
        "exterior {} °C",
        surface_temperature, interior_temperature, exterior_temperature));
  }
  if (interior_temperature == exterior_temperature) {
    throw std::invalid_argument(fmt::format(
        "temperature factor is undefined when interior and exterior temperatures are equal "
        "({} °C); give two different temperatures",
        interior_temperature));
  }
  // Normalising by the driving difference makes the result independent of the climate used in
  // the run, which is what lets one fRsi be checked against any design climate later.
  return (surface_temperature - exterior_temperature) /
         (interior_temperature - exterior_temperature);
}

}  // namespace edgeflux
