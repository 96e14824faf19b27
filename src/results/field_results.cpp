// Heat flows through surfaces, the energy balance, surface extremes and probe temperatures.
#include "results/field_results.h"

#include <fmt/format.h>

#include <algorithm>
#include <array>
#include <cmath>
#include <limits>
#include <set>

#include "solver/conduction_matrix.h"
#include "solver/solve_temperatures.h"
#include "solver/error_indicator.h"
#include "mesh/triangle_locator.h"

namespace edgeflux {

std::vector<double> surface_heat_flows(const TriMesh& mesh, const ThermalProblem& problem,
                                       const std::vector<double>& temperature, const LoadCase& load) {
  const std::size_t n_surfaces = problem.surface_resistance.size();
  std::vector<double> flow(n_surfaces, 0.0);
  // Net conduction out of each node's control volume, (K T)_i, summed as Σ_j K_ij (T_j − T_i): the
  // element rows sum to zero, and in this form the rounding of that sum is not multiplied by the
  // temperature level.
  std::vector<double> conduction_out(mesh.n_points(), 0.0);
  for (int t = 0; t < mesh.n_triangles(); ++t) {
    const auto& tri = mesh.triangles[t];
    const auto k = triangle_conductance(mesh.points[tri[0]], mesh.points[tri[1]], mesh.points[tri[2]],
                                        problem.triangle_conductivity[t]);
    for (int i = 0; i < 3; ++i)
      for (int j = 0; j < 3; ++j)
        if (j != i) conduction_out[tri[i]] += k[i][j] * (temperature[tri[j]] - temperature[tri[i]]);
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
  return TriangleLocator(mesh).value_at(temperature, p);
}

std::vector<std::optional<double>> temperatures_at(const TriMesh& mesh, const std::vector<double>& temperature,
                                                   std::span<const Point> points) {
  if (points.empty()) return {};
  const TriangleLocator locator(mesh);
  std::vector<std::optional<double>> values;
  values.reserve(points.size());
  for (Point p : points) values.push_back(locator.value_at(temperature, p));
  return values;
}

FieldResults evaluate_field(const CrossSection& section, const TriMesh& mesh, const ThermalProblem& problem,
                            const std::vector<double>& temperature, const LoadCase& load) {
  FieldResults r;
  r.surface_heat_flow = surface_heat_flows(mesh, problem, temperature, load);
  r.heat_flux = triangle_heat_flux(mesh, problem.triangle_conductivity, temperature);
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

  // A probe the mesher made a node (on the 0.01 mm grid) reads its nodal value; others are located.
  // (The locator is built only when a probe needs it: it costs as much as the rest of this.)
  std::vector<Point> located_points;
  std::vector<int> probe_node(section.probes.size(), -1);
  for (std::size_t k = 0; k < section.probes.size(); ++k) {
    probe_node[k] = k < mesh.probe_nodes.size() ? mesh.probe_nodes[k] : -1;
    if (probe_node[k] < 0) located_points.push_back(section.probes[k].at);
  }
  const auto located = temperatures_at(mesh, temperature, located_points);
  for (std::size_t k = 0, next_located = 0; k < section.probes.size(); ++k) {
    const Probe& probe = section.probes[k];
    const int node = probe_node[k];
    const std::optional<double> value = node >= 0 ? std::optional<double>(temperature[node]) : located[next_located++];
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
