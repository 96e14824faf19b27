// The graded size field and the node count it implies.
#include "mesh/size_field.h"

#include <algorithm>
#include <cmath>

namespace edgeflux {

SizeField::SizeField(const std::vector<SizeSeed>& seeds, double max_size, double grading, Point origin)
    : max_size_(max_size), grading_(grading), x0_(origin.x), y0_(origin.y), width_(max_size / grading) {
  for (const SizeSeed& s : seeds) {
    if (s.size >= max_size) continue;
    buckets_[key(cell(s.at.x, x0_), cell(s.at.y, y0_))].push_back(s);
  }
}

long long SizeField::cell(double v, double origin) const {
  return static_cast<long long>(std::floor((v - origin) / width_));
}

double SizeField::operator()(double x, double y) const {
  double h = max_size_;
  const long long cx = cell(x, x0_), cy = cell(y, y0_);
  for (long long i = cx - 1; i <= cx + 1; ++i)
    for (long long j = cy - 1; j <= cy + 1; ++j) {
      const auto it = buckets_.find(key(i, j));
      if (it == buckets_.end()) continue;
      for (const SizeSeed& s : it->second) h = std::min(h, s.size + grading_ * std::hypot(x - s.at.x, y - s.at.y));
    }
  return h;
}

// Element size over thickness in a thin domain triangle: measured on a 0.1 mm layer 3 m long (the
// estimate came out at 0.94 × the nodes of its mesh).
constexpr double thin_size_factor = 1.25;

double estimated_node_count(const std::vector<std::array<Point, 3>>& domain, const SizeField& field, double stop_above) {
  // Refinement stops once the longest edge of a triangle is below h, so edges average about 0.6 h
  // (measured on the shipped details: their meshes have 0.61–0.99 × the estimated nodes, a 0.1 mm layer 1.07 ×).
  const double per_unit_area = 2.0 / (std::sqrt(3.0) * 0.6 * 0.6);
  // The angle bound asks for more than the size field: a domain triangle of the constraints-only
  // triangulation that is thin (a layer, a sliver) can only be filled with well-shaped elements
  // about as large as it is thick, whatever the size field allows there.
  struct Piece {
    Point a, b, c;
    double thickness_cap;
  };
  std::vector<Piece> todo;
  for (const auto& [a, b, c] : domain) {
    const double longest = std::max({distance(a, b), distance(b, c), distance(c, a)});
    const double thickness = std::abs(cross(b - a, c - a)) / std::max(longest, 1e-300);
    todo.push_back({a, b, c, thin_size_factor * thickness});
  }
  // Adaptive quadrature of per_unit_area / h². A piece is taken whole where h is nearly constant over
  // it: it is at most a few local sizes long, or the size field (which changes by at most the grading
  // per unit length) stays above the thickness cap all over it. Otherwise it is halved across its
  // longest edge, which also makes slivers less thin.
  double nodes = 0.0;
  while (!todo.empty() && nodes <= stop_above) {
    Piece p = todo.back();
    todo.pop_back();
    const double ab = distance(p.a, p.b), bc = distance(p.b, p.c), ca = distance(p.c, p.a);
    const double longest = std::max({ab, bc, ca});
    const Point centre = (1.0 / 3.0) * (p.a + p.b + p.c);
    const double sized = field(centre.x, centre.y);
    const double h = std::min(sized, p.thickness_cap);
    if (longest <= 4.0 * h || sized - field.grading() * longest >= p.thickness_cap) {
      nodes += per_unit_area * 0.5 * std::abs(cross(p.b - p.a, p.c - p.a)) / (h * h);
      continue;
    }
    // Rotate so that ab is the longest edge, then split it at its midpoint.
    if (bc == longest) p = {p.b, p.c, p.a, p.thickness_cap};
    else if (ca == longest) p = {p.c, p.a, p.b, p.thickness_cap};
    const Point m = 0.5 * (p.a + p.b);
    todo.push_back({p.a, m, p.c, p.thickness_cap});
    todo.push_back({m, p.b, p.c, p.thickness_cap});
  }
  return nodes;
}

}  // namespace edgeflux
