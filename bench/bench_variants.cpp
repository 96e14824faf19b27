// Benchmark of variants that keep the geometry: a sweep of the balcony connector's λ over 50 values
// (details/balcony-slab-connector.xml, 0.05 … 0.5 W/(m·K)), solved from scratch one by one and as
// a batch that meshes and refines the first variant and solves the others on its meshes. Prints the
// time per variant of both, where a reused variant spends its time, and the largest difference of
// ψ between the two against the error bars. Run: build/bench_variants [--variants N] [--jobs N] [--solver cholesky|ldlt]
#include <fmt/format.h>

#include <algorithm>
#include <chrono>
#include <cmath>
#include <cstring>
#include <string>

#include "input/read_detail_file.h"
#include "pipeline/calculate.h"
#include "pipeline/variants.h"

using namespace edgeflux;

namespace {

double seconds_since(std::chrono::steady_clock::time_point start) {
  return std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
}

}  // namespace

int main(int argc, char** argv) {
  int n = 50, jobs = 1;
  LinearSolver linear_solver = LinearSolver::supernodal_cholesky;
  for (int i = 1; i + 1 < argc; ++i) {
    if (!std::strcmp(argv[i], "--solver") && !std::strcmp(argv[i + 1], "ldlt")) linear_solver = LinearSolver::simplicial_ldlt;
    if (!std::strcmp(argv[i], "--variants")) n = std::max(2, std::atoi(argv[i + 1]));
    if (!std::strcmp(argv[i], "--jobs")) jobs = std::max(1, std::atoi(argv[i + 1]));
  }
  const std::string file = std::string(EDGEFLUX_SOURCE_DIR) + "/details/balcony-slab-connector.xml";
  const ParameterRange range{"lambda_connector", 0.05, 0.5, n};

  CalculationOptions scratch;
  scratch.solve.solver = linear_solver;
  scratch.reuse_meshes = false;
  auto start = std::chrono::steady_clock::now();
  const auto own = run_sweep(file, {range}, scratch, jobs);
  const double scratch_seconds = seconds_since(start);

  CalculationOptions reuse;
  reuse.solve.solver = linear_solver;
  start = std::chrono::steady_clock::now();
  const auto shared = run_sweep(file, {range}, reuse, jobs);
  const double reuse_seconds = seconds_since(start);

  double worst_difference = 0.0, worst_bars = 0.0;
  int failed = 0;
  for (int i = 0; i < n; ++i) {
    if (!own[i].error.empty() || !shared[i].error.empty() || own[i].psi.empty() || shared[i].psi.empty()) {
      ++failed;
      continue;
    }
    const double difference = std::abs(own[i].psi[0].psi - shared[i].psi[0].psi);
    if (difference > worst_difference) {
      worst_difference = difference;
      worst_bars = own[i].psi_error[0] + shared[i].psi_error[0];
    }
  }

  // Where a reused variant spends its time: one variant on the first one's ladder, stage by stage.
  const CrossSection base = read_detail_file(file, {{"lambda_connector", 0.05}}, arc_tolerance_for(reuse.target));
  auto ladder = std::make_shared<MeshLadder>();
  calculate(base, reuse, ladder.get());
  LadderSolver solver(ladder, reuse.solve);
  double read_s = 0, factor_s = 0, solve_s = 0, assemble_s = 0, results_s = 0, total_s = 0;
  const int repeats = 20;
  for (int r = 0; r < repeats; ++r) {
    start = std::chrono::steady_clock::now();
    const CrossSection variant = read_detail_file(file, {{"lambda_connector", 0.3}}, arc_tolerance_for(reuse.target));
    read_s += seconds_since(start);
    const Calculation calc = calculate_on_ladder(variant, reuse, solver);
    total_s += seconds_since(start);
    // The per-level timings of the last level stand for all levels in proportion to their nodes.
    const double scale = [&] {
      double nodes = 0;
      for (const ConvergenceLevel& l : calc.convergence.levels) nodes += l.nodes;
      return nodes / calc.mesh.n_points();
    }();
    for (const Run* run : {&calc.heat_loss, &calc.surface_temperature}) {
      factor_s += scale * run->info.factorize_seconds;
      solve_s += scale * run->info.solve_seconds;
      assemble_s += scale * run->info.assemble_seconds;
    }
    results_s += scale * calc.timings.results_seconds;
  }

  fmt::print("λ sweep of the balcony connector: {} variants, {} job(s), {} levels in the ladder ({} nodes at the last)\n", n,
             jobs, ladder->levels.size(), ladder->levels.back().n_points());
  fmt::print("  from scratch   {:8.3f} s  {:8.4f} s per variant\n", scratch_seconds, scratch_seconds / n);
  fmt::print("  meshes reused  {:8.3f} s  {:8.4f} s per variant   ({:.2f}× less per variant)\n", reuse_seconds,
             reuse_seconds / n, scratch_seconds / reuse_seconds);
  fmt::print("  largest |Δψ| between the two: {:.5f} W/(m·K) (sum of their error bars there {:.5f}); failed variants: {}\n",
             worst_difference, worst_bars, failed);
  fmt::print("  one reused variant, {:.4f} s: reading {:.4f}, assembling {:.4f}, factorising {:.4f}, solving {:.4f}, "
             "results {:.4f} (estimated over its levels)\n",
             total_s / repeats, read_s / repeats, assemble_s / repeats, factor_s / repeats, solve_s / repeats,
             results_s / repeats);
  return failed == 0 ? 0 : 1;
}
