// The JSON results and the VTK document of a small solved wall, read back and compared with the
// calculation they were written from.
#include <doctest/doctest.h>
#include <nlohmann/json.hpp>

#include <sstream>

#include "../support/fixtures.h"
#include "../test_support.h"
#include "report/json_results.h"
#include "report/vtu_writer.h"

using namespace edgeflux;

namespace {
const Calculation& wall_calculation() {
  static const CrossSection section = parse_detail_text(test::detail_xml(test::two_layer_wall_body()), "wall.xml");
  static const Calculation calc = calculate(section, {});
  return calc;
}
}  // namespace

TEST_CASE("JSON results hold the calculation's numbers to the last digit (common practice: a lossless export)") {
  const CrossSection section = parse_detail_text(test::detail_xml(test::two_layer_wall_body()), "wall.xml");
  const Calculation& calc = wall_calculation();
  const std::string text = json_results(section, calc);
  REQUIRE(!text.empty());
  CHECK(text.back() == '\n');
  const auto j = nlohmann::json::parse(text);
  CHECK(j["format"] == "edgeflux-results");
  CHECK(j["format_version"] == 1);
  CHECK(j["coupling_coefficient_2d_w_per_mk"].get<double>() == *calc.heat_loss.field.coupling_2d);
  REQUIRE(j["environments"].size() == 2);
  CHECK(j["mesh"]["nodes"].get<int>() == calc.mesh.n_points());
  CHECK(j["energy_balance"]["relative"].get<double>() == calc.heat_loss.field.balance.relative);
  CHECK(j["temperature_factor_frsi"].get<double>() == *calc.junction.temperature_factor);
  CHECK(!j["cautions"].empty());  // every output carries the cautions
}

TEST_CASE("VTK document: one value per node and per triangle, the temperatures as computed (exact round trip)") {
  const CrossSection section = parse_detail_text(test::detail_xml(test::two_layer_wall_body()), "wall.xml");
  const Calculation& calc = wall_calculation();
  const std::string vtu = vtu_document(section, calc);
  CHECK(vtu.find(fmt::format("NumberOfPoints=\"{}\" NumberOfCells=\"{}\"", calc.mesh.n_points(), calc.mesh.n_triangles())) !=
        std::string::npos);
  // The heat-loss temperatures, written with 17 significant digits, read back bit for bit.
  const std::string name = "Name=\"temperature_heat_loss_run_c\"";
  auto at = vtu.find(name);
  REQUIRE(at != std::string::npos);
  at = vtu.find('\n', at) + 1;
  std::istringstream values(vtu.substr(at));
  for (int k = 0; k < calc.mesh.n_points(); ++k) {
    double v = 0.0;
    values >> v;
    CHECK(v == calc.heat_loss.temperature[k]);
  }
  std::string next;
  values >> next;
  CHECK(next == "</DataArray>");
}
