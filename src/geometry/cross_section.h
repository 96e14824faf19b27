// The cross-section as the user described it, in SI units: the plain data every later stage reads.
#pragma once

#include <cstddef>
#include <limits>
#include <optional>
#include <string>
#include <string_view>
#include <utility>
#include <vector>

#include "core/error.h"
#include "core/point.h"

namespace edgeflux {

struct Material {
  std::string id;
  double conductivity = 0.0;  ///< λ, W/(m·K), > 0
  std::string source;         ///< where the value comes from (standard and table, or "declared")
  std::string library_id;     ///< entry of the material library it was taken from, if any
  std::optional<double> density;  ///< kg/m³, from the library entry when its λ is used
  /// "normative" (a tabulated design value), "typical" (a typical declared value, to be replaced by
  /// the product's own), or empty when λ is given in the detail file.
  std::string basis;
  /// Relative standard uncertainty of λ for the first-order range of the results (e.g. 0.1 for
  /// ±10 %), from the file's `uncertainty`; without it results/sensitivity.h's default applies.
  std::optional<double> relative_uncertainty;
  SourceLocation where;
};

/// A painted area. Regions are painted in file order: where two overlap, the later one wins.
struct Region {
  std::string name;            ///< user's name, or "region N" (1-based, file order)
  std::size_t material = 0;    ///< index into CrossSection::materials
  std::vector<Point> outline;  ///< m, counter-clockwise, not repeated at the end, ≥ 3 points
  /// m, inner loops inside the outline (a hatch's islands): crossing one leaves the region, so an
  /// island is a hole, and an island within it is region again (even-odd rule). Usually empty.
  std::vector<std::vector<Point>> islands;
  SourceLocation where;
};

/// Which side of the envelope an environment is on; decides which surface resistances the
/// surface-temperature run replaces.
enum class Side { interior, exterior, other };

struct Environment {
  std::string id;
  double temperature = 0.0;  ///< θ, °C
  Side side = Side::other;
  SourceLocation where;
};

/// Surface kind: glazing and frames keep Rsi = 0.13 in the surface-temperature run (ISO 13788).
enum class SurfaceKind { opaque, glazing };

/// A path along the outer boundary exposed to an environment through a surface resistance.
/// A resistance of zero means a fixed surface temperature equal to the environment's.
struct Surface {
  std::string name;
  std::size_t environment = 0;       ///< index into CrossSection::environments
  double resistance = 0.0;           ///< Rs of the heat-loss run, m²K/W, ≥ 0
  /// Rs of the surface-temperature run as the file gives it, m²K/W; without it the ISO 13788
  /// default applies (physics/surface_resistance.h, temperature_run_resistance).
  std::optional<double> temperature_run_resistance_given;
  SurfaceKind kind = SurfaceKind::opaque;
  std::vector<Point> path;           ///< m, polyline, ≥ 2 points
  SourceLocation where;

  bool is_fixed_temperature() const { return resistance == 0.0; }
};

struct Probe {
  std::string name;
  Point at;  ///< m
  SourceLocation where;
};

/// A flanking element of the junction: where it meets its cut-off plane and the lengths over
/// which its U-value applies in each ISO 14683 dimension system.
enum class DimensionSystem { internal, overall_internal, external };
inline constexpr DimensionSystem all_dimension_systems[] = {
    DimensionSystem::internal, DimensionSystem::overall_internal, DimensionSystem::external};
/// "internal", "overall internal", "external".
inline const char* dimension_system_name(DimensionSystem s) {
  return s == DimensionSystem::internal ? "internal" : s == DimensionSystem::overall_internal ? "overall internal" : "external";
}

/// The file and command-line word of a system: "internal", "overall-internal", "external".
inline const char* dimension_system_word(DimensionSystem s) {
  return s == DimensionSystem::internal ? "internal" : s == DimensionSystem::overall_internal ? "overall-internal" : "external";
}

/// The system named by its file and command-line word ("internal", "overall-internal", "external").
inline std::optional<DimensionSystem> dimension_system_from_word(std::string_view word) {
  if (word == "internal") return DimensionSystem::internal;
  if (word == "overall-internal") return DimensionSystem::overall_internal;
  if (word == "external") return DimensionSystem::external;
  return std::nullopt;
}

struct FlankingElement {
  std::string id;
  Point cut_off_start, cut_off_end;  ///< m, the straight adiabatic edge crossing the element
  std::optional<double> u_value;     ///< W/(m²K) when the user states it
  std::optional<double> length[3];   ///< m, per DimensionSystem (index by enum value)
  SourceLocation where;
};

/// The smallest temperature difference between environments (and between the climate's interior
/// and exterior) that edgeflux accepts, K: heat flows, L2D and fRsi = (θsi − θe)/(θi − θe) divide by
/// it, and below a tenth of a kelvin the results are rounding noise scaled up (common practice).
inline constexpr double min_temperature_difference = 0.1;

/// Interior climate for the condensation and mould verdict (ISO 13788).
struct Climate {
  double interior_temperature = 20.0;  ///< °C
  std::optional<double> interior_relative_humidity;  ///< 0–1
  std::optional<int> humidity_class;                 ///< ISO 13788 class 1–5
  double exterior_temperature = -5.0;  ///< °C
  double exterior_relative_humidity = 0.8;  ///< 0–1, used with humidity classes
  std::string rule = "none";           ///< national fRsi rule preset id, or "none"
  SourceLocation where;
};

/// A named number of the detail file, usable in {expressions} of later numeric attributes.
struct Parameter {
  std::string name;
  double value = 0.0;       ///< in the file's unit system as written (lengths in the file's unit)
  std::string description;
  bool overridden = false;  ///< set from the command line
  SourceLocation where;
};

struct MeshSettings {
  /// The density factors accepted from a file or the command line: below 0.01 a mesh could not
  /// follow the section, above 64 the first mesh alone would pass the node limit.
  static constexpr double min_density = 0.01, max_density = 64.0;
  enum class Mesher { automatic, grid, delaunay };
  Mesher mesher = Mesher::automatic;
  double density = 1.0;  ///< multiplies the number of elements along every length
};

/// Who and what a junction sheet is about, as the detail file's <record> states it; every field
/// may be empty. Shown in the running header and the title block of every report page.
struct JunctionRecord {
  std::string reference;   ///< junction reference in the project, e.g. "J03"
  std::string project, client, site;
  std::string drawing;     ///< drawing reference the section is taken from
  std::string revision;    ///< revision of this assessment (or of the drawing)
  std::string assessor, checker;
  std::string date;        ///< date of the assessment as the user writes it
  /// Label and value of every field but the reference, in title-block order.
  std::vector<std::pair<const char*, const std::string*>> fields() const {
    return {{"Project", &project}, {"Client", &client},   {"Site", &site},         {"Drawing", &drawing},
            {"Revision", &revision}, {"Date", &date}, {"Assessor", &assessor}, {"Checker", &checker}};
  }
  bool empty() const {
    if (!reference.empty()) return false;
    for (const auto& [label, value] : fields())
      if (!value->empty()) return false;
    return true;
  }
};

struct CrossSection {
  std::string title;
  std::string notes;
  std::string file;          ///< path the section was read from
  std::string unit = "mm";   ///< the unit the user wrote coordinates in (for messages)
  double metres_per_unit = 0.001;
  std::vector<Parameter> parameters;
  std::vector<Material> materials;
  std::vector<Region> regions;
  std::vector<Environment> environments;
  std::vector<Surface> surfaces;
  std::vector<Probe> probes;
  std::vector<FlankingElement> flanking_elements;
  std::vector<DimensionSystem> requested_systems;  ///< ψ must be reported in these (may be empty)
  /// The dimension system of the energy calculation the ψ is carried forward into (marked in
  /// every output); from <flanking-elements carry-forward> or --carry-forward.
  std::optional<DimensionSystem> carried_forward;
  JunctionRecord record;
  SourceLocation flanking_where;                   ///< the <flanking-elements> element
  std::optional<Climate> climate;
  MeshSettings mesh;
  std::vector<std::string> warnings;  ///< found while reading and checking (snapped points, odd sizes)
  /// m, the points the reader put on circles and arcs to replace them by chords: not drawn by the
  /// user, so moving one onto a nearby edge is not worth a warning.
  std::vector<Point> chord_points;

  /// "(x, y) mm" in the user's unit, for messages.
  std::string format_point(Point p) const {
    return format_point_for_user(p.x, p.y, metres_per_unit, unit.c_str());
  }
};

}  // namespace edgeflux
