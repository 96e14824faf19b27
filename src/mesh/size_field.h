// The element size the graded Delaunay mesh asks for at every point, and the node count it implies.
#pragma once

#include <array>
#include <unordered_map>
#include <vector>

#include "core/point.h"

namespace edgeflux {

/// A point that asks for elements of a given size (same length unit as the point).
struct SizeSeed {
  Point at;
  double size;
};

/// Size field: each feature seed asks for its own size, growing linearly away from it, capped at
/// max_size. A seed only matters within (max_size − size)/grading of itself, so seeds are kept in
/// buckets of that width and a query looks at the 3 × 3 buckets around it.
class SizeField {
 public:
  SizeField(const std::vector<SizeSeed>& seeds, double max_size, double grading, Point origin);
  double operator()(double x, double y) const;
  double max_size() const { return max_size_; }
  double grading() const { return grading_; }

 private:
  long long cell(double v, double origin) const;
  static long long key(long long i, long long j) { return (i << 32) ^ (j & 0xffffffffLL); }
  double max_size_, grading_, x0_, y0_, width_;
  std::unordered_map<long long, std::vector<SizeSeed>> buckets_;
};

/// About how many nodes the graded mesh of the given triangles (the domain, in coarse pieces) has:
/// the integral of 2/(√3 (0.6 h)²) (equilateral triangles two per node, of side 0.6 h: the average
/// edge when the longest edge of each triangle is kept below the local size h). Accurate to a small factor, for guards rather than for planning. Stops counting
/// and returns a value above `stop_above` as soon as the count passes it, so an absurd section
/// (a 70 km strip with millimetre layers) is found out in milliseconds.
double estimated_node_count(const std::vector<std::array<Point, 3>>& domain, const SizeField& field, double stop_above);

}  // namespace edgeflux
