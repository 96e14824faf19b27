// The picture `edgeflux import` draws: the section from the drawing with every region (R1, R2, …)
// and every run of the outline (S1, S2, …) numbered, so that surfaces can be chosen by looking.
#pragma once

#include <string>

#include "input/drawing_import.h"

namespace edgeflux {

/// A standalone SVG file (A4 landscape at most, at a standard drawing scale) with a legend.
std::string import_picture_svg(const DrawingImport& import);

}  // namespace edgeflux
