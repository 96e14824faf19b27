// What a mesher hands to the common finishing step: triangles over (at least) the section, painted.
#pragma once

#include <array>
#include <cstddef>
#include <vector>

#include "core/point.h"

namespace edgeflux {

/// A mesh edge on a surface or a cut-off, by its two nodes (either order).
struct TaggedEdge {
  int a = 0, b = 0;
  int surface = -1;  ///< index into CrossSection::surfaces, or -1
  int cut_off = -1;  ///< index into CrossSection::flanking_elements, or -1
};

/// Triangles covering the section and possibly some area outside it; each painted with a region
/// index, or -1 where no region covers it.
struct RawTriangulation {
  std::vector<Point> points;                  ///< m
  std::vector<std::array<int, 3>> triangles;  ///< counter-clockwise
  std::vector<int> triangle_region;           ///< -1 = not covered
  std::vector<TaggedEdge> tagged;             ///< every mesh edge along a surface or cut-off
  std::vector<int> probe_nodes;               ///< per probe, its point index, or -1
};

}  // namespace edgeflux
