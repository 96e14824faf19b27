#include "mesh/triangle_locator.h"

#include <algorithm>
#include <cmath>
#include <limits>

namespace edgeflux {

TriangleLocator::TriangleLocator(const TriMesh& mesh) : mesh_(mesh) {
  if (mesh.triangles.empty()) return;
  lo_ = hi_ = mesh.points[mesh.triangles[0][0]];
  for (const auto& tri : mesh.triangles)
    for (int v : tri) {
      const Point p = mesh.points[v];
      lo_ = {std::min(lo_.x, p.x), std::min(lo_.y, p.y)}, hi_ = {std::max(hi_.x, p.x), std::max(hi_.y, p.y)};
    }
  const double width = std::max(hi_.x - lo_.x, 1e-300), height = std::max(hi_.y - lo_.y, 1e-300);
  const double n_cells = std::clamp(static_cast<double>(mesh.n_triangles()), 1.0, 4e6);
  nx_ = std::clamp(static_cast<int>(std::ceil(std::sqrt(n_cells * width / height))), 1, 1 << 16);
  ny_ = std::clamp(static_cast<int>(std::ceil(n_cells / nx_)), 1, 1 << 16);
  cell_w_ = width / nx_, cell_h_ = height / ny_;
  // Counting sort into one flat array: first the number per cell, then the triangles.
  std::vector<std::array<int, 4>> spans(mesh.triangles.size());
  start_.assign(static_cast<std::size_t>(nx_) * ny_ + 1, 0);
  for (int t = 0; t < mesh.n_triangles(); ++t) {
    spans[t] = cell_span(t);
    for (int j = spans[t][2]; j <= spans[t][3]; ++j)
      for (int i = spans[t][0]; i <= spans[t][1]; ++i) ++start_[cell(i, j) + 1];
  }
  for (std::size_t c = 1; c < start_.size(); ++c) start_[c] += start_[c - 1];
  triangles_.resize(start_.back());
  std::vector<std::size_t> fill(start_.begin(), start_.end() - 1);
  for (int t = 0; t < mesh.n_triangles(); ++t)
    for (int j = spans[t][2]; j <= spans[t][3]; ++j)
      for (int i = spans[t][0]; i <= spans[t][1]; ++i) triangles_[fill[cell(i, j)]++] = t;
}

/// Cells covered by the widened box of triangle t: {i0, i1, j0, j1}, inclusive.
std::array<int, 4> TriangleLocator::cell_span(int t) const {
  const auto& tri = mesh_.triangles[t];
  Point lo = mesh_.points[tri[0]], hi = lo;
  for (int v : tri) {
    const Point p = mesh_.points[v];
    lo = {std::min(lo.x, p.x), std::min(lo.y, p.y)}, hi = {std::max(hi.x, p.x), std::max(hi.y, p.y)};
  }
  // An altitude is at most the box's larger side: λ = −allowance is at most that far outside.
  const double widen = 2 * barycentric_allowance * std::max(hi.x - lo.x, hi.y - lo.y);
  auto column = [&](double x) { return std::clamp(static_cast<int>(std::floor((x - lo_.x) / cell_w_)), 0, nx_ - 1); };
  auto row = [&](double y) { return std::clamp(static_cast<int>(std::floor((y - lo_.y) / cell_h_)), 0, ny_ - 1); };
  return {column(lo.x - widen), column(hi.x + widen), row(lo.y - widen), row(hi.y + widen)};
}

std::optional<TriangleLocator::Location> TriangleLocator::locate(Point p) const {
  if (triangles_.empty() || !(p.x >= lo_.x - slack_x() && p.x <= hi_.x + slack_x() && p.y >= lo_.y - slack_y() &&
                              p.y <= hi_.y + slack_y()))
    return std::nullopt;
  const int i = std::clamp(static_cast<int>(std::floor((p.x - lo_.x) / cell_w_)), 0, nx_ - 1);
  const int j = std::clamp(static_cast<int>(std::floor((p.y - lo_.y) / cell_h_)), 0, ny_ - 1);
  // The triangle whose smallest barycentric coordinate is largest contains p (or is nearest to
  // it when p sits on an edge, within rounding).
  double best = -std::numeric_limits<double>::infinity();
  Location found;
  for (std::size_t k = start_[cell(i, j)]; k < start_[cell(i, j) + 1]; ++k) {
    const auto& tri = mesh_.triangles[triangles_[k]];
    const Point a = mesh_.points[tri[0]], b = mesh_.points[tri[1]], c = mesh_.points[tri[2]];
    const double area = cross(b - a, c - a);
    const double l0 = cross(b - p, c - p) / area, l1 = cross(c - p, a - p) / area;
    const double l2 = 1.0 - l0 - l1;
    const double worst = std::min({l0, l1, l2});
    if (worst > best) {
      best = worst;
      found = {triangles_[k], {l0, l1, l2}};
    }
  }
  if (best < -barycentric_allowance) return std::nullopt;
  return found;
}

std::optional<double> TriangleLocator::value_at(const std::vector<double>& nodal, Point p) const {
  const auto at = locate(p);
  if (!at) return std::nullopt;
  const auto& tri = mesh_.triangles[at->triangle];
  const auto& l = at->barycentric;
  return l[0] * nodal[tri[0]] + l[1] * nodal[tri[1]] + l[2] * nodal[tri[2]];
}

}  // namespace edgeflux
