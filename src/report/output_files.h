// The files one `solve` writes besides the printed summary: built in memory first, their paths
// checked, and only then written, so a bad path leaves nothing behind.
#pragma once

#include <string>
#include <vector>

#include "geometry/cross_section.h"
#include "pipeline/calculate.h"

namespace edgeflux {

/// Which outputs to build; an empty path or folder means "not wanted".
struct OutputRequest {
  std::string html_report;  ///< the HTML report
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

/// Builds every requested file in memory. Reads the detail file again (section.file) to embed
/// and hash it in the report; throws InputError when it can no longer be read.
std::vector<OutputFile> build_output_files(const CrossSection& section, const Calculation& calc, const OutputRequest& request);

/// Throws InputError for the first path that cannot be written: a missing folder (unless
/// creates_folder and its parent exists; it is then created on writing), a path that is a
/// folder, or a folder without write permission. Writes nothing.
void check_output_paths(const std::vector<OutputFile>& files);

/// Creates the missing folders of creates_folder files, then writes each file with write_file_atomically.
void write_output_files(const std::vector<OutputFile>& files);

}  // namespace edgeflux
