// The report a consultant hands in: one self-contained HTML file (inline SVG and CSS, nothing
// fetched; one inline script, for the explorable field of Appendix B) that prints to A4.
#pragma once

#include <optional>

#include "validation/iso10211_conformity.h"

#include <string>
#include <vector>

#include "geometry/cross_section.h"
#include "results/calculation.h"
#include "report/svg_drawings.h"

namespace edgeflux {

/// What the report says about where it came from.
struct ReportProvenance {
  std::string input_text;  ///< the bytes of the detail file, embedded and hashed (SHA-256)
  std::string generated;   ///< date and time of the run as shown, e.g. "2025-03-01 14:05 UTC"
  std::optional<ConformityReport> validation;  ///< ISO 10211 Cases 1 and 2 run with this build
};

/// The date and time now in UTC as "YYYY-MM-DD HH:MM UTC"; SOURCE_DATE_EPOCH (seconds since
/// 1970, the reproducible-builds convention) replaces "now" when it is set.
std::string report_timestamp();

/// The report: the junction sheet (two printed pages: record, ψ carried forward and the others, L2D,
/// θsi,min and the junction's own minimum, fRsi, each criterion, detail and temperature drawings,
/// materials, boundary conditions, ψ derivation, cautions, sign-off), then unless left out the
/// appendices: heat flows and flanking elements, mesh and convergence with the further drawings,
/// method, validation and provenance with the input file. Printed pages carry a running header
/// (junction reference, revision, date) and page numbers.
std::string html_report(const CrossSection& section, const Calculation& calc, const std::vector<Drawing>& drawings,
                        const ReportProvenance& provenance, bool with_appendices = true);

}  // namespace edgeflux
