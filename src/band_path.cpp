#include "src/band_path.hpp"

#include <cmath>
#include <numbers>
#include <string>

#include "src/errors.hpp"

namespace bandforge {

EndLayout tangent_end(Vec2 pin, double radius, int sense, bool leaving_a) {
  EndLayout e;
  e.pin = pin;
  const double d = std::hypot(pin.x, pin.y);
  if (!(d > radius)) {
    throw BuildError(std::string("cannot build the band: pin ") + (leaving_a ? "A" : "B") +
                     " lies inside the band circle");
  }
  const double alpha = std::acos(radius / d);
  const double psi = std::atan2(pin.y, pin.x);
  e.tangent_angle = leaving_a ? psi + sense * alpha : psi - sense * alpha;
  e.tangent_point = {radius * std::cos(e.tangent_angle), radius * std::sin(e.tangent_angle)};
  e.free_length = std::sqrt(d * d - radius * radius);
  e.run_dir = {(e.tangent_point.x - pin.x) / e.free_length,
               (e.tangent_point.y - pin.y) / e.free_length};
  return e;
}

double wrap_between(double beta_a, double beta_b, int sense) {
  const double two_pi = 2.0 * std::numbers::pi;
  double phi = std::fmod(sense * (beta_b - beta_a), two_pi);
  if (phi < 0) phi += two_pi;
  return phi;
}

Vec2 rotate_about(Vec2 p, Vec2 centre, double angle) {
  const double c = std::cos(angle), s = std::sin(angle);
  const double dx = p.x - centre.x, dy = p.y - centre.y;
  return {centre.x + c * dx - s * dy, centre.y + s * dx + c * dy};
}

namespace {

// Keeps the fields the mechanics set (mount, arm signs) and replaces the geometry.
void retangent(EndLayout& end, Vec2 pin, double radius, int sense, bool leaving_a, Vec2 pivot,
               int apply_sense) {
  const EndLayout t = tangent_end(pin, radius, sense, leaving_a);
  end.pin = pin;
  end.tangent_point = t.tangent_point;
  end.tangent_angle = t.tangent_angle;
  end.free_length = t.free_length;
  end.run_dir = t.run_dir;
  if (end.mount == Mount::lever) {
    end.arm = (pin.x - pivot.x) * t.run_dir.y - (pin.y - pivot.y) * t.run_dir.x;
    end.arm_applied = apply_sense * end.arm;
  }
}

}  // namespace

Layout released_layout(const Design& design, const Layout& applied) {
  Layout out = applied;
  const Vec2 pivot = design.lever.pivot;
  // The apply sense tightens the band; releasing turns the lever the other way.
  const double turn = -applied.apply_sense * applied.release_rotation;
  out.r_band = applied.r_band + design.band.clearance;
  const Vec2 pin_a = applied.a.mount == Mount::lever ? rotate_about(applied.a.pin, pivot, turn)
                                                     : applied.a.pin;
  const Vec2 pin_b = applied.b.mount == Mount::lever ? rotate_about(applied.b.pin, pivot, turn)
                                                     : applied.b.pin;
  retangent(out.a, pin_a, out.r_band, applied.sense, true, pivot, applied.apply_sense);
  retangent(out.b, pin_b, out.r_band, applied.sense, false, pivot, applied.apply_sense);
  out.wrap = wrap_between(out.a.tangent_angle, out.b.tangent_angle, out.sense);
  out.band_length = out.a.free_length + out.b.free_length + out.r_band * out.wrap;
  return out;
}

}  // namespace bandforge
