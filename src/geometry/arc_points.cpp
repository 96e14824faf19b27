// Chords of a circular arc (see the header).
#include "geometry/arc_points.h"

#include <algorithm>
#include <cmath>

namespace edgeflux {

std::vector<Point> arc_points(Point from, Point to, Point centre, bool counter_clockwise, double tolerance) {
  constexpr double pi = 3.14159265358979323846;
  constexpr double smallest_gap = 1e-6;  // m: 0.001 mm
  const double radius = 0.5 * (distance(from, centre) + distance(to, centre));
  const double start = std::atan2(from.y - centre.y, from.x - centre.x);
  double sweep = std::atan2(to.y - centre.y, to.x - centre.x) - start;
  if (counter_clockwise) {
    while (sweep <= 0.0) sweep += 2.0 * pi;
  } else {
    while (sweep >= 0.0) sweep -= 2.0 * pi;
  }
  // A chord over the angle φ stands off the arc by r(1 − cos(φ/2)).
  const double gap = std::max(tolerance * radius, smallest_gap);
  const double widest = gap >= radius ? pi / 8.0 : std::min(pi / 8.0, 2.0 * std::acos(1.0 - gap / radius));
  // The step is a whole fraction of a turn, and a sweep takes whole steps (up to rounding), so
  // one arc drawn twice (a hatch over its boundary, two regions sharing a curved edge, in either
  // direction) gets the same chords.
  const double turn_pieces = std::ceil(2.0 * pi / widest - 1e-6);
  const double step = 2.0 * pi / turn_pieces;
  const int pieces = std::max(1, static_cast<int>(std::ceil(std::abs(sweep) / step - 1e-6)));
  std::vector<Point> points;
  points.reserve(pieces - 1);
  for (int k = 1; k < pieces; ++k) {
    const double angle = start + sweep * k / pieces;
    points.push_back({centre.x + radius * std::cos(angle), centre.y + radius * std::sin(angle)});
  }
  return points;
}

}  // namespace edgeflux
