// Builds the report drawings. All geometry is converted to paper millimetres first (SVG user
// units = mm), so printed drawings keep their stated scale and text sizes are real sizes.
#include "report/svg_drawings.h"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <map>
#include <functional>
#include <optional>

#include "report/colour_map.h"
#include "report/field_quantities.h"
#include "solver/error_indicator.h"
#include "report/material_fills.h"
#include "report/svg_support.h"

namespace edgeflux {
namespace {

using svg::Box;
using svg::escape;
using svg::num;
using svg::Occupied;
using svg::PaperFrame;

constexpr double font_size = 2.3;        // mm, about 6.5 pt: the size of drawing annotations
constexpr double small_font_size = 2.0;  // mm
constexpr double heading_size = 3.0;     // mm
constexpr double max_width = 180.0;      // mm, the text width of an A4 page with 15 mm margins

struct Bounds {
  double x0 = 0, y0 = 0, x1 = 0, y1 = 0;
  double width() const { return x1 - x0; }
  double height() const { return y1 - y0; }
};

Bounds section_bounds(const TriMesh& mesh) {
  Bounds b{1e300, 1e300, -1e300, -1e300};
  for (const Point& p : mesh.points) {
    b.x0 = std::min(b.x0, p.x), b.x1 = std::max(b.x1, p.x);
    b.y0 = std::min(b.y0, p.y), b.y1 = std::max(b.y1, p.y);
  }
  return b;
}

/// The frame at the smallest standard scale that fits the section into max_w × max_h mm.
PaperFrame fit_frame(const Bounds& b, double max_w, double max_h) {
  PaperFrame f;
  f.denominator = svg::standard_scale(std::max(b.width() * 1000.0 / max_w, b.height() * 1000.0 / max_h));
  f.world_x0 = b.x0;
  f.world_y1 = b.y1;
  return f;
}

Point to_world(const PaperFrame& f, Point p) {
  return {f.world_x0 + (p.x - f.paper_x0) * f.denominator / 1000.0, f.world_y1 - (p.y - f.paper_y0) * f.denominator / 1000.0};
}

Box paper_box(const PaperFrame& f, const Bounds& b) {
  const Point a = f.to_paper({b.x0, b.y1}), c = f.to_paper({b.x1, b.y0});
  return {a.x, a.y, c.x, c.y};
}

void include(Box& extent, const Box& b) {
  extent.x0 = std::min(extent.x0, b.x0), extent.y0 = std::min(extent.y0, b.y0);
  extent.x1 = std::max(extent.x1, b.x1), extent.y1 = std::max(extent.y1, b.y1);
}

Point unit(Point v) {
  const double n = norm(v);
  return n > 0 ? (1.0 / n) * v : Point{1, 0};
}

/// Drops interior points of straight runs, so long straight edges become one segment.
std::vector<Point> simplified(const std::vector<Point>& pts, bool closed) {
  if (pts.size() < 3) return pts;
  std::vector<Point> out;
  const std::size_t n = pts.size();
  for (std::size_t i = 0; i < n; ++i) {
    if (!closed && (i == 0 || i + 1 == n)) {
      out.push_back(pts[i]);
      continue;
    }
    const Point a = pts[(i + n - 1) % n], b = pts[i], c = pts[(i + 1) % n];
    const double scale = std::max(distance(a, b), distance(b, c));
    if (std::abs(cross(b - a, c - b)) > 1e-9 * scale * scale) out.push_back(b);
  }
  return out;
}

/// Okabe–Ito colours (colour-blind safe), by side: interior warm, exterior blue, others green/purple.
std::string environment_colour(const CrossSection& section, std::size_t env) {
  static const char* interior[] = {"#D55E00", "#CC79A7", "#E69F00"};
  static const char* exterior[] = {"#0072B2", "#56B4E9"};
  static const char* other[] = {"#009E73", "#CC79A7", "#E69F00", "#56B4E9"};
  int k = 0;
  const Side side = section.environments[env].side;
  for (std::size_t e = 0; e < env; ++e)
    if (section.environments[e].side == side) ++k;
  if (side == Side::interior) return interior[k % 3];
  if (side == Side::exterior) return exterior[k % 2];
  return other[k % 4];
}

const char* side_name(Side s) { return s == Side::interior ? "interior" : s == Side::exterior ? "exterior" : "other"; }

std::string length_text(double metres, const CrossSection& section) {
  std::string s = fmt::format("{:.1f}", metres / section.metres_per_unit);
  if (s.size() > 2 && s.substr(s.size() - 2) == ".0") s.resize(s.size() - 2);
  return s;
}

/// λ with the digits a designer writes: 0.035, 0.99, 2.50, 230.
std::string conductivity_text(double v) { return fmt::format("{:.{}f}", v, v < 0.1 ? 3 : v < 10 ? 2 : 0); }

std::string degrees(double v, int decimals) { return svg::label_number(v, decimals) + " °C"; }

/// Text with a white halo, so it reads over hatches and colour fields.
std::string halo_text(Point at, const std::string& text, double size, const char* anchor, const char* extra = "") {
  return fmt::format("<text x=\"{}\" y=\"{}\" font-size=\"{}\" text-anchor=\"{}\" stroke=\"#fff\" stroke-width=\"{}\" "
                     "stroke-linejoin=\"round\" paint-order=\"stroke\" {}>{}</text>\n",
                     num(at.x), num(at.y), num(size), anchor, num(size * 0.28), extra, escape(text));
}

/// Boundary stretches of one tag along the loops: (surface tag, node polyline).
std::vector<std::pair<int, std::vector<Point>>> boundary_runs(const TriMesh& mesh) {
  std::vector<std::pair<int, std::vector<Point>>> runs;
  for (const std::vector<int>& loop : boundary_loops(mesh)) {
    const std::size_t n = loop.size();
    std::size_t start = 0;
    for (std::size_t k = 0; k < n; ++k)
      if (mesh.boundary_edges[loop[k]].surface != mesh.boundary_edges[loop[(k + n - 1) % n]].surface) { start = k; break; }
    for (std::size_t k = 0; k < n; ++k) {
      const BoundaryEdge& e = mesh.boundary_edges[loop[(start + k) % n]];
      if (runs.empty() || k == 0 || runs.back().first != e.surface) runs.push_back({e.surface, {mesh.points[e.a]}});
      runs.back().second.push_back(mesh.points[e.b]);
    }
  }
  for (auto& r : runs) r.second = simplified(r.second, false);
  return runs;
}

std::string outline_d(const PaperFrame& f, const TriMesh& mesh) {
  std::string d;
  for (const std::vector<int>& loop : boundary_loops(mesh)) {
    std::vector<Point> pts;
    for (int e : loop) pts.push_back(mesh.points[mesh.boundary_edges[e].a]);
    d += svg::path_d(f, simplified(pts, true), true) + " ";
  }
  return d;
}

/// Tests whether paper boxes overlap the section, by sampling points in the box.
struct SectionHitTest {
  const PaperFrame& frame;
  const svg::PointLocator& locator;
  bool hits(const Box& b) const {
    for (int i = 0; i <= 6; ++i)
      for (int j = 0; j <= 3; ++j) {
        const Point p{b.x0 + (b.x1 - b.x0) * i / 6.0, b.y0 + (b.y1 - b.y0) * j / 3.0};
        if (locator.triangle_at(to_world(frame, p)) >= 0) return true;
      }
    return false;
  }
};

/// Direction (paper) away from the section at a boundary point, found by probing both normals.
Point outward_normal(const PaperFrame& f, const svg::PointLocator& locator, Point paper_at, Point paper_along) {
  const Point n{-paper_along.y, paper_along.x};
  for (double probe : {0.6, 1.5, 3.0}) {
    const bool plus_inside = locator.triangle_at(to_world(f, paper_at + probe * n)) >= 0;
    const bool minus_inside = locator.triangle_at(to_world(f, paper_at - probe * n)) >= 0;
    if (plus_inside != minus_inside) return plus_inside ? -1.0 * n : n;
  }
  return n;
}

/// Places a box of size w × h near `anchor`, away from the section along `outward`, sliding along
/// `along` when the first places are taken. Returns the box and the anchor point it refers to.
struct Placement {
  Box box;
  Point anchor;
};
Placement place_label(const Occupied& occupied, const SectionHitTest& section, const Box& allowed, Point anchor, Point along,
                      double along_length, Point outward, double w, double h) {
  const double half_normal = std::abs(outward.x) * w / 2 + std::abs(outward.y) * h / 2;
  // Candidates by cost: distance from the element, plus sliding along it, plus (much more)
  // sliding beyond its ends.
  struct Candidate { double cost, d, s; };
  std::vector<Candidate> candidates;
  for (double d : {1.5, 3.5, 6.0, 9.0, 13.0, 18.0, 24.0, 32.0})
    for (double s : {0.0, 0.1, -0.1, 0.2, -0.2, 0.35, -0.35, 0.45, -0.45, 0.7, -0.7, 1.0, -1.0, 1.5, -1.5, 2.0, -2.0, 3.0, -3.0}) {
      const double a = std::abs(s);
      candidates.push_back({d + 0.15 * std::min(a, 0.45) * along_length + std::max(0.0, a - 0.45) * along_length, d, s});
    }
  std::stable_sort(candidates.begin(), candidates.end(), [](const Candidate& x, const Candidate& y) { return x.cost < y.cost; });
  std::optional<Placement> fallback;
  for (const Candidate& k : candidates) {
    // The leader starts on the element; beyond its ends only the label moves on.
    const Point on = anchor + (std::clamp(k.s, -0.45, 0.45) * along_length) * along;
    const Point c = anchor + (k.s * along_length) * along + (k.d + half_normal) * outward;
    const Box b{c.x - w / 2, c.y - h / 2, c.x + w / 2, c.y + h / 2};
    if (!allowed.contains(b)) continue;
    if (!fallback) fallback = Placement{b, on};
    if (occupied.is_free(b.grown(0.6)) && !section.hits(b.grown(0.5))) return {b, on};
  }
  if (fallback) return *fallback;
  const Point c = anchor + (3.0 + half_normal) * outward;
  return {{c.x - w / 2, c.y - h / 2, c.x + w / 2, c.y + h / 2}, anchor};
}

Point nearest_on_box(const Box& b, Point p) { return {std::clamp(p.x, b.x0, b.x1), std::clamp(p.y, b.y0, b.y1)}; }

/// A label block: lines of text in a box with a leader to its anchor.
std::string label_block(const Placement& p, const std::vector<std::string>& lines, const std::string& colour, bool first_bold) {
  std::string out;
  const Point end = nearest_on_box(p.box, p.anchor);
  if (distance(end, p.anchor) > 0.8)
    out += fmt::format("<path d=\"M{} {} L{} {}\" stroke=\"{}\" stroke-width=\"0.2\"/><circle cx=\"{}\" cy=\"{}\" r=\"0.45\" fill=\"{}\"/>\n",
                       num(p.anchor.x), num(p.anchor.y), num(end.x), num(end.y), colour, num(p.anchor.x), num(p.anchor.y), colour);
  out += fmt::format("<rect x=\"{}\" y=\"{}\" width=\"{}\" height=\"{}\" fill=\"#fff\" fill-opacity=\"0.9\" stroke=\"{}\" stroke-width=\"0.2\" rx=\"0.4\"/>\n",
                     num(p.box.x0), num(p.box.y0), num(p.box.x1 - p.box.x0), num(p.box.y1 - p.box.y0), colour);
  for (std::size_t i = 0; i < lines.size(); ++i)
    out += fmt::format("<text x=\"{}\" y=\"{}\" font-size=\"{}\"{}>{}</text>\n", num(p.box.x0 + 0.7),
                       num(p.box.y0 + 0.55 + font_size * (0.95 + 1.2 * i)), num(i == 0 ? font_size : small_font_size),
                       i == 0 && first_bold ? " font-weight=\"bold\"" : "", escape(lines[i]));
  return out;
}

Box label_size_box(const std::vector<std::string>& lines) {
  double w = 0;
  for (std::size_t i = 0; i < lines.size(); ++i) w = std::max(w, svg::text_width(lines[i], i == 0 ? font_size : small_font_size));
  return {0, 0, w + 1.4, font_size * (0.45 + 1.2 * lines.size())};
}

/// One chain of dimensions. `ticks` are paper positions along the chain (x for horizontal chains,
/// y for vertical), `at` the chain's position across, `from` where the extension lines start.
void dimension_chain(std::string& out, Occupied& occupied, Box& extent, bool horizontal, double at, double from,
                     const std::vector<double>& ticks, const std::vector<std::string>& texts) {
  if (ticks.size() < 2) return;
  const double dir = at > from ? 1.0 : -1.0;  // away from the drawing
  auto P = [&](double along, double across) { return horizontal ? Point{along, across} : Point{across, along}; };
  std::string d;
  const Point l0 = P(ticks.front() - 1.2, at), l1 = P(ticks.back() + 1.2, at);
  d += fmt::format("M{} {} L{} {}", num(l0.x), num(l0.y), num(l1.x), num(l1.y));
  for (double t : ticks) {
    const Point e0 = P(t, from + dir * 1.0), e1 = P(t, at + dir * 1.2);
    d += fmt::format(" M{} {} L{} {}", num(e0.x), num(e0.y), num(e1.x), num(e1.y));
    const Point c = P(t, at);  // architectural 45° tick
    d += fmt::format(" M{} {} L{} {}", num(c.x - 0.8), num(c.y + 0.8), num(c.x + 0.8), num(c.y - 0.8));
  }
  out += fmt::format("<path d=\"{}\" stroke=\"#222\" stroke-width=\"0.18\" fill=\"none\"/>\n", d);
  include(extent, {std::min(l0.x, l1.x) - 1, std::min(l0.y, l1.y) - 1, std::max(l0.x, l1.x) + 1, std::max(l0.y, l1.y) + 1});
  // Values that fit their span first, so the others make way for them, not the reverse.
  std::vector<std::size_t> order;
  for (int pass = 0; pass < 2; ++pass)
    for (std::size_t i = 0; i + 1 < ticks.size(); ++i)
      if ((svg::text_width(texts[i], font_size) + 0.8 < ticks[i + 1] - ticks[i]) == (pass == 0)) order.push_back(i);
  for (std::size_t i : order) {
    const double mid = 0.5 * (ticks[i] + ticks[i + 1]), span = ticks[i + 1] - ticks[i];
    const double w = svg::text_width(texts[i], font_size), h = font_size * 0.85;
    // Text sits on the side of the line toward the drawing for horizontal chains, outside for
    // vertical ones (read from the right, as on drawings). A value too long for its span moves to
    // the nearest free place: along the line for horizontal chains, out to the side, upright and
    // with a leader, for vertical ones.
    const bool fits = w + 0.8 < span;
    const double across_side = horizontal ? -dir : -1.0;
    std::optional<Box> chosen;
    const int tries = horizontal ? 13 : 41;
    for (int k = 0; k < tries && !chosen; ++k) {
      // Along horizontal chains jump past the neighbouring spans; beside vertical ones creep in
      // half-millimetre steps, so values keep the order of their spans.
      const double step = horizontal ? (w * 0.5 + span * 0.5 + 0.8) : 0.5;
      const double shift = k == 0 ? 0.0 : ((k + 1) / 2) * (k % 2 ? 1.0 : -1.0) * step;
      Box box;
      if (fits) {
        const double c_across = at + across_side * (0.6 + h / 2);
        box = horizontal ? Box{mid - w / 2, c_across - h / 2, mid + w / 2, c_across + h / 2}
                         : Box{c_across - h / 2, mid - w / 2, c_across + h / 2, mid + w / 2};
      } else if (horizontal) {
        if (k == 0) continue;
        const double c_across = at + across_side * (0.6 + h / 2);
        box = {mid + shift - w / 2, c_across - h / 2, mid + shift + w / 2, c_across + h / 2};
      } else {
        box = {at - 1.0 - w, mid + shift - h / 2, at - 1.0, mid + shift + h / 2};
      }
      if (fits || occupied.is_free(box.grown(0.25)) || k == tries - 1) chosen = box;
    }
    occupied.add(*chosen);
    include(extent, *chosen);
    const Point c{0.5 * (chosen->x0 + chosen->x1), 0.5 * (chosen->y0 + chosen->y1)};
    if (horizontal || !fits)
      out += fmt::format("<text x=\"{}\" y=\"{}\" font-size=\"{}\" text-anchor=\"middle\">{}</text>\n", num(c.x), num(chosen->y1 - 0.15),
                         num(font_size), escape(texts[i]));
    else
      out += fmt::format("<text transform=\"translate({} {}) rotate(-90)\" font-size=\"{}\" text-anchor=\"middle\">{}</text>\n",
                         num(chosen->x1 - 0.15), num(c.y), num(font_size), escape(texts[i]));
    // A short leader from the span to a value that had to move.
    const Point on_line = P(mid, at);
    if (horizontal && std::abs(c.x - mid) > 0.01) {
      const Point end{c.x + (c.x > mid ? -w / 2 : w / 2), c.y};
      out += fmt::format("<path d=\"M{} {} L{} {}\" stroke=\"#666\" stroke-width=\"0.12\"/>\n", num(on_line.x), num(on_line.y), num(end.x), num(end.y));
    } else if (!horizontal && !fits) {
      out += fmt::format("<path d=\"M{} {} L{} {}\" stroke=\"#666\" stroke-width=\"0.12\"/>\n", num(on_line.x), num(on_line.y), num(chosen->x1 + 0.1),
                         num(c.y));
    }
  }
}

std::vector<double> distinct_coordinates(const CrossSection& section, bool x, double lo, double hi) {
  std::vector<double> v;
  for (const Region& r : section.regions)
    for (const Point& p : r.outline) {
      const double c = x ? p.x : p.y;
      if (c >= lo - 1e-9 && c <= hi + 1e-9) v.push_back(c);
    }
  std::sort(v.begin(), v.end());
  std::vector<double> out;
  for (double c : v)
    if (out.empty() || c - out.back() > 1e-7) out.push_back(c);
  return out;
}

std::string scale_bar(Point at, const PaperFrame& f, Box& extent) {
  // A bar of about 30 mm in round metres, alternately filled.
  const double metres = svg::nice_step(30.0 * f.denominator / 1000.0, 1);
  const double len = f.mm(metres);
  std::string out;
  for (int i = 0; i < 4; ++i)
    out += fmt::format("<rect x=\"{}\" y=\"{}\" width=\"{}\" height=\"1.2\" fill=\"{}\" stroke=\"#222\" stroke-width=\"0.15\"/>\n",
                       num(at.x + i * len / 4), num(at.y), num(len / 4), i % 2 ? "#fff" : "#222");
  out += fmt::format("<text x=\"{}\" y=\"{}\" font-size=\"{}\" text-anchor=\"middle\">0</text>\n", num(at.x), num(at.y + 3.6), num(small_font_size));
  out += fmt::format("<text x=\"{}\" y=\"{}\" font-size=\"{}\" text-anchor=\"middle\">{} m</text>\n", num(at.x + len), num(at.y + 3.6),
                     num(small_font_size), num(metres));
  out += fmt::format("<text x=\"{}\" y=\"{}\" font-size=\"{}\">scale 1:{} on A4 at 100 %</text>\n", num(at.x + len + 5), num(at.y + 1.3),
                     num(small_font_size), num(f.denominator));
  include(extent, {at.x - 1, at.y - 0.5, at.x + len + 5 + svg::text_width("scale 1:20 on A4 at 100 %", small_font_size), at.y + 4.2});
  return out;
}

std::string heading(const std::string& text) {
  return fmt::format("<text x=\"0\" y=\"{}\" font-size=\"{}\" font-weight=\"bold\">{}</text>\n", num(heading_size), num(heading_size), escape(text));
}

/// Wraps drawing content built around a paper origin into a document whose top-left corner is the
/// content's extent, with the heading above it.
std::string finish(const std::string& title, const std::string& heading_text, const std::string& defs, const std::string& body, Box extent) {
  const double margin = 2.0, head = heading_size + 3.0;
  extent.x1 = std::max(extent.x1, extent.x0 + svg::text_width(heading_text, heading_size));
  const double w = extent.x1 - extent.x0 + 2 * margin, h = extent.y1 - extent.y0 + 2 * margin + head;
  std::string out = svg::open_svg(w, h, title);
  if (!defs.empty()) out += "<defs>\n" + defs + "</defs>\n";
  out += "<rect width=\"100%\" height=\"100%\" fill=\"#fff\"/>\n";
  out += fmt::format("<g transform=\"translate({} {})\">\n", num(margin), num(margin)) + heading(heading_text) + "</g>\n";
  out += fmt::format("<g transform=\"translate({} {})\">\n", num(margin - extent.x0), num(margin + head - extent.y0));
  out += body;
  out += "</g>\n</svg>\n";
  return out;
}

const FlankingResult* flanking_result(const CrossSection&, const Calculation& calc, const std::string& id) {
  for (const FlankingResult& r : calc.junction.flanking)
    if (r.id == id) return &r;
  return nullptr;
}

const char* system_short(DimensionSystem s) {
  return s == DimensionSystem::internal ? "int." : s == DimensionSystem::overall_internal ? "ov. int." : "ext.";
}

/// The fills of the regions in painting order (later regions cover earlier ones, as in the solver).
std::string region_fills(const CrossSection& section, const PaperFrame& f, const std::string& prefix, bool patterns,
                         const std::vector<MaterialFill>& fills, const char* stroke, double stroke_width) {
  std::string out;
  for (const Region& r : section.regions) {
    double x0 = 1e300, x1 = -1e300, y0 = 1e300, y1 = -1e300;
    for (const Point& p : r.outline) x0 = std::min(x0, p.x), x1 = std::max(x1, p.x), y0 = std::min(y0, p.y), y1 = std::max(y1, p.y);
    const bool tall = (y1 - y0) > 1.5 * (x1 - x0);
    const std::string fill = patterns ? fmt::format("url(#{}-m{}-{})", prefix, r.material, tall ? "v" : "h") : fills[r.material].ground;
    std::string d = svg::path_d(f, r.outline, true);
    for (const auto& island : r.islands) d += " " + svg::path_d(f, island, true);
    out += fmt::format("<path d=\"{}\" fill=\"{}\" fill-rule=\"evenodd\" stroke=\"{}\" stroke-width=\"{}\" "
                       "stroke-linejoin=\"round\"/>\n", d, fill, stroke, num(stroke_width));
  }
  return out;
}

}  // namespace

// ---------------------------------------------------------------------------------------------
Drawing detail_drawing(const CrossSection& section, const Calculation& calc) {
  const TriMesh& mesh = calc.mesh;
  const Bounds b = section_bounds(mesh);
  PaperFrame f = fit_frame(b, max_width - 85.0, 175.0);
  const svg::PointLocator locator(mesh);
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
                                                   : fmt::format("Rs {:.2f} | {:.2f} m²K/W", surface.resistance, surface.temperature_run_resistance));
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

// ---------------------------------------------------------------------------------------------
namespace {

/// Frame shared by the field plots: a standard scale that leaves room for a colour bar.
PaperFrame field_frame(const Bounds& b) { return fit_frame(b, max_width - 40.0, 205.0); }

std::string colour_bar(Point at, double height, const std::vector<std::pair<double, std::string>>& band_colours,
                       const std::vector<std::pair<double, std::string>>& ticks, const std::string& title, const std::string& subtitle,
                       Box& extent) {
  // band_colours: (fraction from the bottom where the band ends, colour), ascending.
  std::string out;
  const double w = 4.0;
  double previous = 0.0;
  for (const auto& [end, colour] : band_colours) {
    const double y_top = at.y + height * (1.0 - end), y_bottom = at.y + height * (1.0 - previous);
    out += fmt::format("<rect x=\"{}\" y=\"{}\" width=\"{}\" height=\"{}\" fill=\"{}\" stroke=\"{}\" stroke-width=\"0.05\"/>\n", num(at.x),
                       num(y_top), num(w), num(y_bottom - y_top), colour, colour);
    previous = end;
  }
  out += fmt::format("<rect x=\"{}\" y=\"{}\" width=\"{}\" height=\"{}\" fill=\"none\" stroke=\"#222\" stroke-width=\"0.2\"/>\n", num(at.x), num(at.y),
                     num(w), num(height));
  double text_w = 0;
  double last_y = 1e300;
  for (const auto& [fraction, text] : ticks) {
    const double y = at.y + height * (1.0 - fraction);
    out += fmt::format("<path d=\"M{} {} L{} {}\" stroke=\"#222\" stroke-width=\"0.2\"/>\n", num(at.x + w), num(y), num(at.x + w + 1.0), num(y));
    if (last_y - y < font_size * 1.05) continue;  // keep tick labels apart
    last_y = y;
    out += fmt::format("<text x=\"{}\" y=\"{}\" font-size=\"{}\">{}</text>\n", num(at.x + w + 1.6), num(y + font_size * 0.35), num(font_size), escape(text));
    text_w = std::max(text_w, svg::text_width(text, font_size));
  }
  out += fmt::format("<text x=\"{}\" y=\"{}\" font-size=\"{}\" font-weight=\"bold\">{}</text>\n", num(at.x), num(at.y - 6.0), num(font_size), escape(title));
  out += fmt::format("<text x=\"{}\" y=\"{}\" font-size=\"{}\" fill=\"#444\">{}</text>\n", num(at.x), num(at.y - 3.0), num(small_font_size), escape(subtitle));
  include(extent, {at.x, at.y - 8.5, at.x + std::max({w + 2 + text_w, svg::text_width(title, font_size), svg::text_width(subtitle, small_font_size)}),
                   at.y + height + 1});
  return out;
}

using PVert = std::pair<Point, double>;  // paper point and the temperature there

std::vector<PVert> clip_polygon(const std::vector<PVert>& poly, double level, bool keep_above) {
  std::vector<PVert> out;
  const std::size_t n = poly.size();
  for (std::size_t i = 0; i < n; ++i) {
    const PVert& c = poly[i];
    const PVert& d = poly[(i + 1) % n];
    const bool c_in = keep_above ? c.second >= level : c.second <= level;
    const bool d_in = keep_above ? d.second >= level : d.second <= level;
    if (c_in) out.push_back(c);
    if (c_in != d_in) {
      const double t = (level - c.second) / (d.second - c.second);
      out.push_back({c.first + t * (d.first - c.first), level});
    }
  }
  return out;
}

struct Isotherm {
  double level;
  std::vector<std::vector<Point>> lines;  // paper polylines
};

/// Isotherms by marching triangles, chained across shared edges into polylines.
Isotherm isotherm(const TriMesh& mesh, const PaperFrame& f, const std::vector<double>& T, double level) {
  std::vector<std::pair<std::pair<int, int>, std::pair<int, int>>> segments;  // edge keys of both ends
  for (const auto& tri : mesh.triangles) {
    std::pair<int, int> ends[2];
    int n = 0;
    for (int i = 0; i < 3; ++i) {
      const int a = tri[i], b = tri[(i + 1) % 3];
      if ((T[a] >= level) != (T[b] >= level) && n < 2) ends[n++] = {std::min(a, b), std::max(a, b)};
    }
    if (n == 2) segments.push_back({ends[0], ends[1]});
  }
  auto point_of = [&](std::pair<int, int> e) {
    const double t = (level - T[e.first]) / (T[e.second] - T[e.first]);
    const Point w = mesh.points[e.first] + t * (mesh.points[e.second] - mesh.points[e.first]);
    return f.to_paper(w);
  };
  std::multimap<std::pair<int, int>, int> by_edge;
  for (std::size_t i = 0; i < segments.size(); ++i) by_edge.emplace(segments[i].first, i), by_edge.emplace(segments[i].second, i);
  std::vector<bool> used(segments.size(), false);
  Isotherm iso{level, {}};
  for (std::size_t s = 0; s < segments.size(); ++s) {
    if (used[s]) continue;
    used[s] = true;
    std::vector<std::pair<int, int>> forward{segments[s].second}, backward{segments[s].first};
    for (auto* chain : {&forward, &backward}) {
      for (;;) {
        auto [lo, hi] = by_edge.equal_range(chain->back());
        int next = -1;
        for (auto it = lo; it != hi; ++it)
          if (!used[it->second]) { next = it->second; break; }
        if (next < 0) break;
        used[next] = true;
        chain->push_back(segments[next].first == chain->back() ? segments[next].second : segments[next].first);
      }
    }
    std::vector<Point> line;
    for (auto it = backward.rbegin(); it != backward.rend(); ++it) line.push_back(point_of(*it));
    for (const auto& e : forward) line.push_back(point_of(e));
    iso.lines.push_back(std::move(line));
  }
  return iso;
}

bool segment_hits_box(Point a, Point b, const Box& box) {
  // Liang–Barsky clipping of the segment against the box.
  double t0 = 0, t1 = 1;
  const double dx = b.x - a.x, dy = b.y - a.y;
  const double p[4] = {-dx, dx, -dy, dy}, q[4] = {a.x - box.x0, box.x1 - a.x, a.y - box.y0, box.y1 - a.y};
  for (int i = 0; i < 4; ++i) {
    if (p[i] == 0) {
      if (q[i] < 0) return false;
    } else {
      const double t = q[i] / p[i];
      if (p[i] < 0) t0 = std::max(t0, t);
      else t1 = std::min(t1, t);
      if (t0 > t1) return false;
    }
  }
  return true;
}

std::string section_overlay(const CrossSection& section, const TriMesh& mesh, const PaperFrame& f) {
  std::string out;
  for (const Region& r : section.regions) {
    out += fmt::format("<path d=\"{}\" fill=\"none\" stroke=\"#000\" stroke-opacity=\"0.45\" stroke-width=\"0.12\"/>\n", svg::path_d(f, r.outline, true));
    for (const auto& island : r.islands)
      out += fmt::format("<path d=\"{}\" fill=\"none\" stroke=\"#000\" stroke-opacity=\"0.45\" stroke-width=\"0.12\"/>\n", svg::path_d(f, island, true));
  }
  out += fmt::format("<path d=\"{}\" fill=\"none\" stroke=\"#000\" stroke-width=\"0.3\" stroke-linejoin=\"round\"/>\n", outline_d(f, mesh));
  return out;
}

}  // namespace

// ---------------------------------------------------------------------------------------------
Drawing temperature_drawing(const CrossSection& section, const Calculation& calc) {
  const TriMesh& mesh = calc.mesh;
  const std::vector<double>& T = calc.surface_temperature.temperature;
  const Bounds b = section_bounds(mesh);
  const PaperFrame f = field_frame(b);
  const Box drawing = paper_box(f, b);
  Box extent = drawing;
  Occupied occupied;
  const svg::PointLocator locator(mesh);
  const SectionHitTest hit{f, locator};

  const auto [lo_it, hi_it] = std::minmax_element(T.begin(), T.end());
  const double t_min = *lo_it, t_max = *hi_it;
  const double step = svg::nice_step(std::max(t_max - t_min, 1e-6), 14);
  const double band = step / 4.0;  // fine bands read as a continuous field; the isotherms carry the numbers
  const double lo = std::floor(t_min / band) * band, hi = std::max(lo + band, std::ceil(t_max / band) * band);
  const int n_bands = std::max(1, static_cast<int>(std::lround((hi - lo) / band)));
  auto band_colour = [&](int k) { return hex_colour(colour_at(ColourMap::viridis, (k + 0.5) / n_bands)); };

  // Filled isobands: each triangle clipped to every band it spans.
  std::vector<std::string> band_paths(n_bands);
  for (const auto& tri : mesh.triangles) {
    std::vector<PVert> poly;
    for (int v : tri) poly.push_back({f.to_paper(mesh.points[v]), T[v]});
    const double tmin = std::min({T[tri[0]], T[tri[1]], T[tri[2]]}), tmax = std::max({T[tri[0]], T[tri[1]], T[tri[2]]});
    const int k0 = std::clamp(static_cast<int>(std::floor((tmin - lo) / band)), 0, n_bands - 1);
    const int k1 = std::clamp(static_cast<int>(std::floor((tmax - lo) / band)), 0, n_bands - 1);
    for (int k = k0; k <= k1; ++k) {
      std::vector<PVert> piece = k0 == k1 ? poly : clip_polygon(clip_polygon(poly, lo + k * band, true), lo + (k + 1) * band, false);
      if (piece.size() < 3) continue;
      std::string& d = band_paths[k];
      for (std::size_t i = 0; i < piece.size(); ++i) d += fmt::format("{}{} {}", i == 0 ? "M" : "L", num(piece[i].first.x), num(piece[i].first.y));
      d += "Z";
    }
  }
  std::string body;
  for (int k = 0; k < n_bands; ++k)
    if (!band_paths[k].empty())
      body += fmt::format("<path d=\"{}\" fill=\"{}\" stroke=\"{}\" stroke-width=\"0.06\" stroke-linejoin=\"round\"/>\n", band_paths[k], band_colour(k),
                          band_colour(k));
  body += section_overlay(section, mesh, f);

  // Isotherm lines at the round step.
  std::vector<Isotherm> isotherms;
  for (double level = std::ceil(t_min / step) * step; level < t_max; level += step)
    if (level > t_min) isotherms.push_back(isotherm(mesh, f, T, level));
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
  const int decimals = step < 1 ? (step < 0.1 ? 2 : 1) : 0;
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
  const double bar_h = std::min(drawing.y1 - drawing.y0 - 10, 120.0);
  body += colour_bar({drawing.x1 + 8, drawing.y0 + 9}, std::max(bar_h, 40.0), bands, ticks, "θ [°C]",
                     fmt::format("bands {} K, isotherms {} K", num(band), num(step)), extent);
  body += scale_bar({drawing.x0, extent.y1 + 4}, f, extent);

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

// ---------------------------------------------------------------------------------------------
Drawing heat_flux_drawing(const CrossSection& section, const Calculation& calc) {
  const TriMesh& mesh = calc.mesh;
  const std::vector<Point> flux = triangle_heat_flux(mesh, calc.heat_loss.problem.triangle_conductivity, calc.heat_loss.temperature);
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
  std::string body;
  for (int k = 0; k < n_classes; ++k)
    if (!class_paths[k].empty())
      body += fmt::format("<path d=\"{}\" fill=\"{}\" stroke=\"{}\" stroke-width=\"0.06\" stroke-linejoin=\"round\"/>\n", class_paths[k],
                          class_colour(k), class_colour(k));
  body += section_overlay(section, mesh, f);

  // Direction arrows on a regular paper grid, all the same length: the colour gives the size.
  const svg::PointLocator locator(mesh);
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
  const double bar_h = std::min(drawing.y1 - drawing.y0 - 10, 120.0);
  body += colour_bar({drawing.x1 + 8, drawing.y0 + 9}, std::max(bar_h, 40.0), classes, ticks, "|q| [W/m²]", "logarithmic scale", extent);
  body += scale_bar({drawing.x0, extent.y1 + 4}, f, extent);

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

// ---------------------------------------------------------------------------------------------
Drawing mesh_drawing(const CrossSection& section, const Calculation& calc) {
  const TriMesh& mesh = calc.mesh;
  const Bounds b = section_bounds(mesh);
  const PaperFrame f = field_frame(b);
  const Box drawing = paper_box(f, b);
  Box extent = drawing;
  const auto fills = material_fills(section);
  std::string body = region_fills(section, f, "mesh", false, fills, "none", 0);
  std::vector<std::pair<int, int>> edges;
  for (const auto& t : mesh.triangles)
    for (int i = 0; i < 3; ++i) edges.push_back({std::min(t[i], t[(i + 1) % 3]), std::max(t[i], t[(i + 1) % 3])});
  std::sort(edges.begin(), edges.end());
  edges.erase(std::unique(edges.begin(), edges.end()), edges.end());
  std::string d;
  for (const auto& [a, c] : edges) {
    const Point p = f.to_paper(mesh.points[a]), q = f.to_paper(mesh.points[c]);
    d += fmt::format("M{} {}L{} {}", num(p.x), num(p.y), num(q.x), num(q.y));
  }
  body += fmt::format("<path d=\"{}\" fill=\"none\" stroke=\"#1f2d3d\" stroke-width=\"0.07\"/>\n", d);
  body += fmt::format("<path d=\"{}\" fill=\"none\" stroke=\"#000\" stroke-width=\"0.3\"/>\n", outline_d(f, mesh));
  body += scale_bar({drawing.x0, extent.y1 + 4}, f, extent);
  Drawing out;
  out.id = "mesh";
  out.title = "Mesh";
  out.caption = fmt::format("The {} mesh the solver used: {} nodes, {} triangles, over the material areas; scale 1:{}. Each node carries one "
                            "temperature; its control volume is bounded by the medians of the triangles around it.",
                            mesh.mesher, mesh.n_points(), mesh.n_triangles(), num(f.denominator));
  out.svg = finish(out.title, fmt::format("Mesh: {} nodes, {} triangles · scale 1:{}", mesh.n_points(), mesh.n_triangles(), num(f.denominator)), "",
                   body, extent);
  return out;
}

// ---------------------------------------------------------------------------------------------
Drawing surface_temperature_plot(const CrossSection& section, const Calculation& calc) {
  const JunctionResults& j = calc.junction;
  const std::vector<SurfaceSample> walk = interior_surface_walk(section, calc.mesh);
  Drawing out;
  out.id = "surface-temperature";
  out.title = "Interior surface temperature";
  const double plot_x0 = 16, plot_y0 = 9, plot_w = 138, plot_h = 72;
  Box extent{0, plot_y0 - 1, plot_x0 + plot_w + 22, plot_y0 + plot_h + 10};
  std::string body;
  if (walk.empty()) {
    body += fmt::format("<text x=\"0\" y=\"10\" font-size=\"{}\">No interior surface: mark the room environment side=\"interior\".</text>\n", num(font_size));
    out.caption = "The section has no surface facing an interior environment.";
    out.svg = finish(out.title, out.title, "", body, {0, 0, 120, 14});
    return out;
  }
  // In the verdict's climate when it differs from the design temperatures: θ = θe + f·(θi − θe).
  std::function<double(double)> to_climate = [](double t) { return t; };
  bool mapped = false;
  double theta_i = 0, theta_e = 0;
  const bool has_pair = j.interior_environment && j.exterior_environment;
  if (has_pair) {
    theta_i = section.environments[*j.interior_environment].temperature;
    theta_e = section.environments[*j.exterior_environment].temperature;
  }
  if (has_pair && j.climate && theta_i != theta_e) {
    const double ci = j.climate->interior_temperature, ce = j.climate->exterior_temperature;
    if (std::abs(ci - theta_i) > 1e-9 || std::abs(ce - theta_e) > 1e-9) {
      mapped = true;
      to_climate = [=](double t) { return ce + (t - theta_e) / (theta_i - theta_e) * (ci - ce); };
    }
  }
  std::vector<double> theta;
  for (const SurfaceSample& s : walk) theta.push_back(to_climate(calc.surface_temperature.temperature[s.node]));
  const MoistureAssessment* mould = nullptr;
  for (const MoistureResult& m : j.moisture)
    if (m.kind == SurfaceKind::opaque) mould = &m.assessment;
  const MoistureAssessment* any = j.moisture.empty() ? nullptr : &j.moisture.front().assessment;

  double y_lo = *std::min_element(theta.begin(), theta.end()), y_hi = *std::max_element(theta.begin(), theta.end());
  if (any) y_lo = std::min(y_lo, any->dew_point);
  if (mould) y_lo = std::min(y_lo, mould->mould_surface_temperature);
  const double y_step = svg::nice_step(std::max(y_hi - y_lo, 1.0), 6);
  y_lo = std::floor((y_lo - 0.3 * y_step) / y_step) * y_step;
  y_hi = std::ceil((y_hi + 0.1 * y_step) / y_step) * y_step;
  const double x_len = std::max(walk.back().distance, 1e-9);
  const double x_step = svg::nice_step(x_len, 8);
  auto X = [&](double d) { return plot_x0 + plot_w * d / x_len; };
  auto Y = [&](double t) { return plot_y0 + plot_h * (1.0 - (t - y_lo) / (y_hi - y_lo)); };

  // Surfaces along the walk: alternate shading and names above the plot.
  std::string bands;
  std::vector<std::pair<std::size_t, std::size_t>> runs;  // sample ranges of one surface
  for (std::size_t i = 1; i < walk.size(); ++i) {
    const int surface = walk[i].surface;
    if (walk[i].chain != walk[i - 1].chain)
      runs.push_back({i, i});  // a new stretch starts at its own first node
    else if (runs.empty() || walk[runs.back().second].surface != surface || walk[runs.back().second].chain != walk[i].chain)
      runs.push_back({i - 1, i});
    else
      runs.back().second = i;
  }
  Occupied names;
  for (std::size_t r = 0; r < runs.size(); ++r) {
    const double xa = X(walk[runs[r].first].distance), xb = X(walk[runs[r].second].distance);
    if (r % 2 == 1)
      bands += fmt::format("<rect x=\"{}\" y=\"{}\" width=\"{}\" height=\"{}\" fill=\"#f1f3f5\"/>\n", num(xa), num(plot_y0), num(xb - xa), num(plot_h));
    if (r > 0) {
      const bool chain_break = walk[runs[r].first].chain != walk[runs[r - 1].second].chain;
      bands += fmt::format("<path d=\"M{0} {1} L{0} {2}\" stroke=\"#777\" stroke-width=\"{3}\" {4}/>\n", num(xa), num(plot_y0), num(plot_y0 + plot_h),
                           chain_break ? "0.3" : "0.12", chain_break ? "stroke-dasharray=\"1 0.8\"" : "");
    }
    const std::string name = section.surfaces[walk[runs[r].second].surface].name;
    const double w = svg::text_width(name, small_font_size);
    for (int row = 0; row < 3; ++row) {
      const double y = plot_y0 - 1.2 - row * 2.6;
      const Box box{0.5 * (xa + xb) - w / 2, y - small_font_size, 0.5 * (xa + xb) + w / 2, y};
      if (names.is_free(box.grown(0.4)) || row == 2) {
        names.add(box);
        bands += fmt::format("<text x=\"{}\" y=\"{}\" font-size=\"{}\" text-anchor=\"middle\" fill=\"#333\">{}</text>\n", num(0.5 * (xa + xb)), num(y),
                             num(small_font_size), escape(name));
        include(extent, {box.x0, box.y0 - 1, box.x1, box.y1});
        break;
      }
    }
  }
  body += bands;

  // Grid and axes.
  std::string grid;
  for (double t = y_lo; t <= y_hi + 1e-9; t += y_step) {
    grid += fmt::format("<path d=\"M{} {} L{} {}\" stroke=\"#d5d9de\" stroke-width=\"0.12\"/>\n", num(plot_x0), num(Y(t)), num(plot_x0 + plot_w), num(Y(t)));
    grid += fmt::format("<text x=\"{}\" y=\"{}\" font-size=\"{}\" text-anchor=\"end\">{}</text>\n", num(plot_x0 - 1.2), num(Y(t) + 0.8), num(small_font_size),
                        svg::label_number(t, y_step < 1 ? 1 : 0));
  }
  for (double x = 0; x <= x_len + 1e-9; x += x_step) {
    grid += fmt::format("<path d=\"M{0} {1} L{0} {2}\" stroke=\"#222\" stroke-width=\"0.15\"/>\n", num(X(x)), num(plot_y0 + plot_h), num(plot_y0 + plot_h + 1.0));
    grid += fmt::format("<text x=\"{}\" y=\"{}\" font-size=\"{}\" text-anchor=\"middle\">{}</text>\n", num(X(x)), num(plot_y0 + plot_h + 3.6),
                        num(small_font_size), num(x));
  }
  body += grid;
  body += fmt::format("<rect x=\"{}\" y=\"{}\" width=\"{}\" height=\"{}\" fill=\"none\" stroke=\"#222\" stroke-width=\"0.2\"/>\n", num(plot_x0), num(plot_y0),
                      num(plot_w), num(plot_h));
  body += fmt::format("<text x=\"{}\" y=\"{}\" font-size=\"{}\" text-anchor=\"middle\">distance along the interior surface [m]</text>\n",
                      num(plot_x0 + plot_w / 2), num(plot_y0 + plot_h + 7.5), num(font_size));
  body += fmt::format("<text transform=\"translate({} {}) rotate(-90)\" font-size=\"{}\" text-anchor=\"middle\">θsi [°C]</text>\n", num(plot_x0 - 9.5),
                      num(plot_y0 + plot_h / 2), num(font_size));
  // fRsi on the right: the same line read as (θ − θe)/(θi − θe) in the verdict's climate.
  if (has_pair && theta_i != theta_e) {
    const double ci = mapped ? j.climate->interior_temperature : theta_i, ce = mapped ? j.climate->exterior_temperature : theta_e;
    const double f_lo = (y_lo - ce) / (ci - ce), f_hi = (y_hi - ce) / (ci - ce);
    const double f_step = svg::nice_step(std::abs(f_hi - f_lo), 6);
    for (double fr = std::ceil(std::min(f_lo, f_hi) / f_step) * f_step; fr <= std::max(f_lo, f_hi) + 1e-9; fr += f_step) {
      const double y = Y(ce + fr * (ci - ce));
      body += fmt::format("<path d=\"M{0} {1} L{2} {1}\" stroke=\"#222\" stroke-width=\"0.15\"/>\n", num(plot_x0 + plot_w), num(y), num(plot_x0 + plot_w + 1));
      body += fmt::format("<text x=\"{}\" y=\"{}\" font-size=\"{}\">{:.2f}</text>\n", num(plot_x0 + plot_w + 1.6), num(y + 0.8), num(small_font_size), fr);
    }
    body += fmt::format("<text transform=\"translate({} {}) rotate(90)\" font-size=\"{}\" text-anchor=\"middle\">fRsi</text>\n", num(plot_x0 + plot_w + 11),
                        num(plot_y0 + plot_h / 2), num(font_size));
  }

  // Limits.
  auto limit = [&](double t, const char* colour, const char* dash, const std::string& text, bool above) {
    body += fmt::format("<path d=\"M{0} {1} L{2} {1}\" stroke=\"{3}\" stroke-width=\"0.4\" stroke-dasharray=\"{4}\"/>\n", num(plot_x0), num(Y(t)),
                        num(plot_x0 + plot_w), colour, dash);
    body += halo_text({plot_x0 + 1.5, Y(t) + (above ? -1.0 : 2.6)}, text, small_font_size, "start", fmt::format("fill=\"{}\"", colour).c_str());
  };
  if (mould && any && std::abs(mould->mould_surface_temperature - any->dew_point) < 2.5 * (y_hi - y_lo) / plot_h * font_size) {
    limit(mould->mould_surface_temperature, "#D55E00", "2 1", fmt::format("mould limit (surface RH 80 %): {}", degrees(mould->mould_surface_temperature, 2)), true);
    limit(any->dew_point, "#0072B2", "0.6 0.8", fmt::format("dew point (surface RH 100 %): {}", degrees(any->dew_point, 2)), false);
  } else {
    if (mould) limit(mould->mould_surface_temperature, "#D55E00", "2 1", fmt::format("mould limit (surface RH 80 %): {}", degrees(mould->mould_surface_temperature, 2)), true);
    if (any) limit(any->dew_point, "#0072B2", "0.6 0.8", fmt::format("dew point (surface RH 100 %): {}", degrees(any->dew_point, 2)), true);
  }

  // The curve, one polyline per connected stretch.
  std::string d;
  for (std::size_t i = 0; i < walk.size(); ++i) {
    const bool start = i == 0 || walk[i].chain != walk[i - 1].chain;
    d += fmt::format("{}{} {}", start ? "M" : "L", num(X(walk[i].distance)), num(Y(theta[i])));
  }
  body += fmt::format("<path d=\"{}\" fill=\"none\" stroke=\"#1a1a1a\" stroke-width=\"0.45\" stroke-linejoin=\"round\"/>\n", d);
  const std::size_t i_min = std::min_element(theta.begin(), theta.end()) - theta.begin();
  const Point pm{X(walk[i_min].distance), Y(theta[i_min])};
  body += fmt::format("<circle cx=\"{}\" cy=\"{}\" r=\"0.9\" fill=\"#fff\" stroke=\"#000\" stroke-width=\"0.3\"/>\n", num(pm.x), num(pm.y));
  const std::string min_text = fmt::format("θsi,min {}", degrees(theta[i_min], 2));
  const double mw = svg::text_width(min_text, small_font_size);
  const double tx = std::clamp(pm.x, plot_x0 + mw / 2 + 1, plot_x0 + plot_w - mw / 2 - 1);
  body += halo_text({tx, pm.y + 3.6}, min_text, small_font_size, "middle", "font-weight=\"bold\"");

  out.caption = fmt::format(
      "θsi along the interior surfaces in the surface-temperature run, walked with the section on the left (shaded bands: one surface each; "
      "a dashed line marks a break between separate stretches of surface){}. The horizontal lines are the ISO 13788 limits for the stated "
      "climate: the lowest surface temperature that keeps the surface relative humidity at 80 % (mould) and the dew point (condensation).",
      mapped ? fmt::format("; temperatures converted to the climate of the verdict ({} inside, {} outside) through the temperature factor",
                           degrees(j.climate->interior_temperature, 1), degrees(j.climate->exterior_temperature, 1))
             : std::string());
  out.svg = finish(out.title, "Interior surface temperature, surface-temperature run", "", body, extent);
  return out;
}

std::vector<Drawing> report_drawings(const CrossSection& section, const Calculation& calc) {
  return {detail_drawing(section, calc), mesh_drawing(section, calc), temperature_drawing(section, calc), heat_flux_drawing(section, calc),
          surface_temperature_plot(section, calc)};
}

std::string standalone_svg(const Drawing& drawing) { return "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n" + drawing.svg; }

}  // namespace edgeflux
