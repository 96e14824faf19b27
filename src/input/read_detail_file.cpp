// Reads the XML detail file into a CrossSection, rejecting anything unknown or malformed with a
// message that says where it is and how to fix it.
#include "input/read_detail_file.h"

#include <fmt/format.h>
#include <fmt/ranges.h>
#include <tinyxml2.h>

#include <algorithm>
#include <charconv>
#include <cmath>
#include <filesystem>
#include <fstream>
#include <map>
#include <set>
#include <sstream>
#include <string_view>
#include <unordered_map>

#include "geometry/arc_points.h"
#include "input/drawing_regions.h"
#include "input/read_drawing.h"
#include "geometry/validate_cross_section.h"
#include <muParser.h>

#include <memory>

#include "input/material_library.h"
#include "physics/moisture_verdict.h"
#include "physics/surface_resistance.h"

namespace edgeflux {
namespace {

using tinyxml2::XMLElement;

// Plausibility bounds of the inputs (docs/detail-format.md, Limits). They are far outside any real
// junction, so they never reject a real detail; they catch typing and unit slips and keep the
// arithmetic meaningful: beyond them areas overflow, the 0.01 mm snapping loses its meaning, or a
// value is read that no building has.
/// |x|, |y| of any point, m: 1000 km. A double still resolves 1e-10 m there, far below the
/// 0.01 mm snapping tolerance.
constexpr double max_abs_coordinate_m = 1e6;
/// Largest surface resistance, m²K/W. ISO 6946 values are 0.04–0.17 and ISO 13788 uses 0.25; an
/// edge that exchanges no heat is adiabatic (no surface), not a very large resistance.
constexpr double max_surface_resistance = 10.0;
/// Environment temperatures, °C: from below any cold store or climate to boiling water. The
/// ISO 13788 vapour pressure formula used for the moisture verdict has the same range.
constexpr double min_environment_temperature = -100.0, max_environment_temperature = 100.0;

class Reader {
 public:
  Reader(std::string file, const ParameterOverrides& overrides, double arc_tolerance)
      : file_(std::move(file)), overrides_(overrides), arc_tolerance_(arc_tolerance) {}

  CrossSection read(const std::string& text) {
    tinyxml2::XMLDocument doc;
    if (doc.Parse(text.c_str(), text.size()) != tinyxml2::XML_SUCCESS) {
      throw_input_error({file_, doc.ErrorLineNum()}, "XML",
                        fmt::format("the file is not well-formed XML ({})", doc.ErrorStr()),
                        "check the tags and quotes near this line");
    }
    const XMLElement* root = doc.RootElement();
    if (root != nullptr)
      if (const XMLElement* second = root->NextSiblingElement())
        throw_input_error({file_, second->GetLineNum()}, "XML",
                          fmt::format("a second root element <{}> follows <{}> (line {}); XML allows one root element",
                                      second->Name(), root->Name(), root->GetLineNum()),
                          "keep one <edgeflux-detail> per file and remove or merge the other");
    reject_undefined_entities(text);
    if (root == nullptr || std::string(root->Name()) != "edgeflux-detail")
      throw_input_error({file_, root ? root->GetLineNum() : 1}, "root element",
                        fmt::format("expected <edgeflux-detail>, found <{}>", root ? root->Name() : ""),
                        "start the file with <edgeflux-detail format=\"1\" units=\"mm\">");
    allow_attributes(root, {"format", "units"});
    const std::string format = optional_text(root, "format", "1");
    if (format != "1")
      throw_input_error(where(root), "<edgeflux-detail>", fmt::format("format \"{}\" is not known", format),
                        "this version reads format=\"1\"");
    section_.file = file_;
    const std::string units = optional_text(root, "units", "mm");
    if (units == "mm") section_.metres_per_unit = 0.001;
    else if (units == "cm") section_.metres_per_unit = 0.01;
    else if (units == "m") section_.metres_per_unit = 1.0;
    else
      throw_input_error(where(root), "<edgeflux-detail>", fmt::format("units \"{}\" is not known", units),
                        "use units=\"mm\", \"cm\" or \"m\"");
    section_.unit = units;

    // Parameters come first wherever they stand, so every other block may use them.
    for (const XMLElement* e = root->FirstChildElement("parameters"); e; e = e->NextSiblingElement("parameters"))
      for_children(e, "parameter", [&](const XMLElement* p) { read_parameter(p); });
    for (const auto& [name, value] : overrides_) {
      const auto it = std::find_if(section_.parameters.begin(), section_.parameters.end(),
                                   [&](const Parameter& p) { return p.name == name; });
      if (it == section_.parameters.end())
        throw_input_error({file_, 0}, fmt::format("parameter '{}'", name), "is set on the command line but not defined in the file",
                          fmt::format("use one of: {}", parameter_names()));
    }

    for (const XMLElement* e = root->FirstChildElement(); e; e = e->NextSiblingElement()) {
      const std::string name = e->Name();
      if (name == "parameters") continue;
      if (name == "title") section_.title = element_text(e);
      else if (name == "notes") section_.notes = element_text(e);
      else if (name == "materials") for_children(e, "material", [&](const XMLElement* m) { read_material(m); });
      else if (name == "regions") read_regions(e);
      else if (name == "environments") for_children(e, "environment", [&](const XMLElement* v) { read_environment(v); });
      else if (name == "boundaries") read_boundaries(e);
      else if (name == "probes") for_children(e, "probe", [&](const XMLElement* p) { read_probe(p); });
      else if (name == "flanking-elements") read_flanking_elements(e);
      else if (name == "climate") read_climate(e);
      else if (name == "mesh") read_mesh(e);
      else
        throw_input_error(where(e), fmt::format("<{}>", name), "this element is not part of the detail format",
                          "use title, notes, parameters, materials, regions, environments, boundaries, probes, "
                          "flanking-elements, climate or mesh (see docs/detail-format.md)");
    }
    resolve_references();
    validate_cross_section(section_);
    return std::move(section_);
  }

 private:
  std::string file_;
  ParameterOverrides overrides_;
  double arc_tolerance_;
  std::map<std::string, CadDrawing> drawings_;  ///< by path, each read once
  CrossSection section_;
  // muparser keeps pointers to the variables: stable storage, one slot per parameter.
  std::vector<std::unique_ptr<double>> parameter_values_;

  /// tinyxml2 keeps an entity reference it does not know, such as "&bogus;", as literal text, and it
  /// expands no entity declared in a DTD. So a title or attribute would silently carry "&bogus;":
  /// parse again without entity processing and reject every reference other than the five XML
  /// entities and numeric character references. CDATA, comments and the DTD are not scanned.
  void reject_undefined_entities(const std::string& text) const {
    tinyxml2::XMLDocument raw(false);
    raw.Parse(text.c_str(), text.size());
    for (const tinyxml2::XMLNode* n = raw.FirstChild(); n; n = n->NextSibling()) scan_entities(n);
  }

  void scan_entities(const tinyxml2::XMLNode* node) const {
    if (const XMLElement* e = node->ToElement()) {
      for (const tinyxml2::XMLAttribute* a = e->FirstAttribute(); a; a = a->Next())
        check_entities(a->Value(), a->GetLineNum(), fmt::format("<{}> attribute \"{}\"", e->Name(), a->Name()));
      for (const tinyxml2::XMLNode* child = e->FirstChild(); child; child = child->NextSibling()) {
        if (const tinyxml2::XMLText* t = child->ToText()) {
          if (!t->CData()) check_entities(t->Value(), t->GetLineNum(), fmt::format("text of <{}>", e->Name()));
        } else {
          scan_entities(child);
        }
      }
    }
  }

  void check_entities(std::string_view value, int line, const std::string& object) const {
    static constexpr std::string_view known[] = {"amp", "lt", "gt", "quot", "apos"};
    for (std::size_t at = value.find('&'); at != std::string_view::npos; at = value.find('&', at + 1)) {
      const std::size_t end = value.find(';', at);
      const std::string_view name = end == std::string_view::npos ? std::string_view{} : value.substr(at + 1, end - at - 1);
      const bool decimal = name.size() > 1 && name[0] == '#' &&
                           std::all_of(name.begin() + 1, name.end(), [](unsigned char c) { return std::isdigit(c); });
      const bool hex = name.size() > 2 && name[0] == '#' && name[1] == 'x' &&
                       std::all_of(name.begin() + 2, name.end(), [](unsigned char c) { return std::isxdigit(c); });
      if (decimal || hex || std::find(std::begin(known), std::end(known), name) != std::end(known)) continue;
      // The line of the reference itself: the node's first line plus the line breaks before it.
      const int here = line + static_cast<int>(std::count(value.begin(), value.begin() + at, '\n'));
      const std::string shown(value.substr(at, end == std::string_view::npos || end - at > 40 ? std::min<std::size_t>(20, value.size() - at) : end - at + 1));
      throw_input_error({file_, here}, object,
                        fmt::format("the entity reference \"{}\" is not defined (XML, and edgeflux, know only &amp; &lt; "
                                    "&gt; &quot; &apos; and numeric references such as &#176;; entities declared in a "
                                    "DTD are not expanded)", shown),
                        "write the character itself (UTF-8), or &amp; for a literal &");
    }
  }

  std::string parameter_names() const {
    std::string names;
    for (const Parameter& p : section_.parameters) names += (names.empty() ? "" : ", ") + p.name;
    return names.empty() ? "(none defined)" : names;
  }

  /// Value of one expression over the parameters defined so far.
  double evaluate(const std::string& expression, const XMLElement* e, const std::string& what) const {
    try {
      mu::Parser parser;
      for (std::size_t i = 0; i < section_.parameters.size(); ++i)
        parser.DefineVar(section_.parameters[i].name, parameter_values_[i].get());
      parser.SetExpr(expression);
      const double value = parser.Eval();
      if (!std::isfinite(value))
        throw_input_error(where(e), describe(e), fmt::format("{}: the expression \"{}\" is not finite", what, expression),
                          "check for a division by zero or a logarithm of a non-positive value");
      return value;
    } catch (const mu::Parser::exception_type& error) {
      std::string reason = error.GetMsg();
      while (!reason.empty() && (reason.back() == '.' || reason.back() == ' ')) reason.pop_back();
      throw_input_error(where(e), describe(e),
                        fmt::format("{}: cannot evaluate \"{}\": {}", what, expression, reason),
                        fmt::format("use numbers, + - * / ^, parentheses, functions such as min(a,b), sqrt(x), and "
                                    "the parameters defined before this line: {}", parameter_names()));
    }
  }

  /// Replaces every {expression} in a numeric attribute by its value.
  std::string expand(const std::string& text, const XMLElement* e, const std::string& what) const {
    std::string out;
    std::size_t at = 0;
    while (true) {
      const std::size_t open = text.find('{', at);
      if (open == std::string::npos) break;
      const std::size_t close = text.find('}', open);
      if (close == std::string::npos)
        throw_input_error(where(e), describe(e), fmt::format("{}: \"{{\" without a closing \"}}\"", what),
                          "write an expression as {name} or {2*name + 10}");
      out += text.substr(at, open - at);
      out += fmt::format("{:.17g}", evaluate(text.substr(open + 1, close - open - 1), e, what));
      at = close + 1;
    }
    return out + text.substr(at);
  }

  void read_parameter(const XMLElement* e) {
    allow_attributes(e, {"name", "value", "description"});
    Parameter p;
    p.name = required_text(e, "name");
    p.where = where(e);
    const bool valid_name = std::isalpha(static_cast<unsigned char>(p.name[0])) &&
                            std::all_of(p.name.begin(), p.name.end(), [](unsigned char c) { return std::isalnum(c) || c == '_'; });
    if (!valid_name)
      throw_input_error(p.where, describe(e), fmt::format("\"{}\" is not a valid parameter name", p.name),
                        "use letters, digits and _ , starting with a letter, e.g. insulation_thickness");
    for (const Parameter& other : section_.parameters)
      if (other.name == p.name)
        throw_input_error(p.where, describe(e), fmt::format("parameter \"{}\" is already defined on line {}", p.name, other.where.line),
                          "give each parameter its own name");
    const std::string text = required_text(e, "value");
    p.value = evaluate(text, e, "attribute \"value\"");
    if (const auto it = overrides_.find(p.name); it != overrides_.end()) p.value = it->second, p.overridden = true;
    p.description = optional_text(e, "description", "");
    section_.parameters.push_back(p);
    parameter_values_.push_back(std::make_unique<double>(p.value));
  }
  // References are resolved after reading so the order of the blocks in the file does not matter.
  struct PendingRef { std::size_t* target; std::string id; SourceLocation where; std::string object; };
  std::vector<PendingRef> material_refs_, environment_refs_;
  std::vector<std::string> surface_resistance_text_;  // per surface, for the temperature-run default
  std::unordered_map<std::string, int> material_lines_, environment_lines_;  // id → line, for duplicates

  SourceLocation where(const XMLElement* e) const { return {file_, e->GetLineNum()}; }

  static std::string element_text(const XMLElement* e) { return e->GetText() ? e->GetText() : ""; }

  template <class F>
  void for_children(const XMLElement* parent, const char* child, F&& read_one) {
    allow_attributes(parent, {});
    for (const XMLElement* e = parent->FirstChildElement(); e; e = e->NextSiblingElement()) {
      if (std::string(e->Name()) != child)
        throw_input_error(where(e), fmt::format("<{}>", e->Name()),
                          fmt::format("only <{}> elements belong inside <{}>", child, parent->Name()),
                          "move or remove this element");
      read_one(e);
    }
  }

  void allow_attributes(const XMLElement* e, std::initializer_list<const char*> allowed) const {
    for (const tinyxml2::XMLAttribute* a = e->FirstAttribute(); a; a = a->Next()) {
      const bool ok = std::any_of(allowed.begin(), allowed.end(),
                                  [&](const char* name) { return std::string(name) == a->Name(); });
      if (!ok) {
        std::string list;
        for (const char* name : allowed) list += (list.empty() ? "" : ", ") + std::string(name);
        throw_input_error(where(e), fmt::format("<{}>", e->Name()),
                          fmt::format("attribute \"{}\" is not known here", a->Name()),
                          list.empty() ? "remove it" : fmt::format("the attributes allowed are: {}", list));
      }
    }
  }

  std::string describe(const XMLElement* e) const {
    for (const char* key : {"id", "name"})
      if (const char* v = e->Attribute(key)) return fmt::format("<{} {}=\"{}\">", e->Name(), key, v);
    return fmt::format("<{}>", e->Name());
  }

  std::string required_text(const XMLElement* e, const char* attribute) const {
    const char* v = e->Attribute(attribute);
    if (v == nullptr || std::string(v).empty())
      throw_input_error(where(e), describe(e), fmt::format("attribute \"{}\" is missing", attribute),
                        fmt::format("add {}=\"...\"", attribute));
    return v;
  }

  static std::string optional_text(const XMLElement* e, const char* attribute, const char* fallback) {
    const char* v = e->Attribute(attribute);
    return v ? v : fallback;
  }

  /// Parses one finite number; `what` names it in the message.
  double parse_number(const std::string& raw, const XMLElement* e, const std::string& what) const {
    const std::string text = raw.find('{') == std::string::npos ? raw : expand(raw, e, what);
    const char* begin = text.data();
    const char* end = begin + text.size();
    while (begin < end && std::isspace(static_cast<unsigned char>(*begin))) ++begin;
    while (end > begin && std::isspace(static_cast<unsigned char>(end[-1]))) --end;
    if (begin < end && *begin == '+') ++begin;
    double value = 0.0;
    const auto [ptr, ec] = std::from_chars(begin, end, value);
    if (ec != std::errc() || ptr != end || begin == end)
      throw_input_error(where(e), describe(e), fmt::format("{} \"{}\" is not a number", what, text),
                        "write a plain decimal number such as 0.035 or 200");
    if (!std::isfinite(value))
      throw_input_error(where(e), describe(e), fmt::format("{} \"{}\" is not a finite number", what, text),
                        "write a finite decimal number");
    return value;
  }

  double required_number(const XMLElement* e, const char* attribute) const {
    return parse_number(required_text(e, attribute), e, fmt::format("attribute \"{}\"", attribute));
  }

  /// "x,y x,y ..." in the file's unit → metres.
  std::vector<Point> parse_points(const XMLElement* e, const char* attribute) const {
    std::string text = expand(required_text(e, attribute), e, fmt::format("attribute \"{}\"", attribute));
    if (text.find('(') != std::string::npos)
      throw_input_error(where(e), describe(e), fmt::format("attribute \"{}\" takes points only, no arcs", attribute),
                        "give points as x,y pairs separated by spaces, e.g. \"0,0 200,0\"");
    return numbers_to_points(e, attribute, split_numbers(text, e, attribute));
  }

  std::vector<double> split_numbers(std::string text, const XMLElement* e, const char* attribute) const {
    std::replace(text.begin(), text.end(), ',', ' ');
    std::replace(text.begin(), text.end(), ';', ' ');
    std::istringstream in(text);
    std::vector<double> numbers;
    for (std::string token; in >> token;)
      numbers.push_back(parse_number(token, e, fmt::format("coordinate in \"{}\"", attribute)));
    return numbers;
  }

  /// A point list that may contain arcs: "x,y ccw(cx,cy) x,y" makes the edge between the two points
  /// the circular arc about (cx, cy), turning counter-clockwise ("cw(…)": clockwise). In a closed
  /// outline an arc after the last point closes it; a path from a point round to the same point is
  /// a full circle. Arcs come back as chords (arc_points, the reader's chord tolerance).
  std::vector<Point> parse_outline(const XMLElement* e, const char* attribute, bool closed) {
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

  std::vector<Point> numbers_to_points(const XMLElement* e, const char* attribute, const std::vector<double>& numbers) const {
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

  Point parse_point(const XMLElement* e, const char* attribute) const {
    const auto points = parse_points(e, attribute);
    if (points.size() != 1)
      throw_input_error(where(e), describe(e),
                        fmt::format("attribute \"{}\" must be one point x,y", attribute), "write e.g. \"0,47.5\"");
    return points[0];
  }

  void read_material(const XMLElement* e) {
    allow_attributes(e, {"id", "conductivity", "source", "library"});
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
      if (e->Attribute("conductivity")) {
        m.conductivity = required_number(e, "conductivity");
        m.source = optional_text(e, "source", "") ;
        if (m.source.empty()) m.source = fmt::format("λ set in the detail file (library entry {}: {})", found->id, found->source);
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
    // A hash set: a generated file may define 100 000 materials, and a pairwise check is quadratic.
    if (const auto [it, fresh] = material_lines_.emplace(m.id, m.where.line); !fresh)
      throw_input_error(m.where, describe(e), fmt::format("material id \"{}\" is already used on line {}", m.id, it->second),
                        "give each material its own id");
    section_.materials.push_back(std::move(m));
  }

  void read_regions(const XMLElement* parent) {
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
                          "only <rectangle>, <polygon>, <circle> and <drawing> belong inside <regions>",
                          "describe the area as a rectangle (from, to), a polygon (points, with arcs if curved), a "
                          "circle (centre, radius), or take it from a DXF drawing (<drawing file=\"…\">)");
      }
      region.name = optional_text(e, "name", "");
      if (region.name.empty()) region.name = fmt::format("{} {}", kind, section_.regions.size() + 1);
      section_.regions.push_back(std::move(region));
      material_refs_.push_back({nullptr, required_text(e, "material"), where(e), describe(e)});
    }
  }

  /// A DXF file beside the detail file, relative to the detail file's folder.
  std::string beside_detail_file(const std::string& name) const {
    const std::filesystem::path path(name);
    if (path.is_absolute()) return name;
    return (std::filesystem::path(file_).parent_path() / path).string();
  }

  const CadDrawing& drawing_for(const XMLElement* e, const std::string& name) {
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

  /// <drawing file="…" units="…"><layer name="…" material="…" paint-order="…"/>…</drawing>: every
  /// closed outline on a mapped layer becomes a region, painted in the drawing's entity order
  /// (layers with a lower paint-order first).
  void read_drawing_regions(const XMLElement* e) {
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

  void read_environment(const XMLElement* e) {
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

  double parse_resistance(const XMLElement* e, const std::string& text, const char* attribute) const {
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

  void read_boundaries(const XMLElement* parent) {
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

  /// A surface whose path is every open chain of lines on a layer of the detail's drawing (one
  /// surface per chain, numbered after the first).
  void read_drawing_surfaces(const XMLElement* e, const std::string& layer, Surface surface) {
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

  void read_probe(const XMLElement* e) {
    allow_attributes(e, {"name", "at"});
    Probe probe{required_text(e, "name"), parse_point(e, "at"), where(e)};
    section_.probes.push_back(std::move(probe));
  }

  void read_flanking_elements(const XMLElement* parent) {
    allow_attributes(parent, {"dimension-systems"});
    section_.flanking_where = where(parent);
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

  void read_flanking(const XMLElement* e, const std::map<std::string, Point>& reference_points) {
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

  void read_climate(const XMLElement* e) {
    allow_attributes(e, {"interior-temperature", "interior-humidity", "humidity-class", "exterior-temperature",
                         "exterior-humidity", "rule"});
    Climate c;
    c.where = where(e);
    c.interior_temperature = required_number(e, "interior-temperature");
    c.exterior_temperature = required_number(e, "exterior-temperature");
    if (e->Attribute("interior-humidity")) {
      const double rh = required_number(e, "interior-humidity");
      if (rh < 0.0 || rh > 100.0)
        throw_input_error(c.where, "<climate>", fmt::format("interior-humidity {} % is outside 0–100 %", rh),
                          "give the relative humidity in percent");
      c.interior_relative_humidity = rh / 100.0;
    }
    if (e->Attribute("humidity-class")) {
      const double cls = required_number(e, "humidity-class");
      if (cls != std::floor(cls) || cls < 1 || cls > 5)
        throw_input_error(c.where, "<climate>", fmt::format("humidity-class {} is not 1, 2, 3, 4 or 5", cls),
                          "use an ISO 13788 internal humidity class 1–5");
      c.humidity_class = static_cast<int>(cls);
    }
    if (e->Attribute("exterior-humidity")) {
      const double rh = required_number(e, "exterior-humidity");
      if (rh < 0.0 || rh > 100.0)
        throw_input_error(c.where, "<climate>", fmt::format("exterior-humidity {} % is outside 0–100 %", rh),
                          "give the relative humidity in percent");
      c.exterior_relative_humidity = rh / 100.0;
    }
    if (c.interior_relative_humidity.has_value() == c.humidity_class.has_value())
      throw_input_error(c.where, "<climate>", "give exactly one of interior-humidity and humidity-class",
                        "e.g. interior-humidity=\"50\" (percent) or humidity-class=\"3\"");
    if (c.interior_temperature == c.exterior_temperature)
      throw_input_error(c.where, "<climate>", "interior and exterior temperatures are equal, so fRsi is undefined",
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

  void read_mesh(const XMLElement* e) {
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

  void resolve_references() {
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

  template <class Map>
  static std::string list_keys(const Map& m) {
    std::string out;
    for (const auto& [key, value] : m) out += (out.empty() ? "" : ", ") + key;
    return out.empty() ? "(none defined)" : out;
  }
};

}  // namespace

CrossSection parse_detail_text(const std::string& text, const std::string& file_name, const ParameterOverrides& overrides,
                               double arc_tolerance) {
  return Reader(file_name, overrides, arc_tolerance).read(text);
}

CrossSection read_detail_file(const std::string& path, const ParameterOverrides& overrides, double arc_tolerance) {
  std::ifstream in(path, std::ios::binary);
  if (!in)
    throw_input_error({path, 0}, "detail file", "cannot be opened (missing or unreadable)",
                      "check the path; run 'edgeflux solve --help' for usage");
  std::ostringstream text;
  text << in.rdbuf();
  return parse_detail_text(text.str(), path, overrides, arc_tolerance);
}

}  // namespace edgeflux
