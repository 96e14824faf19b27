// The element size the graded Delaunay mesh asks for at every point, and the node count it implies.
#pragma once

#include <array>
#include <unordered_map>
#include <vector>

#include "core/point.h"

namespace edgeflux {

/// A point that asks for elements of a given size (same length unit as the point).
struct SizeSeed {
  Point at;
  double size;
};

/// Size field: h(x) = min(max_size, min over seeds of size + grading·|x − seed|): each feature seed
/// asks for its own size, growing linearly away from it. The seeds sit in a k-d tree whose nodes
/// know their smallest size, so a query visits only the nodes that could still lower h: O(log n)
/// for the tens of thousands of seeds of a finely drawn curve.
class SizeField {
 public:
  SizeField(const std::vector<SizeSeed>& seeds, double max_size, double grading);
  double operator()(double x, double y) const;
  double max_size() const { return max_size_; }
  double grading() const { return grading_; }

 private:
  struct Node {
    double x_min, y_min, x_max, y_max, smallest;
    int first, last;          ///< seeds_[first, last) below this node
    int children[2] = {-1, -1};
  };
  int build(int first, int last);
  double max_size_, grading_;
  std::vector<SizeSeed> seeds_;
  std::vector<Node> nodes_;
};

/// A triangle of the constraints-only triangulation that a region paints. `bounded` when one of its
/// constrained sides is nearly as long as its longest side: it then spans the thickness of a layer
/// (or sliver) between constraints, and elements there can be no larger than that thickness. A
/// thin triangle between three points of one finely drawn curve is not bounded: its thinness is
/// the triangulation's, not the domain's.
struct DomainTriangle {
  Point a, b, c;
  bool bounded = true;
};

/// About how many nodes the graded mesh of the given triangles (the domain, in coarse pieces) has:
/// the integral of 2/(√3 (0.6 h)²) (equilateral triangles two per node, of side 0.6 h: the average
/// edge when the longest edge of each triangle is kept below the local size h). Accurate to a small factor, for guards rather than for planning. Stops counting
/// and returns a value above `stop_above` as soon as the count passes it, so an absurd section
/// (a 70 km strip with millimetre layers) is found out in milliseconds.
double estimated_node_count(const std::vector<DomainTriangle>& domain, const SizeField& field, double stop_above);

}  // namespace edgeflux
