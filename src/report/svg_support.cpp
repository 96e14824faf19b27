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

PointLocator::PointLocator(const TriMesh& mesh) : mesh_(mesh) {
  if (mesh.points.empty()) return;
  double x1 = mesh.points[0].x, y1 = mesh.points[0].y;
  x0_ = x1, y0_ = y1;
  for (const Point& p : mesh.points) {
    x0_ = std::min(x0_, p.x), y0_ = std::min(y0_, p.y);
    x1 = std::max(x1, p.x), y1 = std::max(y1, p.y);
  }
  const double area = std::max((x1 - x0_) * (y1 - y0_), 1e-12);
  cell_ = std::sqrt(area / std::max<double>(1, mesh.triangles.size() / 2.0));
  nx_ = std::max(1, static_cast<int>(std::ceil((x1 - x0_) / cell_)) + 1);
  ny_ = std::max(1, static_cast<int>(std::ceil((y1 - y0_) / cell_)) + 1);
  buckets_.resize(static_cast<std::size_t>(nx_) * ny_);
  for (std::size_t t = 0; t < mesh.triangles.size(); ++t) {
    const auto& tri = mesh.triangles[t];
    double lo_x = 1e300, lo_y = 1e300, hi_x = -1e300, hi_y = -1e300;
    for (int v : tri) {
      lo_x = std::min(lo_x, mesh.points[v].x), hi_x = std::max(hi_x, mesh.points[v].x);
      lo_y = std::min(lo_y, mesh.points[v].y), hi_y = std::max(hi_y, mesh.points[v].y);
    }
    const int i0 = std::clamp(static_cast<int>((lo_x - x0_) / cell_), 0, nx_ - 1), i1 = std::clamp(static_cast<int>((hi_x - x0_) / cell_), 0, nx_ - 1);
    const int j0 = std::clamp(static_cast<int>((lo_y - y0_) / cell_), 0, ny_ - 1), j1 = std::clamp(static_cast<int>((hi_y - y0_) / cell_), 0, ny_ - 1);
    for (int j = j0; j <= j1; ++j)
      for (int i = i0; i <= i1; ++i) buckets_[static_cast<std::size_t>(j) * nx_ + i].push_back(static_cast<int>(t));
  }
}

int PointLocator::triangle_at(Point p) const {
  if (buckets_.empty()) return -1;
  const int i = static_cast<int>(std::floor((p.x - x0_) / cell_)), j = static_cast<int>(std::floor((p.y - y0_) / cell_));
  if (i < 0 || j < 0 || i >= nx_ || j >= ny_) return -1;
  int best = -1;
  double best_worst = -1e-9;
  for (int t : buckets_[static_cast<std::size_t>(j) * nx_ + i]) {
    const auto& tri = mesh_.triangles[t];
    const Point a = mesh_.points[tri[0]], b = mesh_.points[tri[1]], c = mesh_.points[tri[2]];
    const double area = cross(b - a, c - a);
    const double l0 = cross(b - p, c - p) / area, l1 = cross(c - p, a - p) / area, l2 = 1.0 - l0 - l1;
    const double worst = std::min({l0, l1, l2});
    if (worst > best_worst) best_worst = worst, best = t;
  }
  return best;
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
