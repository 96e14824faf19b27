// Shared helpers of the SVG drawings.
#include "report/svg_support.h"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include "report/text_format.h"

namespace edgeflux::svg {

double standard_scale(double needed) {
  static const double scales[] = {1, 2, 5, 10, 15, 20, 25, 50, 100, 200, 250, 500, 1000, 2000, 2500, 5000, 10000};
  for (double s : scales)
    if (s >= needed) return s;
  return std::ceil(needed / 10000.0) * 10000.0;
}

std::string num(double v) {
  if (std::abs(v) < 0.005) return "0";
  std::string s = fmt::format("{:.2f}", v);
  while (s.back() == '0') s.pop_back();
  if (s.back() == '.') s.pop_back();
  return s;
}

std::string escape(std::string_view text) { return xml_escape(text); }

double text_width(std::string_view text, double font_size) {
  double width = 0;
  for (std::size_t i = 0; i < text.size(); ++i) {
    const unsigned char c = static_cast<unsigned char>(text[i]);
    if ((c & 0xC0) == 0x80) continue;  // continuation byte of a multi-byte character
    // Narrow and wide glyphs of a humanist sans face, as fractions of the em.
    if (c == ' ' || c == '.' || c == ',' || c == ':' || c == 'i' || c == 'l' || c == '|' || c == '(' || c == ')' || c == '\'' || c == 'j' || c == 'I')
      width += 0.34;
    else if (c == 'm' || c == 'w' || c == 'M' || c == 'W')
      width += 0.9;
    else if (c >= 'A' && c <= 'Z')
      width += 0.7;
    else
      width += 0.62;
  }
  return width * font_size;
}

std::string label_number(double v, int decimals) {
  if (std::abs(v) < 0.5 * std::pow(10.0, -decimals)) v = 0.0;  // no "−0.0"
  std::string s = fmt::format("{:.{}f}", std::abs(v), decimals);
  return v < 0 ? "\u2212" + s : s;
}

double nice_step(double range, int target) {
  if (!(range > 0)) return 1.0;
  const double raw = range / target;
  const double power = std::pow(10.0, std::floor(std::log10(raw)));
  for (double m : {1.0, 2.0, 2.5, 5.0, 10.0})
    if (m * power >= raw) return m * power;
  return 10.0 * power;
}

bool Occupied::is_free(const Box& b) const {
  return std::none_of(boxes_.begin(), boxes_.end(), [&](const Box& o) { return o.overlaps(b); });
}

std::string path_d(const PaperFrame& f, const std::vector<Point>& world, bool closed) {
  std::string d;
  for (std::size_t i = 0; i < world.size(); ++i) {
    const Point p = f.to_paper(world[i]);
    d += fmt::format("{}{} {}", i == 0 ? "M" : " L", num(p.x), num(p.y));
  }
  if (closed) d += " Z";
  return d;
}

std::string open_svg(double width_mm, double height_mm, std::string_view title) {
  return fmt::format(
      "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"{0}mm\" height=\"{1}mm\" viewBox=\"0 0 {0} {1}\" "
      "font-family=\"DejaVu Sans, Liberation Sans, Arial, Helvetica, sans-serif\" role=\"img\">\n<title>{2}</title>\n",
      num(width_mm), num(height_mm), escape(title));
}

}  // namespace edgeflux::svg
