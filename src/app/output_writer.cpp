// Checks the paths of a run's output files and writes them: nothing is written unless every path
// can be, and each file appears whole or not at all.
#include "app/output_writer.h"

#include <unistd.h>

#include <filesystem>

#include "core/atomic_file.h"
#include "core/error.h"

namespace edgeflux {
namespace fs = std::filesystem;

void check_output_paths(const std::vector<OutputFile>& files) {
  std::error_code ec;
  for (const OutputFile& f : files) {
    const fs::path target(f.path);
    if (fs::is_directory(target, ec))
      throw_input_error({f.path, 0}, "output file", "is a folder", "give a file name, e.g. " + (target / "result").string());
    const fs::path folder = target.has_parent_path() ? target.parent_path() : fs::path(".");
    fs::path existing = folder;
    if (!fs::is_directory(folder, ec)) {
      // A folder of its own (--svg-dir, --png-dir) may be created, one level deep.
      const fs::path parent = folder.has_parent_path() ? folder.parent_path() : fs::path(".");
      if (!f.creates_folder || fs::exists(folder, ec) || !fs::is_directory(parent, ec))
        throw_input_error({f.path, 0}, "output file", "the folder \"" + folder.string() + "\" does not exist",
                          "create the folder first or choose another path");
      existing = parent;
    }
    if (::access(existing.c_str(), W_OK) != 0)
      throw_input_error({f.path, 0}, "output file", "the folder \"" + existing.string() + "\" is not writable", "choose a folder you can write to");
  }
}

void write_output_files(const std::vector<OutputFile>& files) {
  for (const OutputFile& f : files) {
    const fs::path folder = fs::path(f.path).parent_path();
    std::error_code ec;
    if (f.creates_folder && !folder.empty() && !fs::is_directory(folder, ec)) fs::create_directory(folder, ec);
    write_file_atomically(f.path, f.content);
  }
}

}  // namespace edgeflux
