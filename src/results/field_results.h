// Numbers read off one temperature field: heat flows, balance, surface extremes, probe values.
#pragma once

#include <optional>
#include <span>
#include <string>
#include <vector>

#include "geometry/cross_section.h"
#include "mesh/tri_mesh.h"
#include "solver/thermal_problem.h"

namespace edgeflux {

struct LocatedTemperature {
  double temperature = 0.0;  ///< °C
  Point at;                  ///< m
};

struct EnvironmentFlow {
  std::size_t environment = 0;  ///< index into CrossSection::environments
  double heat_flow = 0.0;       ///< Φ, W/m, positive into the section
  std::optional<LocatedTemperature> coldest_surface;  ///< over this environment's surfaces
  std::optional<LocatedTemperature> warmest_surface;
};

struct HeatBalance {
  double net = 0.0;           ///< Σ Φ, W/m (zero for a conserving solution)
  double relative = 0.0;      ///< Σ Φ / (½ Σ |Φ|), the ISO 10211 energy-balance ratio
};

struct ProbeReading {
  std::string name;
  Point at;
  double temperature = 0.0;  ///< °C
};

struct FieldResults {
  std::vector<double> surface_heat_flow;      ///< per surface, W/m into the section
  std::vector<EnvironmentFlow> environments;  ///< one per environment, file order
  HeatBalance balance;
  std::optional<double> coupling_2d;          ///< L2D, W/(m·K), with exactly two environments
  std::vector<ProbeReading> probes;
  LocatedTemperature coldest_node, warmest_node;
  std::vector<Point> heat_flux;               ///< per triangle, q = −λ∇θ, W/m² (for drawings and VTK)
};

/// Heat flow into the section through each surface, W/m: the surface-resistance exchange for
/// ordinary surfaces, the reaction of the balance at fixed-temperature nodes.
std::vector<double> surface_heat_flows(const TriMesh& mesh, const ThermalProblem& problem,
                                       const std::vector<double>& temperature, const LoadCase& load);

/// Temperature at p by linear interpolation in the triangle containing it; nothing when p lies
/// outside the section. Bins the triangles anew on every call: for many points use temperatures_at.
std::optional<double> temperature_at(const TriMesh& mesh, const std::vector<double>& temperature, Point p);

/// temperature_at for many points at once: the triangles are binned into a grid once, so each
/// point costs the few triangles near it. One entry per point, nothing where it lies outside.
std::vector<std::optional<double>> temperatures_at(const TriMesh& mesh, const std::vector<double>& temperature,
                                                   std::span<const Point> points);

/// Everything above for one solved field. Throws InputError for a probe outside the section.
FieldResults evaluate_field(const CrossSection& section, const TriMesh& mesh, const ThermalProblem& problem,
                            const std::vector<double>& temperature, const LoadCase& load);

}  // namespace edgeflux
