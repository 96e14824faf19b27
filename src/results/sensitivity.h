// How much each input moves the results, to first order, from the solved fields: derivatives of
// L2D, ψ, θsi,min and fRsi with respect to every material's λ and every surface's Rs, and the
// first-order range of ψ and fRsi from the materials' uncertainties.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "geometry/cross_section.h"
#include "mesh/tri_mesh.h"
#include "results/junction_results.h"
#include "results/run.h"

namespace edgeflux {

/// The derivatives of the results with respect to one input (a material's λ or a surface's Rs).
struct InputSensitivity {
  enum class Kind { conductivity, surface_resistance };
  Kind kind = Kind::conductivity;
  std::size_t index = 0;      ///< into CrossSection::materials or ::surfaces
  std::string name;           ///< material id or surface name
  /// λ in W/(m·K), or the surface's Rs in the heat-loss run, m²K/W (L2D and ψ depend on that one).
  double value = 0;
  double temperature_run_value = 0;  ///< surfaces: Rs in the surface-temperature run (θsi,min, fRsi depend on it)
  double relative_uncertainty = 0;   ///< materials: the relative standard uncertainty of λ; surfaces: 0
  std::optional<double> coupling;    ///< ∂L2D/∂p (two environments)
  std::vector<double> psi;           ///< ∂ψ/∂p per JunctionResults::psi, including the flanking U's own change
  std::optional<double> min_surface_temperature;  ///< ∂θsi,min/∂p at the coldest interior point, K per unit of p
  std::optional<double> temperature_factor;       ///< ∂fRsi/∂p
};

/// A result with its first-order spread from the materials' uncertainties.
struct FirstOrderRange {
  double value = 0;
  double independent = 0;  ///< √Σ (∂Q/∂λm · u_m λm)², the λ taken as independent
  double worst_case = 0;   ///< Σ |∂Q/∂λm| · u_m λm, every λ off by its uncertainty the unfavourable way
};

/// fRsi when every λ is off by its uncertainty in the direction that lowers it, to first order.
struct VerdictRobustness {
  SurfaceKind kind = SurfaceKind::opaque;  ///< the kind of surface θsi,min lies on
  double temperature_factor = 0;           ///< fRsi as calculated
  double worst_temperature_factor = 0;     ///< fRsi − Σ |∂fRsi/∂λm| u_m λm
  double required_temperature_factor = 0;  ///< the highest criterion for that kind
  std::vector<double> worst_relative_change;  ///< per material: ±u_m, the change of λ that lowers fRsi
  bool still_met = false;
};

struct Sensitivities {
  std::vector<InputSensitivity> inputs;       ///< materials (file order), then surfaces with Rs > 0
  /// |L2D − (Σ_m λm ∫_m |∇u|² dA + Σ_s (1/Rs) ∫_s (u − u_s)² ds)| / L2D with u the unit field: the
  /// energy identity of the discrete solution, which the derivatives rest on.
  std::optional<double> energy_identity_relative;
  std::optional<FirstOrderRange> coupling;
  std::vector<FirstOrderRange> psi;            ///< per JunctionResults::psi
  std::optional<FirstOrderRange> temperature_factor;
  std::optional<VerdictRobustness> verdict;
  double seconds = 0;                          ///< the sensitivity step (adjoint solve included)
};

/// The node of the mesh where θsi,min lies (a boundary node of its surface), or −1.
int min_surface_node(const TriMesh& mesh, const SurfaceMinimum& minimum);

/// The derivatives from the solved fields. `adjoint` is the surface-temperature run's response to a
/// unit heat source at min_surface_node (empty when there is no θsi,min): (K + R)·z = e_i.
Sensitivities sensitivities(const CrossSection& section, const TriMesh& mesh, const Run& heat_loss,
                            const Run& surface_temperature, const JunctionResults& junction, const std::vector<double>& adjoint);

/// The default relative uncertainty of a material's λ (common practice: ±10 % for every kind of value).
inline constexpr double default_conductivity_uncertainty = 0.10;

/// Elasticity: % change of the result per % change of the input, (p/Q)·∂Q/∂p; nothing when Q is 0.
std::optional<double> elasticity(double derivative, double input, double result);

}  // namespace edgeflux
