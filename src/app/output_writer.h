// Writing a run's output files: every path checked before the first file is written.
#pragma once

#include <vector>

#include "report/output_files.h"

namespace edgeflux {

/// Throws InputError for the first path that cannot be written: a missing folder (unless
/// creates_folder and its parent exists; it is then created on writing), a path that is a
/// folder, or a folder without write permission. Writes nothing.
void check_output_paths(const std::vector<OutputFile>& files);

/// Creates the missing folders of creates_folder files, then writes each file with write_file_atomically.
void write_output_files(const std::vector<OutputFile>& files);

}  // namespace edgeflux
