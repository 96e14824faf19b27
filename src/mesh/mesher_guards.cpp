// What keeps the mesher from running away: the sharpest corners of a section, refusing tips no
// mesh can fill, the refinement budget, and the node estimate checked before refinement starts.
#include "mesh/mesher_guards.h"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <tuple>

namespace edgeflux {

namespace {

constexpr double degree = 3.141592653589793 / 180.0;

}  // namespace

SharpAngles sharp_angles(const PlanarSubdivision& sub) {
  std::vector<std::pair<int, Point>> ends;  // (vertex, direction)
  for (const SubdivisionEdge& e : sub.edges) {
    const Point a{static_cast<double>(sub.vertices[e.a].x), static_cast<double>(sub.vertices[e.a].y)};
    const Point b{static_cast<double>(sub.vertices[e.b].x), static_cast<double>(sub.vertices[e.b].y)};
    ends.push_back({e.a, b - a}), ends.push_back({e.b, a - b});
  }
  std::sort(ends.begin(), ends.end(), [](const auto& p, const auto& q) {
    return std::tie(p.first, p.second.x, p.second.y) < std::tie(q.first, q.second.x, q.second.y);
  });
  SharpAngles sharp;
  for (std::size_t i = 0; i < ends.size(); ++i)
    for (std::size_t j = i + 1; j < ends.size() && ends[j].first == ends[i].first; ++j) {
      const Point u = ends[i].second, v = ends[j].second;
      const double angle = std::atan2(std::abs(cross(u, v)), dot(u, v));
      if (angle < 20.0 * degree) sharp.wedge_nodes += 12.0 / std::max(angle, 1e-12);
      if (angle / degree < sharp.smallest) {
        sharp.smallest = angle / degree;
        sharp.where = {static_cast<double>(sub.vertices[ends[i].first].x), static_cast<double>(sub.vertices[ends[i].first].y)};
      }
    }
  return sharp;
}

[[noreturn]] void throw_mesh_limit(const CrossSection& section, const std::string& problem, const std::string& fix) {
  throw MeshLimitError(format_input_error({section.file, 0}, "mesh", problem, fix), problem);
}

// Tips sharper than this take tens of thousands of nodes each (12/α) and, being nearly always
// drawing errors (a point a hair off a line), are refused before meshing. A taper of 1 in 1 000,
// far flatter than any screed or insulation fall, is 0.057°.
constexpr double sharpest_meshable_angle = 0.05;  // degrees

void reject_unmeshable_angle(const CrossSection& section, const PlanarSubdivision& sub, const SharpAngles& sharp) {
  if (sharp.smallest >= sharpest_meshable_angle) return;
  throw_mesh_limit(section,
                   fmt::format("region edges meet at {:.4f}° at {}, sharper than the {}° the mesher can fill with "
                               "well-shaped elements", sharp.smallest, section.format_point(sub.metres(sharp.where)),
                               sharpest_meshable_angle),
                   "a tip that sharp is usually a drawing error: snap nearly coincident points together, or end the "
                   "tapering region in a short blunt edge across its tip");
}

// Measured on every shipped detail and reference case: the graded mesh has 0.61–1.07 × the
// estimated nodes. Four times the estimate, and at least 60 000 nodes (about 2 s of refinement),
// leaves room for any honest section while ending a cascade early.
constexpr double budget_factor = 4.0;
constexpr double budget_floor = 60'000.0;

RefinementBudget make_budget(double expected, std::size_t max_vertices) {
  const double budget = std::min(static_cast<double>(max_vertices), std::max(budget_floor, budget_factor * expected));
  return {max_vertices, static_cast<std::size_t>(budget), expected};
}

std::string smallest_angle_text(const CrossSection& section, const PlanarSubdivision& sub, const SharpAngles& sharp) {
  return fmt::format("the smallest angle between region edges is {:.2f}° at {}", sharp.smallest,
                     section.format_point(sub.metres(sharp.where)));
}


namespace {

[[noreturn]] void refuse_sharp_corners(const CrossSection& section, const PlanarSubdivision& sub, const SharpAngles& sharp,
                                       std::size_t max_vertices) {
  throw_mesh_limit(section,
                   fmt::format("the sharp corners between region edges (the smallest {:.2f}° at {}) need about {:.3g} "
                               "nodes to be filled with well-shaped elements, more than the limit of {}",
                               sharp.smallest, section.format_point(sub.metres(sharp.where)), sharp.wedge_nodes,
                               max_vertices),
                   "draw corners sharper than about 20° only where the construction has them; a zigzag or a "
                   "serrated edge is better modelled as a layer of equivalent conductivity");
}

}  // namespace

/// Fails at once when the element sizes and sharp corners together ask for more nodes than the
/// limit, naming the feature that asks for the smallest elements.
void check_node_estimate(const CrossSection& section, const PlanarSubdivision& sub, double size_nodes,
                         const SharpAngles& sharp, double extent, const std::vector<SizeSeed>& seeds,
                         std::size_t max_vertices) {
  if (size_nodes + sharp.wedge_nodes <= static_cast<double>(max_vertices)) return;
  if (sharp.wedge_nodes > size_nodes) refuse_sharp_corners(section, sub, sharp, max_vertices);
  const auto finest = std::min_element(seeds.begin(), seeds.end(), [](const SizeSeed& a, const SizeSeed& b) { return a.size < b.size; });
  const double extent_m = extent / grid_steps_per_metre;
  std::string where;
  if (finest != seeds.end())
    where = fmt::format("; the smallest elements, {:.3g} mm, are asked for at {}, where features {:.3g} mm apart meet",
                        finest->size / 100.0, section.format_point(sub.metres(finest->at)), 3.0 * finest->size / 100.0);
  const std::string fix =
      extent_m > 50.0
          ? "check the unit of the coordinates (a section hundreds of metres across is usually millimetres written as "
            "metres), cut the model at the cut-off planes ISO 10211 asks for, or lower the density"
          : "cut the model at the cut-off planes ISO 10211 asks for, lower the density, or simplify the detail where "
            "the smallest elements are asked for";
  throw_mesh_limit(section,
                   fmt::format("the section is {:.4g} m across and needs more than the limit of {} nodes{}", extent_m,
                               max_vertices, where),
                   fix);
}

}  // namespace edgeflux
