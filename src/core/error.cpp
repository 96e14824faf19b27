// Formatting of input errors.
#include "core/error.h"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>

namespace edgeflux {

namespace {

/// A part of a message that may quote the user's text: beyond `limit` characters its middle is
/// left out, so a 20 MB attribute becomes a readable line that still shows how it begins and ends.
std::string shortened(const std::string& text, std::size_t limit) {
  if (text.size() <= limit) return text;
  // Cut at UTF-8 character boundaries (not inside a multi-byte sequence).
  auto boundary = [&](std::size_t at) {
    while (at > 0 && at < text.size() && (static_cast<unsigned char>(text[at]) & 0xC0) == 0x80) --at;
    return at;
  };
  const std::size_t head = boundary(limit * 2 / 3), tail = boundary(text.size() - limit / 3);
  return fmt::format("{} … [{} characters left out] … {}", text.substr(0, head), tail - head, text.substr(tail));
}

/// The user's values appear in messages as long runs without spaces: each is cut to `limit`
/// characters (its middle left out), whatever part of the message quotes it.
std::string shortened_words(const std::string& text, std::size_t limit) {
  std::string out;
  std::size_t start = 0;
  while (start < text.size()) {
    const std::size_t space = text.find_first_of(" \t\n", start);
    const std::size_t end = space == std::string::npos ? text.size() : space;
    out += shortened(text.substr(start, end - start), limit);
    if (space == std::string::npos) break;
    out += text[space];
    start = space + 1;
  }
  return out;
}

}  // namespace

std::string format_input_error(const SourceLocation& where, const std::string& object, const std::string& problem,
                               const std::string& fix) {
  std::string place = where.file.empty() ? std::string("input") : shortened(where.file, 300);
  if (where.line > 0) place += fmt::format(":{}", where.line);
  // Each part quotes the user's text at most in part: a value at most ~200 characters, a part at most 400.
  std::string message = fmt::format("{}: {}: {}", place, shortened(shortened_words(object, 160), 200),
                                    shortened(shortened_words(problem, 160), 400));
  if (!fix.empty()) message += fmt::format(". Fix: {}", shortened(shortened_words(fix, 160), 400));
  return message;
}

void throw_input_error(const SourceLocation& where, const std::string& object,
                       const std::string& problem, const std::string& fix) {
  throw InputError(format_input_error(where, object, problem, fix));
}

namespace {

/// A coordinate to 0.001 mm (the model's grid is 0.01 mm), without trailing zeros.
std::string coordinate_text(double value, int decimals) {
  std::string text = fmt::format("{:.{}f}", value, decimals);
  if (text.find('.') != std::string::npos) {
    while (text.back() == '0') text.pop_back();
    if (text.back() == '.') text.pop_back();
  }
  if (text == "-0") text = "0";
  return text;
}

}  // namespace

std::string format_point_for_user(double x_m, double y_m, double metres_per_unit, const char* unit) {
  const int decimals = std::max(0, 3 + static_cast<int>(std::lround(std::log10(metres_per_unit / 0.001))));
  return fmt::format("({}, {}) {}", coordinate_text(x_m / metres_per_unit, decimals),
                     coordinate_text(y_m / metres_per_unit, decimals), unit);
}

}  // namespace edgeflux
