// Plane geometry of bulge polylines: area, length, reversal, and the sums every flat part reports.
#include <algorithm>
#include <cmath>
#include <cstdio>
#include <limits>
#include <numbers>

#include "geometry/flat_internal.hpp"

namespace bandforge::geom {
namespace {

// One segment from p to q with the bulge stored on p: included angle θ = 4·atan(bulge).
struct Segment {
  double chord = 0;  // |q − p|
  double theta = 0;  // signed included angle [rad]; 0 = line
};

Segment segment(const FlatVertex& p, const FlatVertex& q) {
  return {std::hypot(q.x - p.x, q.y - p.y), 4.0 * std::atan(p.bulge)};
}

// Arc radius from chord and included angle (chord = 2R·sin(θ/2)).
double radius(const Segment& s) { return s.chord / (2.0 * std::sin(std::abs(s.theta) / 2.0)); }

// The extreme points of an arc from p with included angle θ: its ends plus any axis crossing.
void extend_box(const FlatVertex& p, const FlatVertex& q, double& x0, double& y0, double& x1,
                double& y1) {
  auto take = [&](double x, double y) {
    x0 = std::min(x0, x);
    y0 = std::min(y0, y);
    x1 = std::max(x1, x);
    y1 = std::max(y1, y);
  };
  take(p.x, p.y);
  take(q.x, q.y);
  const Segment s = segment(p, q);
  if (s.theta == 0 || s.chord == 0) return;
  const double r = radius(s);
  // Centre: from the chord midpoint along the chord's left normal (CCW arc) by r·cos(θ/2).
  const double mx = (p.x + q.x) / 2, my = (p.y + q.y) / 2;
  const double ux = (q.x - p.x) / s.chord, uy = (q.y - p.y) / s.chord;
  const double h = r * std::cos(std::abs(s.theta) / 2) * (s.theta > 0 ? 1.0 : -1.0);
  const double cx = mx - uy * h, cy = my + ux * h;
  const double a0 = std::atan2(p.y - cy, p.x - cx);
  for (int k = 0; k < 4; ++k) {
    const double axis = k * std::numbers::pi / 2;
    // Turn from a0 to the axis direction in the arc's sense, in [0, 2π).
    double turn = (axis - a0) * (s.theta > 0 ? 1.0 : -1.0);
    turn = std::fmod(turn, 2 * std::numbers::pi);
    if (turn < 0) turn += 2 * std::numbers::pi;
    if (turn < std::abs(s.theta)) take(cx + r * std::cos(axis), cy + r * std::sin(axis));
  }
}

}  // namespace

double contour_area(const std::vector<FlatVertex>& c) {
  double a = 0;
  for (std::size_t i = 0; i < c.size(); ++i) {
    const FlatVertex& p = c[i];
    const FlatVertex& q = c[(i + 1) % c.size()];
    a += (p.x * q.y - q.x * p.y) / 2;
    const Segment s = segment(p, q);
    if (s.theta != 0 && s.chord > 0) {
      // Circular segment between chord and arc; a CCW arc lies right of its chord, outside a
      // CCW polygon, so it adds area (and a CW arc removes it).
      const double r = radius(s);
      a += r * r / 2 * (s.theta - std::sin(s.theta));
    }
  }
  return a;
}

double contour_length(const std::vector<FlatVertex>& c) {
  double l = 0;
  for (std::size_t i = 0; i < c.size(); ++i) {
    const Segment s = segment(c[i], c[(i + 1) % c.size()]);
    l += s.theta == 0 ? s.chord : radius(s) * std::abs(s.theta);
  }
  return l;
}

std::vector<FlatVertex> reversed(const std::vector<FlatVertex>& c) {
  // Segment i runs c[i] → c[i+1] with bulge on c[i]; reversed it runs c[i+1] → c[i] with the
  // opposite bulge, now stored on c[i+1].
  std::vector<FlatVertex> out;
  out.reserve(c.size());
  const std::size_t n = c.size();
  for (std::size_t k = 0; k < n; ++k) {
    const std::size_t i = (n - k) % n;           // vertex order c[0], c[n−1], …, c[1]
    const std::size_t prev = (i + n - 1) % n;    // the segment that ended at c[i]
    out.push_back({c[i].x, c[i].y, -c[prev].bulge});
  }
  return out;
}

std::string num(double value, int decimals) {
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.*f", decimals, value);
  std::string s = buf;
  if (s.find('.') != std::string::npos) {
    while (!s.empty() && s.back() == '0') s.pop_back();
    if (!s.empty() && s.back() == '.') s.pop_back();
  }
  if (s == "-0") s = "0";
  return s;
}

void finish(FlatPart& part) {
  double x0 = std::numeric_limits<double>::infinity(), y0 = x0, x1 = -x0, y1 = -x0;
  const std::vector<FlatVertex>& outline = part.contours.at(0);
  for (std::size_t i = 0; i < outline.size(); ++i) {
    extend_box(outline[i], outline[(i + 1) % outline.size()], x0, y0, x1, y1);
  }
  part.x_min = x0;
  part.y_min = y0;
  part.length = x1 - x0;
  part.width = y1 - y0;
  part.area = contour_area(outline);
  part.perimeter = contour_length(outline);
  for (std::size_t k = 1; k < part.contours.size(); ++k) {
    part.area -= std::abs(contour_area(part.contours[k]));
    part.perimeter += contour_length(part.contours[k]);
  }
  for (const FlatCircle& h : part.holes) {
    part.area -= std::numbers::pi * h.radius * h.radius;
    part.perimeter += 2 * std::numbers::pi * h.radius;
  }
  part.mass = part.area * part.thickness * 1e-9 * part.density;  // mm³ → m³
}

}  // namespace bandforge::geom
