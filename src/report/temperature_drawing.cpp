// The temperature field drawing: filled bands at a round step, isotherms with labels, the
// section overlaid, and the minimum interior surface temperature marked.
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

Drawing temperature_drawing(const CrossSection& section, const Calculation& calc) {
  const TriMesh& mesh = calc.mesh;
  const std::vector<double>& T = calc.surface_temperature.temperature;
  const Bounds b = section_bounds(mesh);
  const PaperFrame f = field_frame(b);
  const Box drawing = paper_box(f, b);
  Box extent = drawing;
  Occupied occupied;
  const TriangleLocator locator(mesh);
  const SectionHitTest hit{f, locator};

  const TemperatureScale scale = temperature_scale(T);
  const double step = scale.step, band = scale.band, lo = scale.lo, hi = scale.hi;
  const int n_bands = scale.n_bands;
  auto band_colour = [&](int k) { return scale.band_colour(k); };

  // Filled isobands: each triangle clipped to every band it spans.
  std::vector<std::string> band_paths(n_bands);
  for (const auto& tri : mesh.triangles) {
    std::vector<FieldVertex> poly;
    for (int v : tri) poly.push_back({f.to_paper(mesh.points[v]), T[v]});
    const double tmin = std::min({T[tri[0]], T[tri[1]], T[tri[2]]}), tmax = std::max({T[tri[0]], T[tri[1]], T[tri[2]]});
    const int k0 = std::clamp(static_cast<int>(std::floor((tmin - lo) / band)), 0, n_bands - 1);
    const int k1 = std::clamp(static_cast<int>(std::floor((tmax - lo) / band)), 0, n_bands - 1);
    for (int k = k0; k <= k1; ++k) {
      std::vector<FieldVertex> piece = k0 == k1 ? poly : clip_to_level(clip_to_level(poly, lo + k * band, true), lo + (k + 1) * band, false);
      if (piece.size() < 3) continue;
      std::string& d = band_paths[k];
      for (std::size_t i = 0; i < piece.size(); ++i) d += fmt::format("{}{} {}", i == 0 ? "M" : "L", num(piece[i].first.x), num(piece[i].first.y));
      d += "Z";
    }
  }
  // The bands in a group of their own (id "temperature-bands"), which the report's explorable
  // picture re-uses; the seam width sits on the wrapper, outside what <use> copies.
  std::string body = fmt::format("<g stroke-width=\"{}\" stroke-linejoin=\"round\"><g id=\"temperature-bands\">\n", num(field_seam_width));
  for (int k = 0; k < n_bands; ++k)
    if (!band_paths[k].empty()) body += fmt::format("<path d=\"{}\" fill=\"{}\" stroke=\"{}\"/>\n", band_paths[k], band_colour(k), band_colour(k));
  body += "</g></g>\n";
  body += section_overlay(section, mesh, f);

  // Isotherm lines at the round step.
  std::vector<Isotherm> isotherms;
  for (double level : scale.isotherm_levels()) isotherms.push_back(isotherm(mesh, f, T, level));
  std::string lines_d;
  for (const Isotherm& iso : isotherms)
    for (const auto& line : iso.lines) {
      for (std::size_t i = 0; i < line.size(); ++i) lines_d += fmt::format("{}{} {}", i == 0 ? "M" : "L", num(line[i].x), num(line[i].y));
    }
  body += fmt::format("<path d=\"{}\" fill=\"none\" stroke=\"#fff\" stroke-width=\"0.42\" stroke-opacity=\"0.75\" stroke-linejoin=\"round\"/>\n", lines_d);
  body += fmt::format("<path d=\"{}\" fill=\"none\" stroke=\"#111\" stroke-width=\"0.2\" stroke-linejoin=\"round\"/>\n", lines_d);

  // θsi,min: marker on the surface and a label outside the section.
  if (calc.junction.min_interior_surface) {
    const SurfaceMinimum& m = *calc.junction.min_interior_surface;
    const Point p = f.to_paper(m.at);
    // Outward direction: the middle of the open side, the mean of the directions that stay
    // outside the section for 2–10 mm (at a corner, the bisector of the free angle).
    Point sum{0, 0};
    for (int k = 0; k < 32; ++k) {
      const double a = k * M_PI / 16;
      const Point dir{std::cos(a), std::sin(a)};
      bool free = true;
      for (double r : {2.0, 5.0, 10.0})
        if (locator.triangle_at(to_world(f, p + r * dir)) >= 0) free = false;
      if (free) sum = sum + dir;
    }
    const Point outward = norm(sum) > 1e-9 ? unit(sum) : Point{1, 0};
    const std::vector<std::string> lines{fmt::format("θsi,min = {}", degrees(m.temperature, 2)),
                                         calc.junction.temperature_factor ? fmt::format("fRsi = {:.3f}", *calc.junction.temperature_factor) : std::string(),
                                         section.surfaces[m.surface].name};
    std::vector<std::string> shown;
    for (const auto& l : lines)
      if (!l.empty()) shown.push_back(l);
    const Box size = label_size_box(shown);
    const Box allowed{drawing.x0 - 40, drawing.y0 - 20, drawing.x1 + 40, drawing.y1 + 20};
    Placement pl = place_label(occupied, hit, allowed, p, {-outward.y, outward.x}, 12.0, outward, size.x1, size.y1);
    pl.anchor = p;  // the label may slide; its leader still points at the minimum
    occupied.add(pl.box);
    occupied.add({p.x - 2, p.y - 2, p.x + 2, p.y + 2});
    include(extent, pl.box);
    body += label_block(pl, shown, "#111", true);
    body += fmt::format("<circle cx=\"{0}\" cy=\"{1}\" r=\"1.3\" fill=\"none\" stroke=\"#fff\" stroke-width=\"0.7\"/>"
                        "<circle cx=\"{0}\" cy=\"{1}\" r=\"1.3\" fill=\"none\" stroke=\"#000\" stroke-width=\"0.3\"/>"
                        "<circle cx=\"{0}\" cy=\"{1}\" r=\"0.35\" fill=\"#000\"/>\n",
                        num(p.x), num(p.y));
  }

  // Isotherm labels where the line has room: not on another isotherm, not on another label.
  std::vector<std::pair<int, std::pair<Point, Point>>> all_segments;  // (isotherm index, segment)
  for (std::size_t i = 0; i < isotherms.size(); ++i)
    for (const auto& line : isotherms[i].lines)
      for (std::size_t k = 0; k + 1 < line.size(); ++k) all_segments.push_back({static_cast<int>(i), {line[k], line[k + 1]}});
  const int decimals = scale.decimals;
  for (std::size_t i = 0; i < isotherms.size(); ++i) {
    const std::string text = svg::label_number(isotherms[i].level, decimals);
    const double w = svg::text_width(text, small_font_size) + 0.6, h = small_font_size * 1.05;
    int placed = 0;
    auto lines = isotherms[i].lines;
    std::sort(lines.begin(), lines.end(), [](const auto& a, const auto& b) { return a.size() > b.size(); });
    for (const auto& line : lines) {
      if (placed >= 2) break;
      std::vector<double> arc{0};
      for (std::size_t k = 1; k < line.size(); ++k) arc.push_back(arc.back() + distance(line[k - 1], line[k]));
      const double total = arc.back();
      if (total < w + 2.0) continue;
      // Candidates from the middle outwards, every 2 mm.
      std::vector<double> candidates;
      for (double s = 0; s <= total / 2 - w / 2 - 0.5; s += 2.0) {
        candidates.push_back(total / 2 + s);
        if (s > 0) candidates.push_back(total / 2 - s);
      }
      std::optional<Point> last_placed;
      for (double s : candidates) {
        const std::size_t k = std::min<std::size_t>(line.size() - 2, std::upper_bound(arc.begin(), arc.end(), s) - arc.begin() - 1);
        const double t = arc[k + 1] > arc[k] ? (s - arc[k]) / (arc[k + 1] - arc[k]) : 0;
        const Point c = line[k] + t * (line[k + 1] - line[k]);
        if (last_placed && distance(*last_placed, c) < 40.0) continue;
        // Direction from the points about half a label width on either side.
        auto at_arc = [&](double u) {
          u = std::clamp(u, 0.0, total);
          const std::size_t j = std::min<std::size_t>(line.size() - 2, std::upper_bound(arc.begin(), arc.end(), u) - arc.begin() - 1);
          const double tt = arc[j + 1] > arc[j] ? (u - arc[j]) / (arc[j + 1] - arc[j]) : 0;
          return line[j] + tt * (line[j + 1] - line[j]);
        };
        const Point dir = unit(at_arc(s + w / 2) - at_arc(s - w / 2));
        // Upright text, and steep lines read from the right (bottom to top), as on drawings.
        double angle = std::atan2(dir.y, dir.x) * 180 / M_PI;
        while (angle > 80) angle -= 180;
        while (angle <= -100) angle += 180;
        const double ca = std::abs(std::cos(angle * M_PI / 180)), sa = std::abs(std::sin(angle * M_PI / 180));
        const double bw = ca * w + sa * h, bh = sa * w + ca * h;
        const Box box{c.x - bw / 2, c.y - bh / 2, c.x + bw / 2, c.y + bh / 2};
        if (!occupied.is_free(box.grown(0.3))) continue;
        const bool crosses_other = std::any_of(all_segments.begin(), all_segments.end(), [&](const auto& seg) {
          return seg.first != static_cast<int>(i) && segment_hits_box(seg.second.first, seg.second.second, box.grown(0.15));
        });
        if (crosses_other) continue;
        // Keep labels inside the section, where the line is.
        if (locator.triangle_at(to_world(f, {box.x0, box.y0})) < 0 || locator.triangle_at(to_world(f, {box.x1, box.y1})) < 0 ||
            locator.triangle_at(to_world(f, {box.x0, box.y1})) < 0 || locator.triangle_at(to_world(f, {box.x1, box.y0})) < 0)
          continue;
        occupied.add(box);
        body += fmt::format("<text transform=\"translate({} {}) rotate({})\" font-size=\"{}\" text-anchor=\"middle\" dy=\"0.35em\" "
                            "stroke=\"#fff\" stroke-width=\"0.7\" stroke-linejoin=\"round\" paint-order=\"stroke\" fill=\"#111\">{}</text>\n",
                            num(c.x), num(c.y), num(angle), num(small_font_size), escape(text));
        last_placed = c;
        if (++placed >= 2) break;
      }
    }
  }

  // Colour scale.
  std::vector<std::pair<double, std::string>> bands, ticks;
  for (int k = 0; k < n_bands; ++k) bands.push_back({(k + 1.0) / n_bands, band_colour(k)});
  for (double level = std::ceil(lo / step) * step; level <= hi + 1e-9; level += step)
    ticks.push_back({(level - lo) / (hi - lo), svg::label_number(level, decimals)});
  body += field_legend(drawing, f, bands, ticks, "θ [°C]", fmt::format("bands {} K, isotherms {} K", num(band), num(step)), extent);

  Drawing d;
  d.id = "temperature";
  d.title = "Temperature field";
  d.caption = fmt::format(
      "Temperatures of the surface-temperature run (interior Rsi 0.25 m²K/W on opaque surfaces, 0.13 on glazing; ISO 13788), the run "
      "that gives θsi,min and fRsi. Colour bands of {} K on the viridis scale, isotherms every {} K, labelled in °C; scale 1:{}.",
      num(band), num(step), num(f.denominator));
  d.svg = finish(d.title, fmt::format("Temperature field, surface-temperature run · scale 1:{}", num(f.denominator)), "", body, extent);
  return d;
}

}  // namespace edgeflux
