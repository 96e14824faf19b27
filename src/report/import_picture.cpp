#include "report/import_picture.h"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <filesystem>

#include "report/material_fills.h"
#include "report/svg_support.h"

namespace edgeflux {

namespace {

using svg::num;

constexpr double drawing_width = 250.0, drawing_height = 150.0;  // mm of paper for the section
constexpr double margin = 14.0;                                   // room for the run labels
constexpr const char* run_colours[] = {"#c0392b", "#1f5fa8"};     // neighbouring runs alternate

std::string label(Point at, const std::string& text, double size, const char* colour, const char* weight) {
  return fmt::format("<text x=\"{0}\" y=\"{1}\" font-size=\"{2}\" text-anchor=\"middle\" dominant-baseline=\"central\" "
                     "font-weight=\"{5}\" stroke=\"#fff\" stroke-width=\"{3}\" paint-order=\"stroke\" fill=\"{4}\">{6}</text>\n",
                     num(at.x), num(at.y), num(size), num(size * 0.3), colour, weight, svg::escape(text));
}

/// The point halfway along a run, and the run's direction there (paper coordinates).
std::pair<Point, Point> middle_of(const std::vector<Point>& paper, bool closed) {
  std::vector<Point> pts = paper;
  if (closed) pts.push_back(pts.front());
  double total = 0.0;
  for (std::size_t i = 0; i + 1 < pts.size(); ++i) total += distance(pts[i], pts[i + 1]);
  double left = 0.5 * total;
  for (std::size_t i = 0; i + 1 < pts.size(); ++i) {
    const double piece = distance(pts[i], pts[i + 1]);
    if (left <= piece || i + 2 == pts.size()) {
      const Point along = piece > 0 ? (1.0 / piece) * (pts[i + 1] - pts[i]) : Point{1, 0};
      return {pts[i] + std::min(left, piece) * along, along};
    }
    left -= piece;
  }
  return {pts.front(), {1, 0}};
}

}  // namespace

std::string import_picture_svg(const DrawingImport& import) {
  const CrossSection& section = import.section;
  double x0 = 1e300, y0 = 1e300, x1 = -1e300, y1 = -1e300;
  for (const Region& r : section.regions)
    for (Point p : r.outline) x0 = std::min(x0, p.x), x1 = std::max(x1, p.x), y0 = std::min(y0, p.y), y1 = std::max(y1, p.y);
  svg::PaperFrame f;
  f.denominator = svg::standard_scale(std::max((x1 - x0) * 1000.0 / drawing_width, (y1 - y0) * 1000.0 / drawing_height));
  f.world_x0 = x0, f.world_y1 = y1;
  f.paper_x0 = margin, f.paper_y0 = margin + 8.0;
  const std::string title = fmt::format("{} — regions R1…R{} and outline runs S1…S{}, scale 1:{}",
                                        std::filesystem::path(import.drawing.file).filename().string(), section.regions.size(),
                                        import.runs.size(), num(f.denominator));
  const double width = 2 * margin + std::max({f.mm(x1 - x0), 150.0, svg::text_width(title, 4.0)});
  const double section_bottom = f.paper_y0 + f.mm(y1 - y0);

  std::string body;
  body += fmt::format("<text x=\"{}\" y=\"{}\" font-size=\"4\" font-weight=\"bold\">{}</text>\n", num(margin), num(margin),
                      svg::escape(title));
  const std::vector<MaterialFill> fills = material_fills(section);
  for (const Region& r : section.regions) {
    std::string d = svg::path_d(f, r.outline, true);
    for (const auto& island : r.islands) d += " " + svg::path_d(f, island, true);
    body += fmt::format("<path d=\"{}\" fill=\"{}\" fill-rule=\"evenodd\" stroke=\"#555\" stroke-width=\"0.15\" "
                        "stroke-linejoin=\"round\"/>\n", d, fills[r.material].ground);
  }
  for (std::size_t k = 0; k < import.runs.size(); ++k) {
    const OutlineRun& run = import.runs[k];
    std::vector<Point> paper;
    for (Point p : run.points) paper.push_back(f.to_paper(p));
    const char* colour = run_colours[k % 2];
    body += fmt::format("<path d=\"{}\" fill=\"none\" stroke=\"{}\" stroke-width=\"0.6\" stroke-linejoin=\"round\"/>\n",
                        svg::path_d(f, run.points, run.closed), colour);
    if (!run.closed)
      for (Point end : {paper.front(), paper.back()})
        body += fmt::format("<circle cx=\"{}\" cy=\"{}\" r=\"0.7\" fill=\"#fff\" stroke=\"#222\" stroke-width=\"0.25\"/>\n",
                            num(end.x), num(end.y));
    // The label sits outside the section: to the right of the run's direction on paper (the
    // section lies to its left in section coordinates, and paper flips y).
    const auto [middle, along] = middle_of(paper, run.closed);
    const Point outward{-along.y, along.x};
    const Point at = middle + 4.0 * outward;
    body += fmt::format("<line x1=\"{}\" y1=\"{}\" x2=\"{}\" y2=\"{}\" stroke=\"{}\" stroke-width=\"0.2\"/>\n", num(middle.x),
                        num(middle.y), num(at.x - 1.8 * outward.x), num(at.y - 1.8 * outward.y), colour);
    body += label(at, fmt::format("S{}", k + 1), 2.6, colour, "bold");
  }
  for (std::size_t r = 0; r < section.regions.size(); ++r)
    body += label(f.to_paper(import.region_labels[r]), fmt::format("R{}", r + 1), 2.2, "#222", "normal");

  // Legend: what each number is, in two columns.
  std::vector<std::string> lines;
  for (std::size_t r = 0; r < section.regions.size(); ++r)
    lines.push_back(fmt::format("R{}  {} → {}", r + 1, section.regions[r].name, section.materials[section.regions[r].material].id));
  for (std::size_t k = 0; k < import.runs.size(); ++k)
    lines.push_back(fmt::format("S{}  {:.1f} mm along {}", k + 1, import.runs[k].length * 1000.0,
                                section.regions[import.runs[k].region].name));
  constexpr std::size_t most_lines = 120;
  if (lines.size() > most_lines) {
    const std::size_t left_out = lines.size() - most_lines + 1;
    lines.resize(most_lines - 1);
    lines.push_back(fmt::format("… and {} more (edgeflux import prints them all)", left_out));
  }
  const double line_height = 3.6, column_width = (width - 2 * margin) / 2;
  const std::size_t per_column = (lines.size() + 1) / 2;
  const double legend_top = section_bottom + margin;
  for (std::size_t i = 0; i < lines.size(); ++i) {
    const double x = margin + (i < per_column ? 0.0 : column_width);
    const double y = legend_top + line_height * static_cast<double>(i % std::max<std::size_t>(per_column, 1));
    body += fmt::format("<text x=\"{}\" y=\"{}\" font-size=\"2.6\">{}</text>\n", num(x), num(y), svg::escape(lines[i]));
  }
  const double height = legend_top + line_height * static_cast<double>(per_column) + margin / 2;
  return "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n" + svg::open_svg(width, height, "Numbered regions and outline runs") +
         fmt::format("<rect width=\"{}\" height=\"{}\" fill=\"#fff\"/>\n", num(width), num(height)) + body + "</svg>\n";
}

}  // namespace edgeflux
