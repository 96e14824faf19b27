// Heat flows through surfaces, the energy balance, surface extremes and probe temperatures.
#include "results/field_results.h"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <set>

#include "solver/conduction_matrix.h"
#include "solver/solve_temperatures.h"

namespace edgeflux {

std::vector<double> surface_heat_flows(const TriMesh& mesh, const ThermalProblem& problem,
                                       const std::vector<double>& temperature, const LoadCase& load) {
  const std::size_t n_surfaces = problem.surface_resistance.size();
  std::vector<double> flow(n_surfaces, 0.0);
  // Net conduction out of each node's control volume, (K T)_i.
  std::vector<double> conduction_out(mesh.n_points(), 0.0);
  for (int t = 0; t < mesh.n_triangles(); ++t) {
    const auto& tri = mesh.triangles[t];
    const auto k = triangle_conductance(mesh.points[tri[0]], mesh.points[tri[1]], mesh.points[tri[2]],
                                        problem.triangle_conductivity[t]);
    for (int i = 0; i < 3; ++i)
      for (int j = 0; j < 3; ++j) conduction_out[tri[i]] += k[i][j] * temperature[tri[j]];
  }
  // Surface-resistance exchange; at a fixed node it is part of the node's balance too.
  std::vector<double> robin_in(mesh.n_points(), 0.0);
  for (const BoundaryEdge& edge : mesh.boundary_edges) {
    if (edge.surface < 0) continue;
    const double rs = problem.surface_resistance[edge.surface];
    if (rs == 0.0) continue;
    const double share = 0.5 * distance(mesh.points[edge.a], mesh.points[edge.b]) / rs;
    for (int node : {edge.a, edge.b}) {
      const double q = share * (load[edge.surface] - temperature[node]);
      flow[edge.surface] += q;
      robin_in[node] += q;
    }
  }
  // A fixed node supplies whatever its balance needs; shared corner nodes split it equally.
  const auto fixed = fixed_surfaces_per_node(mesh, problem.surface_resistance);
  for (int i = 0; i < mesh.n_points(); ++i) {
    if (fixed[i].empty()) continue;
    const double reaction = conduction_out[i] - robin_in[i];
    for (int s : fixed[i]) flow[s] += reaction / static_cast<double>(fixed[i].size());
  }
  return flow;
}

std::optional<double> temperature_at(const TriMesh& mesh, const std::vector<double>& temperature, Point p) {
  // The triangle whose smallest barycentric coordinate is largest contains p (or is nearest to it
  // when p sits on an edge, within rounding).
  double best = -std::numeric_limits<double>::infinity();
  double value = 0.0;
  for (const auto& tri : mesh.triangles) {
    const Point a = mesh.points[tri[0]], b = mesh.points[tri[1]], c = mesh.points[tri[2]];
    const double area = cross(b - a, c - a);
    const double l0 = cross(b - p, c - p) / area, l1 = cross(c - p, a - p) / area;
    const double l2 = 1.0 - l0 - l1;
    const double worst = std::min({l0, l1, l2});
    if (worst > best) {
      best = worst;
      value = l0 * temperature[tri[0]] + l1 * temperature[tri[1]] + l2 * temperature[tri[2]];
    }
  }
  if (best < -1e-9) return std::nullopt;
  return value;
}

FieldResults evaluate_field(const CrossSection& section, const TriMesh& mesh, const ThermalProblem& problem,
                            const std::vector<double>& temperature, const LoadCase& load) {
  FieldResults r;
  r.surface_heat_flow = surface_heat_flows(mesh, problem, temperature, load);
  r.environments.resize(section.environments.size());
  for (std::size_t e = 0; e < section.environments.size(); ++e) r.environments[e].environment = e;
  double sum_abs = 0.0;
  for (std::size_t s = 0; s < section.surfaces.size(); ++s) {
    r.environments[section.surfaces[s].environment].heat_flow += r.surface_heat_flow[s];
  }
  for (const EnvironmentFlow& env : r.environments) {
    r.balance.net += env.heat_flow;
    sum_abs += std::abs(env.heat_flow);
  }
  r.balance.relative = sum_abs > 0.0 ? r.balance.net / (0.5 * sum_abs) : 0.0;

  for (const BoundaryEdge& edge : mesh.boundary_edges) {
    if (edge.surface < 0) continue;
    EnvironmentFlow& env = r.environments[section.surfaces[edge.surface].environment];
    for (int node : {edge.a, edge.b}) {
      const LocatedTemperature here{temperature[node], mesh.points[node]};
      if (!env.coldest_surface || here.temperature < env.coldest_surface->temperature) env.coldest_surface = here;
      if (!env.warmest_surface || here.temperature > env.warmest_surface->temperature) env.warmest_surface = here;
    }
  }

  std::set<std::size_t> used;
  for (const Surface& s : section.surfaces) used.insert(s.environment);
  if (used.size() == 2) {
    const std::size_t a = *used.begin(), b = *used.rbegin();
    const double delta = section.environments[a].temperature - section.environments[b].temperature;
    // L2D = Φ / (θa − θb) with Φ the flow entering from a; both ends give the same value when the
    // balance closes, so take the mean of the two for symmetry.
    const double flow_from_a = 0.5 * (r.environments[a].heat_flow - r.environments[b].heat_flow);
    r.coupling_2d = flow_from_a / delta;
  }

  for (const Probe& probe : section.probes) {
    const auto value = temperature_at(mesh, temperature, probe.at);
    if (!value)
      throw_input_error(probe.where, fmt::format("probe '{}'", probe.name),
                        fmt::format("lies outside the section at {}", section.format_point(probe.at)),
                        "move the probe inside a region or onto its boundary");
    r.probes.push_back({probe.name, probe.at, *value});
  }
  const auto [lo, hi] = std::minmax_element(temperature.begin(), temperature.end());
  r.coldest_node = {*lo, mesh.points[lo - temperature.begin()]};
  r.warmest_node = {*hi, mesh.points[hi - temperature.begin()]};
  return r;
}

}  // namespace edgeflux
