// The outer boundary of a section split into runs between its corners: the candidate surfaces
// and cut-off planes a user picks from when a section comes from a drawing.
#pragma once

#include <vector>

#include "geometry/planar_subdivision.h"

namespace edgeflux {

/// A piece of the outline between two corners (or a whole loop without corners, e.g. a circle).
struct OutlineRun {
  std::vector<Point> points;  ///< m, the section on the left; only the points where the run bends
  double length = 0.0;        ///< m
  int region = -1;            ///< the region along its longest edge
  bool closed = false;        ///< a whole loop: the last point joins the first
};

/// Runs of every boundary loop (outer outlines and holes), each loop split where it turns by more
/// than `corner_degrees`, so a chorded arc stays in one run with the faces it meets tangentially.
/// Ordered by loop (the loop with the lowest-left point first) and along each loop from its first
/// corner after the lowest-left point; a section with n boundary edges takes O(n).
std::vector<OutlineRun> outline_runs(const PlanarSubdivision& subdivision, double corner_degrees = 15.0);

}  // namespace edgeflux
