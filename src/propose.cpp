// The layout search behind `bandforge propose` (method in src/propose.hpp and README "Briefs and
// proposals"). The inner evaluation uses the mechanics' own non-throwing layout (try_pin_layout)
// and force solution (solve_direction), so a candidate is judged by the same formulas as
// `solve`; every proposal is then read back through solve() and plan_hardware().
#include "src/propose.hpp"

#include <algorithm>
#include <array>
#include <atomic>
#include <chrono>
#include <cmath>
#include <cstdio>
#include <mutex>
#include <memory>
#include <numbers>
#include <thread>

#include "src/band_path.hpp"
#include "src/errors.hpp"
#include "src/hardware.hpp"
#include "src/materials.hpp"
#include "src/mechanics.hpp"

namespace bandforge {
namespace {

constexpr double kPi = std::numbers::pi;
/// solve()'s own limits (src/mechanics.hpp): every proposal must pass them too.
constexpr double kHandForceCheck = check_limits::hand_force;
constexpr double kSelfLockCheck = check_limits::self_lock_margin;
/// The hardware's rules (src/hardware.cpp) applied in the inner loop as a fast 2-D screen.
double min_wall(double pin_r) { return std::max(0.002, 0.5 * pin_r); }
/// Proposals are written with positions on this grid when it keeps them feasible [m].
constexpr double kRound = 0.0005;

Vec2 operator-(Vec2 a, Vec2 b) { return {a.x - b.x, a.y - b.y}; }
double norm(Vec2 a) { return std::sqrt(a.x * a.x + a.y * a.y); }  // not hypot: 5× faster, no overflow at these sizes
double dist(Vec2 a, Vec2 b) { return norm(a - b); }
int turn_sign(Turn t) { return t == Turn::ccw ? 1 : -1; }

std::string fmt(const char* f, double v) {
  char buf[96];
  std::snprintf(buf, sizeof buf, f, v);
  return buf;
}

// ---- regions --------------------------------------------------------------------------------

double segment_distance(Vec2 p, Vec2 a, Vec2 b) {
  const Vec2 ab = b - a;
  const double len2 = ab.x * ab.x + ab.y * ab.y;
  const double u = len2 > 0 ? std::clamp(((p.x - a.x) * ab.x + (p.y - a.y) * ab.y) / len2, 0.0, 1.0) : 0.0;
  return dist(p, {a.x + u * ab.x, a.y + u * ab.y});
}

bool segments_cross(Vec2 a, Vec2 b, Vec2 c, Vec2 d) {
  const auto orient = [](Vec2 p, Vec2 q, Vec2 r) {
    return (q.x - p.x) * (r.y - p.y) - (q.y - p.y) * (r.x - p.x);
  };
  const double o1 = orient(a, b, c), o2 = orient(a, b, d), o3 = orient(c, d, a), o4 = orient(c, d, b);
  return ((o1 > 0) != (o2 > 0)) && ((o3 > 0) != (o4 > 0));
}

/// Distance from a segment (grown by nothing) to a polygon: 0 when they touch or overlap.
double segment_to_polygon(Vec2 a, Vec2 b, const std::vector<Vec2>& poly) {
  if (polygon_contains(poly, a) || polygon_contains(poly, b)) return 0;
  double d = 1e300;
  for (std::size_t i = 0; i < poly.size(); ++i) {
    const Vec2 p = poly[i], q = poly[(i + 1) % poly.size()];
    if (segments_cross(a, b, p, q)) return 0;
    d = std::min({d, segment_distance(p, a, b), segment_distance(q, a, b), segment_distance(a, p, q),
                  segment_distance(b, p, q)});
  }
  return d;
}

/// Sample points of a region about `spacing` apart: corners, points along the edges, and the
/// interior grid. Deterministic order.
std::vector<Vec2> sample(const Region& r, double spacing) {
  std::vector<Vec2> out;
  const auto& c = r.corners;
  if (c.size() == 1) return c;
  const std::size_t edges = c.size() == 2 ? 1 : c.size();
  for (std::size_t i = 0; i < edges; ++i) {
    const Vec2 a = c[i], b = c[(i + 1) % c.size()];
    const int n = std::max(1, static_cast<int>(std::ceil(dist(a, b) / spacing)));
    for (int k = 0; k < n; ++k) out.push_back({a.x + (b.x - a.x) * k / n, a.y + (b.y - a.y) * k / n});
  }
  if (c.size() == 2) out.push_back(c[1]);
  if (c.size() >= 3) {
    double x0 = c[0].x, x1 = c[0].x, y0 = c[0].y, y1 = c[0].y;
    for (const Vec2& p : c) {
      x0 = std::min(x0, p.x); x1 = std::max(x1, p.x);
      y0 = std::min(y0, p.y); y1 = std::max(y1, p.y);
    }
    const int nx = std::max(1, static_cast<int>(std::round((x1 - x0) / spacing)));
    const int ny = std::max(1, static_cast<int>(std::round((y1 - y0) / spacing)));
    for (int j = 1; j < ny; ++j) {
      for (int i = 1; i < nx; ++i) {
        const Vec2 p{x0 + (x1 - x0) * i / nx, y0 + (y1 - y0) * j / ny};
        if (polygon_contains(c, p)) out.push_back(p);
      }
    }
  }
  return out;
}

/// A spacing that gives about `target` samples in the region.
double spacing_for(const Region& r, int target) {
  const auto& c = r.corners;
  if (c.size() <= 1) return 1.0;
  if (c.size() == 2) return std::max(dist(c[0], c[1]) / target, 1e-4);
  double area2 = 0, perimeter = 0;
  for (std::size_t i = 0; i < c.size(); ++i) {
    const Vec2 a = c[i], b = c[(i + 1) % c.size()];
    area2 += a.x * b.y - b.x * a.y;
    perimeter += dist(a, b);
  }
  const double area = std::abs(area2) / 2;
  // n ≈ area/h² + perimeter/h  →  solve for h.
  const double h = (perimeter + std::sqrt(perimeter * perimeter + 4.0 * target * area)) / (2.0 * target);
  return std::max(h, 1e-4);
}

const Region& or_pins(const Region& r, const Brief& b) { return r.corners.empty() ? b.pins : r; }

// ---- candidates ---------------------------------------------------------------------------

/// One candidate: everything the search chooses.
struct Params {
  int drum = 0;  ///< index into brief.drum_diameters
  Turn sense = Turn::ccw;
  Mount mount_a = Mount::frame, mount_b = Mount::lever;
  Vec2 a, b, pivot, handle;
  int band = 0;   ///< index into Search::bands_ (width × thickness by mass)
  int pin = 0;    ///< index into stock.pin_diameter
  int plate = 0;  ///< index into Search::plates_
};

/// The limits a candidate is judged by, in a fixed order (also the infeasible message's).
enum Limit {
  kForce, kTravel, kRotation, kPressure, kBandStress, kPinShear, kLever, kSelfLock, kDiffLock,
  kHoist, kTemperature, kPower, kRelease, kLimits
};
const char* const kLimitNames[kLimits] = {
    "operator force", "handle travel", "lever release rotation", "lining pressure", "band stress",
    "pin shear", "lever bending", "self-locking friction", "differential self-lock ratio",
    "hoist holding torque", "drum temperature", "power per lining area", "released state"};

struct Eval {
  bool geometry = false;  ///< the layout exists and the 2-D screen passes
  bool feasible = false;
  BrakeKind kind = BrakeKind::simple;
  Figures fig;
  double tension = 0;       ///< largest tight-side tension [N]
  double lever_moment = 0;  ///< largest lever bending moment [N·m]
  double value[kLimits] = {};
  double limit[kLimits] = {};
  bool upper[kLimits] = {};
  double excess[kLimits] = {};  ///< relative excess over each limit (≤ 0: met)
  double violation = 0;     ///< largest relative excess over a limit (≤ 0: all met)
  int binding = -1;
};

struct Key {
  double primary = 0, secondary = 0;
  bool operator<(const Key& o) const {
    const double tol = 1e-9 * std::max(std::abs(primary), std::abs(o.primary));
    if (std::abs(primary - o.primary) > tol) return primary < o.primary;
    return secondary < o.secondary - 1e-12;
  }
};

struct Found {
  Params p;
  Eval e;
  Key key;
};

class Search {
 public:
  explicit Search(const Brief& brief) : b_(brief) {
    const Lining& li = b_.lining;
    f_[0] = li.friction_min > 0 ? li.friction_min : li.friction;
    f_[1] = li.friction;
    f_[2] = li.friction_max > 0 ? li.friction_max : li.friction;
    const DrumMaterial* steel = find_drum_material("steel");
    steel_density_ = steel != nullptr ? steel->density : 7850.0;
    // Band stock by mass per length (b·t), then thinner first; lever plates by area.
    for (std::size_t i = 0; i < b_.stock.band_width.size(); ++i)
      for (std::size_t j = 0; j < b_.stock.band_thickness.size(); ++j)
        bands_.push_back({b_.stock.band_width[i], b_.stock.band_thickness[j]});
    std::stable_sort(bands_.begin(), bands_.end(), [](const auto& x, const auto& y) {
      return x[0] * x[1] < y[0] * y[1] || (x[0] * x[1] == y[0] * y[1] && x[1] < y[1]);
    });
    for (double w : b_.stock.lever_width)
      for (double t : b_.stock.lever_thickness) plates_.push_back({w, t});
    for (const Region& k : b_.keep_out) {
      Box box{k.corners[0].x, k.corners[0].y, k.corners[0].x, k.corners[0].y};
      for (Vec2 c : k.corners) {
        box.x0 = std::min(box.x0, c.x); box.x1 = std::max(box.x1, c.x);
        box.y0 = std::min(box.y0, c.y); box.y1 = std::max(box.y1, c.y);
      }
      keep_out_boxes_.push_back(box);
    }
    std::stable_sort(plates_.begin(), plates_.end(), [](const auto& x, const auto& y) {
      return x[0] * x[1] < y[0] * y[1] || (x[0] * x[1] == y[0] * y[1] && x[1] < y[1]);
    });
  }

  const Brief& brief() const { return b_; }
  double friction(int k) const { return f_[k]; }
  const std::vector<std::array<double, 2>>& bands() const { return bands_; }
  const std::vector<std::array<double, 2>>& plates() const { return plates_; }

  /// A complete design for `p` (project number and title as given).
  Design design_of(const Params& p) const {
    Design d = prepared();
    apply(p, d);
    return d;
  }

  /// A scratch design for evaluate(): everything the brief fixes, set once (strings included).
  Design prepared() const {
    Design d;
    d.file = "(proposal)";
    d.project = b_.project;
    d.drum.bore = b_.bore;
    d.drum.rotation = b_.rotation;
    d.drum.material = b_.drum_material.material;
    d.drum.density = b_.drum_material.density;
    d.drum.specific_heat = b_.drum_material.specific_heat;
    d.drum.material_source = b_.drum_material.material_source;
    d.lining = b_.lining;
    d.band.allowable_stress = b_.stock.band_allowable_stress;
    d.band.pin_allowable_shear = b_.stock.band_allowable_stress / std::sqrt(3.0);
    d.band.clearance = b_.clearance;
    d.band.model = TensionModel::thin;
    d.band.end_joint = EndJointChoice::automatic;
    d.lever.allowable_stress = b_.stock.lever_allowable_stress;
    d.load.given = Load::Given::torque;
    d.load.torque = b_.torque;
    d.load.service_factor = b_.service_factor;
    d.duty = b_.duty;
    // The search lays out hand levers (README "Briefs and proposals"): a hoist whose drive the
    // brief does not give is proposed as a hand-operated one, where a hand brake is right.
    if (d.duty.hoist_mass > 0 && d.duty.drive == HoistDrive::unspecified) d.duty.drive = HoistDrive::manual;
    return d;
  }

  /// Fills what `p` decides into a prepared() design (plain numbers only: nothing allocated).
  void apply(const Params& p, Design& d) const {
    const double D = b_.drum_diameters[static_cast<std::size_t>(p.drum)];
    const auto& band = bands_[static_cast<std::size_t>(p.band)];
    d.drum.diameter = D;
    d.drum.width = drum_width(band[0]);
    d.band.width = band[0];
    d.band.thickness = band[1];
    d.band.sense = p.sense;
    d.band.end_a = {p.mount_a, p.a};
    d.band.end_b = {p.mount_b, p.b};
    d.band.pin_diameter = b_.stock.pin_diameter[static_cast<std::size_t>(p.pin)];
    const auto& plate = plates_[static_cast<std::size_t>(p.plate)];
    d.lever.pivot = p.pivot;
    d.lever.handle = p.handle;
    d.lever.width = plate[0];
    d.lever.thickness = plate[1];
  }

  /// Drum face width: the brief's, or the band width plus a margin each side (common practice).
  double drum_width(double band_width) const {
    if (b_.drum_width > 0) return b_.drum_width;
    return band_width + 2 * std::max(0.005, 0.1 * band_width);
  }

  /// The inner evaluation of one candidate with its stock as given.
  Eval evaluate(const Params& p, Design& d) const {
    Eval e;
    apply(p, d);
    Layout L;
    if (try_pin_layout(d, L) != LayoutFault::none) return e;
    e.kind = L.kind;
    if (std::find(b_.kinds.begin(), b_.kinds.end(), L.kind) == b_.kinds.end()) return e;
    if (!screen(d, L)) return e;
    e.geometry = true;

    const bool a_tight = turn_sign(b_.rotation) == L.sense;
    DirectionResult r[2][3];
    const int dirs = b_.both_directions ? 2 : 1;
    for (int dir = 0; dir < dirs; ++dir)
      for (int k = 0; k < 3; ++k) r[dir][k] = solve_direction(d, L, dir == 0 ? a_tight : !a_tight, f_[k]);
    Figures& fig = e.fig;
    fig.wrap = L.wrap;
    for (int dir = 0; dir < dirs; ++dir) {
      fig.force = std::max(fig.force, r[dir][0].lever_force);
      for (int k = 0; k < 3; ++k) {
        const DirectionResult& x = r[dir][k];
        fig.pressure = std::max(fig.pressure, x.pressure_max);
        fig.band_stress = std::max(fig.band_stress, x.band_stress);
        fig.pin_shear = std::max(fig.pin_shear, x.pin_shear);
        fig.lever_stress = std::max(fig.lever_stress, x.lever_stress);
        e.tension = std::max(e.tension, x.tension_tight);
        e.lever_moment = std::max(e.lever_moment, x.lever_moment);
      }
    }
    // Lowest self-locking friction over both rotations (as solve() computes it, §1.7).
    for (int dir = 0; dir < 2; ++dir) {
      const double mt = dir == 0 ? L.a.arm_applied : L.b.arm_applied;
      const double ms = dir == 0 ? L.b.arm_applied : L.a.arm_applied;
      if (!(mt > 0)) continue;
      const double fc = ms < 0 ? std::max(0.0, std::log(-ms / mt) / L.wrap) : 0.0;
      fig.self_lock_friction = std::min(fig.self_lock_friction, fc);
    }
    fig.band_mass = L.band_length * d.band.width * d.band.thickness * steel_density_;
    fig.travel = L.handle_travel;
    fig.size = dist(p.handle, p.pivot);
    if (p.mount_a == Mount::lever) fig.size = std::max(fig.size, dist(p.a, p.pivot));
    if (p.mount_b == Mount::lever) fig.size = std::max(fig.size, dist(p.b, p.pivot));

    auto set = [&](int i, double value, double limit, bool upper) {
      e.value[i] = value;
      e.limit[i] = limit;
      e.upper[i] = upper;
    };
    set(kForce, fig.force, std::min(b_.max_force, kHandForceCheck), true);
    set(kTravel, fig.travel, b_.max_travel > 0 ? b_.max_travel : 1e300, true);
    set(kRotation, L.release_rotation, check_limits::release_rotation, true);
    set(kPressure, fig.pressure, b_.lining.pressure_limit > 0 ? b_.lining.pressure_limit : 1e300, true);
    set(kBandStress, fig.band_stress, d.band.allowable_stress, true);
    set(kPinShear, fig.pin_shear, d.band.pin_allowable_shear, true);
    set(kLever, fig.lever_stress, d.lever.allowable_stress, true);
    set(kSelfLock, fig.self_lock_friction, b_.allow_self_locking ? 0.0 : b_.self_lock_margin * f_[2], false);
    if (L.kind == BrakeKind::differential) {
      const bool a_assists = L.a.arm_applied > 0;
      const double at = a_assists ? L.a.arm_applied : L.b.arm_applied;
      const double as = -(a_assists ? L.b.arm_applied : L.a.arm_applied);
      set(kDiffLock, as / (at * std::exp(f_[2] * L.wrap)), kSelfLockCheck, false);
    } else {
      set(kDiffLock, 1, 0, false);
    }
    // The [duty] checks of solve(): the hoist's holding torque, the drum temperature after a stop
    // (the rim mass follows the drum width, which follows the band) and the power per lining
    // area (b·r·φ).
    set(kHoist, 1, 0, false);
    set(kTemperature, 0, 1, true);
    set(kPower, 0, 1, true);
    if (b_.duty.present) {
      const Thermal th = solve_thermal(d, L, r[0][1].torque);
      if (b_.duty.hoist_mass > 0) {
        set(kHoist, b_.torque * b_.service_factor, b_.duty.hoist_mass * 9.80665 * b_.duty.rope_radius, false);
      }
      if (b_.lining.temperature_limit > 0) set(kTemperature, th.peak_temperature, b_.lining.temperature_limit, true);
      if (b_.lining.power_limit > 0) set(kPower, th.power_density_peak, b_.lining.power_limit, true);
    }
    e.violation = -1e300;
    for (int i = 0; i < kLimits; ++i) {
      double v;
      if (e.upper[i]) {
        v = e.value[i] / e.limit[i] - 1.0;
      } else {
        v = e.limit[i] <= 0 ? -1.0 : (e.value[i] > 0 ? e.limit[i] / e.value[i] - 1.0 : 1e9);
      }
      e.excess[i] = v;
      if (v > e.violation) {
        e.violation = v;
        e.binding = i;
      }
    }
    e.feasible = e.violation <= 1e-12;
    // The released state (as plan_hardware() checks it, for riveted eyes): the lever turned back,
    // the band on r_b + clearance; each lever end keeps an eye's length of run and no eye reaches
    // the other run. Only for candidates that pass everything else: it costs a second layout.
    set(kRelease, 0, 1, true);
    if (e.feasible) {
      const double gap = released_gap(d, L);
      if (gap < 0) {
        const double eye = d.band.pin_diameter / 2 + d.band.thickness;
        e.value[kRelease] = -gap;
        e.limit[kRelease] = eye;
        e.excess[kRelease] = -gap / eye;
        e.violation = e.excess[kRelease];
        e.binding = kRelease;
        e.feasible = false;
      }
    }
    return e;
  }

  /// Least clearance of the released state [m] (negative: it fails); see evaluate().
  static double released_gap(const Design& d, const Layout& L) {
    const double eye = d.band.pin_diameter / 2 + d.band.thickness;
    const double radius = L.r_band + d.band.clearance;
    const double turn = -L.apply_sense * L.release_rotation;
    for (const EndLayout* e : {&L.a, &L.b}) {
      const Vec2 p = e->mount == Mount::lever ? rotate_about(e->pin, d.lever.pivot, turn) : e->pin;
      if (norm(p) <= radius + 1e-9) return norm(p) - radius - eye;
    }
    const Layout rel = released_layout(d, L);
    double least = 1e300;
    for (const EndLayout* e : {&rel.a, &rel.b})
      if (e->mount == Mount::lever) least = std::min(least, e->free_length - eye);
    const Vec2 a0 = rel.a.pin, a1 = rel.a.tangent_point, b0 = rel.b.pin, b1 = rel.b.tangent_point;
    const double runs = segments_cross(a0, a1, b0, b1)
                            ? 0.0
                            : std::min({segment_distance(a0, b0, b1), segment_distance(a1, b0, b1),
                                        segment_distance(b0, a0, a1), segment_distance(b1, a0, a1)});
    least = std::min(least, runs - d.band.thickness);
    least = std::min(least, segment_distance(a0, b0, b1) - eye - d.band.thickness / 2);
    least = std::min(least, segment_distance(b0, a0, a1) - eye - d.band.thickness / 2);
    return least;
  }

  /// The 2-D screen on the hardware's rules (src/hardware.cpp): lever holes apart, the grip
  /// clear of the holes, the lever wide enough for its holes, an eye's room on each run, and
  /// nothing in a keep-out region. The full plan (brackets, joints, released state) is made for
  /// the shortlist.
  bool screen(const Design& d, const Layout& L) const {
    const double pin_r = d.band.pin_diameter / 2;
    const double wall = min_wall(pin_r);
    if (d.lever.width / 2 - pin_r < wall) return false;
    const double eye = pin_r + d.band.thickness;
    if (L.a.free_length <= eye || L.b.free_length <= eye) return false;
    Vec2 holes[3];
    int n = 0;
    holes[n++] = d.lever.pivot;
    if (L.a.mount == Mount::lever && dist(L.a.pin, d.lever.pivot) > 1e-6) holes[n++] = L.a.pin;
    if (L.b.mount == Mount::lever && dist(L.b.pin, d.lever.pivot) > 1e-6) holes[n++] = L.b.pin;
    for (int i = 0; i < n; ++i) {
      for (int k = i + 1; k < n; ++k)
        if (dist(holes[i], holes[k]) < 2 * pin_r + wall) return false;
      if (dist(d.lever.handle, holes[i]) < hardware_rules::grip_diameter / 2 + pin_r + wall) return false;
    }
    for (std::size_t ki = 0; ki < b_.keep_out.size(); ++ki) {
      const auto& poly = b_.keep_out[ki].corners;
      const Box& box = keep_out_boxes_[ki];
      // Pins (with their eyes), the band runs and the lever's centre lines; a bounding-box test
      // first spares the exact distances for what is plainly far away.
      for (Vec2 pin : {L.a.pin, L.b.pin, d.lever.pivot}) {
        if (!box.near(pin, pin, eye + wall)) continue;
        if (polygon_contains(poly, pin)) return false;
        for (std::size_t i = 0; i < poly.size(); ++i)
          if (segment_distance(pin, poly[i], poly[(i + 1) % poly.size()]) < eye + wall) return false;
      }
      const double t = d.band.thickness, half = d.lever.width / 2;
      if (box.near(L.a.pin, L.a.tangent_point, t) && segment_to_polygon(L.a.pin, L.a.tangent_point, poly) < t) return false;
      if (box.near(L.b.pin, L.b.tangent_point, t) && segment_to_polygon(L.b.pin, L.b.tangent_point, poly) < t) return false;
      for (int i = 0; i < n; ++i)
        if (box.near(d.lever.handle, holes[i], half) && segment_to_polygon(d.lever.handle, holes[i], poly) < half) return false;
      for (int i = 1; i < n; ++i)
        if (box.near(holes[0], holes[i], half) && segment_to_polygon(holes[0], holes[i], poly) < half) return false;
    }
    return true;
  }

  /// Chooses the lightest stock for the positions in `p` and evaluates it. The tensions and the
  /// lever moment are taken from an evaluation with the reference stock; the chosen stock is
  /// then evaluated in full (the band thickness moves the band line a little).
  Eval choose_stock(Params& p, Design& d, long long& evaluations) const {
    p.band = static_cast<int>(bands_.size()) - 1;  // the strongest as reference
    p.pin = 0;
    p.plate = static_cast<int>(plates_.size()) - 1;
    Eval ref = evaluate(p, d);
    ++evaluations;
    // A layout whose reference (the strongest band, the smallest pin, the largest plate) fails
    // the layout rules or the screen is not pursued with other stock.
    if (!ref.geometry) return ref;
    const double P = ref.tension;
    const double r = b_.drum_diameters[static_cast<std::size_t>(p.drum)] / 2;
    const double sigma = b_.stock.band_allowable_stress;
    const double plim = b_.lining.pressure_limit > 0 ? b_.lining.pressure_limit : 1e300;
    int band = -1;
    for (std::size_t i = 0; i < bands_.size(); ++i) {
      const auto& x = bands_[i];
      if (b_.drum_width > 0 && x[0] > b_.drum_width) continue;
      if (P / (x[0] * x[1]) <= sigma && P / (x[0] * r) <= plim) {
        band = static_cast<int>(i);
        break;
      }
    }
    if (band < 0) {
      // Nothing in stock carries it: the widest-thickest that fits, for the violation figures.
      band = static_cast<int>(bands_.size()) - 1;
      while (band > 0 && b_.drum_width > 0 && bands_[static_cast<std::size_t>(band)][0] > b_.drum_width) --band;
    }
    const double tau = sigma / std::sqrt(3.0);
    int pin = static_cast<int>(b_.stock.pin_diameter.size()) - 1;
    for (std::size_t i = 0; i < b_.stock.pin_diameter.size(); ++i) {
      const double dp = b_.stock.pin_diameter[i];
      if (P / (2.0 * kPi * dp * dp / 4.0) <= tau) {
        pin = static_cast<int>(i);
        break;
      }
    }
    const double dp = b_.stock.pin_diameter[static_cast<std::size_t>(pin)];
    const double M = ref.lever_moment;
    int plate = static_cast<int>(plates_.size()) - 1;
    for (std::size_t i = 0; i < plates_.size(); ++i) {
      const double w = plates_[i][0], t = plates_[i][1];
      if (w / 2 - dp / 2 < min_wall(dp / 2)) continue;
      const double z = t * (w * w * w - dp * dp * dp) / (6.0 * w);
      if (M / z <= b_.stock.lever_allowable_stress) {
        plate = static_cast<int>(i);
        break;
      }
    }
    p.band = band;
    p.pin = pin;
    p.plate = plate;
    Eval e = evaluate(p, d);
    ++evaluations;
    // The thinner band moved the band line: if that alone fails a stress figure, one size up.
    for (int bump = 0; bump < 2 && e.geometry && !e.feasible && p.band + 1 < static_cast<int>(bands_.size()); ++bump) {
      if (e.binding != kBandStress && e.binding != kPressure) break;
      ++p.band;
      e = evaluate(p, d);
      ++evaluations;
    }
    return e;
  }

  Key key_of(const Eval& e) const {
    const Figures& f = e.fig;
    switch (b_.goal) {
      case Goal::force: return {f.force, f.band_mass};
      case Goal::band_mass: return {f.band_mass, f.force};
      case Goal::travel: return {f.travel, f.force};
      case Goal::size: return {f.size, f.force};
    }
    return {f.force, f.band_mass};
  }

  /// Two candidates are alike when they are the same arrangement (drum, kind, band sense, mounts)
  /// and their three pins moved less than 0.4 drum diameters in all (then only the better is
  /// kept): proposals must differ in more than a few millimetres.
  bool alike(const Params& x, const Params& y, BrakeKind kx, BrakeKind ky) const {
    if (x.drum != y.drum || x.sense != y.sense || x.mount_a != y.mount_a || x.mount_b != y.mount_b ||
        kx != ky) {
      return false;
    }
    const double D = b_.drum_diameters[static_cast<std::size_t>(x.drum)];
    return dist(x.a, y.a) + dist(x.b, y.b) + dist(x.pivot, y.pivot) < 0.4 * D;
  }

 private:
  /// An axis-aligned box: does the segment a–b, grown by `margin`, come near it?
  struct Box {
    double x0, y0, x1, y1;
    bool near(Vec2 a, Vec2 b, double margin) const {
      return std::min(a.x, b.x) - margin <= x1 && std::max(a.x, b.x) + margin >= x0 &&
             std::min(a.y, b.y) - margin <= y1 && std::max(a.y, b.y) + margin >= y0;
    }
  };
  const Brief& b_;
  std::vector<Box> keep_out_boxes_;
  double f_[3] = {0, 0, 0};
  double steel_density_ = 7850.0;
  std::vector<std::array<double, 2>> bands_;
  std::vector<std::array<double, 2>> plates_;
};

/// A best-first list that keeps no two alike.
class Shortlist {
 public:
  Shortlist(const Search& s, std::size_t capacity) : s_(&s), capacity_(capacity) {}

  void offer(const Found& f) {
    if (items_.size() >= capacity_ && !(f.key < items_.back().key)) return;
    for (std::size_t i = 0; i < items_.size(); ++i) {
      if (!s_->alike(items_[i].p, f.p, items_[i].e.kind, f.e.kind)) continue;
      if (!(f.key < items_[i].key)) return;  // a better one like it is already here
    }
    // Remove the worse ones it is like, then insert in order.
    items_.erase(std::remove_if(items_.begin(), items_.end(),
                                [&](const Found& x) { return s_->alike(x.p, f.p, x.e.kind, f.e.kind); }),
                 items_.end());
    const auto at = std::upper_bound(items_.begin(), items_.end(), f,
                                     [](const Found& a, const Found& b) { return a.key < b.key; });
    items_.insert(at, f);
    if (items_.size() > capacity_) items_.pop_back();
  }

  const std::vector<Found>& items() const { return items_; }

 private:
  const Search* s_;
  std::size_t capacity_;
  std::vector<Found> items_;
};

/// One slice of the coarse pass: a drum diameter, an arrangement (simple or both ends on the
/// lever) and a band sense.
struct Chunk {
  int drum = 0;
  bool simple = true;
  Turn sense = Turn::ccw;
};

struct ChunkResult {
  std::vector<Found> shortlist;
  std::vector<CloudPoint> cloud;
  long long layouts = 0, handles = 0, feasible = 0;
  bool any_geometry = false;
  /// For each limit, the candidate that meets every other limit and misses this one least.
  Found missing_one[kLimits];
  bool has_missing[kLimits] = {};
};

struct Samples {
  std::vector<Vec2> frame, lever, pivot, handle;
};

/// The coarse pass over one chunk.
ChunkResult run_chunk(const Search& s, const Samples& sm, const Chunk& c, std::size_t keep,
                      std::atomic<long long>& done) {
  const Brief& b = s.brief();
  ChunkResult out;
  // One shortlist per kind, so that the best of each kind survives to the end.
  Shortlist lists[3] = {Shortlist(s, keep), Shortlist(s, keep), Shortlist(s, keep)};
  Design d = s.prepared();
  auto consider = [&](Params p) {
    // Handle: the best sample for the goal among those the force, travel and grip allow. The
    // force at H is M/|H − O| (M, the actuating moment, does not depend on H).
    // The reference handle: the sample farthest from the pivot (clear of the holes, if any is).
    p.handle = sm.handle.front();
    for (const Vec2& h : sm.handle)
      if (dist(h, p.pivot) > dist(p.handle, p.pivot)) p.handle = h;
    long long evals = 0;
    Eval ref = s.choose_stock(p, d, evals);
    out.layouts += evals;
    if (!ref.geometry) return;
    out.any_geometry = true;
    const double M = ref.fig.force * dist(p.handle, p.pivot);  // force·arm, the moment needed
    const double rot = ref.fig.travel / dist(p.handle, p.pivot);
    const double pin_r = b.stock.pin_diameter[static_cast<std::size_t>(p.pin)] / 2;
    const double grip = hardware_rules::grip_diameter / 2 + pin_r + min_wall(pin_r);
    const double fmax = std::min(b.max_force, kHandForceCheck);
    int best = -1;
    Key best_key;
    int farthest = -1;
    for (std::size_t i = 0; i < sm.handle.size(); ++i) {
      const Vec2 h = sm.handle[i];
      ++out.handles;
      const double arm = dist(h, p.pivot);
      if (arm < grip) continue;
      if ((p.mount_a == Mount::lever && dist(h, p.a) < grip) || (p.mount_b == Mount::lever && dist(h, p.b) < grip)) continue;
      if (farthest < 0 || arm > dist(sm.handle[static_cast<std::size_t>(farthest)], p.pivot)) farthest = static_cast<int>(i);
      const double force = M / arm, travel = rot * arm;
      if (force > fmax * (1 + 1e-9)) continue;
      if (b.max_travel > 0 && travel > b.max_travel) continue;
      Figures f = ref.fig;
      f.force = force;
      f.travel = travel;
      f.size = arm;
      if (p.mount_a == Mount::lever) f.size = std::max(f.size, dist(p.a, p.pivot));
      if (p.mount_b == Mount::lever) f.size = std::max(f.size, dist(p.b, p.pivot));
      Eval tmp;
      tmp.fig = f;
      const Key k = s.key_of(tmp);
      if (best < 0 || k < best_key) {
        best = static_cast<int>(i);
        best_key = k;
      }
    }
    // Nothing meets the force and travel: the farthest handle, for the least-violation record.
    const int pick = best >= 0 ? best : farthest;
    if (pick < 0) return;
    p.handle = sm.handle[static_cast<std::size_t>(pick)];
    evals = 0;
    Eval e = s.choose_stock(p, d, evals);
    out.layouts += evals;
    if (!e.geometry) return;
    if (e.feasible) {
      ++out.feasible;
      out.cloud.push_back({e.fig.force, e.fig.band_mass});
      lists[static_cast<int>(e.kind)].offer({p, e, s.key_of(e)});
    } else {
      int missed = 0;
      for (int i = 0; i < kLimits; ++i) missed += e.excess[i] > 1e-12 ? 1 : 0;
      const int i = e.binding;
      if (missed == 1 && (!out.has_missing[i] || e.violation < out.missing_one[i].e.violation)) {
        out.missing_one[i] = {p, e, s.key_of(e)};
        out.has_missing[i] = true;
      }
    }
  };

  Params p;
  p.drum = c.drum;
  p.sense = c.sense;
  if (c.simple) {
    p.mount_a = Mount::frame;
    p.mount_b = Mount::lever;
    for (const Vec2& a : sm.frame) {
      for (const Vec2& bb : sm.lever) {
        if (dist(a, bb) < 1e-9) continue;
        for (const Vec2& o : sm.pivot) {
          if (dist(bb, o) < 1e-9) continue;
          p.a = a;
          p.b = bb;
          p.pivot = o;
          consider(p);
        }
        done.fetch_add(static_cast<long long>(sm.pivot.size()), std::memory_order_relaxed);
      }
    }
  } else {
    p.mount_a = Mount::lever;
    p.mount_b = Mount::lever;
    for (std::size_t i = 0; i < sm.lever.size(); ++i) {
      for (std::size_t j = i + 1; j < sm.lever.size(); ++j) {
        for (const Vec2& o : sm.pivot) {
          if (dist(sm.lever[i], o) < 1e-9 || dist(sm.lever[j], o) < 1e-9) continue;
          p.a = sm.lever[i];
          p.b = sm.lever[j];
          p.pivot = o;
          consider(p);
        }
        done.fetch_add(static_cast<long long>(sm.pivot.size()), std::memory_order_relaxed);
      }
    }
  }
  for (const Shortlist& l : lists) out.shortlist.insert(out.shortlist.end(), l.items().begin(), l.items().end());
  return out;
}

/// Compass search on the positions (Kolda, Lewis & Torczon 2003, §3.3): poll ± x and ± y of
/// each point in a fixed order, accept the first improvement, halve the step when none.
Found refine(const Search& s, Found start, double step0, long long& evaluations) {
  const Brief& b = s.brief();
  Design d = s.prepared();
  Found best = start;
  const Region& frame = or_pins(b.frame_pin, b);
  const Region& lever = or_pins(b.lever_pins, b);
  const Region& pivot = or_pins(b.pivot, b);
  const Vec2 dirs[4] = {{1, 0}, {-1, 0}, {0, 1}, {0, -1}};
  int budget = 6000;
  for (double step = step0; step >= 0.00025 && budget > 0; step /= 2) {
    bool improved = true;
    while (improved && budget > 0) {
      improved = false;
      for (int var = 0; var < 4 && !improved; ++var) {
        for (const Vec2& u : dirs) {
          Params p = best.p;
          Vec2* pt = var == 0 ? &p.a : var == 1 ? &p.b : var == 2 ? &p.pivot : &p.handle;
          const Region& r = var == 0 ? (p.mount_a == Mount::frame ? frame : lever)
                            : var == 1 ? (p.mount_b == Mount::frame ? frame : lever)
                            : var == 2 ? pivot : b.handle;
          const Vec2 moved = region_closest(r, {pt->x + step * u.x, pt->y + step * u.y});
          if (dist(moved, *pt) < 1e-7) continue;
          *pt = moved;
          --budget;
          Eval e = s.choose_stock(p, d, evaluations);
          if (!e.feasible) continue;
          const Key k = s.key_of(e);
          if (k < best.key) {
            best = {p, e, k};
            improved = true;
            break;
          }
        }
      }
    }
  }
  return best;
}

double round_to(double v, double grid) { return std::round(v / grid) * grid; }

/// The same candidate with positions on a tidy grid, if that keeps it feasible and in its regions.
Found tidy(const Search& s, const Found& f, long long& evaluations) {
  const Brief& b = s.brief();
  Design d = s.prepared();
  for (double grid : {kRound, 0.0001}) {
    Params p = f.p;
    for (Vec2* v : {&p.a, &p.b, &p.pivot, &p.handle}) *v = {round_to(v->x, grid), round_to(v->y, grid)};
    const Region& frame = or_pins(b.frame_pin, b);
    const Region& lever = or_pins(b.lever_pins, b);
    if (!region_contains(p.mount_a == Mount::frame ? frame : lever, p.a, 1e-9) ||
        !region_contains(p.mount_b == Mount::frame ? frame : lever, p.b, 1e-9) ||
        !region_contains(or_pins(b.pivot, b), p.pivot, 1e-9) || !region_contains(b.handle, p.handle, 1e-9)) {
      continue;
    }
    Eval e = s.choose_stock(p, d, evaluations);
    if (e.feasible) return {p, e, s.key_of(e)};
  }
  return f;
}

std::string mm_text(double m) { return fmt("%.1f mm", m * 1000); }

/// What would relax the binding limit of the best infeasible candidate.
std::string relax_hint(const Search& s, const Found& f) {
  const Brief& b = s.brief();
  const Eval& e = f.e;
  const int i = e.binding;
  const double value = e.value[i], limit = e.limit[i];
  switch (i) {
    case kForce: {
      const double arm = dist(f.p.handle, f.p.pivot);
      const double need = arm * value / limit;
      // The same moment over a longer arm: the travel grows in proportion.
      const double travel = f.e.fig.travel * need / arm;
      const std::string travel_note =
          b.max_travel > 0 && travel > b.max_travel
              ? " (its handle travel would be " + mm_text(travel) + ", so max_travel must grow too)"
              : "";
      return "the best needs " + fmt("%.0f N", value) + " against " + fmt("%.0f N", limit) +
             " with a " + mm_text(arm) + " lever arm; a handle region reaching " + mm_text(need) +
             " from the pivot at [" + mm_text(f.p.pivot.x) + ", " + mm_text(f.p.pivot.y) + "]" +
             travel_note + ", a larger [operator] max_force, or a lower [load] torque or service_factor "
             "would relax it" + (std::find(b.kinds.begin(), b.kinds.end(), BrakeKind::differential) == b.kinds.end()
                               ? "; a differential layout ([goal] kinds) needs less force" : "");
    }
    case kTravel:
      return "the best needs " + mm_text(value) + " of handle travel against max_travel " +
             mm_text(limit) + "; a larger max_travel, a smaller [limits] clearance, or a larger "
             "operator force (a shorter lever) would relax it";
    case kRotation:
      return "the best needs the lever to turn " + fmt("%.1f°", value * 180 / kPi) + " to take up the "
             "clearance, more than the " + fmt("%.0f°", limit * 180 / kPi) + " solve checks (the band-end "
             "arms about the pivot nearly cancel); a pins region that lets the lever pin sit further "
             "from the pivot, or a smaller [limits] clearance would relax it";
    case kPressure:
      return "the best reaches " + fmt("%.3g MPa", value / 1e6) + " lining pressure against " +
             fmt("%.3g MPa", limit / 1e6) + "; a band wider than the widest in [stock] band_width "
             "(by " + fmt("%.0f %%", 100 * (value / limit - 1)) + "), a larger drum or a larger wrap would relax it";
    case kBandStress:
      return "the best reaches " + fmt("%.3g MPa", value / 1e6) + " band stress against " +
             fmt("%.3g MPa", limit / 1e6) + "; a band section " + fmt("%.0f %%", 100 * (value / limit - 1)) +
             " larger than the largest in [stock], or a larger drum would relax it";
    case kPinShear:
      return "the best reaches " + fmt("%.3g MPa", value / 1e6) + " pin shear against " +
             fmt("%.3g MPa", limit / 1e6) + "; a pin of at least " +
             mm_text(b.stock.pin_diameter.back() * std::sqrt(value / limit)) + " in [stock] pin_diameter would relax it";
    case kLever:
      return "the best reaches " + fmt("%.3g MPa", value / 1e6) + " lever bending against " +
             fmt("%.3g MPa", limit / 1e6) + "; a lever plate with a section modulus " +
             fmt("%.0f %%", 100 * (value / limit - 1)) + " larger than the largest in [stock] would relax it";
    case kSelfLock:
      return "the best self-locks at f = " + fmt("%.3f", value) + ", below the margin × f_max = " +
             fmt("%.3f", limit) + "; a simple or summing layout, a smaller [limits] self_lock_margin, "
             "or allow_self_locking = true (for a backstop) would relax it";
    case kHoist:
      return "the torque × service factor, " + fmt("%.4g N·m", value) + ", is below the " +
             fmt("%.4g N·m", limit) + " that holds the hoist load (m·g·r_rope); raise [load] torque or "
             "service_factor";
    case kTemperature:
      return "the best reaches " + fmt("%.0f °C", value) + " after one stop against " + fmt("%.0f °C", limit) +
             "; a larger drum (more rim mass), a wider drum face ([drum] width) or a lining with a "
             "higher temperature limit would relax it";
    case kPower:
      return "the best reaches " + fmt("%.3g W/mm²", value / 1e6) + " per lining area against " +
             fmt("%.3g W/mm²", limit / 1e6) + "; a wider band, a larger drum or a larger wrap would relax it";
    case kRelease:
      return "in the released state (lever turned back by the release rotation) a band end of the "
             "best comes " + mm_text(value) + " too close to the other run or to the drum; a larger "
             "net lever arm (a smaller release rotation) or pins further from the drum would relax it";
    case kDiffLock:
      return "the best differential layout has a slack-to-tight arm ratio of " + fmt("%.2f", value) +
             " × e^(f_max·φ), below the " + fmt("%.1f", limit) + " solve checks; a simple or summing layout would relax it";
    default:
      return "";
  }
}

}  // namespace

ProposeResult propose(const Brief& brief, int threads, const ProgressFn& progress,
                      const BuildCheckFn& builds) {
  ProposeResult result;
  const Search s(brief);
  // About 36 pin samples and 40 handle samples: about 100 000 layouts per drum and arrangement.
  const Region& frame_r = or_pins(brief.frame_pin, brief);
  const Region& lever_r = or_pins(brief.lever_pins, brief);
  const Region& pivot_r = or_pins(brief.pivot, brief);
  Samples sm;
  const int target = 36;
  sm.frame = sample(frame_r, spacing_for(frame_r, target));
  sm.lever = sample(lever_r, spacing_for(lever_r, target));
  sm.pivot = sample(pivot_r, spacing_for(pivot_r, target));
  sm.handle = sample(brief.handle, spacing_for(brief.handle, 40));
  const double step0 = std::max(spacing_for(brief.pins, target) / 2, 0.002);

  std::vector<Chunk> chunks;
  const bool want_simple = std::find(brief.kinds.begin(), brief.kinds.end(), BrakeKind::simple) != brief.kinds.end();
  const bool want_both = std::find(brief.kinds.begin(), brief.kinds.end(), BrakeKind::differential) != brief.kinds.end() ||
                         std::find(brief.kinds.begin(), brief.kinds.end(), BrakeKind::summing) != brief.kinds.end();
  for (int dr = 0; dr < static_cast<int>(brief.drum_diameters.size()); ++dr) {
    for (Turn sense : {Turn::ccw, Turn::cw}) {
      if (want_simple) chunks.push_back({dr, true, sense});
      if (want_both) chunks.push_back({dr, false, sense});
    }
  }
  long long total = 0;
  for (const Chunk& c : chunks) {
    total += c.simple ? static_cast<long long>(sm.frame.size() * sm.lever.size() * sm.pivot.size())
                      : static_cast<long long>(sm.lever.size() * (sm.lever.size() - 1) / 2 * sm.pivot.size());
  }
  const std::size_t keep = static_cast<std::size_t>(std::max(8, 3 * brief.proposals));
  std::vector<ChunkResult> results(chunks.size());
  std::atomic<std::size_t> next{0};
  std::atomic<long long> done{0};
  std::atomic<bool> finished{false};
  auto worker = [&] {
    for (std::size_t i = next.fetch_add(1); i < chunks.size(); i = next.fetch_add(1)) {
      results[i] = run_chunk(s, sm, chunks[i], keep, done);
    }
  };
  {
    std::vector<std::thread> pool;
    for (int t = 1; t < std::max(1, threads); ++t) pool.emplace_back(worker);
    std::thread reporter;
    if (progress) {
      reporter = std::thread([&] {
        while (!finished.load()) {
          progress(total > 0 ? 0.8 * static_cast<double>(done.load()) / static_cast<double>(total) : 0.0,
                   "searching layouts");
          std::this_thread::sleep_for(std::chrono::milliseconds(200));
        }
      });
    }
    worker();
    for (auto& t : pool) t.join();
    finished = true;
    if (reporter.joinable()) reporter.join();
  }

  // Merge in chunk order (deterministic whatever the threads did).
  Shortlist merged[3] = {Shortlist(s, keep), Shortlist(s, keep), Shortlist(s, keep)};
  bool any_geometry = false;
  const Found* missing_one[kLimits] = {};
  for (const ChunkResult& r : results) {
    result.stats.layouts += r.layouts;
    result.stats.handles += r.handles;
    result.stats.feasible += r.feasible;
    any_geometry = any_geometry || r.any_geometry;
    for (const Found& f : r.shortlist) merged[static_cast<int>(f.e.kind)].offer(f);
    result.cloud.insert(result.cloud.end(), r.cloud.begin(), r.cloud.end());
    for (int i = 0; i < kLimits; ++i) {
      if (r.has_missing[i] && (missing_one[i] == nullptr || r.missing_one[i].e.violation < missing_one[i]->e.violation)) {
        missing_one[i] = &r.missing_one[i];
      }
    }
  }
  // A deterministic subsample for the plot.
  if (result.cloud.size() > 3000) {
    std::vector<CloudPoint> thin;
    const double stride = static_cast<double>(result.cloud.size()) / 3000.0;
    for (int i = 0; i < 3000; ++i) thin.push_back(result.cloud[static_cast<std::size_t>(i * stride)]);
    result.cloud = std::move(thin);
  }

  // Refine each shortlisted candidate, then keep the distinct ones in order.
  if (progress) progress(0.8, "refining the shortlist");
  long long evals = 0;
  std::vector<Found> refined;
  for (const Shortlist& m : merged)
    for (const Found& f : m.items()) refined.push_back(tidy(s, refine(s, f, step0, evals), evals));
  result.stats.layouts += evals;
  result.stats.shortlisted = static_cast<int>(refined.size());
  std::stable_sort(refined.begin(), refined.end(), [](const Found& a, const Found& b) { return a.key < b.key; });

  // Read each back exactly as `solve` and `build` will, and keep those that pass everything.
  if (progress) progress(0.95, "checking the proposals in full");
  struct Passed {
    Found f;
    Design d;
    Solution sol;
    std::string why_chosen;
  };
  std::vector<Passed> passed;
  for (const Found& f : refined) {
    bool like = false;
    for (const Passed& a : passed) like = like || s.alike(a.f.p, f.p, a.f.e.kind, f.e.kind);
    if (like) continue;
    ++result.stats.validated;
    Design d = s.design_of(f.p);
    std::string why;
    Solution sol;
    try {
      sol = solve(d);
    } catch (const DesignError& e) {
      why = std::string("layout refused: ") + e.what();
    }
    if (why.empty()) {
      for (const Check& c : sol.checks) {
        if (!c.ok) {
          why = "check " + c.id + " fails (" + c.note + ")";
          break;
        }
      }
    }
    if (why.empty() && !sol.hardware.refusal.empty()) why = "hardware: " + sol.hardware.refusal;
    if (why.empty() && !sol.hardware.release_ok) why = "hardware: " + sol.hardware.release_problem;
    if (why.empty()) {
      const DirectionResult& r0 = sol.results[sol.primary_a_tight ? 0 : 1][0];
      if (r0.lever_force > brief.max_force * (1 + 1e-9)) why = "operator force above max_force on read-back";
    }
    if (!why.empty()) {
      ++result.stats.rejected;
      if (result.stats.rejections.size() < 5) result.stats.rejections.push_back(why);
      continue;
    }
    passed.push_back({f, std::move(d), std::move(sol), ""});
  }
  // The best overall, then the best of each other kind, then the rest in order: a reviewer
  // sees the alternatives, not only variations of the winner. With a build check, a candidate
  // whose solids cannot be built is passed over for the next.
  std::vector<std::pair<std::size_t, std::string>> order;
  if (!passed.empty()) order.push_back({0, "best found"});
  for (BrakeKind k : {BrakeKind::simple, BrakeKind::differential, BrakeKind::summing}) {
    for (std::size_t i = 0; i < passed.size(); ++i) {
      if (passed[i].f.e.kind != k) continue;
      order.push_back({i, std::string("best ") + to_string(k) + " layout found"});
      break;
    }
  }
  for (std::size_t i = 0; i < passed.size(); ++i) order.push_back({i, "next best distinct layout"});
  std::vector<std::size_t> chosen;
  std::vector<std::size_t> tried;
  bool first_taken = false;
  for (const auto& [i, why] : order) {
    if (static_cast<int>(chosen.size()) >= brief.proposals) break;
    if (std::find(tried.begin(), tried.end(), i) != tried.end()) continue;
    tried.push_back(i);
    if (builds) {
      if (progress) progress(0.96, "building the proposals");
      const std::string fault = builds(passed[i].d, passed[i].sol);
      ++result.stats.built;
      if (!fault.empty()) {
        ++result.stats.rejected;
        if (result.stats.rejections.size() < 5) result.stats.rejections.push_back("build: " + fault);
        continue;
      }
    }
    // The first one taken is the best that builds, whatever the order said.
    passed[i].why_chosen = first_taken ? why : "best found";
    first_taken = true;
    chosen.push_back(i);
  }
  std::sort(chosen.begin(), chosen.end());
  for (std::size_t i : chosen) {
    Proposal prop;
    prop.design = std::move(passed[i].d);
    prop.kind = passed[i].f.e.kind;
    prop.figures = passed[i].f.e.fig;
    prop.reason = passed[i].why_chosen;
    result.proposals.push_back(std::move(prop));
  }

  // Names, reasons and margins.
  for (std::size_t i = 0; i < result.proposals.size(); ++i) {
    Proposal& p = result.proposals[i];
    p.design.project.number = brief.project.number + "-P" + std::to_string(i + 1);
    p.design.project.title = brief.project.title + " (proposal " + std::to_string(i + 1) + ")";
    const Figures& f = p.figures;
    const char* goal_text = brief.goal == Goal::force       ? "lowest operator force"
                            : brief.goal == Goal::band_mass ? "lightest band"
                            : brief.goal == Goal::travel    ? "shortest handle travel"
                                                            : "shortest lever";
    p.reason += std::string(" for the ") + goal_text + " (" + to_string(p.kind) + " brake, " +
                fmt("%.0f°", f.wrap * 180 / kPi) + " wrap)";
    auto margin = [](const char* what, double v, double lim, const char* unit, double scale) {
      return std::string(what) + " " + fmt("%.4g", v * scale) + " " + unit + " of " + fmt("%.4g", lim * scale) +
             " " + unit + " (" + fmt("%.0f %% margin", 100 * (1 - v / lim)) + ")";
    };
    const double fmax = std::min(brief.max_force, kHandForceCheck);
    p.margins.push_back(margin("operator force", f.force, fmax, "N", 1));
    if (brief.lining.pressure_limit > 0)
      p.margins.push_back(margin("lining pressure", f.pressure, brief.lining.pressure_limit, "MPa", 1e-6));
    p.margins.push_back(margin("band stress", f.band_stress, brief.stock.band_allowable_stress, "MPa", 1e-6));
    p.margins.push_back(margin("pin shear", f.pin_shear, p.design.band.pin_allowable_shear, "MPa", 1e-6));
    p.margins.push_back(margin("lever bending", f.lever_stress, brief.stock.lever_allowable_stress, "MPa", 1e-6));
    if (brief.max_travel > 0) p.margins.push_back(margin("handle travel", f.travel, brief.max_travel, "mm", 1e3));
    if (std::isfinite(f.self_lock_friction)) {
      p.margins.push_back("self-locks at f = " + fmt("%.3f", f.self_lock_friction) + "; limit " +
                          fmt("%.3f", brief.self_lock_margin * s.friction(2)) + " (" +
                          fmt("%.2f", brief.self_lock_margin) + " × f_max " + fmt("%.2f", s.friction(2)) + ")");
    } else {
      p.margins.push_back("cannot self-lock at any friction (both band tensions resist the lever)");
    }
  }

  if (result.proposals.empty()) {
    std::string msg = "no layout in the space holds " + fmt("%.4g N·m", brief.torque * brief.service_factor) +
                      " (torque × service factor) under " + fmt("%.0f N", brief.max_force);
    if (!any_geometry) {
      msg += ": no arrangement of the pins in [space] is geometrically possible (each pin needs to lie "
             "outside the band line, clear of the other run, with room for the lever holes and the grip)"
             "; make the pins region larger or move it further from the drum";
    } else if (result.stats.feasible == 0) {
      // The closest candidates each miss one limit: name them, the nearest first.
      std::vector<const Found*> near;
      for (const Found* f : missing_one)
        if (f != nullptr) near.push_back(f);
      std::stable_sort(near.begin(), near.end(),
                       [](const Found* a, const Found* b) { return a->e.violation < b->e.violation; });
      if (near.empty()) {
        msg += ": every layout in the space misses two or more limits at once (operator force, travel, "
               "pressure, stresses, self-locking); give the brake more room or a larger force";
      } else {
        msg += near.size() == 1 ? ":" : "; the closest layouts each miss one limit:";
        for (const Found* f : near) {
          msg += std::string("\n  - ") + kLimitNames[f->e.binding] + " binds: " + relax_hint(s, *f);
        }
      }
    } else {
      msg += ": " + std::to_string(result.stats.feasible) + " layouts passed the search, but none passed the "
             "full checks and the hardware plan";
      for (const std::string& r : result.stats.rejections) msg += "\n  - " + r;
    }
    result.infeasible = msg;
  }
  if (progress) progress(1.0, "done");
  return result;
}

struct CandidateSample::Impl {
  explicit Impl(const Brief& b) : search(b), scratch(search.prepared()) {}
  Search search;
  std::vector<Params> params;
  mutable Design scratch;
};

CandidateSample::CandidateSample(const Brief& brief, long long count, bool solved_only)
    : impl_(std::make_unique<Impl>(brief)) {
  // The coarse pass's own candidates (simple arrangement, both senses), in its order, with the
  // handle farthest from the pivot and a middle stock: what run_chunk() evaluates first.
  const Search& s = impl_->search;
  const Region& frame_r = or_pins(brief.frame_pin, brief);
  const Region& lever_r = or_pins(brief.lever_pins, brief);
  const Region& pivot_r = or_pins(brief.pivot, brief);
  const std::vector<Vec2> frame = sample(frame_r, spacing_for(frame_r, 36));
  const std::vector<Vec2> lever = sample(lever_r, spacing_for(lever_r, 36));
  const std::vector<Vec2> pivot = sample(pivot_r, spacing_for(pivot_r, 36));
  const std::vector<Vec2> handles = sample(brief.handle, spacing_for(brief.handle, 40));
  Params p;
  p.mount_a = Mount::frame;
  p.mount_b = Mount::lever;
  p.band = static_cast<int>(s.bands().size()) / 2;
  p.pin = static_cast<int>(brief.stock.pin_diameter.size()) / 2;
  p.plate = static_cast<int>(s.plates().size()) - 1;
  std::vector<Params>& out = impl_->params;
  for (int round = 0; round < 1000 && static_cast<long long>(out.size()) < count; ++round) {
    const std::size_t before = out.size();
    for (Turn sense : {Turn::cw, Turn::ccw}) {
      p.sense = sense;
      for (const Vec2& a : frame) {
        for (const Vec2& b : lever) {
          for (const Vec2& o : pivot) {
            if (static_cast<long long>(out.size()) >= count) return;
            p.a = a;
            p.b = b;
            p.pivot = o;
            p.handle = handles.front();
            for (const Vec2& h : handles)
              if (dist(h, o) > dist(p.handle, o)) p.handle = h;
            if (solved_only && !s.evaluate(p, impl_->scratch).geometry) continue;
            out.push_back(p);
          }
        }
      }
    }
    if (out.size() == before) return;  // nothing qualifies
  }
}

CandidateSample::~CandidateSample() = default;

long long CandidateSample::size() const { return static_cast<long long>(impl_->params.size()); }

long long CandidateSample::evaluate() const {
  long long feasible = 0;
  for (const Params& p : impl_->params) feasible += impl_->search.evaluate(p, impl_->scratch).feasible ? 1 : 0;
  return feasible;
}

}  // namespace bandforge
