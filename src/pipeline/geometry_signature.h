// What decides a section's meshes: two sections with the same signature differ at most in their
// materials' conductivities (and in what is only reported), so one mesh ladder serves both.
#pragma once

#include <string>

#include "geometry/cross_section.h"

namespace edgeflux {

/// Every input the geometry stage, the mesher and the refinement read, written exactly (coordinates
/// as hexadecimal floating point): the regions and their materials (which material, not its λ), the
/// environments' temperatures and sides, the surfaces with their resistances and kinds, the probes,
/// the cut-off planes, the arcs' chord points and the mesh settings. Conductivities, parameters,
/// U-values and lengths of flanking elements, the climate and the record are left out: they change
/// the solve or the report, not the meshes.
std::string geometry_signature(const CrossSection& section);

}  // namespace edgeflux
