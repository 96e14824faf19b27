// A section turned and moved as a whole, its coordinates rounded the way a drawing exports them:
// the input of the invariance tests (the physics does not care about orientation, so neither may
// the program).
#pragma once

#include <cmath>
#include <cstdio>
#include <cstdlib>

#include "geometry/cross_section.h"

namespace edgeflux::test {

/// x rounded to `digits` significant decimal digits, as a CAD export writes it.
inline double significant(double x, int digits) {
  if (x == 0.0 || digits <= 0) return x;
  char text[64];
  std::snprintf(text, sizeof text, "%.*e", digits - 1, x);
  return std::strtod(text, nullptr);
}

/// The section rotated counter-clockwise about the origin by the angle with cosine c and sine s,
/// then moved by `shift` (metres); every coordinate rounded to `digits` significant digits (0: not
/// rounded).
inline CrossSection transformed_section(CrossSection section, double c, double s, Point shift, int digits) {
  auto move = [&](Point& p) {
    const Point q{c * p.x - s * p.y + shift.x, s * p.x + c * p.y + shift.y};
    p = {significant(q.x, digits), significant(q.y, digits)};
  };
  for (Region& r : section.regions)
    for (Point& p : r.outline) move(p);
  for (Surface& surface : section.surfaces)
    for (Point& p : surface.path) move(p);
  for (Probe& probe : section.probes) move(probe.at);
  for (FlankingElement& f : section.flanking_elements) move(f.cut_off_start), move(f.cut_off_end);
  return section;
}

/// The section rotated by `degrees` and moved by `shift`, rounded to 12 digits as a drawing exports it.
inline CrossSection turned_section(const CrossSection& section, double degrees, Point shift = {}) {
  const double a = degrees * 3.14159265358979323846 / 180.0;
  return transformed_section(section, std::cos(a), std::sin(a), shift, 12);
}

}  // namespace edgeflux::test
