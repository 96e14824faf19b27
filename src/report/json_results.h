// The results as stable JSON (keys documented in docs/results-json.md).
#pragma once

#include <nlohmann/json.hpp>

#include "geometry/cross_section.h"
#include "pipeline/calculate.h"

namespace edgeflux {

/// snake_case keys; lengths in metres, temperatures in °C, heat flows in W/m (suffixes say so).
nlohmann::ordered_json json_results(const CrossSection& section, const Calculation& calc);

}  // namespace edgeflux
