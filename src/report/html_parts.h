// The pieces the HTML report is assembled from: number formatting for its tables, its style
// sheet, and one function per part (summary, tables of inputs and results, method and validation).
#pragma once

#include <optional>
#include <string>

#include "geometry/cross_section.h"
#include "report/html_report.h"
#include "report/svg_support.h"
#include "results/calculation.h"

namespace edgeflux::html {

using svg::escape;

/// A number with fixed decimals and the ASCII minus (tables paste into spreadsheets as numbers).
std::string fixed(double v, int decimals);
/// The same with a sign always shown.
std::string signed_fixed(double v, int decimals);
/// "(x, y) unit" of a point in the user's unit.
std::string user_point(const CrossSection& section, Point p);
/// A summary card: label, value with unit, and a line of detail.
std::string key_card(const std::string& label, const std::string& value, const std::string& unit, const std::string& detail);
/// An error bar with at most the value's decimals.
std::string error_text(double error, int decimals);
/// " ± error" of an estimate, or nothing.
std::string plus_minus(const std::optional<ErrorEstimate>& e, int decimals);
/// The climate of the verdict in words.
std::string climate_text(const Climate& c);

/// The report's style sheet (screen and A4 print).
extern const char* const report_css;

/// The header with the input file and its hash, and the summary: cards, verdict, cautions, warnings.
std::string summary_section(const CrossSection& section, const Calculation& calc, const ReportProvenance& provenance);
/// The tables of inputs and results; `plot_open`: the last figure's section is still open.
std::string data_tables(const CrossSection& section, const Calculation& calc, bool plot_open);
/// Mesh levels and the ISO 10211 doubling check.
std::string convergence_tables(const CrossSection& section, const Calculation& calc);
/// Method, validation status and provenance with the input file.
std::string method_section(const CrossSection& section, const Calculation& calc, const ReportProvenance& provenance);

}  // namespace edgeflux::html
