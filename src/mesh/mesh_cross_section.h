// One call from a cross-section to its mesh: picks the mesher, paints materials, tags surfaces.
#pragma once

#include <string>

#include "core/error.h"
#include "geometry/cross_section.h"
#include "geometry/planar_subdivision.h"
#include "mesh/tri_mesh.h"

namespace edgeflux {

/// The documented largest mesh (docs/detail-format.md, Limits): a finer mesh would need more
/// memory and time than a junction calculation should, and says the input asks for too much.
inline constexpr std::size_t node_limit = 2'000'000;

struct MeshOptions {
  MeshSettings::Mesher mesher = MeshSettings::Mesher::automatic;
  double density = 1.0;  ///< > 0; 2 roughly doubles the elements along every length
  std::size_t max_nodes = node_limit;  ///< the mesher stops with an InputError beyond this
};

/// A mesh that would pass the node limit, or a refinement that ran past its budget. An InputError, so
/// a first mesh that fails this way ends the run (exit code 2); adaptive refinement instead stops at
/// the level it has and says why (`reason`, without file name and fix).
class MeshLimitError : public InputError {
 public:
  MeshLimitError(const std::string& message, std::string reason) : InputError(message), reason_(std::move(reason)) {}
  const std::string& reason() const { return reason_; }

 private:
  std::string reason_;
};

/// Meshes the section's subdivision: its edges are kept exactly, its faces painted, its surface and
/// cut-off edges tagged. Throws InputError for region edges that meet at an angle too sharp to
/// mesh; MeshLimitError for a mesh beyond the node limit or budget. Deterministic: the same
/// section and options give the same mesh.
TriMesh mesh_cross_section(const CrossSection& section, const PlanarSubdivision& subdivision, const MeshOptions& options);

/// The same in one call: builds the subdivision first (its warnings are dropped).
TriMesh mesh_cross_section(const CrossSection& section, const MeshOptions& options);

/// True when every region edge and surface segment is parallel to an axis, so the structured
/// right-triangle grid (the five-point finite-difference stencil) can represent the section exactly.
bool is_rectilinear(const CrossSection& section);

}  // namespace edgeflux
