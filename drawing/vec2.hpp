// Plane vector helpers on Pt (sheet or model millimetres) for the annotation and dimension code.
#pragma once

#include <cmath>
#include <numbers>

#include "drawing/canvas.hpp"

namespace bandforge::drawing {

inline constexpr double kPi = std::numbers::pi;

inline double dot(Pt a, Pt b) { return a.x * b.x + a.y * b.y; }
inline double norm(Pt a) { return std::hypot(a.x, a.y); }
/// `a` scaled to length 1; (1, 0) for the zero vector, so that a degenerate direction still
/// gives a usable one.
inline Pt unit(Pt a) {
  const double n = norm(a);
  return n > 0 ? Pt{a.x / n, a.y / n} : Pt{1, 0};
}
/// `a` turned a quarter turn counter-clockwise.
inline Pt perp(Pt a) { return {-a.y, a.x}; }

}  // namespace bandforge::drawing
