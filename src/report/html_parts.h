// The pieces the HTML report is assembled from: number formatting for its tables, its style
// sheet, and one function per part (summary, tables of inputs and results, method and validation).
#pragma once

#include <optional>
#include <string>

#include "geometry/cross_section.h"
#include "report/html_report.h"
#include "report/number_format.h"
#include "report/svg_support.h"
#include "results/calculation.h"

namespace edgeflux::html {

using svg::escape;

using edgeflux::fixed;
using edgeflux::signed_fixed;
using edgeflux::error_text;
/// "(x, y) unit" of a point in the user's unit.
std::string user_point(const CrossSection& section, Point p);
/// A summary card: label, value with unit, and a line of detail.
std::string key_card(const std::string& label, const std::string& value, const std::string& unit, const std::string& detail);
/// " ± error" of an estimate, or nothing.
std::string plus_minus(const std::optional<ErrorEstimate>& e, int decimals);
/// The climate of the verdict in words.
std::string climate_text(const Climate& c);

/// The report's style sheet (screen and A4 print).
extern const char* const report_css;

/// The junction sheet (at most two printed pages): title block with the record, results with the
/// value carried forward, criteria, detail and temperature drawings, materials, boundary conditions,
/// ψ derivation, cautions and sign-off.
std::string junction_sheet(const CrossSection& section, const Calculation& calc, const std::vector<Drawing>& drawings,
                           const ReportProvenance& provenance, bool with_appendices);
/// Appendix A: heat flows, energy balance, flanking elements with their layer stacks, coupling
/// coefficients, the moisture figures, probes.
std::string results_appendix(const CrossSection& section, const Calculation& calc);
/// Appendix B: mesh and solver, convergence, and the drawings not on the sheet.
std::string mesh_appendix(const CrossSection& section, const Calculation& calc, const std::vector<Drawing>& drawings);
/// Mesh levels and the ISO 10211 doubling check.
std::string convergence_tables(const CrossSection& section, const Calculation& calc);
/// Appendix C: method, validation status and provenance with the input file.
std::string method_section(const CrossSection& section, const Calculation& calc, const ReportProvenance& provenance);

/// Text as a CSS string literal (for the running header of printed pages).
std::string css_string(const std::string& text);

}  // namespace edgeflux::html
