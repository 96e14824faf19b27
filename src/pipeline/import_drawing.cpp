#include "pipeline/import_drawing.h"

#include <fmt/format.h>

#include <algorithm>
#include <cctype>
#include <chrono>
#include <filesystem>
#include <map>

#include "geometry/planar_subdivision.h"
#include "geometry/validate_cross_section.h"
#include "input/drawing_regions.h"

namespace edgeflux {

namespace {

constexpr double max_abs_coordinate_m = 1e6;

/// A material id from a layer name: lower case, runs of other characters as one hyphen.
std::string id_from_layer(const std::string& layer) {
  std::string id;
  for (char c : layer) {
    if (std::isalnum(static_cast<unsigned char>(c))) id += static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
    else if (!id.empty() && id.back() != '-') id += '-';
  }
  while (!id.empty() && id.back() == '-') id.pop_back();
  return id.empty() ? "material" : id;
}

struct ParsedMapping {
  std::string layer, id, library;
};

ParsedMapping parse_mapping(const std::string& text) {
  const auto eq = text.rfind('=');
  ParsedMapping m;
  if (eq != std::string::npos && eq > 0 && eq + 1 < text.size()) {
    m.layer = text.substr(0, eq);
    const std::string right = text.substr(eq + 1);
    const auto colon = right.find(':');
    m.id = right.substr(0, colon);
    if (colon != std::string::npos) m.library = right.substr(colon + 1);
  }
  if (m.layer.empty() || m.id.empty() || (text.find(':', eq) != std::string::npos && m.library.empty()))
    throw_input_error({"command line", 0}, "--map " + text, "is not of the form LAYER=MATERIAL or LAYER=MATERIAL:LIBRARY-ENTRY",
                      "write e.g. --map EPS=insulation or --map BRICK=masonry:calcium-silicate-1800 ('edgeflux materials' "
                      "lists the library)");
  return m;
}

}  // namespace

DrawingImport import_drawing(const std::string& path, const ImportOptions& options) {
  const auto started = std::chrono::steady_clock::now();
  DrawingImport result;
  DrawingOptions drawing_options;
  drawing_options.unit = options.unit;
  result.drawing = read_drawing(path, drawing_options);
  const std::string name = std::filesystem::path(path).filename().string();

  std::vector<ParsedMapping> parsed;
  if (options.mappings.empty()) {
    for (const DrawingLayer& l : result.drawing.layers)
      if (l.outlines > 0) parsed.push_back({l.name, id_from_layer(l.name), ""});
  } else {
    for (const std::string& text : options.mappings) parsed.push_back(parse_mapping(text));
  }
  if (parsed.empty())
    throw_input_error({path, 0}, "drawing", "has no closed outline on any layer, so there is no region to import",
                      "draw each material's area as a closed polyline, circle or hatch (lines and arcs whose ends "
                      "meet within 0.01 mm also close)");

  std::vector<LayerMapping> mappings;
  std::map<std::string, std::size_t> material_of;
  for (const ParsedMapping& m : parsed) {
    const std::string object = options.mappings.empty() ? fmt::format("layer \"{}\"", m.layer) : fmt::format("--map {}={}", m.layer, m.id);
    const SourceLocation where{"command line", 0};
    for (const LayerMapping& earlier : mappings)
      if (earlier.layer == m.layer) throw_input_error(where, object, fmt::format("maps layer \"{}\" a second time", m.layer), "map each layer once");
    const LibraryMaterial* library = find_library_material(m.library.empty() ? m.id : m.library);
    if (!m.library.empty() && !library)
      throw_input_error(where, object, fmt::format("names \"{}\", which is not in the material library", m.library),
                        "'edgeflux materials WORD' searches the library; or leave the entry out and fill in λ later");
    auto [it, added] = material_of.emplace(m.id, result.materials.size());
    if (added) {
      result.materials.push_back({m.id, library, {}});
      Material material;
      material.id = m.id;
      material.conductivity = library ? library->conductivity : 1.0;
      material.library_id = library ? library->id : "";
      result.section.materials.push_back(material);
    } else if (library && result.materials[it->second].library != library) {
      throw_input_error(where, object, fmt::format("gives material \"{}\" a second library entry", m.id),
                        "give each material one library entry, or different names");
    }
    result.materials[it->second].layers.push_back(m.layer);
    result.mapped_layers.push_back(m.layer);
    mappings.push_back({m.layer, m.id, 0, where, object});
  }

  CrossSection& section = result.section;
  section.file = path;
  section.title = name;
  section.warnings = result.drawing.notes;
  if (!result.drawing.unit_stated)
    section.warnings.push_back(fmt::format("the drawing states no unit ($INSUNITS); it was read in millimetres: give --units "
                                           "if it was drawn in another unit"));
  for (Point p : result.drawing.chord_points) section.chord_points.push_back(p);
  for (const MappedOutline& o : mapped_outlines(result.drawing, name, mappings, max_abs_coordinate_m, section.warnings)) {
    Region region;
    region.where = mappings[o.mapping].where;
    region.name = fmt::format("{} {}", o.shape->layer, o.shape->entities);
    region.material = material_of.at(mappings[o.mapping].material);
    region.outline = o.shape->points;
    region.islands = o.shape->islands;
    section.regions.push_back(std::move(region));
  }
  validate_regions(section);
  const PlanarSubdivision subdivision = planar_subdivision(section, false);
  for (const std::string& w : subdivision.warnings) section.warnings.push_back(w);

  // Labels: per region, the seed with the most room around it.
  result.region_labels.assign(section.regions.size(), Point{});
  std::vector<double> room(section.regions.size(), -1.0);
  for (const FaceSeed& seed : subdivision.seeds)
    if (seed.room > room[seed.region]) room[seed.region] = seed.room, result.region_labels[seed.region] = subdivision.metres(seed.at);
  result.runs = outline_runs(subdivision);
  result.warnings = section.warnings;
  result.seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - started).count();
  return result;
}

}  // namespace edgeflux
