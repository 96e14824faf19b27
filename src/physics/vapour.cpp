// Magnus-type saturation pressure over water and ice, its inverse, and humidity-class indoor pressures.
#include "physics/vapour.h"

#include <algorithm>
#include <array>
#include <cmath>
#include <stdexcept>

#include <fmt/format.h>

namespace edgeflux {

namespace {

// Both branches share psat(0 °C) = 610.5 Pa, so the curve is continuous at the triple point; the
// ice branch is steeper because sublimation takes more energy than evaporation.
constexpr double triple_point_pressure = 610.5;  // Pa
constexpr double water_a = 17.269;
constexpr double water_b = 237.3;  // °C
constexpr double ice_a = 21.875;
constexpr double ice_b = 265.5;  // °C

void check_temperature(double temperature, const char* what) {
  if (!std::isfinite(temperature) || temperature < vapour_temperature_min ||
      temperature > vapour_temperature_max) {
    throw std::invalid_argument(fmt::format("{} must be between {} and {} °C, got {}", what,
                                            vapour_temperature_min, vapour_temperature_max,
                                            temperature));
  }
}

double psat(double temperature) {
  if (temperature >= 0.0) {
    return triple_point_pressure * std::exp(water_a * temperature / (water_b + temperature));
  }
  return triple_point_pressure * std::exp(ice_a * temperature / (ice_b + temperature));
}

}  // namespace

double saturation_vapour_pressure(double temperature) {
  check_temperature(temperature, "temperature for the saturation vapour pressure");
  return psat(temperature);
}

double saturation_temperature(double vapour_pressure) {
  const double p_min = psat(vapour_temperature_min);
  const double p_max = psat(vapour_temperature_max);
  if (!std::isfinite(vapour_pressure) || vapour_pressure < p_min || vapour_pressure > p_max) {
    throw std::invalid_argument(fmt::format(
        "vapour pressure must be between {:.4g} and {:.6g} Pa (saturation at {} and {} °C), got {}",
        p_min, p_max, vapour_temperature_min, vapour_temperature_max, vapour_pressure));
  }
  const double x = std::log(vapour_pressure / triple_point_pressure);
  if (vapour_pressure >= triple_point_pressure) return water_b * x / (water_a - x);
  return ice_b * x / (ice_a - x);
}

double dew_point(double vapour_pressure) { return saturation_temperature(vapour_pressure); }

double vapour_pressure(double temperature, double relative_humidity) {
  if (!std::isfinite(relative_humidity) || relative_humidity < 0.0 || relative_humidity > 1.0) {
    throw std::invalid_argument(fmt::format(
        "relative humidity must be a fraction between 0 and 1, got {} (write 50 % as 0.5)",
        relative_humidity));
  }
  check_temperature(temperature, "air temperature");
  return relative_humidity * psat(temperature);
}

double vapour_pressure_excess(int humidity_class, double exterior_temperature) {
  // From memory: class 1 unoccupied/storage up to class 5 special buildings (laundries, pools).
  constexpr std::array<double, 5> excess_at_or_below_0c{270.0, 540.0, 810.0, 1080.0, 1350.0};
  if (humidity_class < 1 || humidity_class > 5) {
    throw std::invalid_argument(
        fmt::format("humidity class must be 1, 2, 3, 4 or 5, got {}", humidity_class));
  }
  if (!std::isfinite(exterior_temperature)) {
    throw std::invalid_argument(fmt::format(
        "exterior temperature must be finite, got {}", exterior_temperature));
  }
  // Moisture produced indoors raises pi above pe; the excess shrinks in mild weather because
  // windows are opened and ventilation rises, reaching zero at θe = 20 °C.
  const double share = std::clamp((20.0 - exterior_temperature) / 20.0, 0.0, 1.0);
  return excess_at_or_below_0c[static_cast<std::size_t>(humidity_class - 1)] * share;
}

double interior_vapour_pressure_from_class(int humidity_class, double exterior_temperature,
                                           double exterior_vapour_pressure) {
  const double excess = vapour_pressure_excess(humidity_class, exterior_temperature);
  check_temperature(exterior_temperature, "exterior temperature");
  const double exterior_saturation = psat(exterior_temperature);
  if (!std::isfinite(exterior_vapour_pressure) || exterior_vapour_pressure < 0.0 ||
      exterior_vapour_pressure > exterior_saturation) {
    throw std::invalid_argument(fmt::format(
        "exterior vapour pressure must be between 0 and {:.1f} Pa (saturation at {} °C), got {}",
        exterior_saturation, exterior_temperature, exterior_vapour_pressure));
  }
  constexpr double safety_factor = 1.10;
  return exterior_vapour_pressure + safety_factor * excess;
}

}  // namespace edgeflux
