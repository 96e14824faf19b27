// The mesher's guards: extreme aspect ratios and conductivity contrasts solve exactly where the
// field is one-dimensional, tips too sharp to mesh are refused before meshing, and the node
// estimate behind the refinement budget is the integral it claims to be.
#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <random>
#include <vector>
#include <string>

#include "../test_support.h"
#include "core/error.h"
#include "mesh/size_field.h"

using namespace edgeflux;

namespace {

CalculationOptions fixed_mesh() {
  CalculationOptions options;
  options.adaptive = false;
  return options;
}

/// A wall of vertical layers (x from 0, in mm), 1000 mm high unless given, interior on the left with
/// Rsi 0.13 and exterior on the right with Rse 0.04 m²K/W (ISO 6946 Table 7, horizontal heat flow).
std::string layered_wall(const std::vector<std::pair<double, double>>& layers, double height = 1000.0) {
  std::string materials, regions;
  double x = 0.0;
  for (std::size_t i = 0; i < layers.size(); ++i) {
    const auto [thickness, conductivity] = layers[i];
    materials += "<material id=\"m" + std::to_string(i) + "\" conductivity=\"" + std::to_string(conductivity) + "\"/>";
    regions += "<rectangle material=\"m" + std::to_string(i) + "\" from=\"" + std::to_string(x) + ",0\" to=\"" +
               std::to_string(x + thickness) + "," + std::to_string(height) + "\"/>";
    x += thickness;
  }
  const std::string h = std::to_string(height), w = std::to_string(x);
  return test::detail_xml("<materials>" + materials + "</materials><regions>" + regions + "</regions>" +
                          "<environments><environment id=\"i\" temperature=\"20\" side=\"interior\"/>"
                          "<environment id=\"e\" temperature=\"-10\" side=\"exterior\"/></environments>"
                          "<boundaries><surface environment=\"i\" resistance=\"rsi-horizontal\" path=\"0," + h + " 0,0\"/>"
                          "<surface environment=\"e\" resistance=\"rse\" path=\"" + w + ",0 " + w + "," + h + "\"/></boundaries>");
}

/// L2D of a layered wall: height / (Rsi + Σ d/λ + Rse), the exact one-dimensional solution.
double series_l2d(const std::vector<std::pair<double, double>>& layers, double height_m = 1.0) {
  double resistance = 0.13 + 0.04;
  for (const auto& [thickness, conductivity] : layers) resistance += thickness * 1e-3 / conductivity;
  return height_m / resistance;
}

}  // namespace

TEST_CASE("a 0.1 mm foil through a 3 m wall solves to the series resistance (exact 1-D solution)") {
  const std::vector<std::pair<double, double>> layers = {{200.0, 2.0}, {0.1, 0.04}, {99.9, 0.035}};
  const Calculation calc = calculate(parse_detail_text(layered_wall(layers, 3000.0), "foil.xml"), fixed_mesh());
  REQUIRE(calc.heat_loss.field.coupling_2d);
  // Linear elements represent the piecewise-linear exact field exactly: only rounding remains.
  CHECK(*calc.heat_loss.field.coupling_2d == doctest::Approx(series_l2d(layers, 3.0)).epsilon(1e-9));
  CHECK(calc.junction.warnings.empty());
}

TEST_CASE("conductivities 10^-3 and 10^3 side by side solve to the series resistance (exact 1-D solution)") {
  const std::vector<std::pair<double, double>> layers = {{100.0, 1000.0}, {50.0, 0.001}, {100.0, 1000.0}};
  const Calculation calc = calculate(parse_detail_text(layered_wall(layers), "contrast.xml"), fixed_mesh());
  REQUIRE(calc.heat_loss.field.coupling_2d);
  CHECK(*calc.heat_loss.field.coupling_2d == doctest::Approx(series_l2d(layers)).epsilon(1e-9));
}

TEST_CASE("a λ = 1000 fin through λ = 0.001 insulation: energy balance within the ISO 10211 criterion") {
  const std::string fin = R"(<materials><material id="c" conductivity="1000"/><material id="i" conductivity="0.001"/>
<material id="m" conductivity="0.8"/></materials><regions><rectangle material="m" from="0,0" to="200,1000"/>
<rectangle material="i" from="200,0" to="300,1000"/><rectangle material="c" from="0,480" to="300,520"/></regions>
<environments><environment id="in" temperature="20" side="interior"/><environment id="out" temperature="-5" side="exterior"/></environments>
<boundaries><surface environment="in" resistance="rsi-horizontal" path="0,1000 0,0"/>
<surface environment="out" resistance="rse" path="300,0 300,1000"/></boundaries>)";
  const Calculation calc = calculate(parse_detail_text(test::detail_xml(fin), "fin.xml"), fixed_mesh());
  // ISO 10211 (2017) 5.3: the sum of all heat flows, over their absolute sum, below 1e-4.
  CHECK(std::abs(calc.heat_loss.field.balance.relative) < 1e-4);
  for (double t : calc.heat_loss.temperature) CHECK((t >= -5.0 - 1e-9 && t <= 20.0 + 1e-9));
}

namespace {

/// Concrete deck with a tapered layer rising `rise` mm over 5 m, and flat insulation over both.
std::string taper(double rise) {
  const std::string r = std::to_string(200.0 + rise);
  return test::detail_xml(
      "<materials><material id=\"d\" conductivity=\"2\"/><material id=\"t\" conductivity=\"0.035\"/>"
      "<material id=\"f\" conductivity=\"0.04\"/></materials><regions>"
      "<rectangle material=\"d\" from=\"0,0\" to=\"5000,200\"/>"
      "<polygon material=\"t\" points=\"0,200 5000,200 5000," + r + "\"/>"
      "<polygon material=\"f\" points=\"0,200 5000," + r + " 5000,300 0,300\"/></regions>"
      "<environments><environment id=\"i\" temperature=\"20\" side=\"interior\"/>"
      "<environment id=\"e\" temperature=\"-10\" side=\"exterior\"/></environments>"
      "<boundaries><surface environment=\"i\" resistance=\"rsi-upward\" path=\"5000,0 0,0\"/>"
      "<surface environment=\"e\" resistance=\"rse\" path=\"0,300 5000,300\"/></boundaries>");
}

}  // namespace

TEST_CASE("a taper of 1 in 1000 (0.057°) meshes; a tip of 0.01° is refused before meshing, with angle and point") {
  // 5 mm over 5 m: the flattest fall the mesher accepts is 0.05° (common practice: screed and
  // insulation falls are 1 in 40 to 1 in 100).
  const Calculation calc = calculate(parse_detail_text(taper(5.0), "taper.xml"), fixed_mesh());
  CHECK(std::abs(calc.heat_loss.field.balance.relative) < 1e-4);  // ISO 10211 (2017) 5.3
  // 0.8727 mm over 5 m is 0.0100°.
  try {
    calculate(parse_detail_text(taper(0.8727), "needle.xml"), fixed_mesh());
    FAIL("a 0.01° tip was meshed");
  } catch (const InputError& e) {
    const std::string message = e.what();
    CHECK(message.find("region edges meet at 0.0100° at (0, 200) mm") != std::string::npos);
    CHECK(message.find("Fix:") != std::string::npos);
  }
}

TEST_CASE("node estimate: the integral of 2/(√3 (0.6 h)²) over the domain, with thin triangles at their thickness (exact algebra)") {
  const double per_unit_area = 2.0 / (std::sqrt(3.0) * 0.36);
  // Uniform size field (no seeds): h = 0.05 everywhere on the unit square.
  const SizeField uniform({}, 0.05, 0.3);
  const std::vector<DomainTriangle> square = {{Point{0, 0}, Point{1, 0}, Point{1, 1}}, {Point{0, 0}, Point{1, 1}, Point{0, 1}}};
  CHECK(estimated_node_count(square, uniform, 1e9) == doctest::Approx(per_unit_area / (0.05 * 0.05)).epsilon(1e-12));
  // A 1 × 0.001 strip: each of its two triangles is 2·area/longest = 0.001/√(1 + 10⁻⁶) thick, and
  // filled with elements 1.25 times that.
  const std::vector<DomainTriangle> strip = {{Point{0, 0}, Point{1, 0}, Point{1, 0.001}}, {Point{0, 0}, Point{1, 0.001}, Point{0, 0.001}}};
  const double h = 1.25 * 0.001 / std::sqrt(1.0 + 1e-6);
  CHECK(estimated_node_count(strip, uniform, 1e9) == doctest::Approx(per_unit_area * 0.001 / (h * h)).epsilon(1e-9));
  // Counting stops once past the given bound.
  CHECK(estimated_node_count(strip, uniform, 100.0) > 100.0);
  CHECK(estimated_node_count(strip, uniform, 100.0) < per_unit_area * 0.001 / (h * h));
  // The same thin triangles drawn between points of one curve (no constrained side along them)
  // are filled at the size field's 0.05.
  const std::vector<DomainTriangle> fan = {{Point{0, 0}, Point{1, 0}, Point{1, 0.001}, false},
                                           {Point{0, 0}, Point{1, 0.001}, Point{0, 0.001}, false}};
  CHECK(estimated_node_count(fan, uniform, 1e9) == doctest::Approx(per_unit_area * 0.001 / (0.05 * 0.05)).epsilon(1e-9));
}

TEST_CASE("size field: the k-d tree search equals the minimum over all seeds (exact algebra)") {
  std::mt19937 random(7);
  std::uniform_real_distribution<double> where(0.0, 100.0), size(0.01, 5.0);
  std::vector<SizeSeed> seeds;
  for (int i = 0; i < 3000; ++i) seeds.push_back({{where(random), where(random)}, size(random)});
  const SizeField field(seeds, 4.0, 0.3);
  for (int q = 0; q < 2000; ++q) {
    const double x = where(random) * 1.2 - 10.0, y = where(random) * 1.2 - 10.0;
    double brute = 4.0;
    for (const SizeSeed& s : seeds)
      brute = std::min(brute, s.size + 0.3 * std::sqrt((x - s.at.x) * (x - s.at.x) + (y - s.at.y) * (y - s.at.y)));
    CHECK(field(x, y) == brute);
  }
}
