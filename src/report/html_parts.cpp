// Number formatting and the style sheet of the HTML report.
#include <fmt/format.h>

#include <algorithm>
#include <cmath>

#include "core/sha256.h"
#include "physics/surface_resistance.h"
#include "report/html_parts.h"
#include "report/text_format.h"

namespace edgeflux::html {

// Numbers in tables use the ASCII minus, so they paste into spreadsheets as numbers.
std::string fixed(double v, int decimals) {
  if (std::abs(v) < 0.5 * std::pow(10.0, -decimals)) v = 0.0;
  return fmt::format("{:.{}f}", v, decimals);
}
std::string signed_fixed(double v, int decimals) {
  if (std::abs(v) < 0.5 * std::pow(10.0, -decimals)) v = 0.0;
  return fmt::format("{:+.{}f}", v, decimals);
}


std::string user_point(const CrossSection& section, Point p) {
  return fmt::format("({}, {}) {}", fixed(p.x / section.metres_per_unit, 1), fixed(p.y / section.metres_per_unit, 1), escape(section.unit));
}



std::string key_card(const std::string& label, const std::string& value, const std::string& unit, const std::string& detail) {
  return fmt::format("<div class=\"card\"><div class=\"label\">{}</div><div class=\"value\">{} <span class=\"unit\">{}</span></div>{}</div>\n", label, value,
                     unit, detail.empty() ? "" : "<div class=\"detail\">" + detail + "</div>");
}

/// An estimated error in plain decimals, one significant digit rounded up, at most two digits finer
/// than the value it belongs to (shown with `decimals`): "0.00003"; smaller errors show as one unit
/// of that finest digit, an upper bound.
std::string error_text(double error, int decimals) {
  const int finest = decimals + 2;
  const double unit = std::pow(10.0, -finest);
  if (!(error >= unit)) return fmt::format("{:.{}f}", unit, finest);  // an upper bound at the finest digit shown
  const int d = std::clamp(static_cast<int>(-std::floor(std::log10(error))), decimals, finest);
  const double scale = std::pow(10.0, d);
  return fmt::format("{:.{}f}", std::ceil(error * scale - 1e-9) / scale, d);
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
:root { --ink: #1d232a; --muted: #56606b; --rule: #d3d8dd; --soft: #f4f6f8; --accent: #0b5a8a; --pass: #1b6e3a; --fail: #a4231c; --warn: #8a5a00; }
* { box-sizing: border-box; }
html { background: #e9ecef; }
body { font-family: "DejaVu Sans", "Liberation Sans", Arial, Helvetica, sans-serif; color: var(--ink); background: #fff;
       max-width: 200mm; margin: 0 auto; padding: 12mm 10mm 16mm; font-size: 10pt; line-height: 1.45; }
h1 { font-size: 17pt; margin: 0 0 2mm; line-height: 1.25; }
h2 { font-size: 12.5pt; margin: 8mm 0 2.5mm; padding-bottom: 1mm; border-bottom: 0.4mm solid var(--ink); }
h3 { font-size: 10.5pt; margin: 5mm 0 1.5mm; }
p { margin: 1.5mm 0; }
.kicker { text-transform: uppercase; letter-spacing: 0.08em; font-size: 8.5pt; color: var(--accent); font-weight: bold; margin-bottom: 1mm; }
.notes { color: #333; font-style: italic; }
.meta { display: grid; grid-template-columns: max-content 1fr; gap: 0.5mm 4mm; font-size: 8.5pt; color: var(--muted); margin: 3mm 0 0; }
.meta dt { font-weight: bold; } .meta dd { margin: 0; word-break: break-all; }
.key { display: grid; grid-template-columns: repeat(3, 1fr); gap: 2.5mm; margin: 3mm 0; }
.card { border: 0.3mm solid var(--rule); border-radius: 1.2mm; padding: 2.2mm 3mm; background: var(--soft); break-inside: avoid; }
.card .label { font-size: 8.5pt; color: var(--muted); }
.card .value { font-size: 15pt; font-weight: bold; }
.card .pm { font-size: 10pt; font-weight: normal; }
.card .unit { font-size: 9pt; font-weight: normal; color: var(--muted); }
.card .detail { font-size: 8.5pt; color: var(--muted); }
.verdict { border-left: 2mm solid var(--pass); background: #eef7f1; padding: 2.5mm 4mm; margin: 3mm 0; break-inside: avoid; }
.verdict.fails { border-left-color: var(--fail); background: #fbeeed; }
.badge { display: inline-block; font-weight: bold; color: #fff; background: var(--pass); border-radius: 1mm; padding: 0.3mm 2mm; margin-right: 2mm; }
.fails .badge { background: var(--fail); }
.cautions { border: 0.5mm solid var(--warn); background: #fff8e6; padding: 2.5mm 4mm; margin: 4mm 0; break-inside: avoid; }
.cautions h3 { margin-top: 0; color: var(--warn); }
.cautions ul, .warnings ul { margin: 1mm 0 0 5mm; padding: 0; }
.warnings { border: 0.5mm solid var(--fail); background: #fdf1f0; padding: 2.5mm 4mm; margin: 4mm 0; break-inside: avoid; }
.warnings h3 { margin-top: 0; color: var(--fail); }
table { border-collapse: collapse; width: 100%; margin: 2mm 0 3mm; font-size: 8.8pt; break-inside: avoid; }
th, td { border-bottom: 0.25mm solid var(--rule); padding: 1mm 2mm; text-align: left; vertical-align: top; }
th { background: var(--soft); font-weight: bold; border-bottom: 0.4mm solid #9aa3ad; }
td.nowrap { white-space: nowrap; }
td.num, th.num { text-align: right; font-variant-numeric: tabular-nums; white-space: nowrap; }
caption { caption-side: top; text-align: left; font-weight: bold; padding: 0 0 1mm; }
figure { margin: 4mm 0; break-inside: avoid; }
figure svg { display: block; max-width: 100%; height: auto; margin: 0 auto; }
figcaption { font-size: 8.5pt; color: var(--muted); margin-top: 2mm; }
figcaption b { color: var(--ink); }
.small { font-size: 8.5pt; color: var(--muted); }
.status { border: 0.3mm solid var(--rule); background: var(--soft); padding: 2mm 3mm; }
code, pre { font-family: "DejaVu Sans Mono", "Liberation Mono", monospace; font-size: 8pt; }
pre { white-space: pre-wrap; word-break: break-all; background: var(--soft); border: 0.3mm solid var(--rule); padding: 2mm; }
details summary { cursor: pointer; font-weight: bold; }
footer { margin-top: 8mm; font-size: 8pt; color: var(--muted); border-top: 0.3mm solid var(--rule); padding-top: 2mm; }
@page { size: A4; margin: 14mm 14mm 15mm 14mm; }
@media print {
  html { background: #fff; }
  body { max-width: none; margin: 0; padding: 0; font-size: 9pt; }
  .page-break { break-before: page; }
  h2 { break-after: avoid; }
  a { color: inherit; text-decoration: none; }
  details::details-content { content-visibility: visible; display: block; }
  details > pre { display: block; }
}
)CSS";

}  // namespace edgeflux::html
