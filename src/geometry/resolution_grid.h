// The geometric resolution of a section: every point of the model lies on a square grid of 0.01 mm.
#pragma once

#include <compare>
#include <cstdint>
#include <functional>

#include "core/point.h"

namespace edgeflux {

/// Grid lines per metre: the grid step is 0.01 mm. Decimal coordinates with up to two decimals in
/// millimetres (five in metres) lie on the grid exactly, so drawn geometry keeps its values.
inline constexpr double grid_steps_per_metre = 1e5;
/// The grid step, m.
inline constexpr double grid_step = 1.0 / grid_steps_per_metre;

/// A point of the grid, in grid steps.
struct GridPoint {
  std::int64_t x = 0, y = 0;
  auto operator<=>(const GridPoint&) const = default;
};

/// A grid point as a plain point, in grid steps.
inline Point as_point(GridPoint p) { return {static_cast<double>(p.x), static_cast<double>(p.y)}; }

struct GridPointHash {
  std::size_t operator()(const GridPoint& p) const {
    return std::hash<std::int64_t>()(p.x * 0x9E3779B97F4A7C15LL ^ (p.y + 0x632BE59BD9B4E019LL));
  }
};

/// Metres of a grid coordinate (correctly rounded: a grid point written in the file keeps its value).
inline double grid_to_metres(std::int64_t steps) { return static_cast<double>(steps) / grid_steps_per_metre; }

}  // namespace edgeflux
