// Heat-flux density per triangle and the walk along the interior surfaces.
#include <doctest/doctest.h>

#include <cmath>
#include <filesystem>
#include <fstream>
#include <set>

#include <unistd.h>

#include "../test_support.h"
#include "report/field_quantities.h"
#include "solver/error_indicator.h"

namespace fs = std::filesystem;
using namespace edgeflux;

namespace {

// The two-layer wall of tests/app/test_bad_input.cpp: 200 mm brick (λ 0.8), 100 mm EPS (λ 0.035),
// 1 m high, Rsi 0.13 inside (ISO 6946 horizontal), Rse 0.04, 20 °C inside, −5 °C outside.
const char* wall = R"(
  <materials>
    <material id="brick" conductivity="0.8" source="test value"/>
    <material id="eps" conductivity="0.035" source="test value"/>
  </materials>
  <regions>
    <rectangle name="brick" material="brick" from="0,0" to="200,1000"/>
    <rectangle name="insulation" material="eps" from="200,0" to="300,1000"/>
  </regions>
  <environments>
    <environment id="in" temperature="20" side="interior"/>
    <environment id="out" temperature="-5" side="exterior"/>
  </environments>
  <boundaries>
    <surface name="inner face" environment="in" resistance="rsi-horizontal" path="0,1000 0,0"/>
    <surface name="outer face" environment="out" resistance="rse" path="300,0 300,1000"/>
  </boundaries>)";

Calculation solve_text(const std::string& body) {
  const fs::path file = fs::temp_directory_path() / ("edgeflux-fq-" + std::to_string(::getpid()) + ".xml");
  std::ofstream(file) << test::detail_xml(body);
  Calculation calc = calculate(read_detail_file(file.string()), {});
  fs::remove(file);
  return calc;
}

}  // namespace

TEST_CASE("heat-flux density of a layered wall is the 1D flux in every triangle") {
  const Calculation calc = solve_text(wall);
  // 1D layered wall: q = ΔT / (Rsi + Σ d/λ + Rse) (exact for the finite-volume solution,
  // which is linear in each layer).
  const double q_1d = 25.0 / (0.13 + 0.2 / 0.8 + 0.1 / 0.035 + 0.04);
  const auto flux = triangle_heat_flux(calc.mesh, calc.heat_loss.problem.triangle_conductivity, calc.heat_loss.temperature);
  REQUIRE(flux.size() == calc.mesh.triangles.size());
  for (const Point& q : flux) {
    CHECK(q.x == doctest::Approx(q_1d).epsilon(1e-9));  // heat flows from x = 0 (inside) to x = 0.3 (outside)
    CHECK(std::abs(q.y) < 1e-9 * q_1d);
  }
  // The same flux over the 1 m height is the heat flow the solver reports.
  CHECK(calc.heat_loss.field.environments[0].heat_flow == doctest::Approx(q_1d * 1.0).epsilon(1e-9));
}

TEST_CASE("the interior surface walk covers every interior node once, in order along the surface") {
  const CrossSection section = read_detail_file(test::source_path("examples/intermediate-floor.xml"));
  const Calculation calc = calculate(section, {});
  const auto walk = interior_surface_walk(section, calc.mesh);
  REQUIRE_FALSE(walk.empty());
  std::set<int> expected, seen;
  for (const BoundaryEdge& e : calc.mesh.boundary_edges)
    if (e.surface >= 0 && section.environments[section.surfaces[e.surface].environment].side == Side::interior)
      expected.insert(e.a), expected.insert(e.b);
  for (const SurfaceSample& s : walk) {
    CHECK(seen.insert(s.node).second);  // each node once
    CHECK(section.environments[section.surfaces[s.surface].environment].side == Side::interior);
  }
  CHECK(seen == expected);
  // The demo's interior surfaces form two stretches, wall face + ceiling below the slab and
  // floor + wall face above it (the slab's end is a cut-off plane).
  CHECK(walk.back().chain == 1);
  CHECK(section.surfaces[walk.front().surface].name == "lower wall face");
  for (std::size_t i = 1; i < walk.size(); ++i) {
    CHECK(walk[i].distance >= walk[i - 1].distance);
    if (walk[i].chain == walk[i - 1].chain)  // consecutive nodes are neighbours on the boundary
      CHECK(walk[i].distance - walk[i - 1].distance == doctest::Approx(distance(walk[i].at, walk[i - 1].at)).epsilon(1e-12));
  }
  // Total length of the interior surfaces of the demo: 1.2 + 1.16 + 1.16 + 1.2 m (from the file).
  CHECK(walk.back().distance == doctest::Approx(1.2 + 1.16 + 1.16 + 1.2).epsilon(1e-12));
}
