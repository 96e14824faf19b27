// ISO 10211 validation Case 1: half square column with fixed surface temperatures, against the
// standard's table and the exact series solution.
#include <doctest/doctest.h>

#include <cmath>
#include <numbers>

#include "../test_support.h"
#include "validation/iso10211_conformity.h"

using namespace edgeflux;


TEST_CASE("series solution (the conformity check's own code): centre of the full square is 5 °C (exact, by "
          "symmetry: four rotated edge problems sum to 20 °C), and the edges hold their temperatures") {
  CHECK(iso10211_case1_series(1.0, 1.0, 2.0) == doctest::Approx(5.0).epsilon(1e-12));
  // Exact boundary values: 0 °C on x = 0, x = L and y = 0; 20 °C inside the heated edge (the series
  // converges slowly there: 0.1 K at a quarter of the side from the corners).
  for (double t : {0.3, 1.0, 1.7}) {
    CHECK(std::abs(iso10211_case1_series(0.0, t, 2.0)) < 1e-12);
    CHECK(std::abs(iso10211_case1_series(2.0, t, 2.0)) < 1e-9);
    CHECK(std::abs(iso10211_case1_series(t, 0.0, 2.0)) < 1e-12);
  }
  CHECK(std::abs(iso10211_case1_series(1.0, 2.0 - 1e-9, 2.0) - 20.0) < 0.1);
  // Superposition (exact): the four edge problems of the square sum to 20 °C at any inner point.
  const double x = 0.37, y = 1.21, L = 2.0;
  const double sum = iso10211_case1_series(x, y, L) + iso10211_case1_series(L - x, L - y, L) +
                     iso10211_case1_series(y, L - x, L) + iso10211_case1_series(L - y, x, L);
  CHECK(sum == doctest::Approx(20.0).epsilon(1e-9));
}

TEST_CASE("ISO 10211 Case 1: 28 points within 0.1 K of the table and 0.01 K of the series") {
  // ISO 10211:2017 Annex C Table C.1 (Annex A in the 2007 edition), °C, rows a/4 … 7a/4 below the
  // heated edge, columns x = a/4 … a. Typed from memory; each value equals the series solution
  // rounded to 0.1 K, which the second check below holds to 0.01 K.
  const double table[7][4] = {{9.7, 13.4, 14.7, 15.1}, {5.3, 8.6, 10.3, 10.8}, {3.2, 5.6, 7.0, 7.5},
                              {2.0, 3.6, 4.7, 5.0},    {1.3, 2.3, 3.0, 3.2},   {0.7, 1.4, 1.8, 1.9},
                              {0.3, 0.6, 0.8, 0.9}};
  const Calculation calc = test::solve_file("tests/reference/iso10211_case1.xml");
  REQUIRE(calc.heat_loss.field.probes.size() == 28);
  double worst_series = 0.0, worst_table = 0.0;
  for (int row = 1; row <= 7; ++row) {
    for (int col = 1; col <= 4; ++col) {
      const double computed = test::probe(calc, "r" + std::to_string(row) + "c" + std::to_string(col));
      const double exact = iso10211_case1_series(0.25 * col, 2.0 - 0.25 * row, 2.0);
      CAPTURE(row);
      CAPTURE(col);
      CHECK(std::abs(computed - table[row - 1][col - 1]) <= 0.1);  // the standard's tolerance
      CHECK(std::abs(computed - exact) <= 0.01);                   // common practice: 0.01 K to the exact series (Incropera & DeWitt, separation of variables)
      worst_series = std::max(worst_series, std::abs(computed - exact));
      worst_table = std::max(worst_table, std::abs(computed - table[row - 1][col - 1]));
    }
  }
  MESSAGE("Case 1: largest difference to the series ", worst_series, " K, to the table ", worst_table, " K");
}
