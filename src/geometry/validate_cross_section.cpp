// Geometry and boundary checks of a cross-section that do not need a mesh.
#include "geometry/validate_cross_section.h"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <optional>
#include <set>
#include <unordered_map>
#include <utility>

#include "geometry/polygon.h"

namespace edgeflux {
namespace {

std::string region_label(const Region& r) { return fmt::format("region '{}'", r.name); }

struct Problem {
  std::string what, fix;
};

/// What is wrong with one region outline, if anything: too few points, a repeated point, zero area
/// (all corners on one line), an outline that crosses or touches itself.
std::optional<Problem> region_problem(const CrossSection& section, const Region& region) {
  const auto& pts = region.outline;
  if (pts.size() < 3)
    return Problem{fmt::format("has {} point{}, a polygon needs at least 3", pts.size(), pts.size() == 1 ? "" : "s"),
                   "list the corners of the area as x,y pairs"};
  for (std::size_t i = 0; i < pts.size(); ++i) {
    const Point a = pts[i], b = pts[(i + 1) % pts.size()];
    if (a.x == b.x && a.y == b.y)
      return Problem{fmt::format("point {} repeats at {}", i + 1, section.format_point(a)), "remove the repeated point"};
  }
  // Zero area before crossings: corners on one line make edges that fold back, which the
  // crossing test would report, but the user's mistake is the flat outline.
  std::size_t far = 0;
  for (std::size_t i = 1; i < pts.size(); ++i)
    if (distance(pts[i], pts[0]) > distance(pts[far], pts[0])) far = i;
  const Point direction = pts[far] - pts[0];
  const bool collinear = std::all_of(pts.begin(), pts.end(), [&](Point p) {
    return std::abs(cross(direction, p - pts[0])) <= 1e-12 * dot(direction, direction);
  });
  if (collinear)
    return Problem{fmt::format("has zero area: all its corners lie on the line from {} to {}", section.format_point(pts[0]),
                               section.format_point(pts[far])),
                   "check the coordinates; a region needs corners off that line"};
  const auto [i, j] = first_self_intersection(pts);
  if (i >= 0) {
    const std::size_t n = pts.size();
    return Problem{fmt::format("the outline crosses itself: edge {} → {} meets edge {} → {}", section.format_point(pts[i]),
                               section.format_point(pts[(i + 1) % n]), section.format_point(pts[j]),
                               section.format_point(pts[(j + 1) % n])),
                   "list the corners in order around the area, without crossing; split a figure-eight into two regions"};
  }
  const double area = signed_area(pts);
  double extent = 0.0;
  for (Point p : pts) extent = std::max({extent, std::abs(p.x - pts[0].x), std::abs(p.y - pts[0].y)});
  if (std::abs(area) <= 1e-12 * extent * extent)
    return Problem{fmt::format("has zero area (corners from {})", section.format_point(pts[0])),
                   "check the coordinates: all corners lie on one line"};
  return std::nullopt;
}

void check_region(const CrossSection& section, Region& region) {
  if (const auto problem = region_problem(section, region))
    throw_input_error(region.where, region_label(region), problem->what, problem->fix);
  if (signed_area(region.outline) < 0.0) std::reverse(region.outline.begin(), region.outline.end());
  for (std::size_t k = 0; k < region.islands.size(); ++k) {
    Region island = region;
    island.outline = region.islands[k];
    if (const auto problem = region_problem(section, island))
      throw_input_error(region.where, region_label(region), fmt::format("its island {} {}", k + 1, problem->what), problem->fix);
    if (!contains(region.outline, island.outline.front()))
      throw_input_error(region.where, region_label(region),
                        fmt::format("its island {} starts at {}, outside the region's outline", k + 1,
                                    section.format_point(island.outline.front())),
                        "an island (a hatch's inner loop) must lie inside the outer loop");
  }
}

/// What the snapping did to one region, for the message when it folds the region.
struct SnapRecord {
  int moved = 0;
  Point first_from{}, first_to{};
};

/// Points of different regions (or of a region and a surface path) closer than the snapping
/// tolerance but not equal are almost certainly meant to coincide: a hair-thin gap or overlap would
/// create a sliver the mesh must resolve and a spurious notch or bridge. They are moved onto the
/// earlier point, and the user is told. The rule holds within one outline too: the model has a
/// geometric resolution of the tolerance, and a feature finer than that is rounding or a slip, not
/// construction. Returns what happened to each region.
std::vector<SnapRecord> snap_nearly_coincident_points(CrossSection& section, double tolerance) {
  // Anchors in cells of the tolerance's size: every anchor within the tolerance of a point lies in
  // its cell or one of the eight around it. The earliest such anchor wins, as in a scan of all
  // earlier points, so the result does not depend on the grid.
  struct CellHash {
    std::size_t operator()(const std::pair<std::int64_t, std::int64_t>& c) const {
      return std::hash<std::int64_t>()(c.first * 0x9E3779B97F4A7C15ULL ^ c.second);
    }
  };
  std::unordered_map<std::pair<std::int64_t, std::int64_t>, std::vector<std::size_t>, CellHash> cells;
  std::vector<Point> anchors;
  auto cell_of = [&](double v) {
    // The reader bounds coordinates to 1e6 m (1e11 cells); the clamp keeps the cast defined anyway.
    return static_cast<std::int64_t>(std::clamp(std::floor(v / tolerance), -1e15, 1e15));
  };
  int moved = 0;
  Point first_from{}, first_to{};
  auto snap = [&](Point& p, SnapRecord* record) {
    const std::int64_t cx = cell_of(p.x), cy = cell_of(p.y);
    std::size_t best = anchors.size();
    for (std::int64_t dx = -1; dx <= 1; ++dx)
      for (std::int64_t dy = -1; dy <= 1; ++dy) {
        const auto it = cells.find({cx + dx, cy + dy});
        if (it == cells.end()) continue;
        for (std::size_t a : it->second)
          if (a < best && distance(anchors[a], p) <= tolerance) best = a;
      }
    if (best == anchors.size()) {
      cells[{cx, cy}].push_back(anchors.size());
      anchors.push_back(p);
      return;
    }
    const Point a = anchors[best];
    if (a.x == p.x && a.y == p.y) return;
    // Moves below 0.0001 mm are rounding noise (an arc drawn twice, a drawing's export): not worth a word.
    if (distance(a, p) > 1e-7 && moved++ == 0) first_from = p, first_to = a;
    if (record && record->moved++ == 0) record->first_from = p, record->first_to = a;
    p = a;
  };
  std::vector<SnapRecord> records(section.regions.size());
  for (std::size_t r = 0; r < section.regions.size(); ++r) {
    for (Point& p : section.regions[r].outline) snap(p, &records[r]);
    for (auto& island : section.regions[r].islands)
      for (Point& p : island) snap(p, &records[r]);
  }
  for (Surface& surface : section.surfaces)
    for (Point& p : surface.path) snap(p, nullptr);
  if (moved > 0)
    section.warnings.push_back(fmt::format(
        "{} point{} closer than {:.3g} mm to another point {} moved onto it (first: {} to {}); check that these "
        "points were meant to coincide", moved, moved == 1 ? "" : "s", tolerance * 1000, moved == 1 ? "was" : "were",
        section.format_point(first_from), section.format_point(first_to)));
  return records;
}

void warn_about_sizes(CrossSection& section) {
  double x0 = 1e300, x1 = -1e300, y0 = 1e300, y1 = -1e300;
  for (const Region& r : section.regions)
    for (Point p : r.outline) x0 = std::min(x0, p.x), x1 = std::max(x1, p.x), y0 = std::min(y0, p.y), y1 = std::max(y1, p.y);
  const double extent = std::max(x1 - x0, y1 - y0);
  // A junction model with ISO 10211 cut-off planes spans about 1–10 m; ground floors up to ~30 m.
  if (extent > 50.0)
    section.warnings.push_back(fmt::format("the section is {:.4g} m across, which is implausible for a junction: were the "
                                           "coordinates meant in mm (units=\"mm\")?", extent));
  if (extent < 0.05)
    section.warnings.push_back(fmt::format("the section is only {:.4g} mm across: were the coordinates meant in metres "
                                           "(units=\"m\")? Cut-off planes belong at least 1 m from the junction", extent * 1000));
}

}  // namespace

void validate_regions(CrossSection& section) {
  const SourceLocation file_only{section.file, 0};
  if (section.regions.empty())
    throw_input_error(file_only, "<regions>", "the section has no regions",
                      "describe the materials of the section as <rectangle> or <polygon> inside <regions>");
  for (Region& region : section.regions) check_region(section, region);
  warn_about_sizes(section);
  // Snapping tolerance: 0.01 mm, far below any real layer, far above rounding in coordinates.
  constexpr double snapping_tolerance = 1e-5;
  const std::vector<SnapRecord> snapped = snap_nearly_coincident_points(section, snapping_tolerance);
  // Snapping may collapse or fold a region that was fine as written; the message must say so, or
  // it would describe points and edges the user never drew.
  for (std::size_t r = 0; r < section.regions.size(); ++r) {
    Region& region = section.regions[r];
    if (snapped[r].moved == 0) continue;
    if (const auto problem = region_problem(section, region))
      throw_input_error(region.where, region_label(region),
                        fmt::format("points closer than {:g} mm were snapped together ({} of its points moved, first {} "
                                    "onto {}), and then the region {}", snapping_tolerance * 1000, snapped[r].moved,
                                    section.format_point(snapped[r].first_from), section.format_point(snapped[r].first_to),
                                    problem->what.rfind("has ", 0) == 0 ? problem->what : "is invalid: " + problem->what),
                        fmt::format("points less than {:g} mm apart count as one point: keep the corners of a region at "
                                    "least {:g} mm apart and make it larger than that, and write points meant to "
                                    "coincide with equal coordinates", snapping_tolerance * 1000, snapping_tolerance * 1000));
    if (signed_area(region.outline) < 0.0) std::reverse(region.outline.begin(), region.outline.end());
  }
}

void validate_cross_section(CrossSection& section) {
  validate_regions(section);
  const SourceLocation file_only{section.file, 0};
  if (section.environments.empty())
    throw_input_error(file_only, "<environments>", "the section has no environment",
                      "define at least two environments, e.g. <environment id=\"inside\" temperature=\"20\" "
                      "side=\"interior\"/> and one outside");
  if (section.surfaces.empty())
    throw_input_error(file_only, "<boundaries>", "no surface connects the section to an environment",
                      "add <surface environment=\"...\" resistance=\"...\" path=\"...\"/> for the inside and the "
                      "outside faces");
  std::set<double> temperatures;
  std::set<std::size_t> used;
  for (const Surface& s : section.surfaces) {
    used.insert(s.environment);
    temperatures.insert(section.environments[s.environment].temperature);
  }
  if (used.size() < 2 || temperatures.size() < 2) {
    const Environment& env = section.environments[section.surfaces.front().environment];
    throw_input_error(env.where, fmt::format("environment '{}'", env.id),
                      used.size() < 2 ? "is the only environment any surface faces, so no heat flows"
                                      : fmt::format("all surfaces face environments at {} °C, so no heat flows",
                                                    env.temperature),
                      "give the section surfaces facing at least two environments at different temperatures");
  }
  const double spread = *temperatures.rbegin() - *temperatures.begin();
  if (spread < min_temperature_difference) {
    const Environment& env = section.environments[section.surfaces.front().environment];
    throw_input_error(env.where, fmt::format("environment '{}'", env.id),
                      fmt::format("the environments the surfaces face differ by only {:.3g} K, less than the {} K the "
                                  "results can be trusted on", spread, min_temperature_difference),
                      "use the design temperatures of the assessment, e.g. 20 °C inside and -5 °C outside");
  }

  // Conductivities spanning more than ten orders of magnitude leave the conduction matrix too
  // ill-conditioned for double precision to close the energy balance (measured: 1e10 solves a
  // layered wall exactly, 1e12 does not); real materials span about 1e5 (copper to aerogel).
  constexpr double max_conductivity_ratio = 1e10;
  const Material* lowest = nullptr;
  const Material* highest = nullptr;
  for (const Region& r : section.regions) {
    const Material& m = section.materials[r.material];
    if (!lowest || m.conductivity < lowest->conductivity) lowest = &m;
    if (!highest || m.conductivity > highest->conductivity) highest = &m;
  }
  if (lowest && highest->conductivity > max_conductivity_ratio * lowest->conductivity)
    throw_input_error(highest->where, fmt::format("material '{}'", highest->id),
                      fmt::format("λ {:g} W/(m·K) is {:.2g} times the λ {:g} of material '{}', more than the {:g} a "
                                  "calculation in double precision can resolve", highest->conductivity,
                                  highest->conductivity / lowest->conductivity, lowest->conductivity, lowest->id,
                                  max_conductivity_ratio),
                      "check the two values (a unit slip?); model a near-perfect conductor or insulator with a λ "
                      "that is merely very large or very small, e.g. 1e4 or 1e-4 W/(m·K)");

  // ψ in a requested dimension system needs every flanking element's length in it; so does the
  // system the ψ is carried forward in.
  std::vector<DimensionSystem> needed = section.requested_systems;
  if (section.carried_forward) needed.push_back(*section.carried_forward);
  if (section.carried_forward && section.flanking_elements.empty())
    throw_input_error(section.flanking_where, "<flanking-elements>", "names a system to carry ψ forward in, but no flanking element",
                      "add the flanking elements (their U and lengths define ψ), or remove carry-forward");
  for (DimensionSystem system : needed)
    for (const FlankingElement& f : section.flanking_elements)
      if (!f.length[static_cast<int>(system)])
        throw_input_error(f.where, fmt::format("flanking element '{}'", f.id),
                          fmt::format("has no {} length, but ψ is requested in {} dimensions", dimension_system_name(system),
                                      dimension_system_name(system)),
                          fmt::format("add length-{0}=\"...\" or {0}-from=\"reference point\"",
                                      system == DimensionSystem::overall_internal ? "overall-internal" : dimension_system_name(system)));

  std::set<std::string> probe_names;
  for (const Probe& probe : section.probes)
    if (!probe_names.insert(probe.name).second)
      throw_input_error(probe.where, fmt::format("probe '{}'", probe.name), "this name is already used",
                        "give each probe its own name");
}

}  // namespace edgeflux
