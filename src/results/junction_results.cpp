// ψ per dimension system, θsi,min and fRsi, coupling coefficients, weighting factors and the
// moisture verdict, from the heat-loss and surface-temperature runs.
#include "results/junction_results.h"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <set>

#include "physics/linear_transmittance.h"
#include "physics/vapour.h"

namespace edgeflux {

std::vector<std::vector<double>> coupling_matrix(const CrossSection& section, const TriMesh& mesh, const Run& run) {
  const std::size_t n = section.environments.size();
  std::vector<std::vector<double>> coupling(n, std::vector<double>(n, 0.0));
  for (std::size_t j = 0; j < n; ++j) {
    LoadCase unit(section.surfaces.size(), 0.0);
    for (std::size_t s = 0; s < section.surfaces.size(); ++s)
      if (section.surfaces[s].environment == j) unit[s] = 1.0;
    const std::vector<double> flows = surface_heat_flows(mesh, run.problem, run.unit_temperature[j], unit);
    for (std::size_t s = 0; s < section.surfaces.size(); ++s) coupling[section.surfaces[s].environment][j] += flows[s];
  }
  return coupling;
}

namespace {

/// Coldest node on the interior surfaces of the given kind (fixed-temperature surfaces excluded).
std::optional<SurfaceMinimum> coldest_interior(const CrossSection& section, const TriMesh& mesh, const Run& run,
                                               std::optional<SurfaceKind> kind) {
  std::optional<SurfaceMinimum> best;
  for (const BoundaryEdge& e : mesh.boundary_edges) {
    if (e.surface < 0) continue;
    const Surface& s = section.surfaces[e.surface];
    if (section.environments[s.environment].side != Side::interior || s.is_fixed_temperature()) continue;
    if (kind && s.kind != *kind) continue;
    for (int node : {e.a, e.b})
      if (!best || run.temperature[node] < best->temperature) best = SurfaceMinimum{run.temperature[node], mesh.points[node], e.surface};
  }
  return best;
}

/// Where the coldest interior point lies relative to the cut-off planes, and the junction's own
/// minimum: along the interior surfaces (a chain of boundary edges) the nodes no warmer than their
/// neighbours are local minima; those on a cut-off plane belong to the undisturbed element.
void find_junction_minimum(const CrossSection& section, const TriMesh& mesh, const Run& run, JunctionResults& r) {
  if (!r.min_interior_surface) return;
  std::vector<std::vector<int>> neighbours(mesh.points.size());
  std::vector<int> surface_of(mesh.points.size(), -1);
  std::vector<int> cut_off_at(mesh.points.size(), -1);
  for (const BoundaryEdge& e : mesh.boundary_edges) {
    if (e.cut_off >= 0) cut_off_at[e.a] = cut_off_at[e.b] = e.cut_off;
    if (e.surface < 0) continue;
    const Surface& s = section.surfaces[e.surface];
    if (section.environments[s.environment].side != Side::interior || s.is_fixed_temperature()) continue;
    neighbours[e.a].push_back(e.b);
    neighbours[e.b].push_back(e.a);
    surface_of[e.a] = surface_of[e.b] = e.surface;
  }
  std::optional<SurfaceMinimum> best;
  for (std::size_t n = 0; n < neighbours.size(); ++n) {
    if (neighbours[n].empty() || cut_off_at[n] >= 0) continue;
    const double t = run.temperature[n];
    const bool local_minimum =
        std::all_of(neighbours[n].begin(), neighbours[n].end(), [&](int m) { return run.temperature[m] >= t; });
    if (local_minimum && (!best || t < best->temperature)) best = SurfaceMinimum{t, mesh.points[n], surface_of[n]};
  }
  r.junction_minimum = best;
  for (std::size_t n = 0; n < mesh.points.size(); ++n)
    if (cut_off_at[n] >= 0 && mesh.points[n].x == r.min_interior_surface->at.x && mesh.points[n].y == r.min_interior_surface->at.y)
      r.plain_element_governs = section.flanking_elements[cut_off_at[n]].id;
  if (!r.plain_element_governs) r.junction_minimum = r.min_interior_surface;
}

/// ψ per pair of environments joined by flanking elements, for sections with three or more.
std::vector<PairPsi> pair_psi(const CrossSection& section, const JunctionResults& r) {
  std::vector<PairPsi> pairs;
  const std::size_t n = section.environments.size();
  if (n < 3 || r.coupling.size() != n) return pairs;
  for (std::size_t i = 0; i < n; ++i)
    for (std::size_t j = i + 1; j < n; ++j) {
      PairPsi p{i, j, -r.coupling[i][j], {}, {}};
      std::vector<const FlankingResult*> between;
      for (const FlankingResult& f : r.flanking)
        if ((f.start_environment == i && f.end_environment == j) || (f.start_environment == j && f.end_environment == i)) {
          between.push_back(&f);
          p.elements.push_back(f.id);
        }
      if (between.empty()) continue;
      for (DimensionSystem system : all_dimension_systems) {
        std::vector<FlankingContribution> terms;
        for (const FlankingResult* f : between)
          if (const auto& l = f->length[static_cast<int>(system)]) terms.push_back({f->u_value, *l});
        if (terms.size() == between.size()) p.psi.push_back({system, linear_transmittance(p.coupling, terms)});
      }
      pairs.push_back(std::move(p));
    }
  return pairs;
}

std::optional<std::size_t> only_environment_on(const CrossSection& section, Side side) {
  std::set<std::size_t> found;
  for (const Surface& s : section.surfaces)
    if (section.environments[s.environment].side == side) found.insert(s.environment);
  if (found.size() == 1) return *found.begin();
  return std::nullopt;
}

}  // namespace

JunctionResults junction_results(const CrossSection& section, const TriMesh& mesh, const Run& heat_loss,
                                 const Run& surface_temperature) {
  JunctionResults r;
  r.cautions = standard_cautions();
  r.flanking = flanking_results(section, mesh, heat_loss, r.warnings);
  r.coupling = coupling_matrix(section, mesh, heat_loss);

  // ψ = L2D − Σ Uj lj in every system for which every flanking element has a length.
  if (!section.flanking_elements.empty()) {
    if (!heat_loss.field.coupling_2d) {
      r.warnings.push_back("a single ψ needs exactly two environments; with more, ψ is given per pair of environments joined by "
                           "flanking elements (Lij less their U·l), and the coupling coefficients Lij describe the rest");
    } else {
      for (DimensionSystem system : all_dimension_systems) {
        std::vector<FlankingContribution> terms;
        for (const FlankingResult& f : r.flanking)
          if (const auto& l = f.length[static_cast<int>(system)]) terms.push_back({f.u_value, *l});
        if (terms.size() == r.flanking.size())
          r.psi.push_back({system, linear_transmittance(*heat_loss.field.coupling_2d, terms)});
      }
      if (r.psi.empty())
        r.warnings.push_back("ψ is not reported: no dimension system has a length for every flanking element");
    }
  }

  // θsi,min, fRsi and weighting factors from the surface-temperature run.
  r.min_interior_surface = coldest_interior(section, mesh, surface_temperature, std::nullopt);
  find_junction_minimum(section, mesh, surface_temperature, r);
  if (!r.min_interior_surface &&
      std::any_of(section.surfaces.begin(), section.surfaces.end(), [&](const Surface& s) { return section.environments[s.environment].side == Side::interior; }))
    r.warnings.push_back("no θsi,min, fRsi or moisture verdict: every surface facing the interior is a fixed temperature (resistance 0); "
                         "give those surfaces their Rsi to assess them");
  r.pair_psi = pair_psi(section, r);
  r.interior_environment = only_environment_on(section, Side::interior);
  r.exterior_environment = only_environment_on(section, Side::exterior);
  if (r.min_interior_surface) {
    // g_j: the unit field of environment j at the coldest point (a mesh node).
    int node = 0;
    for (int i = 0; i < mesh.n_points(); ++i)
      if (mesh.points[i].x == r.min_interior_surface->at.x && mesh.points[i].y == r.min_interior_surface->at.y) node = i;
    for (const auto& unit : surface_temperature.unit_temperature) r.weighting_factors.push_back(unit[node]);
  }
  const bool has_pair = r.interior_environment && r.exterior_environment;
  if (r.min_interior_surface && has_pair) {
    const double ti = section.environments[*r.interior_environment].temperature;
    const double te = section.environments[*r.exterior_environment].temperature;
    if (ti != te) r.temperature_factor = temperature_factor(r.min_interior_surface->temperature, ti, te);
    if (section.environments.size() > 2)
      r.warnings.push_back("with more than two environments fRsi holds only for the design temperatures of all of them; "
                           "for other temperatures use the weighting factors g: θsi = Σ g_j θ_j");
    if (r.temperature_factor && (*r.temperature_factor < 0.0 || *r.temperature_factor > 1.0))
      r.warnings.push_back(fmt::format("fRsi = {:.4f} lies outside 0–1: the environments' temperatures do not bracket "
                                       "the surface temperature; check the environments and sides",
                                       *r.temperature_factor));
  }

  // Mould (opaque) and condensation (glazing) verdicts in the stated or assumed climate.
  if (has_pair && r.temperature_factor) {
    if (section.climate) {
      r.climate = section.climate;
    } else {
      Climate assumed;
      assumed.interior_temperature = section.environments[*r.interior_environment].temperature;
      assumed.exterior_temperature = section.environments[*r.exterior_environment].temperature;
      assumed.interior_relative_humidity = 0.5;
      r.climate = assumed;
      r.climate_assumed = true;
    }
    if (r.climate->interior_temperature <= r.climate->exterior_temperature) {
      r.warnings.push_back("no moisture verdict: the interior climate is not warmer than the exterior");
    } else {
      for (SurfaceKind kind : {SurfaceKind::opaque, SurfaceKind::glazing}) {
        const auto minimum = coldest_interior(section, mesh, surface_temperature, kind);
        if (!minimum) continue;
        const double ti = section.environments[*r.interior_environment].temperature;
        const double te = section.environments[*r.exterior_environment].temperature;
        const double f = temperature_factor(minimum->temperature, ti, te);
        if (f < 0.0 || f > 1.0) continue;  // warned above
        MoistureInput input;
        input.interior_temperature = r.climate->interior_temperature;
        input.exterior_temperature = r.climate->exterior_temperature;
        input.temperature_factor = f;
        input.is_glazing_or_frame = kind == SurfaceKind::glazing;
        input.rule_id = r.climate->rule;
        if (r.climate->interior_relative_humidity) {
          input.interior_relative_humidity = r.climate->interior_relative_humidity;
        } else {
          const double pe = r.climate->exterior_relative_humidity * saturation_vapour_pressure(r.climate->exterior_temperature);
          input.interior_vapour_pressure = interior_vapour_pressure_from_class(*r.climate->humidity_class, r.climate->exterior_temperature, pe);
        }
        try {
          r.moisture.push_back({kind, *minimum, f, assess_surface_moisture(input)});
        } catch (const std::invalid_argument& e) {
          throw_input_error(r.climate->where, "<climate>", e.what(), "check the climate values");
        }
      }
    }
  }
  return r;
}

}  // namespace edgeflux
