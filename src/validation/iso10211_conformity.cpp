// Runs ISO 10211 Cases 1 and 2 and tabulates the comparison with the standard.
#include "validation/iso10211_conformity.h"

#include <fmt/format.h>

#include <chrono>
#include <cmath>
#include <numbers>

#include "input/read_detail_file.h"
#include "pipeline/calculate.h"
#include "validation/reference_files.h"

namespace edgeflux {

double iso10211_case1_series(double x, double y, double side) {
  double sum = 0.0;
  for (int n = 1; n < 400; n += 2) {
    const double k = n * std::numbers::pi / side;
    // sinh(k y) / sinh(k L) written with exponentials so large n does not overflow.
    const double ratio = std::exp(k * (y - side)) * (1.0 - std::exp(-2.0 * k * y)) / (1.0 - std::exp(-2.0 * k * side));
    sum += 4.0 / (n * std::numbers::pi) * std::sin(k * x) * ratio;
  }
  return 20.0 * sum;
}

const double (&iso10211_case1_table())[7][4] {
  // ISO 10211:2017 Annex C (Annex A in the 2007 edition), Case 1, °C. Typed from memory; every
  // value equals the series solution rounded to 0.1 K.
  static const double table[7][4] = {{9.7, 13.4, 14.7, 15.1}, {5.3, 8.6, 10.3, 10.8}, {3.2, 5.6, 7.0, 7.5},
                                     {2.0, 3.6, 4.7, 5.0},    {1.3, 2.3, 3.0, 3.2},   {0.7, 1.4, 1.8, 1.9},
                                     {0.3, 0.6, 0.8, 0.9}};
  return table;
}

bool ConformityReport::passed() const {
  for (const ConformityRow& row : rows)
    if (!row.passed()) return false;
  return !rows.empty();
}

std::string ConformityReport::classification() const {
  return passed() ? "two-dimensional steady-state high-precision method (ISO 10211, both validation cases met)"
                  : "not classified: at least one validation value is outside the standard's tolerance";
}

ConformityReport iso10211_conformity(const std::function<void(const std::string&)>& progress) {
  const auto start = std::chrono::steady_clock::now();
  ConformityReport report;
  CalculationOptions options;
  if (progress) progress("ISO 10211 Case 1");
  const Calculation case1 = calculate(parse_detail_text(iso10211_case1_xml(), "built-in ISO 10211 Case 1"), options);
  report.case1_nodes = case1.mesh.n_points();
  const auto& table = iso10211_case1_table();
  for (const ProbeReading& p : case1.heat_loss.field.probes) {
    const int row = p.name[1] - '0', col = p.name[3] - '0';
    report.rows.push_back({"Case 1", fmt::format("θ at x = {}a/4, {}a/4 below the top", col, row), "°C",
                           table[row - 1][col - 1], p.temperature, 0.1});
  }
  if (progress) progress("ISO 10211 Case 2");
  const Calculation case2 = calculate(parse_detail_text(iso10211_case2_xml(), "built-in ISO 10211 Case 2"), options);
  report.case2_nodes = case2.mesh.n_points();
  // ISO 10211 Annex C, Case 2: temperatures at A–I and the heat flow, tolerance 0.1 K and 0.1 W/m.
  const double standard[9] = {7.1, 0.8, 7.9, 6.3, 0.8, 16.4, 16.3, 16.8, 18.3};
  for (std::size_t i = 0; i < case2.heat_loss.field.probes.size(); ++i) {
    const ProbeReading& p = case2.heat_loss.field.probes[i];
    report.rows.push_back({"Case 2", "θ at point " + p.name, "°C", standard[p.name[0] - 'A'], p.temperature, 0.1});
  }
  report.rows.push_back({"Case 2", "Φ through the section", "W/m", 9.5, case2.heat_loss.field.environments[0].heat_flow, 0.1});
  report.seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
  return report;
}

std::string conformity_text(const ConformityReport& report) {
  std::string out = fmt::format("edgeflux {} — conformity with the ISO 10211 validation cases\n\n", EDGEFLUX_VERSION);
  out += fmt::format("  {:<7} {:<38} {:>10} {:>10} {:>9} {:>9}  {}\n", "case", "quantity", "reference", "computed",
                     "diff.", "tol.", "result");
  for (const ConformityRow& r : report.rows)
    out += fmt::format("  {:<7} {:<38} {:>7.1f} {:<2} {:>10.3f} {:>+9.3f} {:>9.1f}  {}\n", r.reference_case, r.quantity,
                       r.reference, r.unit == "°C" ? "°C" : "W/m", r.computed, r.computed - r.reference, r.tolerance,
                       r.passed() ? "pass" : "FAIL");
  int failed = 0;
  for (const ConformityRow& r : report.rows) failed += r.passed() ? 0 : 1;
  out += fmt::format("\n  {} values checked, {} outside tolerance; Case 1 on {} nodes, Case 2 on {} nodes, {:.1f} s\n",
                     report.rows.size(), failed, report.case1_nodes, report.case2_nodes, report.seconds);
  out += fmt::format("  Classification: {}\n", report.classification());
  return out;
}

}  // namespace edgeflux
