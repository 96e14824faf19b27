// The heat flux drawing: |q| per triangle on a logarithmic colour scale with the section overlaid.
#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <functional>
#include <map>
#include <optional>

#include "report/colour_map.h"
#include "report/drawing_layout.h"
#include "report/field_quantities.h"
#include "report/material_fills.h"
#include "report/svg_drawings.h"

namespace edgeflux {

using namespace layout;

Drawing heat_flux_drawing(const CrossSection& section, const Calculation& calc) {
  const TriMesh& mesh = calc.mesh;
  const std::vector<Point>& flux = calc.heat_loss.field.heat_flux;
  const Bounds b = section_bounds(mesh);
  const PaperFrame f = field_frame(b);
  const Box drawing = paper_box(f, b);
  Box extent = drawing;

  std::vector<double> magnitude(flux.size());
  for (std::size_t t = 0; t < flux.size(); ++t) magnitude[t] = norm(flux[t]);
  std::vector<double> sorted = magnitude;
  std::sort(sorted.begin(), sorted.end());
  auto percentile = [&](double p) { return sorted.empty() ? 1.0 : sorted[std::min(sorted.size() - 1, static_cast<std::size_t>(p * (sorted.size() - 1)))]; };
  // The scale spans the bulk of the values; the few singular corner values saturate.
  double q_lo = std::max(percentile(0.02), 1e-6), q_hi = std::max(percentile(0.995), q_lo * 10);
  q_lo = std::pow(10.0, std::floor(std::log10(q_lo) * 2) / 2);  // round down to half decades
  q_hi = std::pow(10.0, std::ceil(std::log10(q_hi) * 2) / 2);
  const double l_lo = std::log10(q_lo), l_hi = std::log10(q_hi);
  constexpr int n_classes = 40;
  auto class_colour = [&](int k) { return hex_colour(colour_at(ColourMap::magma, 0.06 + 0.92 * (k + 0.5) / n_classes)); };
  std::vector<std::string> class_paths(n_classes);
  for (std::size_t t = 0; t < mesh.triangles.size(); ++t) {
    const double u = (std::log10(std::max(magnitude[t], 1e-300)) - l_lo) / (l_hi - l_lo);
    const int k = std::clamp(static_cast<int>(std::floor(u * n_classes)), 0, n_classes - 1);
    const auto& tri = mesh.triangles[t];
    std::string& d = class_paths[k];
    for (int i = 0; i < 3; ++i) {
      const Point p = f.to_paper(mesh.points[tri[i]]);
      d += fmt::format("{}{} {}", i == 0 ? "M" : "L", num(p.x), num(p.y));
    }
    d += "Z";
  }
  // The classes in a group of their own (id "heat-flux-classes"), which the report's explorable
  // picture re-uses; the seam width sits on the wrapper, outside what <use> copies.
  std::string body = fmt::format("<g stroke-width=\"{}\" stroke-linejoin=\"round\"><g id=\"heat-flux-classes\">\n", num(field_seam_width));
  for (int k = 0; k < n_classes; ++k)
    if (!class_paths[k].empty()) body += fmt::format("<path d=\"{}\" fill=\"{}\" stroke=\"{}\"/>\n", class_paths[k], class_colour(k), class_colour(k));
  body += "</g></g>\n";
  body += section_overlay(section, mesh, f);

  // Direction arrows on a regular paper grid, all the same length: the colour gives the size.
  const TriangleLocator locator(mesh);
  const double spacing = 5.0, half = 1.6;
  std::string arrows;
  for (double y = drawing.y0 + spacing / 2; y < drawing.y1; y += spacing)
    for (double x = drawing.x0 + spacing / 2; x < drawing.x1; x += spacing) {
      const int t = locator.triangle_at(to_world(f, {x, y}));
      if (t < 0 || magnitude[t] <= 0) continue;
      const Point dir = unit({flux[t].x, -flux[t].y});  // paper y points down
      const Point tail = Point{x, y} - half * dir, tip = Point{x, y} + half * dir;
      const Point n{-dir.y, dir.x};
      const Point h1 = tip - 0.9 * dir + 0.45 * n, h2 = tip - 0.9 * dir - 0.45 * n;
      arrows += fmt::format("M{} {}L{} {}M{} {}L{} {}L{} {}", num(tail.x), num(tail.y), num(tip.x), num(tip.y), num(h1.x), num(h1.y), num(tip.x),
                            num(tip.y), num(h2.x), num(h2.y));
    }
  body += fmt::format("<path d=\"{}\" fill=\"none\" stroke=\"#fff\" stroke-opacity=\"0.85\" stroke-width=\"0.6\" stroke-linecap=\"round\" stroke-linejoin=\"round\"/>\n", arrows);
  body += fmt::format("<path d=\"{}\" fill=\"none\" stroke=\"#111\" stroke-width=\"0.25\" stroke-linecap=\"round\" stroke-linejoin=\"round\"/>\n", arrows);

  std::vector<std::pair<double, std::string>> classes, ticks;
  for (int k = 0; k < n_classes; ++k) classes.push_back({(k + 1.0) / n_classes, class_colour(k)});
  for (int decade = static_cast<int>(std::floor(l_lo)); decade <= static_cast<int>(std::ceil(l_hi)); ++decade)
    for (double m : {1.0, 2.0, 5.0}) {
      const double q = m * std::pow(10.0, decade);
      const double u = (std::log10(q) - l_lo) / (l_hi - l_lo);
      if (u < -1e-9 || u > 1 + 1e-9) continue;
      ticks.push_back({u, q >= 1 ? fmt::format("{:.0f}", q) : fmt::format("{:.2g}", q)});
    }
  body += field_legend(drawing, f, classes, ticks, "|q| [W/m²]", "logarithmic scale", extent);

  Drawing d;
  d.id = "heat-flux";
  d.title = "Heat-flux density";
  d.caption = fmt::format(
      "Magnitude of the heat-flux density q = −λ∇T in the heat-loss run (the run that gives L2D and ψ), constant on each triangle, on a "
      "logarithmic magma scale from {} to {} W/m² (values beyond the ends, e.g. at re-entrant corners, take the end colours). "
      "Arrows show the direction of heat flow; scale 1:{}.",
      svg::num(q_lo), svg::num(q_hi), num(f.denominator));
  d.svg = finish(d.title, fmt::format("Heat-flux density, heat-loss run · scale 1:{}", num(f.denominator)), "", body, extent);
  return d;
}

}  // namespace edgeflux
