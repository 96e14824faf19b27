// Slab-on-ground U-value by the formulas of ISO 13370, checked by hand.
#include <doctest/doctest.h>

#include <stdexcept>

#include "physics/ground_floor.h"

using namespace edgeflux;

TEST_CASE("characteristic dimension B' = A / (0.5 P) (ISO 13370)") {
  // A 10 m × 8 m floor, all of its perimeter exposed: 80 / (0.5 · 36) = 4.444… m (hand calculation).
  CHECK(characteristic_dimension(80.0, 36.0) == doctest::Approx(80.0 / 18.0).epsilon(1e-15));
  CHECK_THROWS_AS(characteristic_dimension(0.0, 36.0), std::invalid_argument);
  CHECK_THROWS_AS(characteristic_dimension(80.0, -1.0), std::invalid_argument);
}

TEST_CASE("uninsulated or moderately insulated slab, dt < B' (ISO 13370 formula, hand calculation)") {
  SlabOnGround f;
  f.characteristic_dimension = 5.0;
  f.wall_thickness = 0.3;
  f.floor_resistance = 0.5;
  // dt = 0.3 + 2.0 · (0.17 + 0.5 + 0.04) = 1.72 m < 5 m.
  // Ug = 2·2.0 / (π·5 + 1.72) · ln(π·5/1.72 + 1) = 4 / 17.427963 · ln(10.132432) = 0.229516 · 2.315752 = 0.531503 W/(m²K).
  const GroundFloorU u = slab_on_ground_u(f);
  CHECK(u.equivalent_thickness == doctest::Approx(1.72).epsilon(1e-14));
  CHECK_FALSE(u.well_insulated);
  CHECK(u.u_value == doctest::Approx(0.531503).epsilon(2e-6));
}

TEST_CASE("well-insulated slab, dt ≥ B' (ISO 13370 formula, hand calculation)") {
  SlabOnGround f;
  f.characteristic_dimension = 4.0;
  f.wall_thickness = 0.4;
  f.floor_resistance = 4.0;
  // dt = 0.4 + 2.0 · (0.17 + 4.0 + 0.04) = 8.82 m ≥ 4 m; Ug = 2.0 / (0.457·4 + 8.82) = 2 / 10.648 = 0.187829 W/(m²K).
  const GroundFloorU u = slab_on_ground_u(f);
  CHECK(u.well_insulated);
  CHECK(u.u_value == doctest::Approx(2.0 / 10.648).epsilon(1e-14));
  // Other soil: clay or silt, λ = 1.5 (ISO 13370): dt = 0.4 + 1.5 · 4.21 = 6.715; Ug = 1.5 / (1.828 + 6.715) = 0.175582.
  f.ground_conductivity = 1.5;
  CHECK(slab_on_ground_u(f).u_value == doctest::Approx(1.5 / 8.543).epsilon(1e-14));
}

TEST_CASE("the two formulas meet where dt = B', so Ug has no jump between the regimes (within 0.02 %)") {
  // At dt = B' = b: 2λ/((π+1)b)·ln(π+1) = 0.686… λ/b against λ/(1.457 b) = 0.686… λ/b (hand calculation:
  // 2·ln(4.14159)/4.14159 = 0.686248 and 1/1.457 = 0.686342, 0.014 % apart).
  for (double b : {2.0, 5.0, 12.0}) {
    CAPTURE(b);
    SlabOnGround below, at;
    below.characteristic_dimension = at.characteristic_dimension = b;
    below.wall_thickness = at.wall_thickness = b - 2.0 * (0.17 + 0.04);  // dt = b exactly with Rf = 0
    below.wall_thickness -= 1e-9;
    const double u_below = slab_on_ground_u(below).u_value, u_at = slab_on_ground_u(at).u_value;
    CHECK(slab_on_ground_u(at).well_insulated);
    CHECK(std::abs(u_below - u_at) <= 2e-4 * u_at);
    CHECK(u_at == doctest::Approx(2.0 / (1.457 * b)).epsilon(1e-14));
  }
}

TEST_CASE("Ug falls as the floor gets bigger or better insulated (monotone, from the formulas)") {
  SlabOnGround f;
  f.wall_thickness = 0.3;
  double previous = 1e9;
  for (double b : {1.0, 2.0, 4.0, 8.0, 16.0, 32.0}) {
    f.characteristic_dimension = b;
    const double u = slab_on_ground_u(f).u_value;
    CHECK(u < previous);
    previous = u;
  }
  f.characteristic_dimension = 6.0;
  previous = 1e9;
  for (double r : {0.0, 0.5, 1.0, 2.0, 3.0, 5.0}) {
    f.floor_resistance = r;
    const double u = slab_on_ground_u(f).u_value;
    CHECK(u < previous);
    previous = u;
  }
}

#include "../support/run_program.h"

TEST_CASE("'edgeflux ground' prints the derivation and refuses a floor without area") {
  const auto run = edgeflux::test::run_program("ground --area 80 --perimeter 36 --wall-thickness 0.3 --floor-resistance 0");
  CHECK(run.exit_code == 0);
  // B' = 4.444 m, dt = 0.3 + 2.0 · 0.21 = 0.720 m < B': Ug = 4 / 14.683 · ln(20.393) = 0.821 W/(m²K) (hand calculation).
  CHECK(run.output.find("= 0.821 W/(m²K)") != std::string::npos);
  CHECK(run.output.find("B' = A / (0.5·P)") != std::string::npos);
  CHECK(edgeflux::test::run_program("ground --area 0 --perimeter 36 --wall-thickness 0.3 --floor-resistance 0").exit_code != 0);
}
