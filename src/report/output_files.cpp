// Builds the output files of a solve in memory.
#include "report/output_files.h"

#include <filesystem>

#include "report/html_report.h"
#include "report/png_export.h"
#include "report/surface_csv.h"
#include "report/svg_drawings.h"
#include "report/vtu_writer.h"

namespace edgeflux {
namespace fs = std::filesystem;

namespace {

std::string in_folder(const std::string& folder, const std::string& name) { return (fs::path(folder) / name).string(); }

}  // namespace

std::vector<OutputFile> build_output_files(const CrossSection& section, const Calculation& calc, const OutputRequest& request,
                                           const ReportProvenance& provenance) {
  std::vector<OutputFile> files;
  const bool want_drawings = !request.html_report.empty() || !request.svg_folder.empty() || !request.png_folder.empty();
  const std::vector<Drawing> drawings = want_drawings ? report_drawings(section, calc) : std::vector<Drawing>{};
  if (!request.html_report.empty())
    files.push_back({request.html_report, html_report(section, calc, drawings, provenance, request.report_appendices)});
  if (!request.svg_folder.empty())
    for (const Drawing& d : drawings) files.push_back({in_folder(request.svg_folder, d.id + ".svg"), standalone_svg(d), true});
  if (!request.png_folder.empty())
    for (const Drawing& d : drawings) files.push_back({in_folder(request.png_folder, d.id + ".png"), png_from_svg(standalone_svg(d)), true});
  if (!request.vtu_file.empty()) files.push_back({request.vtu_file, vtu_document(section, calc)});
  if (!request.surface_csv.empty()) files.push_back({request.surface_csv, surface_csv(section, calc)});
  return files;
}

}  // namespace edgeflux
