#include "project/run_project.h"

#include <fmt/format.h>
#include <fmt/ranges.h>

#include <cmath>
#include <map>

#include "pipeline/variants.h"
#include "project/result_cache.h"

namespace edgeflux {

void sum_schedule(Schedule& schedule) {
  schedule.heat_transfer_coefficient = 0;
  schedule.heat_transfer_coefficient_error = 0;
  schedule.failed = 0;
  for (ScheduleRow& row : schedule.rows) {
    row.length = 0;
    for (const TakenLength& l : row.junction.lengths) row.length += l.metres;
    if (!row.psi) {
      ++schedule.failed;
      row.psi_length.reset();
      continue;
    }
    row.psi_length = *row.psi * row.length;
    schedule.heat_transfer_coefficient += *row.psi_length;
    schedule.heat_transfer_coefficient_error += std::abs(row.psi_error.value_or(0.0)) * row.length;
    row.exceeds_assumed = row.junction.assumed_psi && *row.psi > *row.junction.assumed_psi;
  }
  schedule.u_surcharge.reset();
  if (schedule.project.envelope_area) schedule.u_surcharge = schedule.heat_transfer_coefficient / *schedule.project.envelope_area;
}

Schedule run_project(const Project& project, const CalculationOptions& options, int jobs, const std::function<void(int, int)>& progress,
                     const std::string& cache_folder, const CalculationHook& with_calculation) {
  const std::size_t n = project.junctions.size();
  std::vector<std::string> keys(n);
  std::vector<std::optional<VariantSummary>> cached(n);
  std::vector<VariantJob> batch;
  std::vector<std::size_t> solved;  // junction index of each batch entry
  for (std::size_t k = 0; k < n; ++k) {
    const ProjectJunction& j = project.junctions[k];
    if (!cache_folder.empty()) {
      keys[k] = junction_cache_key(j, options.target);
      if (!with_calculation) cached[k] = load_cached_result(cache_folder, keys[k]);
    }
    if (!cached[k]) {
      batch.push_back({j.reference, j.detail_file, j.overrides});
      solved.push_back(k);
    }
  }
  // The hook is told the junction's own index, not the batch's.
  const CalculationHook hook = with_calculation ? CalculationHook([&](std::size_t b, const CrossSection& section, const Calculation& calc) {
    with_calculation(solved[b], section, calc);
  }) : CalculationHook();
  const std::vector<VariantSummary> fresh = run_variants(batch, options, jobs, progress, hook);
  std::vector<VariantSummary> results(n);
  for (std::size_t b = 0; b < solved.size(); ++b) results[solved[b]] = fresh[b];
  Schedule schedule;
  schedule.project = project;
  std::map<std::string, std::vector<std::string>> on_meshes_of;  // junction → junctions solved on its meshes
  for (const VariantSummary& v : fresh)
    if (!v.meshes_from.empty()) on_meshes_of[v.meshes_from].push_back(v.label);
  for (const auto& [leader, followers] : on_meshes_of)
    schedule.notes.push_back(fmt::format("{} solved on the meshes refined for {} (same geometry, other conductivities), "
                                         "each with its own error estimate", fmt::join(followers, ", "), leader));
  for (std::size_t k = 0; k < n; ++k) {
    if (!cache_folder.empty() && !cached[k] && results[k].error.empty())
      if (const std::string problem = store_cached_result(cache_folder, keys[k], results[k]); !problem.empty())
        schedule.notes.push_back("result of " + project.junctions[k].reference + " not cached: " + problem);
    ScheduleRow row;
    row.junction = project.junctions[k];
    row.from_cache = cached[k].has_value();
    row.result = cached[k] ? *cached[k] : results[k];
    if (!row.result.error.empty()) {
      row.error = row.result.error;
    } else {
      std::string systems;
      for (std::size_t i = 0; i < row.result.psi.size(); ++i) {
        systems += (systems.empty() ? "" : ", ") + std::string(dimension_system_word(row.result.psi[i].system));
        if (row.result.psi[i].system == project.system) {
          row.psi = row.result.psi[i].psi;
          if (i < row.result.psi_error.size()) row.psi_error = row.result.psi_error[i];
        }
      }
      if (!row.psi)
        row.error = systems.empty()
                        ? "the detail gives no ψ (it needs flanking elements with lengths, and exactly two environments)"
                        : fmt::format("the detail gives ψ in {} dimensions only, not in the project's {}: add length-{} to its flanking elements",
                                      systems, dimension_system_word(project.system), dimension_system_word(project.system));
    }
    schedule.rows.push_back(std::move(row));
  }
  sum_schedule(schedule);
  return schedule;
}

}  // namespace edgeflux
