// Checks a cross-section as read, before meshing: every problem found here is the user's to fix.
#pragma once

#include "geometry/cross_section.h"

namespace edgeflux {

/// Checks regions (at least 3 distinct points, simple, non-zero area), environments (at least two
/// used by surfaces, at different temperatures), surfaces and probes; orients every region outline
/// counter-clockwise. Throws InputError naming the object, its line and coordinates.
void validate_cross_section(CrossSection& section);

/// The regions' part of validate_cross_section alone (for a section still without surfaces).
void validate_regions(CrossSection& section);

}  // namespace edgeflux
