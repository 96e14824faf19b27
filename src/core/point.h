// A point or vector in the plane of the cross-section, in metres.
#pragma once

#include <cmath>

namespace edgeflux {

struct Point {
  double x = 0.0;  ///< m, across the section
  double y = 0.0;  ///< m, up the section
};

inline Point operator+(Point a, Point b) { return {a.x + b.x, a.y + b.y}; }
inline Point operator-(Point a, Point b) { return {a.x - b.x, a.y - b.y}; }
inline Point operator*(double s, Point a) { return {s * a.x, s * a.y}; }
inline double dot(Point a, Point b) { return a.x * b.x + a.y * b.y; }
inline double cross(Point a, Point b) { return a.x * b.y - a.y * b.x; }
inline double norm(Point a) { return std::hypot(a.x, a.y); }
inline double distance(Point a, Point b) { return norm(a - b); }

}  // namespace edgeflux
