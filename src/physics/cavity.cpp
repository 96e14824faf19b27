// Convective and radiative transfer across air cavities expressed as an equivalent conductivity.
#include "physics/cavity.h"

#include <algorithm>
#include <array>
#include <cmath>
#include <stdexcept>

#include <fmt/format.h>

namespace edgeflux {

namespace {

constexpr double c1 = 0.025;  // W/(m·K): conduction through still air dominates narrow cavities
constexpr double c2 = 0.73;   // W/(m²K^(4/3)): natural convection in wider cavities, heat flow horizontal
constexpr double c3 = 1.14;   // W/(m²K^(4/3)): the same, heat flow upwards
constexpr double c4 = 2.11;   // W/(m²K): half the radiative coefficient of flat faces, ε = 0.9, ~10 °C
constexpr double cavity_temperature_difference = 10.0;  // K, the standard's design value

void check_cavity_size(double value, const char* which) {
  if (!std::isfinite(value) || value <= 0.0) {
    throw std::invalid_argument(
        fmt::format("frame cavity {} must be a finite value > 0 m, got {}", which, value));
  }
}

struct AirLayerRow {
  double thickness;   // m
  double resistance;  // m²K/W
};

// ISO 6946:2017 Table 8, horizontal heat flow. Beyond about 25 mm convection grows as fast as the
// conduction path lengthens, so the resistance stops increasing.
constexpr std::array<AirLayerRow, 5> air_layer_table{{
    {0.005, 0.11}, {0.007, 0.13}, {0.010, 0.15}, {0.015, 0.17}, {0.025, 0.18}}};

}  // namespace

FrameCavity frame_cavity(double bounding_depth, double bounding_width, double area, CavityHeatFlow flow,
                         CavityVentilation ventilation) {
  check_cavity_size(bounding_depth, "depth (size in the direction of heat flow)");
  check_cavity_size(bounding_width, "width (size across the heat flow)");
  check_cavity_size(area, "area");
  if (area > bounding_depth * bounding_width * (1 + 1e-12))
    throw std::invalid_argument(fmt::format("frame cavity area {} m² exceeds its bounding rectangle {} × {} m", area,
                                            bounding_depth, bounding_width));
  FrameCavity c;
  c.depth = std::sqrt(area * bounding_depth / bounding_width);
  c.width = std::sqrt(area * bounding_width / bounding_depth);
  // Convection: still-air conduction in narrow cavities, natural convection in wider ones; rising
  // warm air in a cavity heated from below convects more, one heated from above hardly at all.
  const double still_air = c1 / c.depth;
  const double buoyant = flow == CavityHeatFlow::horizontal ? c2 : c3;
  c.convection = flow == CavityHeatFlow::downward ? still_air : std::max(still_air, buoyant * std::cbrt(cavity_temperature_difference));
  // Radiation between the warm and cold faces: the bracket 1 − d/b + √(1 + d²/b²) is 2 for a flat
  // cavity (d ≪ b), where the faces see each other fully, and falls towards 1 as the cavity gets
  // deeper than wide and the faces mostly see the side walls instead.
  const double aspect = c.depth / c.width;
  c.radiation = c4 * (1.0 - aspect + std::sqrt(1.0 + aspect * aspect));
  c.conductivity = c.depth * (c.convection + c.radiation);
  // Air exchange through the slit carries heat past the cavity as well.
  if (ventilation == CavityVentilation::slightly_ventilated) c.conductivity *= 2.0;
  return c;
}

double frame_cavity_conductivity(double depth, double width) {
  return frame_cavity(depth, width, depth * width, CavityHeatFlow::horizontal, CavityVentilation::unventilated).conductivity;
}

double slightly_ventilated_frame_cavity_conductivity(double depth, double width) {
  // Air exchange with the outside through the slit carries heat past the cavity as well.
  return 2.0 * frame_cavity_conductivity(depth, width);
}

double air_layer_resistance(double thickness) {
  const AirLayerRow& first = air_layer_table.front();
  if (!std::isfinite(thickness) || thickness < first.thickness) {
    throw std::invalid_argument(fmt::format(
        "air layer thickness must be at least {} mm for the ISO 6946 table, got {} mm; model a "
        "thinner gap as a frame cavity or as a solid",
        first.thickness * 1000.0, thickness * 1000.0));
  }
  for (std::size_t k = 1; k < air_layer_table.size(); ++k) {
    const AirLayerRow& lower = air_layer_table[k - 1];
    const AirLayerRow& upper = air_layer_table[k];
    if (thickness <= upper.thickness) {
      const double t = (thickness - lower.thickness) / (upper.thickness - lower.thickness);
      return lower.resistance + t * (upper.resistance - lower.resistance);
    }
  }
  return air_layer_table.back().resistance;
}

double air_layer_conductivity(double thickness) {
  return thickness / air_layer_resistance(thickness);
}

}  // namespace edgeflux
