// Small text helpers every writer of the report layer shares: escaping for XML/HTML and CSV, and
// the words and digits the reports use for sides and conductivities.
#pragma once

#include <string>
#include <string_view>

#include "geometry/cross_section.h"

namespace edgeflux {

/// Text made safe for XML/HTML character data and attribute values (& < > " ').
std::string xml_escape(std::string_view text);

/// A CSV field (RFC 4180): quoted, with quotes doubled, when it holds a comma, quote or line break.
std::string csv_field(std::string_view text);

/// The key of a dimension system in JSON and CSV: "internal", "overall_internal", "external".
const char* dimension_system_key(DimensionSystem s);

/// "interior", "exterior" or "other".
const char* side_name(Side side);

/// λ with the digits a designer writes: 0.035, 0.99, 2.50, 230.
std::string conductivity_text(double conductivity);

}  // namespace edgeflux
