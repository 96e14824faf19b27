// A <cavity> region: its equivalent conductivity worked out from its outline and stated in its source.
#include <doctest/doctest.h>

#include "../support/fixtures.h"
#include "../test_support.h"
#include "input/read_detail_file.h"
#include "pipeline/calculate.h"

using namespace edgeflux;

namespace {

std::string frame_with_cavity(const std::string& cavity) {
  return test::detail_xml(R"(
  <materials>
    <material id="frame" conductivity="0.13" source="test value"/>
  </materials>
  <regions>
    <rectangle name="frame" material="frame" from="0,0" to="80,60"/>
    )" + cavity + R"(
  </regions>
  <environments>
    <environment id="in" temperature="20" side="interior"/>
    <environment id="out" temperature="0" side="exterior"/>
  </environments>
  <boundaries>
    <surface name="inside" environment="in" resistance="0.13" path="80,0 80,60"/>
    <surface name="outside" environment="out" resistance="0.04" path="0,60 0,0"/>
  </boundaries>)");
}

}  // namespace

TEST_CASE("an L-shaped frame cavity gets the ISO 10077-2 λeq of its equivalent rectangle, and the section solves") {
  // 20 × 10 mm bounding rectangle less a 10 × 5 mm corner: area 150 mm², d = 20 mm along x. λeq by
  // hand (ISO 10077-2 formulas from memory, see tests/physics/test_cavity.cpp): 0.072414 W/(m·K).
  const CrossSection section = parse_detail_text(
      frame_with_cavity(R"(<cavity name="c1" heat-flow="horizontal" points="30,20 50,20 50,30 40,30 40,25 30,25"/>)"), "frame.xml");
  const Material& cavity = section.materials.back();
  CHECK(cavity.id == "cavity: c1");
  CHECK(cavity.conductivity == doctest::Approx(0.072414).epsilon(1e-4));
  CHECK(cavity.source.find("equivalent rectangle d′ 17.32 × b′ 8.66 mm") != std::string::npos);
  CHECK(section.regions.back().material == section.materials.size() - 1);
  CalculationOptions options;
  const Calculation calc = calculate(section, options);
  REQUIRE(calc.heat_loss.field.coupling_2d);
  // The cavity insulates: less heat than the solid frame alone, 20 °C × 0.06 m / (0.13 + 0.08/0.13 + 0.04)
  // = 1.5279 W/m (one-dimensional, hand calculation), which the frame without the cavity gives.
  CHECK(calc.heat_loss.field.environments[0].heat_flow < 1.5279);
}

TEST_CASE("cavity refusals: a well-ventilated cavity, a heat flow not named, an outline without area") {
  auto message = [](const std::string& cavity) {
    try {
      parse_detail_text(frame_with_cavity(cavity), "frame.xml");
    } catch (const InputError& e) {
      return std::string(e.what());
    }
    return std::string("no error");
  };
  CHECK(message(R"(<cavity name="v" heat-flow="horizontal" ventilation="well-ventilated" points="30,20 50,20 50,30"/>)")
            .find("not a solid") != std::string::npos);
  CHECK(message(R"(<cavity name="v" heat-flow="sideways" points="30,20 50,20 50,30"/>)").find("horizontal, upward or downward") !=
        std::string::npos);
  CHECK(message(R"(<cavity name="v" points="30,20 50,20 50,30"/>)").find("heat-flow") != std::string::npos);
}
