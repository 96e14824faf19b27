#include "physics/ground_floor.h"

#include <fmt/format.h>

#include <cmath>
#include <numbers>
#include <stdexcept>

namespace edgeflux {

namespace {

void require(bool ok, const std::string& what) {
  if (!ok) throw std::invalid_argument(what);
}

}  // namespace

double characteristic_dimension(double area, double perimeter) {
  require(std::isfinite(area) && area > 0, fmt::format("the floor area must be above 0 m², got {}", area));
  require(std::isfinite(perimeter) && perimeter > 0, fmt::format("the exposed perimeter must be above 0 m, got {}", perimeter));
  return area / (0.5 * perimeter);
}

GroundFloorU slab_on_ground_u(const SlabOnGround& f) {
  const double b = f.characteristic_dimension, lambda = f.ground_conductivity;
  require(std::isfinite(b) && b > 0, fmt::format("the characteristic dimension B' must be above 0 m, got {}", b));
  require(std::isfinite(f.wall_thickness) && f.wall_thickness >= 0, fmt::format("the wall thickness must be 0 m or more, got {}", f.wall_thickness));
  require(std::isfinite(f.floor_resistance) && f.floor_resistance >= 0,
          fmt::format("the floor's thermal resistance must be 0 m²K/W or more, got {}", f.floor_resistance));
  require(std::isfinite(lambda) && lambda > 0, fmt::format("the ground's conductivity must be above 0 W/(m·K), got {}", lambda));
  require(std::isfinite(f.interior_resistance) && f.interior_resistance >= 0 && std::isfinite(f.exterior_resistance) && f.exterior_resistance >= 0,
          "the surface resistances must be 0 m²K/W or more");
  GroundFloorU u;
  u.equivalent_thickness = f.wall_thickness + lambda * (f.interior_resistance + f.floor_resistance + f.exterior_resistance);
  const double dt = u.equivalent_thickness;
  require(dt > 0, "the total equivalent thickness is 0: give the wall thickness or the resistances");
  u.well_insulated = dt >= b;
  const double pi = std::numbers::pi;
  u.u_value = u.well_insulated ? lambda / (0.457 * b + dt) : 2.0 * lambda / (pi * b + dt) * std::log(pi * b / dt + 1.0);
  return u;
}

}  // namespace edgeflux
