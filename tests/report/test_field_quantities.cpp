// The walk along the interior surfaces.
#include <doctest/doctest.h>

#include <cmath>
#include <set>

#include "../test_support.h"
#include "report/field_quantities.h"

using namespace edgeflux;

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
