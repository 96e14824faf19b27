// The drawings of a report as standalone SVG documents in paper millimetres: the detail to scale,
// the mesh, the temperature field with isotherms, the heat-flux density and the interior surface
// temperature along the surface.
#pragma once

#include <string>
#include <vector>

#include "geometry/cross_section.h"
#include "results/calculation.h"

namespace edgeflux {

struct Drawing {
  std::string id;       ///< file stem and HTML anchor: "detail", "mesh", "temperature", "heat-flux", "surface-temperature"
  std::string title;    ///< figure title
  std::string caption;  ///< what the figure shows and how to read it (plain text)
  std::string svg;      ///< one <svg> element with the SVG namespace; ids inside start with `id`
};

/// The detail drawn to a standard scale: materials by hatch with a legend, dimension chains in the
/// user's unit, surfaces labelled with environment, temperature and Rs of both runs, adiabatic
/// edges (cut-off planes) marked, and the flanking lengths of each dimension system.
Drawing detail_drawing(const CrossSection& section, const Calculation& calc);

/// The triangles of the mesh over pale material fills.
Drawing mesh_drawing(const CrossSection& section, const Calculation& calc);

/// The surface-temperature run's field in bands of the viridis map, labelled isotherms at round
/// intervals, the colour scale, and θsi,min marked.
Drawing temperature_drawing(const CrossSection& section, const Calculation& calc);

/// |q| of the heat-loss run per triangle on a logarithmic magma scale, with direction arrows.
Drawing heat_flux_drawing(const CrossSection& section, const Calculation& calc);

/// θsi of the surface-temperature run along the interior surfaces with the mould and dew-point
/// limits of each moisture assessment, and fRsi on the right-hand axis.
Drawing surface_temperature_plot(const CrossSection& section, const Calculation& calc);

/// All five, in the order above.
std::vector<Drawing> report_drawings(const CrossSection& section, const Calculation& calc);

/// `drawing.svg` as a file: XML declaration, then the document.
std::string standalone_svg(const Drawing& drawing);

}  // namespace edgeflux
