// Band-brake mechanics: REFERENCE.md §1.8 (layout), §1.1–1.4 and §1.11 (forces), §1.10 (reactions,
// travel), §2.1–2.3 (thermal). The hot path (solve_layout + solve_direction) allocates nothing
// unless it throws: a batch caller solves millions of layouts per second.
#include "src/mechanics.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>

#include "src/proportions.hpp"

namespace bandforge {
namespace {

constexpr double kPi = 3.14159265358979323846;
constexpr double kTwoPi = 2.0 * kPi;
constexpr double kDeg = kPi / 180.0;
/// Standard gravity (3rd CGPM, 1901) [m/s²].
constexpr double kGravity = 9.80665;
/// Wraps outside this band are degenerate: the runs would overlap or the band barely touches.
constexpr double kMinWrap = 5.0 * kDeg;
constexpr double kMaxWrap = 355.0 * kDeg;
/// Relative tolerance of the self-locking test (REFERENCE §1.8 implementation notes).
constexpr double kLockEps = 1e-9;
/// Hand-lever force: ≤ 350 N occasional, 150–250 N regular (REFERENCE §3, common practice).
constexpr double kHandForceLimit = check_limits::hand_force;
constexpr double kHandForceRegular = check_limits::hand_force_regular;
/// a_s ≥ 1.2·a_t·e^(f_max·φ) for a controllable differential brake (REFERENCE §1.7, common practice).
constexpr double kSelfLockMargin = check_limits::self_lock_margin;

Vec2 operator+(Vec2 a, Vec2 b) { return {a.x + b.x, a.y + b.y}; }
Vec2 operator-(Vec2 a, Vec2 b) { return {a.x - b.x, a.y - b.y}; }
Vec2 operator*(double k, Vec2 a) { return {k * a.x, k * a.y}; }
double cross(Vec2 a, Vec2 b) { return a.x * b.y - a.y * b.x; }
double dot(Vec2 a, Vec2 b) { return a.x * b.x + a.y * b.y; }
double norm(Vec2 a) { return std::sqrt(a.x * a.x + a.y * a.y); }  // not hypot: several times faster; no overflow at these sizes

int turn_sign(Turn t) { return t == Turn::ccw ? 1 : -1; }

// ---- message text (error paths and checks only) ----

std::string fmt(const char* format, double v) {
  char buf[64];
  std::snprintf(buf, sizeof buf, format, v);
  return buf;
}

std::string mm(double metres) { return fmt("%g mm", metres * 1000.0); }

std::string mm_point(Vec2 p) {
  std::string text = "[";  // appended piecewise: GCC 12 warns falsely on "[" + std::string
  text += mm(p.x);
  text += ", ";
  text += mm(p.y);
  text += "]";
  return text;
}

std::string degrees(double rad) { return fmt("%.1f°", rad / kDeg); }

std::string quoted(Turn t) { return std::string("\"") + to_string(t) + "\""; }

// ---- geometry ----

/// Polar angles of the two tangent points for band sense s (REFERENCE §1.8 step 2);
/// both pins must lie outside r_b.
struct TangentAngles {
  double a = 0;
  double b = 0;
};

TangentAngles tangent_angles(Vec2 pa, Vec2 pb, double r_b, int s) {
  const double alpha_a = std::acos(r_b / norm(pa));
  const double alpha_b = std::acos(r_b / norm(pb));
  return {std::atan2(pa.y, pa.x) + s * alpha_a, std::atan2(pb.y, pb.x) - s * alpha_b};
}

/// φ = mod(s·(β_B − β_A), 2π) in [0, 2π).
double wrap_of(TangentAngles t, int s) {
  double phi = std::fmod(s * (t.b - t.a), kTwoPi);
  if (phi < 0) phi += kTwoPi;
  return phi;
}

EndLayout end_layout(const BandEnd& end, double beta, double r_b, Vec2 pivot) {
  EndLayout e;
  e.mount = end.mount;
  e.pin = end.at;
  e.tangent_angle = beta;
  e.tangent_point = {r_b * std::cos(beta), r_b * std::sin(beta)};
  const Vec2 run = e.tangent_point - e.pin;
  e.free_length = norm(run);
  e.run_dir = (1.0 / e.free_length) * run;
  // A frame end reacts into the frame, not into the lever.
  e.arm = end.mount == Mount::lever ? cross(e.pin - pivot, e.run_dir) : 0.0;
  return e;
}

/// Orientation of c relative to the directed line a→b: > 0 left, < 0 right.
double orient(Vec2 a, Vec2 b, Vec2 c) { return cross(b - a, c - a); }

bool segments_cross(Vec2 p1, Vec2 p2, Vec2 q1, Vec2 q2) {
  const double o1 = orient(p1, p2, q1), o2 = orient(p1, p2, q2);
  const double o3 = orient(q1, q2, p1), o4 = orient(q1, q2, p2);
  return ((o1 > 0 && o2 < 0) || (o1 < 0 && o2 > 0)) && ((o3 > 0 && o4 < 0) || (o3 < 0 && o4 > 0));
}

Layout concept_layout(const Design& d) {
  const Concept& c = d.concept_arms;
  Layout L;
  L.from_pins = false;
  L.r = d.drum.diameter / 2;
  L.r_band = L.r;  // textbook arms: the band line is taken on the friction surface
  L.sense = turn_sign(d.band.sense);
  if (!(c.wrap >= kMinWrap && c.wrap <= kMaxWrap)) {
    design_fail(d, "concept.wrap", degrees(c.wrap),
                "the wrap angle must lie between 5° and 355° (270° is usual: Neale, The Tribology Handbook, section B8)");
  }
  if (!(c.handle_arm >= 1e-6)) {
    design_fail(d, "concept.handle_arm", mm(c.handle_arm),
                "the handle arm must be positive: the operator's force needs an arm about the pivot");
  }
  L.wrap = c.wrap;
  L.band_length = L.r_band * L.wrap;
  L.handle_arm = c.handle_arm;
  L.kind = c.kind;
  L.a.mount = c.kind == BrakeKind::simple ? Mount::frame : Mount::lever;  // simple: A at the pivot
  L.b.mount = Mount::lever;
  switch (c.kind) {
    case BrakeKind::simple:
      L.a.arm_applied = 0.0;
      L.b.arm_applied = -c.arm_b;
      break;
    case BrakeKind::differential:
      L.a.arm_applied = c.arm_a;  // A assists when tight
      L.b.arm_applied = -c.arm_b;
      break;
    case BrakeKind::summing:
      L.a.arm_applied = -c.arm_a;
      L.b.arm_applied = -c.arm_b;
      break;
  }
  L.a.arm = L.a.arm_applied;
  L.b.arm = L.b.arm_applied;
  // An arm_a larger than arm_b (differential) is legal: that brake self-locks and says so.
  if (std::abs(L.a.arm + L.b.arm) < 1e-6 * L.r) {
    design_fail(d, "concept.arm_b", mm(c.arm_b),
                "the net arm (arm_b minus the assisting arm_a) is zero: the lever would not "
                "tighten the band; make arm_b differ from arm_a");
  }
  return L;
}

// ---- the layout from the pins: one core, no throw, no allocation ----

/// Least distance of a pin centre outside the band line: the eye round the pin and the clearance.
double pin_room(const Design& d) { return d.band.pin_diameter / 2 + d.band.thickness + d.band.clearance; }

/// Gap between the eye round `e.pin` and the other end's straight run, and what it needs.
double eye_gap(const EndLayout& e, const EndLayout& other) {
  const Vec2 ab = other.tangent_point - other.pin, ap = e.pin - other.pin;
  const double len2 = ab.x * ab.x + ab.y * ab.y;
  const double u = std::clamp((ap.x * ab.x + ap.y * ab.y) / len2, 0.0, 1.0);
  return norm(ap - Vec2{u * ab.x, u * ab.y});
}
double eye_need(const Design& d) {
  return d.band.pin_diameter / 2 + 1.5 * d.band.thickness + d.band.clearance;
}
double ends_need(const Design& d) {
  return d.band.pin_diameter + 2 * d.band.thickness + d.band.clearance;
}

LayoutFault pin_layout_core(const Design& d, Layout& L) {
  const Band& band = d.band;
  L = Layout{};
  L.from_pins = true;
  L.r = d.drum.diameter / 2;
  L.r_band = L.r + d.lining.thickness + band.thickness / 2;
  L.sense = turn_sign(band.sense);
  const int s = L.sense;
  const Vec2 O = d.lever.pivot;

  if (band.end_a.mount == Mount::frame && band.end_b.mount == Mount::frame) return LayoutFault::both_on_frame;
  const double room = pin_room(d);
  for (int i = 0; i < 2; ++i) {
    const double dist = norm(i == 0 ? band.end_a.at : band.end_b.at);
    if (!(dist > L.r_band)) return i == 0 ? LayoutFault::pin_a_inside : LayoutFault::pin_b_inside;
    if (dist - L.r_band < room) return i == 0 ? LayoutFault::pin_a_close : LayoutFault::pin_b_close;
  }

  const TangentAngles beta = tangent_angles(band.end_a.at, band.end_b.at, L.r_band, s);
  L.wrap = wrap_of(beta, s);
  if (L.wrap < kMinWrap || L.wrap > kMaxWrap) return LayoutFault::wrap_range;

  L.a = end_layout(band.end_a, beta.a, L.r_band, O);
  L.b = end_layout(band.end_b, beta.b, L.r_band, O);
  L.band_length = L.a.free_length + L.b.free_length + L.r_band * L.wrap;

  if (segments_cross(L.a.pin, L.a.tangent_point, L.b.tangent_point, L.b.pin)) return LayoutFault::runs_cross;
  // An eye (pin radius + band thickness) may not cut through the other end's straight run.
  if (eye_gap(L.a, L.b) < eye_need(d)) return LayoutFault::eye_a_cuts_run;
  if (eye_gap(L.b, L.a) < eye_need(d)) return LayoutFault::eye_b_cuts_run;
  // The two band ends each wrap round their pin: they cannot pass through each other.
  if (norm(band.end_a.at - band.end_b.at) < ends_need(d)) return LayoutFault::ends_overlap;

  const double net = L.a.arm + L.b.arm;
  if (std::abs(net) < 1e-6 * L.r) return LayoutFault::zero_net_arm;
  const Vec2 arm_h = d.lever.handle - O;
  L.handle_arm = norm(arm_h);
  if (L.handle_arm < 1e-6) return LayoutFault::handle_at_pivot;

  // Path length falls by δψ·(m_A + m_B) for a CCW lever turn δψ (§1.8 step 8).
  L.apply_sense = net > 0 ? -1 : 1;
  L.a.arm_applied = L.apply_sense * L.a.arm;
  L.b.arm_applied = L.apply_sense * L.b.arm;
  L.force_dir = (L.apply_sense / L.handle_arm) * Vec2{-arm_h.y, arm_h.x};

  const double tiny = 1e-6 * L.r;
  const bool a_on = band.end_a.mount == Mount::lever && std::abs(L.a.arm) >= tiny;
  const bool b_on = band.end_b.mount == Mount::lever && std::abs(L.b.arm) >= tiny;
  if (!a_on || !b_on) {
    L.kind = BrakeKind::simple;
  } else if (L.a.arm_applied > 0 || L.b.arm_applied > 0) {
    L.kind = BrakeKind::differential;  // one end assists whenever it is the tight one
  } else {
    L.kind = BrakeKind::summing;
  }

  // Taking up a uniform radial clearance c shortens the path by about φ·c (§1.10).
  L.release_rotation = L.wrap * band.clearance / std::abs(net);
  L.handle_travel = L.handle_arm * L.release_rotation;
  return LayoutFault::none;
}

/// The message for a fault of pin_layout_core: names the key, the value and what would do.
[[noreturn]] void explain(const Design& d, const Layout& L, LayoutFault fault) {
  const Band& band = d.band;
  const auto pin_fault = [&](const BandEnd& end, const char* key, bool inside) {
    const double dist = norm(end.at);
    if (inside) {
      design_fail(d, key, mm_point(end.at),
                  "the pin is at or inside the band line: it is " + mm(dist) +
                      " from the drum centre, the band centreline radius r_b is " + mm(L.r_band) +
                      "; put the pin outside r_b + pin_diameter/2 + band thickness + clearance = " +
                      mm(L.r_band + pin_room(d)));
    }
    design_fail(d, key, mm_point(end.at),
                "the pin is too close for the band loop: its centre is " + mm(dist - L.r_band) +
                    " outside the band line (r_b = " + mm(L.r_band) +
                    "), it needs at least pin_diameter/2 + band thickness + clearance = " + mm(pin_room(d)));
  };
  const auto eye_fault = [&](const EndLayout& e, const EndLayout& other, const char* key) {
    const double gap = eye_gap(e, other), need = eye_need(d);
    design_fail(d, key, mm_point(e.pin),
                "the band end round this pin would cut the other end's straight run: it is " +
                    mm(gap) + " from that run, the eye and the clearance need " + mm(need) +
                    "; move " + key + " at least " + mm(need - gap) + " away from that run");
  };
  switch (fault) {
    case LayoutFault::none:
      break;
    case LayoutFault::both_on_frame:
      design_fail(d, "band.end_b.mount", "\"frame\"",
                  "both band ends are on the frame, so the lever cannot tighten the band; "
                  "put at least one end on the lever (mount = \"lever\")");
    case LayoutFault::pin_a_inside: pin_fault(band.end_a, "band.end_a.at", true);
      break;
    case LayoutFault::pin_b_inside: pin_fault(band.end_b, "band.end_b.at", true);
      break;
    case LayoutFault::pin_a_close: pin_fault(band.end_a, "band.end_a.at", false);
      break;
    case LayoutFault::pin_b_close: pin_fault(band.end_b, "band.end_b.at", false);
      break;
    case LayoutFault::wrap_range: {
      const Turn other = band.sense == Turn::ccw ? Turn::cw : Turn::ccw;
      const int s = turn_sign(band.sense);
      const double other_wrap =
          wrap_of(tangent_angles(band.end_a.at, band.end_b.at, L.r_band, -s), -s);
      if (other_wrap >= kMinWrap && other_wrap <= kMaxWrap) {
        design_fail(d, "band.sense", quoted(band.sense),
                    "with these pins the band would wrap " + degrees(L.wrap) +
                        " (it must be between 5° and 355°); sense = " + quoted(other) +
                        " gives a wrap of " + degrees(other_wrap));
      }
      design_fail(d, "band.end_b.at", mm_point(band.end_b.at),
                  "the pins give a wrap of " + degrees(L.wrap) + " (sense " + quoted(band.sense) +
                      ") or " + degrees(other_wrap) + " (sense " + quoted(other) +
                      "); move the pins so that the band wraps between 5° and 355°");
    }
    case LayoutFault::runs_cross:
      design_fail(d, "band.end_b.at", mm_point(band.end_b.at),
                  "the two straight band runs cross each other; move the pins so that each run "
                  "reaches the drum without crossing the other");
    case LayoutFault::eye_a_cuts_run: eye_fault(L.a, L.b, "band.end_a.at");
      break;
    case LayoutFault::eye_b_cuts_run: eye_fault(L.b, L.a, "band.end_b.at");
      break;
    case LayoutFault::ends_overlap: {
      const double apart = norm(band.end_a.at - band.end_b.at), need = ends_need(d);
      design_fail(d, "band.end_b.at", mm_point(band.end_b.at),
                  "the band ends round the two pins would overlap: the pins are " + mm(apart) +
                      " apart, two eyes (pin_diameter/2 + band thickness each) and the clearance "
                      "need at least " + mm(need) + "; move band.end_b.at at least " +
                      mm(need - apart) + " further from band.end_a.at");
    }
    case LayoutFault::zero_net_arm:
      design_fail(d, "lever.pivot", mm_point(d.lever.pivot),
                  "the lever does not tighten the band: the band-end moments about the pivot "
                  "cancel (net arm " + mm(L.a.arm + L.b.arm) +
                  "); move the pivot or a lever pin off that line");
    case LayoutFault::handle_at_pivot:
      design_fail(d, "lever.handle", mm_point(d.lever.handle),
                  "the handle is at the pivot: the operator's force has no arm; put the handle "
                  "away from lever.pivot " + mm_point(d.lever.pivot));
  }
  design_fail(d, "band", "", "internal: unexplained layout fault");
}

Layout pin_layout(const Design& d) {
  Layout L;
  const LayoutFault fault = pin_layout_core(d, L);
  if (fault != LayoutFault::none) explain(d, L, fault);
  return L;
}

/// Effective radius and capstan exponent factor of the tension model (§1.11).
struct Model {
  double r_eff;     ///< T = (P1 − P2)·r_eff
  double exponent;  ///< P1/P2 = e^(f·exponent)
};

Model model_of(const Layout& L, TensionModel m) {
  if (m == TensionModel::thick) return {L.r_band, L.wrap * L.r / L.r_band};
  return {L.r, L.wrap};
}

/// Torque at the band's allowable stress and at the lining pressure limit. A limit that is not
/// given (0) does not bound the torque.
Capacity capacity_at(const Design& d, const Layout& L, double f, TensionModel model) {
  const Model m = model_of(L, model);
  const double factor = m.r_eff * (1.0 - std::exp(-f * m.exponent));
  Capacity c;
  c.friction = f;
  c.torque_band = d.band.allowable_stress * d.band.width * d.band.thickness * factor;
  c.torque_pressure = d.lining.pressure_limit * d.band.width * L.r * factor;
  if (c.torque_band > 0 && c.torque_pressure > 0) {
    c.torque = std::min(c.torque_band, c.torque_pressure);
  } else {
    c.torque = std::max(c.torque_band, c.torque_pressure);
  }
  return c;
}

/// Largest bending moment in the lever, treated as a beam along pivot → handle. The sections
/// are the pivot and each lever pin (each weakened by a pin hole). The moment at a section is
/// that of the loads beyond it on the handle side; loads exactly at a section are counted on
/// either side and the larger result kept.
double lever_moment_from_pins(const Layout& L, double force, double p_a, double p_b,
                              Vec2 pivot, Vec2 handle, Vec2 pivot_reaction) {
  const Vec2 ax = (1.0 / L.handle_arm) * (handle - pivot);
  struct Load {
    Vec2 at;
    Vec2 force;
  };
  Load loads[4];
  int n = 0;
  loads[n++] = {handle, force * L.force_dir};
  loads[n++] = {pivot, pivot_reaction};
  if (L.a.mount == Mount::lever) loads[n++] = {L.a.pin, p_a * L.a.run_dir};
  if (L.b.mount == Mount::lever) loads[n++] = {L.b.pin, p_b * L.b.run_dir};

  double sections[3];
  int m = 0;
  sections[m++] = 0.0;
  if (L.a.mount == Mount::lever) sections[m++] = dot(L.a.pin - pivot, ax);
  if (L.b.mount == Mount::lever) sections[m++] = dot(L.b.pin - pivot, ax);

  double worst = 0.0;
  for (int i = 0; i < m; ++i) {
    const Vec2 at = pivot + sections[i] * ax;
    double beyond = 0.0, from = 0.0;
    for (int j = 0; j < n; ++j) {
      const double x = dot(loads[j].at - pivot, ax);
      const double moment = cross(loads[j].at - at, loads[j].force);
      if (x > sections[i]) beyond += moment;
      if (x >= sections[i]) from += moment;
    }
    worst = std::max({worst, std::abs(beyond), std::abs(from)});
  }
  return worst;
}

DirectionResult direction(const Design& d, const Layout& L, bool a_tight, double f,
                          TensionModel model) {
  DirectionResult R;
  R.a_tight = a_tight;
  R.friction = f;
  const Model m = model_of(L, model);
  const double e = std::exp(f * m.exponent);
  R.capstan_ratio = e;
  const double mt = a_tight ? L.a.arm_applied : L.b.arm_applied;
  const double ms = a_tight ? L.b.arm_applied : L.a.arm_applied;
  // Actuating moment per unit slack tension is −k (§1.8 step 9).
  const double k = e * mt + ms;
  const bool locks = k >= -kLockEps * std::abs(ms);
  double ps = 0.0, force = 0.0;
  if (d.load.given == Load::Given::torque) {
    R.torque = d.load.torque * d.load.service_factor;
    ps = R.torque / (m.r_eff * (e - 1.0));
    force = locks ? 0.0 : -ps * k / L.handle_arm;
  } else if (!locks) {
    force = d.load.lever_force;
    ps = force * L.handle_arm / -k;
    R.torque = ps * (e - 1.0) * m.r_eff;
  } else {
    // A self-locking brake grips as hard as the band allows whatever the operator does, so the
    // torque it holds is its capacity at this f (band stress or lining pressure, the smaller).
    R.torque = capacity_at(d, L, f, model).torque;
    ps = R.torque / (m.r_eff * (e - 1.0));
  }
  const double pt = e * ps;
  R.tension_tight = pt;
  R.tension_slack = ps;
  R.self_locking = locks;
  R.lever_force = force;
  R.actuating_moment = -ps * k;

  const double b = d.band.width, r = L.r;
  if (b > 0) {
    R.pressure_max = pt / (b * r);
    R.pressure_min = ps / (b * r);
    // Normal force N = T/(f·r) whichever model gives T.
    R.pressure_mean = R.torque / (f * b * r * r * L.wrap);
  }
  if (b > 0 && d.band.thickness > 0) R.band_stress = pt / (b * d.band.thickness);
  const double dp = d.band.pin_diameter;
  if (dp > 0) R.pin_shear = pt / (2.0 * kPi * dp * dp / 4.0);

  const double p_a = a_tight ? pt : ps;
  const double p_b = a_tight ? ps : pt;
  if (L.from_pins) {
    R.drum_load = -1.0 * (p_a * L.a.run_dir + p_b * L.b.run_dir);
    Vec2 on_lever = force * L.force_dir;
    if (L.a.mount == Mount::lever) on_lever = on_lever + p_a * L.a.run_dir;
    if (L.b.mount == Mount::lever) on_lever = on_lever + p_b * L.b.run_dir;
    R.pivot_reaction = -1.0 * on_lever;
    R.lever_moment = lever_moment_from_pins(L, force, p_a, p_b, d.lever.pivot, d.lever.handle,
                                            R.pivot_reaction);
  } else if (L.kind == BrakeKind::differential) {
    // The pins sit on both sides of the pivot and the figure does not say which side the
    // handle is on: the pivot section then carries the moment of the far-side end, which can
    // exceed F·L (tight end assists). Take the larger of the candidates.
    R.lever_moment = std::max({force * L.handle_arm, p_a * std::abs(L.a.arm_applied),
                               p_b * std::abs(L.b.arm_applied)});
  } else {
    // Simple and summing: the pivot section with the pins beyond it carries F·L, the most
    // anywhere on the lever.
    R.lever_moment = force * L.handle_arm;
  }
  const double w = d.lever.width, t = d.lever.thickness;
  if (w > 0 && t > 0 && w > dp) {
    const double z = t * (w * w * w - dp * dp * dp) / (6.0 * w);
    R.lever_stress = R.lever_moment / z;
  }
  return R;
}

// ---- solve(): checks and warnings ----

const char* end_name(bool a_tight) { return a_tight ? "A tight" : "B tight"; }

/// Drum rotation that makes end A (or B) tight: A is tight when the drum turns with the band sense.
Turn rotation_for(const Layout& L, bool a_tight) {
  const int w = a_tight ? L.sense : -L.sense;
  return w > 0 ? Turn::ccw : Turn::cw;
}

std::string case_note(const Layout& L, const DirectionResult& r) {
  return std::string(end_name(r.a_tight)) + " (drum " + to_string(rotation_for(L, r.a_tight)) +
         "), f = " + fmt("%g", r.friction);
}

// The cases a strength check must cover. With [load] torque the requirement is the torque in the
// design rotation, so the reverse direction's forces (the same torque the other way, needing
// e^(fφ) times the operator force) are hypothetical: they are reported and warned about, not
// checked. With [load] lever_force the same hand force acts in either rotation, so both are real.
enum class Scope { design_rotation, both_rotations };

template <class Field>
const DirectionResult& worst_case(const Solution& s, Scope scope, Field field) {
  const int primary = s.primary_a_tight ? 0 : 1;
  const DirectionResult* worst = &s.results[primary][0];
  for (int dir = 0; dir < 2; ++dir) {
    if (scope == Scope::design_rotation && dir != primary) continue;
    for (const auto& r : s.results[dir])
      if (field(r) > field(*worst)) worst = &r;
  }
  return *worst;
}


std::string or_default(const std::string& s, const char* fallback) {
  return s.empty() ? std::string(fallback) : s;
}

Thermal thermal_of(const Design& d, const Layout& layout, double primary_torque) {
  Thermal th;
  const Duty& duty = d.duty;
  if (!duty.present) return th;
  th.present = true;
  const bool hoist = duty.hoist_mass > 0;
  if (hoist) {
    // §2.1: the brake absorbs the potential energy over the stop as well as the kinetic energy.
    const double omega = duty.rope_radius > 0 ? duty.hoist_speed / duty.rope_radius : 0.0;
    th.energy = duty.hoist_mass * kGravity * duty.stop_distance +
                0.5 * duty.hoist_mass * duty.hoist_speed * duty.hoist_speed +
                0.5 * duty.inertia * omega * omega;
    th.stop_time = duty.hoist_speed > 0 ? 2.0 * duty.stop_distance / duty.hoist_speed : 0.0;
    const double theta = omega * th.stop_time / 2.0;
    th.hoist_torque = theta > 0 ? th.energy / theta : 0.0;
  } else {
    th.energy = 0.5 * duty.inertia * duty.speed * duty.speed;
    const double torque = primary_torque;
    th.stop_time = torque > 0 ? duty.inertia * duty.speed / torque : 0.0;
  }
  th.rim_mass = drum_rim_mass(d);
  const double heat_capacity = th.rim_mass * d.drum.specific_heat;
  th.temperature_rise = heat_capacity > 0 ? th.energy / heat_capacity : 0.0;
  th.peak_temperature = duty.ambient + th.temperature_rise;
  th.lining_area = d.band.width * layout.r * layout.wrap;
  if (th.stop_time > 0 && th.lining_area > 0) {
    th.power_density_mean = th.energy / (th.stop_time * th.lining_area);
    th.power_density_peak = 2.0 * th.power_density_mean;  // uniform deceleration (§2.3)
  }
  th.mean_power = th.energy * duty.stops_per_hour / 3600.0;
  return th;
}

void add_checks(const Design& d, Solution& s) {
  const Layout& L = s.layout;
  const bool torque_mode = d.load.given == Load::Given::torque;
  const Scope scope = torque_mode ? Scope::design_rotation : Scope::both_rotations;

  if (d.lining.pressure_limit > 0) {
    const auto& w = worst_case(s, scope, [](const DirectionResult& r) { return r.pressure_max; });
    s.checks.push_back(make_check("lining_pressure", "Lining pressure at the tight end",
                                  w.pressure_max, d.lining.pressure_limit, "Pa", true,
                                  or_default(d.lining.pressure_source, "design file [lining] pressure_limit"),
                                  case_note(L, w)));
  }
  if (d.band.allowable_stress > 0 && d.band.thickness > 0) {
    const auto& w = worst_case(s, scope, [](const DirectionResult& r) { return r.band_stress; });
    s.checks.push_back(make_check("band_stress", "Band tensile stress, gross section",
                                  w.band_stress, d.band.allowable_stress, "Pa", true,
                                  "design file [band] allowable_stress", case_note(L, w)));
  }
  if (d.band.pin_diameter > 0) {
    // The reader fills in the default allowable_stress/√3; repeat it for hand-built designs.
    const double limit = d.band.pin_allowable_shear > 0 ? d.band.pin_allowable_shear
                                                        : d.band.allowable_stress / std::sqrt(3.0);
    const auto& w = worst_case(s, scope, [](const DirectionResult& r) { return r.pin_shear; });
    s.checks.push_back(make_check("pin_shear", "Tight-end pin, double shear", w.pin_shear, limit,
                                  "Pa", true,
                                  "design file [band] pin_allowable_shear (default "
                                  "allowable_stress/√3, shear yield by von Mises)",
                                  case_note(L, w)));
  }
  if (d.lever.allowable_stress > 0 && d.lever.width > 0 && d.lever.thickness > 0) {
    const auto& w = worst_case(s, scope, [](const DirectionResult& r) { return r.lever_stress; });
    s.checks.push_back(make_check("lever_bending", "Lever bending, net section at a pin hole",
                                  w.lever_stress, d.lever.allowable_stress, "Pa", true,
                                  "design file [lever] allowable_stress", case_note(L, w)));
  }
  if (torque_mode) {
    const Capacity& c = s.capacity;
    const bool band_governs =
        c.torque_band > 0 && (c.torque_pressure <= 0 || c.torque_band <= c.torque_pressure);
    s.checks.push_back(make_check(
        "torque_capacity", "Required torque × service factor within capacity", s.required_torque,
        c.torque, "N·m", true, "band allowable stress and lining pressure limit at f_min",
        std::string(band_governs ? "band stress" : "lining pressure") + " governs, f = " +
            fmt("%g", c.friction)));
  }
  if (d.apply.by == ApplyBy::hand) {  // a weight or a spring: src/apply.cpp checks its moment
    const DirectionResult& r = s.results[s.primary_a_tight ? 0 : 1][0];
    s.checks.push_back(make_check(
        "hand_force", "Operator force at the handle", r.lever_force, kHandForceLimit, "N", true,
        "common practice, no source: 150–250 N regular, up to ~350 N occasional",
        case_note(L, r)));
  }
  if (L.kind == BrakeKind::differential) {
    // The direction whose tight end assists is the one that can self-lock.
    const bool a_assists = L.a.arm_applied > 0;
    const DirectionResult& r = s.results[a_assists ? 0 : 1][2];
    const double at = a_assists ? L.a.arm_applied : L.b.arm_applied;
    const double as = -(a_assists ? L.b.arm_applied : L.a.arm_applied);
    s.checks.push_back(make_check(
        "self_lock_margin", "Differential: slack arm over tight arm × e^(f_max·φ)",
        as / (at * r.capstan_ratio), kSelfLockMargin, "1", false,
        "common practice, no source: a_s ≥ 1.2…1.5 × a_t·e^(f_max·φ) for a controllable differential brake",
        case_note(L, r)));
  }
  if (L.from_pins) {
    s.checks.push_back(make_check(
        "release_rotation", "Lever rotation to take up the release clearance", L.release_rotation,
        check_limits::release_rotation, "rad", true,
        "common practice, no source: the layout is solved in the applied position; a lever that "
        "turns more than about 10° to release barely tightens the band (small net arm)",
        "δψ = φ·c/|m_A + m_B|"));
  }
  const Thermal& th = s.thermal;
  if (th.present && d.duty.hoist_mass > 0) {
    const double holding = d.duty.hoist_mass * kGravity * d.duty.rope_radius;
    const double design_torque =
        torque_mode ? s.required_torque : s.results[s.primary_a_tight ? 0 : 1][0].torque;
    s.checks.push_back(make_check("hoist_torque", "Brake torque holds the hoist load",
                                  design_torque, holding, "N·m", false,
                                  "statics: holding torque m·g·r_rope",
                                  torque_mode ? "required torque × service factor"
                                              : case_note(L, s.results[s.primary_a_tight ? 0 : 1][0])));
  }
  if (th.present && d.lining.temperature_limit > 0) {
    s.checks.push_back(make_check("temperature", "Drum temperature after one stop",
                                  th.peak_temperature, d.lining.temperature_limit, "°C", true,
                                  or_default(d.lining.temperature_source, "design file [lining]"),
                                  "ambient " + fmt("%g", d.duty.ambient) + " °C + ΔT per stop"));
  }
  if (th.present && d.lining.power_limit > 0) {
    s.checks.push_back(make_check("power_density", "Power per lining area, start of stop",
                                  th.power_density_peak, d.lining.power_limit, "W/m²", true,
                                  or_default(d.lining.power_source, "design file [lining]"),
                                  "2 × mean over a uniform stop"));
  }
}

void add_warnings(const Design& d, Solution& s) {
  const Layout& L = s.layout;
  const bool torque_mode = d.load.given == Load::Given::torque;
  for (int dir = 0; dir < 2; ++dir) {
    for (const auto& r : s.results[dir]) {
      if (!r.self_locking) continue;
      s.warnings.push_back(std::string(end_name(r.a_tight)) + " (drum " +
                           to_string(rotation_for(L, r.a_tight)) + "): self-locking at f = " +
                           fmt("%g", r.friction) +
                           ": the band applies itself and the lever cannot control or release it "
                           "under load");
      break;  // the lowest f that locks is enough
    }
  }
  const DirectionResult& prim = s.results[s.primary_a_tight ? 0 : 1][0];
  if (d.apply.by == ApplyBy::hand && prim.lever_force > kHandForceRegular) {
    s.warnings.push_back("operator force " + fmt("%.0f N", prim.lever_force) + " (" +
                         case_note(L, prim) +
                         ") is above the 250 N a hand gives regularly (common practice, "
                         "no source)");
  }
  const DirectionResult& p = s.primary();
  const DirectionResult& q = s.nominal(!s.primary_a_tight);
  if (torque_mode && !p.self_locking && !q.self_locking && p.lever_force > 0 &&
      q.lever_force > 2.0 * p.lever_force) {
    s.warnings.push_back("reverse rotation (" + std::string(end_name(q.a_tight)) +
                         ") needs " + fmt("%.2g", q.lever_force / p.lever_force) +
                         "× the lever force (" + fmt("%.0f N", q.lever_force) +
                         " at nominal f): check reverse loads (hoisting against the brake, wind)");
  }
  if (!torque_mode && !p.self_locking && !q.self_locking && p.torque > 0 &&
      q.torque < 0.5 * p.torque) {
    s.warnings.push_back("reverse rotation (" + std::string(end_name(q.a_tight)) +
                         ") holds only " + fmt("%.2g", q.torque / p.torque) +
                         "× the torque at the same lever force: check reverse loads");
  }
  if (L.from_pins && d.band.model == TensionModel::thin && L.r_band > L.r) {
    const DirectionResult thick =
        direction(d, L, s.primary_a_tight, p.friction, TensionModel::thick);
    const double base = torque_mode ? p.lever_force : p.torque;
    const double alt = torque_mode ? thick.lever_force : thick.torque;
    if (base > 0 && std::abs(alt / base - 1.0) > 0.02) {
      s.warnings.push_back(
          "the band's line of action is " + mm(L.r_band - L.r) +
          " outside the friction surface: the thick-band model (band model = \"thick\", "
          "tension at r_b, friction at r) changes the " + (torque_mode ? "lever force" : "torque") + " by " +
          fmt("%+.1f %%", 100.0 * (alt / base - 1.0)));
    }
  }
}

}  // namespace

Layout solve_layout(const Design& design) {
  return design.concept_arms.present ? concept_layout(design) : pin_layout(design);
}

LayoutFault try_pin_layout(const Design& design, Layout& layout) {
  return pin_layout_core(design, layout);
}

Thermal solve_thermal(const Design& design, const Layout& layout, double primary_torque) {
  return thermal_of(design, layout, primary_torque);
}

DirectionResult solve_direction(const Design& design, const Layout& layout, bool a_tight,
                                double friction) {
  return direction(design, layout, a_tight, friction, design.band.model);
}

double drum_rim_mass(const Design& design) {
  const double D = design.drum.diameter;
  const double inner = D - 2.0 * drum_proportions(design.drum).rim_thickness;
  return design.drum.density * kPi / 4.0 * (D * D - inner * inner) * design.drum.width;
}

Solution solve(const Design& design) {
  Solution s;
  s.layout = solve_layout(design);
  const Layout& L = s.layout;
  const Lining& lin = design.lining;
  // A range not given collapses onto the nominal value.
  const double f[3] = {lin.friction_min > 0 ? lin.friction_min : lin.friction, lin.friction,
                       lin.friction_max > 0 ? lin.friction_max : lin.friction};
  for (int dir = 0; dir < 2; ++dir)
    for (int k = 0; k < 3; ++k) s.results[dir][k] = solve_direction(design, L, dir == 0, f[k]);

  s.primary_a_tight = turn_sign(design.drum.rotation) == L.sense;
  if (design.load.given == Load::Given::torque) {
    s.required_torque = design.load.torque * design.load.service_factor;
  } else {
    s.given_force = design.load.lever_force;
  }

  // f_crit = ln(a_s/a_t)/φ_eff for a direction whose tight end assists (§1.7).
  const Model m = model_of(L, design.band.model);
  for (int dir = 0; dir < 2; ++dir) {
    const double mt = dir == 0 ? L.a.arm_applied : L.b.arm_applied;
    const double ms = dir == 0 ? L.b.arm_applied : L.a.arm_applied;
    if (!(mt > 0)) continue;
    const double fc = ms < 0 ? std::max(0.0, std::log(-ms / mt) / m.exponent) : 0.0;
    if (!s.self_lock_friction || fc < *s.self_lock_friction) s.self_lock_friction = fc;
  }

  s.capacity = capacity_at(design, L, f[0], design.band.model);
  s.thermal = thermal_of(design, s.layout, s.primary().torque);
  add_checks(design, s);
  // What bandforge adds by itself (brackets, end joints), with its own checks.
  s.hardware = plan_hardware(design, s);
  s.checks.insert(s.checks.end(), s.hardware.checks.begin(), s.hardware.checks.end());
  // How the brake is applied (REFERENCE §8) and the hoist rules (§7): src/apply.cpp.
  s.apply = solve_apply(design, s);
  s.checks.insert(s.checks.end(), s.apply.checks.begin(), s.apply.checks.end());
  add_warnings(design, s);
  s.warnings.insert(s.warnings.end(), s.apply.warnings.begin(), s.apply.warnings.end());
  return s;
}

}  // namespace bandforge
