// Parses the compiled-in material library.
#include "input/material_library.h"

#include <tinyxml2.h>

#include <algorithm>
#include <cctype>
#include <stdexcept>

namespace edgeflux {

const char* material_library_xml();

const std::vector<LibraryMaterial>& material_library() {
  static const std::vector<LibraryMaterial> library = [] {
    std::vector<LibraryMaterial> entries;
    tinyxml2::XMLDocument doc;
    if (doc.Parse(material_library_xml()) != tinyxml2::XML_SUCCESS || !doc.RootElement())
      throw std::logic_error("the built-in material library is not well-formed XML");
    for (const auto* e = doc.RootElement()->FirstChildElement("material"); e; e = e->NextSiblingElement("material")) {
      LibraryMaterial m;
      m.id = e->Attribute("id") ? e->Attribute("id") : "";
      m.conductivity = e->DoubleAttribute("conductivity", 0.0);
      if (e->Attribute("density")) m.density = e->DoubleAttribute("density");
      m.category = e->Attribute("category") ? e->Attribute("category") : "";
      m.basis = e->Attribute("basis") ? e->Attribute("basis") : "";
      m.source = e->Attribute("source") ? e->Attribute("source") : "";
      entries.push_back(std::move(m));
    }
    return entries;
  }();
  return library;
}

const LibraryMaterial* find_library_material(const std::string& id) {
  for (const LibraryMaterial& m : material_library())
    if (m.id == id) return &m;
  return nullptr;
}

std::vector<LibraryMaterial> search_material_library(const std::string& text) {
  auto lower = [](std::string s) {
    std::transform(s.begin(), s.end(), s.begin(), [](unsigned char c) { return std::tolower(c); });
    return s;
  };
  const std::string needle = lower(text);
  std::vector<LibraryMaterial> found;
  for (const LibraryMaterial& m : material_library())
    if (needle.empty() || lower(m.id + " " + m.category + " " + m.source).find(needle) != std::string::npos)
      found.push_back(m);
  return found;
}

}  // namespace edgeflux
