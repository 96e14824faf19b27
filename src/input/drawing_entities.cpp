// Curved edges of drawing entities as chords: polyline bulges and ellipses.
#include "input/drawing_entities.h"

#include <algorithm>
#include <cmath>

#include "geometry/arc_points.h"

namespace edgeflux {

std::vector<Point> polyline_points(const std::vector<Vertex>& vertices, bool closed, double tolerance,
                                   std::vector<Point>& chords) {
  std::vector<Point> points;
  const std::size_t n = vertices.size();
  for (std::size_t i = 0; i < n; ++i) {
    points.push_back(vertices[i].at);
    if (i + 1 == n && !closed) break;
    const Point from = vertices[i].at, to = vertices[(i + 1) % n].at;
    const double bulge = vertices[i].bulge;
    if (bulge == 0.0 || distance(from, to) == 0.0) continue;
    // The centre lies off the chord's midpoint by (c/2)(1 − b²)/(2b), to the left for b > 0.
    const Point chord = to - from, left{-chord.y, chord.x};
    const Point centre = 0.5 * (from + to) + ((1.0 - bulge * bulge) / (4.0 * bulge)) * left;
    for (Point p : arc_points(from, to, centre, bulge > 0.0, tolerance)) points.push_back(p), chords.push_back(p);
  }
  return points;
}

std::vector<Point> ellipse_points(Point centre, Point major, double ratio, double t0, double t1, bool ccw,
                                         double tolerance) {
  const Point minor{-major.y * ratio, major.x * ratio};
  double sweep = t1 - t0;
  if (ccw) {
    while (sweep <= 0.0) sweep += 2.0 * pi;
  } else {
    while (sweep >= 0.0) sweep -= 2.0 * pi;
  }
  // Chords against the curvature at the flattest point: radius a²/b for semi-axes a ≥ b.
  const double a = norm(major), b = a * std::abs(ratio);
  const double r = std::max(a, b) * std::max(a, b) / std::max(std::min(a, b), 1e-300);
  const double step = std::min(pi / 8.0, 2.0 * std::acos(std::max(0.0, 1.0 - tolerance * std::min(a, b) / r)));
  const int pieces = std::max(2, static_cast<int>(std::ceil(std::abs(sweep) / std::max(step, 1e-4))));
  std::vector<Point> points;
  for (int k = 0; k <= pieces; ++k) {
    const double t = t0 + sweep * k / pieces;
    points.push_back(centre + std::cos(t) * major + std::sin(t) * minor);
  }
  return points;
}

}  // namespace edgeflux
