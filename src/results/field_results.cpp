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

namespace {

/// Triangles binned into a uniform grid over the mesh's bounding box, about one cell per triangle,
/// so a point is located among the few triangles whose box covers its cell instead of all of them.
/// Each triangle's box is widened by the rounding allowance of the barycentric test below, so a
/// point on an edge still finds both triangles.
class TriangleGrid {
 public:
  explicit TriangleGrid(const TriMesh& mesh) : mesh_(mesh) {
    if (mesh.triangles.empty()) return;
    lo_ = hi_ = mesh.points[mesh.triangles[0][0]];
    for (const auto& tri : mesh.triangles)
      for (int v : tri) {
        const Point p = mesh.points[v];
        lo_ = {std::min(lo_.x, p.x), std::min(lo_.y, p.y)}, hi_ = {std::max(hi_.x, p.x), std::max(hi_.y, p.y)};
      }
    const double width = std::max(hi_.x - lo_.x, 1e-300), height = std::max(hi_.y - lo_.y, 1e-300);
    const double n_cells = std::clamp(static_cast<double>(mesh.n_triangles()), 1.0, 4e6);
    nx_ = std::clamp(static_cast<int>(std::ceil(std::sqrt(n_cells * width / height))), 1, 1 << 16);
    ny_ = std::clamp(static_cast<int>(std::ceil(n_cells / nx_)), 1, 1 << 16);
    cell_w_ = width / nx_, cell_h_ = height / ny_;
    // Counting sort into one flat array: first the number per cell, then the triangles.
    std::vector<std::array<int, 4>> spans(mesh.triangles.size());
    start_.assign(static_cast<std::size_t>(nx_) * ny_ + 1, 0);
    for (int t = 0; t < mesh.n_triangles(); ++t) {
      spans[t] = cell_span(t);
      for (int j = spans[t][2]; j <= spans[t][3]; ++j)
        for (int i = spans[t][0]; i <= spans[t][1]; ++i) ++start_[cell(i, j) + 1];
    }
    for (std::size_t c = 1; c < start_.size(); ++c) start_[c] += start_[c - 1];
    triangles_.resize(start_.back());
    std::vector<std::size_t> fill(start_.begin(), start_.end() - 1);
    for (int t = 0; t < mesh.n_triangles(); ++t)
      for (int j = spans[t][2]; j <= spans[t][3]; ++j)
        for (int i = spans[t][0]; i <= spans[t][1]; ++i) triangles_[fill[cell(i, j)]++] = t;
  }

  /// Temperature at p, or nothing when p lies outside every triangle (beyond rounding).
  std::optional<double> temperature_at(const std::vector<double>& temperature, Point p) const {
    if (triangles_.empty() || !(p.x >= lo_.x - slack_x() && p.x <= hi_.x + slack_x() && p.y >= lo_.y - slack_y() &&
                                p.y <= hi_.y + slack_y()))
      return std::nullopt;
    const int i = std::clamp(static_cast<int>(std::floor((p.x - lo_.x) / cell_w_)), 0, nx_ - 1);
    const int j = std::clamp(static_cast<int>(std::floor((p.y - lo_.y) / cell_h_)), 0, ny_ - 1);
    // The triangle whose smallest barycentric coordinate is largest contains p (or is nearest to
    // it when p sits on an edge, within rounding).
    double best = -std::numeric_limits<double>::infinity();
    double value = 0.0;
    for (std::size_t k = start_[cell(i, j)]; k < start_[cell(i, j) + 1]; ++k) {
      const auto& tri = mesh_.triangles[triangles_[k]];
      const Point a = mesh_.points[tri[0]], b = mesh_.points[tri[1]], c = mesh_.points[tri[2]];
      const double area = cross(b - a, c - a);
      const double l0 = cross(b - p, c - p) / area, l1 = cross(c - p, a - p) / area;
      const double l2 = 1.0 - l0 - l1;
      const double worst = std::min({l0, l1, l2});
      if (worst > best) {
        best = worst;
        value = l0 * temperature[tri[0]] + l1 * temperature[tri[1]] + l2 * temperature[tri[2]];
      }
    }
    if (best < -barycentric_allowance) return std::nullopt;
    return value;
  }

 private:
  /// A point this far outside a triangle, in barycentric terms, still counts as on it (rounding).
  static constexpr double barycentric_allowance = 1e-9;

  const TriMesh& mesh_;
  Point lo_{}, hi_{};
  int nx_ = 1, ny_ = 1;
  double cell_w_ = 1.0, cell_h_ = 1.0;
  std::vector<std::size_t> start_;  // triangles of cell c: triangles_[start_[c] .. start_[c+1])
  std::vector<int> triangles_;

  double slack_x() const { return 2 * barycentric_allowance * (hi_.x - lo_.x); }
  double slack_y() const { return 2 * barycentric_allowance * (hi_.y - lo_.y); }
  std::size_t cell(int i, int j) const { return static_cast<std::size_t>(j) * nx_ + i; }

  /// Cells covered by the widened box of triangle t: {i0, i1, j0, j1}, inclusive.
  std::array<int, 4> cell_span(int t) const {
    const auto& tri = mesh_.triangles[t];
    Point lo = mesh_.points[tri[0]], hi = lo;
    for (int v : tri) {
      const Point p = mesh_.points[v];
      lo = {std::min(lo.x, p.x), std::min(lo.y, p.y)}, hi = {std::max(hi.x, p.x), std::max(hi.y, p.y)};
    }
    // An altitude is at most the box's larger side: λ = −allowance is at most that far outside.
    const double widen = 2 * barycentric_allowance * std::max(hi.x - lo.x, hi.y - lo.y);
    auto column = [&](double x) { return std::clamp(static_cast<int>(std::floor((x - lo_.x) / cell_w_)), 0, nx_ - 1); };
    auto row = [&](double y) { return std::clamp(static_cast<int>(std::floor((y - lo_.y) / cell_h_)), 0, ny_ - 1); };
    return {column(lo.x - widen), column(hi.x + widen), row(lo.y - widen), row(hi.y + widen)};
  }
};

}  // namespace

std::optional<double> temperature_at(const TriMesh& mesh, const std::vector<double>& temperature, Point p) {
  return TriangleGrid(mesh).temperature_at(temperature, p);
}

std::vector<std::optional<double>> temperatures_at(const TriMesh& mesh, const std::vector<double>& temperature,
                                                   std::span<const Point> points) {
  const TriangleGrid grid(mesh);
  std::vector<std::optional<double>> values;
  values.reserve(points.size());
  for (Point p : points) values.push_back(grid.temperature_at(temperature, p));
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
  std::vector<Point> probe_points;
  for (const Probe& probe : section.probes) probe_points.push_back(probe.at);
  const auto probe_values = temperatures_at(mesh, temperature, probe_points);
  for (std::size_t k = 0; k < section.probes.size(); ++k) {
    const Probe& probe = section.probes[k];
    const int node = k < mesh.probe_nodes.size() ? mesh.probe_nodes[k] : -1;
    const std::optional<double> value = node >= 0 ? std::optional<double>(temperature[node]) : probe_values[k];
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
