// Reading materials, regions (rectangles, polygons with arcs, circles) and regions from drawings.
#include "input/detail_reader.h"
#include "geometry/polygon.h"
#include "physics/cavity.h"

namespace edgeflux {

std::vector<Point> DetailReader::parse_outline(const XMLElement* e, const char* attribute, bool closed) {
  const std::string text = expand(required_text(e, attribute), e, fmt::format("attribute \"{}\"", attribute));
  struct Item {
    std::vector<Point> points;  // the points written before the arc marker
    bool has_arc = false;
    Point centre{};
    bool counter_clockwise = true;
  };
  std::vector<Item> items(1);
  std::size_t at = 0;
  while (at < text.size()) {
    const std::size_t open = text.find('(', at);
    const std::string plain = text.substr(at, open == std::string::npos ? std::string::npos : open - at);
    std::size_t word = plain.find_last_not_of("abcdefghijklmnopqrstuvwxyz");
    word = word == std::string::npos ? 0 : word + 1;
    for (Point p : numbers_to_points(e, attribute, split_numbers(plain.substr(0, word), e, attribute)))
      items.back().points.push_back(p);
    if (open == std::string::npos) break;
    const std::string marker = plain.substr(word);
    const std::size_t close = text.find(')', open);
    if ((marker != "ccw" && marker != "cw") || close == std::string::npos)
      throw_input_error(where(e), describe(e),
                        fmt::format("in attribute \"{}\", \"{}(\" is not an arc (write ccw(cx,cy) or cw(cx,cy))",
                                    attribute, marker),
                        "write an arc between two points as ccw(cx,cy) or cw(cx,cy): the centre, and the direction "
                        "it turns from the point before to the point after");
    const std::vector<Point> centre =
        numbers_to_points(e, attribute, split_numbers(text.substr(open + 1, close - open - 1), e, attribute));
    if (centre.size() != 1 || items.back().points.empty())
      throw_input_error(where(e), describe(e),
                        fmt::format("in attribute \"{}\", the arc {}(…) needs one centre x,y and a point before it",
                                    attribute, marker),
                        "write e.g. \"100,0 ccw(0,0) 0,100\": from (100, 0) counter-clockwise about (0, 0) to (0, 100)");
    items.back().has_arc = true;
    items.back().centre = centre[0];
    items.back().counter_clockwise = marker == "ccw";
    items.emplace_back();
    at = close + 1;
  }
  // Flatten: an arc runs from the last point of its item to the first point of the next (or,
  // closing an outline, to the very first point).
  std::vector<Point> points;
  for (std::size_t i = 0; i < items.size(); ++i) {
    const Item& item = items[i];
    points.insert(points.end(), item.points.begin(), item.points.end());
    if (!item.has_arc) continue;
    const bool last = i + 1 == items.size() - 1 && items.back().points.empty();
    Point to;
    if (i + 1 < items.size() && !items[i + 1].points.empty()) to = items[i + 1].points.front();
    else if (closed && last) to = points.front();
    else
      throw_input_error(where(e), describe(e),
                        fmt::format("in attribute \"{}\", an arc has no point after it", attribute),
                        closed ? "end the arc at a point, or put it last to close the outline"
                               : "give the point where the arc ends after it");
    const Point from = item.points.back(), centre = item.centre;
    const double r_from = distance(from, centre), r_to = distance(to, centre);
    if (std::abs(r_from - r_to) > 1e-5 || r_from <= 0.0)
      throw_input_error(where(e), describe(e),
                        fmt::format("the arc from {} to {} about {} does not fit a circle: its ends are {:.6g} and "
                                    "{:.6g} {} from the centre", section_.format_point(from), section_.format_point(to),
                                    section_.format_point(centre), r_from / section_.metres_per_unit,
                                    r_to / section_.metres_per_unit, section_.unit),
                        "give the centre and two ends at the same distance from it (within 0.01 mm)");
    for (Point p : arc_points(from, to, centre, item.counter_clockwise, arc_tolerance_))
      points.push_back(p), section_.chord_points.push_back(p);
  }
  return points;
}

std::vector<Point> DetailReader::numbers_to_points(const XMLElement* e, const char* attribute, const std::vector<double>& numbers) const {
  if (numbers.size() % 2 != 0)
    throw_input_error(where(e), describe(e),
                      fmt::format("attribute \"{}\" has an odd number of coordinates ({})", attribute, numbers.size()),
                      "give points as x,y pairs separated by spaces, e.g. \"0,0 200,0\"");
  std::vector<Point> points;
  const double bound = max_abs_coordinate_m / section_.metres_per_unit;  // in the file's unit
  for (std::size_t i = 0; i + 1 < numbers.size(); i += 2) {
    for (std::size_t k : {i, i + 1})
      if (std::abs(numbers[k]) > bound)
        throw_input_error(where(e), describe(e),
                          fmt::format("in attribute \"{}\", point {} has {} = {:g} {}, which is too large: coordinates "
                                      "must lie within ±{:g} {} (±{:g} m)", attribute, i / 2 + 1, k == i ? "x" : "y",
                                      numbers[k], section_.unit, bound, section_.unit, max_abs_coordinate_m),
                          "check the number and the units attribute of <edgeflux-detail>");
    points.push_back({numbers[i] * section_.metres_per_unit, numbers[i + 1] * section_.metres_per_unit});
  }
  return points;
}

Point DetailReader::parse_point(const XMLElement* e, const char* attribute) const {
  const auto points = parse_points(e, attribute);
  if (points.size() != 1)
    throw_input_error(where(e), describe(e),
                      fmt::format("attribute \"{}\" must be one point x,y", attribute), "write e.g. \"0,47.5\"");
  return points[0];
}

void DetailReader::read_material(const XMLElement* e) {
  allow_attributes(e, {"id", "conductivity", "source", "library", "uncertainty"});
  Material m;
  m.id = required_text(e, "id");
  m.where = where(e);
  // "?" is what `edgeflux import` leaves for the user to fill in.
  for (const char* attribute : {"conductivity", "source"})
    if (const char* value = e->Attribute(attribute); value && std::string(value) == "?")
      throw_input_error(m.where, describe(e), fmt::format("has no {} yet (\"?\")", attribute),
                        std::string(attribute) == "conductivity"
                            ? "enter the design value λ in W/(m·K): the product's declared value, ISO 10456, or an entry "
                              "of 'edgeflux materials' as library=\"ENTRY\" instead of conductivity"
                            : "say where λ comes from (standard and table, or the product's declaration)");
  if (const char* entry = e->Attribute("library")) {
    const LibraryMaterial* found = find_library_material(entry);
    if (found == nullptr) {
      std::string close;
      for (const LibraryMaterial& l : search_material_library(std::string(entry).substr(0, 4)))
        close += (close.empty() ? "" : ", ") + l.id;
      throw_input_error(m.where, describe(e), fmt::format("\"{}\" is not in the material library", entry),
                        close.empty() ? "run 'edgeflux materials' to list the library"
                                      : fmt::format("did you mean one of: {}? ('edgeflux materials' lists all)", close));
    }
    m.library_id = found->id;
    m.conductivity = found->conductivity;
    m.source = found->source;
    m.density = found->density;
    m.basis = found->basis;
    if (e->Attribute("conductivity")) {
      m.conductivity = required_number(e, "conductivity");
      m.source = optional_text(e, "source", "") ;
      if (m.source.empty()) m.source = fmt::format("λ set in the detail file (library entry {}: {})", found->id, found->source);
      m.basis.clear();  // the detail's own λ: its basis is what its source says
    } else if (e->Attribute("source")) {
      m.source = required_text(e, "source");
    }
  } else {
    m.conductivity = required_number(e, "conductivity");
    m.source = optional_text(e, "source", "not stated");
  }
  if (!(m.conductivity > 0.0))
    throw_input_error(m.where, describe(e), fmt::format("conductivity {} W/(m·K) is not positive", m.conductivity),
                      "give the design thermal conductivity λ in W/(m·K), greater than zero");
  if (e->Attribute("uncertainty")) {
    const double u = required_number(e, "uncertainty");
    if (!(u > 0.0 && u < 1.0))
      throw_input_error(m.where, describe(e), fmt::format("uncertainty {} is not a fraction between 0 and 1", u),
                        "give the relative standard uncertainty of λ as a fraction, e.g. uncertainty=\"0.1\" for ±10 %");
    m.relative_uncertainty = u;
  }
  // A hash set: a generated file may define 100 000 materials, and a pairwise check is quadratic.
  if (const auto [it, fresh] = material_lines_.emplace(m.id, m.where.line); !fresh)
    throw_input_error(m.where, describe(e), fmt::format("material id \"{}\" is already used on line {}", m.id, it->second),
                      "give each material its own id");
  section_.materials.push_back(std::move(m));
}

void DetailReader::read_regions(const XMLElement* parent) {
  allow_attributes(parent, {});
  for (const XMLElement* e = parent->FirstChildElement(); e; e = e->NextSiblingElement()) {
    const std::string kind = e->Name();
    Region region;
    region.where = where(e);
    if (kind == "rectangle") {
      allow_attributes(e, {"name", "material", "from", "to"});
      const Point a = parse_point(e, "from"), b = parse_point(e, "to");
      const double x0 = std::min(a.x, b.x), x1 = std::max(a.x, b.x);
      const double y0 = std::min(a.y, b.y), y1 = std::max(a.y, b.y);
      if (x0 == x1 || y0 == y1)
        throw_input_error(where(e), describe(e),
                          fmt::format("has zero area: from {} and to {} have the same {} coordinate, so its {} is 0",
                                      section_.format_point(a), section_.format_point(b), x0 == x1 ? "x" : "y",
                                      x0 == x1 ? "width" : "height"),
                          "give two opposite corners of the rectangle");
      region.outline = {{x0, y0}, {x1, y0}, {x1, y1}, {x0, y1}};
    } else if (kind == "polygon") {
      allow_attributes(e, {"name", "material", "points"});
      region.outline = parse_outline(e, "points", true);
      // The outline closes itself; a repeated first point at the end is accepted and dropped.
      if (region.outline.size() > 1 && region.outline.front().x == region.outline.back().x &&
          region.outline.front().y == region.outline.back().y)
        region.outline.pop_back();
    } else if (kind == "drawing") {
      read_drawing_regions(e);
      continue;
    } else if (kind == "cavity") {
      read_cavity(e, std::move(region));
      continue;
    } else if (kind == "circle") {
      allow_attributes(e, {"name", "material", "centre", "radius"});
      const Point centre = parse_point(e, "centre");
      const double radius = required_number(e, "radius") * section_.metres_per_unit;
      if (!(radius >= 1e-5) || radius > max_abs_coordinate_m)
        throw_input_error(where(e), describe(e), fmt::format("radius {:g} {} is below the 0.01 mm resolution or beyond the coordinate limit",
                                                             radius / section_.metres_per_unit, section_.unit),
                          "give the radius in the file's unit, larger than 0.01 mm");
      const Point start{centre.x + radius, centre.y};
      region.outline = {start};
      for (Point p : arc_points(start, start, centre, true, arc_tolerance_))
        region.outline.push_back(p), section_.chord_points.push_back(p);
    } else {
      throw_input_error(where(e), fmt::format("<{}>", kind),
                        "only <rectangle>, <polygon>, <circle>, <cavity> and <drawing> belong inside <regions>",
                        "describe the area as a rectangle (from, to), a polygon (points, with arcs if curved), a "
                        "circle (centre, radius), or take it from a DXF drawing (<drawing file=\"…\">)");
    }
    region.name = optional_text(e, "name", "");
    if (region.name.empty()) region.name = fmt::format("{} {}", kind, section_.regions.size() + 1);
    section_.regions.push_back(std::move(region));
    material_refs_.push_back({nullptr, required_text(e, "material"), where(e), describe(e)});
  }
}

void DetailReader::read_cavity(const XMLElement* e, Region region) {
  allow_attributes(e, {"name", "points", "heat-flow", "ventilation"});
  region.outline = parse_outline(e, "points", true);
  if (region.outline.size() > 1 && region.outline.front().x == region.outline.back().x &&
      region.outline.front().y == region.outline.back().y)
    region.outline.pop_back();
  region.name = optional_text(e, "name", "");
  if (region.name.empty()) region.name = fmt::format("cavity {}", section_.regions.size() + 1);
  const std::string flow_word = required_text(e, "heat-flow");
  const std::string ventilation_word = optional_text(e, "ventilation", "unventilated");
  if (flow_word != "horizontal" && flow_word != "upward" && flow_word != "downward")
    throw_input_error(where(e), describe(e), fmt::format("heat-flow \"{}\" is not horizontal, upward or downward", flow_word),
                      "give the direction the heat crosses the cavity in the section: horizontal (along x), upward or downward");
  if (ventilation_word == "well-ventilated")
    throw_input_error(where(e), describe(e), "a well-ventilated cavity is part of the air it opens to, not a solid",
                      "leave it out of the regions and give its faces a <surface> facing that environment (ISO 10077-2)");
  if (ventilation_word != "unventilated" && ventilation_word != "slightly-ventilated")
    throw_input_error(where(e), describe(e), fmt::format("ventilation \"{}\" is not unventilated or slightly-ventilated", ventilation_word),
                      "unventilated: closed; slightly-ventilated: joined to the outside or inside air by a slit of 2–10 mm");
  const CavityHeatFlow flow = flow_word == "horizontal" ? CavityHeatFlow::horizontal
                              : flow_word == "upward"   ? CavityHeatFlow::upward
                                                        : CavityHeatFlow::downward;
  double x0 = 1e300, x1 = -1e300, y0 = 1e300, y1 = -1e300;
  for (Point p : region.outline) x0 = std::min(x0, p.x), x1 = std::max(x1, p.x), y0 = std::min(y0, p.y), y1 = std::max(y1, p.y);
  const double area = std::abs(signed_area(region.outline));
  // d along the heat flow, b across it.
  const double depth = flow == CavityHeatFlow::horizontal ? x1 - x0 : y1 - y0;
  const double width = flow == CavityHeatFlow::horizontal ? y1 - y0 : x1 - x0;
  if (!(area > 0.0) || !(depth > 0.0) || !(width > 0.0))
    throw_input_error(where(e), describe(e), "encloses no area", "give the cavity's outline as at least three points around it");
  const FrameCavity cavity = frame_cavity(depth, width, area, flow,
                                          ventilation_word == "unventilated" ? CavityVentilation::unventilated
                                                                             : CavityVentilation::slightly_ventilated);
  // The cavity becomes a solid of its own material, whose source states the derivation.
  Material m;
  m.id = "cavity: " + region.name;
  m.conductivity = cavity.conductivity;
  m.where = where(e);
  const double mm = 1000.0;
  m.source = fmt::format(
      "ISO 10077-2 equivalent conductivity of a{} frame cavity, heat flow {}: area {:.1f} mm², bounding rectangle d {:.1f} × "
      "b {:.1f} mm, equivalent rectangle d′ {:.2f} × b′ {:.2f} mm; ha {:.3f}, hr {:.3f} W/(m²K); λeq = d′(ha + hr){} = {:.4f} W/(m·K)",
      ventilation_word == "unventilated" ? "n unventilated" : " slightly ventilated", flow_word, area * mm * mm, depth * mm,
      width * mm, cavity.depth * mm, cavity.width * mm, cavity.convection, cavity.radiation,
      ventilation_word == "unventilated" ? "" : " × 2", cavity.conductivity);
  if (const auto [it, fresh] = material_lines_.emplace(m.id, m.where.line); !fresh)
    throw_input_error(m.where, describe(e), fmt::format("the name makes the material id \"{}\", already used on line {}", m.id, it->second),
                      "give each cavity its own name");
  region.material = section_.materials.size();
  section_.materials.push_back(std::move(m));
  section_.regions.push_back(std::move(region));
  material_refs_.push_back({nullptr, section_.materials.back().id, where(e), describe(e)});
}

std::string DetailReader::beside_detail_file(const std::string& name) const {
  const std::filesystem::path path(name);
  if (path.is_absolute()) return name;
  return (std::filesystem::path(file_).parent_path() / path).string();
}

const CadDrawing& DetailReader::drawing_for(const XMLElement* e, const std::string& name) {
  const std::string path = beside_detail_file(name);
  auto it = drawings_.find(path);
  if (it == drawings_.end()) {
    DrawingOptions options;
    options.arc_tolerance = arc_tolerance_;
    if (const char* units = e->Attribute("units")) options.unit = units;
    CadDrawing drawing;
    try {
      drawing = read_drawing(path, options);
    } catch (const InputError& problem) {  // name the detail file's line too: that is where the user starts
      throw InputError(fmt::format("{}:{}: {}: {}", file_, e->GetLineNum(), describe(e), problem.what()));
    }
    if (!drawing.unit_stated)
      section_.warnings.push_back(fmt::format(
          "the drawing {} states no unit ($INSUNITS); it was read in millimetres: give units=\"…\" on <drawing> "
          "(line {}) to be sure", name, e->GetLineNum()));
    for (const std::string& note : drawing.notes) section_.warnings.push_back(fmt::format("drawing {}: {}", name, note));
    section_.chord_points.insert(section_.chord_points.end(), drawing.chord_points.begin(), drawing.chord_points.end());
    it = drawings_.emplace(path, std::move(drawing)).first;
  }
  return it->second;
}

void DetailReader::read_drawing_regions(const XMLElement* e) {
  allow_attributes(e, {"file", "units"});
  const std::string name = required_text(e, "file");
  std::vector<LayerMapping> mappings;
  std::set<std::string> layers;
  for (const XMLElement* l = e->FirstChildElement(); l; l = l->NextSiblingElement()) {
    if (std::string(l->Name()) != "layer")
      throw_input_error(where(l), fmt::format("<{}>", l->Name()), "only <layer> belongs inside <drawing>",
                        "map each layer as <layer name=\"LAYER\" material=\"MATERIAL-ID\"/>");
    allow_attributes(l, {"name", "material", "paint-order"});
    const std::string layer = required_text(l, "name");
    const double order = l->Attribute("paint-order") ? required_number(l, "paint-order") : 0.0;
    if (!layers.insert(layer).second)
      throw_input_error(where(l), describe(l), fmt::format("layer \"{}\" is mapped twice", layer), "map each layer once");
    mappings.push_back({layer, required_text(l, "material"), static_cast<int>(order), where(l), describe(l)});
  }
  if (mappings.empty())
    throw_input_error(where(e), describe(e), "maps no layer to a material",
                      "add <layer name=\"LAYER\" material=\"MATERIAL-ID\"/> for each layer that holds regions "
                      "('edgeflux import DRAWING' lists the layers)");
  const CadDrawing& drawing = drawing_for(e, name);
  for (const MappedOutline& o : mapped_outlines(drawing, name, mappings, max_abs_coordinate_m, section_.warnings)) {
    const LayerMapping& m = mappings[o.mapping];
    Region region;
    region.where = m.where;
    region.name = fmt::format("{} {}", o.shape->layer, o.shape->entities);
    region.outline = o.shape->points;
    region.islands = o.shape->islands;
    section_.regions.push_back(std::move(region));
    material_refs_.push_back({nullptr, m.material, m.where, m.object});
  }
}

}  // namespace edgeflux
