// `edgeflux import`: a DXF drawing turned into the pieces of a starting detail file — its layers,
// the regions of the mapped layers with their materials, and the outline's runs between corners
// as candidate surfaces (the data: input/drawing_import.h).
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "input/drawing_import.h"

namespace edgeflux {

struct ImportOptions {
  /// "LAYER=ID" or "LAYER=ID:LIBRARY-ENTRY" (ID alone may name a library entry). Empty: every
  /// layer with closed outlines, each as a material named after the layer.
  std::vector<std::string> mappings;
  std::optional<std::string> unit;  ///< overrides $INSUNITS
};

/// Reads the drawing and builds the import. Throws InputError for a drawing that cannot be read,
/// a malformed or unknown mapping, and for regions that do not make a section (crossing outlines,
/// gaps, parts touching at a point), naming the layer, entity and coordinates.
DrawingImport import_drawing(const std::string& drawing_path, const ImportOptions& options);

}  // namespace edgeflux
