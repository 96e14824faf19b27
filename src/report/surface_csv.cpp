// Formats the interior-surface walk of the surface-temperature run as CSV.
#include "report/surface_csv.h"

#include <fmt/format.h>

#include "report/field_quantities.h"
#include "report/text_format.h"

namespace edgeflux {

std::string surface_csv(const CrossSection& section, const Calculation& calc) {
  std::string out = "distance_m,x_m,y_m,temperature_c,environment,surface\n";
  for (const SurfaceSample& s : interior_surface_walk(section, calc.mesh)) {
    const Surface& surface = section.surfaces[s.surface];
    out += fmt::format("{:.17g},{:.17g},{:.17g},{:.17g},{},{}\n", s.distance, s.at.x, s.at.y,
                       calc.surface_temperature.temperature[s.node], csv_field(section.environments[surface.environment].id),
                       csv_field(surface.name));
  }
  return out;
}

}  // namespace edgeflux
