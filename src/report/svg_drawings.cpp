// The list of report drawings and their standalone form. Each drawing has its own file
// (detail_drawing.cpp, temperature_drawing.cpp, ...); the shared layout is report/drawing_layout.h.
#include "report/svg_drawings.h"

namespace edgeflux {

std::vector<Drawing> report_drawings(const CrossSection& section, const Calculation& calc) {
  return {detail_drawing(section, calc), mesh_drawing(section, calc), temperature_drawing(section, calc), heat_flux_drawing(section, calc),
          surface_temperature_plot(section, calc)};
}

std::string standalone_svg(const Drawing& drawing) { return "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n" + drawing.svg; }

}  // namespace edgeflux
