// The style and the script of the report's explorable temperature field (explorable_field.h), as
// text for inline <style> and <script> elements.
#pragma once

namespace edgeflux {

/// CSS for the picture's controls and read-out; in print they are hidden and the static copy shows.
extern const char* const explorable_field_css;

/// The page script: reads the JSON block "xf-data", bins the triangles into a uniform grid, and
/// drives the read-out, the isotherm and colour switches, and zoom and pan on the view box.
extern const char* const explorable_field_script;

}  // namespace edgeflux
