// Material hatches for section drawings, following common architectural hatching conventions.
#include "report/material_fills.h"

#include <fmt/format.h>

#include <algorithm>
#include <cctype>

namespace edgeflux {
namespace {

bool has_any(const std::string& text, std::initializer_list<const char*> words) {
  return std::any_of(words.begin(), words.end(), [&](const char* w) { return text.find(w) != std::string::npos; });
}

HatchKind classify(const Material& m) {
  std::string text = m.id + " " + m.source;
  std::transform(text.begin(), text.end(), text.begin(), [](unsigned char c) { return std::tolower(c); });
  if (has_any(text, {"insulat", "eps", "xps", "mineral wool", "mineral-wool", "rock wool", "glass wool", "pir", "pur", "polyurethane",
                     "polystyrene", "foam", "wood fibre", "cellulose", "aerogel", "vacuum"}))
    return HatchKind::insulation;
  if (has_any(text, {"reinforced"})) return HatchKind::reinforced_concrete;
  if (has_any(text, {"concrete"})) return HatchKind::concrete;
  if (has_any(text, {"brick", "masonry", "calcium", "block", "clay unit", "stone", "granite", "sandstone", "aerated"}))
    return HatchKind::masonry;
  if (has_any(text, {"plaster", "render", "screed", "mortar", "gypsum", "board"})) return HatchKind::plaster;
  if (has_any(text, {"timber", "wood", "plywood", "osb", "lumber", "glulam", "clt"})) return HatchKind::timber;
  if (has_any(text, {"steel", "alumin", "copper", "metal", "iron", "zinc"})) return HatchKind::metal;
  if (has_any(text, {"glass", "glazing", "pane"})) return HatchKind::glass;
  if (has_any(text, {"soil", "ground", "clay", "silt", "sand", "gravel", "earth"})) return HatchKind::soil;
  if (has_any(text, {"air", "cavity", "gap"})) return HatchKind::air;
  return HatchKind::plain;
}

struct Shades {
  std::vector<const char*> grounds;
  const char* ink;
};

Shades shades(HatchKind k) {
  switch (k) {
    case HatchKind::insulation: return {{"#fff4c2", "#fde7a6", "#f6f0d0"}, "#9a7b12"};
    case HatchKind::masonry: return {{"#f3d2c4", "#e9dccb", "#f1c7b0"}, "#8c4a32"};
    case HatchKind::concrete: return {{"#dedede", "#e6e3dc", "#d6d9dc"}, "#555555"};
    case HatchKind::reinforced_concrete: return {{"#cfd3d6", "#d8d4cc", "#c8cdd2"}, "#3b3f44"};
    case HatchKind::plaster: return {{"#f1eee8", "#e9eef0", "#f3ede2"}, "#8a8378"};
    case HatchKind::timber: return {{"#ecd6ad", "#e3c99a", "#f0ddb8"}, "#8a5a22"};
    case HatchKind::metal: return {{"#b9c2ca", "#c7c0b5", "#aeb8c0"}, "#2f3a44"};
    case HatchKind::glass: return {{"#dcf0f7", "#e2f3ef"}, "#3f86a8"};
    case HatchKind::soil: return {{"#dccfb4", "#d3c7ae"}, "#6b5a3a"};
    case HatchKind::air: return {{"#ffffff", "#fafcff"}, "#9aa7b4"};
    case HatchKind::plain: return {{"#e4ecf7", "#eaf4e4", "#f5e6ef", "#f0eadc", "#e6e6f5"}, "#56606b"};
  }
  return {{"#eeeeee"}, "#555555"};
}

// The hatch motif of one pattern tile, in tile coordinates (mm).
std::string motif(HatchKind k, const std::string& ink, double angle, double& tile_w, double& tile_h) {
  switch (k) {
    case HatchKind::insulation:  // the soft-insulation zig-zag, running along the layer
      tile_w = 2.4, tile_h = 1.6;
      return fmt::format("<path d=\"M0 1.5 L0.6 0.1 L1.2 1.5 L1.8 0.1 L2.4 1.5\" fill=\"none\" stroke=\"{}\" stroke-width=\"0.13\"/>", ink);
    case HatchKind::masonry:  // diagonal section hatch
      tile_w = tile_h = 1.3;
      return fmt::format("<path d=\"M-0.2 1.5 L1.5 -0.2 M-0.2 0.2 L0.2 -0.2 M1.1 1.5 L1.5 1.1\" stroke=\"{}\" stroke-width=\"0.12\"/>", ink);
    case HatchKind::concrete:  // aggregate stipple
      tile_w = tile_h = 2.2;
      return fmt::format("<g fill=\"{}\"><circle cx=\"0.4\" cy=\"0.5\" r=\"0.13\"/><circle cx=\"1.5\" cy=\"0.3\" r=\"0.09\"/>"
                         "<circle cx=\"1.1\" cy=\"1.3\" r=\"0.15\"/><circle cx=\"0.3\" cy=\"1.8\" r=\"0.08\"/>"
                         "<circle cx=\"1.9\" cy=\"1.9\" r=\"0.11\"/><path d=\"M1.7 0.9 l0.3 0.05 l-0.18 0.24 z\"/></g>", ink);
    case HatchKind::reinforced_concrete:  // stipple with a diagonal
      tile_w = tile_h = 2.2;
      return fmt::format("<g fill=\"{0}\"><circle cx=\"0.5\" cy=\"1.4\" r=\"0.12\"/><circle cx=\"1.6\" cy=\"0.5\" r=\"0.1\"/>"
                         "<circle cx=\"1.7\" cy=\"1.8\" r=\"0.09\"/></g><path d=\"M-0.2 2.4 L2.4 -0.2\" stroke=\"{0}\" stroke-width=\"0.12\"/>", ink);
    case HatchKind::plaster:  // fine dots
      tile_w = tile_h = 0.9;
      return fmt::format("<circle cx=\"0.45\" cy=\"0.45\" r=\"0.07\" fill=\"{}\"/>", ink);
    case HatchKind::timber:  // grain
      tile_w = 4.0, tile_h = 1.2;
      return fmt::format("<path d=\"M0 0.6 C1 0.2 2 1.0 4 0.6\" fill=\"none\" stroke=\"{}\" stroke-width=\"0.11\"/>", ink);
    case HatchKind::metal:  // dense cross-hatch
      tile_w = tile_h = 0.8;
      return fmt::format("<path d=\"M-0.1 0.9 L0.9 -0.1 M-0.1 -0.1 L0.9 0.9\" stroke=\"{}\" stroke-width=\"0.1\"/>", ink);
    case HatchKind::glass:
      tile_w = tile_h = 1.6;
      return fmt::format("<path d=\"M0 0.8 L1.6 0.8\" stroke=\"{}\" stroke-width=\"0.1\"/>", ink);
    case HatchKind::soil:
      tile_w = tile_h = 2.4;
      return fmt::format("<path d=\"M0.2 2.0 L0.9 1.3 M1.4 0.9 L2.1 0.2\" stroke=\"{}\" stroke-width=\"0.12\"/>", ink);
    case HatchKind::air:
      tile_w = tile_h = 2.0;
      return fmt::format("<circle cx=\"1\" cy=\"1\" r=\"0.06\" fill=\"{}\"/>", ink);
    case HatchKind::plain:
      tile_w = tile_h = 1.6;
      return fmt::format("<path d=\"M0 0.8 L1.6 0.8\" stroke=\"{}\" stroke-width=\"0.1\" transform=\"rotate({} 0.8 0.8)\"/>", ink, angle);
  }
  tile_w = tile_h = 1;
  return "";
}

}  // namespace

const char* hatch_name(HatchKind kind) {
  switch (kind) {
    case HatchKind::insulation: return "insulation";
    case HatchKind::masonry: return "masonry";
    case HatchKind::concrete: return "concrete";
    case HatchKind::reinforced_concrete: return "reinforced concrete";
    case HatchKind::plaster: return "plaster, render, screed";
    case HatchKind::timber: return "timber";
    case HatchKind::metal: return "metal";
    case HatchKind::glass: return "glass";
    case HatchKind::soil: return "soil";
    case HatchKind::air: return "air layer";
    case HatchKind::plain: return "other";
  }
  return "other";
}

std::vector<MaterialFill> material_fills(const CrossSection& section) {
  std::vector<MaterialFill> fills;
  int count[11] = {};
  static const double angles[] = {45, -45, 0, 90, 30, -60, 60, -30};
  for (const Material& m : section.materials) {
    MaterialFill f;
    f.hatch = classify(m);
    const int k = count[static_cast<int>(f.hatch)]++;
    const Shades s = shades(f.hatch);
    f.ground = s.grounds[k % s.grounds.size()];
    f.ink = s.ink;
    f.angle = angles[k % 8];
    fills.push_back(f);
  }
  return fills;
}

std::string material_pattern_defs(const std::vector<MaterialFill>& fills, const std::string& prefix) {
  std::string out;
  for (std::size_t i = 0; i < fills.size(); ++i) {
    double w = 1, h = 1;
    const std::string tile = motif(fills[i].hatch, fills[i].ink, fills[i].angle, w, h);
    for (const char* orientation : {"h", "v"}) {
      out += fmt::format("<pattern id=\"{}-m{}-{}\" patternUnits=\"userSpaceOnUse\" width=\"{}\" height=\"{}\"{}>"
                         "<rect width=\"{}\" height=\"{}\" fill=\"{}\"/>{}</pattern>\n",
                         prefix, i, orientation, w, h, orientation[0] == 'v' ? " patternTransform=\"rotate(90)\"" : "", w, h,
                         fills[i].ground, tile);
    }
  }
  return out;
}

}  // namespace edgeflux
