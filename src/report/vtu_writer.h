// The solved section as a VTK XML UnstructuredGrid (.vtu, ASCII) for ParaView and other viewers.
#pragma once

#include <string>

#include "geometry/cross_section.h"
#include "results/calculation.h"

namespace edgeflux {

/// A .vtu document: points (x, y, 0) in metres, linear triangles; point data
/// "temperature_heat_loss_run_c" and "temperature_surface_run_c" (°C); cell data "material_id"
/// (index into CrossSection::materials, listed in a comment), "region_id" and
/// "heat_flux_w_per_m2" (q = −λ∇T of the heat-loss run, 3 components, z = 0).
/// Numbers are written with 17 significant digits, so they read back exactly.
std::string vtu_document(const CrossSection& section, const Calculation& calc);

}  // namespace edgeflux
