// Runs every junction of a project in parallel and sums the schedule.
#pragma once

#include <functional>

#include "pipeline/calculate.h"
#include "pipeline/variants.h"
#include "results/project_schedule.h"

namespace edgeflux {

/// Solves each junction (its detail with its parameter values) on `jobs` threads (0: all cores),
/// then reads ψ in the project's dimension system and sums H_TB = Σ ψ·l and ΔU_TB = H_TB / A.
/// A junction that fails, or has no ψ in that system, is a row with its error; the others complete.
/// With `cache_folder` (non-empty), results whose inputs are unchanged are read from it and new
/// ones stored there (project/result_cache.h); those rows say so.
/// With `with_calculation`, every junction is solved in this run (none read from the cache) and
/// the hook sees each calculation, indexed like project.junctions (to build its report).
Schedule run_project(const Project& project, const CalculationOptions& options, int jobs,
                     const std::function<void(int done, int total)>& progress = {}, const std::string& cache_folder = "",
                     const CalculationHook& with_calculation = {});

/// The sums of a schedule whose rows are filled in (used by run_project; tests call it on rows
/// made by hand).
void sum_schedule(Schedule& schedule);

}  // namespace edgeflux
