// libFuzzer target: the whole calculation on small valid sections derived from the fuzz bytes, with
// the physics every solution must obey checked. The bytes choose a rectangular section made of
// vertical layers with rectangles, star-shaped polygons and triangles painted into it (so the union
// of the regions is always the rectangle and no area is uncovered), conductivities from 1e-3 to
// 1e3 W/(m·K), two environments at different temperatures and two or three surfaces on the outline.
// The section is written as detail-file text and read back, so a finding is an ordinary detail file:
// run the crashing input with EDGEFLUX_FUZZ_PRINT=1 to print it, and keep it under tests/hostile/.
//
// Checked on every input (a violation aborts with the detail file and the broken invariant):
//   - the generated file is accepted (it is valid by construction) and the calculation succeeds;
//   - every number is finite;
//   - energy balance |Σ Φ| / (½ Σ |Φ|) < 1e-6, or 1e-11 × the conductivity contrast where larger (a
//     conservative scheme balances to rounding; the ISO 10211 criterion is 1e-4, this is far
//     tighter on purpose);
//   - every node and probe temperature lies within [min θ_env − 1e-6, max θ_env + 1e-6] K (maximum
//     principle of steady conduction without sources; common practice);
//   - heat flows in at the warmer environment and out at the colder one, L2D > 0.
#include <fuzzer/FuzzedDataProvider.h>
#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <cstddef>
#include <cstdint>
#include <cstdio>
#include <cstdlib>
#include <numbers>
#include <string>
#include <vector>

#include "core/error.h"
#include "input/read_detail_file.h"
#include "pipeline/calculate.h"

namespace {

using namespace edgeflux;

struct GeneratedDetail {
  std::string xml;
  double t_cold = 0.0, t_warm = 0.0;  ///< °C
  std::size_t warm_environment = 0;   ///< index of the warmer environment
  double contrast = 1.0;              ///< largest over smallest conductivity
};

/// A detail file (mm) built from the fuzz bytes; valid by construction.
GeneratedDetail generate(FuzzedDataProvider& fd) {
  const int width = fd.ConsumeIntegralInRange(20, 3000), height = fd.ConsumeIntegralInRange(20, 3000);
  std::string materials, regions;
  int n_materials = 0;
  double lambda_min = 1e300, lambda_max = 0.0;
  auto add_material = [&] {
    const double conductivity = std::pow(10.0, fd.ConsumeFloatingPointInRange(-3.0, 3.0));
    lambda_min = std::min(lambda_min, conductivity), lambda_max = std::max(lambda_max, conductivity);
    materials += fmt::format("    <material id=\"m{}\" conductivity=\"{:.6g}\" source=\"fuzz\"/>\n", n_materials, conductivity);
    return n_materials++;
  };

  // Vertical layers across the whole height: they cover the rectangle, which is the section.
  std::vector<int> cuts{0, width};
  for (int i = fd.ConsumeIntegralInRange(0, 3); i > 0; --i) cuts.push_back(fd.ConsumeIntegralInRange(1, width - 1));
  std::sort(cuts.begin(), cuts.end());
  cuts.erase(std::unique(cuts.begin(), cuts.end()), cuts.end());
  for (std::size_t i = 0; i + 1 < cuts.size(); ++i)
    regions += fmt::format("    <rectangle material=\"m{}\" from=\"{},0\" to=\"{},{}\"/>\n", add_material(), cuts[i], cuts[i + 1], height);

  // Inserts painted over the layers, all inside the rectangle so the union stays the rectangle.
  bool rectilinear = true;
  for (int i = fd.ConsumeIntegralInRange(0, 4); i > 0; --i) {
    switch (fd.ConsumeIntegralInRange(0, 2)) {
      case 0: {  // axis-parallel rectangle on the millimetre grid, possibly touching the outline
        const int x0 = fd.ConsumeIntegralInRange(0, width), x1 = fd.ConsumeIntegralInRange(0, width);
        const int y0 = fd.ConsumeIntegralInRange(0, height), y1 = fd.ConsumeIntegralInRange(0, height);
        if (x0 == x1 || y0 == y1) break;
        regions += fmt::format("    <rectangle material=\"m{}\" from=\"{},{}\" to=\"{},{}\"/>\n", add_material(), x0, y0, x1, y1);
        break;
      }
      case 1: {  // star-shaped polygon: angles increase with gaps below π, so the outline is simple
        const double cx = fd.ConsumeFloatingPointInRange(1.0, width - 1.0), cy = fd.ConsumeFloatingPointInRange(1.0, height - 1.0);
        const double r_max = 0.999 * std::min({cx, width - cx, cy, height - cy});
        if (r_max < 1.0) break;
        const int n = fd.ConsumeIntegralInRange(3, 8);
        const double start = fd.ConsumeFloatingPointInRange(0.0, 2.0 * std::numbers::pi);
        std::string points;
        for (int k = 0; k < n; ++k) {
          const double angle = start + 2.0 * std::numbers::pi * (k + fd.ConsumeFloatingPointInRange(0.0, 0.45)) / n;
          const double r = r_max * fd.ConsumeFloatingPointInRange(0.05, 1.0);
          points += fmt::format("{}{:.6f},{:.6f}", k ? " " : "", cx + r * std::cos(angle), cy + r * std::sin(angle));
        }
        regions += fmt::format("    <polygon material=\"m{}\" points=\"{}\"/>\n", add_material(), points);
        rectilinear = false;
        break;
      }
      default: {  // triangle on the millimetre grid, possibly with corners on the outline
        int p[6];
        for (int k = 0; k < 6; ++k) p[k] = fd.ConsumeIntegralInRange(0, k % 2 ? height : width);
        const long long twice_area = static_cast<long long>(p[2] - p[0]) * (p[5] - p[1]) -
                                     static_cast<long long>(p[3] - p[1]) * (p[4] - p[0]);
        if (twice_area == 0) break;
        regions += fmt::format("    <polygon material=\"m{}\" points=\"{},{} {},{} {},{}\"/>\n", add_material(), p[0], p[1], p[2],
                               p[3], p[4], p[5]);
        rectilinear = false;
        break;
      }
    }
  }

  // Two environments at different temperatures.
  GeneratedDetail out;
  const int t_a = fd.ConsumeIntegralInRange(-30, 40);
  const int dt = fd.ConsumeIntegralInRange(1, 50) * (fd.ConsumeBool() ? 1 : -1);
  const int t_b = t_a + dt;
  out.t_cold = std::min(t_a, t_b), out.t_warm = std::max(t_a, t_b);
  out.contrast = lambda_max / lambda_min;
  out.warm_environment = t_a > t_b ? 0 : 1;
  static const char* const side_pairs[][2] = {{"interior", "exterior"}, {"other", "other"}, {"interior", "other"}, {"exterior", "interior"}};
  const auto& sides = side_pairs[fd.ConsumeIntegralInRange(0, 3)];

  // Surfaces on the outline: fixed temperature, a preset or a number.
  auto surface = [&](const char* environment, const std::string& path) {
    switch (fd.ConsumeIntegralInRange(0, 3)) {
      case 0: return fmt::format("    <fixed-temperature environment=\"{}\" path=\"{}\"/>\n", environment, path);
      case 1: {
        static const char* const presets[] = {"rsi-upward", "rsi-horizontal", "rsi-downward", "rse", "rsi-temperature"};
        return fmt::format("    <surface environment=\"{}\" resistance=\"{}\" path=\"{}\"/>\n", environment,
                           presets[fd.ConsumeIntegralInRange(0, 4)], path);
      }
      case 2: return fmt::format("    <surface environment=\"{}\" resistance=\"{:.4g}\" kind=\"glazing\" path=\"{}\"/>\n", environment,
                                 fd.ConsumeFloatingPointInRange(0.01, 2.0), path);
      default: return fmt::format("    <surface environment=\"{}\" resistance=\"{:.4g}\" path=\"{}\"/>\n", environment,
                                  fd.ConsumeFloatingPointInRange(0.01, 2.0), path);
    }
  };
  const std::string left = fmt::format("0,0 0,{}", height), right = fmt::format("{},0 {},{}", width, width, height);
  const std::string top = fmt::format("0,{} {},{}", height, width, height);
  std::string boundaries;
  switch (fd.ConsumeIntegralInRange(0, 3)) {
    case 0: boundaries = surface("a", left) + surface("b", right); break;
    case 1: boundaries = surface("a", left) + surface("b", top); break;  // meeting at a corner
    case 2: {  // the bottom edge split between the two environments
      const int s = fd.ConsumeIntegralInRange(1, width - 1);
      boundaries = surface("a", fmt::format("0,0 {},0", s)) + surface("b", fmt::format("{},0 {},0", s, width));
      break;
    }
    default: {  // an L-shaped path of one environment and a second surface of the same one
      const int s = fd.ConsumeIntegralInRange(1, width - 1);
      boundaries = surface("a", fmt::format("{},{} 0,{} 0,0", s, height, height)) + surface("b", right) +
                   surface("a", fmt::format("{},0 {},0", width / 2, width));
      break;
    }
  }

  std::string probes;
  for (int i = fd.ConsumeIntegralInRange(0, 2); i > 0; --i)
    probes += fmt::format("    <probe name=\"p{}\" at=\"{},{}\"/>\n", i, fd.ConsumeIntegralInRange(0, width),
                          fd.ConsumeIntegralInRange(0, height));
  const bool grid = rectilinear && fd.ConsumeBool();

  out.xml = fmt::format(
      "<edgeflux-detail format=\"1\" units=\"mm\">\n  <materials>\n{}  </materials>\n  <regions>\n{}  </regions>\n"
      "  <environments>\n    <environment id=\"a\" temperature=\"{}\" side=\"{}\"/>\n"
      "    <environment id=\"b\" temperature=\"{}\" side=\"{}\"/>\n  </environments>\n"
      "  <boundaries>\n{}  </boundaries>\n{}{}  <mesh density=\"0.1\" mesher=\"{}\"/>\n</edgeflux-detail>\n",
      materials, regions, t_a, sides[0], t_b, sides[1], boundaries, probes.empty() ? "" : "  <probes>\n" + probes + "  </probes>\n",
      "", grid ? "grid" : "delaunay");
  return out;
}

const GeneratedDetail* current = nullptr;

[[noreturn]] void finding(const std::string& what) {
  std::fprintf(stderr, "fuzz_solver: %s\n--- detail file ---\n%s---\n", what.c_str(), current->xml.c_str());
  std::abort();
}

void check_temperature(const GeneratedDetail& g, double t, const std::string& what) {
  if (!std::isfinite(t)) finding(what + " is not finite");
  if (t < g.t_cold - 1e-6 || t > g.t_warm + 1e-6)
    finding(fmt::format("{} = {:.9g} °C lies outside the environment temperatures [{}, {}]", what, t, g.t_cold, g.t_warm));
}

/// Rounding in the balance grows with the conductivity contrast: conductances of 1000 W/(m·K)
/// carry a heat flow set by 0.001 W/(m·K). 1e-6, or 1e-11 × the contrast where that is larger
/// (measured: 1.2e-6 at a contrast of 10^6); the ISO 10211 criterion, 1e-4, stays far above.
double balance_bound(const GeneratedDetail& g) { return std::max(1e-6, 1e-11 * g.contrast); }

void check_run(const GeneratedDetail& g, const Run& run, const char* name) {
  for (std::size_t i = 0; i < run.temperature.size(); ++i) check_temperature(g, run.temperature[i], fmt::format("{} run: node {}", name, i));
  const FieldResults& f = run.field;
  for (const ProbeReading& p : f.probes) check_temperature(g, p.temperature, fmt::format("{} run: probe {}", name, p.name));
  double sum_abs = 0.0;
  for (const EnvironmentFlow& e : f.environments) {
    if (!std::isfinite(e.heat_flow)) finding(fmt::format("{} run: heat flow not finite", name));
    sum_abs += std::abs(e.heat_flow);
  }
  if (!std::isfinite(f.balance.relative) || std::abs(f.balance.relative) >= balance_bound(g))
    finding(fmt::format("{} run: energy balance ratio {:.3g} (Σ Φ = {:.3g} W/m of Σ|Φ| = {:.3g} W/m)", name, f.balance.relative,
                        f.balance.net, sum_abs));
  if (f.environments.size() != 2) finding(fmt::format("{} run: {} environment flows, expected 2", name, f.environments.size()));
  if (!(f.environments[g.warm_environment].heat_flow > 0.0) || !(f.environments[1 - g.warm_environment].heat_flow < 0.0))
    finding(fmt::format("{} run: heat does not flow from the warm to the cold environment ({:.6g}, {:.6g} W/m)", name,
                        f.environments[0].heat_flow, f.environments[1].heat_flow));
}

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  FuzzedDataProvider fd(data, size);
  const GeneratedDetail g = generate(fd);
  current = &g;
  if (std::getenv("EDGEFLUX_FUZZ_PRINT")) std::fprintf(stderr, "%s", g.xml.c_str());
  CalculationOptions options;
  // Three levels: the first mesh and two refinements (bisection and flips), each checked below on
  // the finest; more levels would only slow the executions down.
  options.adaptive = true;
  options.max_levels = 3;
  try {
    const Calculation calc = calculate(parse_detail_text(g.xml, "fuzz.xml"), options);
    check_run(g, calc.heat_loss, "heat-loss");
    check_run(g, calc.surface_temperature, "surface-temperature");
    const auto& l2d = calc.heat_loss.field.coupling_2d;
    if (!l2d || !std::isfinite(*l2d) || !(*l2d > 0.0)) finding("L2D missing, not finite or not positive");
    if (calc.junction.min_interior_surface)
      check_temperature(g, calc.junction.min_interior_surface->temperature, "θsi,min");
  } catch (const MeshLimitError&) {
    // A documented limit of the mesher (a tip sharper than 0.05°, the node limit, the refinement
    // budget), reached quickly with a clear message: what such a section should get.
  } catch (const InputError& e) {
    finding(std::string("a valid detail was rejected: ") + e.what());
  } catch (const std::exception& e) {
    finding(std::string("the calculation failed: ") + e.what());
  }
  return 0;
}
