// Temporary-file-then-rename output.
#include "core/atomic_file.h"

#include <cerrno>
#include <cstdio>
#include <cstring>
#include <filesystem>
#include <fstream>

#include "core/error.h"

namespace edgeflux {

void write_file_atomically(const std::string& path, const std::string& content) {
  namespace fs = std::filesystem;
  const fs::path target(path);
  const fs::path folder = target.has_parent_path() ? target.parent_path() : fs::path(".");
  std::error_code ec;
  if (!fs::is_directory(folder, ec))
    throw_input_error({path, 0}, "output file", "the folder \"" + folder.string() + "\" does not exist", "create the folder first or choose another path");
  const fs::path temporary = folder / ("." + target.filename().string() + ".partial");
  {
    std::ofstream out(temporary, std::ios::binary | std::ios::trunc);
    if (!out)
      throw_input_error({path, 0}, "output file", std::string("cannot be written (") + std::strerror(errno) + ")",
                        "choose a folder you can write to");
    out << content;
    out.flush();
    if (!out) {
      fs::remove(temporary, ec);
      throw_input_error({path, 0}, "output file", "writing failed (disk full?)", "free space or choose another folder");
    }
  }
  fs::rename(temporary, target, ec);
  if (ec) {
    fs::remove(temporary, ec);
    throw_input_error({path, 0}, "output file", "cannot replace the file", "check the permissions of the folder");
  }
}

}  // namespace edgeflux
