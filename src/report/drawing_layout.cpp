#include "report/drawing_layout.h"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <functional>
#include <map>
#include <optional>

#include "report/material_fills.h"

namespace edgeflux::layout {

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

std::string length_text(double metres, const CrossSection& section) {
  std::string s = fmt::format("{:.1f}", metres / section.metres_per_unit);
  if (s.size() > 2 && s.substr(s.size() - 2) == ".0") s.resize(s.size() - 2);
  return s;
}

/// λ with the digits a designer writes: 0.035, 0.99, 2.50, 230.

/// Text with a white halo, so it reads over hatches and colour fields.
std::string halo_text(Point at, const std::string& text, double size, const char* anchor, const char* extra) {
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

/// Direction (paper) away from the section at a boundary point, found by probing both normals.
Point outward_normal(const PaperFrame& f, const TriangleLocator& locator, Point paper_at, Point paper_along) {
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

/// Frame shared by the field plots: a standard scale that leaves room for a colour bar.

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

std::string field_legend(const Box& drawing, const PaperFrame& f, const std::vector<std::pair<double, std::string>>& band_colours,
                         const std::vector<std::pair<double, std::string>>& ticks, const std::string& title,
                         const std::string& subtitle, Box& extent) {
  const double bar_height = std::max(std::min(drawing.y1 - drawing.y0 - 10, 120.0), 40.0);
  std::string out = colour_bar({drawing.x1 + 8, drawing.y0 + 9}, bar_height, band_colours, ticks, title, subtitle, extent);
  return out + scale_bar({drawing.x0, extent.y1 + 4}, f, extent);
}

TemperatureScale temperature_scale(const std::vector<double>& T) {
  TemperatureScale s;
  const auto [lo_it, hi_it] = std::minmax_element(T.begin(), T.end());
  s.t_min = *lo_it, s.t_max = *hi_it;
  s.step = svg::nice_step(std::max(s.t_max - s.t_min, 1e-6), 14);
  s.band = s.step / 4.0;  // fine bands read as a continuous field; the isotherms carry the numbers
  s.lo = std::floor(s.t_min / s.band) * s.band, s.hi = std::max(s.lo + s.band, std::ceil(s.t_max / s.band) * s.band);
  s.n_bands = std::max(1, static_cast<int>(std::lround((s.hi - s.lo) / s.band)));
  s.decimals = s.step < 1 ? (s.step < 0.1 ? 2 : 1) : 0;
  return s;
}

std::string TemperatureScale::band_colour(int k) const { return hex_colour(colour_at(ColourMap::viridis, (k + 0.5) / n_bands)); }

std::vector<double> TemperatureScale::isotherm_levels() const {
  std::vector<double> levels;
  for (double level = std::ceil(t_min / step) * step; level < t_max; level += step)
    if (level > t_min) levels.push_back(level);
  return levels;
}

Isotherm isotherm(const TriMesh& mesh, const PaperFrame& f, const std::vector<double>& T, double level) {
  Isotherm iso{level, {}};
  for (const std::vector<Point>& line : isotherm_lines(mesh, T, level).lines) {
    std::vector<Point> paper;
    for (Point p : line) paper.push_back(f.to_paper(p));
    iso.lines.push_back(std::move(paper));
  }
  return iso;
}

}  // namespace edgeflux::layout
