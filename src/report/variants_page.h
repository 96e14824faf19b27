// Sweeps and comparisons as CSV and as one self-contained HTML page with plots of ψ and fRsi.
#pragma once

#include <string>
#include <vector>

#include "results/variant_summary.h"

namespace edgeflux {

/// One row per variant: the varied parameters, L2D, ψ per system with error bars, θsi,min, fRsi;
/// per kind of surface (opaque, glazing) fRsi, required fRsi and the criteria outcome; every
/// criterion in words; the climate, the input's SHA-256, nodes, error. `parameter_names` fixes the parameter columns.
std::string variants_csv(const std::vector<VariantSummary>& variants, const std::vector<std::string>& parameter_names);

/// How the variants were meshed, in one sentence: which ones were solved on the meshes of another
/// (same geometry, other conductivities), each with its own error estimate; empty when every
/// variant was meshed on its own.
std::string mesh_reuse_note(const std::vector<VariantSummary>& variants);

/// The page: a table with every variant, and for sweeps line plots of ψ and fRsi against the first
/// parameter (one line per value of the second), with the required fRsi drawn. Opaque and glazing
/// verdicts apart, each criterion in words, the climate, the time `generated`, input hashes, print
/// rules with page numbers. Cautions included.
std::string variants_page(const std::string& heading, const std::vector<VariantSummary>& variants,
                          const std::vector<std::string>& parameter_names, const std::string& generated);

}  // namespace edgeflux
