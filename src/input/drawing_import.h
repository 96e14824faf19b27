// What `edgeflux import` makes of a drawing: its layers, the regions of the mapped layers with
// their materials, and the outline's runs as candidate surfaces. Plain data for the writers in
// report/import_files.h (pipeline/import_drawing.h makes it).
#pragma once

#include <string>
#include <vector>

#include "geometry/cross_section.h"
#include "geometry/outline_runs.h"
#include "input/material_library.h"
#include "input/read_drawing.h"

namespace edgeflux {

struct ImportedMaterial {
  std::string id;
  const LibraryMaterial* library = nullptr;  ///< λ from the library, else left for the user
  std::vector<std::string> layers;
};

struct DrawingImport {
  CadDrawing drawing;
  std::vector<ImportedMaterial> materials;  ///< same order as section.materials
  std::vector<std::string> mapped_layers;   ///< in the order the user mapped them
  /// Regions of the mapped layers in painting order, validated; materials whose λ is left to the
  /// user carry λ = 1 here (the geometry does not depend on it).
  CrossSection section;
  std::vector<Point> region_labels;         ///< m, per region, a point well inside what it paints
  std::vector<OutlineRun> runs;             ///< the candidate surfaces S1, S2, … in this order
  std::vector<std::string> warnings;
  double seconds = 0.0;                     ///< time to read and analyse the drawing
};

}  // namespace edgeflux
