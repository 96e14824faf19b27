// From the entities of a drawing to its outlines and chains: blocks expanded with their
// transforms, lines and arcs joined, hatch loops sorted into outlines and islands, duplicates
// and zero-length pieces dropped with notes, everything in metres.
#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <functional>
#include <set>
#include <unordered_map>

#include "geometry/arc_points.h"
#include "geometry/polygon.h"
#include "input/drawing_entities.h"

namespace edgeflux {

namespace {

/// The affine map of a block insert: p ↦ offset + M·p.
struct Transform {
  double m00 = 1, m01 = 0, m10 = 0, m11 = 1;
  Point offset{};
  Point operator()(Point p) const { return {offset.x + m00 * p.x + m01 * p.y, offset.y + m10 * p.x + m11 * p.y}; }
  Transform then(const Transform& outer) const {  // outer ∘ this
    Transform t;
    t.m00 = outer.m00 * m00 + outer.m01 * m10, t.m01 = outer.m00 * m01 + outer.m01 * m11;
    t.m10 = outer.m10 * m00 + outer.m11 * m10, t.m11 = outer.m10 * m01 + outer.m11 * m11;
    t.offset = outer(offset);
    return t;
  }
};


}  // namespace

void assemble_drawing(CadDrawing& drawing, const RawDrawing& raw, double tolerance, const SourceLocation& where) {
  // Expand model space, blocks inserted with their transforms; pieces to chain afterwards.
  struct Piece {
    std::string layer, entity;
    std::vector<Point> points;
    int order;
  };
  std::vector<Piece> pieces;
  std::map<std::pair<int, int>, std::vector<DrawnShape>> hatch_loops;  // per (insert, hatch), its loops
  int instances = 0;
  std::map<std::string, DrawingLayer> layers;
  int order = 0;
  int zero_length = 0;
  std::string zero_length_first;
  constexpr long max_placed_entities = 2'000'000;
  long placed = 0;

  std::function<void(const std::string&, const Transform&, const std::string&, int)> expand =
      [&](const std::string& block, const Transform& transform, const std::string& insert_layer, int depth) {
        if (depth > 64)
          throw_input_error(where, fmt::format("block '{}'", block), "is inserted into itself (directly or through other blocks)",
                            "remove the recursive INSERT from the block definition");
        const auto found = raw.blocks.find(block);
        if (found == raw.blocks.end()) return;
        const int instance = instances++;
        const Point base = raw.block_base.count(block) ? raw.block_base.at(block) : Point{};
        for (const RawEntity& e : found->second) {
          // Arrays of nested blocks multiply: a few lines can stand for billions of entities.
          if (++placed > max_placed_entities)
            throw_input_error(where, fmt::format("block '{}'", block),
                              fmt::format("expands to more than {} entities through inserts and arrays", max_placed_entities),
                              "explode the arrays the section does not need, or draw the section without them");
          const std::string layer = (e.layer == "0" && !insert_layer.empty()) ? insert_layer : e.layer;
          auto place = [&](Point p) {
            if (e.mirrored) p.x = -p.x;
            return transform(p - base);
          };
          auto place_all = [&](std::vector<Point> points) {
            for (Point& p : points) p = place(p);
            return points;
          };
          std::vector<Point> chords;  // this entity's arc points, in block coordinates
          struct Flush {
            std::vector<Point>& chords;
            std::function<Point(Point)> place;
            std::vector<Point>& out;
            ~Flush() { for (Point p : chords) out.push_back(place(p)); }
          } flush{chords, place, drawing.chord_points};
          const std::string entity = fmt::format("{} {}", e.type, e.handle);
          ++layers[layer].entities;
          switch (e.kind) {
            case RawEntity::Kind::insert: {
              const double a = e.angle * pi / 180.0, c = std::cos(a), s = std::sin(a);
              for (int col = 0; col < e.columns; ++col)
                for (int row = 0; row < e.rows; ++row) {
                  Transform local;
                  local.m00 = c * e.scale.x, local.m01 = -s * e.scale.y, local.m10 = s * e.scale.x, local.m11 = c * e.scale.y;
                  const Point shift{col * e.spacing.x, row * e.spacing.y};
                  local.offset = e.a + Point{c * shift.x - s * shift.y, s * shift.x + c * shift.y};
                  Transform t = local;
                  // The insert's own position is in the coordinates of the block that holds it.
                  if (e.mirrored) t.m00 = -t.m00, t.m01 = -t.m01, t.offset.x = -t.offset.x;
                  t.offset = t.offset - base;
                  expand(e.block, t.then(transform), layer, depth + 1);
                }
              break;
            }
            case RawEntity::Kind::spline:
              drawing.splines.push_back(fmt::format("{}: {}", layer, entity));
              break;
            case RawEntity::Kind::line:
              if (distance(e.a, e.b) == 0.0) {
                if (zero_length++ == 0) zero_length_first = fmt::format("{} on layer '{}'", entity, layer);
                break;
              }
              pieces.push_back({layer, entity, {place(e.a), place(e.b)}, order++});
              break;
            case RawEntity::Kind::arc: {
              const Point from = e.a + e.radius * Point{std::cos(e.start * pi / 180), std::sin(e.start * pi / 180)};
              const Point to = e.a + e.radius * Point{std::cos(e.end * pi / 180), std::sin(e.end * pi / 180)};
              std::vector<Point> points{from};
              for (Point p : arc_points(from, to, e.a, true, tolerance)) points.push_back(p), chords.push_back(p);
              points.push_back(to);
              pieces.push_back({layer, entity, place_all(points), order++});
              break;
            }
            case RawEntity::Kind::circle: {
              const Point start = e.a + Point{e.radius, 0.0};
              std::vector<Point> points{start};
              for (Point p : arc_points(start, start, e.a, true, tolerance)) points.push_back(p), chords.push_back(p);
              drawing.outlines.push_back({layer, entity, place_all(points), {}, order++});
              break;
            }
            case RawEntity::Kind::ellipse: {
              const bool full = std::abs(std::abs(e.end - e.start) - 2.0 * pi) < 1e-9 || e.end == e.start;
              std::vector<Point> points = ellipse_points(e.a, e.b, e.ratio, e.start, full ? e.start + 2.0 * pi : e.end, true, tolerance);
              chords.insert(chords.end(), points.begin() + 1, points.end() - 1);
              if (full) {
                points.pop_back();
                drawing.outlines.push_back({layer, entity, place_all(points), {}, order++});
              } else {
                pieces.push_back({layer, entity, place_all(points), order++});
              }
              break;
            }
            case RawEntity::Kind::polyline: {
              std::vector<Point> points = place_all(polyline_points(e.vertices, e.closed, tolerance, chords));
              points.erase(std::unique(points.begin(), points.end(), [](Point p, Point q) { return distance(p, q) == 0.0; }), points.end());
              if (e.closed && points.size() > 1 && distance(points.front(), points.back()) == 0.0) points.pop_back();
              if (points.size() < 2) {
                if (zero_length++ == 0) zero_length_first = fmt::format("{} on layer '{}'", entity, layer);
                break;
              }
              if (e.closed) drawing.outlines.push_back({layer, entity, points, {}, order++});
              else pieces.push_back({layer, entity, points, order++});
              break;
            }
            case RawEntity::Kind::hatch_loop: {
              std::vector<Point> points;
              if (!e.loop_edges.empty()) {
                for (std::size_t k = 0; k < e.loop_edges.size(); ++k) {
                  const auto& edge = e.loop_edges[k];
                  if (e.curved_edges[k] && edge.size() > 2) chords.insert(chords.end(), edge.begin() + 1, edge.end() - 1);
                  for (Point p : edge)
                    if (points.empty() || distance(points.back(), p) > 1e-9 * std::max(1.0, norm(p))) points.push_back(p);
                }
                if (points.size() > 1 && distance(points.front(), points.back()) <= 1e-9 * std::max(1.0, norm(points.front())))
                  points.pop_back();
              } else {
                points = polyline_points(e.vertices, true, tolerance, chords);
              }
              if (points.size() >= 3)
                hatch_loops[{instance, e.hatch}].push_back({layer, entity, place_all(points), {}, order++});
              break;
            }
          }
        }
      };
  expand("", Transform{}, "", 0);
  if (zero_length > 0)
    drawing.notes.push_back(fmt::format("{} zero-length line{} or polyline{} left out (first: {})", zero_length,
                                        zero_length == 1 ? "" : "s", zero_length == 1 ? "" : "s", zero_length_first));

  // Hatches: the loop enclosing the largest area is the outline; the others are islands in it.
  for (auto& [hatch, loops] : hatch_loops) {
    auto area = [](const DrawnShape& s) { return std::abs(signed_area(s.points)); };
    const auto outer = std::max_element(loops.begin(), loops.end(), [&](const auto& a, const auto& b) { return area(a) < area(b); });
    DrawnShape shape = *outer;
    for (auto it = loops.begin(); it != loops.end(); ++it)
      if (it != outer) shape.islands.push_back(it->points);
    drawing.outlines.push_back(std::move(shape));
  }

  // Chains: pieces whose ends meet within 0.01 mm, per layer.
  const double join = 1e-5;  // m
  std::map<std::string, std::vector<int>> by_layer;
  for (int i = 0; i < static_cast<int>(pieces.size()); ++i) by_layer[pieces[i].layer].push_back(i);
  for (const auto& [layer, members] : by_layer) {
    // Cluster end points.
    std::vector<Point> nodes;
    std::unordered_map<long long, std::vector<int>> cells;
    auto cell_key = [](long long i, long long j) { return i * 73856093LL ^ j * 19349663LL; };
    auto node_at = [&](Point p) {
      const long long ci = static_cast<long long>(std::floor(p.x / join)), cj = static_cast<long long>(std::floor(p.y / join));
      for (long long di = -1; di <= 1; ++di)
        for (long long dj = -1; dj <= 1; ++dj)
          for (int k : cells[cell_key(ci + di, cj + dj)])
            if (distance(nodes[k], p) <= join) return k;
      cells[cell_key(ci, cj)].push_back(static_cast<int>(nodes.size()));
      nodes.push_back(p);
      return static_cast<int>(nodes.size()) - 1;
    };
    std::vector<std::array<int, 2>> ends(members.size());
    std::vector<std::vector<std::pair<int, int>>> at(0);  // node → (member, end)
    for (std::size_t m = 0; m < members.size(); ++m) {
      const Piece& p = pieces[members[m]];
      ends[m] = {node_at(p.points.front()), node_at(p.points.back())};
    }
    at.resize(nodes.size());
    for (std::size_t m = 0; m < members.size(); ++m)
      for (int k = 0; k < 2; ++k) at[ends[m][k]].push_back({static_cast<int>(m), k});
    std::vector<char> used(members.size(), 0);
    auto walk = [&](int first, int from_end) {
      DrawnShape shape{layer, "", {}, {}, pieces[members[first]].order};
      int m = first, end = from_end;  // enter piece m at its end `end`
      std::set<std::string> entities;
      while (true) {
        used[m] = 1;
        const Piece& p = pieces[members[m]];
        entities.insert(p.entity);
        shape.order = std::min(shape.order, p.order);
        std::vector<Point> pts = p.points;
        if (end == 1) std::reverse(pts.begin(), pts.end());
        for (std::size_t k = shape.points.empty() ? 0 : 1; k < pts.size(); ++k) shape.points.push_back(pts[k]);
        const int node = ends[m][1 - end];
        if (at[node].size() != 2) break;
        const auto& [next, next_end] = at[node][0].first == m && at[node][0].second == 1 - end ? at[node][1] : at[node][0];
        if (used[next]) {
          shape.entities = fmt::format("{}", fmt::join(entities, ", "));
          if (next == first) {  // back at the start: closed
            shape.points.pop_back();
            return std::pair{shape, true};
          }
          break;
        }
        m = next, end = next_end;
      }
      shape.entities = fmt::format("{}", fmt::join(entities, ", "));
      return std::pair{shape, false};
    };
    // Open chains start at ends that do not continue; what is left are closed loops.
    for (std::size_t n = 0; n < nodes.size(); ++n) {
      if (at[n].size() == 2) continue;
      for (const auto& [m, end] : at[n])
        if (!used[m]) drawing.chains.push_back(walk(m, end).first);
    }
    for (std::size_t m = 0; m < members.size(); ++m)
      if (!used[m]) {
        auto [shape, closed] = walk(static_cast<int>(m), 0);
        (closed ? drawing.outlines : drawing.chains).push_back(std::move(shape));
      }
  }

  // Duplicates: the same outline on the same layer (a hatch over its boundary polyline, a line drawn
  // twice) is kept once.
  {
    auto key_of = [](const DrawnShape& s) {
      std::vector<std::pair<long long, long long>> k;
      for (Point p : s.points) k.push_back({std::llround(p.x / 1e-5), std::llround(p.y / 1e-5)});
      const auto first = std::min_element(k.begin(), k.end());
      std::rotate(k.begin(), first, k.end());
      if (k.size() > 2 && k.back() < k[1]) std::reverse(k.begin() + 1, k.end());
      return std::pair{s.layer, k};
    };
    std::sort(drawing.outlines.begin(), drawing.outlines.end(), [](const DrawnShape& a, const DrawnShape& b) { return a.order < b.order; });
    std::map<std::pair<std::string, std::vector<std::pair<long long, long long>>>, std::string> seen;
    std::vector<DrawnShape> kept;
    for (DrawnShape& s : drawing.outlines) {
      const auto [it, fresh] = seen.emplace(key_of(s), s.entities);
      if (fresh || !s.islands.empty()) kept.push_back(std::move(s));
      else drawing.notes.push_back(fmt::format("layer '{}': {} repeats {} and was left out", s.layer, s.entities, it->second));
    }
    drawing.outlines = std::move(kept);
  }
  std::sort(drawing.chains.begin(), drawing.chains.end(), [](const DrawnShape& a, const DrawnShape& b) { return a.order < b.order; });

  // Units into metres, layer summaries.
  for (Point& p : drawing.chord_points) p = drawing.metres_per_unit * p;
  for (auto* list : {&drawing.outlines, &drawing.chains})
    for (DrawnShape& s : *list) {
      for (Point& p : s.points) p = drawing.metres_per_unit * p;
      for (auto& island : s.islands)
        for (Point& p : island) p = drawing.metres_per_unit * p;
      DrawingLayer& l = layers[s.layer];
      if (l.outlines + l.chains == 0) l.lower = l.upper = s.points.front();
      (list == &drawing.outlines ? l.outlines : l.chains) += 1;
      for (Point p : s.points) {
        l.lower = {std::min(l.lower.x, p.x), std::min(l.lower.y, p.y)};
        l.upper = {std::max(l.upper.x, p.x), std::max(l.upper.y, p.y)};
      }
    }
  for (const std::string& name : raw.layers_declared) layers[name];
  for (auto& [name, l] : layers) {
    l.name = name;
    drawing.layers.push_back(l);
  }
}

}  // namespace edgeflux
