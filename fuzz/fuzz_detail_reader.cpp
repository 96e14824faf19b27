// libFuzzer target: arbitrary bytes through the detail reader, the cross-section checks and the
// mesher at a low density. An InputError is the expected answer to bad input; any other exception,
// a crash, a hang, a sanitizer report or a mesh that breaks its own invariants is a finding.
#include <algorithm>
#include <cmath>
#include <cstddef>
#include <cstdint>
#include <cstdio>
#include <cstdlib>
#include <string>

#include "core/error.h"
#include "input/read_detail_file.h"
#include "mesh/mesh_cross_section.h"

namespace {

using namespace edgeflux;

[[noreturn]] void finding(const char* what) {
  std::fprintf(stderr, "fuzz_detail_reader: mesh invariant broken: %s\n", what);
  std::abort();
}

/// The promises of TriMesh (mesh/tri_mesh.h) that later stages index by without checking.
void check_mesh(const CrossSection& section, const TriMesh& mesh) {
  const int n_points = mesh.n_points();
  if (mesh.triangles.empty()) finding("a section that passed the checks meshed to no triangles");
  if (mesh.triangle_region.size() != mesh.triangles.size() || mesh.triangle_material.size() != mesh.triangles.size())
    finding("per-triangle arrays differ in length");
  for (int t = 0; t < mesh.n_triangles(); ++t) {
    const auto& tri = mesh.triangles[t];
    for (int v : tri)
      if (v < 0 || v >= n_points) finding("triangle node index out of range");
    const Point p0 = mesh.points[tri[0]], p1 = mesh.points[tri[1]], p2 = mesh.points[tri[2]];
    if (!(cross(p1 - p0, p2 - p0) > 0.0)) finding("triangle not counter-clockwise or of zero area");
    if (mesh.triangle_region[t] < 0 || mesh.triangle_region[t] >= static_cast<int>(section.regions.size()))
      finding("triangle region out of range");
    if (mesh.triangle_material[t] < 0 || mesh.triangle_material[t] >= static_cast<int>(section.materials.size()))
      finding("triangle material out of range");
  }
  for (const Point& p : mesh.points)
    if (!std::isfinite(p.x) || !std::isfinite(p.y)) finding("node coordinate not finite");
  for (const BoundaryEdge& e : mesh.boundary_edges) {
    if (e.a < 0 || e.a >= n_points || e.b < 0 || e.b >= n_points) finding("boundary edge node out of range");
    if (e.triangle < 0 || e.triangle >= mesh.n_triangles()) finding("boundary edge triangle out of range");
    if (e.surface < -1 || e.surface >= static_cast<int>(section.surfaces.size())) finding("boundary edge surface out of range");
  }
}

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string text(reinterpret_cast<const char*>(data), size);
  try {
    const CrossSection section = parse_detail_text(text, "fuzz.xml");
    MeshOptions options;
    options.mesher = section.mesh.mesher;
    // Low density keeps an execution in milliseconds; the mesher's logic is the same at any density.
    options.density = std::min(section.mesh.density, 0.25);
    check_mesh(section, mesh_cross_section(section, options));
  } catch (const InputError&) {
    // The expected outcome for bad input.
  }
  return 0;
}
