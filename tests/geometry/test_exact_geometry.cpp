// Snap rounding, box overlaps and the constrained triangulation on hand-built inputs (grid steps).
#include <doctest/doctest.h>

#include <algorithm>

#include "geometry/exact_geometry.h"

using namespace edgeflux;

namespace {
using Line = std::vector<GridPoint>;
}

TEST_CASE("snap rounding: crossing segments both pass through the centre of the crossing's pixel (exact geometry)") {
  // (0,0)–(10,3) and (0,3)–(10,0) cross at (5, 1.5), in the pixel of grid point (5, 2) (half-open
  // pixels: 1.5 rounds up).
  const auto lines = snap_rounded({{Point{0, 0}, Point{10, 3}}, {Point{0, 3}, Point{10, 0}}}, {});
  REQUIRE(lines.size() == 2);
  CHECK(lines[0] == Line{{0, 0}, {5, 2}, {10, 3}});
  CHECK(lines[1] == Line{{0, 3}, {5, 2}, {10, 0}});
}

TEST_CASE("snap rounding: a segment passing within half a step of a point is led through it; farther, it is not") {
  const auto near = snap_rounded({{Point{0, 0}, Point{100, 0}}}, {Point{40, 0.3}});
  CHECK(near[0] == Line{{0, 0}, {40, 0}, {100, 0}});
  const auto on_sloped = snap_rounded({{Point{0, 0}, Point{100, 70}}}, {Point{50, 35.2}});
  CHECK(on_sloped[0] == Line{{0, 0}, {50, 35}, {100, 70}});
  const auto far = snap_rounded({{Point{0, 0}, Point{100, 0}}}, {Point{40, 0.7}});
  CHECK(far[0] == Line{{0, 0}, {100, 0}});
}

TEST_CASE("snap rounding: edges drawn along each other at an angle become the same pieces (exact geometry)") {
  // A long edge and a shorter one on the same line, turned so that their ends are off the grid.
  const double c = 0.9612616959383189, s = 0.27563735581699916;  // 16°
  auto at = [&](double t) { return Point{3.3 + c * t, 7.1 + s * t}; };
  const auto lines = snap_rounded({{at(0), at(1000)}, {at(200), at(600)}}, {});
  // The short edge's ends are hot pixels on the long edge: the long edge passes them, and the
  // piece between them is the short edge itself.
  REQUIRE(lines[0].size() == 4);
  CHECK(lines[1].size() == 2);
  CHECK(lines[0][1] == lines[1][0]);
  CHECK(lines[0][2] == lines[1][1]);
}

TEST_CASE("snap rounding: segments far from everything keep their rounded ends; the result is deterministic") {
  std::vector<std::array<Point, 2>> segments;
  for (int i = 0; i < 200; ++i)
    segments.push_back({Point{10.0 * i + 0.2, 0.4}, Point{10.0 * i + 5.3, 3.6}});
  const auto a = snap_rounded(segments, {}), b = snap_rounded(segments, {});
  CHECK(a == b);
  for (int i = 0; i < 200; ++i) CHECK(a[i] == Line{{10 * i, 0}, {10 * i + 5, 4}});
  // One inside a single pixel collapses to a point.
  CHECK(snap_rounded({{Point{3.1, 3.1}, Point{3.3, 2.9}}}, {})[0] == Line{{3, 3}});
}

TEST_CASE("box overlaps: every touching or overlapping pair once, sorted") {
  const std::vector<Box> boxes = {{0, 0, 1, 1}, {1, 1, 2, 2}, {5, 5, 6, 6}, {0.5, -1, 0.6, 0}};
  CHECK(overlapping_boxes(boxes) == std::vector<std::pair<int, int>>{{0, 1}, {0, 3}});
  CHECK(overlapping_boxes({{0, 0, 1, 1}}, {{2, 2, 3, 3}, {1, 0, 2, 0}}) == std::vector<std::pair<int, int>>{{0, 1}});
}

TEST_CASE("constrained triangulation: a square split by its constrained diagonal, with adjacency and point location") {
  const std::vector<GridPoint> points = {{0, 0}, {10, 0}, {10, 10}, {0, 10}};
  const auto t = segment_triangulation(points, {{0, 2}}, {Point{8, 2}, Point{2, 8}, Point{20, 20}});
  REQUIRE(t.triangles.size() == 2);
  int constrained_sides = 0;
  for (int f = 0; f < 2; ++f)
    for (int k = 0; k < 3; ++k) {
      if (t.segment[f][k] == 0) {
        ++constrained_sides;
        CHECK(t.neighbour[f][k] == 1 - f);
      } else {
        CHECK(t.segment[f][k] == -1);
        CHECK(t.neighbour[f][k] == -1);  // the square's sides are on the hull
      }
    }
  CHECK(constrained_sides == 2);
  REQUIRE(t.located.size() == 3);
  CHECK(t.located[0] != t.located[1]);
  CHECK(t.located[2] == -1);
  // (8, 2) is below the diagonal: the triangle with corner (10, 0).
  const auto& below = t.triangles[t.located[0]];
  CHECK(std::find(below.begin(), below.end(), 1) != below.end());
}
