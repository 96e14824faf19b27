// Structured right-triangle mesh for rectilinear sections: on it the vertex-centred finite-volume
// scheme is exactly the five-point finite-difference stencil, second-order on graded grids.
#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <limits>

#include "geometry/cross_section.h"
#include "geometry/planar_subdivision.h"
#include "geometry/polygon.h"
#include "mesh/mesh_cross_section.h"
#include "mesh/grid_triangulation.h"

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

/// Index of the last region whose outline contains p (regions paint in file order), or -1.
int painting_region(const CrossSection& section, Point p) {
  for (int r = static_cast<int>(section.regions.size()) - 1; r >= 0; --r) {
    bool inside = contains(section.regions[r].outline, p);
    for (const auto& island : section.regions[r].islands) inside = inside != contains(island, p);  // even-odd
    if (inside) return r;
  }
  return -1;
}

/// The mesh edges along the subdivision's surfaces and cut-offs: grid lines run through every
/// vertex of the subdivision, so each such edge is a run of grid nodes on one grid line.
std::vector<TaggedEdge> grid_tags(const CrossSection& section, const PlanarSubdivision& sub, const std::vector<double>& gx,
                                  const std::vector<double>& gy) {
  std::vector<TaggedEdge> tagged;
  const int nx = static_cast<int>(gx.size());
  auto index_of = [](const std::vector<double>& axis, double v) {
    return static_cast<int>(std::lower_bound(axis.begin(), axis.end(), v) - axis.begin());
  };
  for (const SubdivisionEdge& e : sub.edges) {
    if (e.surface < 0 && e.cut_off < 0) continue;
    const Point a = sub.metres(sub.vertices[e.a]), b = sub.metres(sub.vertices[e.b]);
    if (a.x != b.x && a.y != b.y)
      throw_input_error({section.file, 0}, "mesh",
                        fmt::format("the grid mesher needs every surface parallel to an axis, but the edge from {} to {} "
                                    "is not (after rounding to the 0.01 mm grid)", section.format_point(a), section.format_point(b)),
                        "use mesher=\"delaunay\" or \"automatic\"");
    int i0 = index_of(gx, std::min(a.x, b.x)), i1 = index_of(gx, std::max(a.x, b.x));
    int j0 = index_of(gy, std::min(a.y, b.y)), j1 = index_of(gy, std::max(a.y, b.y));
    if (a.x == b.x)
      for (int j = j0; j < j1; ++j) tagged.push_back({j * nx + i0, (j + 1) * nx + i0, e.surface, e.cut_off});
    else
      for (int i = i0; i < i1; ++i) tagged.push_back({j0 * nx + i, j0 * nx + i + 1, e.surface, e.cut_off});
  }
  return tagged;
}

}  // namespace

RawTriangulation grid_triangulation(const CrossSection& section, const PlanarSubdivision& sub, const MeshOptions& options) {
  // Grid lines through every vertex of the subdivision, in metres as the subdivision gives them.
  std::vector<double> xs, ys;
  for (GridPoint g : sub.vertices) {
    const Point p = sub.metres(g);
    xs.push_back(p.x), ys.push_back(p.y);
  }
  const auto [x_min, x_max] = std::minmax_element(xs.begin(), xs.end());
  const auto [y_min, y_max] = std::minmax_element(ys.begin(), ys.end());
  const double extent = std::max(*x_max - *x_min, *y_max - *y_min);
  const double tol = 0.0;  // grid points: equal or at least a grid step apart
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
  raw.tagged = grid_tags(section, sub, gx, gy);
  return raw;
}

}  // namespace edgeflux
