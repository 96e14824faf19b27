#include "report/text_format.h"

#include <fmt/format.h>

#include "core/utf8.h"

namespace edgeflux {

std::string xml_escape(std::string_view raw) {
  // File names may hold bytes that are not UTF-8 (the detail's text was checked when read); they
  // show as U+FFFD rather than make the page invalid.
  const std::string checked = invalid_utf8_at(raw) == std::string_view::npos ? std::string() : valid_utf8(raw);
  const std::string_view text = checked.empty() ? raw : std::string_view(checked);
  std::string out;
  out.reserve(text.size());
  for (char c : text) {
    switch (c) {
      case '&': out += "&amp;"; break;
      case '<': out += "&lt;"; break;
      case '>': out += "&gt;"; break;
      case '"': out += "&quot;"; break;
      case '\'': out += "&#39;"; break;
      default: out += c;
    }
  }
  return out;
}

std::string csv_field(std::string_view text) {
  if (text.find_first_of(",\"\r\n") == std::string_view::npos) return std::string(text);
  std::string quoted = "\"";
  for (char c : text) quoted += c == '"' ? std::string("\"\"") : std::string(1, c);
  return quoted + "\"";
}

const char* dimension_system_key(DimensionSystem s) {
  return s == DimensionSystem::internal ? "internal" : s == DimensionSystem::overall_internal ? "overall_internal" : "external";
}

const char* side_name(Side side) {
  return side == Side::interior ? "interior" : side == Side::exterior ? "exterior" : "other";
}

std::string conductivity_text(double conductivity) {
  return fmt::format("{:.{}f}", conductivity, conductivity < 0.1 ? 3 : conductivity < 10 ? 2 : 0);
}

}  // namespace edgeflux
