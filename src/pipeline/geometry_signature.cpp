// The exact text of everything that shapes a section's meshes, compared to share meshes between variants.
#include "pipeline/geometry_signature.h"

#include <fmt/format.h>

#include <iterator>

namespace edgeflux {
namespace {

void add_point(std::string& out, Point p) { fmt::format_to(std::back_inserter(out), "{:a},{:a};", p.x, p.y); }

void add_points(std::string& out, const std::vector<Point>& points) {
  fmt::format_to(std::back_inserter(out), "[{}:", points.size());
  for (Point p : points) add_point(out, p);
  out += ']';
}

}  // namespace

std::string geometry_signature(const CrossSection& section) {
  std::string out;
  auto add = [&](auto&&... values) { (fmt::format_to(std::back_inserter(out), "{}|", values), ...); };
  add(section.unit, fmt::format("{:a}", section.metres_per_unit), section.materials.size());
  for (const Material& m : section.materials) add(m.id);
  for (const Region& r : section.regions) {
    add("region", r.material, r.islands.size());
    add_points(out, r.outline);
    for (const auto& island : r.islands) add_points(out, island);
  }
  for (const Environment& e : section.environments)
    add("environment", fmt::format("{:a}", e.temperature), static_cast<int>(e.side));
  for (const Surface& s : section.surfaces) {
    add("surface", s.environment, fmt::format("{:a}", s.resistance),
        s.temperature_run_resistance_given ? fmt::format("{:a}", *s.temperature_run_resistance_given) : "-",
        static_cast<int>(s.kind));
    add_points(out, s.path);
  }
  for (const Probe& p : section.probes) add_point(out, p.at);
  for (const FlankingElement& f : section.flanking_elements) {
    add("cut-off");
    add_point(out, f.cut_off_start);
    add_point(out, f.cut_off_end);
  }
  add("chords");
  add_points(out, section.chord_points);
  add("mesh", static_cast<int>(section.mesh.mesher), fmt::format("{:a}", section.mesh.density));
  return out;
}

}  // namespace edgeflux
