// Shared pieces of the report drawings: paper frames at standard scales, text with halos, label
// placement and dimension chains, colour bars, section outlines and overlays. All in paper
// millimetres (SVG user units = mm, y down), so printed drawings keep their scale and text sizes.
#pragma once

#include <fmt/format.h>

#include <algorithm>
#include <string>
#include <utility>
#include <vector>

#include "geometry/cross_section.h"
#include "mesh/tri_mesh.h"
#include "mesh/triangle_locator.h"
#include "results/calculation.h"
#include "report/field_quantities.h"
#include "report/material_fills.h"
#include "report/svg_support.h"
#include "report/colour_map.h"
#include "report/text_format.h"
#include "results/isotherms.h"

namespace edgeflux::layout {

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

Bounds section_bounds(const TriMesh& mesh);
/// The frame at the smallest standard scale that fits the section into max_w × max_h mm.
PaperFrame fit_frame(const Bounds& b, double max_w, double max_h);
Point to_world(const PaperFrame& f, Point p);
Box paper_box(const PaperFrame& f, const Bounds& b);
void include(Box& extent, const Box& b);
Point unit(Point v);
/// Drops interior points of straight runs, so long straight edges become one segment.
std::vector<Point> simplified(const std::vector<Point>& pts, bool closed);
/// Okabe–Ito colours (colour-blind safe), by side: interior warm, exterior blue, others green/purple.
std::string environment_colour(const CrossSection& section, std::size_t env);

std::string length_text(double metres, const CrossSection& section);

inline std::string degrees(double v, int decimals) { return svg::label_number(v, decimals) + " °C"; }

/// Text with a white halo, so it reads over hatches and colour fields.
std::string halo_text(Point at, const std::string& text, double size, const char* anchor, const char* extra = "");
/// Boundary stretches of one tag along the loops: (surface tag, node polyline).
std::vector<std::pair<int, std::vector<Point>>> boundary_runs(const TriMesh& mesh);
std::string outline_d(const PaperFrame& f, const TriMesh& mesh);
/// Tests whether paper boxes overlap the section, by sampling points in the box.
struct SectionHitTest {
  const PaperFrame& frame;
  const TriangleLocator& locator;
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
Point outward_normal(const PaperFrame& f, const TriangleLocator& locator, Point paper_at, Point paper_along);
/// Places a box of size w × h near `anchor`, away from the section along `outward`, sliding along
/// `along` when the first places are taken. Returns the box and the anchor point it refers to.
struct Placement {
  Box box;
  Point anchor;
};

Placement place_label(const Occupied& occupied, const SectionHitTest& section, const Box& allowed, Point anchor, Point along,
                      double along_length, Point outward, double w, double h);
inline Point nearest_on_box(const Box& b, Point p) { return {std::clamp(p.x, b.x0, b.x1), std::clamp(p.y, b.y0, b.y1)}; }

/// A label block: lines of text in a box with a leader to its anchor.
std::string label_block(const Placement& p, const std::vector<std::string>& lines, const std::string& colour, bool first_bold);
Box label_size_box(const std::vector<std::string>& lines);
/// One chain of dimensions. `ticks` are paper positions along the chain (x for horizontal chains,
/// y for vertical), `at` the chain's position across, `from` where the extension lines start.
void dimension_chain(std::string& out, Occupied& occupied, Box& extent, bool horizontal, double at, double from,
                     const std::vector<double>& ticks, const std::vector<std::string>& texts);
std::vector<double> distinct_coordinates(const CrossSection& section, bool x, double lo, double hi);
std::string scale_bar(Point at, const PaperFrame& f, Box& extent);
std::string heading(const std::string& text);
/// Wraps drawing content built around a paper origin into a document whose top-left corner is the
/// content's extent, with the heading above it.
std::string finish(const std::string& title, const std::string& heading_text, const std::string& defs, const std::string& body, Box extent);
const FlankingResult* flanking_result(const CrossSection&, const Calculation& calc, const std::string& id);
const char* system_short(DimensionSystem s);
/// The fills of the regions in painting order (later regions cover earlier ones, as in the solver).
std::string region_fills(const CrossSection& section, const PaperFrame& f, const std::string& prefix, bool patterns,
                         const std::vector<MaterialFill>& fills, const char* stroke, double stroke_width);
/// Frame shared by the field plots: a standard scale that leaves room for a colour bar.
inline PaperFrame field_frame(const Bounds& b) { return fit_frame(b, max_width - 40.0, 205.0); }

std::string colour_bar(Point at, double height, const std::vector<std::pair<double, std::string>>& band_colours,
                       const std::vector<std::pair<double, std::string>>& ticks, const std::string& title, const std::string& subtitle,
                       Box& extent);
bool segment_hits_box(Point a, Point b, const Box& box);
std::string section_overlay(const CrossSection& section, const TriMesh& mesh, const PaperFrame& f);

/// The colour bar beside a field drawing (box `drawing` on paper) and the scale bar below it.
std::string field_legend(const Box& drawing, const PaperFrame& f, const std::vector<std::pair<double, std::string>>& band_colours,
                         const std::vector<std::pair<double, std::string>>& ticks, const std::string& title,
                         const std::string& subtitle, Box& extent);

/// Stroke width (mm) of the filled bands and classes of the field drawings: each fill is also
/// stroked in its own colour, so no hairline seams show between neighbouring triangles. Set on a
/// wrapper group, so a picture that re-uses the fills (<use>) can give its own width.
constexpr double field_seam_width = 0.06;

/// The colour bands and isotherm levels of a temperature drawing: isotherms at a round step
/// (about 14 over the range), bands a quarter of that, on the viridis map.
struct TemperatureScale {
  double t_min = 0, t_max = 0;  ///< range of the field, °C
  double step = 1;              ///< between isotherms, K
  double band = 0.25;           ///< width of a colour band, K
  double lo = 0, hi = 1;        ///< ends of the colour scale, °C (whole bands)
  int n_bands = 1;
  int decimals = 0;             ///< of the isotherm labels
  std::string band_colour(int k) const;
  /// The isotherm levels strictly inside (t_min, t_max).
  std::vector<double> isotherm_levels() const;
};
TemperatureScale temperature_scale(const std::vector<double>& T);

/// Isotherms of a nodal field at `level`, as paper polylines.
struct Isotherm {
  double level;
  std::vector<std::vector<Point>> lines;
};
Isotherm isotherm(const TriMesh& mesh, const PaperFrame& f, const std::vector<double>& T, double level);

}  // namespace edgeflux::layout
