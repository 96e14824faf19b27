// Thermal resistance and U-value of a stack of plane homogeneous layers (ISO 6946).
#pragma once

#include <span>

namespace edgeflux {

/// One plane homogeneous layer of a building element.
struct Layer {
  double thickness;     ///< d, m; finite and > 0
  double conductivity;  ///< λ, W/(m·K); finite and > 0
};

/// Σ d/λ over the layers, m²K/W; 0 for an empty stack.
/// Throws std::invalid_argument naming the layer (0-based) when a thickness or conductivity is
/// not finite and positive.
double thermal_resistance(std::span<const Layer> layers);

/// U = 1 / (Rsi + Σ d/λ + Rse), W/(m²K) (ISO 6946), for one-dimensional heat flow through the stack.
/// `internal_surface_resistance` Rsi and `external_surface_resistance` Rse in m²K/W, finite and ≥ 0.
/// Throws std::invalid_argument for a bad layer or surface resistance, or a total resistance of 0.
double thermal_transmittance(double internal_surface_resistance, std::span<const Layer> layers,
                             double external_surface_resistance);

}  // namespace edgeflux
