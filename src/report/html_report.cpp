// Assembles the HTML report from the calculation and its drawings (its parts: report/html_parts.h).
#include "report/html_report.h"

#include <fmt/format.h>

#include <cstdlib>
#include <ctime>

#include "core/utf8.h"
#include "report/explorable_field.h"
#include "report/html_parts.h"

namespace edgeflux {

using namespace html;

std::string report_timestamp() {
  std::time_t now = std::time(nullptr);
  if (const char* epoch = std::getenv("SOURCE_DATE_EPOCH")) {
    char* end = nullptr;
    const long long v = std::strtoll(epoch, &end, 10);
    if (end && *end == '\0' && end != epoch) now = static_cast<std::time_t>(v);
  }
  std::tm utc{};
  gmtime_r(&now, &utc);
  char text[32];
  std::strftime(text, sizeof text, "%Y-%m-%d %H:%M UTC", &utc);
  return text;
}

std::string html::css_string(const std::string& raw) {
  const std::string text = valid_utf8(raw);  // a file name may hold bytes that are not UTF-8
  std::string out = "\"";
  for (char c : text) {
    if (c == '"' || c == '\\') out += '\\', out += c;
    else if (c == '\n' || c == '\r') out += ' ';
    else if (c == '<') out += "\\3C ";  // never closes the <style> element
    else out += c;
  }
  return out + "\"";
}

namespace {

/// The running header and page numbers of every printed page: junction reference, revision and
/// date on the left, the title on the right.
std::string page_rules(const CrossSection& section, const std::string& title, const ReportProvenance& provenance) {
  const JunctionRecord& r = section.record;
  std::string left = r.reference.empty() ? "Junction sheet" : "Junction " + r.reference;
  if (!r.revision.empty()) left += " · rev. " + r.revision;
  left += " · " + (r.date.empty() ? provenance.generated : r.date);
  std::string right = title.size() > 70 ? title.substr(0, 67) + "…" : title;
  if (!r.project.empty()) right = (r.project.size() > 40 ? r.project.substr(0, 37) + "…" : r.project) + " · " + right;
  return fmt::format("@page {{ @top-left {{ content: {}; }} @top-right {{ content: {}; }} "
                     "@bottom-left {{ content: {}; }} @bottom-right {{ content: \"page \" counter(page) \" of \" counter(pages); }} }}\n",
                     css_string(left), css_string(right), css_string("edgeflux " + std::string(EDGEFLUX_VERSION) + " · " + section.file));
}

}  // namespace

std::string html_report(const CrossSection& section, const Calculation& calc, const std::vector<Drawing>& drawings,
                        const ReportProvenance& provenance, bool with_appendices) {
  const std::string title = section.title.empty() ? section.file : section.title;
  std::string h;
  auto add = [&](const std::string& s) { h += s; };

  add("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n");
  add("<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n");
  add(fmt::format("<meta name=\"generator\" content=\"edgeflux {}\">\n", EDGEFLUX_VERSION));
  add(fmt::format("<title>Junction sheet — {}</title>\n<style>{}{}</style>\n</head>\n<body>\n", escape(title), report_css,
                  page_rules(section, title, provenance)));
  add(junction_sheet(section, calc, drawings, provenance, with_appendices));
  if (with_appendices) {
    add(results_appendix(section, calc));
    add(mesh_appendix(section, calc, drawings));
    add(explorable_field_section(section, calc, drawings));  // continues Appendix B, before Appendix C's page break
    add(method_section(section, calc, provenance));
  } else {
    add("<p class=\"small\">Appendices (heat flows, flanking layer stacks, mesh convergence, further drawings, method, validation and "
        "the input file) were left out of this print; <code>edgeflux solve</code> writes them unless <code>--appendices none</code> is given.</p>\n");
  }
  add(fmt::format("<footer>edgeflux {} · {} · {}</footer>\n</body>\n</html>\n", EDGEFLUX_VERSION, escape(title), escape(provenance.generated)));
  return h;
}

}  // namespace edgeflux
