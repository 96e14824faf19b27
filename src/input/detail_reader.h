// The detail-file reader: one object per file read, with the helpers every element's reader
// shares. Its methods are defined in read_detail_file.cpp (document, parameters, attributes),
// detail_regions.cpp (materials, regions, drawings) and detail_boundaries.cpp (environments,
// surfaces, flanking elements, climate, mesh). The only header that includes tinyxml2 and muparser.
#pragma once

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

class DetailReader {
 public:
  DetailReader(std::string file, const ParameterOverrides& overrides, double arc_tolerance)
      : file_(std::move(file)), overrides_(overrides), arc_tolerance_(arc_tolerance) {}

  CrossSection read(const std::string& raw);

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
  void reject_undefined_entities(const std::string& text) const;

  /// The file's text, checked as UTF-8 (other encodings, NUL bytes, invalid bytes refused with
  /// their line), with line endings made LF.
  std::string checked_text(const std::string& raw) const;

  void scan_entities(const tinyxml2::XMLNode* node) const;

  void check_entities(std::string_view value, int line, const std::string& object) const;

  std::string parameter_names() const;

  /// Value of one expression over the parameters defined so far.
  double evaluate(const std::string& expression, const XMLElement* e, const std::string& what) const;

  /// Replaces every {expression} in a numeric attribute by its value.
  std::string expand(const std::string& text, const XMLElement* e, const std::string& what) const;

  void read_parameter(const XMLElement* e);
  // References are resolved after reading so the order of the blocks in the file does not matter.
  struct PendingRef { std::size_t* target; std::string id; SourceLocation where; std::string object; };
  std::vector<PendingRef> material_refs_, environment_refs_;
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

  void allow_attributes(const XMLElement* e, std::initializer_list<const char*> allowed) const;

  std::string describe(const XMLElement* e) const;

  std::string required_text(const XMLElement* e, const char* attribute) const;

  static std::string optional_text(const XMLElement* e, const char* attribute, const char* fallback);

  /// Parses one finite number; `what` names it in the message.
  double parse_number(const std::string& raw, const XMLElement* e, const std::string& what) const;

  double required_number(const XMLElement* e, const char* attribute) const;

  /// "x,y x,y ..." in the file's unit → metres.
  std::vector<Point> parse_points(const XMLElement* e, const char* attribute) const;

  std::vector<double> split_numbers(std::string text, const XMLElement* e, const char* attribute) const;

  /// A point list that may contain arcs: "x,y ccw(cx,cy) x,y" makes the edge between the two points
  /// the circular arc about (cx, cy), turning counter-clockwise ("cw(…)": clockwise). In a closed
  /// outline an arc after the last point closes it; a path from a point round to the same point is
  /// a full circle. Arcs come back as chords (arc_points, the reader's chord tolerance).
  std::vector<Point> parse_outline(const XMLElement* e, const char* attribute, bool closed);

  std::vector<Point> numbers_to_points(const XMLElement* e, const char* attribute, const std::vector<double>& numbers) const;

  Point parse_point(const XMLElement* e, const char* attribute) const;

  void read_material(const XMLElement* e);

  void read_regions(const XMLElement* parent);

  /// A DXF file beside the detail file, relative to the detail file's folder.
  std::string beside_detail_file(const std::string& name) const;

  const CadDrawing& drawing_for(const XMLElement* e, const std::string& name);

  /// <drawing file="…" units="…"><layer name="…" material="…" paint-order="…"/>…</drawing>: every
  /// closed outline on a mapped layer becomes a region, painted in the drawing's entity order
  /// (layers with a lower paint-order first).
  /// <cavity>: an air cavity as a solid of the ISO 10077-2 equivalent conductivity, worked out here
  /// from its outline and heat-flow direction (a material of its own, "cavity: NAME").
  void read_cavity(const tinyxml2::XMLElement* e, Region region);
  void read_drawing_regions(const XMLElement* e);

  void read_environment(const XMLElement* e);

  double parse_resistance(const XMLElement* e, const std::string& text, const char* attribute) const;

  void read_boundaries(const XMLElement* parent);

  /// A surface whose path is every open chain of lines on a layer of the detail's drawing (one
  /// surface per chain, numbered after the first).
  void read_drawing_surfaces(const XMLElement* e, const std::string& layer, Surface surface);

  void read_probe(const XMLElement* e);

  void read_flanking_elements(const XMLElement* parent);

  void read_flanking(const XMLElement* e, const std::map<std::string, Point>& reference_points);

  void read_climate(const XMLElement* e);

  void read_mesh(const XMLElement* e);
  /// <record>: junction reference, project, client, drawing and revision, assessor, checker, date.
  void read_record(const XMLElement* e);

  void resolve_references();

  template <class Map>
  static std::string list_keys(const Map& m) {
    std::string out;
    for (const auto& [key, value] : m) out += (out.empty() ? "" : ", ") + key;
    return out.empty() ? "(none defined)" : out;
  }
};

}  // namespace edgeflux
