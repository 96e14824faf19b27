// Runs the stages in order, refines the mesh until the results are accurate enough, and times it.
#include "pipeline/calculate.h"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <chrono>
#include <numeric>
#include <stdexcept>

#include "core/process_memory.h"
#include "geometry/planar_subdivision.h"
#include "solver/error_indicator.h"
#include "solver/solve_temperatures.h"
#include "mesh/refine_mesh.h"
#include "physics/surface_resistance.h"

namespace edgeflux {
namespace {

double seconds_since(std::chrono::steady_clock::time_point start) {
  return std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
}

/// Solves one run for a unit temperature of every environment (one factorisation), then forms
/// the design field by superposition: θ(x) = Σ_e θ_e · u_e(x).
Run solve_run(const CrossSection& section, const TriMesh& mesh, SteadyConduction& conduction,
              const std::vector<double>& conductivity, std::vector<double> resistance) {
  Run run;
  run.problem.triangle_conductivity = conductivity;
  run.problem.surface_resistance = std::move(resistance);
  const std::size_t n_env = section.environments.size();
  std::vector<LoadCase> unit_loads(n_env, LoadCase(section.surfaces.size(), 0.0));
  for (std::size_t s = 0; s < section.surfaces.size(); ++s) {
    unit_loads[section.surfaces[s].environment][s] = 1.0;
    run.load.push_back(section.environments[section.surfaces[s].environment].temperature);
  }
  Solution solution = conduction.solve(run.problem.surface_resistance, unit_loads);
  run.info = solution.info;
  if (!run.info.ok && run.info.out_of_memory) throw std::bad_alloc();
  if (!run.info.ok) throw std::runtime_error("numerical failure: " + run.info.message);
  run.unit_temperature = std::move(solution.temperature);
  run.temperature.assign(mesh.n_points(), 0.0);
  for (std::size_t e = 0; e < n_env; ++e) {
    const double theta = section.environments[e].temperature;
    for (int i = 0; i < mesh.n_points(); ++i) run.temperature[i] += theta * run.unit_temperature[e][i];
  }
  return run;
}

ConvergenceLevel level_record(const Calculation& calc, double seconds) {
  ConvergenceLevel level;
  level.nodes = calc.mesh.n_points();
  level.seconds = seconds;
  for (const EnvironmentFlow& e : calc.heat_loss.field.environments) {
    level.heat_flows.push_back(e.heat_flow);
    level.sum_abs_heat_flow += std::abs(e.heat_flow);
  }
  level.coupling_2d = calc.heat_loss.field.coupling_2d;
  for (const PsiValue& p : calc.junction.psi) level.psi.push_back(p.psi);
  if (calc.junction.min_interior_surface) level.min_surface_temperature = calc.junction.min_interior_surface->temperature;
  for (const ProbeReading& p : calc.heat_loss.field.probes) level.probes.push_back(p.temperature);
  return level;
}

/// Marks the quarter of the triangles with the largest error indicator (both runs, each scaled by
/// its total, so heat flows and surface temperatures both drive the refinement). Ties go to the
/// lower index, so marking is deterministic.
std::vector<char> mark_for_refinement(const Calculation& calc) {
  const int n = calc.mesh.n_triangles();
  std::vector<double> eta(n, 0.0);
  // The same field twice (no interior surface, or the same resistances) counts once.
  const bool same_field = calc.surface_temperature.problem.surface_resistance == calc.heat_loss.problem.surface_resistance;
  for (const Run* run : {&calc.heat_loss, &calc.surface_temperature}) {
    if (same_field && run == &calc.surface_temperature) break;
    const std::vector<double> part = flux_jump_indicator(calc.mesh, run->problem, run->temperature, run->load);
    const double total = std::accumulate(part.begin(), part.end(), 0.0);
    if (total > 0.0)
      for (int t = 0; t < n; ++t) eta[t] += part[t] / total;
  }
  std::vector<int> order(n);
  std::iota(order.begin(), order.end(), 0);
  const int n_marked = std::max(1, n / 4);
  std::partial_sort(order.begin(), order.begin() + n_marked, order.end(),
                    [&](int a, int b) { return eta[a] != eta[b] ? eta[a] > eta[b] : a < b; });
  std::vector<char> marked(n, 0);
  for (int i = 0; i < n_marked; ++i) marked[order[i]] = 1;
  return marked;
}

/// A boundary node on two fixed-temperature surfaces at different temperatures, if any.
std::optional<Point> fixed_temperature_jump(const CrossSection& section, const TriMesh& mesh) {
  std::vector<double> resistance;
  for (const Surface& s : section.surfaces) resistance.push_back(s.resistance);
  const auto fixed = fixed_surfaces_per_node(mesh, resistance);
  for (int i = 0; i < mesh.n_points(); ++i)
    for (int s : fixed[i])
      if (section.environments[section.surfaces[s].environment].temperature !=
          section.environments[section.surfaces[fixed[i][0]].environment].temperature)
        return mesh.points[i];
  return std::nullopt;
}

/// A field that breaks a law of steady conduction is no result: a heat balance that does not close
/// (ISO 10211 asks for Σ Φ / (½ Σ |Φ|) < 10⁻⁴) or a temperature outside the range of the
/// environments (the maximum principle). Either ends the run with the cause, never a report.
void require_physical_field(const CrossSection& section, const Calculation& calc) {
  const double balance = calc.heat_loss.field.balance.relative;
  if (!(std::abs(balance) < 1e-4))
    throw std::runtime_error(fmt::format(
        "the energy balance does not close on the mesh of {} nodes: Σ Φ / (½ Σ |Φ|) = {:.2e}, above the ISO 10211 "
        "criterion of 1e-4, so no result is given", calc.mesh.n_points(), balance));
  double coldest = 1e300, warmest = -1e300;
  for (const Surface& s : section.surfaces) {
    coldest = std::min(coldest, section.environments[s.environment].temperature);
    warmest = std::max(warmest, section.environments[s.environment].temperature);
  }
  // The linear-element scheme keeps the maximum principle on Delaunay meshes; across material
  // interfaces a small overshoot is possible, far below this slack (measured: none above 1e-9 of
  // the temperature range on every shipped detail and reference case, turned or not).
  const double slack = 1e-6 * std::max(1.0, warmest - coldest);
  for (const Run* run : {&calc.heat_loss, &calc.surface_temperature}) {
    const auto [lo, hi] = std::minmax_element(run->temperature.begin(), run->temperature.end());
    if (*lo < coldest - slack || *hi > warmest + slack || !std::isfinite(*lo) || !std::isfinite(*hi))
      throw std::runtime_error(fmt::format(
          "computed temperatures {:.6g} … {:.6g} °C leave the range of the boundary temperatures {:.6g} … {:.6g} °C "
          "on the mesh of {} nodes, which steady conduction cannot do, so no result is given",
          *lo, *hi, coldest, warmest, calc.mesh.n_points()));
  }
}

}  // namespace

std::vector<double> triangle_conductivities(const CrossSection& section, const TriMesh& mesh) {
  std::vector<double> conductivity(mesh.n_triangles());
  for (int t = 0; t < mesh.n_triangles(); ++t)
    conductivity[t] = section.materials[mesh.triangle_material[t]].conductivity;
  return conductivity;
}

Calculation calculate_on_mesh(const CrossSection& section, TriMesh mesh, const CalculationOptions& options,
                              SteadyConduction* conduction) {
  Calculation calc;
  calc.mesh = std::move(mesh);
  auto start = std::chrono::steady_clock::now();
  const std::vector<double> conductivity = triangle_conductivities(section, calc.mesh);
  std::vector<double> heat_loss_rs, temperature_rs;
  for (const Surface& s : section.surfaces) {
    heat_loss_rs.push_back(s.resistance);
    temperature_rs.push_back(temperature_run_resistance(section, s));
  }
  std::optional<SteadyConduction> own;
  if (!conduction) conduction = &own.emplace(calc.mesh, conductivity, options.solve);
  calc.heat_loss = solve_run(section, calc.mesh, *conduction, conductivity, heat_loss_rs);
  const bool same_field = temperature_rs == heat_loss_rs;
  if (!same_field) calc.surface_temperature = solve_run(section, calc.mesh, *conduction, conductivity, temperature_rs);
  calc.timings.solve_seconds = seconds_since(start);

  start = std::chrono::steady_clock::now();
  calc.heat_loss.field = evaluate_field(section, calc.mesh, calc.heat_loss.problem, calc.heat_loss.temperature, calc.heat_loss.load);
  if (same_field)
    calc.surface_temperature = calc.heat_loss;  // same resistances: the same field
  else
    calc.surface_temperature.field = evaluate_field(section, calc.mesh, calc.surface_temperature.problem,
                                                    calc.surface_temperature.temperature, calc.surface_temperature.load);
  calc.junction = junction_results(section, calc.mesh, calc.heat_loss, calc.surface_temperature);
  calc.timings.results_seconds = seconds_since(start);
  if (options.sensitivities) {
    start = std::chrono::steady_clock::now();
    // The adjoint of θsi,min: the surface-temperature run's response to a unit source at its node,
    // with the factorisation that run left behind.
    std::vector<double> adjoint;
    if (calc.junction.min_interior_surface)
      if (const int node = min_surface_node(calc.mesh, *calc.junction.min_interior_surface); node >= 0) {
        std::vector<double> source(calc.mesh.n_points(), 0.0);
        source[node] = 1.0;
        adjoint = conduction->solve_sources(temperature_rs, {source}).front();
      }
    calc.sensitivities = sensitivities(section, calc.mesh, calc.heat_loss, calc.surface_temperature, calc.junction, adjoint);
    calc.sensitivities->seconds = seconds_since(start);
  }
  return calc;
}

LadderSolver::LadderSolver(std::shared_ptr<const MeshLadder> ladder, SolveOptions options)
    : ladder_(std::move(ladder)), options_(options), conduction_(ladder_->levels.size()) {}

SteadyConduction& LadderSolver::conduction(std::size_t level, const std::vector<double>& triangle_conductivity) {
  std::unique_ptr<SteadyConduction>& c = conduction_.at(level);
  // Always through set_conductivity, so a variant's matrix is rounded the same way whichever
  // worker solves it (results do not depend on the number of threads).
  if (!c) c = std::make_unique<SteadyConduction>(ladder_->levels[level], triangle_conductivity, options_);
  c->set_conductivity(triangle_conductivity);
  return *c;
}

namespace {

/// The mesh settings of this run, resolved once: the command line's overrides over the file's.
MeshOptions resolved_mesh_options(const CrossSection& section, const CalculationOptions& options) {
  MeshOptions mesh_options;
  mesh_options.density = options.density.value_or(section.mesh.density);
  mesh_options.mesher = options.mesher.value_or(section.mesh.mesher);
  mesh_options.max_nodes = static_cast<std::size_t>(options.max_nodes);
  return mesh_options;
}

/// The progress line of a solved level.
std::string level_line(int level, const Calculation& calc, const Convergence& convergence) {
  std::string line = fmt::format("level {}: {} nodes", level + 1, calc.mesh.n_points());
  if (convergence.coupling_2d)
    line += fmt::format(", L2D = {:.5f} ± {:.5f} W/(m·K)", convergence.coupling_2d->value, convergence.coupling_2d->error);
  if (convergence.min_surface_temperature)
    line += fmt::format(", θsi,min ± {:.4f} K", convergence.min_surface_temperature->error);
  return line;
}

/// Why the refinement ends after this level (setting target_met when the target is reached), or
/// nothing when it goes on.
std::optional<std::string> reason_to_stop(Convergence& convergence, const CalculationOptions& options, int level) {
  if (!options.adaptive) return "fixed mesh (no refinement asked for)";
  if (meets_target(convergence)) {
    convergence.target_met = true;
    return "target accuracy reached";
  }
  if (level + 1 >= options.max_levels)
    return fmt::format("stopped after {} levels before reaching the target", options.max_levels);
  return std::nullopt;
}

/// The next, finer mesh, or why there is none (a mesh past the node limit ends the refinement,
/// not the run: the levels so far carry their error bars). Adaptively on Delaunay meshes; a grid
/// refines everywhere (density × 1.5). Where the heat flux is singular the indicator would spend
/// every new node at the singular point and leave the temperatures elsewhere unchanged level to
/// level, which hides their error: there every triangle is split into four instead, so the
/// estimates see the whole field converge.
struct NextMesh {
  std::optional<TriMesh> mesh;
  std::string stop_reason;  ///< when there is no mesh
};
NextMesh next_mesh(const CrossSection& section, const PlanarSubdivision& subdivision, const Calculation& calc,
                   const Convergence& convergence, const CalculationOptions& options, MeshOptions& mesh_options) {
  TriMesh mesh;
  if (mesh_options.mesher == MeshSettings::Mesher::grid) {
    mesh_options.density *= 1.5;
    mesh = mesh_cross_section(section, subdivision, mesh_options);
  } else if (convergence.singular_heat_flow) {
    mesh = subdivide_mesh(calc.mesh);
  } else {
    try {
      mesh = refine_mesh(section, calc.mesh, mark_for_refinement(calc), static_cast<std::size_t>(options.max_nodes));
    } catch (const MeshLimitError& e) {
      return {std::nullopt, "stopped before reaching the target: " + e.reason()};
    }
  }
  if (mesh.n_points() > options.max_nodes)
    return {std::nullopt, fmt::format("stopped before reaching the target: the next mesh would exceed the limit of {} nodes",
                                      options.max_nodes)};
  return {std::move(mesh), ""};
}

/// The warnings of the whole run: what the reader and the geometry stage noticed about the drawing
/// first, then a singular heat flux and a target not reached.
void add_run_warnings(Calculation& calc, const CrossSection& section, const std::vector<std::string>& geometry_warnings,
                      const std::optional<Point>& jump, const CalculationOptions& options) {
  if (jump)
    calc.junction.warnings.push_back(fmt::format(
        "two fixed temperatures meet at {}: the exact heat flux there is infinite, so the heat flows grow slowly "
        "without bound as the mesh is refined; they are given for the final mesh only and the refinement targets "
        "the temperatures", section.format_point(*jump)));
  if (options.adaptive && !calc.convergence.target_met)
    calc.junction.warnings.push_back("the mesh refinement did not reach the accuracy target (" + calc.convergence.stop_reason +
                                     "); the error bars show the accuracy reached");
  std::vector<std::string> drawing = section.warnings;
  drawing.insert(drawing.end(), geometry_warnings.begin(), geometry_warnings.end());
  calc.junction.warnings.insert(calc.junction.warnings.begin(), drawing.begin(), drawing.end());
}

/// Where each level's mesh comes from: meshed and refined here, or taken from a ladder of the same
/// geometry (and refined on from its last mesh when it runs out). The planar subdivision is made
/// only when a mesh has to be made.
class LevelMeshes {
 public:
  LevelMeshes(const CrossSection& section, const CalculationOptions& options, LadderSolver* ladder)
      : section_(section), options_(options), ladder_(ladder), mesh_options_(resolved_mesh_options(section, options)) {
    if (ladder_) {
      geometry_warnings_ = ladder_->ladder().geometry_warnings;
      jump_ = ladder_->ladder().fixed_temperature_jump;
    }
  }

  TriMesh first() {
    if (ladder_ && !ladder_->ladder().levels.empty()) return ladder_->ladder().levels.front();
    TriMesh mesh = mesh_cross_section(section_, subdivision(), mesh_options_);
    jump_ = fixed_temperature_jump(section_, mesh);
    return mesh;
  }

  NextMesh next(std::size_t level, const Calculation& calc, const Convergence& convergence) {
    if (ladder_ && level + 1 < ladder_->ladder().levels.size()) {
      if (mesh_options_.mesher == MeshSettings::Mesher::grid) mesh_options_.density *= 1.5;  // in step with the ladder
      return {ladder_->ladder().levels[level + 1], ""};
    }
    return next_mesh(section_, subdivision(), calc, convergence, options_, mesh_options_);
  }

  /// The reused conduction of this level, with the section's conductivities, or null (a mesh of its own).
  SteadyConduction* conduction(std::size_t level, const TriMesh& mesh) {
    if (!ladder_ || level >= ladder_->ladder().levels.size()) return nullptr;
    return &ladder_->conduction(level, triangle_conductivities(section_, mesh));
  }

  const std::optional<Point>& jump() const { return jump_; }
  const std::vector<std::string>& geometry_warnings() const { return geometry_warnings_; }

 private:
  const PlanarSubdivision& subdivision() {
    if (!subdivision_) {
      subdivision_ = planar_subdivision(section_);
      if (!ladder_) geometry_warnings_ = subdivision_->warnings;
    }
    return *subdivision_;
  }

  const CrossSection& section_;
  const CalculationOptions& options_;
  LadderSolver* ladder_;
  MeshOptions mesh_options_;
  std::optional<PlanarSubdivision> subdivision_;
  std::vector<std::string> geometry_warnings_;
  std::optional<Point> jump_;
};

Calculation refine_until_accurate(const CrossSection& section, const CalculationOptions& options, LadderSolver* ladder,
                                  MeshLadder* record) {
  const auto overall = std::chrono::steady_clock::now();
  prepare_process_memory();
  Convergence convergence;
  convergence.adaptive = options.adaptive;
  convergence.target = options.target;

  auto start = std::chrono::steady_clock::now();
  LevelMeshes meshes(section, options, ladder);
  TriMesh mesh = meshes.first();
  double mesh_seconds = seconds_since(start);
  convergence.singular_heat_flow = meshes.jump().has_value();

  Calculation calc;
  for (int level = 0;; ++level) {
    prepare_process_memory();  // huge pages for what the heap gained in the last level
    if (mesh.n_points() > options.max_nodes)
      throw_input_error({section.file, 0}, "mesh", fmt::format("{} nodes exceed the limit of {}", mesh.n_points(), options.max_nodes),
                        "lower the density or the accuracy target");
    const auto level_start = std::chrono::steady_clock::now();
    const int nodes = mesh.n_points();
    if (record) record->levels.push_back(mesh);
    try {
      SteadyConduction* reused = meshes.conduction(static_cast<std::size_t>(level), mesh);
      calc = calculate_on_mesh(section, std::move(mesh), options, reused);
    } catch (const std::bad_alloc&) {
      // The levels solved so far keep their results and error bars; without one, nothing is trusted.
      if (level == 0)
        throw std::runtime_error(fmt::format("the memory ran out while solving the first mesh ({} nodes): lower the "
                                             "density, or run on a machine with more memory", nodes));
      if (record) record->levels.pop_back();
      convergence.stop_reason = fmt::format("stopped before reaching the target: the memory ran out while solving the "
                                            "next mesh ({} nodes)", nodes);
      break;
    }
    require_physical_field(section, calc);
    calc.timings.mesh_seconds = mesh_seconds;
    convergence.levels.push_back(level_record(calc, mesh_seconds + seconds_since(level_start)));
    estimate_errors(convergence);
    if (options.progress) options.progress(level_line(level, calc, convergence));

    if (auto reason = reason_to_stop(convergence, options, level)) {
      convergence.stop_reason = *reason;
      break;
    }
    start = std::chrono::steady_clock::now();
    NextMesh next = meshes.next(static_cast<std::size_t>(level), calc, convergence);
    if (!next.mesh) {
      convergence.stop_reason = next.stop_reason;
      break;
    }
    mesh = std::move(*next.mesh);
    mesh_seconds = seconds_since(start);
  }
  calc.convergence = std::move(convergence);
  add_run_warnings(calc, section, meshes.geometry_warnings(), meshes.jump(), options);
  if (record) {
    record->geometry_warnings = meshes.geometry_warnings();
    record->fixed_temperature_jump = meshes.jump();
  }
  calc.total_seconds = seconds_since(overall);
  return calc;
}

}  // namespace

Calculation calculate(const CrossSection& section, const CalculationOptions& options, MeshLadder* record) {
  if (record) *record = MeshLadder{};
  return refine_until_accurate(section, options, nullptr, record);
}

Calculation calculate_on_ladder(const CrossSection& section, const CalculationOptions& options, LadderSolver& solver) {
  return refine_until_accurate(section, options, &solver, nullptr);
}

}  // namespace edgeflux
