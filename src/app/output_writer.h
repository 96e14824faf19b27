// Writing a run's output files: every path checked before the first file is written.
#pragma once

#include <string>
#include <vector>

#include "report/output_files.h"

namespace edgeflux {

/// Throws InputError for the first path that cannot be written: the same file as an input or as
/// another output (compared as real paths, after symlinks), a missing folder (unless
/// creates_folder and its parent exists; it is then created on writing), a path that is a folder,
/// an existing file that is not a regular file or is read-only, or a folder without write
/// permission. A symlink is followed: the file it points to is replaced. Writes nothing.
void check_output_paths(const std::vector<OutputFile>& files, const std::vector<std::string>& inputs);

/// Creates the missing folders of creates_folder files, then writes all files or none
/// (write_files_atomically).
void write_output_files(const std::vector<OutputFile>& files);

}  // namespace edgeflux
