// Helical compression springs: Shigley 9th ed. ch. 10 (REFERENCE §8.2) and the spring design of
// an applying element (REFERENCE §8.1).
#include "src/spring.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

#include "src/materials.hpp"

namespace bandforge {
namespace {

constexpr double kPi = 3.14159265358979323846;
constexpr double kMm = 1e-3;
constexpr double kInch = 0.0254;  // exact (NIST SP 811)
constexpr double kGpa = 1e9;

const char* const kTable104 =
    "Budynas & Nisbett, Shigley's Mechanical Engineering Design, 9th ed., Table 10-4 (A and m as "
    "REFERENCE §8.2 lists them; the size ranges from memory)";
const char* const kTable105 =
    "Shigley's Mechanical Engineering Design, 9th ed., Table 10-5 (G by wire diameter)";
const char* const kTable106 =
    "Shigley's Mechanical Engineering Design, 9th ed., Table 10-6, static service, before set "
    "removal (the column Example 10-1 uses)";

std::vector<SpringWire> build_wires() {
  auto wire = [](const char* key, const char* description, double d_min_mm, double d_max_mm,
                 double a, double m, double fraction, const char* allowable_text) {
    SpringWire w;
    w.key = key;
    w.description = description;
    w.d_min = d_min_mm * kMm;
    w.d_max = d_max_mm * kMm;
    w.a_mpa = a;
    w.m = m;
    w.allowable_fraction = fraction;
    w.strength_source = kTable104;
    w.modulus_source = kTable105;
    w.allowable_source = std::string(kTable106) + ": " + allowable_text;
    return w;
  };
  return {
      wire("music-wire", "music wire, ASTM A228", 0.10, 6.5, 2211, 0.145, 0.45,
           "45 % of S_ut for music wire and cold-drawn carbon steel"),
      wire("hard-drawn", "hard-drawn carbon steel wire, ASTM A227", 0.7, 12.7, 1783, 0.190, 0.45,
           "45 % of S_ut for music wire and cold-drawn carbon steel"),
      wire("oil-tempered", "oil-tempered carbon steel wire, ASTM A229", 0.5, 12.7, 1855, 0.187,
           0.50, "50 % of S_ut for hardened and tempered carbon and low-alloy steel"),
      wire("chrome-vanadium", "chrome-vanadium alloy steel wire, ASTM A232", 0.8, 11.1, 2005,
           0.168, 0.50, "50 % of S_ut for hardened and tempered carbon and low-alloy steel"),
      wire("chrome-silicon", "chrome-silicon alloy steel wire, ASTM A401", 1.6, 9.5, 1974, 0.108,
           0.50, "50 % of S_ut for hardened and tempered carbon and low-alloy steel"),
  };
}

/// Active coils rounded up to the maker's step; a hair of tolerance keeps an exact multiple.
double round_up_coils(double n) {
  const double step = spring_limits::coil_step;
  return step * std::ceil(n / step - 1e-9);
}

}  // namespace

const char* const kWireDiameterSource =
    "preferred wire diameters, SI, in 'Computer Aided Engineering Design', ch. 1 Table 1.1(b) "
    "(as printed at issuhub.com/view/index?id=5593&pageIndex=37)";

const std::vector<SpringWire>& spring_wires() {
  static const std::vector<SpringWire> table = build_wires();
  return table;
}

const SpringWire* find_spring_wire(std::string_view key) {
  const auto& t = spring_wires();
  const auto it = std::find_if(t.begin(), t.end(), [&](const auto& w) { return w.key == key; });
  return it == t.end() ? nullptr : &*it;
}

const std::vector<double>& wire_diameters() {
  static const std::vector<double> series = [] {
    const double mm[] = {0.10, 0.12, 0.16, 0.20, 0.25, 0.30, 0.35, 0.40, 0.45, 0.50, 0.55, 0.60,
                         0.65, 0.70, 0.80, 0.90, 1.00, 1.10, 1.20, 1.40, 1.60, 1.80, 2.00, 2.20,
                         2.50, 2.80, 3.00, 3.50, 4.00, 4.50, 5.00, 5.50, 6.00, 6.50, 7.00, 8.00,
                         9.00, 10.0, 11.0, 12.0, 13.0, 14.0, 15.0, 16.0};
    std::vector<double> out;
    for (double v : mm) out.push_back(v * kMm);
    return out;
  }();
  return series;
}

double wire_strength(const SpringWire& wire, double d) {
  return wire.a_mpa / std::pow(d / kMm, wire.m) * 1e6;
}

double shear_modulus(const SpringWire& wire, double d) {
  const double in = d / kInch;
  if (wire.key == "music-wire") {
    return (in <= 0.032 ? 82.7 : in <= 0.063 ? 81.7 : in <= 0.125 ? 81.0 : 80.0) * kGpa;
  }
  if (wire.key == "hard-drawn") {
    return (in <= 0.032 ? 80.7 : in <= 0.063 ? 80.0 : in <= 0.125 ? 79.3 : 78.6) * kGpa;
  }
  return 77.2 * kGpa;  // oil-tempered, chrome-vanadium, chrome-silicon
}

double allowable_shear(const SpringWire& wire, double d) {
  return wire.allowable_fraction * wire_strength(wire, d);
}

double bergstrasser(double index) { return (4.0 * index + 2.0) / (4.0 * index - 3.0); }

double spring_stress(double force, double mean_diameter, double wire_diameter) {
  const double d = wire_diameter;
  return bergstrasser(mean_diameter / d) * 8.0 * force * mean_diameter / (kPi * d * d * d);
}

double spring_rate(double wire_diameter, double mean_diameter, double active_coils,
                   double shear_modulus) {
  const double d2 = wire_diameter * wire_diameter;
  return d2 * d2 * shear_modulus /
         (8.0 * mean_diameter * mean_diameter * mean_diameter * active_coils);
}

double total_coils(SpringEnds ends, double active_coils) {
  switch (ends) {
    case SpringEnds::plain: return active_coils;
    case SpringEnds::plain_ground: return active_coils + 1.0;
    case SpringEnds::squared:
    case SpringEnds::squared_ground: return active_coils + 2.0;
  }
  return active_coils + 2.0;
}

double solid_length(SpringEnds ends, double wire_diameter, double total) {
  const bool ground = ends == SpringEnds::plain_ground || ends == SpringEnds::squared_ground;
  return wire_diameter * (ground ? total : total + 1.0);
}

double end_constant(SpringSeats seats) {
  switch (seats) {
    case SpringSeats::flat_flat: return 0.5;
    case SpringSeats::flat_pivoted: return 0.707;
    case SpringSeats::pivoted_pivoted: return 1.0;
  }
  return 1.0;
}

double buckling_free_length(double mean_diameter, SpringSeats seats) {
  return 2.63 * mean_diameter / end_constant(seats);
}

SpringResult spring_states(SpringResult s, const SpringDemand& q) {
  const double lengths[3] = {q.installed_length, q.installed_length + q.wear_travel,
                             q.installed_length - q.release_travel};
  SpringState* states[3] = {&s.applied, &s.worn, &s.released};
  for (int i = 0; i < 3; ++i) {
    states[i]->length = lengths[i];
    states[i]->force = s.rate * (s.free_length - lengths[i]);
    states[i]->stress = spring_stress(states[i]->force, s.mean_diameter, s.wire_diameter);
  }
  const double y_released = s.free_length - s.released.length;
  s.overrun = y_released > 0 ? (s.free_length - s.solid_length) / y_released - 1.0 : 0.0;
  return s;
}

SpringResult design_spring(const SpringDemand& q) {
  SpringResult best;
  best.binding = SpringLimit::material;
  const SpringWire* wire = find_spring_wire(q.material);
  if (wire == nullptr) return best;
  const DrumMaterial* steel = find_drum_material("steel");
  const double density = steel != nullptr ? steel->density : 7850.0;
  const double alpha = end_constant(q.seats);
  const double travel = q.wear_travel + q.release_travel;
  const double length_worn = q.installed_length + q.wear_travel;
  const double length_released = q.installed_length - q.release_travel;
  const double step = 0.5 * kMm;  // mean diameter in half millimetres
  // The force falls by k·w from applied to worn: the brake's limit at the applied position caps k.
  double k_band = std::numeric_limits<double>::infinity();
  if (q.max_force_applied > 0) {
    if (!(q.max_force_applied > q.force_worn)) {
      best.binding = SpringLimit::band;
      best.needed = q.force_worn / q.max_force_applied;
      return best;
    }
    if (q.wear_travel > 0) k_band = (q.max_force_applied - q.force_worn) / q.wear_travel;
  }

  // The furthest stage any candidate reaches says which requirement binds.
  int reached = 0;  // 0 material, 1 diameter, 2 strength, 3 solid, 4 buckling, 5 found
  double least_outer = std::numeric_limits<double>::infinity();     // diameter stage
  double most_force = 0.0;                                          // strength stage
  double strong_outer = std::numeric_limits<double>::infinity();    // strength, ignoring the limit
  double least_extra = std::numeric_limits<double>::infinity();     // solid stage
  double least_shortening = std::numeric_limits<double>::infinity();  // buckling stage

  for (double d : wire_diameters()) {
    if (d < wire->d_min - 1e-12 || d > wire->d_max + 1e-12) continue;
    reached = std::max(reached, 1);
    const double g = shear_modulus(*wire, d);
    const double allowable = allowable_shear(*wire, d);
    const int first = static_cast<int>(std::ceil(spring_limits::index_min * d / step - 1e-9));
    const int last = static_cast<int>(std::floor(spring_limits::index_max * d / step + 1e-9));
    for (int i = first; i <= last; ++i) {
      const double D = step * i;
      // The index exactly as the checks compute it: a rounding hair past 4 or 12 is out.
      const double index = D / d;
      if (index < spring_limits::index_min || index > spring_limits::index_max) continue;
      const double outer = D + d;
      const bool fits = q.max_outer_diameter <= 0 || outer <= q.max_outer_diameter * (1 + 1e-12);
      least_outer = std::min(least_outer, outer);
      // Stress at the released position: F_w + k·(w + s) ≤ F_allow (eq. 10-7 solved for F).
      const double f_allow = kPi * d * d * d * allowable / (8.0 * bergstrasser(index) * D);
      const bool strong = f_allow > q.force_worn;
      if (strong) strong_outer = std::min(strong_outer, outer);
      if (!fits) continue;
      reached = std::max(reached, 2);
      most_force = std::max(most_force, f_allow);
      if (!strong) continue;
      reached = std::max(reached, 3);
      // The stiffest spring the stress allows: fewest coils, shortest solid and free lengths.
      const double k_max = std::min(k_band, travel > 0 ? (f_allow - q.force_worn) / travel
                                                       : std::numeric_limits<double>::infinity());
      const double n_min = spring_rate(d, D, 1.0, g) / k_max;
      const double n_a = std::max(spring_limits::active_min, round_up_coils(n_min));
      SpringResult s;
      s.material = wire->key;
      s.wire_diameter = d;
      s.mean_diameter = D;
      s.outer_diameter = outer;
      s.index = index;
      s.active_coils = n_a;
      s.total_coils = total_coils(q.ends, n_a);
      s.ends = q.ends;
      s.rate = spring_rate(d, D, n_a, g);
      s.free_length = length_worn + q.force_worn / s.rate;
      s.solid_length = solid_length(q.ends, d, s.total_coils);
      s.mass = density * kPi * d * d / 4.0 * kPi * D * s.total_coils;
      s.tensile_strength = wire_strength(*wire, d);
      s.allowable = allowable;
      s.shear_modulus = g;
      s.alpha = alpha;
      s.buckling_length = buckling_free_length(D, q.seats);
      s = spring_states(s, q);
      // Room: L_a ≥ s + L_s + 0.15·y_released, y_released independent of L_a.
      const double y_released = s.free_length - length_released;
      const double room_needed = q.release_travel + s.solid_length +
                                 spring_limits::overrun_min * y_released;
      if (!(s.overrun >= spring_limits::overrun_min) || !(s.solid_length < length_released)) {
        least_extra = std::min(least_extra, room_needed - q.installed_length);
        continue;
      }
      reached = std::max(reached, 4);
      if (!(s.free_length <= s.buckling_length)) {
        const double cut = s.free_length - s.buckling_length;
        if (q.installed_length - cut >= room_needed) least_shortening = std::min(least_shortening, cut);
        continue;
      }
      reached = 5;
      if (!best.found || s.mass < best.mass) {
        best = s;
        best.found = true;
      }
    }
  }
  if (best.found) {
    best.binding = SpringLimit::none;
    return best;
  }
  switch (reached) {
    case 0:
      best.binding = SpringLimit::material;
      break;
    case 1:
      best.binding = SpringLimit::diameter;
      best.needed = least_outer;
      break;
    case 2:
      best.binding = SpringLimit::strength;
      best.needed = most_force > 0 ? q.force_worn / most_force : 0.0;
      best.needed_diameter = std::isfinite(strong_outer) ? strong_outer : 0.0;
      break;
    case 3:
      best.binding = SpringLimit::solid;
      best.needed = least_extra;
      break;
    default:
      best.binding = SpringLimit::buckling;
      best.needed = std::isfinite(least_shortening) ? least_shortening : 0.0;
      break;
  }
  return best;
}

const char* to_string(SpringLimit l) {
  switch (l) {
    case SpringLimit::none: return "none";
    case SpringLimit::material: return "material";
    case SpringLimit::band: return "band and lining at the applied position";
    case SpringLimit::diameter: return "outer diameter";
    case SpringLimit::strength: return "stress at the released position";
    case SpringLimit::solid: return "solid-length margin";
    case SpringLimit::buckling: return "buckling";
  }
  return "?";
}

}  // namespace bandforge
