#include "core/utf8.h"

namespace edgeflux {

std::size_t invalid_utf8_at(std::string_view text) {
  std::size_t i = 0;
  while (i < text.size()) {
    const unsigned char c = static_cast<unsigned char>(text[i]);
    int extra = c < 0x80 ? 0 : (c >> 5) == 0x6 ? 1 : (c >> 4) == 0xE ? 2 : (c >> 3) == 0x1E ? 3 : -1;
    if (extra < 0 || c == 0xC0 || c == 0xC1 || c > 0xF4) return i;
    unsigned long code = extra == 0 ? c : c & (0x3F >> extra);
    for (int k = 1; k <= extra; ++k) {
      if (i + k >= text.size()) return i;
      const unsigned char d = static_cast<unsigned char>(text[i + k]);
      if ((d >> 6) != 0x2) return i;
      code = (code << 6) | (d & 0x3F);
    }
    const unsigned long smallest[] = {0, 0x80, 0x800, 0x10000};
    if (code < smallest[extra] || (code >= 0xD800 && code <= 0xDFFF) || code > 0x10FFFF) return i;
    i += static_cast<std::size_t>(extra) + 1;
  }
  return std::string_view::npos;
}

std::string valid_utf8(std::string_view text) {
  if (invalid_utf8_at(text) == std::string_view::npos) return std::string(text);
  std::string out;
  for (unsigned char c : text) {
    if (c < 0x80) {
      out += static_cast<char>(c);
    } else {
      out += static_cast<char>(0xC0 | (c >> 6));
      out += static_cast<char>(0x80 | (c & 0x3F));
    }
  }
  return out;
}

}  // namespace edgeflux
