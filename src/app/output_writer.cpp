// Checks the paths of a run's output files and writes them: nothing is written unless every path
// can be, and each file appears whole or not at all.
#include "app/output_writer.h"

#include <sys/stat.h>
#include <unistd.h>

#include <filesystem>

#include "core/atomic_file.h"
#include "core/error.h"

namespace edgeflux {
namespace fs = std::filesystem;

void check_output_paths(const std::vector<OutputFile>& files, const std::vector<std::string>& inputs) {
  std::error_code ec;
  // Real paths, after symlinks: "din.xml" and "./din.xml" or a link to it are one file.
  auto real = [](const std::string& path) {
    std::error_code e;
    const fs::path p = fs::weakly_canonical(fs::absolute(path, e), e);
    return e ? fs::path(path) : p;
  };
  std::vector<fs::path> input_paths, seen;
  for (const std::string& in : inputs) input_paths.push_back(real(in));
  for (const OutputFile& f : files) {
    const fs::path target(f.path);
    const fs::path resolved = real(f.path);
    for (std::size_t k = 0; k < input_paths.size(); ++k)
      if (resolved == input_paths[k])
        throw_input_error({f.path, 0}, "output file", "is the input file " + inputs[k] + ", which writing would destroy",
                          "give the output another name");
    for (const fs::path& earlier : seen)
      if (resolved == earlier)
        throw_input_error({f.path, 0}, "output file", "is named twice among the outputs, so one would overwrite the other",
                          "give each output its own name");
    seen.push_back(resolved);
    // /dev/stdout or the file the summary is redirected to: the file would replace the summary.
    struct stat out_stat {}, target_stat {};
    if (::fstat(STDOUT_FILENO, &out_stat) == 0 && ::stat(resolved.c_str(), &target_stat) == 0 && out_stat.st_dev == target_stat.st_dev &&
        out_stat.st_ino == target_stat.st_ino)
      throw_input_error({f.path, 0}, "output file", "is where the printed summary goes (standard output), which it would replace",
                        "give the output a file of its own");
    if (fs::is_directory(target, ec))
      throw_input_error({f.path, 0}, "output file", "is a folder", "give a file name, e.g. " + (target / "result").string());
    if (fs::exists(resolved, ec)) {
      // Symlinks are followed: the file they point to is replaced, the link stays.
      if (!fs::is_regular_file(resolved, ec))
        throw_input_error({f.path, 0}, "output file", "exists and is not a regular file (a device, pipe or socket)",
                          "write to a regular file and copy it from there if needed");
      // The permission bits, not access(): a file protected on purpose stays protected for root too.
      const fs::perms write = fs::perms::owner_write | fs::perms::group_write | fs::perms::others_write;
      if ((fs::status(resolved, ec).permissions() & write) == fs::perms::none || ::access(resolved.c_str(), W_OK) != 0)
        throw_input_error({f.path, 0}, "output file", "exists and is read-only", "remove the write protection or choose another name");
    }
    const fs::path folder = resolved.has_parent_path() ? resolved.parent_path() : fs::path(".");
    fs::path existing = folder;
    if (!fs::is_directory(folder, ec)) {
      // A folder of its own (--svg-dir, --png-dir) may be created, one level deep.
      const fs::path parent = folder.has_parent_path() ? folder.parent_path() : fs::path(".");
      if (fs::exists(folder, ec))
        throw_input_error({f.path, 0}, "output file", "\"" + folder.string() + "\" is a file, not a folder",
                          "choose a path in a folder, or rename that file");
      if (!f.creates_folder || !fs::is_directory(parent, ec))
        throw_input_error({f.path, 0}, "output file", "the folder \"" + folder.string() + "\" does not exist",
                          "create the folder first or choose another path");
      existing = parent;
    }
    if (::access(existing.c_str(), W_OK) != 0)
      throw_input_error({f.path, 0}, "output file", "the folder \"" + existing.string() + "\" is not writable", "choose a folder you can write to");
  }
}

void write_output_files(const std::vector<OutputFile>& files) {
  std::vector<FileToWrite> set;
  for (const OutputFile& f : files) {
    const fs::path folder = fs::path(f.path).parent_path();
    std::error_code ec;
    if (f.creates_folder && !folder.empty() && !fs::is_directory(folder, ec)) fs::create_directory(folder, ec);
    set.push_back({f.path, f.content});
  }
  write_files_atomically(set);
}

}  // namespace edgeflux
