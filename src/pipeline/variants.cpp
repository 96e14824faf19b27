// Parallel runs of independent calculations; each is deterministic, so the order of completion
// does not affect the results.
#include "pipeline/variants.h"

#include <fmt/format.h>

#include <algorithm>
#include <atomic>
#include <chrono>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <mutex>
#include <thread>

#include "core/sha256.h"
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

/// Runs task(i) for i in [0, n) on `jobs` threads.
void parallel_for(int n, int jobs, const std::function<void(int)>& task, const std::function<void(int, int)>& progress) {
  if (jobs <= 0) jobs = std::max(1u, std::thread::hardware_concurrency());
  jobs = std::min(jobs, std::max(n, 1));
  if (jobs > 1) pin_blas_to_one_thread();
  std::atomic<int> next{0}, done{0};
  std::mutex report;
  auto worker = [&] {
    for (int i; (i = next++) < n;) {
      task(i);
      const int finished = ++done;
      if (progress) {
        std::lock_guard lock(report);
        progress(finished, n);
      }
    }
  };
  std::vector<std::thread> threads;
  for (int j = 1; j < jobs; ++j) threads.emplace_back(worker);
  worker();
  for (std::thread& t : threads) t.join();
}

VariantSummary run_one(const std::string& label, const std::string& file, const ParameterOverrides& overrides,
                       const CalculationOptions& options, std::size_t index = 0, const CalculationHook& with_calculation = {}) {
  try {
    const CrossSection section = read_detail_file(file, overrides, arc_tolerance_for(options.target));
    CalculationOptions quiet = options;
    quiet.progress = nullptr;
    const Calculation calc = calculate(section, quiet);
    if (with_calculation) with_calculation(index, section, calc);
    VariantSummary v = summarise(label, file, section, calc);
    v.parameters = overrides;
    std::ifstream in(file, std::ios::binary);
    std::ostringstream text;
    text << in.rdbuf();
    v.input_sha256 = sha256_hex(text.str());
    return v;
  } catch (const std::exception& e) {
    VariantSummary v;
    v.label = label;
    v.file = file;
    v.parameters = overrides;
    v.error = e.what();
    return v;
  }
}

}  // namespace

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
  std::vector<VariantSummary> results(combinations.size());
  parallel_for(static_cast<int>(combinations.size()), jobs, [&](int i) {
    std::string label;
    for (const ParameterRange& range : ranges)
      label += (label.empty() ? "" : ", ") + fmt::format("{} = {:g}", range.name, combinations[i].at(range.name));
    results[i] = run_one(label, file, combinations[i], options);
  }, progress);
  return results;
}

std::vector<VariantSummary> run_variants(const std::vector<VariantJob>& batch, const CalculationOptions& options, int jobs,
                                         const std::function<void(int, int)>& progress, const CalculationHook& with_calculation) {
  std::vector<VariantSummary> results(batch.size());
  parallel_for(static_cast<int>(batch.size()), jobs, [&](int i) {
    results[i] = run_one(batch[i].label, batch[i].file, batch[i].overrides, options, static_cast<std::size_t>(i), with_calculation);
  }, progress);
  return results;
}

std::vector<VariantSummary> run_comparison(const std::vector<std::string>& files, const CalculationOptions& options, int jobs,
                                           const std::function<void(int, int)>& progress) {
  std::vector<VariantSummary> results(files.size());
  parallel_for(static_cast<int>(files.size()), jobs, [&](int i) {
    results[i] = run_one(std::filesystem::path(files[i]).stem().string(), files[i], {}, options);
  }, progress);
  return results;
}

}  // namespace edgeflux
