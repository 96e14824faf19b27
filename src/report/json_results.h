// The results as stable JSON (keys documented in docs/results-json.md).
#pragma once

#include <string>

#include "geometry/cross_section.h"
#include "results/calculation.h"

namespace edgeflux {

/// The JSON text (indented by 2, ending in a newline): snake_case keys; lengths in metres,
/// temperatures in °C, heat flows in W/m (suffixes say so).
std::string json_results(const CrossSection& section, const Calculation& calc);

}  // namespace edgeflux
