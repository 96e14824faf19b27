// The one error type for problems in the user's input, carrying where the problem is and how to fix it.
#pragma once

#include <stdexcept>
#include <string>

namespace edgeflux {

/// Where in an input file an object was written (line 0 when unknown).
struct SourceLocation {
  std::string file;
  int line = 0;
};

/// A problem the user can fix in their input. The message names file, line, object and
/// coordinates and says how to fix it; the program prints it and exits with code 2.
class InputError : public std::runtime_error {
 public:
  explicit InputError(const std::string& message) : std::runtime_error(message) {}
};

/// Formats "file:line: object: problem. Fix: how" (the line left out when 0, the fix when empty).
std::string format_input_error(const SourceLocation& where, const std::string& object, const std::string& problem,
                               const std::string& fix);

/// Throws an InputError formatted as "file:line: object: problem. Fix: how".
[[noreturn]] void throw_input_error(const SourceLocation& where, const std::string& object,
                                    const std::string& problem, const std::string& fix);

/// Formats a point given in metres in the unit the user wrote, e.g. "(200, 1000) mm".
std::string format_point_for_user(double x_m, double y_m, double metres_per_unit, const char* unit);

}  // namespace edgeflux
