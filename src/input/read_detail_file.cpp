// Reads the XML detail file into a CrossSection, rejecting anything unknown or malformed with a
// message that says where it is and how to fix it: the document, parameters and expressions, and
// the attribute helpers every element's reader uses.
#include "input/detail_reader.h"

#include "core/utf8.h"

namespace edgeflux {

namespace {

/// The line (1-based) of byte `at`.
int line_of(const std::string& text, std::size_t at) {
  return 1 + static_cast<int>(std::count(text.begin(), text.begin() + static_cast<std::ptrdiff_t>(at), '\n'));
}

}  // namespace

/// What the XML parser would report as "not well-formed" or read wrongly: another encoding, NUL
/// bytes, invalid UTF-8. Line endings are made LF as XML prescribes (CR-only files get their line
/// numbers right).
std::string DetailReader::checked_text(const std::string& raw) const {
  auto refuse = [&](int line, const std::string& problem, const std::string& fix) {
    throw_input_error({file_, line}, "detail file", problem, fix);
  };
  if (raw.empty()) refuse(0, "is empty", "write the detail as XML (docs/detail-format.md), or give the right file");
  const auto starts = [&](std::string_view bom) { return raw.compare(0, bom.size(), bom) == 0; };
  if (starts(std::string_view("\x00\x00\xFE\xFF", 4)) || starts(std::string_view("\xFF\xFE\x00\x00", 4)))
    refuse(0, "is encoded in UTF-32", "save it as UTF-8 (every text editor can), then run again");
  if (starts("\xFE\xFF") || starts("\xFF\xFE"))
    refuse(0, "is encoded in UTF-16", "save it as UTF-8 (every text editor can), then run again");
  if (const std::size_t nul = raw.find('\0'); nul != std::string::npos)
    refuse(line_of(raw, nul), raw.find_first_not_of(std::string(1, '\0')) == std::string::npos ? "holds only NUL bytes"
                                                                                            : "holds a NUL byte: it is not a text file",
           "give the XML detail file; a damaged file must be restored from a copy");
  // The declared encoding: <?xml version="1.0" encoding="..."?>.
  if (raw.compare(raw.compare(0, 3, "\xEF\xBB\xBF") == 0 ? 3 : 0, 5, "<?xml") == 0) {
    const std::size_t end = raw.find("?>");
    const std::string declaration = raw.substr(0, end == std::string::npos ? 200 : end);
    const std::size_t at = declaration.find("encoding");
    if (at != std::string::npos) {
      const std::size_t q = declaration.find_first_of("\"'", at);
      const std::size_t q2 = q == std::string::npos ? q : declaration.find(declaration[q], q + 1);
      std::string encoding = q2 == std::string::npos ? "" : declaration.substr(q + 1, q2 - q - 1);
      std::string lower = encoding;
      for (char& c : lower) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
      if (lower != "utf-8" && lower != "utf8" && lower != "us-ascii" && lower != "ascii")
        refuse(1, fmt::format("declares the encoding \"{}\"; edgeflux reads UTF-8 only", encoding.substr(0, 40)),
               "save the file as UTF-8 and write encoding=\"UTF-8\" in its first line");
    }
  }
  if (const std::size_t bad = invalid_utf8_at(raw); bad != std::string::npos)
    refuse(line_of(raw, bad), fmt::format("is not valid UTF-8 here (byte 0x{:02X})", static_cast<unsigned char>(raw[bad])),
           "save the file as UTF-8; a file from another program may be in Latin-1 or Windows-1252");
  std::string text;
  text.reserve(raw.size());
  for (std::size_t i = 0; i < raw.size(); ++i) {
    if (raw[i] != '\r') text += raw[i];
    else if (i + 1 >= raw.size() || raw[i + 1] != '\n') text += '\n';
  }
  return text;
}

CrossSection DetailReader::read(const std::string& raw) {
  const std::string text = checked_text(raw);
  tinyxml2::XMLDocument doc;
  if (doc.Parse(text.c_str(), text.size()) != tinyxml2::XML_SUCCESS) {
    throw_input_error({file_, doc.ErrorLineNum()}, "XML",
                      fmt::format("the file is not well-formed XML ({})", doc.ErrorStr()),
                      "check the tags and quotes near this line");
  }
  const XMLElement* root = doc.RootElement();
  if (root != nullptr)
    if (const XMLElement* second = root->NextSiblingElement())
      throw_input_error({file_, second->GetLineNum()}, "XML",
                        fmt::format("a second root element <{}> follows <{}> (line {}); XML allows one root element",
                                    second->Name(), root->Name(), root->GetLineNum()),
                        "keep one <edgeflux-detail> per file and remove or merge the other");
  reject_undefined_entities(text);
  if (root == nullptr || std::string(root->Name()) != "edgeflux-detail")
    throw_input_error({file_, root ? root->GetLineNum() : 1}, "root element",
                      fmt::format("expected <edgeflux-detail>, found <{}>", root ? root->Name() : ""),
                      "start the file with <edgeflux-detail format=\"1\" units=\"mm\">");
  allow_attributes(root, {"format", "units"});
  const std::string format = optional_text(root, "format", "1");
  if (format != "1")
    throw_input_error(where(root), "<edgeflux-detail>", fmt::format("format \"{}\" is not known", format),
                      "this version reads format=\"1\"");
  section_.file = file_;
  const std::string units = optional_text(root, "units", "mm");
  if (units == "mm") section_.metres_per_unit = 0.001;
  else if (units == "cm") section_.metres_per_unit = 0.01;
  else if (units == "m") section_.metres_per_unit = 1.0;
  else
    throw_input_error(where(root), "<edgeflux-detail>", fmt::format("units \"{}\" is not known", units),
                      "use units=\"mm\", \"cm\" or \"m\"");
  section_.unit = units;

  // Parameters come first wherever they stand, so every other block may use them.
  for (const XMLElement* e = root->FirstChildElement("parameters"); e; e = e->NextSiblingElement("parameters"))
    for_children(e, "parameter", [&](const XMLElement* p) { read_parameter(p); });
  for (const auto& [name, value] : overrides_) {
    const auto it = std::find_if(section_.parameters.begin(), section_.parameters.end(),
                                 [&](const Parameter& p) { return p.name == name; });
    if (it == section_.parameters.end())
      throw_input_error({file_, 0}, fmt::format("parameter '{}'", name), "is given a value (on the command line or in a project) but not defined in the file",
                        fmt::format("use one of: {}", parameter_names()));
  }

  for (const XMLElement* e = root->FirstChildElement(); e; e = e->NextSiblingElement()) {
    const std::string name = e->Name();
    if (name == "parameters") continue;
    if ((name == "title" || name == "notes") && e->FirstChildElement())
      throw_input_error(where(e->FirstChildElement()), fmt::format("<{}>", name),
                        fmt::format("holds the element <{}>, but is plain text (only its first part would be kept)",
                                    e->FirstChildElement()->Name()),
                        "write the text without tags; write &lt; for a literal <");
    if (name == "title") section_.title = element_text(e);
    else if (name == "notes") section_.notes = element_text(e);
    else if (name == "materials") for_children(e, "material", [&](const XMLElement* m) { read_material(m); });
    else if (name == "regions") read_regions(e);
    else if (name == "environments") for_children(e, "environment", [&](const XMLElement* v) { read_environment(v); });
    else if (name == "boundaries") read_boundaries(e);
    else if (name == "probes") for_children(e, "probe", [&](const XMLElement* p) { read_probe(p); });
    else if (name == "flanking-elements") read_flanking_elements(e);
    else if (name == "climate") read_climate(e);
    else if (name == "mesh") read_mesh(e);
    else if (name == "record") read_record(e);
    else
      throw_input_error(where(e), fmt::format("<{}>", name), "this element is not part of the detail format",
                        "use title, notes, record, parameters, materials, regions, environments, boundaries, probes, "
                        "flanking-elements, climate or mesh (see docs/detail-format.md)");
  }
  resolve_references();
  validate_cross_section(section_);
  return std::move(section_);
}

void DetailReader::read_record(const XMLElement* e) {
  if (e->PreviousSiblingElement("record"))
    throw_input_error(where(e), "<record>", "is given twice", "keep one <record> with all its attributes");
  allow_attributes(e, {"reference", "project", "client", "site", "drawing", "revision", "assessor", "checker", "date"});
  if (e->FirstChildElement() || (e->GetText() && std::string(e->GetText()).find_first_not_of(" \t\r\n") != std::string::npos))
    throw_input_error(where(e), "<record>", "holds content, but takes only attributes", "write e.g. <record reference=\"J03\" project=\"...\"/>");
  // Record fields go into a one-line running header: keep them to what a title block holds.
  auto field = [&](const char* attribute) {
    std::string text = optional_text(e, attribute, "");
    if (text.size() > 200)
      throw_input_error(where(e), "<record>", fmt::format("attribute \"{}\" is {} characters long; a record field holds at most 200", attribute, text.size()),
                        "shorten it; longer explanations belong in <notes>");
    return text;
  };
  JunctionRecord& r = section_.record;
  r.reference = field("reference");
  r.project = field("project");
  r.client = field("client");
  r.site = field("site");
  r.drawing = field("drawing");
  r.revision = field("revision");
  r.assessor = field("assessor");
  r.checker = field("checker");
  r.date = field("date");
}

void DetailReader::reject_undefined_entities(const std::string& text) const {
  tinyxml2::XMLDocument raw(false);
  raw.Parse(text.c_str(), text.size());
  for (const tinyxml2::XMLNode* n = raw.FirstChild(); n; n = n->NextSibling()) scan_entities(n);
}

void DetailReader::scan_entities(const tinyxml2::XMLNode* node) const {
  if (const XMLElement* e = node->ToElement()) {
    for (const tinyxml2::XMLAttribute* a = e->FirstAttribute(); a; a = a->Next())
      check_entities(a->Value(), a->GetLineNum(), fmt::format("<{}> attribute \"{}\"", e->Name(), a->Name()));
    for (const tinyxml2::XMLNode* child = e->FirstChild(); child; child = child->NextSibling()) {
      if (const tinyxml2::XMLText* t = child->ToText()) {
        if (!t->CData()) check_entities(t->Value(), t->GetLineNum(), fmt::format("text of <{}>", e->Name()));
      } else {
        scan_entities(child);
      }
    }
  }
}

void DetailReader::check_entities(std::string_view value, int line, const std::string& object) const {
  static constexpr std::string_view known[] = {"amp", "lt", "gt", "quot", "apos"};
  for (std::size_t at = value.find('&'); at != std::string_view::npos; at = value.find('&', at + 1)) {
    const std::size_t end = value.find(';', at);
    const std::string_view name = end == std::string_view::npos ? std::string_view{} : value.substr(at + 1, end - at - 1);
    const bool decimal = name.size() > 1 && name[0] == '#' &&
                         std::all_of(name.begin() + 1, name.end(), [](unsigned char c) { return std::isdigit(c); });
    const bool hex = name.size() > 2 && name[0] == '#' && name[1] == 'x' &&
                     std::all_of(name.begin() + 2, name.end(), [](unsigned char c) { return std::isxdigit(c); });
    if (decimal || hex) {
      // A reference to a character XML forbids (controls, surrogates, beyond Unicode) would end
      // the text early or make it invalid UTF-8 in every output.
      const std::string digits(name.substr(hex ? 2 : 1));
      const unsigned long code = digits.size() > 8 ? 0x110000ul : std::stoul(digits, nullptr, hex ? 16 : 10);
      const bool allowed = code == 0x9 || code == 0xA || code == 0xD || (code >= 0x20 && code < 0xD800) ||
                           (code >= 0xE000 && code <= 0xFFFD) || (code >= 0x10000 && code <= 0x10FFFF);
      if (allowed) continue;
      const int here = line + static_cast<int>(std::count(value.begin(), value.begin() + at, '\n'));
      throw_input_error({file_, here}, object,
                        fmt::format("the character reference \"&{};\" names a character XML text may not hold (a control "
                                    "character, a surrogate or a code beyond Unicode)", std::string(name.substr(0, 12))),
                        "remove it, or write the character meant itself (UTF-8)");
    }
    if (std::find(std::begin(known), std::end(known), name) != std::end(known)) continue;
    // The line of the reference itself: the node's first line plus the line breaks before it.
    const int here = line + static_cast<int>(std::count(value.begin(), value.begin() + at, '\n'));
    const std::string shown(value.substr(at, end == std::string_view::npos || end - at > 40 ? std::min<std::size_t>(20, value.size() - at) : end - at + 1));
    throw_input_error({file_, here}, object,
                      fmt::format("the entity reference \"{}\" is not defined (XML, and edgeflux, know only &amp; &lt; "
                                  "&gt; &quot; &apos; and numeric references such as &#176;; entities declared in a "
                                  "DTD are not expanded)", shown),
                      "write the character itself (UTF-8), or &amp; for a literal &");
  }
}

std::string DetailReader::parameter_names() const {
  std::string names;
  for (const Parameter& p : section_.parameters) names += (names.empty() ? "" : ", ") + p.name;
  return names.empty() ? "(none defined)" : names;
}

double DetailReader::evaluate(const std::string& expression, const XMLElement* e, const std::string& what) const {
  try {
    mu::Parser parser;
    for (std::size_t i = 0; i < section_.parameters.size(); ++i)
      parser.DefineVar(section_.parameters[i].name, parameter_values_[i].get());
    parser.SetExpr(expression);
    const double value = parser.Eval();
    if (!std::isfinite(value))
      throw_input_error(where(e), describe(e), fmt::format("{}: the expression \"{}\" is not finite", what, expression),
                        "check for a division by zero or a logarithm of a non-positive value");
    return value;
  } catch (const mu::Parser::exception_type& error) {
    std::string reason = error.GetMsg();
    while (!reason.empty() && (reason.back() == '.' || reason.back() == ' ')) reason.pop_back();
    throw_input_error(where(e), describe(e),
                      fmt::format("{}: cannot evaluate \"{}\": {}", what, expression, reason),
                      fmt::format("use numbers, + - * / ^, parentheses, functions such as min(a,b), sqrt(x), and "
                                  "the parameters defined before this line: {}", parameter_names()));
  }
}

std::string DetailReader::expand(const std::string& text, const XMLElement* e, const std::string& what) const {
  std::string out;
  std::size_t at = 0;
  while (true) {
    const std::size_t open = text.find('{', at);
    if (open == std::string::npos) break;
    const std::size_t close = text.find('}', open);
    if (close == std::string::npos)
      throw_input_error(where(e), describe(e), fmt::format("{}: \"{{\" without a closing \"}}\"", what),
                        "write an expression as {name} or {2*name + 10}");
    out += text.substr(at, open - at);
    out += fmt::format("{:.17g}", evaluate(text.substr(open + 1, close - open - 1), e, what));
    at = close + 1;
  }
  return out + text.substr(at);
}

void DetailReader::read_parameter(const XMLElement* e) {
  allow_attributes(e, {"name", "value", "description"});
  Parameter p;
  p.name = required_text(e, "name");
  p.where = where(e);
  const bool valid_name = std::isalpha(static_cast<unsigned char>(p.name[0])) &&
                          std::all_of(p.name.begin(), p.name.end(), [](unsigned char c) { return std::isalnum(c) || c == '_'; });
  if (!valid_name)
    throw_input_error(p.where, describe(e), fmt::format("\"{}\" is not a valid parameter name", p.name),
                      "use letters, digits and _ , starting with a letter, e.g. insulation_thickness");
  for (const Parameter& other : section_.parameters)
    if (other.name == p.name)
      throw_input_error(p.where, describe(e), fmt::format("parameter \"{}\" is already defined on line {}", p.name, other.where.line),
                        "give each parameter its own name");
  const std::string text = required_text(e, "value");
  p.value = evaluate(text, e, "attribute \"value\"");
  if (const auto it = overrides_.find(p.name); it != overrides_.end()) p.value = it->second, p.overridden = true;
  p.description = optional_text(e, "description", "");
  section_.parameters.push_back(p);
  parameter_values_.push_back(std::make_unique<double>(p.value));
}

void DetailReader::allow_attributes(const XMLElement* e, std::initializer_list<const char*> allowed) const {
  for (const tinyxml2::XMLAttribute* a = e->FirstAttribute(); a; a = a->Next()) {
    const bool ok = std::any_of(allowed.begin(), allowed.end(),
                                [&](const char* name) { return std::string(name) == a->Name(); });
    if (!ok) {
      std::string list;
      for (const char* name : allowed) list += (list.empty() ? "" : ", ") + std::string(name);
      throw_input_error(where(e), fmt::format("<{}>", e->Name()),
                        fmt::format("attribute \"{}\" is not known here", a->Name()),
                        list.empty() ? "remove it" : fmt::format("the attributes allowed are: {}", list));
    }
  }
}

std::string DetailReader::describe(const XMLElement* e) const {
  for (const char* key : {"id", "name"})
    if (const char* v = e->Attribute(key)) return fmt::format("<{} {}=\"{}\">", e->Name(), key, v);
  return fmt::format("<{}>", e->Name());
}

std::string DetailReader::required_text(const XMLElement* e, const char* attribute) const {
  const char* v = e->Attribute(attribute);
  if (v == nullptr || std::string(v).empty())
    throw_input_error(where(e), describe(e), fmt::format("attribute \"{}\" is missing", attribute),
                      fmt::format("add {}=\"...\"", attribute));
  return v;
}

std::string DetailReader::optional_text(const XMLElement* e, const char* attribute, const char* fallback) {
  const char* v = e->Attribute(attribute);
  return v ? v : fallback;
}

double DetailReader::parse_number(const std::string& raw, const XMLElement* e, const std::string& what) const {
  const std::string text = raw.find('{') == std::string::npos ? raw : expand(raw, e, what);
  const char* begin = text.data();
  const char* end = begin + text.size();
  while (begin < end && std::isspace(static_cast<unsigned char>(*begin))) ++begin;
  while (end > begin && std::isspace(static_cast<unsigned char>(end[-1]))) --end;
  if (begin < end && *begin == '+') ++begin;
  double value = 0.0;
  const auto [ptr, ec] = std::from_chars(begin, end, value);
  if (ec != std::errc() || ptr != end || begin == end)
    throw_input_error(where(e), describe(e), fmt::format("{} \"{}\" is not a number", what, text),
                      "write a plain decimal number such as 0.035 or 200");
  if (!std::isfinite(value))
    throw_input_error(where(e), describe(e), fmt::format("{} \"{}\" is not a finite number", what, text),
                      "write a finite decimal number");
  return value;
}

double DetailReader::required_number(const XMLElement* e, const char* attribute) const {
  return parse_number(required_text(e, attribute), e, fmt::format("attribute \"{}\"", attribute));
}

std::vector<Point> DetailReader::parse_points(const XMLElement* e, const char* attribute) const {
  std::string text = expand(required_text(e, attribute), e, fmt::format("attribute \"{}\"", attribute));
  if (text.find('(') != std::string::npos)
    throw_input_error(where(e), describe(e), fmt::format("attribute \"{}\" takes points only, no arcs", attribute),
                      "give points as x,y pairs separated by spaces, e.g. \"0,0 200,0\"");
  return numbers_to_points(e, attribute, split_numbers(text, e, attribute));
}

std::vector<double> DetailReader::split_numbers(std::string text, const XMLElement* e, const char* attribute) const {
  std::replace(text.begin(), text.end(), ',', ' ');
  std::replace(text.begin(), text.end(), ';', ' ');
  std::istringstream in(text);
  std::vector<double> numbers;
  for (std::string token; in >> token;)
    numbers.push_back(parse_number(token, e, fmt::format("coordinate in \"{}\"", attribute)));
  return numbers;
}
CrossSection parse_detail_text(const std::string& text, const std::string& file_name, const ParameterOverrides& overrides,
                               double arc_tolerance) {
  return DetailReader(file_name, overrides, arc_tolerance).read(text);
}

CrossSection read_detail_file(const std::string& path, const ParameterOverrides& overrides, double arc_tolerance) {
  std::error_code ec;
  if (std::filesystem::is_directory(path, ec))
    throw_input_error({path, 0}, "detail file", "is a folder", "give the detail file inside it, e.g. " + path + "/detail.xml");
  std::ifstream in(path, std::ios::binary);
  if (!in)
    throw_input_error({path, 0}, "detail file", "cannot be opened (missing or unreadable)",
                      "check the path; run 'edgeflux solve --help' for usage");
  std::ostringstream text;
  text << in.rdbuf();
  return parse_detail_text(text.str(), path, overrides, arc_tolerance);
}

}  // namespace edgeflux
