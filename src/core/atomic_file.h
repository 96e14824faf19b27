// Writing output files so that an interrupted or failed run never leaves a half-written file or
// a mixed set of old and new files.
#pragma once

#include <string>
#include <vector>

namespace edgeflux {

struct FileToWrite {
  std::string path;
  std::string content;
};

/// Writes every file or none: each goes to a temporary file of its own, with a unique name, in
/// the folder of its target (a symlinked target: the folder of the file it points to); only when
/// all are complete and flushed are they renamed into place, one after the other. On any failure
/// the temporaries are removed and the old files stay as they were; on SIGINT, SIGTERM, SIGHUP or
/// SIGQUIT during the writing, too. Temporaries a killed run left behind (their writer's process
/// id is in the name) are removed by the next run that writes the same file. Throws InputError naming the file and the cause (folder missing, disk full).
void write_files_atomically(const std::vector<FileToWrite>& files);

/// One file, the same way.
inline void write_file_atomically(const std::string& path, const std::string& content) {
  write_files_atomically({{path, content}});
}

}  // namespace edgeflux
