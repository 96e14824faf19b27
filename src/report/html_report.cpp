// Assembles the HTML report from the calculation and its drawings (its parts: report/html_parts.h).
#include "report/html_report.h"

#include <fmt/format.h>

#include <cstdlib>
#include <ctime>

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

std::string html_report(const CrossSection& section, const Calculation& calc, const std::vector<Drawing>& drawings,
                        const ReportProvenance& provenance) {
  const std::string title = section.title.empty() ? section.file : section.title;
  std::string h;
  auto add = [&](const std::string& s) { h += s; };

  add("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n");
  add("<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n");
  add(fmt::format("<meta name=\"generator\" content=\"edgeflux {}\">\n", EDGEFLUX_VERSION));
  add(fmt::format("<title>Thermal bridge assessment — {}</title>\n<style>{}</style>\n</head>\n<body>\n", escape(title), report_css));
  add(summary_section(section, calc, provenance));
  for (std::size_t i = 0; i < drawings.size(); ++i) {
    const Drawing& d = drawings[i];
    add(fmt::format("<section class=\"page-break\" id=\"{}\">\n<h2>Figure {} — {}</h2>\n<figure>\n{}<figcaption><b>Figure {}.</b> {}</figcaption>\n</figure>\n",
                    d.id, i + 1, escape(d.title), d.svg, i + 1, escape(d.caption)));
    if (d.id == "surface-temperature") break;  // the tables follow on the same page
    add("</section>\n");
  }
  const bool plot_open = !drawings.empty() && drawings.back().id == "surface-temperature";
  add(data_tables(section, calc, plot_open));
  add(method_section(section, calc, provenance));
  add(fmt::format("<footer>edgeflux {} · {} · {}</footer>\n</body>\n</html>\n", EDGEFLUX_VERSION, escape(title), escape(provenance.generated)));
  return h;
}

}  // namespace edgeflux
