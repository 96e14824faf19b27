// Runs every junction of a project in parallel and sums the schedule.
#pragma once

#include <functional>

#include "pipeline/calculate.h"
#include "results/project_schedule.h"

namespace edgeflux {

/// Solves each junction (its detail with its parameter values) on `jobs` threads (0: all cores),
/// then reads ψ in the project's dimension system and sums H_TB = Σ ψ·l and ΔU_TB = H_TB / A.
/// A junction that fails, or has no ψ in that system, is a row with its error; the others complete.
Schedule run_project(const Project& project, const CalculationOptions& options, int jobs,
                     const std::function<void(int done, int total)>& progress = {});

/// The sums of a schedule whose rows are filled in (used by run_project; tests call it on rows
/// made by hand).
void sum_schedule(Schedule& schedule);

}  // namespace edgeflux
