// The parametric junction library in details/: every detail solves with a closed energy balance,
// and the physical trends a consultant expects hold.
#include <doctest/doctest.h>

#include <cmath>
#include <filesystem>

#include "../test_support.h"

using namespace edgeflux;

namespace {
Calculation solve_detail(const std::string& name, const ParameterOverrides& overrides = {}) {
  return calculate(read_detail_file(test::source_path("details/" + name), overrides), {});
}
double psi(const Calculation& calc, DimensionSystem system) {
  for (const PsiValue& p : calc.junction.psi)
    if (p.system == system) return p.psi;
  throw std::runtime_error("no ψ in that system");
}
}  // namespace

TEST_CASE("every detail in details/ solves, converges and closes its energy balance (ISO 10211 criterion 1e-4)") {
  namespace fs = std::filesystem;
  int count = 0;
  for (const auto& entry : fs::directory_iterator(test::source_path("details"))) {
    if (entry.path().extension() != ".xml") continue;
    ++count;
    CAPTURE(entry.path().filename().string());
    const Calculation calc = calculate(read_detail_file(entry.path().string()), {});
    CHECK(std::abs(calc.heat_loss.field.balance.relative) < 1e-4);
    CHECK(calc.convergence.target_met);
    CHECK(!calc.junction.psi.empty());
    REQUIRE(calc.junction.temperature_factor);
    CHECK(*calc.junction.temperature_factor > 0.0);
    CHECK(*calc.junction.temperature_factor < 1.0);
    CHECK(!calc.junction.moisture.empty());
    for (const std::string& w : calc.junction.warnings) CHECK_MESSAGE(w.find("not trustworthy") == std::string::npos, w);
  }
  CHECK(count >= 8);
}

TEST_CASE("balcony: ψ falls as the connector's λ falls, and the continuous slab is far worse (physical trend)") {
  const double continuous = psi(solve_detail("balcony-slab-continuous.xml"), DimensionSystem::external);
  double previous = continuous;
  for (double lambda : {0.5, 0.15, 0.05}) {
    const double value = psi(solve_detail("balcony-slab-connector.xml", {{"lambda_connector", lambda}}), DimensionSystem::external);
    CAPTURE(lambda);
    CHECK(value < previous);
    previous = value;
  }
  CHECK(continuous > 0.3);  // a concrete slab through the insulation: a major bridge (common practice)
}

TEST_CASE("intermediate floor: ψ with internal insulation exceeds ψ with external insulation (physical trend)") {
  const double external = psi(solve_detail("intermediate-floor-external-insulation.xml"), DimensionSystem::external);
  const double internal = psi(solve_detail("intermediate-floor-internal-insulation.xml"), DimensionSystem::external);
  CHECK(internal > external + 0.1);
}

TEST_CASE("balcony with connector: fRsi rises with the insulation thickness where the bridge is interrupted") {
  const Calculation thin = solve_detail("balcony-slab-connector.xml", {{"insulation_thickness", 100}});
  const Calculation thick = solve_detail("balcony-slab-connector.xml", {{"insulation_thickness", 200}});
  CHECK(*thick.junction.temperature_factor > *thin.junction.temperature_factor);
}

TEST_CASE("external corner: ψe < 0 < ψi and ψi − ψe = 2·U·d (ISO 14683 relation for a corner of equal walls)") {
  const Calculation calc = solve_detail("external-wall-corner.xml");
  const double e = psi(calc, DimensionSystem::external), i = psi(calc, DimensionSystem::internal);
  CHECK(e < 0.0);
  CHECK(i > 0.0);
  const FlankingResult& f = calc.junction.flanking.at(0);
  double thickness = 0.0;
  for (const FlankingLayer& l : f.layers) thickness += l.thickness;
  CHECK(i - e == doctest::Approx(2.0 * f.u_value * thickness).epsilon(1e-9));
}
