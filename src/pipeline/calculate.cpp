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

/// Solves one run for a unit temperature of every environment (one factorisation), then forms
/// the design field by superposition: θ(x) = Σ_e θ_e · u_e(x).
Run solve_run(const CrossSection& section, const TriMesh& mesh, std::vector<double> conductivity,
              std::vector<double> resistance, const SolveOptions& options) {
  Run run;
  run.problem.triangle_conductivity = std::move(conductivity);
  run.problem.surface_resistance = std::move(resistance);
  const std::size_t n_env = section.environments.size();
  std::vector<LoadCase> unit_loads(n_env, LoadCase(section.surfaces.size(), 0.0));
  for (std::size_t s = 0; s < section.surfaces.size(); ++s) {
    unit_loads[section.surfaces[s].environment][s] = 1.0;
    run.load.push_back(section.environments[section.surfaces[s].environment].temperature);
  }
  Solution solution = solve_temperatures(mesh, run.problem, unit_loads, options);
  run.info = solution.info;
  if (!run.info.ok) throw std::runtime_error("numerical failure: " + run.info.message);
  run.unit_temperature = std::move(solution.temperature);
  run.temperature.assign(mesh.n_points(), 0.0);
  for (std::size_t e = 0; e < n_env; ++e) {
    const double theta = section.environments[e].temperature;
    for (int i = 0; i < mesh.n_points(); ++i) run.temperature[i] += theta * run.unit_temperature[e][i];
  }
  return run;
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

  tell("solving the heat-loss run (" + std::to_string(calc.mesh.n_points()) + " nodes)");
  start = std::chrono::steady_clock::now();
  const std::vector<double> conductivity = triangle_conductivities(section, calc.mesh);
  std::vector<double> heat_loss_rs, temperature_rs;
  for (const Surface& s : section.surfaces) {
    heat_loss_rs.push_back(s.resistance);
    temperature_rs.push_back(s.temperature_run_resistance);
  }
  calc.heat_loss = solve_run(section, calc.mesh, conductivity, heat_loss_rs, options.solve);
  if (temperature_rs == heat_loss_rs) {
    calc.surface_temperature = calc.heat_loss;  // same resistances: the same field
  } else {
    tell("solving the surface-temperature run");
    calc.surface_temperature = solve_run(section, calc.mesh, conductivity, temperature_rs, options.solve);
  }
  calc.timings.solve_seconds = seconds_since(start);

  tell("evaluating");
  start = std::chrono::steady_clock::now();
  for (Run* run : {&calc.heat_loss, &calc.surface_temperature})
    run->field = evaluate_field(section, calc.mesh, run->problem, run->temperature, run->load);
  calc.junction = junction_results(section, calc.mesh, calc.heat_loss, calc.surface_temperature);
  calc.timings.results_seconds = seconds_since(start);
  return calc;
}

}  // namespace edgeflux
