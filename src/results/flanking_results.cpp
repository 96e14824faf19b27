// Flanking elements: the layer stack where each meets its cut-off plane, its U-value, its lengths,
// and whether the flow there is one-dimensional as ISO 10211 assumes.
#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <stdexcept>

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
  for (int index = 0; index < static_cast<int>(section.flanking_elements.size()); ++index) {
    const FlankingElement& element = section.flanking_elements[index];
    const Point a = element.cut_off_start, b = element.cut_off_end;
    const Point direction = (1.0 / distance(a, b)) * (b - a);
    // The geometry stage laid the cut-off along the outline and tagged its edges with the first
    // element that names this cut-off.
    int owner = index;
    for (int k = 0; k < index; ++k) {
      const FlankingElement& other = section.flanking_elements[k];
      if (other.cut_off_start.x == a.x && other.cut_off_start.y == a.y && other.cut_off_end.x == b.x && other.cut_off_end.y == b.y) {
        owner = k;
        break;
      }
    }
    std::vector<CutEdge> pieces;
    for (const BoundaryEdge& e : mesh.boundary_edges) {
      if (e.cut_off != owner) continue;
      const Point p = mesh.points[e.a], q = mesh.points[e.b];
      double s0 = dot(p - a, direction), s1 = dot(q - a, direction);
      int na = e.a, nb = e.b;
      if (s0 > s1) std::swap(s0, s1), std::swap(na, nb);
      pieces.push_back({s0, s1, e.triangle, na, nb});
    }
    if (pieces.empty()) throw std::logic_error("flanking element '" + element.id + "' has no cut-off edge in the mesh");
    std::sort(pieces.begin(), pieces.end(), [](const CutEdge& x, const CutEdge& y) { return x.from < y.from; });
    double covered = 0.0;
    for (const CutEdge& piece : pieces) covered += piece.to - piece.from;

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
    if (start_surface < 0 || end_surface < 0)  // checked by the geometry stage
      throw std::logic_error("the cut-off of flanking element '" + element.id + "' does not end on surfaces");
    r.start_surface = section.surfaces[start_surface].name;
    r.end_surface = section.surfaces[end_surface].name;
    r.start_environment = section.surfaces[start_surface].environment;
    r.end_environment = section.surfaces[end_surface].environment;
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
