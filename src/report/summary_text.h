// The readable summary the calculation command prints.
#pragma once

#include <string>

#include "geometry/cross_section.h"
#include "results/calculation.h"

namespace edgeflux {

/// Plain-text summary: heat flows per environment, balance, L2D, surface extremes, probes,
/// mesh and timing. Ends with a newline.
std::string summary_text(const CrossSection& section, const Calculation& calc);

}  // namespace edgeflux
