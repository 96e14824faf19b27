// Table of named surface-resistance presets and lookup by name.
#include "physics/surface_resistance.h"

#include <array>

namespace edgeflux {

namespace {

// Surface resistance combines convection and long-wave radiation at a face. ISO 6946 values suit
// heat-loss runs; surface-temperature runs use higher internal values so that the coldest point is
// not underestimated where air movement and radiation exchange are reduced.
constexpr std::array<SurfaceResistancePreset, 7> presets{{
    {"rsi-upward", 0.10, "internal surface, heat flow upwards (heat-loss run)",
     "ISO 6946:2017 Table 7"},
    {"rsi-horizontal", 0.13, "internal surface, heat flow horizontal within ±30° (heat-loss run)",
     "ISO 6946:2017 Table 7"},
    {"rsi-downward", 0.17, "internal surface, heat flow downwards (heat-loss run)",
     "ISO 6946:2017 Table 7"},
    {"rse", 0.04, "external surface, any direction of heat flow", "ISO 6946:2017 Table 7"},
    {"rsi-temperature", temperature_run_surface_resistance_opaque,
     "opaque internal surface in a surface-temperature run", "ISO 13788 clause 4"},
    {"rsi-glazing", temperature_run_surface_resistance_glazing,
     "internal surface of glazing and frames in a surface-temperature run",
     "ISO 13788 clause 4; ISO 10077-2"},
    {"rsi-frame-corner", 0.20,
     "internal frame surface in corners and steps where radiation and convection are reduced",
     "ISO 10077-2"},
}};

}  // namespace

std::span<const SurfaceResistancePreset> surface_resistance_presets() { return presets; }

std::optional<double> surface_resistance_preset(std::string_view id) {
  for (const auto& preset : presets) {
    if (preset.id == id) return preset.value;
  }
  return std::nullopt;
}

double temperature_run_resistance(const CrossSection& section, const Surface& surface) {
  if (surface.temperature_run_resistance_given) return *surface.temperature_run_resistance_given;
  const bool interior = section.environments[surface.environment].side == Side::interior;
  if (!interior || surface.is_fixed_temperature()) return surface.resistance;
  return surface.kind == SurfaceKind::glazing ? temperature_run_surface_resistance_glazing
                                              : temperature_run_surface_resistance_opaque;
}

}  // namespace edgeflux
