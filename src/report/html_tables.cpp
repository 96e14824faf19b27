// The report's tables of inputs and results, and of the mesh convergence.
#include <fmt/format.h>

#include <algorithm>
#include <cmath>

#include "core/sha256.h"
#include "physics/surface_resistance.h"
#include "report/html_parts.h"
#include "report/sensitivity_tables.h"
#include "report/text_format.h"

namespace edgeflux::html {

std::string convergence_tables(const CrossSection& section, const Calculation& calc) {
  const Convergence& conv = calc.convergence;
  const JunctionResults& j = calc.junction;
  if (conv.levels.size() < 2)
    return "<p class=\"status\"><b>Mesh convergence:</b> one fixed mesh, no convergence evidence in this run. ISO 10211 asks that Σ|Φ| with n "
           "and 2n subdivisions differ by less than 1 %: repeat with twice the density and compare, or let edgeflux refine adaptively.</p>\n";
  std::string h = fmt::format("<table><caption>Mesh convergence ({} refinement, {} meshes)</caption><tr><th class=\"num\">Mesh</th><th class=\"num\">Nodes</th>",
                              conv.adaptive ? "adaptive" : "uniform", conv.levels.size());
  const bool has_l2d = std::any_of(conv.levels.begin(), conv.levels.end(), [](const ConvergenceLevel& l) { return l.coupling_2d.has_value(); });
  const bool has_min = std::any_of(conv.levels.begin(), conv.levels.end(), [](const ConvergenceLevel& l) { return l.min_surface_temperature.has_value(); });
  if (has_l2d) h += "<th class=\"num\">L<sub>2D</sub> [W/(m·K)]</th>";
  for (const PsiValue& p : j.psi) h += fmt::format("<th class=\"num\">ψ {} [W/(m·K)]</th>", dimension_system_name(p.system));
  if (has_min) h += "<th class=\"num\">θ<sub>si,min</sub> [°C]</th>";
  h += "<th class=\"num\">Σ|Φ| [W/m]</th></tr>\n";
  for (std::size_t k = 0; k < conv.levels.size(); ++k) {
    const ConvergenceLevel& l = conv.levels[k];
    h += fmt::format("<tr><td class=\"num\">{}</td><td class=\"num\">{}</td>", k + 1, l.nodes);
    if (has_l2d) h += fmt::format("<td class=\"num\">{}</td>", l.coupling_2d ? fixed(*l.coupling_2d, 5) : std::string("—"));
    for (std::size_t i = 0; i < j.psi.size(); ++i) h += fmt::format("<td class=\"num\">{}</td>", i < l.psi.size() ? fixed(l.psi[i], 4) : std::string("—"));
    if (has_min) h += fmt::format("<td class=\"num\">{}</td>", l.min_surface_temperature ? fixed(*l.min_surface_temperature, 3) : std::string("—"));
    h += fmt::format("<td class=\"num\">{}</td></tr>\n", fixed(l.sum_abs_heat_flow, 4));
  }
  auto error_cell = [](const std::optional<ErrorEstimate>& e, int decimals) {
    return fmt::format("<td class=\"num\">{}</td>", e ? "± " + error_text(e->error, decimals - 2) : std::string("—"));
  };
  h += "<tr><th colspan=\"2\">estimated error</th>";
  if (has_l2d) h += error_cell(conv.coupling_2d, 5);
  for (std::size_t i = 0; i < j.psi.size(); ++i)
    h += error_cell(i < conv.psi.size() ? std::optional<ErrorEstimate>(conv.psi[i]) : std::nullopt, 4);
  if (has_min) h += error_cell(conv.min_surface_temperature, 3);
  h += "<td></td></tr>\n";
  h += fmt::format("<tr><th colspan=\"2\">target</th>{}{}{}<td></td></tr>\n",
                   has_l2d ? fmt::format("<td class=\"num\">{:g} × L<sub>2D</sub></td>", conv.target.coupling_relative) : "",
                   [&] {
                     std::string s;
                     for (std::size_t i = 0; i < j.psi.size(); ++i) s += fmt::format("<td class=\"num\">± {:g}</td>", conv.target.psi_absolute);
                     return s;
                   }(),
                   has_min ? fmt::format("<td class=\"num\">± {:g} K</td>", conv.target.temperature_absolute) : "");
  h += "</table>\n";
  std::string status = conv.target_met ? "accuracy target met" : "<b>accuracy target NOT met</b>";
  if (!conv.stop_reason.empty()) status += " (" + escape(conv.stop_reason) + ")";
  if (conv.doubling)
    status += fmt::format("; ISO 10211 doubling check: Σ|Φ| {} W/m with {} nodes, {} W/m with {} nodes, change {:.3f} % (criterion &lt; 1 %): <b>{}</b>",
                          fixed(conv.doubling->coarse_sum, 4), conv.doubling->coarse_nodes, fixed(conv.doubling->fine_sum, 4), conv.doubling->fine_nodes,
                          100 * conv.doubling->relative_change, conv.doubling->passed ? "met" : "NOT MET");
  h += "<p class=\"small\">Errors are Richardson-type estimates from the last two meshes; " + status + ".</p>\n";
  (void)section;
  return h;
}

std::string results_appendix(const CrossSection& section, const Calculation& calc) {
  const FieldResults& field = calc.heat_loss.field;
  const JunctionResults& j = calc.junction;
  std::string h;
  auto add = [&](const std::string& s) { h += s; };
  add("<section class=\"appendix page-break\" id=\"appendix-results\">\n<h2>Appendix A — Description, heat flows, flanking elements and moisture</h2>\n");
  if (!section.notes.empty()) add(fmt::format("<p class=\"notes\"><b>Description of the detail.</b> {}</p>\n", escape(section.notes)));
  add("<table><caption>Environments</caption><tr><th>Environment</th><th>Side</th><th class=\"num\">θ [°C]</th><th class=\"num\">Φ into the section [W/m]</th></tr>\n");
  for (const EnvironmentFlow& flow : field.environments) {
    const Environment& e = section.environments[flow.environment];
    add(fmt::format("<tr><td>{}</td><td>{}</td><td class=\"num\">{}</td><td class=\"num\">{}</td></tr>\n", escape(e.id), side_name(e.side),
                    fixed(e.temperature, 2), fixed(flow.heat_flow, 3)));
  }
  add("</table>\n");

  add("<table><caption>Heat flow per surface (heat-loss run)</caption><tr><th>Surface</th><th>Environment</th><th class=\"num\">Φ [W/m]</th></tr>\n");
  for (std::size_t s = 0; s < section.surfaces.size(); ++s)
    add(fmt::format("<tr><td>{}</td><td>{}</td><td class=\"num\">{}</td></tr>\n", escape(section.surfaces[s].name),
                    escape(section.environments[section.surfaces[s].environment].id),
                    s < field.surface_heat_flow.size() ? fixed(field.surface_heat_flow[s], digits::heat_flow) : std::string("—")));
  add("</table>\n");

  add(fmt::format("<table><caption>Heat flows and energy balance (heat-loss run)</caption><tr><th>Quantity</th><th class=\"num\">Value</th><th>Note</th></tr>\n"
                  "<tr><td>Σ Φ over all environments</td><td class=\"num\">{:.2e} W/m</td><td>zero for a conserving solution</td></tr>\n"
                  "<tr><td>Σ Φ / (½ Σ |Φ|)</td><td class=\"num\">{:.1e}</td><td>ISO 10211 criterion &lt; 1e-4: <b>{}</b></td></tr>\n",
                  field.balance.net, field.balance.relative, std::abs(field.balance.relative) < 1e-4 ? "met" : "NOT MET"));
  if (field.coupling_2d)
    add(fmt::format("<tr><td>L<sub>2D</sub> = Φ / (θi − θe)</td><td class=\"num\">{} W/(m·K)</td><td>independent of the dimension system</td></tr>\n",
                    fixed(*field.coupling_2d, 5)));
  add("</table>\n");

  if (!j.flanking.empty()) {
    add("<table><caption>Flanking elements (U from the layer stack at the cut-off plane, ISO 6946, unless stated)</caption><tr><th>Element</th>"
        "<th class=\"num\">U [W/(m²K)]</th><th class=\"num\">l internal [m]</th><th class=\"num\">l overall int. [m]</th>"
        "<th class=\"num\">l external [m]</th><th class=\"num\">1D check [K]</th></tr>\n");
    for (const FlankingResult& f : j.flanking) {
      std::string stack = fmt::format("Rs {} | ", fixed(f.start_resistance, 2));
      for (const FlankingLayer& l : f.layers) stack += fmt::format("{} {} mm (λ {:.3g}) | ", escape(l.material), fixed(l.thickness * 1000, 0), l.conductivity);
      stack += fmt::format("Rs {}", fixed(f.end_resistance, 2));
      auto len = [&](int s) { return f.length[s] ? fixed(*f.length[s], digits::length) : std::string("—"); };
      add(fmt::format("<tr class=\"element\"><td>{}</td><td class=\"num\">{}{}</td><td class=\"num\">{}</td><td class=\"num\">{}</td><td class=\"num\">{}</td>"
                      "<td class=\"num\">{}</td></tr>\n<tr><td colspan=\"6\" class=\"stack\">layer stack at the cut-off: {}</td></tr>\n",
                      escape(f.id), fixed(f.u_value, 4), f.u_value_stated ? " (stated)" : "", len(0), len(1), len(2), fixed(f.deviation_from_1d, 3), stack));
    }
    add("</table>\n<p class=\"small\">1D check: the largest difference, along the cut-off plane, between the computed temperatures and the 1D profile of "
        "the layer stack. A large value means the cut-off plane is too close to the junction.</p>\n");
  }
  if (section.environments.size() > 2 && !j.coupling.empty()) {
    add("<table><caption>Coupling matrix ∂Φ<sub>i</sub>/∂θ<sub>j</sub> [W/(m·K)] (heat-loss run; L<sub>ij</sub> = −entry for i ≠ j; rows sum to zero)</caption><tr><th></th>");
    for (const Environment& e : section.environments) add(fmt::format("<th class=\"num\">{}</th>", escape(e.id)));
    add("</tr>\n");
    for (std::size_t i = 0; i < section.environments.size(); ++i) {
      add(fmt::format("<tr><th>{}</th>", escape(section.environments[i].id)));
      for (double v : j.coupling[i]) add(fmt::format("<td class=\"num\">{}</td>", fixed(v, 5)));
      add("</tr>\n");
    }
    add("</table>\n");
    if (!j.weighting_factors.empty()) {
      add("<table><caption>Temperature weighting factors g at θ<sub>si,min</sub> (surface-temperature run): θsi = Σ g<sub>j</sub>·θ<sub>j</sub></caption><tr>");
      for (const Environment& e : section.environments) add(fmt::format("<th class=\"num\">g [{}]</th>", escape(e.id)));
      add("</tr><tr>");
      for (double g : j.weighting_factors) add(fmt::format("<td class=\"num\">{}</td>", fixed(g, 4)));
      add("</tr></table>\n");
    }
  }

  if (!j.moisture.empty()) {
    add("<table><caption>Condensation and mould (ISO 13788)</caption><tr><th>Surfaces</th><th class=\"num\">p<sub>i</sub> [Pa]</th><th class=\"num\">dew point [°C]</th>"
        "<th class=\"num\">θsi for 80 % RH [°C]</th><th class=\"num\">fRsi,min mould</th><th class=\"num\">fRsi,min cond.</th><th class=\"num\">required</th>"
        "<th class=\"num\">fRsi</th><th class=\"num\">margin</th></tr>\n");
    for (const MoistureResult& m : j.moisture) {
      const MoistureAssessment& a = m.assessment;
      add(fmt::format("<tr><td>{}</td><td class=\"num\">{}</td><td class=\"num\">{}</td><td class=\"num\">{}</td><td class=\"num\">{}</td><td class=\"num\">{}</td>"
                      "<td class=\"num\">{}</td><td class=\"num\">{}</td><td class=\"num\">{}</td></tr>\n",
                      m.kind == SurfaceKind::glazing ? "glazing/frame" : "opaque", fixed(a.interior_vapour_pressure, 0), fixed(a.dew_point, 2),
                      fixed(a.mould_surface_temperature, 2), fixed(a.mould_temperature_factor, 3), fixed(a.condensation_temperature_factor, 3),
                      fixed(a.required_temperature_factor, 3), fixed(a.actual_temperature_factor, 3), signed_fixed(a.margin, 3)));
    }
    add("</table>\n");
  }

  if (!field.probes.empty()) {
    add("<table><caption>Probes (P1, P2, … in Figure 1)</caption><tr><th></th><th>Probe</th><th>Location</th><th class=\"num\">θ heat-loss run [°C]</th>"
        "<th class=\"num\">θ surface-temp. run [°C]</th></tr>\n");
    for (std::size_t i = 0; i < field.probes.size(); ++i) {
      const ProbeReading& p = field.probes[i];
      const ProbeReading* q = i < calc.surface_temperature.field.probes.size() ? &calc.surface_temperature.field.probes[i] : nullptr;
      add(fmt::format("<tr><td>P{}</td><td>{}</td><td>{}</td><td class=\"num\">{}</td><td class=\"num\">{}</td></tr>\n", i + 1, escape(p.name),
                      user_point(section, p.at), fixed(p.temperature, 3), q ? fixed(q->temperature, 3) : std::string("—")));
    }
    add("</table>\n");
  }

  add(sensitivity_html(section, calc));
  add("</section>\n");
  return h;
}

std::string mesh_appendix(const CrossSection& section, const Calculation& calc, const std::vector<Drawing>& drawings) {
  std::string h;
  auto add = [&](const std::string& s) { h += s; };
  add("<section class=\"appendix page-break\" id=\"appendix-mesh\">\n<h2>Appendix B — Mesh, convergence and further drawings</h2>\n");
  const SolveInfo& info = calc.heat_loss.info;
  add(fmt::format("<table><caption>Mesh and solver</caption><tr><th>Item</th><th>Value</th></tr>\n"
                  "<tr><td>Mesh</td><td>{} mesher: {} nodes, {} triangles</td></tr>\n"
                  "<tr><td>Linear solver</td><td>{}, {} unknowns; solved {}</td></tr>\n"
                  "<tr><td>Time</td><td>mesh {:.3f} s, both runs (assembly, factorisation, solves) {:.3f} s, results {:.3f} s</td></tr>\n"
                  "</table>\n",
                  escape(calc.mesh.mesher), calc.mesh.n_points(), calc.mesh.n_triangles(), escape(info.solver), info.n_unknowns,
                  info.ok && calc.surface_temperature.info.ok ? "without fault in both runs" : "WITH A FAULT: " + escape(info.message),
                  calc.timings.mesh_seconds, calc.timings.solve_seconds, calc.timings.results_seconds));
  add(convergence_tables(section, calc));
  int number = 3;
  for (const Drawing& d : drawings) {
    if (d.id == "detail" || d.id == "temperature") continue;
    add(fmt::format("<figure id=\"{}\">\n{}<figcaption><b>Figure {}. {}.</b> {}</figcaption>\n</figure>\n", d.id, d.svg, number++, escape(d.title),
                    escape(d.caption)));
  }
  add("</section>\n");
  return h;
}

}  // namespace edgeflux::html
