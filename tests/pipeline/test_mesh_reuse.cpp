// Variants that keep the geometry are solved on the meshes of the first: the same answers within the
// error bars, their own error estimates, and no reuse where the geometry differs.
#include <doctest/doctest.h>

#include <cmath>

#include "../test_support.h"
#include "input/read_detail_file.h"
#include "pipeline/calculate.h"
#include "pipeline/geometry_signature.h"
#include "pipeline/variants.h"

using namespace edgeflux;

TEST_CASE("the geometry signature ignores conductivities and sees thicknesses, temperatures and resistances") {
  const std::string file = test::source_path("details/balcony-slab-connector.xml");
  const std::string base = geometry_signature(read_detail_file(file));
  CHECK(geometry_signature(read_detail_file(file, {{"lambda_connector", 0.3}})) == base);
  CHECK(geometry_signature(read_detail_file(file, {{"lambda_insulation", 0.022}, {"lambda_slab", 2.3}})) == base);
  CHECK(geometry_signature(read_detail_file(file, {{"insulation_thickness", 160}})) != base);
  CHECK(geometry_signature(read_detail_file(file, {{"connector_thickness", 120}})) != base);

  CrossSection warmer = read_detail_file(file);
  warmer.environments[0].temperature += 1.0;
  CHECK(geometry_signature(warmer) != base);
  CrossSection other_rs = read_detail_file(file);
  other_rs.surfaces[0].resistance *= 1.5;
  CHECK(geometry_signature(other_rs) != base);
}

// Check values: the same calculation meshed on its own (exact comparison within the two error
// bars, since both estimate the distance to the same mesh-converged value).
TEST_CASE("a variant on another variant's meshes agrees with its own refinement within the error bars, and refines on "
          "where the ladder is not fine enough for it") {
  const std::string file = test::source_path("details/balcony-slab-connector.xml");
  CalculationOptions options;
  // The leader's insulating connector meets the target on three levels; a connector of concrete's λ
  // concentrates the heat flow and needs finer meshes than that ladder holds.
  const CrossSection leader = read_detail_file(file, {{"lambda_connector", 0.15}}, arc_tolerance_for(options.target));
  auto ladder = std::make_shared<MeshLadder>();
  const Calculation leader_calc = calculate(leader, options, ladder.get());
  REQUIRE(ladder->levels.size() == leader_calc.convergence.levels.size());
  CHECK(ladder->levels.back().n_points() == leader_calc.mesh.n_points());

  LadderSolver solver(ladder, options.solve);
  for (double lambda : {0.05, 0.15, 2.0}) {
    CAPTURE(lambda);
    const CrossSection variant = read_detail_file(file, {{"lambda_connector", lambda}}, arc_tolerance_for(options.target));
    const Calculation reused = calculate_on_ladder(variant, options, solver);
    const Calculation own = calculate(variant, options);
    REQUIRE(reused.convergence.target_met);
    REQUIRE(own.convergence.target_met);
    const double l2d_bars = reused.convergence.coupling_2d->error + own.convergence.coupling_2d->error;
    CHECK(std::abs(*reused.heat_loss.field.coupling_2d - *own.heat_loss.field.coupling_2d) <= l2d_bars);
    for (std::size_t i = 0; i < own.junction.psi.size(); ++i)
      CHECK(std::abs(reused.junction.psi[i].psi - own.junction.psi[i].psi) <=
            reused.convergence.psi[i].error + own.convergence.psi[i].error);
    CHECK(std::abs(reused.junction.min_interior_surface->temperature - own.junction.min_interior_surface->temperature) <=
          reused.convergence.min_surface_temperature->error + own.convergence.min_surface_temperature->error);
    // Its levels begin on the ladder's meshes.
    for (std::size_t level = 0; level < std::min(ladder->levels.size(), reused.convergence.levels.size()); ++level)
      CHECK(reused.convergence.levels[level].nodes == ladder->levels[level].n_points());
    if (lambda == 0.15) {  // the leader itself: the same numbers to rounding
      CHECK(*reused.heat_loss.field.coupling_2d == doctest::Approx(*leader_calc.heat_loss.field.coupling_2d).epsilon(1e-12));
      CHECK(reused.convergence.levels.size() == ladder->levels.size());
    }
    if (lambda == 2.0) CHECK(reused.convergence.levels.size() > ladder->levels.size());  // refined on
  }
}

TEST_CASE("a sweep solves the first variant's meshes for the others only where the geometry is the same") {
  const std::string file = test::source_path("details/balcony-slab-connector.xml");
  CalculationOptions options;
  const auto by_lambda = run_sweep(file, {{"lambda_connector", 0.1, 0.3, 3}}, options, 2);
  REQUIRE(by_lambda.size() == 3);
  CHECK(by_lambda[0].meshes_from.empty());
  CHECK(by_lambda[1].meshes_from == "lambda_connector = 0.1");
  CHECK(by_lambda[2].meshes_from == "lambda_connector = 0.1");
  const auto by_thickness = run_sweep(file, {{"connector_thickness", 60, 100, 2}}, options, 2);
  for (const VariantSummary& v : by_thickness) CHECK(v.meshes_from.empty());
  options.reuse_meshes = false;
  for (const VariantSummary& v : run_sweep(file, {{"lambda_connector", 0.1, 0.3, 2}}, options, 1)) CHECK(v.meshes_from.empty());
}
