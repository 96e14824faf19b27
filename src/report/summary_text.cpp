// Formats the results of a calculation as a readable text summary.
#include "report/summary_text.h"

#include <fmt/format.h>

#include <algorithm>
#include <cctype>

#include "report/number_format.h"
#include "report/sensitivity_tables.h"

namespace edgeflux {

std::string summary_text(const CrossSection& section, const Calculation& calc) {
  const double unit = section.metres_per_unit;
  auto at = [&](Point p) { return point_text(p, unit, section.unit); };
  const FieldResults& field = calc.heat_loss.field;
  const JunctionResults& junction = calc.junction;
  std::string out;
  auto line = [&](const std::string& text) { out += text + "\n"; };
  std::size_t id_width = 12;
  for (const Environment& e : section.environments) id_width = std::max(id_width, e.id.size());

  line(fmt::format("edgeflux {} — {}", EDGEFLUX_VERSION, section.title.empty() ? section.file : section.title));
  line(fmt::format("input: {}", section.file));
  {
    const JunctionRecord& r = section.record;
    std::string record;
    auto add = [&](std::string label, const std::string& v) {
      label[0] = static_cast<char>(std::tolower(static_cast<unsigned char>(label[0])));
      if (!v.empty()) record += fmt::format("{}{}: {}", record.empty() ? "" : " · ", label, v);
    };
    add("junction", r.reference);
    for (const auto& [label, value] : r.fields()) add(label, *value);
    if (!record.empty()) line(record);
  }
  line("");
  line("Heat-loss run (surface resistances as given; Φ positive into the section)");
  line(fmt::format("  {:<{}} {:>8} {:>12}   {:<30} {}", "environment", id_width, "θ [°C]", "Φ [W/m]",
                   "coldest surface [°C] at", "warmest surface [°C] at"));
  for (const EnvironmentFlow& env : field.environments) {
    const Environment& e = section.environments[env.environment];
    auto extreme = [&](const std::optional<LocatedTemperature>& t) {
      return t ? fmt::format("{:7.3f} {}", t->temperature, at(t->at)) : std::string("—");
    };
    line(fmt::format("  {:<{}} {:>8.2f} {:>12.5f}   {:<30} {}", e.id, id_width, e.temperature, env.heat_flow,
                     extreme(env.coldest_surface), extreme(env.warmest_surface)));
  }
  line(fmt::format("  energy balance: Σ Φ = {:.2e} W/m, ratio {:.1e} (ISO 10211 criterion < 1e-4: {})", field.balance.net,
                   field.balance.relative, std::abs(field.balance.relative) < 1e-4 ? "met" : "NOT MET"));
  const Convergence& conv = calc.convergence;
  if (field.coupling_2d) line(fmt::format("  thermal coupling coefficient L2D = {} W/(m·K)", fixed(*field.coupling_2d, digits::coupling)));

  if (!junction.flanking.empty()) {
    line("");
    line("Flanking elements (U from the layer stack at the cut-off plane unless stated; lengths in m)");
    std::size_t id_width = 18;  // long ids widen the column rather than push the figures out of line
    for (const FlankingResult& f : junction.flanking) id_width = std::max(id_width, f.id.size());
    line(fmt::format("  {:<{}} {:>11} {:>9} {:>9} {:>9}   {}", "element", id_width, "U [W/m²K]", "internal", "ov. int.", "external", "layer stack at the cut-off"));
    for (const FlankingResult& f : junction.flanking) {
      auto length = [&](int s) { return f.length[s] ? fmt::format("{:9.3f}", *f.length[s]) : fmt::format("{:>9}", "—"); };
      std::string stack = fmt::format("Rs {:.2f}", f.start_resistance);
      for (const FlankingLayer& l : f.layers) stack += fmt::format(" | {} {:.0f} mm", l.material, l.thickness * 1000);
      stack += fmt::format(" | Rs {:.2f}", f.end_resistance);
      line(fmt::format("  {:<{}} {:>9.4f}{} {} {} {}   {}", f.id, id_width, f.u_value, f.u_value_stated ? " *" : "  ", length(0), length(1),
                       length(2), stack));
    }
    if (std::any_of(junction.flanking.begin(), junction.flanking.end(), [](const FlankingResult& f) { return f.u_value_stated; }))
      line("  * U stated in the detail file");
  }
  if (!junction.psi.empty()) {
    line("");
    line("Linear thermal transmittance ψ = L2D − Σ U·l");
    for (const PsiValue& p : junction.psi) {
      const bool carried = section.carried_forward == p.system;
      line(fmt::format("  {:<29} ψ = {:>6} W/(m·K){}", fmt::format("{} dimensions:", dimension_system_name(p.system)), fixed(p.psi, digits::psi),
                       carried ? "   ← carried forward" : ""));
    }
    if (!section.carried_forward)
      line("  (no system marked as carried forward: carry-forward=\"...\" in <flanking-elements> or --carry-forward)");
  }
  for (const PairPsi& pair : junction.pair_psi) {
    if (&pair == &junction.pair_psi.front()) {
      line("");
      line("ψ per pair of environments = Lij − Σ U·l of the flanking elements between them (ISO 10211)");
    }
    for (const PsiValue& p : pair.psi)
      line(fmt::format("  {} – {}, {} dimensions: ψ = {} W/(m·K) (Lij {}; elements {}){}", section.environments[pair.first].id,
                       section.environments[pair.second].id, dimension_system_name(p.system), fixed(p.psi, digits::psi),
                       fixed(pair.coupling, digits::coupling), fmt::join(pair.elements, ", "),
                       section.carried_forward == p.system ? "   ← carried forward" : ""));
  }
  if (const std::string accuracy = accuracy_statement(conv); !accuracy.empty()) line("  (" + accuracy + ")");

  line("");
  line("Surface-temperature run (interior Rsi 0.25 m²K/W on opaque surfaces, 0.13 on glazing; ISO 13788)");
  if (junction.min_interior_surface) {
    const SurfaceMinimum& m = *junction.min_interior_surface;
    line(fmt::format("  θsi,min = {} °C at {} on surface '{}'", fixed(m.temperature, digits::surface_temperature), at(m.at),
                     section.surfaces[m.surface].name));
    if (junction.plain_element_governs) {
      line(fmt::format("    this is the plain element '{}' at its cut-off plane: the undisturbed element governs", *junction.plain_element_governs));
      if (junction.junction_minimum)
        line(fmt::format("    the junction's own lowest: {} °C at {} on surface '{}'", fixed(junction.junction_minimum->temperature, digits::surface_temperature),
                         at(junction.junction_minimum->at), section.surfaces[junction.junction_minimum->surface].name));
      else
        line("    the interior surfaces warm steadily towards the junction: it has no colder point of its own");
    }
  } else {
    // Say which of the two reasons holds: no interior environment, or only fixed temperatures facing it.
    bool interior_surface = false;
    for (const Surface& s : section.surfaces)
      interior_surface = interior_surface || section.environments[s.environment].side == Side::interior;
    line(interior_surface ? "  no θsi,min: every surface facing the interior is a fixed temperature (resistance 0), which the "
                            "search for the coldest surface leaves out; give those surfaces their Rsi to get θsi,min and fRsi"
                          : "  no interior surface (mark the room environment side=\"interior\" to get θsi,min and fRsi)");
  }
  if (junction.temperature_factor) line(fmt::format("  fRsi = {:.3f}", *junction.temperature_factor));

  if (section.environments.size() > 2) {
    line("");
    line("Coupling matrix ∂Φi/∂θj [W/(m·K)] (heat-loss run; Lij = −entry for i ≠ j; rows sum to zero)");
    std::string head = fmt::format("  {:<{}}", "", id_width);
    for (const Environment& e : section.environments) head += fmt::format(" {:>{}}", e.id, std::max<std::size_t>(id_width, 10));
    line(head);
    for (std::size_t i = 0; i < section.environments.size(); ++i) {
      std::string row = fmt::format("  {:<{}}", section.environments[i].id, id_width);
      for (double v : junction.coupling[i]) row += fmt::format(" {:>{}.5f}", v, std::max<std::size_t>(id_width, 10));
      line(row);
    }
    if (!junction.weighting_factors.empty()) {
      std::string g = "  temperature weighting factors at θsi,min:";
      for (std::size_t j = 0; j < junction.weighting_factors.size(); ++j)
        g += fmt::format("  g[{}] = {:.4f}", section.environments[j].id, junction.weighting_factors[j]);
      line(g);
    }
  }

  if (junction.climate) {
    const Climate& c = *junction.climate;
    line("");
    line(fmt::format("Condensation and mould (ISO 13788){}", junction.climate_assumed ? " — climate ASSUMED, none given in the file" : ""));
    line(fmt::format("  climate: interior {:.1f} °C, {}, exterior {:.1f} °C; rule: {}", c.interior_temperature,
                     c.interior_relative_humidity ? fmt::format("{:.0f} % RH", 100 * *c.interior_relative_humidity)
                                                  : fmt::format("humidity class {}", *c.humidity_class),
                     c.exterior_temperature, c.rule));
    for (const MoistureResult& m : junction.moisture) {
      const MoistureAssessment& a = m.assessment;
      line(fmt::format("  {} surfaces: pi = {:.0f} Pa, dew point {:.2f} °C, θsi,min for mould {:.2f} °C", 
                       m.kind == SurfaceKind::glazing ? "glazing/frame" : "opaque", a.interior_vapour_pressure, a.dew_point,
                       a.mould_surface_temperature));
      line(fmt::format("    fRsi,min: mould {:.3f}, condensation {:.3f}; required {:.3f} ({})", a.mould_temperature_factor,
                       a.condensation_temperature_factor, a.required_temperature_factor, a.governing_requirement));
      for (const CriterionCheck& c : a.criteria) line("    " + criterion_statement(c, a.actual_temperature_factor));
      line(fmt::format("    margin {:+.3f} to the highest requirement; the coldest surface reaches {:.1f} °C and {:.0f} % surface RH",
                       a.margin, a.surface_temperature, 100 * a.surface_relative_humidity));
    }
  }

  if (const std::string block = sensitivity_text(section, calc); !block.empty()) {
    line("");
    out += block;
  }

  if (!field.probes.empty()) {
    line("");
    line("Probe temperatures (heat-loss run)");
    std::size_t w = 8;
    for (const ProbeReading& p : field.probes) w = std::max(w, p.name.size());
    for (const ProbeReading& p : field.probes) line(fmt::format("  {:<{}} {:>9.3f} °C  at {}", p.name, w, p.temperature, at(p.at)));
  }
  line("");
  line(conv.adaptive ? fmt::format("Mesh convergence (adaptive; targets: L2D {:.2g} %, ψ {:.4f} W/(m·K), θ {:.3f} K) — {}",
                                   100 * conv.target.coupling_relative, conv.target.psi_absolute,
                                   conv.target.temperature_absolute, conv.stop_reason)
                     : "Mesh convergence: fixed mesh, no refinement (no error estimate)");
  if (conv.levels.size() > 1) {
    line(fmt::format("  {:>6} {:>9} {:>12} {:>14} {:>9}", "level", "nodes", "Σ|Φ| [W/m]", "θsi,min [°C]", "time [s]"));
    for (std::size_t i = 0; i < conv.levels.size(); ++i) {
      const ConvergenceLevel& l = conv.levels[i];
      line(fmt::format("  {:>6} {:>9} {:>12.5f} {:>14} {:>9.3f}", i + 1, l.nodes, l.sum_abs_heat_flow,
                       l.min_surface_temperature ? fmt::format("{:.4f}", *l.min_surface_temperature) : "—", l.seconds));
    }
  }
  if (conv.doubling) {
    const DoublingCheck& d = *conv.doubling;
    line(fmt::format("  ISO 10211 mesh check: Σ|Φ| {:.5f} W/m on {} nodes vs {:.5f} W/m on {} nodes (≈ twice the "
                     "subdivisions): change {:.4f} % {} 1 % — {}",
                     d.coarse_sum, d.coarse_nodes, d.fine_sum, d.fine_nodes, 100 * d.relative_change,
                     d.passed ? "<" : "≥", d.passed ? "passed" : "FAILED"));
  }
  if (!junction.warnings.empty()) {
    line("");
    line("WARNINGS");
    for (const std::string& w : junction.warnings) line("  ! " + w);
  }
  line("");
  line("Cautions");
  for (const std::string& c : junction.cautions) line("  - " + c);
  line("");
  const SolveInfo& info = calc.heat_loss.info;
  line(fmt::format("Mesh: {} nodes, {} triangles ({} mesher); solver: {}", calc.mesh.n_points(), calc.mesh.n_triangles(),
                   calc.mesh.mesher, info.solver));
  line(fmt::format("Time: {:.3f} s in all; final level: mesh {:.3f} s, solve (both runs) {:.3f} s, results {:.3f} s{}",
                   calc.total_seconds, calc.timings.mesh_seconds, calc.timings.solve_seconds, calc.timings.results_seconds,
                   calc.sensitivities ? fmt::format(", sensitivities {:.4f} s", calc.sensitivities->seconds) : ""));
  return out;
}

}  // namespace edgeflux
