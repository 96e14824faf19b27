// What `edgeflux import` prints and writes: the drawing's layer list, and a starting detail file
// that takes its regions from the drawing and lists the outline's runs as candidate surfaces.
#pragma once

#include <string>

#include "input/drawing_import.h"

namespace edgeflux {

/// The layers with entity counts, closed outlines, open chains and extents; the entities left out
/// and any notes; then the regions and candidate surfaces found.
std::string import_summary_text(const DrawingImport& import);

/// A detail file (format 1, millimetres) beside `detail_path`: one material per mapped material
/// (library entries by reference, else λ "?" for the user to fill in), a <drawing> element with the
/// layer mapping and the drawing's path relative to the detail file, two environments to edit, and
/// every outline run as a commented-out surface numbered as in the picture.
std::string starting_detail_xml(const DrawingImport& import, const std::string& drawing_path, const std::string& detail_path,
                                 const std::string& picture_path);

}  // namespace edgeflux
