// Small helpers the SVG drawings share: a world-to-paper frame at a drawing scale, number and
// text formatting, a text-size estimate, and a register of occupied label boxes.
#pragma once

#include <string>
#include <string_view>
#include <vector>

#include "mesh/tri_mesh.h"

namespace edgeflux::svg {

/// An axis-aligned rectangle in paper millimetres (y down, as in SVG).
struct Box {
  double x0 = 0, y0 = 0, x1 = 0, y1 = 0;
  bool overlaps(const Box& o) const { return x0 < o.x1 && o.x0 < x1 && y0 < o.y1 && o.y0 < y1; }
  Box grown(double d) const { return {x0 - d, y0 - d, x1 + d, y1 + d}; }
  bool contains(Box o) const { return o.x0 >= x0 && o.x1 <= x1 && o.y0 >= y0 && o.y1 <= y1; }
};

/// Maps section coordinates (m, y up) to paper (mm, y down) at scale 1:denominator.
struct PaperFrame {
  double denominator = 20;  ///< the N of 1:N
  double world_x0 = 0, world_y1 = 0;  ///< the section's left and top edge, m
  double paper_x0 = 0, paper_y0 = 0;  ///< where they land on paper, mm
  double mm(double metres) const { return metres * 1000.0 / denominator; }
  Point to_paper(Point p) const { return {paper_x0 + mm(p.x - world_x0), paper_y0 + mm(world_y1 - p.y)}; }
};

/// SVG path data ("M x y L x y …", closed with Z) of a polyline in section coordinates.
std::string path_d(const PaperFrame& f, const std::vector<Point>& world, bool closed);

/// The smallest of the usual drawing scales 1:1, 1:2, 1:5, 1:10, 1:15, 1:20, 1:25, 1:50, 1:100, … that
/// is at least `needed` (a denominator).
double standard_scale(double needed);

/// A coordinate or length on paper: at most 2 decimals, no trailing zeros.
std::string num(double v);
/// Text made safe for XML character data and attribute values (xml_escape, report/text_format.h).
std::string escape(std::string_view text);
/// Estimated advance width of `text` in a sans-serif face at `font_size` (same unit), counting
/// UTF-8 code points; generous, so boxes built from it rarely underestimate.
double text_width(std::string_view text, double font_size);
/// A number for a label: `decimals` fixed decimals, with a true minus sign (U+2212).
std::string label_number(double v, int decimals);

/// Round steps for axes and isotherms: 1, 2, 2.5 or 5 times a power of ten, about range/target.
double nice_step(double range, int target);

/// Boxes already used by labels or drawing elements that labels must avoid.
class Occupied {
 public:
  void add(Box b) { boxes_.push_back(b); }
  bool is_free(const Box& b) const;
  const std::vector<Box>& boxes() const { return boxes_; }
 private:
  std::vector<Box> boxes_;
};

/// The opening <svg> tag of a standalone drawing: width and height in mm, viewBox in mm, the
/// SVG namespace and the font family. Close it with "</svg>\n".
std::string open_svg(double width_mm, double height_mm, std::string_view title);

}  // namespace edgeflux::svg
