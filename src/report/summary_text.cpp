// Formats the results of a calculation as a readable text summary.
#include "report/summary_text.h"

#include <fmt/format.h>

namespace edgeflux {

std::string summary_text(const CrossSection& section, const Calculation& calc) {
  const double unit = section.metres_per_unit;
  auto at = [&](Point p) { return fmt::format("({:.6g}, {:.6g})", p.x / unit, p.y / unit); };
  std::string out;
  auto line = [&](const std::string& text) { out += text + "\n"; };

  line(fmt::format("edgeflux {} — {}", EDGEFLUX_VERSION, section.title.empty() ? section.file : section.title));
  line("");
  line("Heat flow per environment (heat-loss run, positive into the section)");
  line(fmt::format("  {:<16} {:>8} {:>12}   {:<28} {:<28}", "environment", "θ [°C]", "Φ [W/m]",
                   fmt::format("coldest surface [°C] at ({})", section.unit),
                   fmt::format("warmest surface [°C] at ({})", section.unit)));
  for (const EnvironmentFlow& env : calc.field.environments) {
    const Environment& e = section.environments[env.environment];
    auto extreme = [&](const std::optional<LocatedTemperature>& t) {
      return t ? fmt::format("{:8.3f} {}", t->temperature, at(t->at)) : std::string("—");
    };
    line(fmt::format("  {:<16} {:>8.2f} {:>12.5f}   {:<28} {:<28}", e.id, e.temperature, env.heat_flow,
                     extreme(env.coldest_surface), extreme(env.warmest_surface)));
  }
  line(fmt::format("  energy balance: Σ Φ = {:.3e} W/m, ratio {:.2e} (ISO 10211 criterion < 1e-4: {})",
                   calc.field.balance.net, calc.field.balance.relative,
                   std::abs(calc.field.balance.relative) < 1e-4 ? "met" : "NOT MET"));
  if (calc.field.coupling_2d)
    line(fmt::format("  thermal coupling coefficient L2D = {:.5f} W/(m·K)", *calc.field.coupling_2d));
  if (!calc.field.probes.empty()) {
    line("");
    line(fmt::format("Probe temperatures"));
    for (const ProbeReading& p : calc.field.probes)
      line(fmt::format("  {:<16} {:>9.3f} °C  at {} {}", p.name, p.temperature, at(p.at), section.unit));
  }
  line("");
  const SolveInfo& info = calc.solution.info;
  line(fmt::format("Mesh: {} nodes, {} triangles ({} mesher); solver: {}", calc.mesh.n_points(),
                   calc.mesh.n_triangles(), calc.mesh.mesher, info.solver));
  line(fmt::format("Time: mesh {:.3f} s, assembly {:.3f} s, factorisation {:.3f} s, solve {:.3f} s",
                   calc.timings.mesh_seconds, info.assemble_seconds, info.factorize_seconds, info.solve_seconds));
  return out;
}

}  // namespace edgeflux
