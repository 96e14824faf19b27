// Writing output files so that an interrupted run never leaves a half-written file.
#pragma once

#include <string>

namespace edgeflux {

/// Writes `content` to a temporary file beside `path`, then renames it over `path`.
/// Throws InputError (the output location is the user's to fix) when the folder is missing or
/// not writable.
void write_file_atomically(const std::string& path, const std::string& content);

}  // namespace edgeflux
