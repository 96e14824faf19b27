// Reading environments, surfaces, probes, flanking elements, the climate and the mesh settings,
// and resolving the references between them.
#include "input/detail_reader.h"

namespace edgeflux {

void DetailReader::read_environment(const XMLElement* e) {
  allow_attributes(e, {"id", "temperature", "side"});
  Environment env;
  env.id = required_text(e, "id");
  env.where = where(e);
  env.temperature = required_number(e, "temperature");
  const std::string side = optional_text(e, "side", "other");
  if (side == "interior") env.side = Side::interior;
  else if (side == "exterior") env.side = Side::exterior;
  else if (side == "other") env.side = Side::other;
  else
    throw_input_error(env.where, describe(e), fmt::format("side \"{}\" is not known", side),
                      "use side=\"interior\", \"exterior\" or \"other\"");
  if (env.temperature < -273.15)
    throw_input_error(env.where, describe(e), fmt::format("temperature {} °C is below absolute zero", env.temperature),
                      "give the temperature in degrees Celsius");
  if (!(env.temperature >= min_environment_temperature && env.temperature <= max_environment_temperature))
    throw_input_error(env.where, describe(e),
                      fmt::format("temperature {:g} °C is outside the plausible range {:g} to {:g} °C", env.temperature,
                                  min_environment_temperature, max_environment_temperature),
                      "give the design temperature of the air or boundary in degrees Celsius");
  if (const auto [it, fresh] = environment_lines_.emplace(env.id, env.where.line); !fresh)
    throw_input_error(env.where, describe(e), fmt::format("environment id \"{}\" is already used on line {}", env.id, it->second),
                      "give each environment its own id");
  section_.environments.push_back(std::move(env));
}

double DetailReader::parse_resistance(const XMLElement* e, const std::string& text, const char* attribute) const {
  if (auto preset = surface_resistance_preset(text)) return *preset;
  if (!text.empty() && (std::isdigit(static_cast<unsigned char>(text[0])) || text[0] == '.' || text[0] == '-' ||
                        text[0] == '+' || text[0] == '{')) {
    const double value = parse_number(text, e, fmt::format("attribute \"{}\"", attribute));
    if (value < 0.0)
      throw_input_error(where(e), describe(e), fmt::format("surface resistance {} m²K/W is negative", value),
                        "give a resistance ≥ 0 (0 means a fixed surface temperature)");
    if (value > max_surface_resistance)
      throw_input_error(where(e), describe(e),
                        fmt::format("surface resistance {:g} m²K/W in attribute \"{}\" is above the plausible {:g} m²K/W",
                                    value, attribute, max_surface_resistance),
                        "give Rs in m²K/W (ISO 6946: 0.04–0.17); leave an edge that exchanges no heat without a "
                        "surface (it is adiabatic), and model a thick layer in front of it as a region");
    return value;
  }
  std::string names;
  for (const auto& p : surface_resistance_presets()) names += (names.empty() ? "" : ", ") + std::string(p.id);
  throw_input_error(where(e), describe(e), fmt::format("surface resistance \"{}\" is neither a number nor a preset", text),
                    fmt::format("give a value in m²K/W or one of: {}", names));
}

void DetailReader::read_boundaries(const XMLElement* parent) {
  allow_attributes(parent, {});
  for (const XMLElement* e = parent->FirstChildElement(); e; e = e->NextSiblingElement()) {
    const std::string kind = e->Name();
    Surface surface;
    surface.where = where(e);
    if (kind == "surface") {
      allow_attributes(e, {"name", "environment", "resistance", "temperature-run-resistance", "kind", "path", "drawing-layer"});
      surface.resistance = parse_resistance(e, required_text(e, "resistance"), "resistance");
      if (const char* t = e->Attribute("temperature-run-resistance"))
        surface.temperature_run_resistance_given = parse_resistance(e, t, "temperature-run-resistance");
      const std::string surface_kind = optional_text(e, "kind", "opaque");
      if (surface_kind == "glazing") surface.kind = SurfaceKind::glazing;
      else if (surface_kind != "opaque")
        throw_input_error(where(e), describe(e), fmt::format("kind \"{}\" is not known", surface_kind),
                          "use kind=\"opaque\" or kind=\"glazing\" (glazing and frames)");
    } else if (kind == "fixed-temperature") {
      allow_attributes(e, {"name", "environment", "path", "drawing-layer"});
      surface.resistance = 0.0;
    } else {
      throw_input_error(where(e), fmt::format("<{}>", kind),
                        "only <surface> and <fixed-temperature> belong inside <boundaries>",
                        "every boundary edge not named by one of them is adiabatic");
    }
    if (const char* layer = e->Attribute("drawing-layer")) {
      read_drawing_surfaces(e, layer, std::move(surface));
      continue;
    }
    surface.path = parse_outline(e, "path", false);
    if (surface.path.size() < 2)
      throw_input_error(where(e), describe(e), "the path needs at least two points",
                        "give the path as points along the boundary, e.g. \"0,0 0,1000\"");
    surface.name = optional_text(e, "name", "");
    if (surface.name.empty()) surface.name = fmt::format("{} {}", kind, section_.surfaces.size() + 1);
    environment_refs_.push_back({nullptr, required_text(e, "environment"), where(e), describe(e)});
    section_.surfaces.push_back(std::move(surface));
  }
}

void DetailReader::read_drawing_surfaces(const XMLElement* e, const std::string& layer, Surface surface) {
  if (e->Attribute("path"))
    throw_input_error(where(e), describe(e), "has both path and drawing-layer", "give the path in one way only");
  if (drawings_.empty())
    throw_input_error(where(e), describe(e), fmt::format("takes its path from drawing layer \"{}\", but the file reads no drawing", layer),
                      "add <drawing file=\"…\"> inside <regions> before using drawing-layer");
  std::vector<const DrawnShape*> chains;
  const CadDrawing* source = nullptr;
  for (const auto& [path, drawing] : drawings_)
    for (const DrawnShape& chain : drawing.chains)
      if (chain.layer == layer) {
        if (source && source != &drawing)
          throw_input_error(where(e), describe(e), fmt::format("layer \"{}\" exists in two drawings", layer),
                            "rename the layer in one of them");
        source = &drawing, chains.push_back(&chain);
      }
  if (chains.empty())
    throw_input_error(where(e), describe(e), fmt::format("the drawing has no open lines on layer \"{}\"", layer),
                      "draw the surface as a line or an open polyline along the outline on that layer");
  const std::string given = optional_text(e, "name", "");
  const std::string base = given.empty() ? fmt::format("{} {}", layer, section_.surfaces.size() + 1) : given;
  for (std::size_t k = 0; k < chains.size(); ++k) {
    Surface part = surface;
    part.path = chains[k]->points;
    part.name = k == 0 ? base : fmt::format("{} {}", base, k + 1);
    environment_refs_.push_back({nullptr, required_text(e, "environment"), where(e), describe(e)});
    section_.surfaces.push_back(std::move(part));
  }
}

void DetailReader::read_probe(const XMLElement* e) {
  allow_attributes(e, {"name", "at"});
  Probe probe{required_text(e, "name"), parse_point(e, "at"), where(e)};
  section_.probes.push_back(std::move(probe));
}

void DetailReader::read_flanking_elements(const XMLElement* parent) {
  allow_attributes(parent, {"dimension-systems", "carry-forward"});
  section_.flanking_where = where(parent);
  if (const char* carried = parent->Attribute("carry-forward")) {
    const auto system = dimension_system_from_word(carried);
    if (!system)
      throw_input_error(where(parent), "<flanking-elements>", fmt::format("carry-forward dimension system \"{}\" is not known", carried),
                        "write one of: internal overall-internal external (the system of the energy calculation the ψ goes into)");
    section_.carried_forward = *system;
  }
  if (const char* systems = parent->Attribute("dimension-systems")) {
    std::istringstream in(systems);
    for (std::string word; in >> word;) {
      if (word == "internal") section_.requested_systems.push_back(DimensionSystem::internal);
      else if (word == "overall-internal") section_.requested_systems.push_back(DimensionSystem::overall_internal);
      else if (word == "external") section_.requested_systems.push_back(DimensionSystem::external);
      else
        throw_input_error(where(parent), "<flanking-elements>", fmt::format("dimension system \"{}\" is not known", word),
                          "list any of: internal overall-internal external");
    }
  }
  std::map<std::string, Point> reference_points;
  for (const XMLElement* e = parent->FirstChildElement("reference-point"); e; e = e->NextSiblingElement("reference-point")) {
    allow_attributes(e, {"name", "at"});
    if (!reference_points.emplace(required_text(e, "name"), parse_point(e, "at")).second)
      throw_input_error(where(e), describe(e), "this reference-point name is already used", "give each point its own name");
  }
  for (const XMLElement* e = parent->FirstChildElement(); e; e = e->NextSiblingElement()) {
    const std::string name = e->Name();
    if (name == "reference-point") continue;
    if (name != "element")
      throw_input_error(where(e), fmt::format("<{}>", name), "only <element> and <reference-point> belong inside <flanking-elements>",
                        "move or remove this element");
    read_flanking(e, reference_points);
  }
}

void DetailReader::read_flanking(const XMLElement* e, const std::map<std::string, Point>& reference_points) {
  allow_attributes(e, {"id", "cut-off", "u-value", "length-internal", "length-overall-internal", "length-external",
                       "internal-from", "overall-internal-from", "external-from"});
  FlankingElement f;
  f.id = required_text(e, "id");
  f.where = where(e);
  const auto cut = parse_points(e, "cut-off");
  if (cut.size() != 2)
    throw_input_error(f.where, describe(e), "cut-off must be two points (the ends of the cut-off edge)",
                      "write e.g. cut-off=\"0,1200 300,1200\"");
  f.cut_off_start = cut[0], f.cut_off_end = cut[1];
  if (distance(cut[0], cut[1]) == 0.0)
    throw_input_error(f.where, describe(e), "the two cut-off points coincide", "give both ends of the cut-off edge");
  if (e->Attribute("u-value")) {
    f.u_value = required_number(e, "u-value");
    if (!(*f.u_value > 0.0))
      throw_input_error(f.where, describe(e), "u-value must be positive", "give U in W/(m²K)");
  }
  const char* length_keys[3] = {"length-internal", "length-overall-internal", "length-external"};
  const char* from_keys[3] = {"internal-from", "overall-internal-from", "external-from"};
  for (int s = 0; s < 3; ++s) {
    if (e->Attribute(length_keys[s]) && e->Attribute(from_keys[s]))
      throw_input_error(f.where, describe(e), fmt::format("both {} and {} are given", length_keys[s], from_keys[s]),
                        "state the length or name the reference point it is measured from, not both");
    if (e->Attribute(length_keys[s])) {
      const double length = required_number(e, length_keys[s]) * section_.metres_per_unit;
      if (length < 0.0)
        throw_input_error(f.where, describe(e), fmt::format("{} is negative", length_keys[s]), "give a length ≥ 0");
      if (length > max_abs_coordinate_m)
        throw_input_error(f.where, describe(e), fmt::format("{} is too large (above {:g} m)", length_keys[s], max_abs_coordinate_m),
                          "check the number and the units attribute of <edgeflux-detail>");
      f.length[s] = length;
    } else if (const char* from = e->Attribute(from_keys[s])) {
      const auto it = reference_points.find(from);
      if (it == reference_points.end())
        throw_input_error(f.where, describe(e), fmt::format("reference point \"{}\" is not defined", from),
                          fmt::format("add <reference-point name=\"{}\" at=\"x,y\"/> inside <flanking-elements>", from));
      // The length over which U applies runs from the reference point (a face of the junction in
      // that dimension system) to the cut-off plane: the point's distance from the cut-off line.
      const Point d = f.cut_off_end - f.cut_off_start;
      f.length[s] = std::abs(cross(d, it->second - f.cut_off_start)) / norm(d);
    }
  }
  section_.flanking_elements.push_back(std::move(f));
}

void DetailReader::read_climate(const XMLElement* e) {
  allow_attributes(e, {"interior-temperature", "interior-humidity", "humidity-class", "exterior-temperature",
                       "exterior-humidity", "rule"});
  Climate c;
  c.where = where(e);
  c.interior_temperature = required_number(e, "interior-temperature");
  c.exterior_temperature = required_number(e, "exterior-temperature");
  // A relative humidity in percent, as a fraction.
  auto humidity = [&](const char* attribute) {
    const double rh = required_number(e, attribute);
    if (rh < 0.0 || rh > 100.0)
      throw_input_error(c.where, "<climate>", fmt::format("{} {} % is outside 0–100 %", attribute, rh),
                        "give the relative humidity in percent");
    return rh / 100.0;
  };
  if (e->Attribute("interior-humidity")) c.interior_relative_humidity = humidity("interior-humidity");
  if (e->Attribute("humidity-class")) {
    const double cls = required_number(e, "humidity-class");
    if (cls != std::floor(cls) || cls < 1 || cls > 5)
      throw_input_error(c.where, "<climate>", fmt::format("humidity-class {} is not 1, 2, 3, 4 or 5", cls),
                        "use an ISO 13788 internal humidity class 1–5");
    c.humidity_class = static_cast<int>(cls);
  }
  if (e->Attribute("exterior-humidity")) c.exterior_relative_humidity = humidity("exterior-humidity");
  if (c.interior_relative_humidity.has_value() == c.humidity_class.has_value())
    throw_input_error(c.where, "<climate>", "give exactly one of interior-humidity and humidity-class",
                      "e.g. interior-humidity=\"50\" (percent) or humidity-class=\"3\"");
  if (c.interior_temperature == c.exterior_temperature)
    throw_input_error(c.where, "<climate>", "interior and exterior temperatures are equal, so fRsi is undefined",
                      "use the design temperatures of the assessment, e.g. 20 and -5");
  if (std::abs(c.interior_temperature - c.exterior_temperature) < min_temperature_difference)
    throw_input_error(c.where, "<climate>",
                      fmt::format("interior and exterior temperatures differ by {:.3g} K, less than the {} K a temperature "
                                  "factor can be judged on", std::abs(c.interior_temperature - c.exterior_temperature),
                                  min_temperature_difference),
                      "use the design temperatures of the assessment, e.g. 20 and -5");
  c.rule = optional_text(e, "rule", "none");
  if (!minimum_temperature_factor_rule(c.rule)) {
    std::string names;
    for (const auto& r : minimum_temperature_factor_rules()) names += (names.empty() ? "" : ", ") + std::string(r.id);
    throw_input_error(c.where, "<climate>", fmt::format("rule \"{}\" is not known", c.rule),
                      fmt::format("use one of: {}", names));
  }
  section_.climate = c;
}

void DetailReader::read_mesh(const XMLElement* e) {
  allow_attributes(e, {"density", "mesher"});
  if (e->Attribute("density")) {
    section_.mesh.density = required_number(e, "density");
    if (!(section_.mesh.density >= MeshSettings::min_density && section_.mesh.density <= MeshSettings::max_density))
      throw_input_error(where(e), "<mesh>", fmt::format("density {} is outside [{}, {}]", section_.mesh.density,
                                                        MeshSettings::min_density, MeshSettings::max_density),
                        "use 1 for the default mesh, 2 for about twice the elements along every length");
  }
  const std::string mesher = optional_text(e, "mesher", "automatic");
  if (mesher == "automatic") section_.mesh.mesher = MeshSettings::Mesher::automatic;
  else if (mesher == "grid") section_.mesh.mesher = MeshSettings::Mesher::grid;
  else if (mesher == "delaunay") section_.mesh.mesher = MeshSettings::Mesher::delaunay;
  else
    throw_input_error(where(e), "<mesh>", fmt::format("mesher \"{}\" is not known", mesher),
                      "use mesher=\"automatic\", \"grid\" or \"delaunay\"");
}

void DetailReader::resolve_references() {
  std::map<std::string, std::size_t> materials, environments;
  for (std::size_t i = 0; i < section_.materials.size(); ++i) materials[section_.materials[i].id] = i;
  for (std::size_t i = 0; i < section_.environments.size(); ++i) environments[section_.environments[i].id] = i;
  for (std::size_t r = 0; r < material_refs_.size(); ++r) {
    const auto& ref = material_refs_[r];
    const auto it = materials.find(ref.id);
    if (it == materials.end())
      throw_input_error(ref.where, ref.object, fmt::format("material \"{}\" is not defined", ref.id),
                        fmt::format("define <material id=\"{}\" .../> inside <materials>, or use one of: {}", ref.id,
                                    list_keys(materials)));
    section_.regions[r].material = it->second;
  }
  for (std::size_t s = 0; s < environment_refs_.size(); ++s) {
    const auto& ref = environment_refs_[s];
    const auto it = environments.find(ref.id);
    if (it == environments.end())
      throw_input_error(ref.where, ref.object, fmt::format("environment \"{}\" is not defined", ref.id),
                        fmt::format("define <environment id=\"{}\" temperature=\"...\"/> inside <environments>{}", ref.id,
                                    environments.empty() ? "" : ", or use one of: " + list_keys(environments)));
    Surface& surface = section_.surfaces[s];
    surface.environment = it->second;
  }
}

}  // namespace edgeflux
