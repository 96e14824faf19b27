// Geometry and boundary checks of a cross-section that do not need a mesh.
#include "geometry/validate_cross_section.h"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <set>

#include "geometry/polygon.h"

namespace edgeflux {
namespace {

std::string region_label(const Region& r) { return fmt::format("region '{}'", r.name); }

void check_region(const CrossSection& section, Region& region) {
  const auto& pts = region.outline;
  if (pts.size() < 3)
    throw_input_error(region.where, region_label(region),
                      fmt::format("has {} point{}, a polygon needs at least 3", pts.size(), pts.size() == 1 ? "" : "s"),
                      "list the corners of the area as x,y pairs");
  for (std::size_t i = 0; i < pts.size(); ++i) {
    const Point a = pts[i], b = pts[(i + 1) % pts.size()];
    if (a.x == b.x && a.y == b.y)
      throw_input_error(region.where, region_label(region),
                        fmt::format("point {} repeats at {}", i + 1, section.format_point(a)),
                        "remove the repeated point");
  }
  const auto [i, j] = first_self_intersection(pts);
  if (i >= 0) {
    const std::size_t n = pts.size();
    throw_input_error(region.where, region_label(region),
                      fmt::format("the outline crosses itself: edge {} → {} meets edge {} → {}",
                                  section.format_point(pts[i]), section.format_point(pts[(i + 1) % n]),
                                  section.format_point(pts[j]), section.format_point(pts[(j + 1) % n])),
                      "list the corners in order around the area, without crossing; split a figure-eight "
                      "into two regions");
  }
  const double area = signed_area(pts);
  double extent = 0.0;
  for (Point p : pts) extent = std::max({extent, std::abs(p.x - pts[0].x), std::abs(p.y - pts[0].y)});
  if (std::abs(area) <= 1e-12 * extent * extent)
    throw_input_error(region.where, region_label(region),
                      fmt::format("has zero area (corners from {})", section.format_point(pts[0])),
                      "check the coordinates: all corners lie on one line");
  if (area < 0.0) std::reverse(region.outline.begin(), region.outline.end());
}

/// Points of different regions (or of a region and a surface path) closer than the snapping
/// tolerance but not equal are almost certainly meant to coincide: a hair-thin gap or overlap would
/// create a sliver the mesh must resolve and a spurious notch or bridge. They are moved onto the
/// earlier point, and the user is told.
void snap_nearly_coincident_points(CrossSection& section, double tolerance) {
  std::vector<Point> anchors;
  int moved = 0;
  Point first_from{}, first_to{};
  auto snap = [&](Point& p) {
    for (const Point& a : anchors) {
      const double d = distance(a, p);
      if (d == 0.0) return;
      if (d <= tolerance) {
        if (moved++ == 0) first_from = p, first_to = a;
        p = a;
        return;
      }
    }
    anchors.push_back(p);
  };
  for (Region& region : section.regions)
    for (Point& p : region.outline) snap(p);
  for (Surface& surface : section.surfaces)
    for (Point& p : surface.path) snap(p);
  if (moved > 0)
    section.warnings.push_back(fmt::format(
        "{} point{} closer than {:.3g} mm to another point {} moved onto it (first: {} to {}); check that these "
        "points were meant to coincide", moved, moved == 1 ? "" : "s", tolerance * 1000, moved == 1 ? "was" : "were",
        section.format_point(first_from), section.format_point(first_to)));
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

void validate_cross_section(CrossSection& section) {
  const SourceLocation file_only{section.file, 0};
  if (section.regions.empty())
    throw_input_error(file_only, "<regions>", "the section has no regions",
                      "describe the materials of the section as <rectangle> or <polygon> inside <regions>");
  for (Region& region : section.regions) check_region(section, region);
  warn_about_sizes(section);
  // Snapping tolerance: 0.01 mm, far below any real layer, far above rounding in coordinates.
  snap_nearly_coincident_points(section, 1e-5);
  for (Region& region : section.regions) check_region(section, region);  // snapping may fold a region

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

  std::set<std::string> probe_names;
  for (const Probe& probe : section.probes)
    if (!probe_names.insert(probe.name).second)
      throw_input_error(probe.where, fmt::format("probe '{}'", probe.name), "this name is already used",
                        "give each probe its own name");
}

}  // namespace edgeflux
