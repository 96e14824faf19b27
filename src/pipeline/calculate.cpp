// Runs the stages in order and times them.
#include "pipeline/calculate.h"

#include <chrono>
#include <stdexcept>

#include "solver/solve_temperatures.h"

namespace edgeflux {
namespace {
double seconds_since(std::chrono::steady_clock::time_point start) {
  return std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
}
}  // namespace

std::vector<double> triangle_conductivities(const CrossSection& section, const TriMesh& mesh) {
  std::vector<double> conductivity(mesh.n_triangles());
  for (int t = 0; t < mesh.n_triangles(); ++t)
    conductivity[t] = section.materials[mesh.triangle_material[t]].conductivity;
  return conductivity;
}

Calculation calculate(const CrossSection& section, const CalculationOptions& options) {
  auto tell = [&](const std::string& stage) { if (options.progress) options.progress(stage); };
  Calculation calc;
  MeshOptions mesh_options;
  mesh_options.density = options.density.value_or(section.mesh.density);
  mesh_options.mesher = options.mesher.value_or(section.mesh.mesher);

  tell("meshing");
  auto start = std::chrono::steady_clock::now();
  calc.mesh = mesh_cross_section(section, mesh_options);
  calc.timings.mesh_seconds = seconds_since(start);

  tell("solving");
  start = std::chrono::steady_clock::now();
  calc.problem.triangle_conductivity = triangle_conductivities(section, calc.mesh);
  for (const Surface& s : section.surfaces) {
    calc.problem.surface_resistance.push_back(s.resistance);
    calc.load.push_back(section.environments[s.environment].temperature);
  }
  calc.solution = solve_temperatures(calc.mesh, calc.problem, {calc.load}, options.solve);
  calc.timings.solve_seconds = seconds_since(start);
  if (!calc.solution.info.ok) throw std::runtime_error("numerical failure: " + calc.solution.info.message);

  tell("evaluating");
  start = std::chrono::steady_clock::now();
  calc.field = evaluate_field(section, calc.mesh, calc.problem, calc.solution.temperature[0], calc.load);
  calc.timings.results_seconds = seconds_since(start);
  return calc;
}

}  // namespace edgeflux
