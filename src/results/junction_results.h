// The numbers a consultant writes down for a junction: U and lengths of the flanking elements,
// ψ per dimension system, θsi,min and fRsi, coupling coefficients and weighting factors, and the
// mould/condensation verdict with its cautions.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "geometry/cross_section.h"
#include "mesh/tri_mesh.h"
#include "physics/moisture_verdict.h"
#include "results/run.h"

namespace edgeflux {

struct FlankingLayer {
  std::string material;  ///< material id
  double thickness = 0;  ///< m, measured along the cut-off edge
  double conductivity = 0;
};

struct FlankingResult {
  std::string id;
  std::vector<FlankingLayer> layers;        ///< crossed by the cut-off edge, from its start
  std::string start_surface, end_surface;   ///< the faces the element joins
  std::size_t start_environment = 0, end_environment = 0;  ///< the environments those faces face
  double start_resistance = 0, end_resistance = 0;  ///< their heat-loss-run Rs, m²K/W
  std::optional<double> stack_u_value;      ///< U from the layer stack, W/(m²K)
  double u_value = 0;                       ///< U used for ψ (stated, else from the stack)
  bool u_value_stated = false;
  std::optional<double> length[3];          ///< m, per DimensionSystem
  double deviation_from_1d = 0;             ///< K, largest difference at the cut-off to the 1D profile
};

struct PsiValue {
  DimensionSystem system;
  double psi = 0;  ///< ψ, W/(m·K)
};

struct SurfaceMinimum {
  double temperature = 0;  ///< °C, in the surface-temperature run
  Point at;
  int surface = -1;        ///< index into CrossSection::surfaces
};

/// ψ between one pair of environments of a section with three or more (ISO 10211): their coupling
/// coefficient Lij less U·l of the flanking elements that join exactly these two environments.
struct PairPsi {
  std::size_t first = 0, second = 0;   ///< environment indices, first < second
  double coupling = 0;                 ///< Lij, W/(m·K)
  std::vector<std::string> elements;   ///< ids of the flanking elements between them
  std::vector<PsiValue> psi;           ///< per dimension system every one of them has a length in
};

struct MoistureResult {
  SurfaceKind kind;              ///< opaque: mould criterion; glazing: condensation criterion
  SurfaceMinimum minimum;
  double temperature_factor = 0; ///< fRsi at that minimum
  MoistureAssessment assessment;
};

struct JunctionResults {
  std::vector<FlankingResult> flanking;
  std::vector<PsiValue> psi;                   ///< every system the lengths allow
  std::optional<SurfaceMinimum> min_interior_surface;  ///< surface-temperature run
  /// The junction's own coldest point: the lowest local minimum of the interior surface temperature
  /// away from the cut-off planes. It equals min_interior_surface unless the plain element governs.
  std::optional<SurfaceMinimum> junction_minimum;
  /// θsi,min lies where a cut-off plane meets an interior surface: the undisturbed flanking element
  /// is colder than the junction itself. Names that element.
  std::optional<std::string> plain_element_governs;
  /// With three or more environments: ψ per pair of environments joined by flanking elements.
  std::vector<PairPsi> pair_psi;
  std::optional<double> temperature_factor;    ///< fRsi = (θsi,min − θe)/(θi − θe)
  std::optional<std::size_t> interior_environment, exterior_environment;
  /// coupling[i][j] = ∂Φi/∂θj, W/(m·K): heat flow into the section from environment i per kelvin
  /// of environment j (heat-loss run). Symmetric; rows sum to zero; Lij = −coupling[i][j], i ≠ j.
  std::vector<std::vector<double>> coupling;
  /// g_j at the point of θsi,min (surface-temperature run): θsi = Σ g_j θ_j, Σ g_j = 1.
  std::vector<double> weighting_factors;
  std::optional<Climate> climate;              ///< the climate of the verdict
  bool climate_assumed = false;                ///< true when the file gave none
  std::vector<MoistureResult> moisture;        ///< one per kind of interior surface present
  std::vector<std::string> warnings;
  std::vector<std::string> cautions;
};

/// Everything above, for a section the geometry stage has accepted (cut-offs on the outline,
/// lengths in every requested dimension system). Throws InputError only for a climate the
/// moisture assessment cannot use.
JunctionResults junction_results(const CrossSection& section, const TriMesh& mesh, const Run& heat_loss,
                                 const Run& surface_temperature);

/// The flanking-element part alone (U, layers, lengths, 1D check).
std::vector<FlankingResult> flanking_results(const CrossSection& section, const TriMesh& mesh, const Run& heat_loss,
                                             std::vector<std::string>& warnings);

/// ∂Φi/∂θj for every pair of environments from the unit fields of a run.
std::vector<std::vector<double>> coupling_matrix(const CrossSection& section, const TriMesh& mesh, const Run& run);

}  // namespace edgeflux
