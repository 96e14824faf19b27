// The files one `solve` writes besides the printed summary, built in memory (app/output_writer.h
// checks their paths and writes them).
#pragma once

#include <string>
#include <vector>

#include "geometry/cross_section.h"
#include "results/calculation.h"
#include "report/html_report.h"

namespace edgeflux {

/// Which outputs to build; an empty path or folder means "not wanted".
struct OutputRequest {
  std::string html_report;  ///< the HTML report
  bool report_appendices = true;  ///< false: the junction sheet alone
  std::string svg_folder;   ///< one standalone SVG per drawing: detail.svg, mesh.svg, …
  std::string png_folder;   ///< the same drawings as PNG (librsvg)
  std::string vtu_file;     ///< VTK XML UnstructuredGrid of the mesh and fields
  std::string surface_csv;  ///< interior surface temperatures along the surface
};

struct OutputFile {
  std::string path;
  std::string content;
  bool creates_folder = false;  ///< true for files in --svg-dir/--png-dir: that folder may be created
};

/// Builds every requested file in memory; the report embeds `provenance` (the input file's bytes,
/// the time, the validation run), which the caller gathers.
std::vector<OutputFile> build_output_files(const CrossSection& section, const Calculation& calc, const OutputRequest& request,
                                           const ReportProvenance& provenance);

}  // namespace edgeflux
