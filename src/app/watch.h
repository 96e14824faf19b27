// Watch mode: solve a detail again each time it is saved, and keep its report page current.
#pragma once

#include <functional>
#include <string>

#include "input/read_detail_file.h"

namespace edgeflux {

struct WatchSettings {
  std::string detail_file;
  ParameterOverrides overrides;
  std::string report_file;     ///< the page the browser shows; replaced on each save
  int runs = 0;                ///< stop after this many solves (0: until interrupted)
  double poll_seconds = 0.3;   ///< how often the files are looked at
  bool quiet = false;
};

/// What one solve gave: the report page, and a one-line summary for the terminal.
struct WatchedResult {
  std::string report_html;
  std::string summary_line;
};

/// Solves (solve_once) now and after every change of the detail file or a file it refers to,
/// writing the report with a live banner and an automatic reload; when the input is wrong the page
/// shows the message (file, line, fix) instead of the last picture. Returns when `runs` solves are
/// done (exit code 0), or never: Ctrl-C ends it.
int watch_detail(const WatchSettings& settings, const std::function<WatchedResult()>& solve_once);

/// The page shown while the input cannot be solved: the message, the time, and the same reload.
std::string watch_error_page(const std::string& detail_file, const std::string& message, const std::string& time);

/// The report with the live banner and the reload added.
std::string live_report(const std::string& report_html, const std::string& detail_file, const std::string& time);

}  // namespace edgeflux
