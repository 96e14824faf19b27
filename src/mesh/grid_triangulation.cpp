// Structured right-triangle mesh for rectilinear sections: on it the vertex-centred finite-volume
// scheme is exactly the five-point finite-difference stencil, second-order on graded grids.
#include <algorithm>
#include <cmath>
#include <limits>

#include "geometry/cross_section.h"
#include "mesh/mesh_cross_section.h"
#include "mesh/raw_triangulation.h"

namespace edgeflux {
namespace {

/// Sorted, de-duplicated coordinates (values closer than tol merge into the first).
std::vector<double> unique_sorted(std::vector<double> v, double tol) {
  std::sort(v.begin(), v.end());
  std::vector<double> out;
  for (double x : v)
    if (out.empty() || x - out.back() > tol) out.push_back(x);
  return out;
}

/// Grid coordinates along one axis: the feature lines plus graded subdivisions between them.
/// The target spacing grows linearly away from each feature line (rate `grading`) from the
/// line's own size (a fraction of its neighbouring intervals) up to `max_size`.
std::vector<double> graded_axis(const std::vector<double>& lines, double max_size, double density) {
  const double grading = 0.25 / std::sqrt(density);
  const double per_interval = std::max(2.0, std::ceil(3.0 * density));
  const std::size_t n = lines.size();
  std::vector<double> line_size(n, max_size);
  for (std::size_t k = 0; k < n; ++k) {
    double shortest = std::numeric_limits<double>::infinity();
    if (k > 0) shortest = std::min(shortest, lines[k] - lines[k - 1]);
    if (k + 1 < n) shortest = std::min(shortest, lines[k + 1] - lines[k]);
    line_size[k] = std::min(max_size, shortest / per_interval);
  }
  auto target = [&](double x) {
    double h = max_size;
    for (std::size_t k = 0; k < n; ++k) h = std::min(h, line_size[k] + grading * std::abs(x - lines[k]));
    return h;
  };
  std::vector<double> coords{lines.front()};
  constexpr int samples = 256;
  for (std::size_t k = 0; k + 1 < n; ++k) {
    const double a = lines[k], b = lines[k + 1], length = b - a;
    // Cumulative number of elements ∫ dx / h(x) by the midpoint rule; nodes at equal increments.
    std::vector<double> cumulative(samples + 1, 0.0);
    for (int s = 0; s < samples; ++s) {
      const double x = a + (s + 0.5) * length / samples;
      cumulative[s + 1] = cumulative[s] + (length / samples) / target(x);
    }
    const int cells = std::max(static_cast<int>(per_interval) / 2,
                               static_cast<int>(std::ceil(cumulative.back() - 1e-9)));
    for (int c = 1; c < cells; ++c) {
      const double wanted = cumulative.back() * c / cells;
      const auto it = std::lower_bound(cumulative.begin(), cumulative.end(), wanted);
      const int s = std::clamp(static_cast<int>(it - cumulative.begin()), 1, samples);
      const double t = (wanted - cumulative[s - 1]) / (cumulative[s] - cumulative[s - 1]);
      coords.push_back(a + (s - 1 + t) * length / samples);
    }
    coords.push_back(b);
  }
  return coords;
}

}  // namespace

RawTriangulation grid_triangulation(const CrossSection& section, const MeshOptions& options) {
  std::vector<double> xs, ys;
  for (const Region& region : section.regions)
    for (Point p : region.outline) xs.push_back(p.x), ys.push_back(p.y);
  for (const Surface& surface : section.surfaces)
    for (Point p : surface.path) xs.push_back(p.x), ys.push_back(p.y);
  const auto [x_min, x_max] = std::minmax_element(xs.begin(), xs.end());
  const auto [y_min, y_max] = std::minmax_element(ys.begin(), ys.end());
  const double extent = std::max(*x_max - *x_min, *y_max - *y_min);
  const double tol = 1e-9 * extent;
  const double max_size = extent / (20.0 * options.density);

  const std::vector<double> gx = graded_axis(unique_sorted(xs, tol), max_size, options.density);
  const std::vector<double> gy = graded_axis(unique_sorted(ys, tol), max_size, options.density);
  const int nx = static_cast<int>(gx.size()), ny = static_cast<int>(gy.size());

  RawTriangulation raw;
  raw.points.reserve(static_cast<std::size_t>(nx) * ny);
  for (int j = 0; j < ny; ++j)
    for (int i = 0; i < nx; ++i) raw.points.push_back({gx[i], gy[j]});
  auto node = [nx](int i, int j) { return j * nx + i; };

  // Each cell takes the region painting its centre; the diagonal alternates so the mesh has no
  // preferred direction (on right triangles the diagonal carries no conductance either way).
  std::vector<int> column_region(nx - 1);
  for (int j = 0; j + 1 < ny; ++j) {
    for (int i = 0; i + 1 < nx; ++i) {
      const Point centre{0.5 * (gx[i] + gx[i + 1]), 0.5 * (gy[j] + gy[j + 1])};
      const int region = painting_region(section, centre);
      const int a = node(i, j), b = node(i + 1, j), c = node(i + 1, j + 1), d = node(i, j + 1);
      if ((i + j) % 2 == 0) {
        raw.triangles.push_back({a, b, c});
        raw.triangles.push_back({a, c, d});
      } else {
        raw.triangles.push_back({a, b, d});
        raw.triangles.push_back({b, c, d});
      }
      raw.triangle_region.push_back(region);
      raw.triangle_region.push_back(region);
    }
  }
  return raw;
}

}  // namespace edgeflux
