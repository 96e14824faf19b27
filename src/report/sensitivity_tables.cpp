// Sensitivity rows, notes and tables from Calculation::sensitivities, for the terminal and the report.
#include "report/sensitivity_tables.h"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>

#include "report/number_format.h"
#include "report/svg_support.h"

namespace edgeflux {
namespace {

std::string input_name(const InputSensitivity& in) {
  return in.kind == InputSensitivity::Kind::conductivity ? "λ " + in.name : "Rs " + in.name;
}

std::string optional_number(const std::optional<double>& v, int decimals, bool with_sign = true) {
  if (!v) return "—";
  return with_sign ? signed_fixed(*v, decimals) : fixed(*v, decimals);
}

std::string psi_label(const CrossSection& section, const Calculation& calc) {
  const auto i = headline_psi(section, calc);
  return i ? fmt::format("ψ {}", dimension_system_name(calc.junction.psi[*i].system)) : "ψ";
}

}  // namespace

std::optional<std::size_t> headline_psi(const CrossSection& section, const Calculation& calc) {
  const auto& psi = calc.junction.psi;
  for (std::size_t i = 0; i < psi.size(); ++i)
    if (section.carried_forward && psi[i].system == *section.carried_forward) return i;
  if (!psi.empty()) return 0;
  return std::nullopt;
}

std::vector<SensitivityRow> sensitivity_rows(const CrossSection& section, const Calculation& calc) {
  if (!calc.sensitivities) return {};
  const auto psi_index = headline_psi(section, calc);
  struct Ranked {
    SensitivityRow row;
    double psi_effect, temperature_effect;
  };
  std::vector<Ranked> ranked;
  for (const InputSensitivity& in : calc.sensitivities->inputs) {
    SensitivityRow r;
    r.input = input_name(in);
    r.value = in.kind == InputSensitivity::Kind::conductivity ? fmt::format("{} W/(m·K)", fixed(in.value, 3))
                                                              : fmt::format("{} m²K/W", fixed(in.value, 3));
    if (in.coupling && calc.heat_loss.field.coupling_2d)
      r.coupling_elasticity = elasticity(*in.coupling, in.value, *calc.heat_loss.field.coupling_2d);
    if (psi_index && *psi_index < in.psi.size()) {
      r.psi_per_10_percent = in.psi[*psi_index] * 0.1 * in.value;
      const double psi = calc.junction.psi[*psi_index].psi;
      if (std::abs(psi) >= 1e-3) r.psi_elasticity = elasticity(in.psi[*psi_index], in.value, psi);
    }
    const double p = in.kind == InputSensitivity::Kind::conductivity ? in.value : in.temperature_run_value;
    if (in.min_surface_temperature) r.min_temperature_per_10_percent = *in.min_surface_temperature * 0.1 * p;
    if (in.temperature_factor && calc.junction.temperature_factor)
      r.temperature_factor_elasticity = elasticity(*in.temperature_factor, p, *calc.junction.temperature_factor);
    ranked.push_back({r, std::abs(r.psi_per_10_percent.value_or(0.0)), std::abs(r.min_temperature_per_10_percent.value_or(0.0))});
  }
  std::stable_sort(ranked.begin(), ranked.end(), [](const Ranked& a, const Ranked& b) {
    return a.psi_effect != b.psi_effect ? a.psi_effect > b.psi_effect : a.temperature_effect > b.temperature_effect;
  });
  std::vector<SensitivityRow> rows;
  for (Ranked& r : ranked) rows.push_back(std::move(r.row));
  return rows;
}

std::string sensitivity_headline(const CrossSection& section, const Calculation& calc) {
  const std::vector<SensitivityRow> rows = sensitivity_rows(section, calc);
  if (rows.empty()) return "";
  std::string text;
  if (rows.front().psi_per_10_percent)
    text = fmt::format("{} moves {} most ({} W/(m·K) for +10 %)", rows.front().input, psi_label(section, calc),
                       signed_fixed(*rows.front().psi_per_10_percent, 4));
  const auto coldest = std::max_element(rows.begin(), rows.end(), [](const SensitivityRow& a, const SensitivityRow& b) {
    return std::abs(a.min_temperature_per_10_percent.value_or(0)) < std::abs(b.min_temperature_per_10_percent.value_or(0));
  });
  if (coldest->min_temperature_per_10_percent)
    text += fmt::format("{}{} moves θsi,min most ({} K for +10 %)", text.empty() ? "" : "; ", coldest->input,
                        signed_fixed(*coldest->min_temperature_per_10_percent, 3));
  return text;
}

std::vector<std::string> sensitivity_notes(const CrossSection& section, const Calculation& calc) {
  if (!calc.sensitivities) return {};
  const Sensitivities& s = *calc.sensitivities;
  std::vector<std::string> notes;
  notes.push_back("ε: % change of the result per % change of the input (first order, from the solved field: the energy "
                  "of the heat-loss field per material and surface, and one adjoint solve for θsi,min). For a surface, "
                  "L2D and ψ follow its Rs in the heat-loss run, θsi,min and fRsi its Rs in the surface-temperature run.");
  bool stated = false;
  for (const Material& m : section.materials) stated = stated || m.relative_uncertainty.has_value();
  std::string range = fmt::format("Uncertainty of λ: ±{:.0f} % for every material{} (common practice for design and "
                                  "declared values; set uncertainty=\"…\" on a material). First order, λ independent / all "
                                  "unfavourable:",
                                  100 * default_conductivity_uncertainty, stated ? " that states none" : "");
  if (const auto i = headline_psi(section, calc); i && *i < s.psi.size())
    range += fmt::format(" {} = {} ± {} / ± {} W/(m·K);", psi_label(section, calc), fixed(s.psi[*i].value, digits::psi),
                         fixed(s.psi[*i].independent, digits::psi), fixed(s.psi[*i].worst_case, digits::psi));
  if (s.temperature_factor)
    range += fmt::format(" fRsi = {} ± {} / ± {}.", fixed(s.temperature_factor->value, digits::temperature_factor),
                         fixed(s.temperature_factor->independent, digits::temperature_factor),
                         fixed(s.temperature_factor->worst_case, digits::temperature_factor));
  notes.push_back(range);
  if (s.verdict) {
    const VerdictRobustness& v = *s.verdict;
    notes.push_back(fmt::format(
        "With every λ off by its uncertainty in the direction that lowers fRsi, the {} criterion is {}: fRsi {} {} fRsi,min {} "
        "(first order).",
        v.kind == SurfaceKind::glazing ? "glazing/frame" : "opaque-surface", v.still_met ? "still met" : "NO LONGER MET",
        fixed(v.worst_temperature_factor, digits::temperature_factor), v.still_met ? "≥" : "<",
        fixed(v.required_temperature_factor, digits::temperature_factor)));
  }
  return notes;
}

std::string sensitivity_text(const CrossSection& section, const Calculation& calc) {
  const std::vector<SensitivityRow> rows = sensitivity_rows(section, calc);
  if (rows.empty()) return "";
  std::size_t width = 10;
  for (const SensitivityRow& r : rows) width = std::max(width, r.input.size());
  width = std::min<std::size_t>(width, 36);
  std::string out = fmt::format("Which input matters (ranked by the effect on {})\n", psi_label(section, calc));
  out += fmt::format("  {:<{}} {:>16} {:>10} {:>7} {:>7} {:>14} {:>8}\n", "input", width, "value", "Δψ +10 %", "ε L2D", "ε ψ",
                     "Δθsi,min +10 %", "ε fRsi");
  for (const SensitivityRow& r : rows)
    out += fmt::format("  {:<{}} {:>16} {:>10} {:>7} {:>7} {:>14} {:>8}\n", r.input.substr(0, width), width, r.value,
                       optional_number(r.psi_per_10_percent, 4), optional_number(r.coupling_elasticity, 3),
                       optional_number(r.psi_elasticity, 2), optional_number(r.min_temperature_per_10_percent, 3),
                       optional_number(r.temperature_factor_elasticity, 4));
  // The notes wrapped at about 110 columns, as the rest of the summary.
  for (const std::string& note : sensitivity_notes(section, calc)) {
    std::string row = " ";
    for (std::size_t at = 0; at < note.size();) {
      std::size_t end = note.find(' ', at);
      if (end == std::string::npos) end = note.size();
      const std::string word = note.substr(at, end - at);
      if (row.size() + word.size() > 110 && row.size() > 2) out += row + "\n", row = "   ";
      row += " " + word;
      at = end + 1;
    }
    out += row + "\n";
  }
  return out;
}

std::string sensitivity_html(const CrossSection& section, const Calculation& calc) {
  const std::vector<SensitivityRow> rows = sensitivity_rows(section, calc);
  if (rows.empty()) return "";
  std::string h = fmt::format(
      "<table class=\"sensitivity\"><caption>Which input matters: first-order sensitivities, ranked by the effect on {}</caption>"
      "<tr><th>Input</th><th class=\"num\">Value</th><th class=\"num\">Δψ for +10 % [W/(m·K)]</th><th class=\"num\">ε L<sub>2D</sub></th>"
      "<th class=\"num\">ε ψ</th><th class=\"num\">Δθ<sub>si,min</sub> for +10 % [K]</th><th class=\"num\">ε f<sub>Rsi</sub></th></tr>\n",
      svg::escape(psi_label(section, calc)));
  for (const SensitivityRow& r : rows)
    h += fmt::format("<tr><td>{}</td><td class=\"num\">{}</td><td class=\"num\">{}</td><td class=\"num\">{}</td><td class=\"num\">{}</td>"
                     "<td class=\"num\">{}</td><td class=\"num\">{}</td></tr>\n",
                     svg::escape(r.input), svg::escape(r.value), optional_number(r.psi_per_10_percent, 4), optional_number(r.coupling_elasticity, 3),
                     optional_number(r.psi_elasticity, 2), optional_number(r.min_temperature_per_10_percent, 3),
                     optional_number(r.temperature_factor_elasticity, 4));
  h += "</table>\n";
  for (const std::string& note : sensitivity_notes(section, calc)) h += "<p class=\"note\">" + svg::escape(note) + "</p>\n";
  return h;
}

}  // namespace edgeflux
