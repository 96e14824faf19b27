// Fills for materials in section drawings: a pale ground colour and an architectural hatch chosen
// from the material's name and source (insulation zig-zag, masonry diagonals, concrete stipple, …).
#pragma once

#include <string>
#include <vector>

#include "geometry/cross_section.h"

namespace edgeflux {

enum class HatchKind { insulation, masonry, concrete, reinforced_concrete, plaster, timber, metal, glass, soil, air, plain };

struct MaterialFill {
  HatchKind hatch = HatchKind::plain;
  std::string ground;  ///< "#rrggbb", the pale background
  std::string ink;     ///< "#rrggbb", the hatch lines
  double angle = 45;   ///< degrees, for plain hatches: varies between materials so they differ
};

/// One fill per material (same order as CrossSection::materials). Materials of the same kind get
/// different ground colours, so neighbouring layers stay distinguishable.
std::vector<MaterialFill> material_fills(const CrossSection& section);

/// Human-readable name of the hatch kind, e.g. "insulation".
const char* hatch_name(HatchKind kind);

/// SVG <pattern> definitions for every material, in paper millimetres: ids
/// "<prefix>-m<index>-h" (hatch along x) and "<prefix>-m<index>-v" (rotated for tall regions).
std::string material_pattern_defs(const std::vector<MaterialFill>& fills, const std::string& prefix);

}  // namespace edgeflux
