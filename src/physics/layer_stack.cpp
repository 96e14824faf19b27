// Series resistances of plane layers and the resulting U-value.
#include "physics/layer_stack.h"

#include <cmath>
#include <stdexcept>

#include <fmt/format.h>

namespace edgeflux {

namespace {

void check_surface_resistance(double value, const char* which) {
  if (!std::isfinite(value) || value < 0.0) {
    throw std::invalid_argument(fmt::format(
        "{} surface resistance must be a finite value >= 0 m²K/W, got {}", which, value));
  }
}

}  // namespace

double thermal_resistance(std::span<const Layer> layers) {
  // In one-dimensional steady conduction the same heat flux crosses every layer, so the
  // temperature drops, and hence the resistances d/λ, add in series.
  double sum = 0.0;
  for (std::size_t k = 0; k < layers.size(); ++k) {
    const Layer& layer = layers[k];
    if (!std::isfinite(layer.thickness) || layer.thickness <= 0.0) {
      throw std::invalid_argument(fmt::format(
          "layer {}: thickness must be a finite value > 0 m, got {}", k, layer.thickness));
    }
    if (!std::isfinite(layer.conductivity) || layer.conductivity <= 0.0) {
      throw std::invalid_argument(fmt::format(
          "layer {}: thermal conductivity must be a finite value > 0 W/(m·K), got {}", k,
          layer.conductivity));
    }
    sum += layer.thickness / layer.conductivity;
  }
  return sum;
}

double thermal_transmittance(double internal_surface_resistance, std::span<const Layer> layers,
                             double external_surface_resistance) {
  check_surface_resistance(internal_surface_resistance, "internal");
  check_surface_resistance(external_surface_resistance, "external");
  // The surface films are further resistances in series with the layers.
  const double total =
      internal_surface_resistance + thermal_resistance(layers) + external_surface_resistance;
  if (total <= 0.0) {
    throw std::invalid_argument(
        "total thermal resistance is 0 m²K/W: give at least one layer or a surface resistance");
  }
  return 1.0 / total;
}

}  // namespace edgeflux
