// Raster copies of the drawings, rendered by librsvg onto a cairo image surface.
#pragma once

#include <string>

namespace edgeflux {

/// The PNG file (bytes) of an SVG document rendered at `dpi` pixels per inch (SVG sizes in mm
/// convert through it). Throws std::runtime_error when librsvg cannot parse or render it.
std::string png_from_svg(const std::string& svg, double dpi = 200.0);

}  // namespace edgeflux
