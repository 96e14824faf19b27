// Parallel runs of independent calculations; each is deterministic, so the order of completion
// does not affect the results.
#include "pipeline/variants.h"

#include <fmt/format.h>

#include <algorithm>
#include <atomic>
#include <chrono>
#include <filesystem>
#include <fstream>
#include <map>
#include <memory>
#include <sstream>
#include <mutex>
#include <thread>

#include "core/sha256.h"
#include "pipeline/geometry_signature.h"
#include "solver/factorisation_runtime.h"
#include "solver/solve_temperatures.h"

namespace edgeflux {

std::vector<double> ParameterRange::values() const {
  std::vector<double> v;
  if (steps <= 1) return {from};
  for (int i = 0; i < steps; ++i) v.push_back(from + (to - from) * i / (steps - 1));
  return v;
}

VariantSummary summarise(const std::string& label, const std::string& file, const CrossSection& section,
                         const Calculation& calc) {
  VariantSummary v;
  v.label = label;
  v.file = file;
  v.title = section.title;
  v.coupling_2d = calc.heat_loss.field.coupling_2d;
  if (calc.convergence.coupling_2d) v.coupling_2d_error = calc.convergence.coupling_2d->error;
  v.psi = calc.junction.psi;
  for (std::size_t i = 0; i < v.psi.size(); ++i)
    v.psi_error.push_back(i < calc.convergence.psi.size() ? calc.convergence.psi[i].error : 0.0);
  if (calc.junction.min_interior_surface) v.min_surface_temperature = calc.junction.min_interior_surface->temperature;
  v.temperature_factor = calc.junction.temperature_factor;
  for (const MoistureResult& m : calc.junction.moisture)
    v.verdicts.push_back({m.kind, m.assessment.actual_temperature_factor, m.assessment.required_temperature_factor, m.assessment.criteria,
                          m.assessment.passes});
  v.carried_forward = section.carried_forward;
  if (calc.junction.climate) {
    const Climate& c = *calc.junction.climate;
    v.climate = fmt::format("{:.1f} °C and {} inside, {:.1f} °C outside{}{}", c.interior_temperature,
                            c.interior_relative_humidity ? fmt::format("{:.0f} % RH", 100 * *c.interior_relative_humidity)
                                                         : fmt::format("humidity class {}", c.humidity_class.value_or(0)),
                            c.exterior_temperature, c.rule == "none" ? "" : ", rule " + c.rule, calc.junction.climate_assumed ? " (assumed)" : "");
  }
  v.nodes = calc.mesh.n_points();
  v.seconds = calc.total_seconds;
  v.warnings = calc.junction.warnings;
  return v;
}

namespace {

/// Runs task(i, worker) for i in [0, n) on `jobs` threads; worker is the thread's number in [0, jobs).
int parallel_for(int n, int jobs, const std::function<void(int, int)>& task, const std::function<void()>& finished_one) {
  if (jobs <= 0) jobs = std::max(1u, std::thread::hardware_concurrency());
  jobs = std::min(jobs, std::max(n, 1));
  if (jobs > 1) pin_blas_to_one_thread();
  std::atomic<int> next{0};
  std::mutex report;
  auto worker = [&](int id) {
    for (int i; (i = next++) < n;) {
      task(i, id);
      if (finished_one) {
        std::lock_guard lock(report);
        finished_one();
      }
    }
  };
  std::vector<std::thread> threads;
  for (int j = 1; j < jobs; ++j) threads.emplace_back(worker, j);
  worker(0);
  for (std::thread& t : threads) t.join();
  return jobs;
}

/// One job of a batch on its way: the section read (or why not), and its geometry's signature.
struct PreparedJob {
  std::optional<CrossSection> section;
  std::string signature;
  std::string input_sha256;
  std::string error;
};

PreparedJob prepare(const VariantJob& job, const CalculationOptions& options) {
  PreparedJob p;
  try {
    p.section = read_detail_file(job.file, job.overrides, arc_tolerance_for(options.target));
    p.signature = geometry_signature(*p.section);
    std::ifstream in(job.file, std::ios::binary);
    std::ostringstream text;
    text << in.rdbuf();
    p.input_sha256 = sha256_hex(text.str());
  } catch (const std::exception& e) {
    p.error = e.what();
  }
  return p;
}

VariantSummary failed(const VariantJob& job, const std::string& error) {
  VariantSummary v;
  v.label = job.label;
  v.file = job.file;
  v.parameters = job.overrides;
  v.error = error;
  return v;
}

/// Solves one prepared job (on a ladder when given one, recording its own when asked) and summarises it.
VariantSummary solve_prepared(const VariantJob& job, const PreparedJob& prepared, const CalculationOptions& options,
                              std::size_t index, const CalculationHook& with_calculation, LadderSolver* ladder,
                              MeshLadder* record) {
  if (!prepared.section) return failed(job, prepared.error);
  try {
    const CrossSection& section = *prepared.section;
    CalculationOptions quiet = options;
    quiet.progress = nullptr;
    const Calculation calc = ladder ? calculate_on_ladder(section, quiet, *ladder) : calculate(section, quiet, record);
    if (with_calculation) with_calculation(index, section, calc);
    VariantSummary v = summarise(job.label, job.file, section, calc);
    v.parameters = job.overrides;
    v.input_sha256 = prepared.input_sha256;
    return v;
  } catch (const std::exception& e) {
    return failed(job, e.what());
  }
}

}  // namespace

std::vector<VariantSummary> run_variants(const std::vector<VariantJob>& batch, const CalculationOptions& options, int jobs,
                                         const std::function<void(int, int)>& progress, const CalculationHook& with_calculation) {
  const int n = static_cast<int>(batch.size());
  std::vector<PreparedJob> prepared(batch.size());
  parallel_for(n, jobs, [&](int i, int) { prepared[i] = prepare(batch[i], options); }, {});

  // The first job of each geometry leads: it is meshed and refined on its own, and the others of
  // its geometry are solved on its meshes. Leaders are fixed by job order, so the results do not
  // depend on the number of threads.
  std::map<std::string, int> leader_of;
  std::vector<int> leaders, followers;
  for (int i = 0; i < n; ++i) {
    if (!prepared[i].section) {
      leaders.push_back(i);  // nothing to solve; reported as failed
      continue;
    }
    const auto [at, inserted] = leader_of.emplace(prepared[i].signature, i);
    (inserted || !options.reuse_meshes ? leaders : followers).push_back(i);
  }

  std::vector<VariantSummary> results(batch.size());
  std::vector<std::shared_ptr<const MeshLadder>> ladders(batch.size());
  int done = 0;
  auto finished_one = [&] {
    if (progress) progress(++done, n);
  };
  parallel_for(static_cast<int>(leaders.size()), jobs, [&](int k, int) {
    const int i = leaders[k];
    auto ladder = std::make_shared<MeshLadder>();
    results[i] = solve_prepared(batch[i], prepared[i], options, static_cast<std::size_t>(i), with_calculation, nullptr,
                                options.reuse_meshes ? ladder.get() : nullptr);
    if (results[i].error.empty() && !ladder->levels.empty()) ladders[i] = std::move(ladder);
  }, finished_one);

  // One solver per worker and geometry, so each keeps its symbolic factorisations between variants.
  const int workers = std::max(1, jobs <= 0 ? static_cast<int>(std::max(1u, std::thread::hardware_concurrency())) : jobs);
  std::vector<std::map<int, LadderSolver>> solvers(workers);
  parallel_for(static_cast<int>(followers.size()), workers, [&](int k, int worker) {
    const int i = followers[k];
    const int leader = leader_of.at(prepared[i].signature);
    LadderSolver* solver = nullptr;
    if (ladders[leader]) {
      auto& mine = solvers[worker];
      solver = &mine.try_emplace(leader, ladders[leader], options.solve).first->second;
    }
    results[i] = solve_prepared(batch[i], prepared[i], options, static_cast<std::size_t>(i), with_calculation, solver, nullptr);
    if (solver) results[i].meshes_from = batch[leader].label;
  }, finished_one);
  return results;
}

std::vector<VariantSummary> run_sweep(const std::string& file, const std::vector<ParameterRange>& ranges,
                                      const CalculationOptions& options, int jobs,
                                      const std::function<void(int, int)>& progress) {
  std::vector<ParameterOverrides> combinations{{}};
  for (const ParameterRange& range : ranges) {
    std::vector<ParameterOverrides> next;
    for (const ParameterOverrides& base : combinations)
      for (double value : range.values()) {
        ParameterOverrides o = base;
        o[range.name] = value;
        next.push_back(o);
      }
    combinations = std::move(next);
  }
  std::vector<VariantJob> batch;
  for (const ParameterOverrides& combination : combinations) {
    std::string label;
    for (const ParameterRange& range : ranges)
      label += (label.empty() ? "" : ", ") + fmt::format("{} = {:g}", range.name, combination.at(range.name));
    batch.push_back({label, file, combination});
  }
  return run_variants(batch, options, jobs, progress);
}

std::vector<VariantSummary> run_comparison(const std::vector<std::string>& files, const CalculationOptions& options, int jobs,
                                           const std::function<void(int, int)>& progress) {
  std::vector<VariantJob> batch;
  for (const std::string& file : files) batch.push_back({std::filesystem::path(file).stem().string(), file, {}});
  return run_variants(batch, options, jobs, progress);
}

}  // namespace edgeflux
