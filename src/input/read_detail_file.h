// Reader of the detail file (XML, format 1): the only place that includes tinyxml2.
#pragma once

#include <map>
#include <string>

#include "geometry/arc_points.h"
#include "geometry/cross_section.h"

namespace edgeflux {

/// Reads and checks a detail file. Throws InputError naming file, line, object and how to fix it.
/// Coordinates are converted to metres; surface resistance presets are resolved to numbers.
/// `overrides` replace the values of named <parameter>s (from the command line); naming a
/// parameter the file does not define is an error.
using ParameterOverrides = std::map<std::string, double>;
/// Circles and arcs become chains of chords that stand off the true curve by at most
/// `arc_tolerance` × radius (see geometry/arc_points.h).
CrossSection read_detail_file(const std::string& path, const ParameterOverrides& overrides = {},
                              double arc_tolerance = default_arc_tolerance);

/// Same, from text already in memory; `file_name` is used in messages.
CrossSection parse_detail_text(const std::string& text, const std::string& file_name,
                               const ParameterOverrides& overrides = {}, double arc_tolerance = default_arc_tolerance);

}  // namespace edgeflux
