// Interior surface temperatures along the surface, as CSV for spreadsheets and plotting tools.
#pragma once

#include <string>

#include "geometry/cross_section.h"
#include "results/calculation.h"

namespace edgeflux {

/// One row per mesh node on an interior surface, in the order of interior_surface_walk, with the
/// header "distance_m,x_m,y_m,temperature_c,environment,surface". Temperatures are those of the
/// surface-temperature run (interior Rsi per ISO 13788), 17 significant digits. Text fields are
/// quoted when they contain a comma, quote or line break (RFC 4180).
std::string surface_csv(const CrossSection& section, const Calculation& calc);

}  // namespace edgeflux
