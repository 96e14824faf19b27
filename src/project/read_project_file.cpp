// Reads the project file: strict like the detail reader (unknown elements and attributes are
// errors), every message naming file, line and object.
#include "project/read_project_file.h"

#include <fmt/format.h>
#include <tinyxml2.h>

#include <cmath>
#include <filesystem>
#include <fstream>
#include <initializer_list>
#include <set>
#include <sstream>

#include "core/error.h"
#include "core/utf8.h"

namespace edgeflux {

namespace {

using tinyxml2::XMLElement;
namespace fs = std::filesystem;

class ProjectReader {
 public:
  explicit ProjectReader(std::string file) : file_(std::move(file)) {}

  Project read(const std::string& content) {
    if (invalid_utf8_at(content) != std::string::npos)
      throw_input_error({file_, 0}, "project file", "is not valid UTF-8", "save it as UTF-8");
    tinyxml2::XMLDocument doc;
    if (doc.Parse(content.c_str(), content.size()) != tinyxml2::XML_SUCCESS)
      throw_input_error({file_, doc.ErrorLineNum()}, "XML", fmt::format("the file is not well-formed XML ({})", doc.ErrorStr()),
                        "check the tags and quotes near this line");
    const XMLElement* root = doc.RootElement();
    if (root == nullptr || std::string(root->Name()) != "edgeflux-project")
      throw_input_error({file_, root ? root->GetLineNum() : 0}, "project file", "the root element is not <edgeflux-project>",
                        "start the file with <edgeflux-project format=\"1\"> (docs/project-format.md)");
    allow(root, {"format"});
    if (const char* format = root->Attribute("format"); format && std::string(format) != "1")
      throw_input_error(where(root), "<edgeflux-project>", fmt::format("format \"{}\" is not known", format), "this version reads format=\"1\"");
    Project p;
    p.file = file_;
    bool method_seen = false;
    std::set<std::string> references;
    for (const XMLElement* e = root->FirstChildElement(); e; e = e->NextSiblingElement()) {
      const std::string name = e->Name();
      if (name == "record") {
        allow(e, {"project", "client", "site", "drawing", "revision", "assessor", "checker", "date"});
        JunctionRecord& r = p.record;
        r.project = text(e, "project"), r.client = text(e, "client"), r.site = text(e, "site"), r.drawing = text(e, "drawing");
        r.revision = text(e, "revision"), r.assessor = text(e, "assessor"), r.checker = text(e, "checker"), r.date = text(e, "date");
      } else if (name == "energy-method") {
        if (method_seen) throw_input_error(where(e), "<energy-method>", "is given twice", "keep one");
        method_seen = true;
        allow(e, {"dimensions", "envelope-area"});
        const std::string word = required(e, "dimensions");
        const auto system = dimension_system_from_word(word);
        if (!system)
          throw_input_error(where(e), "<energy-method>", fmt::format("dimension system \"{}\" is not known", word),
                            "write internal, overall-internal or external: the system the energy method measures lengths in");
        p.system = *system;
        if (e->Attribute("envelope-area")) {
          const double area = number(e, "envelope-area");
          if (!(area > 0))
            throw_input_error(where(e), "<energy-method>", "envelope-area must be above 0 m²", "give the envelope area in m², or leave it out");
          p.envelope_area = area;
        }
      } else if (name == "junction") {
        ProjectJunction j = junction(e);
        if (!references.insert(j.reference).second)
          throw_input_error(j.where, fmt::format("<junction reference=\"{}\">", j.reference), "this reference is already used",
                            "give each junction its own reference; the same detail with other parameters is another junction");
        p.junctions.push_back(std::move(j));
      } else {
        throw_input_error(where(e), fmt::format("<{}>", name), "this element is not part of the project format",
                          "use record, energy-method and junction (docs/project-format.md)");
      }
    }
    if (!method_seen)
      throw_input_error({file_, root->GetLineNum()}, "<edgeflux-project>", "has no <energy-method dimensions=\"…\"/>",
                        "name the dimension system of the energy method, e.g. <energy-method dimensions=\"external\"/>");
    if (p.junctions.empty())
      throw_input_error({file_, root->GetLineNum()}, "<edgeflux-project>", "lists no <junction>", "add the building's junctions");
    return p;
  }

 private:
  ProjectJunction junction(const XMLElement* e) {
    allow(e, {"reference", "description", "detail"});
    ProjectJunction j;
    j.where = where(e);
    j.reference = required(e, "reference");
    j.description = text(e, "description");
    const std::string object = fmt::format("<junction reference=\"{}\">", j.reference);
    const fs::path detail = required(e, "detail");
    const fs::path resolved = detail.is_absolute() ? detail : fs::path(file_).parent_path() / detail;
    std::error_code ec;
    if (!fs::is_regular_file(resolved, ec))
      throw_input_error(j.where, object, fmt::format("the detail file \"{}\" does not exist ({})", detail.string(), resolved.string()),
                        "give the path of the detail file relative to the project file");
    j.detail_file = resolved.lexically_normal().string();
    for (const XMLElement* c = e->FirstChildElement(); c; c = c->NextSiblingElement()) {
      const std::string name = c->Name();
      if (name == "set") {
        allow(c, {"name", "value"});
        const std::string parameter = required(c, "name");
        if (!j.overrides.emplace(parameter, number(c, "value")).second)
          throw_input_error(where(c), object, fmt::format("sets '{}' a second time", parameter), "give each parameter once");
      } else if (name == "length") {
        allow(c, {"metres", "where"});
        const double metres = number(c, "metres");
        if (!(metres > 0))
          throw_input_error(where(c), object, fmt::format("a length of {} m", metres), "give each length in metres, above 0");
        j.lengths.push_back({metres, text(c, "where")});
      } else if (name == "assumed") {
        allow(c, {"psi", "source"});
        if (j.assumed_psi) throw_input_error(where(c), object, "has two <assumed> values", "keep one");
        j.assumed_psi = number(c, "psi");
        j.assumed_source = text(c, "source");
        if (j.assumed_source.empty())
          throw_input_error(where(c), object, "gives an assumed ψ without its source",
                            "say where the value comes from, e.g. source=\"default value of the national method, table 3\"");
      } else {
        throw_input_error(where(c), fmt::format("<{}>", name), "this element is not part of a junction",
                          "use set, length and assumed inside <junction>");
      }
    }
    if (j.lengths.empty())
      throw_input_error(j.where, object, "has no <length>", "add the length taken off the drawings, e.g. <length metres=\"12.4\" where=\"north elevation\"/>");
    return j;
  }

  SourceLocation where(const XMLElement* e) const { return {file_, e->GetLineNum()}; }

  void allow(const XMLElement* e, std::initializer_list<const char*> names) const {
    for (const tinyxml2::XMLAttribute* a = e->FirstAttribute(); a; a = a->Next()) {
      bool known = false;
      for (const char* n : names) known = known || std::string(n) == a->Name();
      if (!known) {
        std::string list;
        for (const char* n : names) list += (list.empty() ? "" : ", ") + std::string(n);
        throw_input_error(where(e), fmt::format("<{}>", e->Name()), fmt::format("attribute \"{}\" is not known", a->Name()),
                          list.empty() ? "remove it" : "use " + list);
      }
    }
  }

  std::string text(const XMLElement* e, const char* attribute) const {
    const char* v = e->Attribute(attribute);
    if (v && std::string(v).size() > 400)
      throw_input_error(where(e), fmt::format("<{}>", e->Name()), fmt::format("attribute \"{}\" is longer than 400 characters", attribute),
                        "shorten it");
    return v ? v : "";
  }

  std::string required(const XMLElement* e, const char* attribute) const {
    const std::string v = text(e, attribute);
    if (v.empty())
      throw_input_error(where(e), fmt::format("<{}>", e->Name()), fmt::format("attribute \"{}\" is missing", attribute),
                        fmt::format("add {}=\"...\"", attribute));
    return v;
  }

  double number(const XMLElement* e, const char* attribute) const {
    const std::string v = required(e, attribute);
    char* end = nullptr;
    const double value = std::strtod(v.c_str(), &end);
    if (end == v.c_str() || *end != '\0' || !std::isfinite(value))
      throw_input_error(where(e), fmt::format("<{}>", e->Name()), fmt::format("attribute \"{}\" \"{}\" is not a number", attribute, v),
                        "write a plain decimal number such as 12.4");
    return value;
  }

  std::string file_;
};

}  // namespace

Project parse_project_text(const std::string& text, const std::string& file_name) { return ProjectReader(file_name).read(text); }

Project read_project_file(const std::string& path) {
  std::error_code ec;
  if (fs::is_directory(path, ec)) throw_input_error({path, 0}, "project file", "is a folder", "give the project's XML file");
  std::ifstream in(path, std::ios::binary);
  if (!in) throw_input_error({path, 0}, "project file", "cannot be opened", "check the path");
  std::ostringstream text;
  text << in.rdbuf();
  return parse_project_text(text.str(), path);
}

}  // namespace edgeflux
