// What a mesher hands to the common finishing step: triangles over (at least) the section, painted.
#pragma once

#include <array>
#include <cstddef>
#include <vector>

#include "core/point.h"

namespace edgeflux {

/// Triangles covering the section and possibly some area outside it; each painted with a region
/// index, or -1 where no region covers it.
struct RawTriangulation {
  std::vector<Point> points;
  std::vector<std::array<int, 3>> triangles;  ///< counter-clockwise
  std::vector<int> triangle_region;           ///< -1 = not covered
};

struct CrossSection;
struct MeshOptions;

RawTriangulation grid_triangulation(const CrossSection& section, const MeshOptions& options);
RawTriangulation delaunay_triangulation(const CrossSection& section, const MeshOptions& options);

/// Index of the last region whose outline contains p (regions paint in file order), or -1.
int painting_region(const CrossSection& section, Point p);

/// Local target element size at every input vertex, from the distance to the nearest other
/// feature (thin layers and short edges get small elements). Returns pairs of (point, size).
struct SizeSeed { Point at; double size; };
std::vector<SizeSeed> feature_sizes(const CrossSection& section, double density);

}  // namespace edgeflux
