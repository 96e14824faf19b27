// Writes the VTK XML UnstructuredGrid format (VTK file formats, "XML File Formats", version 1.0).
#include "report/vtu_writer.h"

#include <fmt/format.h>

#include "report/field_quantities.h"

namespace edgeflux {
namespace {

std::string xml_comment_safe(std::string s) {
  // "--" may not appear inside an XML comment.
  for (std::size_t at; (at = s.find("--")) != std::string::npos;) s.replace(at, 2, "- -");
  return s;
}

}  // namespace

std::string vtu_document(const CrossSection& section, const Calculation& calc) {
  const TriMesh& mesh = calc.mesh;
  const std::vector<Point>& flux = calc.heat_loss.field.heat_flux;
  std::string out;
  out += "<?xml version=\"1.0\"?>\n";
  out += fmt::format("<!-- edgeflux {}: {} -->\n", EDGEFLUX_VERSION, xml_comment_safe(section.title.empty() ? section.file : section.title));
  out += "<!-- material_id:";
  for (std::size_t m = 0; m < section.materials.size(); ++m) out += fmt::format(" {}={}", m, xml_comment_safe(section.materials[m].id));
  out += " -->\n";
  out += "<VTKFile type=\"UnstructuredGrid\" version=\"1.0\" byte_order=\"LittleEndian\" header_type=\"UInt64\">\n";
  out += "  <UnstructuredGrid>\n";
  out += fmt::format("    <Piece NumberOfPoints=\"{}\" NumberOfCells=\"{}\">\n", mesh.n_points(), mesh.n_triangles());
  auto scalars = [&](const char* type, const char* name, int components, auto&& body) {
    out += fmt::format("        <DataArray type=\"{}\" Name=\"{}\" NumberOfComponents=\"{}\" format=\"ascii\">\n", type, name, components);
    body();
    out += "        </DataArray>\n";
  };
  auto field = [&](const char* name, const std::vector<double>& values) {
    scalars("Float64", name, 1, [&] {
      for (double v : values) out += fmt::format("          {:.17g}\n", v);
    });
  };
  out += "      <PointData Scalars=\"temperature_heat_loss_run_c\">\n";
  field("temperature_heat_loss_run_c", calc.heat_loss.temperature);
  field("temperature_surface_run_c", calc.surface_temperature.temperature);
  out += "      </PointData>\n";
  out += "      <CellData Scalars=\"material_id\" Vectors=\"heat_flux_w_per_m2\">\n";
  scalars("Int32", "material_id", 1, [&] {
    for (int m : mesh.triangle_material) out += fmt::format("          {}\n", m);
  });
  scalars("Int32", "region_id", 1, [&] {
    for (int r : mesh.triangle_region) out += fmt::format("          {}\n", r);
  });
  scalars("Float64", "heat_flux_w_per_m2", 3, [&] {
    for (const Point& q : flux) out += fmt::format("          {:.17g} {:.17g} 0\n", q.x, q.y);
  });
  out += "      </CellData>\n";
  out += "      <Points>\n";
  scalars("Float64", "Points", 3, [&] {
    for (const Point& p : mesh.points) out += fmt::format("          {:.17g} {:.17g} 0\n", p.x, p.y);
  });
  out += "      </Points>\n";
  out += "      <Cells>\n";
  scalars("Int64", "connectivity", 1, [&] {
    for (const auto& t : mesh.triangles) out += fmt::format("          {} {} {}\n", t[0], t[1], t[2]);
  });
  scalars("Int64", "offsets", 1, [&] {
    for (int t = 1; t <= mesh.n_triangles(); ++t) out += fmt::format("          {}\n", 3 * t);
  });
  scalars("UInt8", "types", 1, [&] {
    for (int t = 0; t < mesh.n_triangles(); ++t) out += "          5\n";  // VTK_TRIANGLE
  });
  out += "      </Cells>\n";
  out += "    </Piece>\n  </UnstructuredGrid>\n</VTKFile>\n";
  return out;
}

}  // namespace edgeflux
