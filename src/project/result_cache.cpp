#include "project/result_cache.h"

#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include <filesystem>
#include <fstream>
#include <regex>
#include <sstream>

#include "core/atomic_file.h"
#include "core/error.h"
#include "core/sha256.h"

namespace edgeflux {

namespace {

namespace fs = std::filesystem;
using json = nlohmann::ordered_json;

/// Format of the stored entries; a change of it (or of the program version) makes old entries misses.
constexpr int cache_format = 1;

std::optional<std::string> read_bytes(const fs::path& path) {
  std::ifstream in(path, std::ios::binary);
  if (!in) return std::nullopt;
  std::ostringstream s;
  s << in.rdbuf();
  return s.str();
}

json to_json(const VariantSummary& v) {
  json psi = json::array();
  for (std::size_t i = 0; i < v.psi.size(); ++i)
    psi.push_back({{"system", static_cast<int>(v.psi[i].system)}, {"psi", v.psi[i].psi}, {"error", i < v.psi_error.size() ? v.psi_error[i] : 0.0}});
  json verdicts = json::array();
  for (const KindVerdict& k : v.verdicts) {
    json criteria = json::array();
    for (const CriterionCheck& c : k.criteria)
      criteria.push_back({{"criterion", c.criterion}, {"required", c.required}, {"met", c.met}, {"governs", c.governs}});
    verdicts.push_back({{"kind", static_cast<int>(k.kind)}, {"frsi", k.temperature_factor}, {"required", k.required_temperature_factor},
                        {"criteria", criteria}, {"met", k.met}});
  }
  auto opt = [](const std::optional<double>& x) { return x ? json(*x) : json(); };
  return {{"format", cache_format}, {"program_version", EDGEFLUX_VERSION}, {"label", v.label}, {"file", v.file}, {"parameters", v.parameters},
          {"title", v.title}, {"coupling_2d", opt(v.coupling_2d)}, {"coupling_2d_error", opt(v.coupling_2d_error)}, {"psi", psi},
          {"min_surface_temperature", opt(v.min_surface_temperature)}, {"temperature_factor", opt(v.temperature_factor)}, {"verdicts", verdicts},
          {"carried_forward", v.carried_forward ? json(static_cast<int>(*v.carried_forward)) : json()}, {"climate", v.climate},
          {"input_sha256", v.input_sha256}, {"nodes", v.nodes}, {"seconds", v.seconds}, {"warnings", v.warnings}};
}

std::optional<double> opt_number(const json& j) { return j.is_null() ? std::nullopt : std::optional<double>(j.get<double>()); }

VariantSummary from_json(const json& j) {
  VariantSummary v;
  v.label = j.at("label").get<std::string>();
  v.file = j.at("file").get<std::string>();
  v.parameters = j.at("parameters").get<std::map<std::string, double>>();
  v.title = j.at("title").get<std::string>();
  v.coupling_2d = opt_number(j.at("coupling_2d"));
  v.coupling_2d_error = opt_number(j.at("coupling_2d_error"));
  for (const json& p : j.at("psi")) {
    v.psi.push_back({static_cast<DimensionSystem>(p.at("system").get<int>()), p.at("psi").get<double>()});
    v.psi_error.push_back(p.at("error").get<double>());
  }
  v.min_surface_temperature = opt_number(j.at("min_surface_temperature"));
  v.temperature_factor = opt_number(j.at("temperature_factor"));
  for (const json& k : j.at("verdicts")) {
    KindVerdict kv;
    kv.kind = static_cast<SurfaceKind>(k.at("kind").get<int>());
    kv.temperature_factor = k.at("frsi").get<double>();
    kv.required_temperature_factor = k.at("required").get<double>();
    kv.met = k.at("met").get<bool>();
    for (const json& c : k.at("criteria"))
      kv.criteria.push_back({c.at("criterion").get<std::string>(), c.at("required").get<double>(), c.at("met").get<bool>(), c.at("governs").get<bool>()});
    v.verdicts.push_back(kv);
  }
  if (!j.at("carried_forward").is_null()) v.carried_forward = static_cast<DimensionSystem>(j.at("carried_forward").get<int>());
  v.climate = j.at("climate").get<std::string>();
  v.input_sha256 = j.at("input_sha256").get<std::string>();
  v.nodes = j.at("nodes").get<int>();
  v.seconds = j.at("seconds").get<double>();
  v.warnings = j.at("warnings").get<std::vector<std::string>>();
  return v;
}

}  // namespace

std::string junction_cache_key(const ProjectJunction& junction, const AccuracyTarget& target) {
  std::string material = fmt::format("edgeflux {} cache {}\ntarget {:.17g} {:.17g} {:.17g}\n", EDGEFLUX_VERSION, cache_format,
                                     target.coupling_relative, target.psi_absolute, target.temperature_absolute);
  for (const auto& [name, value] : junction.overrides) material += fmt::format("set {}={:.17g}\n", name, value);
  const auto detail = read_bytes(junction.detail_file);
  if (!detail) return sha256_hex(material + "unreadable " + junction.detail_file + fmt::format(" {}", static_cast<const void*>(&junction)));
  material += "detail\n" + *detail + "\n";
  // Files the detail refers to (a <drawing file="…">): their bytes are inputs too.
  static const std::regex file_attribute(R"(\bfile\s*=\s*"([^"]*)\")");
  for (std::sregex_iterator it(detail->begin(), detail->end(), file_attribute), end; it != end; ++it) {
    const fs::path referred = fs::path(junction.detail_file).parent_path() / (*it)[1].str();
    const auto bytes = read_bytes(referred);
    material += "file " + (*it)[1].str() + "\n" + (bytes ? *bytes : std::string("(missing)")) + "\n";
  }
  return sha256_hex(material);
}

std::optional<VariantSummary> load_cached_result(const std::string& folder, const std::string& key) {
  const auto text = read_bytes(fs::path(folder) / (key + ".json"));
  if (!text) return std::nullopt;
  try {
    const json j = json::parse(*text);
    if (j.at("format").get<int>() != cache_format || j.at("program_version").get<std::string>() != EDGEFLUX_VERSION) return std::nullopt;
    return from_json(j);
  } catch (const std::exception&) {
    return std::nullopt;  // a damaged entry is a miss; the junction is solved again and the entry replaced
  }
}

std::string store_cached_result(const std::string& folder, const std::string& key, const VariantSummary& result) {
  std::error_code ec;
  fs::create_directories(folder, ec);
  if (ec) return fmt::format("the cache folder {} cannot be created ({})", folder, ec.message());
  try {
    write_file_atomically((fs::path(folder) / (key + ".json")).string(), to_json(result).dump(1) + "\n");
  } catch (const InputError& e) {
    return e.what();
  }
  return "";
}

}  // namespace edgeflux
