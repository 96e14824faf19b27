// One place for the digits of every output: points to the drawing's millimetre, errors stated
// once, sums from the printed values.
#include <doctest/doctest.h>

#include "report/number_format.h"

using namespace edgeflux;

TEST_CASE("points are rounded to whole millimetres in the user's unit") {
  CHECK(point_text({0.34, 2.68}, 0.001, "mm") == "(340, 2680) mm");
  CHECK(point_text({-0.00136719, 1.2}, 0.001, "mm") == "(-1, 1200) mm");
  CHECK(point_text({-0.0001, 0.0}, 0.001, "mm") == "(0, 0) mm");  // no "-0"
  CHECK(point_text({0.34, 2.68}, 0.01, "cm") == "(34.0, 268.0) cm");
  CHECK(point_text({0.34, 2.6804}, 1.0, "m") == "(0.340, 2.680) m");
}

TEST_CASE("error bars: one significant digit rounded up, never finer than two digits past the value") {
  CHECK(error_text(0.000023, 3) == "0.00003");
  CHECK(error_text(0.0000001, 3) == "0.00001");  // an upper bound at the finest digit shown
  CHECK(error_text(0.0042, 3) == "0.005");
  CHECK(error_text(0.042, 2) == "0.05");
}

TEST_CASE("the accuracy is stated once, in words, and names what is not below the last digit") {
  Convergence c;
  c.coupling_2d = ErrorEstimate{0.6146, 0.00002, 0.5};
  c.psi = {ErrorEstimate{0.066, 0.00002, 0.5}};
  c.min_surface_temperature = ErrorEstimate{18.61, 0.00001, 0.5};
  CHECK(accuracy_statement(c) == "estimated discretisation error below half a unit of the last digit shown for L2D, ψ, θsi,min");
  c.psi = {ErrorEstimate{0.066, 0.0004, 0.5}};  // below 0.0005, half a unit of the third decimal
  CHECK(accuracy_statement(c) == "estimated discretisation error below half a unit of the last digit shown for L2D, ψ, θsi,min");
  c.psi = {ErrorEstimate{0.066, 0.0007, 0.5}};
  CHECK(accuracy_statement(c) ==
        "estimated discretisation error below half a unit of the last digit shown for L2D, θsi,min; larger for ψ ± 0.0007 W/(m·K)");
  CHECK(accuracy_statement(Convergence{}).empty());
}

TEST_CASE("Σ U·l is recomputed from the printed U and lengths, as a checker would") {
  // 0.22851 W/(m²K) prints as 0.229 (3 decimals), 2.68 m as 2.680: 0.229 × 2.680 = 0.61372 (exact arithmetic).
  CHECK(printed_product(0.22851, 2.68) == doctest::Approx(0.61372).epsilon(1e-12));
  CHECK(printed_product(0.22849, 2.68) == doctest::Approx(0.61104).epsilon(1e-12));  // 0.228 × 2.680
}
