// The sweep that finds where a region outline crosses or touches itself, checked against the
// pairwise test it replaced on many small outlines full of degeneracies, and on very long ones.
#include <doctest/doctest.h>

#include <chrono>
#include <cmath>
#include <random>
#include <vector>

#include "geometry/polygon.h"

using namespace edgeflux;

namespace {

/// The pairwise (quadratic) test the sweep replaced: every non-adjacent pair of edges, and
/// adjacent pairs that fold back onto each other. The oracle for the property test below.
bool is_self_intersecting_pairwise(const std::vector<Point>& outline) {
  const int n = static_cast<int>(outline.size());
  for (int i = 0; i < n; ++i) {
    const Point a = outline[i], b = outline[(i + 1) % n];
    for (int j = i + 1; j < n; ++j) {
      const bool adjacent = (j == i + 1) || (i == 0 && j == n - 1);
      const Point c = outline[j], d = outline[(j + 1) % n];
      if (adjacent) {
        const Point shared = (j == i + 1) ? b : a;
        const Point u = ((j == i + 1) ? a : b) - shared, v = ((j == i + 1) ? d : c) - shared;
        if (std::abs(cross(u, v)) <= 1e-14 * norm(u) * norm(v) && dot(u, v) > 0) return true;
        continue;
      }
      if (segments_intersect(a, b, c, d)) return true;
    }
  }
  return false;
}

/// True when edges i and j of the outline share a point, or (adjacent) fold back.
bool edges_meet(const std::vector<Point>& outline, int i, int j) {
  const int n = static_cast<int>(outline.size());
  const std::vector<Point> two = {outline[i], outline[(i + 1) % n], outline[j], outline[(j + 1) % n]};
  const bool adjacent = (j == i + 1) || (i == 0 && j == n - 1);
  if (!adjacent) return segments_intersect(two[0], two[1], two[2], two[3]);
  const std::vector<Point> three = j == i + 1 ? std::vector<Point>{two[0], two[1], two[3]}
                                              : std::vector<Point>{two[2], two[3], two[1]};
  const Point u = three[0] - three[1], v = three[2] - three[1];
  return std::abs(cross(u, v)) <= 1e-14 * norm(u) * norm(v) && dot(u, v) > 0;
}

}  // namespace

TEST_CASE("self-intersection sweep: simple, crossing and touching outlines") {
  // Check values by construction (common practice): a square is simple; a figure-eight crosses;
  // a corner placed on a non-adjacent edge touches it; a point visited twice touches.
  const std::vector<Point> square = {{0, 0}, {1, 0}, {1, 1}, {0, 1}};
  CHECK(first_self_intersection(square).first == -1);
  const std::vector<Point> bowtie = {{0, 0}, {1, 1}, {1, 0}, {0, 1}};
  CHECK(first_self_intersection(bowtie) == std::pair<int, int>{0, 2});
  const std::vector<Point> corner_on_edge = {{0, 0}, {2, 0}, {2, 2}, {1, 0}, {0, 2}};
  const auto touch = first_self_intersection(corner_on_edge);
  REQUIRE(touch.first >= 0);
  CHECK(edges_meet(corner_on_edge, touch.first, touch.second));
  const std::vector<Point> twice = {{0, 0}, {2, 0}, {1, 1}, {2, 2}, {0, 2}, {1, 1}};
  const auto repeat = first_self_intersection(twice);
  REQUIRE(repeat.first >= 0);
  CHECK(edges_meet(twice, repeat.first, repeat.second));
  // Vertical edges and a spike folding back along itself.
  const std::vector<Point> spike = {{0, 0}, {1, 0}, {1, 1}, {1, 3}, {1, 2}, {0, 2}};
  CHECK(first_self_intersection(spike).first >= 0);
}

TEST_CASE("self-intersection sweep agrees with the pairwise test on 20000 random small outlines") {
  // Corners on a 5 × 5 integer grid make collinear edges, corners on edges, repeated points and
  // vertical edges common: the cases a sweep gets wrong first. Oracle: the pairwise test (common
  // practice). Outlines with two equal consecutive points are skipped: the caller rejects those
  // first (validate_cross_section) and the sweep reports them as folds.
  std::mt19937 random(12345);
  std::uniform_int_distribution<int> coordinate(0, 4), size(3, 9);
  int n_simple = 0, n_not_simple = 0;
  for (int trial = 0; trial < 20000; ++trial) {
    std::vector<Point> outline(size(random));
    for (Point& p : outline) p = {double(coordinate(random)), double(coordinate(random))};
    bool repeats = false;
    for (std::size_t i = 0; i < outline.size(); ++i) {
      const Point a = outline[i], b = outline[(i + 1) % outline.size()];
      repeats = repeats || (a.x == b.x && a.y == b.y);
    }
    if (repeats) continue;
    const bool expected = is_self_intersecting_pairwise(outline);
    const auto found = first_self_intersection(outline);
    CAPTURE(trial);
    REQUIRE((found.first >= 0) == expected);
    if (found.first >= 0) {
      CHECK(found.first < found.second);
      CHECK(edges_meet(outline, found.first, found.second));
      ++n_not_simple;
    } else {
      ++n_simple;
    }
  }
  // Both outcomes must be well represented, or the comparison says little.
  CHECK(n_simple > 500);
  CHECK(n_not_simple > 500);
}

TEST_CASE("self-intersection sweep on random outlines with non-integer corners") {
  // Star-shaped outlines (angles increasing) are simple by construction; moving one corner far
  // across makes most of them cross. Oracle: the pairwise test (common practice).
  std::mt19937 random(777);
  std::uniform_real_distribution<double> unit(0.0, 1.0);
  for (int trial = 0; trial < 2000; ++trial) {
    const int n = 3 + trial % 40;
    std::vector<Point> outline(n);
    for (int k = 0; k < n; ++k) {
      const double angle = 2 * M_PI * (k + 0.9 * unit(random)) / n, r = 0.1 + unit(random);
      outline[k] = {r * std::cos(angle), r * std::sin(angle)};
    }
    CAPTURE(trial);
    REQUIRE(first_self_intersection(outline).first == -1);
    outline[trial % n] = {3 * (unit(random) - 0.5), 3 * (unit(random) - 0.5)};
    CHECK((first_self_intersection(outline).first >= 0) == is_self_intersecting_pairwise(outline));
  }
}

TEST_CASE("self-intersection sweep: 200000-point outlines in well under a second") {
  // A zigzag bottom edge (1 mm deep, 0.002 mm pitch) closed over the top: simple. The pairwise test
  // took about a minute on 100 000 points. The time bound is common practice for an O(n log n)
  // pass over 2e5 edges (measured: about 0.1 s in the Release build).
  const int n_zigzag = 200000;
  std::vector<Point> outline;
  for (int i = 0; i < n_zigzag; ++i) outline.push_back({0.2 * i / (n_zigzag - 1), i % 2 ? 0.001 : 0.0});
  outline.push_back({0.2, 1.0});
  outline.push_back({0.0, 1.0});
  const auto start = std::chrono::steady_clock::now();
  CHECK(first_self_intersection(outline).first == -1);
  // Closing through the zigzag instead crosses it; the edge that does so is the second-last.
  outline.back() = {0.1, -0.005};
  outline.insert(outline.end() - 1, Point{0.0, 1.0});
  const auto crossing = first_self_intersection(outline);
  const double seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
  REQUIRE(crossing.first >= 0);
  CHECK(crossing.second == static_cast<int>(outline.size()) - 2);
  CHECK(edges_meet(outline, crossing.first, crossing.second));
  CHECK(seconds < 5.0);
}
