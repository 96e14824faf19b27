// Linear thermal transmittance ψ of a junction and the temperature factor fRsi (ISO 10211, ISO 14683).
#pragma once

#include <span>

namespace edgeflux {

/// A flanking element's one-dimensional heat loss, as counted in the chosen dimension system.
struct FlankingContribution {
  double u_value;  ///< U of the flanking element from a 1D calculation, W/(m²K); finite and ≥ 0
  double length;   ///< l over which U applies in the dimension system, m; finite and ≥ 0
};

/// ψ = L2D − Σ U·l, W/(m·K) (ISO 10211, ISO 14683).
/// `coupling_coefficient_2d` L2D = Φ/(θi − θe) per metre of junction, W/(m·K), finite and ≥ 0.
/// ψ depends on the dimension system through the lengths l; L2D does not.
/// Throws std::invalid_argument for a negative or non-finite L2D, U or l (naming the element).
double linear_transmittance(double coupling_coefficient_2d,
                            std::span<const FlankingContribution> flanking);

/// fRsi = (θsi − θe) / (θi − θe), dimensionless; 1 means the surface is at room temperature,
/// 0 at outdoor temperature. Temperatures in °C (differences in K), all finite.
/// Throws std::invalid_argument when θi == θe or a temperature is not finite.
double temperature_factor(double surface_temperature, double interior_temperature,
                          double exterior_temperature);

/// The inverse: θsi = θe + fRsi·(θi − θe), the surface temperature a temperature factor gives in
/// another climate (a steady linear field scales with the driving difference).
inline double surface_temperature_for_factor(double factor, double interior_temperature, double exterior_temperature) {
  return exterior_temperature + factor * (interior_temperature - exterior_temperature);
}

}  // namespace edgeflux
