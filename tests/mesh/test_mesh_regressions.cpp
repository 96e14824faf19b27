// Inputs that once broke the mesher: painted regions whose edges cross, and two overlapping
// rectangles forming an L. Each must solve with a closed energy balance.
#include <doctest/doctest.h>

#include <cmath>

#include "../test_support.h"

using namespace edgeflux;

TEST_CASE("regression: crossing region edges and an overlapping L mesh and solve (energy balance, common practice)") {
  for (const char* file : {"tests/data/regression/crossing-rectangles.xml", "tests/data/regression/overlapping-l.xml"}) {
    CAPTURE(file);
    const Calculation calc = test::solve_file(file);
    CHECK(std::abs(calc.heat_loss.field.balance.relative) < 1e-9);
    CHECK(calc.convergence.target_met);
    REQUIRE(calc.heat_loss.field.coupling_2d);
    CHECK(*calc.heat_loss.field.coupling_2d > 0.0);
  }
}

TEST_CASE("the overlapping L equals the same L drawn as one polygon (painting rule, exact geometry)") {
  const Calculation painted = test::solve_file("tests/data/regression/overlapping-l.xml");
  const std::string one_polygon = R"(<edgeflux-detail format="1" units="mm"><materials><material id="mas" library="calcium-silicate-1800"/></materials><regions>
<polygon material="mas" points="325,325 1540,325 1540,340 340,340 340,1540 325,1540"/></regions>
<environments><environment id="i" temperature="20" side="interior"/><environment id="x" temperature="-5" side="exterior"/></environments>
<boundaries><surface environment="x" resistance="rse" path="1540,325 325,325 325,1540"/>
<surface environment="i" resistance="rsi-horizontal" path="1540,340 340,340 340,1540"/></boundaries></edgeflux-detail>)";
  const Calculation polygon = calculate(parse_detail_text(one_polygon, "l.xml"), {});
  const double bar = painted.convergence.coupling_2d->error + polygon.convergence.coupling_2d->error;
  CHECK(std::abs(*painted.heat_loss.field.coupling_2d - *polygon.heat_loss.field.coupling_2d) <= bar);
}
