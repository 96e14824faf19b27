// Circular arcs as chains of chords: how curved outlines and surface paths enter a section.
#pragma once

#include <vector>

#include "core/point.h"

namespace edgeflux {

/// The default chord tolerance: the largest gap between an arc and its chords as a fraction of the
/// radius. The shape factor of a pipe changes by about two thirds of this over ln(D2/D1), so 1e-4
/// keeps a faceted pipe within a tenth of the default 0.1 % accuracy target of the true circle.
inline constexpr double default_arc_tolerance = 1e-4;

/// The points strictly between `from` and `to` (m) on the circular arc about `centre`, turning
/// counter-clockwise or clockwise; `from` equal to `to` is a full turn. The chords between
/// successive points deviate from the arc by at most `tolerance` × radius, but not by less than
/// 0.001 mm (finer than the model's 0.01 mm grid resolves), and a full turn has at least 16 of
/// them. The radius is the mean of the two ends' distances from the centre (the caller checks
/// that they agree).
std::vector<Point> arc_points(Point from, Point to, Point centre, bool counter_clockwise, double tolerance);

}  // namespace edgeflux
