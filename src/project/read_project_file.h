// Reader of the project file (XML, format 1): the building's junctions, their detail files,
// parameter values and lengths, and the energy method's dimension system (docs/project-format.md).
#pragma once

#include <string>

#include "results/project_schedule.h"

namespace edgeflux {

/// Reads and checks a project file; detail paths are resolved against its folder. Throws
/// InputError naming file, line, object and how to fix it (unknown element or attribute, a
/// missing or non-positive length, two junctions with one reference, an assumed ψ without a
/// source, a detail file that does not exist).
Project read_project_file(const std::string& path);

/// Same, from text in memory; `file_name` is used in messages and to resolve detail paths.
Project parse_project_text(const std::string& text, const std::string& file_name);

}  // namespace edgeflux
