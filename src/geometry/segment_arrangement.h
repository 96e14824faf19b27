// Region edges split where they cross or touch, so a triangulation can take them as constraints
// that never cross: painting one region over another creates such crossings everywhere.
#pragma once

#include <vector>

#include "core/point.h"

namespace edgeflux {

struct Segment {
  Point a, b;
};

/// Splits every segment at the points where others cross it or end on it, and drops duplicates.
/// Points closer than `tolerance` (m) are merged. The result has no two segments that cross or
/// overlap; they meet only at shared end points. Deterministic; O(n²) in the number of segments.
std::vector<Segment> segment_arrangement(const std::vector<Segment>& segments, double tolerance);

/// The region outlines of a section as segments.
struct CrossSection;
std::vector<Segment> region_segments(const CrossSection& section);

}  // namespace edgeflux
