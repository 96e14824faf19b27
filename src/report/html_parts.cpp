// Number formatting and the style sheet of the HTML report.
#include <fmt/format.h>

#include <algorithm>
#include <cmath>

#include "core/sha256.h"
#include "physics/surface_resistance.h"
#include "report/html_parts.h"
#include "report/text_format.h"

namespace edgeflux::html {

std::string user_point(const CrossSection& section, Point p) {
  return escape(point_text(p, section.metres_per_unit, section.unit));
}



std::string key_card(const std::string& label, const std::string& value, const std::string& unit, const std::string& detail) {
  return fmt::format("<div class=\"card\"><div class=\"label\">{}</div><div class=\"value\">{} <span class=\"unit\">{}</span></div>{}</div>\n", label, value,
                     unit, detail.empty() ? "" : "<div class=\"detail\">" + detail + "</div>");
}

/// " ± 0.00003" for a value with an estimated discretisation error, nothing without one.
std::string plus_minus(const std::optional<ErrorEstimate>& e, int decimals) {
  if (!e) return "";
  return " <span class=\"pm\">± " + error_text(e->error, decimals) + "</span>";
}


std::string climate_text(const Climate& c) {
  return fmt::format("{} °C and {} inside, {} °C outside", fixed(c.interior_temperature, 1),
                     c.interior_relative_humidity ? fixed(100 * *c.interior_relative_humidity, 0) + " % RH"
                                                  : fmt::format("humidity class {}", c.humidity_class.value_or(0)),
                     fixed(c.exterior_temperature, 1));
}

/// Evidence that the mesh is fine enough: the quantities on every mesh, the estimated errors and the
/// ISO 10211 doubling check; or, for a single fixed mesh, how to get that evidence.

const char* const report_css = R"CSS(
:root { --ink: #1d232a; --muted: #56606b; --rule: #d3d8dd; --soft: #f4f6f8; --accent: #0b5a8a; --met: #1b6e3a; --notmet: #a4231c; --warn: #8a5a00; }
* { box-sizing: border-box; }
html { background: #e9ecef; }
body { font-family: "DejaVu Sans", "Liberation Sans", Arial, Helvetica, sans-serif; color: var(--ink); background: #fff;
       max-width: 200mm; margin: 0 auto; padding: 12mm 10mm 16mm; font-size: 9.5pt; line-height: 1.4; overflow-wrap: anywhere; }
h1 { font-size: 13.5pt; margin: 0 0 1mm; line-height: 1.2; }
h1 .ref { color: var(--accent); }
h2 { font-size: 12pt; margin: 6mm 0 2mm; padding-bottom: 1mm; border-bottom: 0.4mm solid var(--ink); }
h3 { font-size: 10pt; margin: 3mm 0 1mm; }
p { margin: 1.2mm 0; }
.kicker { text-transform: uppercase; letter-spacing: 0.08em; font-size: 8pt; color: var(--accent); font-weight: bold; margin-bottom: 1mm; }
.notes { color: #333; font-style: italic; margin: 0 0 1.5mm; }
.title-block { border: 0.4mm solid var(--ink); padding: 2mm 3mm; margin-bottom: 2mm; }
.title-block .notes { font-size: 8pt; }
.record { display: grid; grid-template-columns: repeat(4, 1fr); gap: 1mm 3mm; margin: 1.5mm 0 0; font-size: 8pt; }
.record div { min-width: 0; }
.record .wide { grid-column: 1 / -1; color: var(--muted); }
.record dt { font-weight: bold; color: var(--muted); display: inline; } .record dt::after { content: ": "; }
.record dd { margin: 0; display: inline; }
.blank { color: #aab; }
.meta { display: grid; grid-template-columns: max-content 1fr; gap: 0.5mm 4mm; font-size: 8.5pt; color: var(--muted); margin: 3mm 0 0; }
.meta dt { font-weight: bold; } .meta dd { margin: 0; word-break: break-all; }
table { border-collapse: collapse; width: 100%; margin: 1.5mm 0 2.5mm; font-size: 8.3pt; break-inside: avoid; }
th, td { border-bottom: 0.25mm solid var(--rule); padding: 0.7mm 1.5mm; text-align: left; vertical-align: top; }
th { background: var(--soft); font-weight: bold; border-bottom: 0.4mm solid #9aa3ad; overflow-wrap: normal; hyphens: auto; }
td.num, th.num { text-align: right; font-variant-numeric: tabular-nums; }
td.num { white-space: nowrap; }
caption { caption-side: top; text-align: left; font-weight: bold; padding: 0 0 0.8mm; font-size: 9pt; }
caption .small { font-weight: normal; }
table.results th { width: 30%; background: none; border-bottom: 0.25mm solid var(--rule); font-weight: normal; }
table.results td:last-child { font-size: 7.6pt; line-height: 1.3; }
table.results td.num { width: 17%; font-weight: bold; font-size: 9.5pt; }
table.results tr.carried th, table.results tr.carried td { background: #e8f1f8; }
table.results tr.carried td.num { font-size: 11pt; }
table.results tr.criterion td.num { color: var(--met); }
table.results tr.not-met td.num { color: var(--notmet); }
table.compact { font-size: 7.5pt; break-inside: auto; }
table.compact td, table.compact th { padding: 0.45mm 1.2mm; }
.sheet .notes { font-size: 7.8pt; font-style: normal; }
table.compact tr.carried td { font-weight: bold; }
td.stack { font-size: 7.5pt; color: var(--muted); padding-left: 5mm; }
table.sign-off { margin-top: 3mm; font-size: 8.5pt; }
table.sign-off th { width: 14%; background: none; border-bottom: none; }
table.sign-off td { border-bottom: 0.3mm solid var(--ink); height: 8mm; vertical-align: bottom; }
figure { margin: 2mm 0; break-inside: avoid; }
figure svg { display: block; max-width: 100%; height: auto; margin: 0 auto; }
.figure-row { display: grid; grid-template-columns: 1fr 1fr; gap: 4mm; align-items: start; break-inside: avoid; }
.figure-row figure { margin: 1mm 0; min-width: 0; }
figure.sheet-figure svg { max-height: 72mm; width: auto; }
figure.sheet-figure figcaption { font-size: 6.8pt; line-height: 1.3; }
figcaption { font-size: 7.5pt; color: var(--muted); margin-top: 1mm; }
figcaption b { color: var(--ink); }
.small { font-size: 8pt; color: var(--muted); }
.status { border: 0.3mm solid var(--rule); background: var(--soft); padding: 2mm 3mm; }
.cautions { border: 0.4mm solid var(--warn); background: #fff8e6; padding: 1.5mm 3mm; margin: 2.5mm 0; break-inside: avoid; font-size: 7.4pt; line-height: 1.3; }
.cautions h3 { margin: 0; color: var(--warn); font-size: 8.5pt; }
.cautions ul, .warnings ul { margin: 0.5mm 0 0 4mm; padding: 0; }
.warnings { border: 0.4mm solid var(--notmet); background: #fdf1f0; padding: 1.5mm 3mm; margin: 2.5mm 0; break-inside: avoid; font-size: 7.4pt; line-height: 1.3; }
.warnings h3 { margin: 0; color: var(--notmet); font-size: 8.5pt; }
code, pre { font-family: "DejaVu Sans Mono", "Liberation Mono", monospace; font-size: 7.5pt; }
pre { white-space: pre-wrap; word-break: break-all; background: var(--soft); border: 0.3mm solid var(--rule); padding: 2mm; }
details summary { cursor: pointer; font-weight: bold; }
footer { margin-top: 6mm; font-size: 7.5pt; color: var(--muted); border-top: 0.3mm solid var(--rule); padding-top: 1.5mm; }
.sheet + .sheet { margin-top: 8mm; }
@page { margin: 15mm 13mm 14mm 13mm;
  @top-left { font-size: 7.5pt; color: #56606b; font-family: "DejaVu Sans", sans-serif; }
  @top-right { font-size: 7.5pt; color: #56606b; font-family: "DejaVu Sans", sans-serif; }
  @bottom-left { font-size: 7pt; color: #56606b; font-family: "DejaVu Sans", sans-serif; }
  @bottom-right { font-size: 7.5pt; color: #56606b; font-family: "DejaVu Sans", sans-serif; } }
@media print {
  html { background: #fff; }
  body { max-width: none; margin: 0; padding: 0; font-size: 8.8pt; }
  .page-break { break-before: page; }
  .sheet + .sheet { margin-top: 0; }
  h2 { break-after: avoid; }
  a { color: inherit; text-decoration: none; }
  footer { display: none; }
  details::details-content { content-visibility: visible; display: block; }
  details > pre { display: block; }
}
)CSS";

}  // namespace edgeflux::html
