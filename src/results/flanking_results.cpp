// Flanking elements: the layer stack where each meets its cut-off plane, its U-value, its lengths,
// and whether the flow there is one-dimensional as ISO 10211 assumes.
#include <fmt/format.h>

#include <algorithm>
#include <cmath>

#include "geometry/polygon.h"
#include "physics/layer_stack.h"
#include "results/junction_results.h"

namespace edgeflux {
namespace {

struct CutEdge { double from, to; int triangle; int a, b; };

/// The surface (other than along the cut-off) that touches node `node`, or -1.
int surface_at_node(const TriMesh& mesh, int node) {
  for (const BoundaryEdge& e : mesh.boundary_edges)
    if (e.surface >= 0 && (e.a == node || e.b == node)) return e.surface;
  return -1;
}

}  // namespace

std::vector<FlankingResult> flanking_results(const CrossSection& section, const TriMesh& mesh, const Run& heat_loss,
                                             std::vector<std::string>& warnings) {
  std::vector<FlankingResult> results;
  double extent = 0.0;
  for (Point p : mesh.points) extent = std::max({extent, std::abs(p.x), std::abs(p.y)});
  const double tol = 1e-9 * std::max(extent, 1e-3);

  for (const FlankingElement& element : section.flanking_elements) {
    const std::string object = fmt::format("flanking element '{}'", element.id);
    const Point a = element.cut_off_start, b = element.cut_off_end;
    const Point direction = (1.0 / distance(a, b)) * (b - a);
    std::vector<CutEdge> pieces;
    for (const BoundaryEdge& e : mesh.boundary_edges) {
      const Point p = mesh.points[e.a], q = mesh.points[e.b];
      if (distance_to_segment(p, a, b) > tol || distance_to_segment(q, a, b) > tol) continue;
      if (e.surface >= 0)
        throw_input_error(element.where, object,
                          fmt::format("the cut-off edge from {} to {} is not adiabatic: surface '{}' lies along it",
                                      section.format_point(a), section.format_point(b), section.surfaces[e.surface].name),
                          "a cut-off plane is an adiabatic edge; remove the surface there or move the cut-off");
      double s0 = dot(p - a, direction), s1 = dot(q - a, direction);
      int na = e.a, nb = e.b;
      if (s0 > s1) std::swap(s0, s1), std::swap(na, nb);
      pieces.push_back({s0, s1, e.triangle, na, nb});
    }
    if (pieces.empty())
      throw_input_error(element.where, object,
                        fmt::format("the cut-off edge from {} to {} crosses no material on the boundary of the section",
                                    section.format_point(a), section.format_point(b)),
                        "give the two ends of the straight adiabatic edge where the element is cut off");
    std::sort(pieces.begin(), pieces.end(), [](const CutEdge& x, const CutEdge& y) { return x.from < y.from; });
    double covered = 0.0;
    for (const CutEdge& piece : pieces) covered += piece.to - piece.from;
    const double length = distance(a, b);
    if (std::abs(covered - length) > 1e-6 * length + tol || pieces.front().from > tol)
      throw_input_error(element.where, object,
                        fmt::format("the cut-off edge from {} to {} is not a straight boundary edge of the section "
                                    "({:.3g} % of it lies on the boundary)",
                                    section.format_point(a), section.format_point(b), 100.0 * covered / length),
                        "give the ends of one straight adiabatic edge, from the outside face to the inside face");

    FlankingResult r;
    r.id = element.id;
    for (const CutEdge& piece : pieces) {
      const Material& m = section.materials[mesh.triangle_material[piece.triangle]];
      if (!r.layers.empty() && r.layers.back().material == m.id)
        r.layers.back().thickness += piece.to - piece.from;
      else
        r.layers.push_back({m.id, piece.to - piece.from, m.conductivity});
    }
    const int start_surface = surface_at_node(mesh, pieces.front().a);
    const int end_surface = surface_at_node(mesh, pieces.back().b);
    if (start_surface < 0 || end_surface < 0)
      throw_input_error(element.where, object,
                        fmt::format("the cut-off edge must run from one surface to another, but its {} end at {} "
                                    "touches no surface",
                                    start_surface < 0 ? "first" : "second", section.format_point(start_surface < 0 ? a : b)),
                        "put the cut-off across the whole element, from its outside face to its inside face");
    r.start_surface = section.surfaces[start_surface].name;
    r.end_surface = section.surfaces[end_surface].name;
    r.start_resistance = heat_loss.problem.surface_resistance[start_surface];
    r.end_resistance = heat_loss.problem.surface_resistance[end_surface];
    std::vector<Layer> stack;
    for (const FlankingLayer& layer : r.layers) stack.push_back({layer.thickness, layer.conductivity});
    r.stack_u_value = thermal_transmittance(r.start_resistance, stack, r.end_resistance);
    r.u_value_stated = element.u_value.has_value();
    r.u_value = element.u_value.value_or(*r.stack_u_value);
    for (int s = 0; s < 3; ++s) r.length[s] = element.length[s];

    // One-dimensional check: compare the computed temperatures along the cut-off edge with the
    // layer-stack profile between the two environments it joins.
    const double theta_start = heat_loss.load[start_surface], theta_end = heat_loss.load[end_surface];
    const double total = r.start_resistance + thermal_resistance(stack) + r.end_resistance;
    const double q = (theta_start - theta_end) / total;
    auto profile = [&](double s) {
      double resistance = r.start_resistance, at = 0.0;
      for (const Layer& layer : stack) {
        resistance += std::clamp(s - at, 0.0, layer.thickness) / layer.conductivity;
        at += layer.thickness;
      }
      return theta_start - q * resistance;
    };
    for (const CutEdge& piece : pieces) {
      r.deviation_from_1d = std::max(r.deviation_from_1d, std::abs(heat_loss.temperature[piece.a] - profile(piece.from)));
      r.deviation_from_1d = std::max(r.deviation_from_1d, std::abs(heat_loss.temperature[piece.b] - profile(piece.to)));
    }
    const double delta = std::abs(theta_start - theta_end);
    if (delta > 0 && r.deviation_from_1d > 0.01 * delta)
      warnings.push_back(fmt::format(
          "flanking element '{}': the temperatures at its cut-off differ from the one-dimensional layer profile by up "
          "to {:.2f} K ({:.1f} % of the temperature difference): the flow there is not one-dimensional, so the cut-off "
          "is too close to the junction or the layers change near it; move the cut-off further away",
          r.id, r.deviation_from_1d, 100.0 * r.deviation_from_1d / delta));
    // ISO 10211 places cut-off planes at least max(1 m, 3 × the element's thickness) from the
    // central element; the shortest stated length is the distance from the junction.
    double shortest = INFINITY;
    for (const auto& l : r.length) if (l) shortest = std::min(shortest, *l);
    const double thickness = covered;
    const double minimum = std::max(1.0, 3.0 * thickness);
    if (std::isfinite(shortest) && shortest < minimum - 1e-9)
      warnings.push_back(fmt::format(
          "flanking element '{}': its cut-off plane is {:.3f} m from the junction, closer than the {:.3f} m ISO 10211 "
          "asks for (at least 1 m and 3 × the element's {:.3f} m thickness)",
          r.id, shortest, minimum, thickness));
    results.push_back(std::move(r));
  }
  return results;
}

}  // namespace edgeflux
