// Benchmark of the geometry stage and the first mesh on large sections: a wall with one curved
// polygon of up to 100 000 vertices painted into it, and a wall built of up to 20 000 bricks
// (rectangles, each sharing its edges with its neighbours, every course offset by half a brick),
// turned by 17° so that no edge is axis-parallel. For each it times reading the detail text, the
// planar subdivision and the first mesh, and prints the growth of each time from one size to the
// next against the growth of the input: a quadratic step would grow by the square of the latter.
// Run: build/bench_geometry [--quick], or build/bench_geometry polygon|bricks SIZE for one case
#include <fmt/format.h>

#include <chrono>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <cstring>
#include <string>

#include "geometry/planar_subdivision.h"
#include "input/read_detail_file.h"
#include "mesh/mesh_cross_section.h"

using namespace edgeflux;

namespace {

double seconds_since(std::chrono::steady_clock::time_point start) {
  return std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
}

std::string detail(const std::string& regions, const std::string& inner, const std::string& outer) {
  return "<edgeflux-detail format=\"1\" units=\"mm\"><materials><material id=\"brick\" conductivity=\"0.8\"/>"
         "<material id=\"mortar\" conductivity=\"1.0\"/><material id=\"eps\" conductivity=\"0.035\"/></materials><regions>" +
         regions + "</regions><environments><environment id=\"in\" temperature=\"20\" side=\"interior\"/>"
                   "<environment id=\"out\" temperature=\"-5\" side=\"exterior\"/></environments><boundaries>"
                   "<surface environment=\"in\" resistance=\"0.13\" path=\"" + inner + "\"/><surface environment=\"out\" "
                   "resistance=\"0.04\" path=\"" + outer + "\"/></boundaries></edgeflux-detail>";
}

std::string point(double x, double y, double degrees) {
  const double a = degrees * 3.14159265358979323846 / 180.0;
  return fmt::format("{:.12g},{:.12g}", x * std::cos(a) - y * std::sin(a), x * std::sin(a) + y * std::cos(a));
}

/// A 5 m × 5 m block with a wavy insulation insert of n vertices (radius 2000 ± 100 mm, 40 waves):
/// at 100 000 vertices its edges are 0.13 mm long.
std::string curved_polygon(int n, double degrees) {
  std::string points;
  for (int i = 0; i < n; ++i) {
    const double t = 2.0 * 3.14159265358979323846 * i / n, r = 2000.0 + 100.0 * std::sin(40.0 * t);
    points += point(2500.0 + r * std::cos(t), 2500.0 + r * std::sin(t), degrees) + " ";
  }
  const std::string block = point(0, 0, degrees) + " " + point(5000, 0, degrees) + " " + point(5000, 5000, degrees) + " " +
                            point(0, 5000, degrees);
  return detail("<polygon material=\"brick\" points=\"" + block + "\"/><polygon material=\"eps\" points=\"" + points + "\"/>",
                point(0, 0, degrees) + " " + point(0, 5000, degrees), point(5000, 0, degrees) + " " + point(5000, 5000, degrees));
}

/// A wall 2 bricks thick of `n` bricks 240 × 71 mm in stretcher bond, courses offset by half a brick.
std::string brick_wall(int n, double degrees) {
  const int courses = std::max(1, n / 2);
  std::string regions;
  auto rect = [&](double x0, double y0, double x1, double y1) {
    regions += "<polygon material=\"brick\" points=\"" + point(x0, y0, degrees) + " " + point(x1, y0, degrees) + " " +
               point(x1, y1, degrees) + " " + point(x0, y1, degrees) + "\"/>";
  };
  for (int c = 0; c < courses; ++c) {
    const double y0 = 71.0 * c, y1 = y0 + 71.0;
    if (c % 2 == 0) rect(0, y0, 240, y1), rect(240, y0, 480, y1);
    else rect(0, y0, 120, y1), rect(120, y0, 360, y1), rect(360, y0, 480, y1);
  }
  const double top = 71.0 * courses;
  return detail(regions, point(0, 0, degrees) + " " + point(0, top, degrees), point(480, 0, degrees) + " " + point(480, top, degrees));
}

struct Timing {
  int size;
  double read, subdivide, mesh;
  int nodes;
};

Timing time_one(int size, const std::string& xml) {
  Timing t{size, 0, 0, 0, 0};
  auto start = std::chrono::steady_clock::now();
  const CrossSection section = parse_detail_text(xml, "bench.xml");
  t.read = seconds_since(start);
  start = std::chrono::steady_clock::now();
  const PlanarSubdivision sub = planar_subdivision(section);
  t.subdivide = seconds_since(start);
  start = std::chrono::steady_clock::now();
  MeshOptions options;
  options.density = 0.25;  // the first mesh of a coarse run: the geometry, not the refinement, is measured
  t.nodes = mesh_cross_section(section, sub, options).n_points();
  t.mesh = seconds_since(start);
  return t;
}

void table(const char* title, const char* unit, const std::vector<int>& sizes, std::string (*make)(int, double)) {
  fmt::print("{}\n{:>8} {:>8} {:>12} {:>9} {:>9} {:>9} {:>12}\n", title, unit, "nodes", "subdivide s", "read s", "mesh s",
             "total s", "growth ×");
  double previous_total = 0.0;
  int previous_size = 0;
  for (int size : sizes) {
    const Timing t = time_one(size, make(size, 17.0));
    const double total = t.read + t.subdivide + t.mesh;
    const std::string growth = previous_size ? fmt::format("{:.1f} for {:.0f}", total / previous_total,
                                                           static_cast<double>(size) / previous_size)
                                             : std::string("—");
    fmt::print("{:>8} {:>8} {:>12.3f} {:>9.3f} {:>9.3f} {:>9.3f} {:>12}\n", size, t.nodes, t.subdivide, t.read, t.mesh,
               total, growth);
    std::fflush(stdout);
    previous_total = total, previous_size = size;
  }
  fmt::print("\n");
}

}  // namespace

int main(int argc, char** argv) {
  // One case alone, for profiling: bench_geometry polygon|bricks SIZE
  if (argc == 3) {
    const int size = std::atoi(argv[2]);
    table(argv[1], "size", {size}, !std::strcmp(argv[1], "bricks") ? brick_wall : curved_polygon);
    return 0;
  }
  const bool quick = argc > 1 && !std::strcmp(argv[1], "--quick");
  table("One curved polygon painted into a block, turned by 17°", "vertices",
        quick ? std::vector<int>{1000, 10000} : std::vector<int>{1000, 10000, 100000}, curved_polygon);
  table("A brick wall of separate rectangles, turned by 17°", "regions",
        quick ? std::vector<int>{1000, 5000} : std::vector<int>{1000, 5000, 20000}, brick_wall);
  return 0;
}
