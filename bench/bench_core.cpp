// Benchmark of the core calculation on ISO 10211 Case 2: nodes, mesh and solve time, peak memory
// and heat-flow error against the converged 9.4915 W/m, at the default density and at about
// 10^5 and 10^6 nodes. Run: build/bench_core [--mesher grid|delaunay] [--solver cholesky|ldlt|cg]
#include <fmt/format.h>
#include <sys/resource.h>

#include <chrono>
#include <cstring>
#include <string>

#include "input/read_detail_file.h"
#include "pipeline/calculate.h"

using namespace edgeflux;

int main(int argc, char** argv) {
  CalculationOptions options;
  options.mesher = MeshSettings::Mesher::delaunay;
  options.adaptive = false;  // one solve on the mesh of each density, not a refinement sequence
  for (int i = 1; i + 1 < argc; ++i) {
    if (!std::strcmp(argv[i], "--mesher")) options.mesher = !std::strcmp(argv[i + 1], "grid") ? MeshSettings::Mesher::grid : MeshSettings::Mesher::delaunay;
    if (!std::strcmp(argv[i], "--solver")) {
      const std::string s = argv[i + 1];
      options.solve.solver = s == "ldlt" ? LinearSolver::simplicial_ldlt : s == "cg" ? LinearSolver::conjugate_gradient : LinearSolver::supernodal_cholesky;
    }
  }
  const CrossSection section = read_detail_file(std::string(EDGEFLUX_SOURCE_DIR) + "/tests/reference/iso10211_case2.xml");
  fmt::print("ISO 10211 Case 2, {} mesher\n", options.mesher == MeshSettings::Mesher::grid ? "grid" : "delaunay");
  fmt::print("{:>8} {:>9} {:>9} {:>10} {:>10} {:>10} {:>10} {:>12} {:>10}\n", "density", "nodes", "mesh s", "assemble s",
             "factor s", "solve s", "total s", "peak MiB", "Φ error %");
  // Densities chosen so the node counts land near the default, 10^5 and 10^6 for this geometry.
  for (double density : {1.0, 10.0, 32.0}) {
    options.density = density;
    const auto start = std::chrono::steady_clock::now();
    const Calculation calc = calculate(section, options);
    const double total = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
    rusage usage{};
    getrusage(RUSAGE_SELF, &usage);
    const double error = 100.0 * (calc.heat_loss.field.environments[0].heat_flow - 9.4915) / 9.4915;
    const SolveInfo& info = calc.heat_loss.info;
    fmt::print("{:>8.1f} {:>9} {:>9.3f} {:>10.3f} {:>10.3f} {:>10.3f} {:>10.3f} {:>12.0f} {:>+10.4f}\n", density,
               calc.mesh.n_points(), calc.timings.mesh_seconds, info.assemble_seconds, info.factorize_seconds,
               info.solve_seconds, total, usage.ru_maxrss / 1024.0, error);
  }
  return 0;
}
