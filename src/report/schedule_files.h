// The project schedule as text for the terminal, CSV for spreadsheets and JSON for other programs.
#pragma once

#include <string>

#include "results/project_schedule.h"

namespace edgeflux {

/// The schedule table: reference, description, ψ in the project's system, length, ψ·l, fRsi and
/// criteria, the assumed ψ and whether it is exceeded; the sums H_TB and ΔU_TB; failed junctions
/// with their reasons; the cautions.
std::string schedule_text(const Schedule& schedule);

/// One row per junction (and one per failed junction, with its error), then the sums.
std::string schedule_csv(const Schedule& schedule);

/// The project, each junction with its lengths and results, and the sums (format "edgeflux-schedule", version 1).
std::string schedule_json(const Schedule& schedule);

}  // namespace edgeflux
