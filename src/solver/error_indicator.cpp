// Flux-jump error indicator and per-triangle heat flux.
#include "solver/error_indicator.h"

#include "mesh/mesh_edges.h"

namespace edgeflux {

std::vector<Point> triangle_heat_flux(const TriMesh& mesh, const std::vector<double>& conductivity,
                                      const std::vector<double>& temperature) {
  std::vector<Point> flux(mesh.n_triangles());
  for (int t = 0; t < mesh.n_triangles(); ++t) {
    const auto& tri = mesh.triangles[t];
    const Point p0 = mesh.points[tri[0]], p1 = mesh.points[tri[1]], p2 = mesh.points[tri[2]];
    const double twice_area = cross(p1 - p0, p2 - p0);
    // ∇θ = Σ θ_i ∇φ_i with ∇φ_i = rot(e_i) / (2A), e_i the edge opposite node i.
    const Point e[3] = {p2 - p1, p0 - p2, p1 - p0};
    Point gradient{0.0, 0.0};
    if (!(twice_area > 0.0)) continue;  // needle of zero area in doubles: no flux
    for (int i = 0; i < 3; ++i) gradient = gradient + (temperature[tri[i]] / twice_area) * Point{-e[i].y, e[i].x};
    flux[t] = (-conductivity[t]) * gradient;
  }
  return flux;
}

std::vector<double> flux_jump_indicator(const TriMesh& mesh, const ThermalProblem& problem,
                                        const std::vector<double>& temperature, const LoadCase& load) {
  const std::vector<Point> flux = triangle_heat_flux(mesh, problem.triangle_conductivity, temperature);
  std::vector<double> eta(mesh.n_triangles(), 0.0);
  // Interior edges: the two triangles on each edge.
  const EdgeTable edges = edge_table(mesh);
  for (std::size_t e = 0; e < edges.ends.size(); ++e) {
    const int t = edges.triangles[e][0], u = edges.triangles[e][1];
    if (u < 0) continue;
    const Point edge = mesh.points[edges.ends[e][1]] - mesh.points[edges.ends[e][0]];
    const double length = norm(edge);
    const Point normal{edge.y / length, -edge.x / length};
    const double jump = dot(flux[t] - flux[u], normal);
    const double share = 0.5 * length * length * jump * jump;
    eta[t] += 0.5 * share;
    eta[u] += 0.5 * share;
  }
  for (const BoundaryEdge& e : mesh.boundary_edges) {
    if (e.surface < 0) {
      // Adiabatic: the normal flux should vanish.
      const Point edge = mesh.points[e.b] - mesh.points[e.a];
      const double length = norm(edge);
      const Point outward{edge.y / length, -edge.x / length};
      const double residual = dot(flux[e.triangle], outward);
      eta[e.triangle] += 0.5 * length * length * residual * residual;
      continue;
    }
    const double rs = problem.surface_resistance[e.surface];
    if (rs == 0.0) continue;  // fixed temperature: no flux condition to check
    const Point edge = mesh.points[e.b] - mesh.points[e.a];
    const double length = norm(edge);
    const Point outward{edge.y / length, -edge.x / length};
    const double mean_temperature = 0.5 * (temperature[e.a] + temperature[e.b]);
    const double residual = dot(flux[e.triangle], outward) - (mean_temperature - load[e.surface]) / rs;
    eta[e.triangle] += 0.5 * length * length * residual * residual;
  }
  return eta;
}

}  // namespace edgeflux
