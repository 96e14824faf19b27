// Named surface-resistance presets (Rsi, Rse) for heat-loss and surface-temperature runs.
#pragma once

#include <optional>
#include <span>
#include <string_view>

#include "geometry/cross_section.h"

namespace edgeflux {

/// Rsi on opaque internal surfaces in a surface-temperature run, m²K/W (ISO 13788 clause 4).
/// The high value stands for furniture and corners that shield the surface from room air.
inline constexpr double temperature_run_surface_resistance_opaque = 0.25;

/// Rsi on glazing and frames in a surface-temperature run, m²K/W (ISO 13788 clause 4, ISO 10077-2).
inline constexpr double temperature_run_surface_resistance_glazing = 0.13;

/// Rs of a surface in the surface-temperature run, m²K/W: the value the detail file gives, else
/// ISO 13788's 0.25 on opaque interior surfaces and 0.13 on glazing and frames; every other
/// surface (exterior, other environments, fixed temperatures) keeps its heat-loss value.
double temperature_run_resistance(const CrossSection& section, const Surface& surface);

/// One named surface resistance a detail file may refer to by `id`.
struct SurfaceResistancePreset {
  std::string_view id;           ///< stable name used in detail files, e.g. "rsi-horizontal"
  double value;                  ///< surface resistance, m²K/W
  std::string_view description;  ///< one line: which surface and which kind of run
  std::string_view source;       ///< standard and clause or table the value comes from
};

/// All presets, in a fixed order (heat-loss values first, then surface-temperature values).
/// The span refers to static storage and stays valid for the life of the program.
std::span<const SurfaceResistancePreset> surface_resistance_presets();

/// The surface resistance in m²K/W of the preset named `id` (exact, case-sensitive match),
/// or nothing when no preset has that name.
std::optional<double> surface_resistance_preset(std::string_view id);

}  // namespace edgeflux
