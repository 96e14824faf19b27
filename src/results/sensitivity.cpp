// First-order sensitivities from the solved fields. The discrete problem is self-adjoint: L2D is the
// energy of the unit field, stationary in the field, so its derivative with respect to a λ or an Rs
// is that term of the energy at the solved field. A point temperature needs one adjoint field.
#include "results/sensitivity.h"

#include <chrono>
#include <cmath>

namespace edgeflux {
namespace {

/// Area and the gradient of a linear field on triangle t.
struct TriangleGradient {
  double area = 0;
  Point gradient;
};

TriangleGradient triangle_gradient(const TriMesh& mesh, int t, const std::vector<double>& field) {
  const auto& tri = mesh.triangles[t];
  const Point p0 = mesh.points[tri[0]], p1 = mesh.points[tri[1]], p2 = mesh.points[tri[2]];
  const double twice_area = cross(p1 - p0, p2 - p0);
  if (!(twice_area > 0.0)) return {};
  // ∇f = Σ f_i · (rotated opposite edge) / (2A)
  const Point e[3] = {p2 - p1, p0 - p2, p1 - p0};
  Point g{0.0, 0.0};
  for (int i = 0; i < 3; ++i) {
    g.x += field[tri[i]] * -e[i].y / twice_area;
    g.y += field[tri[i]] * e[i].x / twice_area;
  }
  return {0.5 * twice_area, g};
}

FirstOrderRange range_of(double value, const std::vector<InputSensitivity>& inputs, auto derivative_of) {
  FirstOrderRange r;
  r.value = value;
  double squares = 0;
  for (const InputSensitivity& in : inputs) {
    if (in.kind != InputSensitivity::Kind::conductivity) continue;
    const std::optional<double> d = derivative_of(in);
    if (!d) continue;
    const double spread = *d * in.relative_uncertainty * in.value;
    squares += spread * spread;
    r.worst_case += std::abs(spread);
  }
  r.independent = std::sqrt(squares);
  return r;
}

}  // namespace

std::optional<double> elasticity(double derivative, double input, double result) {
  if (result == 0.0 || !std::isfinite(result)) return std::nullopt;
  return derivative * input / result;
}

int min_surface_node(const TriMesh& mesh, const SurfaceMinimum& minimum) {
  for (const BoundaryEdge& e : mesh.boundary_edges) {
    if (e.surface != minimum.surface) continue;
    for (int node : {e.a, e.b})
      if (mesh.points[node].x == minimum.at.x && mesh.points[node].y == minimum.at.y) return node;
  }
  return -1;
}

Sensitivities sensitivities(const CrossSection& section, const TriMesh& mesh, const Run& heat_loss,
                            const Run& surface_temperature, const JunctionResults& junction, const std::vector<double>& adjoint) {
  const auto start = std::chrono::steady_clock::now();
  Sensitivities out;
  const std::size_t n_materials = section.materials.size(), n_surfaces = section.surfaces.size();

  // The two environments of L2D: the unit field is 1 in the first and 0 in the second.
  std::optional<std::size_t> first_environment;
  if (heat_loss.field.coupling_2d)
    for (const Surface& s : section.surfaces)
      if (!first_environment || s.environment < *first_environment) first_environment = s.environment;
  const std::vector<double>* unit = first_environment ? &heat_loss.unit_temperature[*first_environment] : nullptr;

  // Volume terms per material: ∫|∇u|² (L2D) and −∫∇z·∇T (θsi,min).
  std::vector<double> energy(n_materials, 0.0), point(n_materials, 0.0);
  for (int t = 0; t < mesh.n_triangles(); ++t) {
    const std::size_t m = mesh.triangle_material[t];
    if (unit) {
      const TriangleGradient g = triangle_gradient(mesh, t, *unit);
      energy[m] += g.area * dot(g.gradient, g.gradient);
    }
    if (!adjoint.empty()) {
      const TriangleGradient gz = triangle_gradient(mesh, t, adjoint);
      const TriangleGradient gt = triangle_gradient(mesh, t, surface_temperature.temperature);
      point[m] -= gz.area * dot(gz.gradient, gt.gradient);
    }
  }
  // Surface terms per surface: ∫(u − u_s)² ds (L2D, lumped at the nodes as the solver does) and
  // Σ z (T − θ_s) ds (θsi,min).
  std::vector<double> surface_energy(n_surfaces, 0.0), surface_point(n_surfaces, 0.0);
  for (const BoundaryEdge& edge : mesh.boundary_edges) {
    if (edge.surface < 0) continue;
    const Surface& s = section.surfaces[edge.surface];
    const double half = 0.5 * distance(mesh.points[edge.a], mesh.points[edge.b]);
    const double unit_level = first_environment && s.environment == *first_environment ? 1.0 : 0.0;
    const double theta = section.environments[s.environment].temperature;
    for (int node : {edge.a, edge.b}) {
      if (unit) surface_energy[edge.surface] += half * std::pow((*unit)[node] - unit_level, 2);
      if (!adjoint.empty()) surface_point[edge.surface] += half * adjoint[node] * (surface_temperature.temperature[node] - theta);
    }
  }

  std::optional<double> denominator;  // θi − θe of fRsi
  if (junction.temperature_factor && junction.interior_environment && junction.exterior_environment)
    denominator = section.environments[*junction.interior_environment].temperature -
                  section.environments[*junction.exterior_environment].temperature;

  // The flanking elements' U from their layer stacks: ∂U/∂λm = U² Σ d/λm², ∂U/∂Rs = −U² per end on s.
  auto flanking_u_derivative = [&](const InputSensitivity& in, const FlankingResult& f) {
    if (f.u_value_stated) return 0.0;
    const double u2 = f.u_value * f.u_value;
    double d = 0.0;
    if (in.kind == InputSensitivity::Kind::conductivity) {
      for (const FlankingLayer& layer : f.layers)
        if (layer.material == in.name) d += u2 * layer.thickness / (layer.conductivity * layer.conductivity);
    } else {
      if (f.start_surface == in.name) d -= u2;
      if (f.end_surface == in.name) d -= u2;
    }
    return d;
  };
  auto finish = [&](InputSensitivity in, double d_coupling, double d_point) {
    if (unit) {
      in.coupling = d_coupling;
      for (const PsiValue& p : junction.psi) {
        double d = d_coupling;
        for (const FlankingResult& f : junction.flanking)
          if (const auto& l = f.length[static_cast<int>(p.system)]) d -= *l * flanking_u_derivative(in, f);
        in.psi.push_back(d);
      }
    }
    if (!adjoint.empty()) {
      in.min_surface_temperature = d_point;
      if (denominator) in.temperature_factor = d_point / *denominator;
    }
    out.inputs.push_back(std::move(in));
  };

  for (std::size_t m = 0; m < n_materials; ++m) {
    InputSensitivity in;
    in.kind = InputSensitivity::Kind::conductivity;
    in.index = m;
    in.name = section.materials[m].id;
    in.value = section.materials[m].conductivity;
    in.relative_uncertainty = section.materials[m].relative_uncertainty.value_or(default_conductivity_uncertainty);
    finish(std::move(in), energy[m], point[m]);
  }
  for (std::size_t s = 0; s < n_surfaces; ++s) {
    const double rs = heat_loss.problem.surface_resistance[s];
    const double rs_t = surface_temperature.problem.surface_resistance[s];
    if (rs == 0.0) continue;  // a fixed temperature has no resistance to vary
    InputSensitivity in;
    in.kind = InputSensitivity::Kind::surface_resistance;
    in.index = s;
    in.name = section.surfaces[s].name;
    in.value = rs;
    in.temperature_run_value = rs_t;
    // L2D = … + (1/Rs) ∫(u − u_s)²: ∂/∂Rs = −(1/Rs²) ∫(u − u_s)²; θsi,min: +(1/Rs²) Σ z (T − θ_s).
    finish(std::move(in), -surface_energy[s] / (rs * rs), rs_t > 0.0 ? surface_point[s] / (rs_t * rs_t) : 0.0);
  }

  if (unit) {
    double identity = 0.0;
    for (std::size_t m = 0; m < n_materials; ++m) identity += section.materials[m].conductivity * energy[m];
    for (std::size_t s = 0; s < n_surfaces; ++s)
      if (heat_loss.problem.surface_resistance[s] > 0.0) identity += surface_energy[s] / heat_loss.problem.surface_resistance[s];
    const double l2d = *heat_loss.field.coupling_2d;
    out.energy_identity_relative = std::abs(l2d - identity) / std::abs(l2d);
    out.coupling = range_of(l2d, out.inputs, [](const InputSensitivity& in) { return in.coupling; });
    for (std::size_t i = 0; i < junction.psi.size(); ++i)
      out.psi.push_back(range_of(junction.psi[i].psi, out.inputs, [i](const InputSensitivity& in) {
        return i < in.psi.size() ? std::optional<double>(in.psi[i]) : std::nullopt;
      }));
  }
  if (junction.temperature_factor && !adjoint.empty() && denominator) {
    out.temperature_factor = range_of(*junction.temperature_factor, out.inputs,
                                      [](const InputSensitivity& in) { return in.temperature_factor; });
    const SurfaceKind kind = section.surfaces[junction.min_interior_surface->surface].kind;
    for (const MoistureResult& m : junction.moisture) {
      if (m.kind != kind) continue;
      VerdictRobustness v;
      v.kind = kind;
      v.temperature_factor = *junction.temperature_factor;
      v.worst_temperature_factor = v.temperature_factor - out.temperature_factor->worst_case;
      v.required_temperature_factor = m.assessment.required_temperature_factor;
      for (const InputSensitivity& in : out.inputs)
        if (in.kind == InputSensitivity::Kind::conductivity)
          v.worst_relative_change.push_back(in.temperature_factor.value_or(0.0) > 0.0 ? -in.relative_uncertainty
                                                                                      : in.relative_uncertainty);
      v.still_met = v.worst_temperature_factor >= v.required_temperature_factor;
      out.verdict = v;
    }
  }
  out.seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
  return out;
}

}  // namespace edgeflux
