// The project schedule as text for the terminal, CSV for spreadsheets and JSON for other programs.
#pragma once

#include <string>
#include <vector>

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

/// The schedule as the first page of the hand-in set: the record, one row per junction linking to
/// its report (`report_files[k]` for junction k, empty: no link), the sums, the cautions; prints on
/// A4 or Letter with a running header and page numbers. `generated`: the time of the run.
std::string schedule_page(const Schedule& schedule, const std::vector<std::string>& report_files, const std::string& generated);

/// A file name for a junction's report from its reference: letters, digits, '-' and '_' kept,
/// anything else '_', then ".html" (e.g. "J03" → "J03.html").
std::string report_file_name(const std::string& reference);

}  // namespace edgeflux
