// The section drawing: regions with their material hatches, surfaces, cut-off planes, dimension
// chains, labels and the material legend.
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
#include "physics/surface_resistance.h"

namespace edgeflux {

using namespace layout;

Drawing detail_drawing(const CrossSection& section, const Calculation& calc) {
  const TriMesh& mesh = calc.mesh;
  const Bounds b = section_bounds(mesh);
  PaperFrame f = fit_frame(b, max_width - 85.0, 175.0);
  const TriangleLocator locator(mesh);
  const SectionHitTest hit{f, locator};
  const auto fills = material_fills(section);
  const Box drawing = paper_box(f, b);
  Box extent = drawing;
  Occupied occupied;
  // Labels may use a band around the section as wide as the page allows.
  const double spare = std::max(20.0, (max_width - (drawing.x1 - drawing.x0)) * 0.6);
  const Box allowed{drawing.x0 - spare, drawing.y0 - 30, drawing.x1 + spare, drawing.y1 + 40};
  std::string body;

  body += region_fills(section, f, "detail", true, fills, "#3a3a3a", 0.15);
  body += fmt::format("<path d=\"{}\" fill=\"none\" stroke=\"#111\" stroke-width=\"0.4\" stroke-linejoin=\"round\"/>\n", outline_d(f, mesh));

  // Surfaces in their environment's colour; adiabatic edges as bold chain lines (cut-off planes).
  for (const auto& [tag, pts] : boundary_runs(mesh)) {
    const std::string d = svg::path_d(f, pts, false);
    if (tag < 0)
      body += fmt::format("<path d=\"{0}\" fill=\"none\" stroke=\"#fff\" stroke-width=\"0.9\"/>"
                          "<path d=\"{0}\" fill=\"none\" stroke=\"#111\" stroke-width=\"0.6\" stroke-dasharray=\"2.6 0.7 0.5 0.7\"/>\n", d);
    else
      body += fmt::format("<path d=\"{}\" fill=\"none\" stroke=\"{}\" stroke-width=\"0.9\" stroke-linecap=\"butt\"/>\n", d,
                          environment_colour(section, section.surfaces[tag].environment));
  }

  // Flanking elements: the lengths over which U applies, drawn from the cut-off plane along the
  // element, external ones on the exterior side and internal ones on the interior side.
  struct FlankLabel { Point anchor, along, outward; double length; std::vector<std::string> lines; };
  std::vector<FlankLabel> flank_labels;
  for (const FlankingElement& fe : section.flanking_elements) {
    const FlankingResult* fr = flanking_result(section, calc, fe.id);
    const Point pa = f.to_paper(fe.cut_off_start), pb = f.to_paper(fe.cut_off_end);
    const Point along = unit(pb - pa);
    const Point mid = 0.5 * (pa + pb);
    const Point inward = -1.0 * outward_normal(f, locator, mid, along);
    auto side_of = [&](const std::string& name) {
      for (const Surface& s : section.surfaces)
        if (s.name == name) return section.environments[s.environment].side;
      return Side::other;
    };
    const bool start_exterior = fr && side_of(fr->start_surface) == Side::exterior;
    const bool end_exterior = fr && side_of(fr->end_surface) == Side::exterior;
    // Group systems with equal lengths, so one line carries "ext. / ov. int.".
    std::vector<std::pair<double, std::vector<DimensionSystem>>> groups;
    for (DimensionSystem s : all_dimension_systems) {
      const auto& l = fe.length[static_cast<int>(s)];
      if (!l) continue;
      auto g = std::find_if(groups.begin(), groups.end(), [&](const auto& x) { return std::abs(x.first - *l) < 1e-9; });
      if (g == groups.end()) groups.push_back({*l, {s}});
      else g->second.push_back(s);
    }
    int row[2] = {0, 0};  // rows used beyond the start and the end of the cut-off
    for (const auto& [length, systems] : groups) {
      const bool external = std::find(systems.begin(), systems.end(), DimensionSystem::external) != systems.end();
      bool at_end = !(start_exterior || end_exterior) ? true : (external ? end_exterior : start_exterior);
      const Point end_point = at_end ? pb : pa;
      const Point lateral = at_end ? along : -1.0 * along;
      const double offset = 3.5 + 3.5 * row[at_end ? 1 : 0]++;
      const Point p0 = end_point + offset * lateral, p1 = p0 + f.mm(length) * inward;
      std::string names;
      for (const DimensionSystem s : systems) names += (names.empty() ? "" : " / ") + std::string(system_short(s));
      const std::string text = fmt::format("{}  {:.3f} m", names, length);
      body += fmt::format("<path d=\"M{0} {1} L{2} {3} M{4} {5} L{6} {7} M{8} {9} L{10} {11}\" stroke=\"#5b3f8c\" stroke-width=\"0.22\" fill=\"none\"/>\n",
                          num(p0.x), num(p0.y), num(p1.x), num(p1.y), num(p0.x - 0.9 * lateral.x), num(p0.y - 0.9 * lateral.y),
                          num(p0.x + 0.9 * lateral.x), num(p0.y + 0.9 * lateral.y), num(p1.x - 0.9 * lateral.x), num(p1.y - 0.9 * lateral.y),
                          num(p1.x + 0.9 * lateral.x), num(p1.y + 0.9 * lateral.y));
      const Point c = 0.5 * (p0 + p1);
      double angle = std::atan2(inward.y, inward.x) * 180.0 / M_PI;
      if (angle > 90) angle -= 180;
      if (angle <= -90) angle += 180;
      const double w = svg::text_width(text, small_font_size);
      const Point tc = c + (small_font_size * 0.6) * lateral;
      body += fmt::format("<text transform=\"translate({} {}) rotate({})\" font-size=\"{}\" text-anchor=\"middle\" dy=\"0.35em\" fill=\"#5b3f8c\" "
                          "stroke=\"#fff\" stroke-width=\"0.5\" paint-order=\"stroke\">{}</text>\n",
                          num(tc.x), num(tc.y), num(angle), num(small_font_size), escape(text));
      const bool vertical = std::abs(inward.y) > std::abs(inward.x);
      const Box line_box{std::min(p0.x, p1.x) - 1, std::min(p0.y, p1.y) - 1, std::max(p0.x, p1.x) + 1, std::max(p0.y, p1.y) + 1};
      const Box text_box = vertical ? Box{tc.x - small_font_size * 0.6, c.y - w / 2, tc.x + small_font_size * 0.6, c.y + w / 2}
                                    : Box{c.x - w / 2, tc.y - small_font_size * 0.6, c.x + w / 2, tc.y + small_font_size * 0.6};
      occupied.add(line_box);
      occupied.add(text_box);
      include(extent, line_box);
      include(extent, text_box);
    }
    std::vector<std::string> lines{"cut-off plane: " + fe.id};
    if (fr) lines.push_back(fmt::format("U = {:.3f} W/(m²K){}", fr->u_value, fr->u_value_stated ? " (stated)" : ""));
    flank_labels.push_back({mid, along, -1.0 * inward, distance(pa, pb), lines});
  }

  // The dimension chains come last, outside the labels; keep labels off their extension lines.
  Occupied label_occupied = occupied;
  const auto xs = distinct_coordinates(section, true, b.x0, b.x1), ys = distinct_coordinates(section, false, b.y0, b.y1);
  for (double x : xs) {
    const double px = f.to_paper({x, 0}).x;
    label_occupied.add({px - 0.3, drawing.y1 + 0.5, px + 0.3, allowed.y1});
  }
  for (double y : ys) {
    const double py = f.to_paper({0, y}).y;
    label_occupied.add({allowed.x0, py - 0.3, drawing.x0 - 0.5, py + 0.3});
  }
  body += "<!--labels-->";

  // Probes: numbered markers; the table gives their names.
  for (std::size_t i = 0; i < section.probes.size(); ++i) {
    const Point p = f.to_paper(section.probes[i].at);
    body += fmt::format("<g><circle cx=\"{0}\" cy=\"{1}\" r=\"0.8\" fill=\"#fff\" stroke=\"#000\" stroke-width=\"0.25\"/>"
                        "<path d=\"M{2} {1} L{3} {1} M{0} {4} L{0} {5}\" stroke=\"#000\" stroke-width=\"0.15\"/></g>\n",
                        num(p.x), num(p.y), num(p.x - 1.3), num(p.x + 1.3), num(p.y - 1.3), num(p.y + 1.3));
    body += halo_text({p.x + 1.2, p.y - 1.0}, fmt::format("P{}", i + 1), small_font_size, "start", "font-weight=\"bold\"");
    occupied.add({p.x - 1.4, p.y - 3.2, p.x + 1.2 + svg::text_width("P10", small_font_size), p.y + 1.4});
  }

  // Labels: every surface with its environment and Rs of both runs, then the cut-off planes.
  for (std::size_t s = 0; s < section.surfaces.size(); ++s) {
    const Surface& surface = section.surfaces[s];
    std::size_t longest = 0;
    double longest_len = -1;
    for (std::size_t i = 0; i + 1 < surface.path.size(); ++i) {
      const double len = distance(surface.path[i], surface.path[i + 1]);
      if (len > longest_len) longest_len = len, longest = i;
    }
    const Point a = f.to_paper(surface.path[longest]), c = f.to_paper(surface.path[longest + 1]);
    const Point along = unit(c - a), mid = 0.5 * (a + c);
    const Point outward = outward_normal(f, locator, mid, along);
    const Environment& env = section.environments[surface.environment];
    std::vector<std::string> lines{surface.name, fmt::format("{} · {}", env.id, degrees(env.temperature, 1))};
    lines.push_back(surface.is_fixed_temperature() ? std::string("fixed surface temperature")
                                                   : fmt::format("Rs {:.2f} | {:.2f} m²K/W", surface.resistance, temperature_run_resistance(section, surface)));
    if (surface.kind == SurfaceKind::glazing) lines.back() += " (glazing)";
    const Box size = label_size_box(lines);
    const Placement p = place_label(label_occupied, hit, allowed, mid, along, distance(a, c), outward, size.x1, size.y1);
    occupied.add(p.box);
    label_occupied.add(p.box);
    include(extent, p.box);
    body += label_block(p, lines, environment_colour(section, surface.environment), true);
  }
  for (const FlankLabel& fl : flank_labels) {
    const Box size = label_size_box(fl.lines);
    const Placement p = place_label(label_occupied, hit, allowed, fl.anchor, fl.along, fl.length, fl.outward, size.x1, size.y1);
    occupied.add(p.box);
    label_occupied.add(p.box);
    include(extent, p.box);
    body += label_block(p, fl.lines, "#111", false);
  }

  // Dimension chains below and left of everything else; painted under the labels, whose white
  // boxes then interrupt the extension lines instead of being crossed by them.
  std::string dims;
  {
    const double bottom = std::max(drawing.y1, extent.y1) + 4.0, left = std::min(drawing.x0, extent.x0) - 4.0;
    auto chain = [&](bool horizontal, double at, const std::vector<double>& coords) {
      std::vector<double> ticks;
      std::vector<std::string> texts;
      std::vector<double> ordered = coords;  // in paper order: left to right, top to bottom
      if (!horizontal) std::reverse(ordered.begin(), ordered.end());
      for (double c : ordered) ticks.push_back(horizontal ? f.to_paper({c, 0}).x : f.to_paper({0, c}).y);
      for (std::size_t i = 0; i + 1 < ordered.size(); ++i) texts.push_back(length_text(std::abs(ordered[i + 1] - ordered[i]), section));
      dimension_chain(dims, occupied, extent, horizontal, at, horizontal ? drawing.y1 : drawing.x0, ticks, texts);
    };
    double row = 0;
    if (xs.size() > 2 && xs.size() <= 16) chain(true, bottom + row, xs), row += 6.0;
    chain(true, bottom + row, {b.x0, b.x1});
    row = 0;
    if (ys.size() > 2 && ys.size() <= 16) chain(false, left - row, ys), row += 7.0;
    chain(false, left - row, {b.y0, b.y1});
  }
  {
    const std::size_t at = body.find("<!--labels-->");
    body.replace(at, std::string("<!--labels-->").size(), dims);
  }

  // Scale bar and legend below everything.
  double y = extent.y1 + 5.0;
  body += scale_bar({extent.x0, y}, f, extent);
  y = extent.y1 + 5.0;
  const double x0 = extent.x0;
  const double width = std::max(extent.x1 - extent.x0, 120.0);
  const int columns = width >= 115 ? 2 : 1;
  double widest = 0;
  for (const Material& m : section.materials) widest = std::max(widest, svg::text_width(m.id + "  λ = 0.035 W/(m·K)", font_size));
  const double column_w = std::max(width / columns, widest + 16.0);
  std::string legend_defs;
  body += fmt::format("<text x=\"{}\" y=\"{}\" font-size=\"{}\" font-weight=\"bold\">Materials</text>\n", num(x0), num(y), num(font_size));
  y += 2.0;
  std::vector<std::size_t> used_materials;  // those some region paints, in file order
  for (std::size_t m = 0; m < section.materials.size(); ++m)
    if (std::any_of(section.regions.begin(), section.regions.end(), [&](const Region& r) { return r.material == m; })) used_materials.push_back(m);
  for (std::size_t k = 0; k < used_materials.size(); ++k) {
    const std::size_t m = used_materials[k];
    const double cx = x0 + (k % columns) * column_w, cy = y + (k / columns) * 5.2;
    body += fmt::format("<rect x=\"{}\" y=\"{}\" width=\"9\" height=\"4\" fill=\"url(#detail-m{}-h)\" stroke=\"#333\" stroke-width=\"0.15\"/>\n",
                        num(cx), num(cy), m);
    body += fmt::format("<text x=\"{}\" y=\"{}\" font-size=\"{}\"><tspan font-weight=\"bold\">{}</tspan>  λ = {} W/(m·K)</text>\n",
                        num(cx + 11), num(cy + 3.0), num(font_size), escape(section.materials[m].id), conductivity_text(section.materials[m].conductivity));
    include(extent, {cx, cy, cx + 11 + svg::text_width(section.materials[m].id + "  λ = 0.035 W/(m·K)", font_size), cy + 4});
  }
  y += ((used_materials.size() + columns - 1) / columns) * 5.2 + 3.0;
  body += fmt::format("<text x=\"{}\" y=\"{}\" font-size=\"{}\" font-weight=\"bold\">Boundaries</text>\n", num(x0), num(y), num(font_size));
  y += 2.0;
  std::vector<std::pair<std::string, std::string>> keys;  // (svg of the line sample, text)
  for (std::size_t e = 0; e < section.environments.size(); ++e) {
    const Environment& env = section.environments[e];
    keys.push_back({fmt::format("stroke=\"{}\" stroke-width=\"0.9\"", environment_colour(section, e)),
                    fmt::format("{} ({}), {}", env.id, side_name(env.side), degrees(env.temperature, 1))});
  }
  keys.push_back({"stroke=\"#111\" stroke-width=\"0.6\" stroke-dasharray=\"2.6 0.7 0.5 0.7\"", "adiabatic edge (cut-off plane)"});
  if (!section.flanking_elements.empty()) keys.push_back({"stroke=\"#5b3f8c\" stroke-width=\"0.22\"", "flanking length l for ψ (per dimension system)"});
  for (std::size_t k = 0; k < keys.size(); ++k) {
    const double cx = x0 + (k % columns) * column_w, cy = y + (k / columns) * 4.6;
    body += fmt::format("<path d=\"M{} {} L{} {}\" {} fill=\"none\"/>\n", num(cx), num(cy + 2), num(cx + 9), num(cy + 2), keys[k].first);
    body += fmt::format("<text x=\"{}\" y=\"{}\" font-size=\"{}\">{}</text>\n", num(cx + 11), num(cy + 2.8), num(font_size), escape(keys[k].second));
    include(extent, {cx, cy, cx + 11 + svg::text_width(keys[k].second, font_size), cy + 4});
  }
  y += ((keys.size() + columns - 1) / columns) * 4.6;
  const std::string note = fmt::format("Rs a | b: heat-loss run (ISO 6946) | surface-temperature run (ISO 13788), m²K/W · dimensions in {}", section.unit);
  body += fmt::format("<text x=\"{}\" y=\"{}\" font-size=\"{}\" fill=\"#444\">{}</text>\n", num(x0), num(y + 2.5), num(small_font_size), escape(note));
  include(extent, {x0, y - 1, x0 + std::max(width, svg::text_width(note, small_font_size)), y + 4});

  Drawing d;
  d.id = "detail";
  d.title = "Detail section";
  d.caption = fmt::format("The cross-section as modelled, drawn to scale 1:{} (A4 print at 100 %; the scale bar holds at any size). "
                          "Materials by hatch, surfaces in the colour of their environment with Rs of both runs, adiabatic edges as chain lines; "
                          "the violet lines give the lengths l over which each flanking element's U applies in ψ = L2D − Σ U·l. "
                          "Dimensions in {}.", num(f.denominator), section.unit);
  d.svg = finish(d.title, fmt::format("Detail section · scale 1:{}", num(f.denominator)),
                 material_pattern_defs(fills, "detail") + legend_defs, body, extent);
  return d;
}

}  // namespace edgeflux
