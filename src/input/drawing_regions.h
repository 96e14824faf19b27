// The regions a drawing gives a section: the closed outlines on the layers mapped to materials,
// in painting order, with the checks that concern the mapping. Shared by the detail-file reader
// (<drawing> with <layer> elements) and `edgeflux import` (--map on the command line).
#pragma once

#include <string>
#include <vector>

#include "core/error.h"
#include "input/read_drawing.h"

namespace edgeflux {

/// One layer mapped to a material, and where the mapping was written (for messages).
struct LayerMapping {
  std::string layer;
  std::string material;   ///< material id (detail file) or material name (import)
  int paint_order = 0;    ///< lower first; equal: the drawing's entity order
  SourceLocation where;
  std::string object;     ///< e.g. "<layer name=\"EPS\" …>" or "--map EPS=eps"
};

/// A closed outline of the drawing and the mapping that makes it a region.
struct MappedOutline {
  const DrawnShape* shape = nullptr;
  std::size_t mapping = 0;  ///< index into the mappings
};

/// The outlines on mapped layers in painting order. Throws InputError (at the mapping's location)
/// for a layer the drawing lacks (listing those with outlines), a spline or open lines on a mapped
/// layer (with the gap between the open ends), and a point beyond ±`max_abs_coordinate_m`.
/// Appends a warning naming the layers with outlines that no mapping takes.
std::vector<MappedOutline> mapped_outlines(const CadDrawing& drawing, const std::string& drawing_name,
                                           const std::vector<LayerMapping>& mappings, double max_abs_coordinate_m,
                                           std::vector<std::string>& warnings);

}  // namespace edgeflux
