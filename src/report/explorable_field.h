// The report's explorable temperature field: the field of Figure 2 at a larger size, where the
// reader points or taps to read θ, |q| and the material, switches isotherms and zooms; printed, a
// static figure. Its data travel inline as JSON; the page needs nothing beyond the report file.
#pragma once

#include <array>
#include <string>
#include <vector>

#include "geometry/cross_section.h"
#include "results/calculation.h"
#include "report/svg_drawings.h"

namespace edgeflux {

/// Above this many triangles the picture carries a raster sample instead of the mesh.
inline constexpr int explorable_max_triangles = 60000;
/// Decimals of |q| in the read-out, W/m² (the temperature takes digits::surface_temperature).
inline constexpr int heat_flux_density_decimals = 1;

/// What the page interpolates in: triangles with nodal θ, and |q| and material per triangle.
struct ExplorableMesh {
  std::vector<Point> points;                  ///< m
  std::vector<std::array<int, 3>> triangles;  ///< counter-clockwise node indices
  std::vector<double> temperature;            ///< per point, °C, surface-temperature run
  std::vector<double> heat_flux;              ///< per triangle, |q| of the heat-loss run, W/m²
  std::vector<int> material;                  ///< per triangle, index into CrossSection::materials
  double raster_step = 0;                     ///< m; 0 when these are the solver's mesh itself
  int boundary_triangles = 0;                 ///< with a raster: the first this many are the solver's
};

/// The solver's final mesh with its fields; when it has more than `max_triangles` triangles, a
/// sample of about that many instead: first the solver's own triangles with an edge on the
/// boundary (the surfaces keep their exact values), then a regular raster, the points of a square
/// grid inside the section carrying the solver's field there, each grid cell whose four corners lie
/// inside split into two triangles, |q| and material from the solver's triangle at the centroid.
/// The strip between the two, less than a raster step wide, is covered by neither.
ExplorableMesh explorable_mesh(const Calculation& calc, int max_triangles = explorable_max_triangles);

/// The data block the page reads (JSON): points in µm, triangles, θ, |q|, materials, the affine
/// map from section metres to the picture's millimetres, the view box and the digits shown.
std::string explorable_field_json(const CrossSection& section, const Calculation& calc, const ExplorableMesh& data);

/// The picture as a part of Appendix B (an HTML <section class="appendix">, with its style, data
/// and inline script), numbered after the drawings in Appendix B. It re-uses the filled bands of
/// the temperature drawing (Figure 2, on the sheet) and the classes of the heat-flux drawing by
/// reference, so it is empty unless `drawings` holds the temperature drawing.
std::string explorable_field_section(const CrossSection& section, const Calculation& calc, const std::vector<Drawing>& drawings,
                                     int max_triangles = explorable_max_triangles);

}  // namespace edgeflux
