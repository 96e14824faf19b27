// Where elements must be small: local feature sizes from the input geometry, and region painting.
#include <algorithm>
#include <cmath>
#include <limits>
#include <tuple>

#include "geometry/cross_section.h"
#include "geometry/polygon.h"
#include "mesh/raw_triangulation.h"

namespace edgeflux {

int painting_region(const CrossSection& section, Point p) {
  for (int r = static_cast<int>(section.regions.size()) - 1; r >= 0; --r)
    if (contains(section.regions[r].outline, p)) return r;
  return -1;
}

std::vector<SizeSeed> feature_sizes(const CrossSection& section, double density) {
  struct Segment { Point a, b; };
  std::vector<Segment> segments;
  struct Vertex { Point at; bool reflex; };
  std::vector<Vertex> vertices;
  for (const Region& region : section.regions) {
    const std::size_t n = region.outline.size();
    for (std::size_t i = 0; i < n; ++i) {
      const Point prev = region.outline[(i + n - 1) % n], here = region.outline[i], next = region.outline[(i + 1) % n];
      segments.push_back({here, next});
      // Outlines run counter-clockwise, so a right turn is a re-entrant (reflex) corner.
      vertices.push_back({here, cross(here - prev, next - here) < 0.0});
    }
  }
  for (const Surface& surface : section.surfaces)
    for (Point p : surface.path) vertices.push_back({p, false});

  // Local feature size at a vertex: the distance to the nearest geometry it does not touch.
  // Three elements across that distance resolve thin layers; re-entrant corners, where the heat
  // flux is singular (θ − θc ∝ r^(2/3)), start several times finer.
  const double elements_across = 3.0 * density;
  const double reflex_factor = 10.0;
  std::vector<SizeSeed> seeds;
  seeds.reserve(vertices.size());
  for (const Vertex& v : vertices) {
    double nearest = std::numeric_limits<double>::infinity();
    for (const Segment& s : segments) {
      const double d = distance_to_segment(v.at, s.a, s.b);
      if (d > 1e-12) nearest = std::min(nearest, d);
    }
    if (std::isfinite(nearest)) seeds.push_back({v.at, nearest / (elements_across * (v.reflex ? reflex_factor : 1.0))});
  }
  std::sort(seeds.begin(), seeds.end(), [](const SizeSeed& a, const SizeSeed& b) {
    return std::tie(a.at.x, a.at.y, a.size) < std::tie(b.at.x, b.at.y, b.size);
  });
  return seeds;
}

}  // namespace edgeflux
