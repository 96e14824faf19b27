// Builds, checks and writes the output files of a solve.
#include "report/output_files.h"

#include <unistd.h>

#include <filesystem>
#include <fstream>
#include <sstream>

#include "core/atomic_file.h"
#include "core/error.h"
#include "report/html_report.h"
#include "report/png_export.h"
#include "report/surface_csv.h"
#include "report/svg_drawings.h"
#include "report/vtu_writer.h"

namespace edgeflux {
namespace fs = std::filesystem;

namespace {

std::string read_whole_file(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  if (!in) throw_input_error({path, 0}, "detail file", "cannot be read again to embed it in the report", "keep the file in place while edgeflux runs");
  std::ostringstream text;
  text << in.rdbuf();
  return text.str();
}

std::string in_folder(const std::string& folder, const std::string& name) { return (fs::path(folder) / name).string(); }

}  // namespace

std::vector<OutputFile> build_output_files(const CrossSection& section, const Calculation& calc, const OutputRequest& request) {
  std::vector<OutputFile> files;
  const bool want_drawings = !request.html_report.empty() || !request.svg_folder.empty() || !request.png_folder.empty();
  const std::vector<Drawing> drawings = want_drawings ? report_drawings(section, calc) : std::vector<Drawing>{};
  if (!request.html_report.empty())
    // The report carries the validation of the very build that made it (about a second).
    files.push_back({request.html_report, html_report(section, calc, drawings,
                                                      {read_whole_file(section.file), report_timestamp(), iso10211_conformity()})});
  if (!request.svg_folder.empty())
    for (const Drawing& d : drawings) files.push_back({in_folder(request.svg_folder, d.id + ".svg"), standalone_svg(d), true});
  if (!request.png_folder.empty())
    for (const Drawing& d : drawings) files.push_back({in_folder(request.png_folder, d.id + ".png"), png_from_svg(standalone_svg(d)), true});
  if (!request.vtu_file.empty()) files.push_back({request.vtu_file, vtu_document(section, calc)});
  if (!request.surface_csv.empty()) files.push_back({request.surface_csv, surface_csv(section, calc)});
  return files;
}

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
