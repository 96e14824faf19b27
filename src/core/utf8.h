// UTF-8 checks for text from files: where a text stops being valid UTF-8, and text from older
// drawings (code page 1252 / Latin-1) made valid.
#pragma once

#include <string>
#include <string_view>

namespace edgeflux {

/// The first byte at which `text` is not valid UTF-8 (overlong forms, surrogates and codes beyond
/// U+10FFFF count as invalid), or npos.
std::size_t invalid_utf8_at(std::string_view text);

/// `text` itself when it is valid UTF-8; otherwise its bytes read as Latin-1 (how DXF files before
/// AutoCAD-2007-format store names such as "DÄMMUNG"), so names stay readable in every output.
std::string valid_utf8(std::string_view text);

}  // namespace edgeflux
