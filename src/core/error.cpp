// Formatting of input errors.
#include "core/error.h"

#include <fmt/format.h>

namespace edgeflux {

std::string format_input_error(const SourceLocation& where, const std::string& object, const std::string& problem,
                               const std::string& fix) {
  std::string place = where.file.empty() ? std::string("input") : where.file;
  if (where.line > 0) place += fmt::format(":{}", where.line);
  std::string message = fmt::format("{}: {}: {}", place, object, problem);
  if (!fix.empty()) message += fmt::format(". Fix: {}", fix);
  return message;
}

void throw_input_error(const SourceLocation& where, const std::string& object,
                       const std::string& problem, const std::string& fix) {
  throw InputError(format_input_error(where, object, problem, fix));
}

std::string format_point_for_user(double x_m, double y_m, double metres_per_unit, const char* unit) {
  return fmt::format("({:.6g}, {:.6g}) {}", x_m / metres_per_unit, y_m / metres_per_unit, unit);
}

}  // namespace edgeflux
