// The watch loop: a fingerprint of the detail and the files it refers to, polled; a solve per change.
#include "app/watch.h"

#include <fmt/format.h>

#include <chrono>
#include <ctime>
#include <thread>

#include "app/output_writer.h"
#include "core/error.h"
#include "project/result_cache.h"
#include "report/svg_support.h"

namespace edgeflux {
namespace {

/// The browser reloads the page from disk every two seconds: a file:// page cannot ask the program.
constexpr const char* reload = "<meta http-equiv=\"refresh\" content=\"2\">";

std::string clock_time() {
  const std::time_t now = std::time(nullptr);
  std::tm local{};
  localtime_r(&now, &local);
  char text[16];
  std::strftime(text, sizeof text, "%H:%M:%S", &local);
  return text;
}

/// Changes whenever the detail or a file it refers to changes (their bytes, not their times).
std::string fingerprint(const WatchSettings& settings) {
  ProjectJunction junction;
  junction.detail_file = settings.detail_file;
  junction.overrides = settings.overrides;
  return junction_cache_key(junction, AccuracyTarget{});
}

std::string insert_after_tag(const std::string& html, const std::string& tag, const std::string& text) {
  const auto open = html.find(tag);
  if (open == std::string::npos) return text + html;
  const auto close = html.find('>', open);
  return html.substr(0, close + 1) + text + html.substr(close + 1);
}

}  // namespace

std::string live_report(const std::string& report_html, const std::string& detail_file, const std::string& time) {
  const std::string banner = fmt::format(
      "<div class=\"live-banner\" style=\"background:#e8f1fb;border-left:4px solid #0072B2;padding:4px 10px;font-size:12px\">"
      "Live view of <code>{}</code>: solved at {}; saving the file solves it again and this page follows.</div>\n"
      "<style>@media print{{.live-banner{{display:none}}}}</style>\n",
      svg::escape(detail_file), time);
  return insert_after_tag(insert_after_tag(report_html, "<head", reload), "<body", banner);
}

std::string watch_error_page(const std::string& detail_file, const std::string& message, const std::string& time) {
  return fmt::format(
      "<!DOCTYPE html><html lang=\"en\"><head><meta charset=\"utf-8\">{}<title>edgeflux: {} cannot be solved</title></head>"
      "<body style=\"font-family:'DejaVu Sans',system-ui,sans-serif;margin:2em;max-width:60em\">"
      "<h1>{} cannot be solved</h1>"
      "<p class=\"watch-error\" style=\"background:#fdecea;border-left:4px solid #B00020;padding:8px 12px;white-space:pre-wrap\">{}</p>"
      "<p>Checked at {}. No result is shown until the file solves again: fix it and save, and this page follows.</p>"
      "</body></html>\n",
      reload, svg::escape(detail_file), svg::escape(detail_file), svg::escape(message), time);
}

int watch_detail(const WatchSettings& settings, const std::function<WatchedResult()>& solve_once) {
  std::string seen;
  for (int solved = 0; settings.runs == 0 || solved < settings.runs;) {
    const std::string now = fingerprint(settings);
    if (now == seen) {
      std::this_thread::sleep_for(std::chrono::duration<double>(settings.poll_seconds));
      continue;
    }
    seen = now;
    const std::string time = clock_time();
    std::string page, line;
    try {
      const WatchedResult result = solve_once();
      page = live_report(result.report_html, settings.detail_file, time);
      line = fmt::format("edgeflux watch: {} solved at {}: {}", settings.detail_file, time, result.summary_line);
    } catch (const std::exception& e) {
      page = watch_error_page(settings.detail_file, e.what(), time);
      line = fmt::format("edgeflux watch: {} cannot be solved ({}): {}", settings.detail_file, time, e.what());
    }
    write_output_files({{settings.report_file, page}});
    ++solved;
    if (!settings.quiet) fmt::print(stderr, "{}\n", line);
  }
  return 0;
}

}  // namespace edgeflux
