// Applying the brake by a weight or a compression spring: REFERENCE §8.1 (lever statics, release
// actuator), §8.2 (the spring, src/spring.cpp), §1.10 (lever rotation from a radial gap),
// §7 (hoist rules).
//
// Method. The lever is solved in the applied position (src/mechanics.cpp). A uniform radial
// lining wear w shortens the band path by φ·w, as the release clearance c does (§1.10), so the
// worn position is the lever turned further in the applying sense by δψ_w = φ·w/|m_A + m_B|; the
// released position is the lever turned back by the release rotation δψ = φ·c/|m_A + m_B|. The
// band forces are those of the applied layout at all three positions (small rotations). Gravity
// acts along −y of the front view.
#include "src/apply.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <iterator>
#include <limits>

#include "src/hardware.hpp"
#include "src/materials.hpp"
#include "src/mechanics.hpp"

namespace bandforge {
namespace {

constexpr double kPi = 3.14159265358979323846;
/// Standard gravity (3rd CGPM, 1901) [m/s²].
constexpr double kGravity = 9.80665;
/// 29 CFR 1910.179(f)(2)(i): holding torque ≥ 125 % of the full-load hoisting torque.
constexpr double kHoistHoldingFactor = 1.25;

Vec2 operator+(Vec2 a, Vec2 b) { return {a.x + b.x, a.y + b.y}; }
Vec2 operator-(Vec2 a, Vec2 b) { return {a.x - b.x, a.y - b.y}; }
Vec2 operator*(double k, Vec2 a) { return {k * a.x, k * a.y}; }
double cross(Vec2 a, Vec2 b) { return a.x * b.y - a.y * b.x; }
double dot(Vec2 a, Vec2 b) { return a.x * b.x + a.y * b.y; }
double norm(Vec2 a) { return std::sqrt(a.x * a.x + a.y * a.y); }

Vec2 rotate_about(Vec2 p, Vec2 centre, double angle) {
  const double c = std::cos(angle), s = std::sin(angle);
  const Vec2 v = p - centre;
  return centre + Vec2{c * v.x - s * v.y, s * v.x + c * v.y};
}

std::string fmt(const char* format, double v) {
  char buf[96];
  std::snprintf(buf, sizeof buf, format, v);
  return buf;
}
std::string mm(double metres) { return fmt("%.1f mm", metres * 1000.0); }

/// Counter-clockwise convex hull (Andrew's monotone chain), collinear points dropped.
std::vector<Vec2> hull(std::vector<Vec2> p) {
  std::sort(p.begin(), p.end(), [](Vec2 a, Vec2 b) { return a.x < b.x || (a.x == b.x && a.y < b.y); });
  if (p.size() < 2) return p;
  std::vector<Vec2> h(2 * p.size());
  std::size_t k = 0;
  for (std::size_t i = 0; i < p.size(); ++i) {
    while (k >= 2 && cross(h[k - 1] - h[k - 2], p[i] - h[k - 2]) <= 0) --k;
    h[k++] = p[i];
  }
  for (std::size_t i = p.size() - 1, t = k + 1; i-- > 0;) {
    while (k >= t && cross(h[k - 1] - h[k - 2], p[i] - h[k - 2]) <= 0) --k;
    h[k++] = p[i];
  }
  h.resize(k - 1);
  return h;
}

/// Area and centroid of the convex hull of `points` grown by `radius` (a plate outline): the
/// polygon, a strip of width `radius` along each edge, a circular sector at each corner.
struct AreaMoment {
  double area = 0;
  Vec2 first;  ///< ∫ (x, y) dA
};

AreaMoment grown_hull(const std::vector<Vec2>& points, double radius) {
  const std::vector<Vec2> h = hull(points);
  AreaMoment out;
  const std::size_t n = h.size();
  if (n == 1) {
    out.area = kPi * radius * radius;
    out.first = out.area * h[0];
    return out;
  }
  for (std::size_t i = 0; n >= 3 && i < n; ++i) {  // shoelace
    const Vec2 a = h[i], b = h[(i + 1) % n];
    const double c = cross(a, b);
    out.area += c / 2;
    out.first = out.first + (c / 6) * (a + b);
  }
  auto normal = [&](std::size_t i) {  // outward normal of edge i → i+1 of a ccw polygon
    const Vec2 e = h[(i + 1) % n] - h[i];
    return (1.0 / norm(e)) * Vec2{e.y, -e.x};
  };
  for (std::size_t i = 0; i < n; ++i) {
    const Vec2 a = h[i], b = h[(i + 1) % n];
    const Vec2 nrm = normal(i);
    const double strip = norm(b - a) * radius;
    out.area += strip;
    out.first = out.first + strip * (0.5 * (a + b) + (radius / 2) * nrm);
    // The corner at b: the sector between this edge's normal and the next edge's.
    const Vec2 next = normal((i + 1) % n);
    // The exterior angle of a convex ccw outline lies in (0, π]; |cross| keeps the half-turn at
    // the end of a two-point outline (a straight lever) from reading as −π.
    const double theta = std::atan2(std::abs(cross(nrm, next)), dot(nrm, next));
    const double sector = radius * radius * theta / 2;
    const Vec2 bisector = rotate_about(nrm, {0, 0}, theta / 2);
    const double reach = theta > 0 ? 4 * radius * std::sin(theta / 2) / (3 * theta) : 0.0;
    out.area += sector;
    out.first = out.first + sector * (b + reach * bisector);
  }
  return out;
}

/// Signed moment arm, applying sense positive, of a unit force along `dir` at `p` about `pivot`.
double arm_of(Vec2 p, Vec2 dir, Vec2 pivot, int apply_sense) {
  return apply_sense * cross(p - pivot, dir);
}

const Vec2 kDown{0.0, -1.0};  // gravity in the front view

std::string case_text(bool a_tight, double f) {
  return std::string(a_tight ? "A tight" : "B tight") + ", f = " + fmt("%g", f);
}

/// The hoist rules (REFERENCE §7) for any applying element.
void hoist_checks(const Design& d, ApplyResult& r) {
  const Duty& du = d.duty;
  if (!du.present || !(du.hoist_mass > 0)) return;
  if (du.drive == HoistDrive::manual) {
    if (r.by == ApplyBy::hand) {
      r.warnings.push_back(
          "manual hoist with a hand-applied brake: a ratchet and pawl or a self-locking backstop "
          "must hold the load when the operator lets go (REFERENCE §7, common practice, no source)");
    }
    return;
  }
  const bool self_setting = r.by != ApplyBy::hand;
  const std::string drive = du.drive == HoistDrive::powered
                                ? "powered hoist"
                                : "hoist taken as powered ([duty] drive not given)";
  r.checks.push_back(make_check(
      "self_setting", "Hoist holding brake applied automatically when power is removed",
      self_setting ? 1.0 : 0.0, 1.0, "1", false,
      "29 CFR 1910.179(f)(2): holding brakes \"shall be applied automatically when power is "
      "removed\"",
      self_setting ? drive + ", applied by " + to_string(r.by)
                   : drive + ", applied by hand: give [apply] by = \"spring\" or \"weight\" (or "
                             "[duty] drive = \"manual\" for a hand-operated hoist)"));
  const double hoisting = du.hoist_mass * kGravity * du.rope_radius;
  r.checks.push_back(make_check(
      "hoist_holding", "Holding torque at least 125 % of the full-load hoisting torque",
      r.holding_torque, kHoistHoldingFactor * hoisting, "N·m", false,
      "29 CFR 1910.179(f)(2)(i): at least 125 % of the full-load hoisting torque at the brake "
      "(control braking other than mechanical; 100 % with mechanical control braking or two "
      "holding brakes)",
      "hoisting torque m·g·r_rope = " + fmt("%.1f N·m", hoisting) + "; holding torque " +
          (r.present ? std::string("of the applying element at the worn position, f_min")
                     : std::string(d.load.given == Load::Given::torque
                                       ? "required torque × service factor"
                                       : "at the given lever force, f_min"))));
}

/// The largest moment about the pivot the band and the lining take when the applying element
/// grips and the drum slips: the worst case over both rotations and the friction range of the
/// band allowable stress and the lining pressure limit (infinite when neither is given).
double moment_limit(const Design& d, const Solution& s) {
  double limit = std::numeric_limits<double>::infinity();
  for (int dir = 0; dir < 2; ++dir) {
    for (const DirectionResult& x : s.results[dir]) {
      if (x.self_locking || !(x.actuating_moment > 0)) continue;
      if (d.band.allowable_stress > 0 && x.band_stress > 0)
        limit = std::min(limit, x.actuating_moment * d.band.allowable_stress / x.band_stress);
      if (d.lining.pressure_limit > 0 && x.pressure_max > 0)
        limit = std::min(limit, x.actuating_moment * d.lining.pressure_limit / x.pressure_max);
    }
  }
  return limit;
}

/// What the relaxation of a spring refusal is, with the design key and the amount.
std::string spring_refusal(const Design& d, const ApplyResult& r, const SpringDemand& q) {
  const SpringResult& s = r.spring;
  const std::string od = "apply.spring_max_outer_diameter";
  switch (s.binding) {
    case SpringLimit::none:
      return "";
    case SpringLimit::band:
      return "the band and the lining cannot take, at f_max with the lining new, even the force "
             "the spring must keep at the worn position (" + fmt("%.2f", s.needed) + "× too much): "
             "give a smaller apply.wear_allowance, or a wider band (band.width) or a lining with a "
             "narrower friction range";
    case SpringLimit::material:
      return "no wire diameter of the series lies in the size range of \"" + q.material +
             "\"; choose another apply.spring_material";
    case SpringLimit::diameter:
      return "not even the smallest spring (index 4 on the thinnest wire) fits the outer diameter "
             "limit: raise " + od + " to at least " + mm(s.needed);
    case SpringLimit::strength: {
      std::string text = "no " + q.material + " wire within the limits carries the released force " +
                         "at the allowable stress (Shigley 9th ed. Table 10-6): the force must fall " +
                         fmt("%.2f", s.needed) + "×; move apply.at at least " +
                         mm(r.worn.arm * (s.needed - 1.0)) +
                         " further from the pivot (a longer arm)";
      if (q.max_outer_diameter > 0 && s.needed_diameter > 0) {
        text += ", or raise " + od + " to at least " + mm(s.needed_diameter);
      }
      return text + ", or choose a stronger apply.spring_material";
    }
    case SpringLimit::solid:
      return "the coils do not fit between apply.at and apply.seat (installed length " +
             mm(q.installed_length) + "): the fractional overrun to closure would fall below 0.15 "
             "(Shigley 9th ed. §10-9); move apply.seat at least " + mm(s.needed) +
             " further from apply.at along the spring's axis";
    case SpringLimit::buckling:
      if (s.needed > 0) {
        return "every spring that fits would buckle (free length above 2.63·D/α, Shigley 9th ed. "
               "eq. 10-13); move apply.seat at least " + mm(s.needed) +
               " closer to apply.at, or give apply.spring_seats = \"flat-flat\", or guide the spring";
      }
      return "every spring that fits would buckle (free length above 2.63·D/α, Shigley 9th ed. "
             "eq. 10-13); give apply.spring_seats = \"flat-flat\"" +
             (q.max_outer_diameter > 0 ? ", raise " + od : std::string()) +
             ", or guide the spring on a rod";
  }
  (void)d;
  return "";
}

void spring_checks(const ApplyResult& r, const Design& d, std::vector<Check>& out) {
  const SpringResult& s = r.spring;
  const std::string spec = fmt("d = %.2f mm", s.wire_diameter * 1000) +
                           fmt(", D = %.1f mm", s.mean_diameter * 1000) + ", " + s.material;
  out.push_back(make_check("spring_stress", "Spring shear stress at the released position",
                           s.released.stress, s.allowable, "Pa", true,
                           find_spring_wire(s.material)->allowable_source,
                           "τ = K_B·8·F·D/(π·d³) at F_released = " +
                               fmt("%.0f N", s.released.force) + "; " + spec));
  out.push_back(make_check("spring_index", "Spring index C = D/d, at most 12", s.index,
                           spring_limits::index_max, "1", true,
                           "Shigley's Mechanical Engineering Design, 9th ed., §10-9: 4 ≤ C ≤ 12",
                           spec));
  out.push_back(make_check("spring_index_min", "Spring index C = D/d, at least 4", s.index,
                           spring_limits::index_min, "1", false,
                           "Shigley's Mechanical Engineering Design, 9th ed., §10-9: 4 ≤ C ≤ 12",
                           spec));
  out.push_back(make_check(
      "spring_overrun", "Spring fractional overrun to closure at the released position",
      s.overrun, spring_limits::overrun_min, "1", false,
      "Shigley's Mechanical Engineering Design, 9th ed., §10-9: ξ ≥ 0.15",
      "ξ = (L_0 − L_s)/(L_0 − L_released) − 1"));
  out.push_back(make_check("spring_buckling", "Spring free length within the buckling limit",
                           s.free_length, s.buckling_length, "m", true,
                           "Shigley's Mechanical Engineering Design, 9th ed., eq. 10-13: "
                           "L_0 < 2.63·D/α (steel)",
                           std::string("α = ") + fmt("%g", s.alpha) + " (spring_seats = \"" +
                               to_string(d.apply.spring_seats) + "\")"));
  if (d.apply.spring_max_outer_diameter > 0) {
    out.push_back(make_check("spring_outer_diameter", "Spring outer diameter within the room",
                             s.outer_diameter, d.apply.spring_max_outer_diameter, "m", true,
                             "design file [apply] spring_max_outer_diameter", spec));
  }
}

/// The lever plate's outline: the handle and the lever's holes, grown by half its width.
std::vector<Vec2> lever_centres(const Design& d, const Solution& s) {
  std::vector<Vec2> points{d.lever.handle};
  for (const PinPlan& p : s.hardware.pins) {
    if (p.on_lever) points.push_back(p.at);
  }
  return points;
}

/// First distance s ≥ 0 along the unit `dir` from `p` at which the plate's signed distance
/// crosses zero going from `outside` (true: from outside in; false: from inside out); −1 when the
/// line never does within `reach`. The signed distance is convex along a line, so sampling finer
/// than the plate's half width and bisecting finds the crossing.
double along_to_edge(Vec2 p, Vec2 dir, const std::vector<Vec2>& centres, double radius, double reach,
                     bool outside) {
  auto f = [&](double t) {
    const double v = distance_to_plate(p + t * dir, centres, radius);
    return outside ? v : -v;
  };
  const double step = radius / 4;
  double lo = 0;
  for (double t = step; t <= reach + step; t += step) {
    if (f(t) <= 0) {
      double hi = t;
      for (int i = 0; i < 60; ++i) {
        const double mid = (lo + hi) / 2;
        (f(mid) <= 0 ? hi : lo) = mid;
      }
      return hi;
    }
    lo = t;
  }
  return -1;
}

std::string point_text(Vec2 p) {
  return "[\"" + fmt("%.1f", p.x * 1000) + " mm\", \"" + fmt("%.1f", p.y * 1000) + " mm\"]";
}

SeatPlan seat_for(const SpringResult& sp, Vec2 face, Vec2 normal, double shortest) {
  using namespace mount_rules;
  SeatPlan st;
  st.face = face;
  st.normal = normal;
  const double od = sp.outer_diameter, id = sp.mean_diameter - sp.wire_diameter;
  st.diameter = od + 2 * std::max(seat_rim_min, seat_rim_fraction * od);
  st.thickness = seat_series[std::size(seat_series) - 1];
  for (double t : seat_series) {
    if (t >= seat_rim_fraction * od - 1e-12) {
      st.thickness = t;
      break;
    }
  }
  st.spigot_diameter = id - std::max(0.001, 0.05 * id);
  st.spigot_height = std::min(2 * sp.wire_diameter, 0.2 * shortest);
  return st;
}

/// Seats for the spring, or the weight's hanger and block, where the design file puts them.
ElementMount plan_mount(const Design& d, const Solution& s, const ApplyResult& r) {
  ElementMount m;
  const Apply& ap = d.apply;
  if (!r.present || !s.hardware.present) return m;
  const std::vector<Vec2> centres = lever_centres(d, s);
  const double half = d.lever.width / 2;
  double reach = 0;
  for (Vec2 c : centres) reach = std::max(reach, norm(c - ap.at) + half);
  if (ap.by == ApplyBy::spring) {
    if (!r.spring.found) return m;
    m.present = true;
    const Vec2 u = (1.0 / norm(ap.seat - ap.at)) * (ap.seat - ap.at);  // lever → frame
    const SpringResult& sp = r.spring;
    const double shortest = sp.released.length;
    m.frame_seat = seat_for(sp, ap.seat, u, shortest);
    m.lever_seat = seat_for(sp, ap.at, {0.0 - u.x, 0.0 - u.y}, shortest);
    if (distance_to_plate(ap.at, centres, half) <= 0) {
      const double out = along_to_edge(ap.at, u, centres, half, reach, false);
      m.refusal = "apply.at = " + point_text(ap.at) + " lies inside the lever plate, where the "
                  "spring's end cannot seat: put it on the lever's edge along the spring's axis, "
                  "at " + point_text(ap.at + out * u) + " or further out (the force line and its "
                  "arm stay the same; the spring is then designed for the shorter length)";
      return m;
    }
    const double edge = along_to_edge(ap.at, -1.0 * u, centres, half, reach, true);
    if (edge < 0) {
      m.refusal = "the spring's axis apply.seat → apply.at does not meet the lever plate behind "
                  "apply.at = " + point_text(ap.at) + ": nothing would carry its seat; put "
                  "apply.at over the lever (lever.width " + mm(d.lever.width) + " about the "
                  "handle and the lever's pins)";
      return m;
    }
    // Across the seat the lever's edge may come closer than on the axis (a slanting or rounded
    // edge): the least distance behind the face over the seat's width, negative where the lever
    // stands in front of it.
    const Vec2 n{-u.y, u.x};
    double least = edge;
    for (int i = -10; i <= 10; ++i) {
      const Vec2 p = ap.at + (m.lever_seat.diameter / 2 * i / 10.0) * n;
      if (distance_to_plate(p, centres, half) <= 0) {
        least = std::min(least, -along_to_edge(p, u, centres, half, reach, false));
      } else {
        const double e = along_to_edge(p, -1.0 * u, centres, half, reach, true);
        if (e >= 0) least = std::min(least, e);
      }
    }
    if (least < mount_rules::seat_bridge && edge >= mount_rules::seat_bridge) {
      m.refusal = "the lever's edge comes within " + mm(std::max(0.0, least)) + " of the spring's "
                  "seat face at apply.at = " + point_text(ap.at) + " (Ø" + mm(m.lever_seat.diameter) +
                  " seat; the edge slants or rounds across it); the seat plate needs at least " +
                  mm(mount_rules::seat_bridge) + ": move apply.at (and apply.seat with it) at least " +
                  mm(mount_rules::seat_bridge - least) + " further from the lever along the axis";
      return m;
    }
    if (edge < mount_rules::seat_bridge) {
      m.refusal = "apply.at = " + point_text(ap.at) + " is " + mm(edge) + " from the lever's "
                  "edge along the spring's axis; the seat plate between them needs at least " +
                  mm(mount_rules::seat_bridge) + ": move apply.at (and apply.seat with it) at "
                  "least " + mm(mount_rules::seat_bridge - edge) + " further from the lever "
                  "along the axis";
      return m;
    }
    m.lever_seat.thickness = std::max(m.lever_seat.thickness, edge);
    return m;
  }
  // By weight: the rod hangs from the lever's lower edge on the vertical through apply.at.
  m.present = true;
  const Vec2 down{0, -1};
  const double top = distance_to_plate(ap.at, centres, half) <= 0
                         ? along_to_edge(ap.at, down, centres, half, reach, false)
                         : -1;
  Vec2 hang;
  if (top >= 0) {
    hang = ap.at + top * down;
  } else {
    // apply.at outside the plate: the lever above or below it on the same vertical.
    const double below = along_to_edge(ap.at, down, centres, half, reach, true);
    const double above = along_to_edge(ap.at, {0, 1}, centres, half, reach, true);
    if (below < 0 && above < 0) {
      m.refusal = "apply.at = " + point_text(ap.at) + ": no part of the lever plate lies on the "
                  "vertical through it, so the weight's hanger has nothing to hang from; put "
                  "apply.at over the lever";
      return m;
    }
    const Vec2 inside = below >= 0 ? ap.at + (below + 1e-6) * down : ap.at + (above + 1e-6) * Vec2{0, 1};
    hang = inside + along_to_edge(inside, down, centres, half, reach, false) * down;
  }
  using namespace mount_rules;
  WeightMount& w = m.weight;
  w.hang = hang;
  const double rho = 7850.0;  // carbon steel [kg/m³]: common practice, no source
  // Within the lever's faces (1 mm less than its thickness), so that it passes under the grip.
  w.rod_diameter = std::max(std::min(rod_min, d.lever.thickness - rod_inset),
                            std::ceil(std::sqrt(4 * ap.mass * kGravity / (kPi * rod_stress)) * 1000 - 1e-9) / 1000);
  const double rod_area = kPi * w.rod_diameter * w.rod_diameter / 4;
  // Block height = diameter D, bored for the rod; drop = max(20 mm, D/4); block + rod = mass.
  // The block's top clears the lever over the block's whole width by the least plan clearance:
  // a sloping lever comes lower beside the hanger than at it. The plate's lower boundary is a
  // convex function of x, so its lowest point over [a, b] is at a, at b, or at the bottom of a
  // centre's disc within [a, b].
  double y_min = centres.front().y, y_max = centres.front().y;
  for (Vec2 c : centres) {
    y_min = std::min(y_min, c.y);
    y_max = std::max(y_max, c.y);
  }
  auto lower_edge = [&](double x) {
    const Vec2 from{x, y_min - half - 0.001};
    const double up = along_to_edge(from, {0, 1}, centres, half, y_max - y_min + 2 * half + 0.002, true);
    return up >= 0 ? from.y + up : hang.y;
  };
  auto drop_for = [&](double D) {
    const double a = hang.x - D / 2, b = hang.x + D / 2;
    double lowest = std::min({hang.y, lower_edge(a), lower_edge(b)});
    for (Vec2 c : centres) {
      if (c.x >= a && c.x <= b) lowest = std::min(lowest, c.y - half);
    }
    return std::max({drop_min, D / 4, hang.y - lowest + hardware_rules::clearance});
  };
  // Fixed point on D (the rod's share is a few per cent).
  double D = std::cbrt(4 * ap.mass / (rho * kPi));
  for (int i = 0; i < 12; ++i) {
    const double rod_mass = rho * rod_area * (drop_for(D) + D);
    const double block_volume = std::max(1e-9, (ap.mass - rod_mass) / rho);
    // π D³/4 − rod_area·D = block_volume
    double x = D;
    for (int k = 0; k < 30; ++k) {
      const double g = kPi * x * x * x / 4 - rod_area * x - block_volume;
      const double dg = 3 * kPi * x * x / 4 - rod_area;
      x -= g / dg;
    }
    D = x;
  }
  w.block_diameter = w.block_height = D;
  w.drop = drop_for(D);
  w.rod_length = w.drop + D;
  w.rod_mass = rho * rod_area * w.rod_length;
  w.block_mass = ap.mass - w.rod_mass;
  if (!(w.block_mass > 0) || !(D > 2 * w.rod_diameter)) {
    m.refusal = "apply.mass = " + fmt("%.3g kg", ap.mass) + " is too light for a block on a Ø" +
                mm(w.rod_diameter) + " hanger; give at least " +
                fmt("%.2g kg", 3 * rho * rod_area * 0.1) + " or apply the brake by spring";
  }
  return m;
}

}  // namespace

LeverMass lever_mass(const Design& d, const Solution& s) {
  LeverMass out;
  if (!s.hardware.present) return out;
  const DrumMaterial* steel = find_drum_material("steel");
  const double rho = steel != nullptr ? steel->density : 7850.0;
  const std::vector<Vec2> points = lever_centres(d, s);
  const std::vector<Vec2> holes(points.begin() + 1, points.end());
  AreaMoment plate = grown_hull(points, d.lever.width / 2);
  const double pin_r = d.band.pin_diameter / 2;
  for (Vec2 h : holes) {
    const double a = kPi * pin_r * pin_r;
    plate.area -= a;
    plate.first = plate.first - a * h;
  }
  const double t = d.lever.thickness;
  const double plate_mass = rho * t * plate.area;
  const double gr = hardware_rules::grip_diameter / 2;
  const double grip_mass = rho * kPi * gr * gr * hardware_rules::grip_length;
  out.mass = plate_mass + grip_mass;
  if (out.mass > 0) {
    out.centroid = (1.0 / out.mass) * ((rho * t) * plate.first + grip_mass * d.lever.handle);
  }
  return out;
}

ApplyResult solve_apply(const Design& d, const Solution& s) {
  ApplyResult r;
  r.by = d.apply.by;
  const Layout& L = s.layout;
  const bool torque_mode = d.load.given == Load::Given::torque;
  const int primary = s.primary_a_tight ? 0 : 1;
  r.holding_torque = torque_mode ? s.required_torque : s.results[primary][0].torque;
  r.present = r.by != ApplyBy::hand && L.from_pins;
  if (!r.present) {
    hoist_checks(d, r);
    return r;
  }
  const Apply& ap = d.apply;
  const Vec2 O = d.lever.pivot;
  const int sigma = L.apply_sense;
  const double net = std::abs(L.a.arm + L.b.arm);

  // The moment the element must supply: the largest actuating moment over the friction range
  // (f_min for a brake that does not lock), in the design rotation or in both.
  bool first = true;
  for (int dir = 0; dir < 2; ++dir) {
    if (!ap.both_rotations && dir != primary) continue;
    for (const DirectionResult& x : s.results[dir]) {
      if (first || x.actuating_moment > r.required_moment) {
        r.required_moment = x.actuating_moment;
        r.governing = case_text(x.a_tight, x.friction);
        first = false;
      }
    }
  }
  r.wear_allowance = ap.wear_allowance;
  r.wear_rotation = L.wrap * ap.wear_allowance / net;
  r.release_rotation = L.release_rotation;
  const LeverMass lm = lever_mass(d, s);
  r.lever_mass = lm.mass;
  r.lever_centroid = lm.centroid;
  r.seat = ap.seat;

  ApplyPosition* positions[3] = {&r.applied, &r.worn, &r.released};
  const double turns[3] = {0.0, sigma * r.wear_rotation, -sigma * r.release_rotation};
  for (int i = 0; i < 3; ++i) {
    ApplyPosition& p = *positions[i];
    p.rotation = turns[i];
    p.at = turns[i] == 0.0 ? ap.at : rotate_about(ap.at, O, turns[i]);
    const Vec2 c = rotate_about(lm.centroid, O, turns[i]);
    p.lever_moment = lm.mass * kGravity * arm_of(c, kDown, O, sigma);
    if (ap.by == ApplyBy::weight) {
      p.arm = arm_of(p.at, kDown, O, sigma);
    } else {
      const Vec2 axis = p.at - ap.seat;
      p.arm = arm_of(p.at, (1.0 / norm(axis)) * axis, O, sigma);
    }
  }
  const double tiny = 1e-3 * L.handle_arm;
  if (ap.by == ApplyBy::weight && !(r.applied.arm > tiny)) {
    design_fail(d, "apply.at", "[" + mm(ap.at.x) + ", " + mm(ap.at.y) + "]",
                "a weight hung here " + std::string(r.applied.arm < -tiny ? "turns the lever in the releasing sense"
                                                                          : "has no arm about the pivot") +
                    " (gravity along −y of the front view); hang it on the other side of lever.pivot "
                    "(x " + std::string(sigma * 1 > 0 ? "less" : "more") + " than " + mm(O.x) + ")");
  }
  if (ap.by == ApplyBy::spring && !(r.applied.arm > tiny)) {
    design_fail(d, "apply.seat", "[" + mm(ap.seat.x) + ", " + mm(ap.seat.y) + "]",
                "a compression spring along apply.seat → apply.at " +
                    std::string(r.applied.arm < -tiny ? "pushes the lever in the releasing sense"
                                                      : "has no arm about the pivot") +
                    ": put the seat on the other side of the lever, so that the spring pushes it "
                    "the way that tightens the band (" + std::string(sigma > 0 ? "ccw" : "cw") + ")");
  }

  if (ap.by == ApplyBy::weight) {
    r.weight_mass = ap.mass;
    for (ApplyPosition* p : positions) p->element_moment = ap.mass * kGravity * p->arm;
  } else {
    SpringDemand q;
    const double moment = r.required_moment - r.worn.lever_moment > 0 ? r.required_moment - r.worn.lever_moment
                                                                      : r.required_moment;
    // A relative hair above the need so that rounding cannot leave the check a bit short.
    q.force_worn = (1.0 + 1e-9) * moment / r.worn.arm;
    q.installed_length = norm(ap.at - ap.seat);
    q.wear_travel = norm(r.worn.at - ap.seat) - q.installed_length;
    q.release_travel = q.installed_length - norm(r.released.at - ap.seat);
    q.max_outer_diameter = ap.spring_max_outer_diameter;
    const double cap = moment_limit(d, s);
    if (std::isfinite(cap)) q.max_force_applied = std::max(0.0, (cap - r.applied.lever_moment) / r.applied.arm);
    q.material = ap.spring_material;
    q.ends = ap.spring_ends;
    q.seats = ap.spring_seats;
    if (!(moment > 0)) {
      r.refusal = "the brake applies itself at " + r.governing +
                  " (self-locking): no spring is needed to apply it, and an actuator cannot release "
                  "it under load; change the layout (REFERENCE §1.7)";
    } else {
      r.spring = design_spring(q);
      if (r.spring.found) {
        const SpringState* states[3] = {&r.spring.applied, &r.spring.worn, &r.spring.released};
        for (int i = 0; i < 3; ++i) positions[i]->element_moment = states[i]->force * positions[i]->arm;
      } else {
        r.refusal = spring_refusal(d, r, q);
      }
    }
  }
  r.available_moment = r.worn.element_moment + r.worn.lever_moment;
  if (r.required_moment > 0 && torque_mode) {
    r.holding_torque = s.required_torque * r.available_moment / r.required_moment;
  }

  // The release actuator: lifts the lever by the release rotation, with the wear rotation in
  // reserve, against the element and the lever at the released position.
  ActuatorNeed& act = r.actuator;
  act.at = ap.actuator_at;
  act.arm = norm(ap.actuator_at - O);
  if (!(act.arm > tiny)) {
    design_fail(d, "apply.actuator_at", "[" + mm(ap.actuator_at.x) + ", " + mm(ap.actuator_at.y) + "]",
                "the release actuator acts at the pivot and has no arm; put it on the lever away "
                "from lever.pivot");
  }
  act.travel = act.arm * r.release_rotation;
  act.margin = act.arm * r.wear_rotation;
  act.stroke = act.travel + act.margin;
  act.force = std::max(0.0, r.released.element_moment + r.released.lever_moment) / act.arm;

  // Checks.
  const std::string worn_note =
      r.governing + ", lining worn " + mm(r.wear_allowance) + " (lever turned " +
      fmt("%.2f°", r.wear_rotation * 180.0 / kPi) + " further), lever weight " +
      fmt("%.1f N·m", r.worn.lever_moment);
  if (ap.by == ApplyBy::spring && !r.spring.found) {
    r.checks.push_back(make_check("spring_design",
                                  "A spring from the wire series meets every requirement", 0.0, 1.0,
                                  "1", false,
                                  "Shigley's Mechanical Engineering Design, 9th ed., ch. 10 "
                                  "(REFERENCE §8.2)",
                                  r.refusal));
    r.warnings.push_back("no spring found: " + r.refusal);
  } else {
    r.checks.push_back(make_check(
        "apply_moment", "Applying moment at the worn-lining position", r.available_moment,
        r.required_moment, "N·m", false,
        "statics (REFERENCE §8.1): the actuating moment at f_min, the lever's own weight included",
        worn_note));
    if (ap.by == ApplyBy::spring) spring_checks(r, d, r.checks);
  }
  // The element grips with its full moment (lining new): the band and lining under it, the worst
  // over both rotations and the friction range (a driven or reversed drum slips at that moment).
  const double full = r.applied.element_moment + r.applied.lever_moment;
  double stress = 0, pressure = 0;
  std::string stress_case, pressure_case;
  for (int dir = 0; dir < 2; ++dir) {
    for (const DirectionResult& x : s.results[dir]) {
      if (x.self_locking || !(x.actuating_moment > 0)) continue;
      const double scale = full / x.actuating_moment;
      if (x.band_stress * scale > stress) {
        stress = x.band_stress * scale;
        stress_case = case_text(x.a_tight, x.friction);
      }
      if (x.pressure_max * scale > pressure) {
        pressure = x.pressure_max * scale;
        pressure_case = case_text(x.a_tight, x.friction);
      }
    }
  }
  if (full > 0 && d.band.allowable_stress > 0 && stress > 0) {
    r.checks.push_back(make_check("apply_band_stress",
                                  "Band stress under the applying element's full moment",
                                  stress, d.band.allowable_stress, "Pa", true,
                                  "design file [band] allowable_stress",
                                  stress_case + ", lining new, the drum slipping"));
  }
  if (full > 0 && d.lining.pressure_limit > 0 && pressure > 0) {
    r.checks.push_back(make_check(
        "apply_lining_pressure", "Lining pressure under the applying element's full moment",
        pressure, d.lining.pressure_limit, "Pa", true,
        d.lining.pressure_source.empty() ? "design file [lining] pressure_limit" : d.lining.pressure_source,
        pressure_case + ", lining new, the drum slipping"));
  }
  hoist_checks(d, r);
  r.mount = plan_mount(d, s, r);
  return r;
}

}  // namespace bandforge
