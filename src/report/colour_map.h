// Perceptually uniform colour maps for field plots: the published 256-entry tables, embedded.
#pragma once

#include <string>

namespace edgeflux {

struct Rgb {
  double r = 0, g = 0, b = 0;  ///< sRGB, 0–1
};

/// viridis: sequential, perceptually uniform, readable with the common colour-vision deficiencies
/// and in grey-scale print. Used for temperature.
/// magma: the same qualities with a different hue path (black–purple–orange–white), so a flux map
/// is never mistaken for a temperature map. Used for heat-flux magnitude.
enum class ColourMap { viridis, magma };

/// Colour at position t of the map, t clamped to [0, 1], linear between table entries.
Rgb colour_at(ColourMap map, double t);

/// "#rrggbb".
std::string hex_colour(Rgb c);

/// Relative luminance (ITU-R BT.709 weights on linearised sRGB), 0 black – 1 white; used to pick
/// a readable text colour on top of a fill.
double relative_luminance(Rgb c);

}  // namespace edgeflux
