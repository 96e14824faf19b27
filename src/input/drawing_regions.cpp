#include "input/drawing_regions.h"

#include <fmt/format.h>
#include <fmt/ranges.h>

#include <algorithm>
#include <cmath>
#include <map>
#include <set>

namespace edgeflux {

namespace {
std::string point_text(Point p) { return format_point_for_user(p.x, p.y, 0.001, "mm"); }
}  // namespace

std::vector<MappedOutline> mapped_outlines(const CadDrawing& drawing, const std::string& name,
                                           const std::vector<LayerMapping>& mappings, double max_abs_coordinate_m,
                                           std::vector<std::string>& warnings) {
  std::map<std::string, std::size_t> mapping_of;
  for (std::size_t m = 0; m < mappings.size(); ++m) mapping_of.emplace(mappings[m].layer, m);

  std::set<std::string> present;
  for (const DrawingLayer& l : drawing.layers) present.insert(l.name);
  for (const LayerMapping& m : mappings)
    if (!present.count(m.layer)) {
      std::vector<std::string> names;
      for (const DrawingLayer& l : drawing.layers)
        if (l.outlines > 0) names.push_back(l.name);
      throw_input_error(m.where, m.object, fmt::format("the drawing {} has no layer \"{}\"", name, m.layer),
                        fmt::format("use a layer that holds closed outlines: {}",
                                    names.empty() ? std::string("(none)") : fmt::format("{}", fmt::join(names, ", "))));
    }
  for (const std::string& spline : drawing.splines) {
    const auto m = mapping_of.find(spline.substr(0, spline.find(':')));
    if (m != mapping_of.end())
      throw_input_error(mappings[m->second].where, mappings[m->second].object,
                        fmt::format("the drawing {} has a spline on this layer ({}), which edgeflux does not read", name, spline),
                        "convert the spline to a polyline in the CAD program (flatten or explode it to arcs and lines)");
  }
  for (const DrawnShape& chain : drawing.chains) {
    const auto m = mapping_of.find(chain.layer);
    if (m == mapping_of.end()) continue;
    throw_input_error(mappings[m->second].where, mappings[m->second].object,
                      fmt::format("the lines {} on layer \"{}\" of {} do not close into an outline: their ends at {} and "
                                  "{} are {:.3f} mm apart", chain.entities, chain.layer, name, point_text(chain.points.front()),
                                  point_text(chain.points.back()), distance(chain.points.front(), chain.points.back()) * 1000.0),
                      "close the outline in the drawing (lines whose ends are within 0.01 mm are joined), or move "
                      "open lines to a layer that is not mapped");
  }

  std::vector<MappedOutline> outlines;
  std::map<std::string, int> unmapped;
  for (const DrawnShape& s : drawing.outlines) {
    const auto m = mapping_of.find(s.layer);
    if (m == mapping_of.end()) {
      ++unmapped[s.layer];
      continue;
    }
    for (Point p : s.points)
      if (!(std::abs(p.x) <= max_abs_coordinate_m && std::abs(p.y) <= max_abs_coordinate_m))
        throw_input_error(mappings[m->second].where, mappings[m->second].object,
                          fmt::format("{} on layer \"{}\" of {} has a point beyond ±{:g} m", s.entities, s.layer, name,
                                      max_abs_coordinate_m),
                          "check the drawing's unit ($INSUNITS, or the unit given with the drawing)");
    outlines.push_back({&s, m->second});
  }
  std::stable_sort(outlines.begin(), outlines.end(), [&](const MappedOutline& a, const MappedOutline& b) {
    return mappings[a.mapping].paint_order < mappings[b.mapping].paint_order;
  });
  if (!unmapped.empty()) {
    std::vector<std::string> parts;
    for (const auto& [layer, count] : unmapped) parts.push_back(fmt::format("\"{}\" ({} outline{})", layer, count, count == 1 ? "" : "s"));
    warnings.push_back(fmt::format("drawing {}: layers with closed outlines that no mapping takes were left out: {}", name,
                                   fmt::join(parts, ", ")));
  }
  return outlines;
}

}  // namespace edgeflux
