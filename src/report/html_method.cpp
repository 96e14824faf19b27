// The report's method and validation section and its provenance, with the input file.
#include <fmt/format.h>

#include <algorithm>
#include <cmath>

#include "core/sha256.h"
#include "physics/surface_resistance.h"
#include "report/html_parts.h"
#include "report/text_format.h"

namespace edgeflux::html {

std::string method_section(const CrossSection& section, const Calculation& calc, const ReportProvenance& provenance) {
  const SolveInfo& info = calc.heat_loss.info;
  std::string h;
  auto add = [&](const std::string& s) { h += s; };
  add("<section class=\"appendix page-break\" id=\"method\">\n<h2>Appendix C — Method, validation and provenance</h2>\n");
  add(fmt::format(
      "<p>Steady-state two-dimensional heat conduction, solved by vertex-centred finite volumes on a {} mesh (graded constrained Delaunay "
      "triangulation, or a rectilinear grid for rectilinear sections): each node's control volume is bounded by the medians of the triangles "
      "around it (median-dual), conductivity is constant per triangle, surface resistances enter as exchange with the environment "
      "temperature. The symmetric positive-definite system is solved by sparse Cholesky factorisation ({}).</p>\n",
      escape(calc.mesh.mesher), escape(info.solver)));
  add("<p>Two runs share the mesh: the <b>heat-loss run</b> with the surface resistances of the detail file (ISO 6946) gives Φ, L<sub>2D</sub> and ψ; "
      "the <b>surface-temperature run</b> with interior Rsi = 0.25 m²K/W on opaque surfaces and 0.13 m²K/W on glazing (ISO 13788) gives θ<sub>si,min</sub>, "
      "f<sub>Rsi</sub> and the moisture verdict. ψ = L<sub>2D</sub> − Σ U<sub>j</sub>·l<sub>j</sub> with U<sub>j</sub> from the layer stack of each "
      "flanking element at its cut-off plane (or as stated) and l<sub>j</sub> in the named dimension system (ISO 14683).</p>\n");
  if (provenance.validation) {
    const ConformityReport& v = *provenance.validation;
    int failed = 0;
    double worst_case1 = 0.0;
    for (const ConformityRow& r : v.rows) {
      failed += r.passed() ? 0 : 1;
      if (r.reference_case == "Case 1") worst_case1 = std::max(worst_case1, std::abs(r.computed - r.reference));
    }
    add(fmt::format("<p class=\"status\"><b>Validation status:</b> ISO 10211 Cases 1 and 2 were solved by this program at the time of this "
                    "report: {} of {} reference values within the standard's tolerance; Case 1 largest difference {:.3f} K (tolerance 0.1 K). "
                    "Classification: {}. <code>edgeflux conformity</code> prints the full table.</p>\n",
                    v.rows.size() - failed, v.rows.size(), worst_case1, escape(v.classification())));
    add("<table><tr><th>Case 2</th><th>reference</th><th>computed</th><th>difference</th><th>tolerance</th><th>result</th></tr>\n");
    for (const ConformityRow& r : v.rows)
      if (r.reference_case == "Case 2")
        add(fmt::format("<tr><td>{}</td><td>{:.1f} {}</td><td>{:.3f}</td><td>{:+.3f}</td><td>{:.1f}</td><td>{}</td></tr>\n", escape(r.quantity),
                        r.reference, escape(r.unit), r.computed, r.computed - r.reference, r.tolerance, r.passed() ? "pass" : "FAIL"));
    add("</table>\n");
  } else {
    add("<p class=\"status\"><b>Validation status:</b> not run for this report; <code>edgeflux conformity</code> solves ISO 10211 Cases 1 "
        "and 2 and prints the conformity table.</p>\n");
  }
  add("<h3>Provenance</h3>\n<dl class=\"meta\">");
  add(fmt::format("<dt>Program</dt><dd>edgeflux {}</dd><dt>Calculated</dt><dd>{}</dd><dt>Input file</dt><dd>{}</dd><dt>SHA-256 of the input</dt><dd><code>{}</code></dd>",
                  EDGEFLUX_VERSION, escape(provenance.generated), escape(section.file), sha256_hex(provenance.input_text)));
  add(fmt::format("<dt>Re-run</dt><dd><code>edgeflux solve {} --report {}.html</code> with the file below saved under that name</dd>", escape(section.file),
                  "report"));
  add("</dl>\n");
  add(fmt::format("<details><summary>Input file as calculated ({} bytes)</summary>\n<pre>{}</pre>\n</details>\n", provenance.input_text.size(),
                  escape(provenance.input_text)));
  add("</section>\n");
  return h;
}

}  // namespace edgeflux::html
