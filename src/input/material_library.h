// The built-in material library (materials/library.xml): design conductivities with their sources.
#pragma once

#include <optional>
#include <string>
#include <vector>

namespace edgeflux {

struct LibraryMaterial {
  std::string id;
  double conductivity = 0.0;       ///< λ, W/(m·K)
  std::optional<double> density;   ///< kg/m³, where the source gives it
  std::string category;
  std::string basis;               ///< "normative" (tabulated design value) or "typical" (declared, product-specific)
  std::string source;
};

/// All entries, in file order. Parsed once.
const std::vector<LibraryMaterial>& material_library();

/// The entry with this id, or nothing.
const LibraryMaterial* find_library_material(const std::string& id);

/// Entries whose id, category or source contains `text` (case-insensitive); all when empty.
std::vector<LibraryMaterial> search_material_library(const std::string& text);

}  // namespace edgeflux
