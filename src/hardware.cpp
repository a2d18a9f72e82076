#include "src/hardware.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <cstdio>
#include <numbers>
#include <optional>
#include <string>
#include <vector>

#include "src/band_path.hpp"
#include "src/errors.hpp"
#include "src/mechanics.hpp"
#include "src/proportions.hpp"

namespace bandforge {
namespace {

using hardware_rules::axial_gap;
using hardware_rules::clearance;
using hardware_rules::grip_diameter;
using hardware_rules::grip_length;
constexpr double pi = std::numbers::pi;

// ---- Materials and limits of the generated parts -------------------------------------------

// Brackets and end blocks: structural steel S235 (EN 10025-2). Yield strength by thickness:
// 235 MPa up to 16 mm, 225 MPa to 40 mm, 215 MPa to 63 mm (EN 10025-2 Table 7, from memory).
double s235_yield(double thickness) {
  if (thickness <= 0.016 + 1e-12) return 235e6;
  if (thickness <= 0.040 + 1e-12) return 225e6;
  return 215e6;
}
const char* kYieldSource = "S235 yield by thickness, EN 10025-2 Table 7 (from memory)";
// Allowable stresses as fractions of the yield strength, AISC Specification for Structural Steel
// Buildings, allowable stress design (1989), from memory: bearing on pins in bored holes
// 0.90 F_y (J8.1), bending 0.60 F_y (F1), tension on the net section of a pin-connected part
// 0.45 F_y (D3.1), shear 0.40 F_y (F4).
constexpr double kBearingFactor = 0.90, kBendingFactor = 0.60, kPinPlateTension = 0.45,
                 kShearFactor = 0.40;
// Fillet weld metal in shear on the throat: 0.30 S_ut of the electrode (AISC, as tabulated in
// Shigley 9th ed. Table 9-4); E70xx electrode S_ut = 482 MPa (Shigley 9th ed. Table 9-3).
// Both from memory.
constexpr double kWeldShear = 0.30 * 482e6;

// Stock plate thicknesses for brackets [m] (common practice, no source).
constexpr double kPlateSeries[] = {0.005, 0.006, 0.008, 0.010, 0.012, 0.015, 0.020,
                                   0.025, 0.030, 0.035, 0.040, 0.050};
// Solid rivet nominal diameters [m]: the round-head series of DIN 660 (5–8 mm) and DIN 124
// (10–20 mm), src/standard_parts.cpp.
constexpr double kRivetSeries[] = {0.005, 0.006, 0.008, 0.010, 0.012, 0.014, 0.016, 0.020};

// ---- Plane geometry -------------------------------------------------------------------------

double dist(Vec2 p, Vec2 q) { return std::hypot(p.x - q.x, p.y - q.y); }
Vec2 add(Vec2 p, Vec2 u, double s) { return {p.x + s * u.x, p.y + s * u.y}; }
double cross(Vec2 o, Vec2 a, Vec2 b) { return (a.x - o.x) * (b.y - o.y) - (a.y - o.y) * (b.x - o.x); }

double point_segment(Vec2 p, Vec2 a, Vec2 b) {
  const double dx = b.x - a.x, dy = b.y - a.y, l2 = dx * dx + dy * dy;
  double t = l2 > 0 ? ((p.x - a.x) * dx + (p.y - a.y) * dy) / l2 : 0;
  t = std::clamp(t, 0.0, 1.0);
  return std::hypot(p.x - a.x - t * dx, p.y - a.y - t * dy);
}

bool segments_cross(Vec2 a, Vec2 b, Vec2 c, Vec2 d) {
  const double d1 = cross(c, d, a), d2 = cross(c, d, b), d3 = cross(a, b, c), d4 = cross(a, b, d);
  return ((d1 > 0) != (d2 > 0)) && ((d3 > 0) != (d4 > 0));
}

double segment_segment(Vec2 a, Vec2 b, Vec2 c, Vec2 d) {
  if (segments_cross(a, b, c, d)) return 0;
  return std::min({point_segment(a, c, d), point_segment(b, c, d), point_segment(c, a, b),
                   point_segment(d, a, b)});
}

// Counter-clockwise convex hull (Andrew's monotone chain); duplicates removed.
std::vector<Vec2> hull(std::vector<Vec2> p) {
  std::sort(p.begin(), p.end(), [](Vec2 a, Vec2 b) { return a.x < b.x || (a.x == b.x && a.y < b.y); });
  p.erase(std::unique(p.begin(), p.end(), [](Vec2 a, Vec2 b) { return dist(a, b) < 1e-12; }), p.end());
  if (p.size() < 3) return p;
  std::vector<Vec2> h(2 * p.size());
  std::size_t k = 0;
  for (std::size_t i = 0; i < p.size(); ++i) {
    while (k >= 2 && cross(h[k - 2], h[k - 1], p[i]) <= 0) --k;
    h[k++] = p[i];
  }
  for (std::size_t i = p.size() - 1, t = k + 1; i-- > 0;) {
    while (k >= t && cross(h[k - 2], h[k - 1], p[i]) <= 0) --k;
    h[k++] = p[i];
  }
  h.resize(k - 1);
  return h;
}

bool inside_hull(Vec2 p, const std::vector<Vec2>& h) {
  if (h.size() < 3) return false;
  for (std::size_t i = 0; i < h.size(); ++i) {
    if (cross(h[i], h[(i + 1) % h.size()], p) < 0) return false;
  }
  return true;
}

// Distance from p to the hull polygon (0 inside).
double to_hull(Vec2 p, const std::vector<Vec2>& h) {
  if (h.empty()) return 1e9;
  if (h.size() == 1) return dist(p, h[0]);
  if (inside_hull(p, h)) return 0;
  double d = 1e9;
  for (std::size_t i = 0; i < h.size(); ++i) d = std::min(d, point_segment(p, h[i], h[(i + 1) % h.size()]));
  return d;
}

std::string mm(double metres, int decimals = 1) {
  char buf[48];
  std::snprintf(buf, sizeof buf, "%.*f", decimals, metres * 1000);
  return buf;
}

std::string end_key(const std::string& id) {
  return id == "A" ? "band.end_a.at" : id == "B" ? "band.end_b.at" : "lever.pivot";
}

// ---- Loads ----------------------------------------------------------------------------------

// Largest tension at end A (a = true) or B over both directions and the friction range.
double end_tension(const Solution& s, bool a) {
  double t = 0;
  for (int dir = 0; dir < 2; ++dir) {
    for (const DirectionResult& r : s.results[dir]) {
      t = std::max(t, (dir == 0) == a ? r.tension_tight : r.tension_slack);
    }
  }
  return t;
}

double pivot_load(const Solution& s) {
  double f = 0;
  for (const auto& dir : s.results) {
    for (const DirectionResult& r : dir) f = std::max(f, std::hypot(r.pivot_reaction.x, r.pivot_reaction.y));
  }
  return f;
}

// ---- The band's footprint in the front view --------------------------------------------------

struct Footprint {
  double band_outer = 0;  // radius of the band's outside face on the drum
  struct Run {
    Vec2 from, to;        // tangent point → pin
    double half = 0;      // strip half-thickness
    double end_radius = 0;  // eye or block round the pin
  };
  std::array<Run, 2> runs;
  // A riveted lap beside its run: the tail and the manufactured heads outside, the round closing
  // heads inside (the band solid and the rivets of geometry/assemble.cpp), as strips.
  std::vector<Run> laps;
};

Footprint footprint(const Layout& L, double t, const std::array<double, 2>& end_radius,
                    const std::array<const JointPlan*, 2>& joints = {nullptr, nullptr}) {
  Footprint f;
  f.band_outer = L.r_band + t / 2;
  const EndLayout* e[2] = {&L.a, &L.b};
  for (int i = 0; i < 2; ++i) f.runs[i] = {e[i]->tangent_point, e[i]->pin, t / 2, end_radius[i]};
  for (int i = 0; i < 2; ++i) {
    const JointPlan* j = joints[static_cast<std::size_t>(i)];
    if (!j || j->kind == JointKind::welded_block || j->rivet_at.empty()) continue;
    const Vec2 u = e[i]->run_dir, tp = e[i]->tangent_point;
    Vec2 n{-u.y, u.x};
    if (n.x * tp.x + n.y * tp.y < 0) n = {u.y, -u.x};  // outward, away from the drum
    const double h = t / 2, k = j->rivets.size.k, a = j->rivets.size.dk / 2;
    const double s0 = j->rivet_at.back() - a, s1 = j->rivet_at.front() + a;  // the rows' heads
    const double lap_end = j->rivet_at.front() + j->edge;                    // ρ + lap
    auto strip = [&](double from, double to, double offset, double half) {
      f.laps.push_back({add(add(e[i]->pin, u, from), n, offset), add(add(e[i]->pin, u, to), n, offset), half, 0});
    };
    strip(std::min(s0, lap_end - j->lap), std::max(s1, lap_end), 2 * h + k / 2, h + k / 2);
    if (j->rivets.closing_height() > 0) strip(s0, s1, -(h + k / 2), k / 2);
  }
  return f;
}

// Clearance between a disc (c, r) and the band (its arc annulus, runs and end fittings).
double disc_to_band(Vec2 c, double r, const Footprint& f) {
  double d = std::hypot(c.x, c.y) - r - f.band_outer;
  for (const auto& run : f.runs) {
    d = std::min(d, point_segment(c, run.from, run.to) - run.half - r);
    d = std::min(d, dist(c, run.to) - run.end_radius - r);
  }
  for (const auto& lap : f.laps) d = std::min(d, point_segment(c, lap.from, lap.to) - lap.half - r);
  return d;
}

// ---- Joints ---------------------------------------------------------------------------------

struct JointInput {
  std::string end;
  double tension = 0;  // [N]
  double run = 0;      // free run [m]
  double t = 0, b = 0, pin_r = 0;
  double tau = 0;      // rivet allowable shear [Pa]
  double sigma = 0;    // band allowable tension, gross [Pa]
};

struct JointResult {
  JointPlan plan;
  std::vector<Check> checks;
  bool fits = false;
  bool passes = false;
};


// Net-section allowable of the band at a rivet row: the gross allowable of the textbook
// examples allows for a joint efficiency of 0.6 or better (REFERENCE: typical riveted-end
// efficiency 0.6–0.85, common practice), so the net section may reach allowable / 0.6.
constexpr double kJointEfficiency = 0.6;
// Rivet bearing on the band: twice the rivet's allowable shear (common practice, no source).
constexpr double kRivetBearingFactor = 2.0;

void riveted_checks(const JointInput& in, JointResult& r) {
  const JointPlan& j = r.plan;
  const std::string id = "joint_" + std::string(in.end == "A" ? "a" : "b");
  const std::string who = "End " + in.end + " joint (" + to_string(j.kind) + ")";
  const int n = j.rows * j.columns;
  const double area = pi * j.rivet * j.rivet / 4;
  const std::string note = std::to_string(j.rows) + " rows × " + std::to_string(j.columns) +
                           " Ø" + mm(j.rivet, 0) + " mm rivets, largest tension " +
                           std::to_string(static_cast<long>(std::lround(in.tension))) + " N";
  r.checks.push_back(make_check(id + "_rivet_shear", who + ": rivet shear τ = P/(n·πd²/4)",
                                in.tension / (n * area), in.tau, "Pa", true,
                                "the pin allowable shear (band.pin_allowable_shear; "
                                "default allowable/√3, distortion-energy relation)",
                                note));
  r.checks.push_back(make_check(id + "_rivet_bearing", who + ": rivet bearing on the band σ = P/(n·d·t)",
                                in.tension / (n * j.rivet * in.t), kRivetBearingFactor * in.tau, "Pa", true,
                                "2 × rivet allowable shear (common practice, no source)", note));
  const double net = (in.b - j.columns * j.rivet) * in.t;
  r.checks.push_back(make_check(id + "_net_section",
                                who + ": band net section at the first row σ = P/((b − n_c·d)·t)",
                                net > 0 ? in.tension / net : 1e30, in.sigma / kJointEfficiency, "Pa", true,
                                "band allowable / 0.6: the gross allowable of textbook examples "
                                "allows for a riveted-end efficiency of 0.6–0.85 (common practice, "
                                "no source)",
                                note));
}

// The riveted eye lap as bandforge has always made it: d = max(5 mm, 2t) rounded up to a whole
// millimetre, edge 2d, pitch 3d, as many columns as fit, at least two rows (common practice).
JointResult riveted_lap(const JointInput& in) {
  JointResult r;
  JointPlan& j = r.plan;
  j.kind = JointKind::riveted_lap;
  j.end = in.end;
  j.tension = in.tension;
  j.rivet = std::max(0.005, std::ceil(2 * in.t * 1000 - 1e-9) / 1000);
  j.edge = 2 * j.rivet;
  j.pitch = 3 * j.rivet;
  j.room = in.run - (in.pin_r + in.t / 2);
  if (in.b < 2 * j.edge) return r;  // too narrow for the rivets
  j.columns = static_cast<int>(std::floor((in.b - 2 * j.edge) / j.pitch + 1e-9)) + 1;
  for (int k = 0; k < j.columns; ++k) {
    j.across.push_back(j.columns == 1 ? in.b / 2 : j.edge + k * (in.b - 2 * j.edge) / (j.columns - 1));
  }
  const double per_rivet = in.tau * pi * j.rivet * j.rivet / 4;
  const int need = static_cast<int>(std::ceil(in.tension / per_rivet - 1e-9));
  j.rows = std::max(2, (need + j.columns - 1) / j.columns);
  j.rivet_capacity = per_rivet * j.rows * j.columns;
  j.lap = 2 * j.edge + (j.rows - 1) * j.pitch;
  j.needs = j.lap;
  r.fits = j.needs <= j.room;
  riveted_checks(in, r);
  r.passes = std::all_of(r.checks.begin(), r.checks.end(), [](const Check& c) { return c.ok; });
  return r;
}

// A shorter riveted lap: a rivet from the standard series and the least spacings of
// EN 1993-1-8 Table 3.3 (end and edge 1.2 d0, pitch 2.2 d0 along, 2.4 d0 across; from memory),
// the combination of diameter and columns that gives the shortest lap passing its checks.
JointResult riveted_compact(const JointInput& in) {
  std::optional<JointResult> best, shortest;  // passing its checks / any, by lap
  const double d_min = std::max(0.005, in.t);
  for (double d : kRivetSeries) {
    if (d < d_min - 1e-12) continue;
    const double e = 1.2 * d, p1 = 2.2 * d, p2 = 2.4 * d;
    if (in.b < 2 * e) break;
    const int max_cols = static_cast<int>(std::floor((in.b - 2 * e) / p2 + 1e-9)) + 1;
    for (int cols = max_cols; cols >= 1; --cols) {
      JointResult r;
      JointPlan& j = r.plan;
      j.kind = JointKind::riveted_compact;
      j.end = in.end;
      j.tension = in.tension;
      j.rivet = d;
      j.edge = e;
      j.pitch = p1;
      j.columns = cols;
      j.room = in.run - (in.pin_r + in.t / 2);
      for (int k = 0; k < cols; ++k) {
        j.across.push_back(cols == 1 ? in.b / 2 : e + k * (in.b - 2 * e) / (cols - 1));
      }
      const double per_rivet = in.tau * pi * d * d / 4;
      const int need = static_cast<int>(std::ceil(in.tension / per_rivet - 1e-9));
      j.rows = std::max(2, (need + cols - 1) / cols);
      j.rivet_capacity = per_rivet * j.rows * cols;
      j.lap = 2 * e + (j.rows - 1) * p1;
      j.needs = j.lap;
      riveted_checks(in, r);
      r.passes = std::all_of(r.checks.begin(), r.checks.end(), [](const Check& c) { return c.ok; });
      r.fits = j.needs <= j.room;
      if (!shortest || j.needs < shortest->plan.needs - 1e-12) shortest = r;
      if (!r.passes) continue;
      if (!best || j.needs < best->plan.needs - 1e-12) best = r;
    }
  }
  if (best) return *best;
  if (shortest) return *shortest;  // nothing passes: the shortest, its failing checks reported
  JointResult none;
  none.plan.kind = JointKind::riveted_compact;
  none.plan.end = in.end;
  none.plan.tension = in.tension;
  none.plan.room = in.run - (in.pin_r + in.t / 2);
  none.plan.needs = 1e9;
  return none;
}

// A welded end block: a steel block (band width along the drum axis) with the pin bore, the
// band end in a slot on the block's mid-plane (so that the tension still acts through the pin
// centre), fillet welds of leg t across both faces at the slot mouth. Sized from the tension:
// ligaments beside the bore for net-section tension, the end beyond the bore for shear-out.
JointResult welded_block(const JointInput& in, const Layout& L, bool a) {
  JointResult r;
  JointPlan& j = r.plan;
  j.kind = JointKind::welded_block;
  j.end = in.end;
  j.tension = in.tension;
  const double d = 2 * in.pin_r;
  const double fy = s235_yield(in.b);
  const double wall = std::max(0.002, 0.5 * in.pin_r);  // least material round a hole
  const double ligament = std::max(wall, in.tension / (2 * in.b * kPinPlateTension * fy));
  const double beyond = std::max(std::max(wall, 0.5 * d), in.tension / (2 * in.b * kShearFactor * fy));
  j.block_height = std::max(d + 2 * ligament, in.t + 4 * in.t);
  j.block_front = in.pin_r + beyond;
  j.slot_depth = std::max(3 * in.t, 0.008);
  j.block_back = in.pin_r + wall + j.slot_depth;
  j.weld_leg = in.t;
  j.room = in.run;
  j.needs = j.block_back + j.weld_leg + clearance;
  // The block's corners on the drum side must clear the band on the drum.
  const EndLayout& e = a ? L.a : L.b;
  const Vec2 u = e.run_dir, n{-u.y, u.x};
  for (double side : {-1.0, 1.0}) {
    const Vec2 corner = add(add(e.pin, u, j.block_back), n, side * j.block_height / 2);
    const double short_by = L.r_band + in.t / 2 + clearance - std::hypot(corner.x, corner.y);
    if (short_by > 0) j.needs = std::max(j.needs, j.room + short_by);
  }
  r.fits = j.needs <= j.room;
  const std::string id = "joint_" + std::string(a ? "a" : "b");
  const std::string who = "End " + in.end + " joint (welded-block)";
  const std::string note = "block " + mm(j.block_front + j.block_back, 0) + " × " +
                           mm(j.block_height, 0) + " × " + mm(in.b, 0) + " mm, bore Ø" +
                           mm(d, 0) + " mm, largest tension " +
                           std::to_string(static_cast<long>(std::lround(in.tension))) + " N";
  r.checks.push_back(make_check(id + "_weld_throat",
                                who + ": fillet weld throat shear τ = P/(0.707·h·2b)",
                                in.tension / (0.707 * j.weld_leg * 2 * in.b), kWeldShear, "Pa", true,
                                "0.30 S_ut, E70xx S_ut = 482 MPa (AISC, Shigley 9th ed. "
                                "Tables 9-3 and 9-4; from memory); formula: Shigley 9th ed. §9-3",
                                note));
  r.checks.push_back(make_check(id + "_block_bearing", who + ": bearing in the bore σ = P/(d·b)",
                                in.tension / (d * in.b), kBearingFactor * fy, "Pa", true,
                                std::string("0.90 F_y (AISC ASD 1989 J8.1, from memory); ") +
                                    kYieldSource,
                                note));
  r.checks.push_back(make_check(id + "_block_net", who + ": net section at the bore σ = P/((H − d)·b)",
                                in.tension / ((j.block_height - d) * in.b), kPinPlateTension * fy,
                                "Pa", true,
                                std::string("0.45 F_y, pin-connected part (AISC ASD 1989 "
                                            "D3.1, from memory); ") + kYieldSource,
                                note));
  r.passes = std::all_of(r.checks.begin(), r.checks.end(), [](const Check& c) { return c.ok; });
  return r;
}

// The rows of a riveted lap along the run, and the rivet that closes them: a round closing head
// (a spherical cap d_k × k, the manufactured head's form) stands below the run's drum-side face;
// near the tangent point that face comes close to the band's circle r_b − t/2 (lining face, or
// the drum for a bare band), so where a round head would come within `clearance` of it the
// joint's rivets are closed flush instead (countersunk into the run). Never a refusal.
void place_rivets(JointPlan& j, const EndLayout& e, double r_band, double t, double pin_r) {
  const double rho = pin_r + t / 2;
  j.rivet_at.clear();
  for (int row = 0; row < j.rows; ++row) j.rivet_at.push_back(rho + j.lap - (j.edge + row * j.pitch));
  standard::RivetSet round = standard::choose_rivet(j.rivet, 2 * t, standard::RivetClosing::round);
  // The head's profile in the plane of the run: depth z(u) = √(R² − u²) − (R − k) below the
  // face at u along the run from the rivet's axis, R = (a² + k²)/(2k) the sphere's radius.
  const double a = round.size.dk / 2, k = round.size.k, R = (a * a + k * k) / (2 * k);
  const double ri = r_band - t / 2;  // the run's drum-side face is tangent to this circle at T
  bool clears = true;
  for (double s : j.rivet_at) {
    for (int i = 0; i <= 64; ++i) {
      const double u = -a + 2 * a * i / 64.0;
      const double z = std::sqrt(std::max(0.0, R * R - u * u)) - (R - k);
      const double w = e.free_length - s - u;  // from the tangent point toward the pin
      if (std::hypot(w, ri - z) < ri + clearance) clears = false;
    }
  }
  j.rivets = clears ? round : standard::choose_rivet(j.rivet, 2 * t, standard::RivetClosing::flush);
}

JointKind kind_of(EndJointChoice c) {
  switch (c) {
    case EndJointChoice::riveted_compact: return JointKind::riveted_compact;
    case EndJointChoice::welded_block: return JointKind::welded_block;
    default: return JointKind::riveted_lap;
  }
}

JointResult joint_of(JointKind kind, const JointInput& in, const Layout& L, bool a) {
  switch (kind) {
    case JointKind::riveted_compact: return riveted_compact(in);
    case JointKind::welded_block: return welded_block(in, L, a);
    default: return riveted_lap(in);
  }
}

// ---- Brackets -------------------------------------------------------------------------------

struct FramePin {
  std::string id;
  Vec2 at;
  double load = 0;      // worst load [N]
  double load_z = 0;    // axial position of the load line [m]
  BracketSide side = BracketSide::behind;
  Vec2 lug_dir;         // unit direction of the lug from the pin
};

}  // namespace

const char* to_string(JointKind kind) {
  switch (kind) {
    case JointKind::riveted_lap: return "riveted-lap";
    case JointKind::riveted_compact: return "riveted-compact";
    case JointKind::welded_block: return "welded-block";
  }
  return "?";
}

double distance_to_plate(Vec2 p, const std::vector<Vec2>& points, double radius) {
  const std::vector<Vec2> h = hull(points);
  if (inside_hull(p, h)) {
    double d = 1e9;
    for (std::size_t i = 0; i < h.size(); ++i) d = std::min(d, point_segment(p, h[i], h[(i + 1) % h.size()]));
    return -d - radius;
  }
  return to_hull(p, h) - radius;
}

double distance_between_plates(const std::vector<Vec2>& a, double ra, const std::vector<Vec2>& b,
                               double rb) {
  const std::vector<Vec2> ha = hull(a), hb = hull(b);
  for (Vec2 p : ha) {
    if (inside_hull(p, hb)) return 0;
  }
  for (Vec2 p : hb) {
    if (inside_hull(p, ha)) return 0;
  }
  double d = 1e9;
  auto edges = [](const std::vector<Vec2>& h) {
    std::vector<std::pair<Vec2, Vec2>> e;
    if (h.size() == 1) e.push_back({h[0], h[0]});
    for (std::size_t i = 0; i < h.size() && h.size() > 1; ++i) e.push_back({h[i], h[(i + 1) % h.size()]});
    return e;
  };
  for (const auto& [p, q] : edges(ha)) {
    for (const auto& [r, s] : edges(hb)) d = std::min(d, segment_segment(p, q, r, s));
  }
  return std::max(0.0, d - ra - rb);
}

// ---- Pin heads and tails --------------------------------------------------------------------

// Extra axial gaps the pins' heads and tails ask for, beyond hardware_rules::axial_gap [m].
struct StackPush {
  double behind = 0;  ///< brackets behind the band move further back
  double lever = 0;   ///< the lever (and all in front of it) moves further forward
  double front = 0;   ///< brackets and cheeks in front of the lever move further forward
  std::string why;         ///< what the last widening was for
  std::string unresolved;  ///< a head or tail that no gap makes room for
  bool any() const { return behind > 1e-9 || lever > 1e-9 || front > 1e-9; }
};

// Something a pin's head or tail must keep clear of: the convex hull of discs of radius `r`
// about `pts` (front view) between z0 and z1.
struct Body {
  enum class Layer { core, behind, lever, front };
  std::string name;
  std::vector<Vec2> pts;
  double r = 0;
  double z0 = 0, z1 = 0;
  Layer layer = Layer::core;  ///< which push moves it away (core: none)
  bool moves = false;         ///< turns with the lever (checked applied and released)
  bool band = false;          ///< the band: its footprints instead of pts
  int pin = -1;               ///< the pin it belongs to (its own shank or ends)
};

// Chooses for each pin its ISO 2341 set and which face its head goes on, so that the head and
// the tail (washer, split pin) clear every other part; returns the gaps still to widen.
StackPush place_pin_ends(HardwarePlan& plan, const Design& design, double turn,
                         const std::vector<Footprint>& fps, double lever_w,
                         const std::vector<Vec2>& lever_points, Vec2 handle, Vec2 pivot) {
  const AxialPlan& ax = plan.axial;
  constexpr double zc = 0.001;  // axial room left between a head or tail and the next part
  // Side by side, parts that keep their places relative to each other need only a small gap
  // (common practice, no source); parts that move past each other keep hardware_rules::clearance.
  constexpr double steady_gap = 0.0005;
  std::vector<Body> bodies;
  bodies.push_back({"the drum", {{0, 0}}, design.drum.diameter / 2, ax.drum_back, ax.drum_front});
  {
    Body band{"the band", {}, 0, ax.band_back, ax.band_front};
    band.band = true;
    bodies.push_back(band);
  }
  for (const BracketPlan& br : plan.brackets) {
    Body b{br.name, br.outline, br.half_width, br.z_back, br.z_front};
    b.layer = br.side == BracketSide::behind ? Body::Layer::behind : Body::Layer::front;
    bodies.push_back(b);
    if (br.cheek) {
      Body c{br.name + "-FRONT", br.outline, br.half_width, br.cheek_z_back, br.cheek_z_front};
      c.layer = br.cheek_z_back > ax.lever_front - 1e-9 ? Body::Layer::front : Body::Layer::core;
      bodies.push_back(c);
    }
  }
  {
    Body lever{"the lever", lever_points, lever_w / 2, ax.lever_back, ax.lever_front, Body::Layer::lever, true};
    bodies.push_back(lever);
    Body grip{"the grip", {handle}, hardware_rules::grip_diameter / 2, ax.lever_front, ax.grip_front,
              Body::Layer::lever, true};
    bodies.push_back(grip);
  }
  for (std::size_t i = 0; i < plan.pins.size(); ++i) {
    const PinPlan& p = plan.pins[i];
    Body shank{"pin " + p.id, {p.at}, p.set.pin.d / 2, p.grip_back, p.grip_front};
    shank.moves = p.on_lever && p.id != "PIVOT";
    shank.layer = shank.moves ? Body::Layer::lever : Body::Layer::core;
    shank.pin = static_cast<int>(i);
    bodies.push_back(shank);
  }

  auto placed = [&](const std::vector<Vec2>& pts, bool moves, double rot) {
    if (!moves || rot == 0) return pts;
    std::vector<Vec2> out;
    for (Vec2 q : pts) out.push_back(rotate_about(q, pivot, rot));
    return out;
  };
  // Front-view clearance between an end (disc at `c`, radius r) and a body, the worst over the
  // applied and released states when one of them turns with the lever.
  auto clearance_to = [&](Vec2 c, double r, bool end_moves, const Body& b) {
    double least = 1e9;
    const bool relative = end_moves != b.moves;
    for (double rot : {0.0, turn}) {
      if (rot != 0 && !relative) continue;
      const Vec2 cc = end_moves ? rotate_about(c, pivot, rot) : c;
      if (b.band) {
        for (const Footprint& f : fps) least = std::min(least, disc_to_band(cc, r, f));
      } else {
        least = std::min(least, distance_to_plate(cc, placed(b.pts, b.moves, rot), b.r + r));
      }
    }
    return least;
  };

  // What stands beyond a face of pin p: a spacer sleeve (when it has one on that side) and
  // then the head or the tail. One segment of it: radius, axial extent.
  struct Segment {
    double r = 0, z0 = 0, z1 = 0;
    bool sleeve = false;
    Vec2 offset;  ///< centre from the pin's axis (the split pin's eye) [m]
  };
  auto ends_of = [&](const PinPlan& p) {
    std::vector<std::pair<bool, Segment>> out;  // (head?, segment)
    for (bool front : {false, true}) {
      const bool head = front == p.head_front;
      const double face = front ? p.grip_front : p.grip_back;
      const double sl = front ? p.sleeve_front : p.sleeve_back;
      const double sign = front ? 1 : -1;
      if (sl > 0) {
        const double e = face + sign * sl;
        out.push_back({head, {p.sleeve_diameter / 2, std::min(face, e), std::max(face, e), true, {}}});
      }
      const double start = face + sign * sl;
      const double reach = head ? p.set.head_reach() : p.set.tail_reach();
      const double r = head ? p.set.pin.dk / 2 : p.set.washer.d2 / 2;
      const double e = start + sign * reach;
      out.push_back({head, {r, std::min(start, e), std::max(start, e), false, {}}});
      if (!head) {
        // The split pin's eye, a disc of its width beside the pin, toward `split_angle`; its legs
        // bent back round the pin stay inside the washer.
        const double off = p.set.pin.d / 2 + p.set.split.c / 2;
        out.push_back({head, {p.set.split.c / 2, std::min(start, e), std::max(start, e), false,
                              {off * std::cos(p.split_angle), off * std::sin(p.split_angle)}}});
      }
    }
    return out;
  };

  // Every choice of head sides is tried (at most 2³): the pins' ends meet each other, so one
  // pin's best side depends on the others'.
  struct Outcome {
    std::vector<PinPlan> pins;
    StackPush extra;
    int unresolved = 0;
    double cost = 0;
  };
  auto run = [&](unsigned mask, const std::vector<std::size_t>& order) {
    Outcome out;
    out.pins = plan.pins;
    StackPush& extra = out.extra;
    for (std::size_t step = 0; step < order.size(); ++step) {
      const std::size_t i = order[step];
      PinPlan& p = out.pins[i];
      const bool moves = p.on_lever && p.id != "PIVOT";
      const double grip = p.grip_front - p.grip_back;
      // A tube wall of 1.5 mm or 0.1 d (common practice, no source: a spacer carries only the
      // washer's axial push), on a band-end pin no thicker than the band (it then clears the drum
      // and the band as the band's eye does).
      const double wall = std::max(0.0015, 0.1 * p.set.pin.d);
      p.sleeve_diameter = p.set.pin.d + 2 * (p.carries_band ? std::min(wall, design.band.thickness) : wall);
      struct Option {
        bool head_front = false;
        double sleeve_back = 0, sleeve_front = 0;
        standard::PinSet set;
        double cost = 0;
        int unresolved = 0;
        StackPush push;
        std::string first_unresolved;
        std::array<double, 2> past{0, 0};  ///< sleeve each end would need to pass what it meets
      };
      auto evaluate = [&](bool head_front, double sleeve_back, double sleeve_front) {
        Option o;
        o.head_front = head_front;
        o.sleeve_back = sleeve_back;
        o.sleeve_front = sleeve_front;
        o.set = standard::choose_pin(design.band.pin_diameter, grip + sleeve_back + sleeve_front);
        PinPlan trial = p;
        trial.head_front = head_front;
        trial.sleeve_back = sleeve_back;
        trial.sleeve_front = sleeve_front;
        trial.set = o.set;
        // Only the drum's rim, standing beside a narrower band, and another pin's end are passed
        // with a sleeve.
        auto miss = [&](const std::string& text, bool front, double far, bool drum) {
          ++o.unresolved;
          if (o.first_unresolved.empty()) o.first_unresolved = text;
          if (!drum) return;
          const double face = front ? p.grip_front : p.grip_back;
          o.past[front ? 1 : 0] = std::max(o.past[front ? 1 : 0], (front ? far - face : face - far) + zc);
        };
        for (const auto& [head, seg] : ends_of(trial)) {
          const bool front = seg.z0 >= p.grip_front - 1e-9;
          const std::string part = seg.sleeve ? "the spacer sleeve" : head ? "the head" : "the washer and split pin";
          const std::string what = part + " of pin " + p.id + " (" + (front ? "front" : "back") + " face)";
          for (const Body& b : bodies) {
            if (b.pin == static_cast<int>(i)) continue;
            // The plates it holds (and anything else within its grip) the ends only touch.
            if (b.z0 >= p.grip_back - 1e-9 && b.z1 <= p.grip_front + 1e-9) continue;
            // A band-carrying pin's sleeve is no thicker than the band's eye.
            if (seg.sleeve && p.carries_band && (b.band || b.name == "the drum")) continue;
            if (seg.z0 >= b.z1 + zc - 1e-12 || b.z0 >= seg.z1 + zc - 1e-12) continue;  // apart axially
            const Vec2 centre{p.at.x + seg.offset.x, p.at.y + seg.offset.y};
            const double c = clearance_to(centre, seg.r, moves, b);
            // Beside another pin's shank that keeps its place relative to this one, a small gap.
            const bool steady = b.pin >= 0 && (b.moves == moves || b.name == "pin PIVOT");
            if (c >= (steady ? steady_gap : clearance)) continue;
            double need = 0;
            double* slot = nullptr;
            if (!front && b.layer == Body::Layer::behind) {
              need = b.z1 + zc - seg.z0;
              slot = &o.push.behind;
            } else if (!front && b.layer == Body::Layer::core && p.grip_back >= ax.lever_back - 1e-9) {
              need = b.z1 + zc - seg.z0;
              slot = &o.push.lever;
            } else if (front && b.layer == Body::Layer::lever && !moves && p.grip_front < ax.lever_back + 1e-9) {
              need = seg.z1 + zc - b.z0;
              slot = &o.push.lever;
            } else if (front && b.layer == Body::Layer::front && p.grip_front <= ax.grip_front + 1e-9) {
              need = seg.z1 + zc - b.z0;
              slot = &o.push.front;
            }
            if (slot) {
              if (need > *slot) {
                *slot = need;
                o.push.why = what + " meets " + b.name + " across the axial gap";
              }
              o.cost += need;
            } else {
              miss(what + " meets " + b.name + ": move " + end_key(p.id) + " at least " +
                       mm((steady ? steady_gap : clearance) - c + 0.0001) + " mm further from " +
                       (b.pin >= 0 ? end_key(plan.pins[static_cast<std::size_t>(b.pin)].id) : b.name),
                   front, front ? b.z1 : b.z0, b.name == "the drum");
            }
          }
          // The other pins' ends already placed.
          for (std::size_t e = 0; e < step; ++e) {
            const PinPlan& q = out.pins[order[e]];
            const bool q_moves = q.on_lever && q.id != "PIVOT";
            for (const auto& [qhead, qseg] : ends_of(q)) {
              if (seg.z0 >= qseg.z1 + zc - 1e-12 || qseg.z0 >= seg.z1 + zc - 1e-12) continue;
              Body qb{std::string(qseg.sleeve ? "the spacer sleeve" : qhead ? "the head" : "the washer and split pin") +
                          " of pin " + q.id,
                      {{q.at.x + qseg.offset.x, q.at.y + qseg.offset.y}}, qseg.r, qseg.z0, qseg.z1};
              qb.moves = q_moves;
              // Ends that keep their places relative to each other need only a small gap (the
              // pivot's stay at their distance from a lever pin as the lever turns).
              const double need = q_moves == moves || q.id == "PIVOT" ? steady_gap : clearance;
              const Vec2 centre{p.at.x + seg.offset.x, p.at.y + seg.offset.y};
              const double c = clearance_to(centre, seg.r, moves, qb);
              if (c >= need) continue;
              // An end on the lever's back face and one below the lever: move the lever out.
              const bool p_on_lever_back = !front && p.grip_back >= ax.lever_back - 1e-9 && qseg.z1 <= ax.lever_back + 1e-9;
              const bool q_on_lever_back = front && p.grip_front <= ax.lever_back + 1e-9 && qseg.z0 >= ax.lever_back - 1e-9 &&
                                           !moves;
              if (p_on_lever_back || q_on_lever_back) {
                const double widen = p_on_lever_back ? qseg.z1 + zc - seg.z0 : seg.z1 + zc - qseg.z0;
                if (widen > o.push.lever) {
                  o.push.lever = widen;
                  o.push.why = what + " meets " + qb.name + " across the axial gap";
                }
                o.cost += widen;
                continue;
              }
              miss(what + " meets " + qb.name + ": move " + end_key(p.id) + " at least " +
                       mm(need - c + 0.0001) + " mm further from " + end_key(q.id),
                   front, front ? qseg.z1 : qseg.z0, true);
            }
          }
        }
        return o;
      };
      auto worse = [](const Option& x, const Option& y) {
        if (x.unresolved != y.unresolved) return x.unresolved > y.unresolved;
        return x.cost + x.sleeve_back + x.sleeve_front > y.cost + y.sleeve_back + y.sleeve_front + 1e-9;
      };
      // A spacer sleeve takes an end past the drum's rim beside a narrower band.
      const bool head_front = (mask >> i) & 1u;
      // The split pin's eye: away from the drum's axis, else the first of eight directions that
      // clears.
      const double outward = std::atan2(p.at.y, p.at.x);
      Option best;
      double best_angle = outward;
      for (int turn8 = 0; turn8 < 8; ++turn8) {
        p.split_angle = outward + turn8 * pi / 4;
        Option o = evaluate(head_front, 0, 0);
        if (o.unresolved > 0) {
          const Option sleeved = evaluate(head_front, o.past[0], o.past[1]);
          if (worse(o, sleeved)) o = sleeved;
        }
        if (turn8 == 0 || worse(best, o)) {
          best = o;
          best_angle = p.split_angle;
        }
        if (best.unresolved == 0) break;
      }
      p.split_angle = best_angle;
      p.head_front = best.head_front;
      p.sleeve_back = best.sleeve_back;
      p.sleeve_front = best.sleeve_front;
      p.set = best.set;
      const double k = p.set.head_reach(), tail = p.set.tail_reach();
      p.z_back = p.grip_back - p.sleeve_back - (p.head_front ? tail : k);
      p.z_front = p.grip_front + p.sleeve_front + (p.head_front ? k : tail);
      extra.behind = std::max(extra.behind, best.push.behind);
      extra.lever = std::max(extra.lever, best.push.lever);
      extra.front = std::max(extra.front, best.push.front);
      if (!best.push.why.empty()) extra.why = best.push.why;
      if (best.unresolved > 0 && extra.unresolved.empty()) extra.unresolved = best.first_unresolved;
      out.unresolved += best.unresolved;
      out.cost += best.cost + best.sleeve_back + best.sleeve_front;
    }
    return out;
  };
  // Heads at the back and split pins in front, where they are seen and serviced (mask 0), unless
  // another choice needs less.
  std::optional<Outcome> chosen;
  // The pin placed later gets the spacer sleeve when two pins' ends meet: every order is tried.
  std::vector<std::size_t> order(plan.pins.size());
  for (std::size_t i = 0; i < order.size(); ++i) order[i] = i;
  do {
    for (unsigned mask = 0; mask < (1u << plan.pins.size()); ++mask) {
      Outcome o = run(mask, order);
      if (!chosen || o.unresolved < chosen->unresolved ||
          (o.unresolved == chosen->unresolved && o.cost < chosen->cost - 1e-9)) {
        chosen = std::move(o);
      }
      // Nothing met and nothing widened: no later choice can be strictly better (the same choice
      // as running them all, found sooner).
      if (chosen->unresolved == 0 && chosen->cost == 0) break;
    }
    if (chosen->unresolved == 0 && chosen->cost == 0) break;
  } while (std::next_permutation(order.begin(), order.end()));
  plan.pins = chosen->pins;
  return chosen->extra;
}

HardwarePlan plan_hardware(const Design& design, const Solution& solution) {
  HardwarePlan plan;
  const Layout& L = solution.layout;
  if (!L.from_pins) return plan;
  plan.present = true;
  auto refuse = [&](const std::string& why) {
    if (plan.refusal.empty()) plan.refusal = why;
  };

  const double R = design.drum.diameter / 2;
  const double t = design.band.thickness, b = design.band.width;
  // The pins as bought: the ISO 2341 nominal at least the design's diameter.
  const double pin_r = standard::clevis_nominal(design.band.pin_diameter) / 2;
  const double lever_w = design.lever.width, lever_t = design.lever.thickness;
  const double eye_outer = pin_r + t;
  const double min_wall = std::max(0.002, 0.5 * pin_r);  // least material round a hole
  const Vec2 pivot = design.lever.pivot, handle = design.lever.handle;

  // Drum hub (src/proportions.hpp): hub wall at least a tenth of the bore and 3 mm.
  {
    const DrumProportions p = drum_proportions(design.drum);
    const double hub_wall = std::max(0.003, 0.1 * design.drum.bore);
    const double over = design.drum.bore + 2 * hub_wall - p.hub_diameter;
    if (over >= 0) {
      refuse("cannot build the drum: drum.bore = " + mm(design.drum.bore) +
             " mm leaves no hub inside the rim (the hub is Ø" + mm(p.hub_diameter) +
             " mm): make drum.bore at least " + mm(over + 0.0001) + " mm smaller");
    }
  }
  if (lever_w / 2 - pin_r < min_wall) {
    refuse("cannot build the lever: lever.width = " + mm(lever_w) + " mm is too narrow for the Ø" +
           mm(2 * pin_r) + " mm pin holes: make lever.width at least " +
           mm(2 * (pin_r + min_wall) - lever_w + 0.0001) + " mm wider");
  }

  // ---- Joints at the band ends -----------------------------------------------------------
  const bool forced = design.band.end_joint != EndJointChoice::automatic;
  for (bool a : {true, false}) {
    const EndLayout& e = a ? L.a : L.b;
    JointInput in;
    in.end = a ? "A" : "B";
    in.tension = end_tension(solution, a);
    in.run = e.free_length;
    in.t = t;
    in.b = b;
    in.pin_r = pin_r;
    in.tau = design.band.pin_allowable_shear > 0 ? design.band.pin_allowable_shear
                                                  : design.band.allowable_stress / std::sqrt(3.0);
    in.sigma = design.band.allowable_stress;
    std::optional<JointResult> chosen;
    std::vector<JointResult> tried;
    if (forced) {
      tried.push_back(joint_of(kind_of(design.band.end_joint), in, L, a));
      if (tried.back().fits) chosen = tried.back();
    } else {
      for (JointKind k : {JointKind::riveted_lap, JointKind::riveted_compact, JointKind::welded_block}) {
        tried.push_back(joint_of(k, in, L, a));
        if (tried.back().fits && tried.back().passes) {
          chosen = tried.back();
          break;
        }
      }
      // Nothing passes its checks: take the first that fits; its failing check is reported.
      if (!chosen) {
        for (const JointResult& r : tried) {
          if (r.fits) {
            chosen = r;
            break;
          }
        }
      }
    }
    if (!chosen) {
      // The joint that needs the least run tells the designer how far to move the pin.
      const JointResult* least = &tried.front();
      for (const JointResult& r : tried) {
        if (r.plan.needs - r.plan.room < least->plan.needs - least->plan.room) least = &r;
      }
      const double short_by = least->plan.needs - least->plan.room;
      std::string why = "cannot build the band end " + in.end + ": the straight run at " +
                        end_key(in.end) + " leaves " + mm(least->plan.room) +
                        " mm for the end joint; the shortest that carries " +
                        std::to_string(static_cast<long>(std::lround(in.tension))) + " N (" +
                        to_string(least->plan.kind) + ") needs " + mm(least->plan.needs) +
                        " mm: move " + end_key(in.end) + " at least " + mm(short_by + 0.00005) +
                        " mm further from the drum along its run";
      if (forced && least->plan.kind != JointKind::welded_block) {
        why += ", or set band.end_joint = \"auto\"";
      }
      refuse(why);
      chosen = *least;
    }
    chosen->plan.chosen_automatically = !forced;
    if (chosen->plan.kind != JointKind::welded_block) place_rivets(chosen->plan, e, L.r_band, t, pin_r);
    (a ? plan.joint_a : plan.joint_b) = chosen->plan;
    plan.checks.insert(plan.checks.end(), chosen->checks.begin(), chosen->checks.end());
  }
  // What each end looks like round its pin, for clearances: the eye, or the block's half-diagonal.
  auto end_radius = [&](const JointPlan& j) {
    if (j.kind != JointKind::welded_block) return eye_outer;
    return std::hypot(std::max(j.block_front, j.block_back), j.block_height / 2);
  };
  const std::array<double, 2> ends{end_radius(plan.joint_a), end_radius(plan.joint_b)};
  // A riveted end's eye needs a run longer than its own radius.
  for (bool a : {true, false}) {
    const EndLayout& e = a ? L.a : L.b;
    const JointPlan& j = a ? plan.joint_a : plan.joint_b;
    if (j.kind != JointKind::welded_block && e.free_length <= eye_outer) {
      refuse("cannot build the band: the run at " + end_key(a ? "A" : "B") + " is " +
             mm(e.free_length) + " mm, the eye round the pin needs more than " + mm(eye_outer) +
             " mm: move " + end_key(a ? "A" : "B") + " at least " +
             mm(eye_outer - e.free_length + 0.0001) + " mm further from the drum along its run");
    }
  }
  {
    // The eyes alone are checked by solve (pin_diameter + 2t + clearance); end blocks are larger.
    const double gap = dist(L.a.pin, L.b.pin) - ends[0] - ends[1] - design.band.clearance;
    if (gap < 0) {
      refuse("cannot build the band: its two ends collide round the pins (" +
             mm(dist(L.a.pin, L.b.pin)) + " mm apart, the end fittings need " +
             mm(ends[0] + ends[1] + design.band.clearance) + " mm): move band.end_b.at at least " +
             mm(-gap + 0.0001) + " mm further from band.end_a.at");
    }
  }

  // ---- Released state: the band on r_b + c, lever pins turned back ------------------------
  // Each band end on the lever must keep its fitting's length of straight run (the eye, or the
  // end block up to its slot) on the lifted band.
  std::optional<Layout> released;
  try {
    released = released_layout(design, L);
  } catch (const BuildError&) {
    released.reset();
  }
  const double turn = -L.apply_sense * L.release_rotation;
  {
    double least = 1e9;
    std::string where;
    for (bool a : {true, false}) {
      if ((a ? L.a : L.b).mount != Mount::lever) continue;
      const JointPlan& j = a ? plan.joint_a : plan.joint_b;
      const double need = j.kind == JointKind::welded_block ? j.block_back : eye_outer;
      double gap;
      if (released) {
        gap = (a ? released->a : released->b).free_length - need;
      } else {
        const Vec2 p = rotate_about((a ? L.a : L.b).pin, pivot, turn);
        gap = std::hypot(p.x, p.y) - (L.r_band + design.band.clearance) - need;
      }
      if (gap < least) {
        least = gap;
        where = end_key(a ? "A" : "B");
      }
    }
    // The released band must still be a band: its runs may not cross, nor an end fitting reach
    // the other run (a very small net lever arm needs a release rotation too large for that).
    if (released) {
      const EndLayout* e[2] = {&released->a, &released->b};
      const double runs = segment_segment(e[0]->pin, e[0]->tangent_point, e[1]->pin,
                                          e[1]->tangent_point) - t;
      if (runs < least) {
        least = runs;
        where = "band.end_a.at and band.end_b.at (the released runs meet)";
      }
      for (int i = 0; i < 2; ++i) {
        const JointPlan& j = i == 0 ? plan.joint_a : plan.joint_b;
        const double fitting = j.kind == JointKind::welded_block
                                   ? std::hypot(std::max(j.block_front, j.block_back), j.block_height / 2)
                                   : eye_outer;
        const double g = point_segment(e[i]->pin, e[1 - i]->pin, e[1 - i]->tangent_point) - fitting - t / 2;
        if (g < least) {
          least = g;
          where = end_key(i == 0 ? "A" : "B") + " (its end reaches the other released run)";
        }
      }
    }
    if (least < 1e8) {
      Check c = make_check("release_clearance",
                           "Released state: least clearance of the band ends (run left beyond the "
                           "eye or end block; distance to the other run)",
                           least, 0, "m", false,
                           "geometry of the released state (lever turned back by the release "
                           "rotation, band on r_b + clearance); the eye or end block needs its own "
                           "length of straight run (common practice, no source)",
                           "at " + where + ", lever turned " +
                               std::to_string(std::lround(turn * 180 / pi)) + "°");
      plan.checks.push_back(c);
      if (!c.ok) {
        plan.release_ok = false;
        plan.release_problem =
            "cannot build the released state: turned back by the release rotation (" +
            std::to_string(std::lround(turn * 180 / pi)) + "°), the band end at " + where +
            " has " + mm(least) + " mm less straight run than its fitting needs: move " + where +
            " at least " + mm(-least + 0.0001) + " mm further from the drum along its run, or make "
            "the lever's net arm larger (a smaller release rotation)";
      }
    }
  }
  const std::array<const JointPlan*, 2> joints{&plan.joint_a, &plan.joint_b};
  const Footprint fp_applied = footprint(L, t, ends, joints);
  std::vector<Footprint> fps{fp_applied};
  if (released) fps.push_back(footprint(*released, t, ends, joints));

  // A band-end pin must not cross the other end's run.
  for (int i = 0; i < 2; ++i) {
    const Vec2 p = i == 0 ? L.a.pin : L.b.pin;
    const auto& other = fp_applied.runs[1 - i];
    const double to_other = std::min(point_segment(p, other.from, other.to) - other.half,
                                     dist(p, other.to) - other.end_radius) - pin_r;
    if (to_other < 0) {
      refuse("cannot build the band: the pin at " + end_key(i == 0 ? "A" : "B") +
             " passes through the band's other run: move it at least " + mm(-to_other + 0.0001) +
             " mm away from that run");
    }
  }

  // ---- Lever holes and handle ------------------------------------------------------------
  struct Hole {
    std::string id;
    Vec2 at;
  };
  std::vector<Hole> lever_holes{{"PIVOT", pivot}};
  bool pivot_carries_band = false;
  for (bool a : {true, false}) {
    const EndLayout& e = a ? L.a : L.b;
    if (dist(e.pin, pivot) < 1e-6) {
      pivot_carries_band = true;
      continue;
    }
    if (e.mount == Mount::lever) lever_holes.push_back({a ? "A" : "B", e.pin});
  }
  const double least = 2 * pin_r + min_wall;
  for (std::size_t i = 0; i < lever_holes.size(); ++i) {
    for (std::size_t k = i + 1; k < lever_holes.size(); ++k) {
      const double g = dist(lever_holes[i].at, lever_holes[k].at);
      if (g < least) {
        refuse("cannot build the lever: the holes at " + end_key(lever_holes[i].id) + " and " +
               end_key(lever_holes[k].id) + " are " + mm(g) + " mm apart, the Ø" + mm(2 * pin_r) +
               " mm holes need " + mm(least) + " mm: move " + end_key(lever_holes[k].id) +
               " at least " + mm(least - g + 0.0001) + " mm further from " + end_key(lever_holes[i].id));
      }
    }
  }
  for (const Hole& h : lever_holes) {
    const double need = grip_diameter / 2 + pin_r + min_wall;
    const double g = dist(handle, h.at);
    if (g < need) {
      refuse("cannot build the lever: lever.handle is " + mm(g) + " mm from the hole at " +
             end_key(h.id) + ", the Ø" + mm(grip_diameter, 0) + " mm grip needs " + mm(need) +
             " mm: move lever.handle at least " + mm(need - g + 0.0001) + " mm further from it");
    }
  }

  // The axial stack, the brackets and the pins are planned in rounds: the pins' heads and tails
  // (washer and split pin) stand beyond the plates they hold; where one would meet a part across
  // an axial gap, the gap is widened (`push`) and the stack planned again.
  const std::size_t checks_before = plan.checks.size();
  const std::string refusal_before = plan.refusal;
  StackPush push;
  for (int round = 0;; ++round) {
    plan.checks.resize(checks_before);
    plan.refusal = refusal_before;
    plan.brackets.clear();
    plan.pins.clear();
    // ---- Axial stack -------------------------------------------------------------------------
    AxialPlan& ax = plan.axial;
    ax.drum_back = -design.drum.width / 2;
    ax.drum_front = design.drum.width / 2;
    ax.band_back = -b / 2;
    ax.band_front = b / 2;
    ax.gap = axial_gap;
    std::vector<Vec2> lever_points{handle};
    for (const Hole& h : lever_holes) lever_points.push_back(h.at);
    double lever_to_drum = 1e9;
    for (double rot : {0.0, turn}) {
      std::vector<Vec2> pts;
      for (Vec2 p : lever_points) pts.push_back(rotate_about(p, pivot, rot));
      lever_to_drum = std::min(lever_to_drum, distance_to_plate({0, 0}, pts, lever_w / 2));
    }
    ax.lever_outboard = lever_to_drum < R + clearance;
    ax.lever_back = (ax.lever_outboard ? std::max(ax.band_front, ax.drum_front) : ax.band_front) + axial_gap + push.lever;
    ax.lever_front = ax.lever_back + lever_t;
    ax.grip_front = ax.lever_front + grip_length;

    // ---- Frame pins and their brackets -------------------------------------------------------
    std::vector<FramePin> frame;
    {
      FramePin p;
      p.id = "PIVOT";
      p.at = pivot;
      p.load = pivot_load(solution);
      p.load_z = (ax.lever_back + ax.lever_front) / 2;
      // Behind (on the frame side) unless the pin would then pass through the band or the drum.
      double c = 1e9;
      if (!pivot_carries_band) {
        for (const Footprint& f : fps) c = std::min(c, disc_to_band(pivot, pin_r, f));
        c = std::min(c, std::hypot(pivot.x, pivot.y) - pin_r - R);
      }
      p.side = pivot_carries_band || c >= clearance ? BracketSide::behind : BracketSide::front;
      const double away = std::atan2(pivot.y - handle.y, pivot.x - handle.x);
      const double out = std::atan2(pivot.y, pivot.x);
      const double dir = p.side == BracketSide::front ? away : out;
      p.lug_dir = {std::cos(dir), std::sin(dir)};
      frame.push_back(p);
    }
    for (bool a : {true, false}) {
      const EndLayout& e = a ? L.a : L.b;
      if (e.mount != Mount::frame || dist(e.pin, pivot) < 1e-6) continue;
      FramePin p;
      p.id = a ? "A" : "B";
      p.at = e.pin;
      p.load = end_tension(solution, a);
      p.load_z = 0;
      p.side = BracketSide::behind;
      const double out = std::atan2(e.pin.y, e.pin.x);
      p.lug_dir = {std::cos(out), std::sin(out)};
      frame.push_back(p);
    }
    if (pivot_carries_band) {
      for (bool a : {true, false}) {
        const EndLayout& e = a ? L.a : L.b;
        if (dist(e.pin, pivot) < 1e-6) frame.front().load = std::max(frame.front().load, end_tension(solution, a));
      }
      frame.front().load_z = 0;
    }

    // One lug per frame pin, pointing away from the drum (the pivot's in front of the lever:
    // away from the handle); lugs that come close share one bracket.
    const double lug = lever_w;  // lug length from the bore to the frame (common practice)
    double half_width = lever_w / 2;
    auto outline_of = [&](const std::vector<std::size_t>& g) {
      std::vector<Vec2> pts;
      for (std::size_t i : g) {
        pts.push_back(frame[i].at);
        pts.push_back(add(frame[i].at, frame[i].lug_dir, lug));
      }
      return pts;
    };
    // Order the members (A, B, PIVOT) for stable names.
    auto rank = [&](std::size_t i) { return frame[i].id == "A" ? 0 : frame[i].id == "B" ? 1 : 2; };
    // Lugs of plate half-width `hw` that come within the clearance of each other share a bracket.
    auto make_groups = [&](double hw) {
      std::vector<std::vector<std::size_t>> groups;
      for (std::size_t i = 0; i < frame.size(); ++i) groups.push_back({i});
      for (bool merged = true; merged;) {
        merged = false;
        for (std::size_t i = 0; i < groups.size() && !merged; ++i) {
          for (std::size_t k = i + 1; k < groups.size() && !merged; ++k) {
            if (frame[groups[i][0]].side != frame[groups[k][0]].side) continue;
            const double d = distance_between_plates(outline_of(groups[i]), hw, outline_of(groups[k]), hw);
            if (d < clearance) {
              groups[i].insert(groups[i].end(), groups[k].begin(), groups[k].end());
              groups.erase(groups.begin() + static_cast<std::ptrdiff_t>(k));
              merged = true;
            }
          }
        }
      }
      for (auto& g : groups) {
        std::sort(g.begin(), g.end(), [&](std::size_t x, std::size_t y) { return rank(x) < rank(y); });
      }
      std::sort(groups.begin(), groups.end(), [&](const auto& x, const auto& y) { return rank(x[0]) < rank(y[0]); });
      return groups;
    };

    // The lever in both states and the grip, in the front view, for the cheeks' clearances.
    std::vector<std::vector<Vec2>> lever_states;
    for (double rot : {0.0, turn}) {
      std::vector<Vec2> pts;
      for (Vec2 p : lever_points) pts.push_back(rotate_about(p, pivot, rot));
      lever_states.push_back(pts);
    }
    std::vector<Vec2> lever_pins;  // band-end pins on the lever, both states
    for (const Hole& h : lever_holes) {
      if (h.id == "PIVOT") continue;
      lever_pins.push_back(h.at);
      lever_pins.push_back(rotate_about(h.at, pivot, turn));
    }
    auto clears_lever = [&](const std::vector<Vec2>& outline, double hw) {
      for (const auto& st : lever_states) {
        if (distance_between_plates(outline, hw, st, lever_w / 2) < clearance) return false;
      }
      return true;
    };
    auto clears_drum = [&](const std::vector<Vec2>& outline, double hw) {
      return distance_to_plate({0, 0}, outline, hw) >= R + clearance;
    };
    auto near_grip = [&](const std::vector<Vec2>& outline, double hw) {
      return distance_to_plate(handle, outline, hw) < grip_diameter / 2 + clearance;
    };
    // Where a group's front cheek can go: in front of the band (no lever pin in it, the lever and
    // the lever pins clear of it), or in front of the lever (every other pin of the group clear of
    // the lever, so that it can pass the lever's plane); none when neither fits.
    // When no plate in the series carries the loads, a frame band end under the lever may still
    // get its front cheek in front of the band, the lever then moved out in front of the cheek.
    enum class Cheek { none, band_front, lever_front };
    bool push_lever = false;
    double lever_back_needed = 0;
    auto cheek_for = [&](const std::vector<std::size_t>& g, double hw) {
      const std::vector<Vec2> outline = outline_of(g);
      if (frame[g[0]].side != BracketSide::behind) return Cheek::none;
      bool has_pivot = false;
      for (std::size_t i : g) has_pivot = has_pivot || frame[i].id == "PIVOT";
      if (!has_pivot && (push_lever || clears_lever(outline, hw)) &&
          (clears_drum(outline, hw) || ax.band_front + axial_gap >= ax.drum_front)) {
        bool pins_clear = true;
        for (Vec2 p : lever_pins) pins_clear = pins_clear && distance_to_plate(p, outline, hw) >= pin_r + clearance;
        if (pins_clear) return Cheek::band_front;
      }
      bool pass = true;
      for (std::size_t i : g) {
        if (frame[i].id == "PIVOT") continue;
        for (const auto& st : lever_states) {
          pass = pass && distance_to_plate(frame[i].at, st, lever_w / 2) >= pin_r + clearance;
        }
      }
      if (pass && (clears_drum(outline, hw) || ax.lever_front + axial_gap >= ax.drum_front)) {
        return Cheek::lever_front;
      }
      return Cheek::none;
    };

    // Thickness from the stock series (at least the lever's plate), the same for every bracket
    // (one plate stock), the least that passes every bore's checks.
    auto bearing_check = [&](const std::string& pin, const std::string& title, double bearing,
                             double fy, const std::string& note) {
      plan.checks.push_back(make_check(
          "bracket_bearing_" + pin, title, bearing, kBearingFactor * fy, "Pa", true,
          std::string("0.90 F_y, pins in bored holes (AISC ASD 1989 J8.1, from memory); ") + kYieldSource,
          note));
    };
    auto size_brackets = [&](double thick, double hw, bool record) {
      bool ok = true;
      std::vector<BracketPlan> out;
      const double fy = s235_yield(thick);
      for (const auto& g : make_groups(hw)) {
        BracketPlan br;
        br.side = frame[g[0]].side;
        for (std::size_t i : g) {
          br.pins.push_back(frame[i].id);
          br.holes.push_back(frame[i].at);
        }
        br.name = g.size() == 1 ? "ANCHOR-" + frame[g[0]].id : "BRACKET";
        if (g.size() > 1) {
          for (std::size_t i : g) br.name += "-" + frame[i].id;
        }
        br.outline = outline_of(g);
        br.half_width = hw;
        br.thickness = thick;
        if (br.side == BracketSide::behind) {
          const bool crosses_drum = !clears_drum(br.outline, hw);
          br.behind_drum = crosses_drum && ax.drum_back < ax.band_back;
          br.z_front = (br.behind_drum ? ax.drum_back : ax.band_back) - axial_gap - push.behind;
          br.z_back = br.z_front - thick;
        } else {
          // In front of the lever; beyond the grip when the plate would reach it.
          br.z_back = (near_grip(br.outline, hw) ? ax.grip_front : ax.lever_front) + axial_gap + push.front;
          br.z_front = br.z_back + thick;
        }
        const Cheek cheek = cheek_for(g, hw);
        if (cheek != Cheek::none) {
          br.cheek = true;
          const double base = cheek == Cheek::band_front ? ax.band_front : ax.lever_front;
          br.cheek_z_back = (cheek == Cheek::lever_front && near_grip(br.outline, hw) ? ax.grip_front : base) + axial_gap +
                             (cheek == Cheek::lever_front ? push.front : 0.0);
          br.cheek_z_front = br.cheek_z_back + thick;
          if (cheek == Cheek::band_front && !clears_lever(br.outline, hw)) {
            lever_back_needed = std::max(lever_back_needed, br.cheek_z_front + axial_gap + push.lever);
          }
        }
        const double mid = (br.z_back + br.z_front) / 2;
        const double cheek_mid = (br.cheek_z_back + br.cheek_z_front) / 2;
        const double net = 2 * hw - 2 * pin_r;
        for (std::size_t i : g) {
          const double F = frame[i].load, zl = frame[i].load_z;
          br.loads.push_back(F);
          const std::string who = br.name + ", bore " + frame[i].id;
          if (br.cheek) {
            // Two cheeks: the pin a beam on two supports, each cheek loaded in its plane by the
            // lever rule about the load line.
            const double span = cheek_mid - mid;
            const double f_back = F * (cheek_mid - zl) / span, f_front = F * (zl - mid) / span;
            br.offsets.push_back(0);
            const double worst = std::max(f_back, f_front);
            const double bearing = worst / (2 * pin_r * thick), tension = worst / (net * thick);
            ok = ok && bearing <= kBearingFactor * fy && tension <= kPinPlateTension * fy;
            if (record) {
              const std::string note = "worst load " + std::to_string(static_cast<long>(std::lround(F))) +
                                       " N shared by two " + mm(thick, 0) + " mm cheeks " + mm(span) +
                                       " mm apart: " + std::to_string(static_cast<long>(std::lround(f_back))) +
                                       " N back, " + std::to_string(static_cast<long>(std::lround(f_front))) +
                                       " N front";
              bearing_check(frame[i].id, who + ": bore bearing pressure p = F_cheek/(d·t)", bearing, fy, note);
              plan.checks.push_back(make_check(
                  "bracket_net_" + frame[i].id, who + ": cheek net section at the bore σ = F_cheek/((w − d)·t)",
                  tension, kPinPlateTension * fy, "Pa", true,
                  std::string("0.45 F_y, pin-connected part (AISC ASD 1989 D3.1, from memory); ") + kYieldSource,
                  note));
            }
          } else {
            br.offsets.push_back(std::abs(zl - mid));
            const double bearing = F / (2 * pin_r * thick);
            const double bending = 6 * F * br.offsets.back() / (net * thick * thick);
            ok = ok && bearing <= kBearingFactor * fy && bending <= kBendingFactor * fy;
            if (record) {
              const std::string note = "worst load " + std::to_string(static_cast<long>(std::lround(F))) +
                                       " N on one " + mm(thick, 0) + " mm plate, load line " +
                                       mm(br.offsets.back()) + " mm from its mid-plane";
              bearing_check(frame[i].id, who + ": bore bearing pressure p = F/(d·t)", bearing, fy, note);
              plan.checks.push_back(make_check(
                  "bracket_bending_" + frame[i].id,
                  who + ": plate bending at the bore σ = 6·F·e/((w − d)·t²), overhung pin",
                  bending, kBendingFactor * fy, "Pa", true,
                  std::string("0.60 F_y (AISC ASD 1989 F1, from memory); ") + kYieldSource +
                      "; formula: elementary beam bending (Shigley 9th ed. §3-10)",
                  note));
            }
          }
        }
        out.push_back(br);
      }
      return std::make_pair(ok, out);
    };
    double thick = 0;
    bool sized = false;
    const double base_half_width = half_width;
    auto search = [&] {
      for (double hw_factor : {1.0, 1.25, 1.5, 2.0, 2.5, 3.0}) {
        const double hw = base_half_width * hw_factor;
        for (double s : kPlateSeries) {
          if (s < lever_t - 1e-12) continue;
          lever_back_needed = 0;
          if (size_brackets(s, hw, false).first) {
            thick = s;
            half_width = hw;
            return true;
          }
        }
      }
      return false;
    };
    sized = search();
    if (!sized) {
      // Cheeks in front of the band under the lever, the lever moved out to make room; the
      // positions in front of the lever follow it, so settle the stack before the final sizing.
      push_lever = true;
      for (int settle = 0; settle < 4; ++settle) {
        sized = search();
        if (!sized) break;
        lever_back_needed = 0;
        size_brackets(thick, half_width, false);
        if (lever_back_needed <= ax.lever_back + 1e-12) break;
        ax.lever_back = lever_back_needed;
        ax.lever_front = ax.lever_back + lever_t;
        ax.grip_front = ax.lever_front + grip_length;
        ax.lever_outboard = true;
      }
    }
    if (!sized) {
      // Nothing in the stock carries the loads: the largest plates are built and their checks
      // fail on the calculation sheet, like any other part that is too weak for its loads.
      thick = std::max(lever_t, kPlateSeries[std::size(kPlateSeries) - 1]);
      half_width = base_half_width * 3.0;
    }
    plan.brackets = size_brackets(thick, half_width, true).second;

    // ---- Pins ------------------------------------------------------------------------------
    auto bracket_of = [&](const std::string& id) -> const BracketPlan* {
      for (const BracketPlan& br : plan.brackets) {
        if (std::find(br.pins.begin(), br.pins.end(), id) != br.pins.end()) return &br;
      }
      return nullptr;
    };
    for (bool a : {true, false}) {
      const EndLayout& e = a ? L.a : L.b;
      if (dist(e.pin, pivot) < 1e-6) continue;
      PinPlan p;
      p.id = a ? "A" : "B";
      p.at = e.pin;
      p.carries_band = true;
      p.on_lever = e.mount == Mount::lever;
      if (p.on_lever) {
        p.z_back = ax.band_back;
        p.z_front = ax.lever_front;
      } else {
        const BracketPlan* br = bracket_of(p.id);
        p.bracket = br ? br->name : "";
        p.z_back = br ? br->z_back : ax.band_back;
        p.z_front = br && br->cheek ? br->cheek_z_front : ax.band_front;
      }
      plan.pins.push_back(p);
    }
    {
      PinPlan p;
      p.id = "PIVOT";
      p.at = pivot;
      p.on_lever = true;
      p.carries_band = pivot_carries_band;
      const BracketPlan* br = bracket_of("PIVOT");
      p.bracket = br ? br->name : "";
      if (br && br->side == BracketSide::front) {
        p.z_back = ax.lever_back;
        p.z_front = br->z_front;
      } else {
        p.z_back = br ? br->z_back : ax.band_back;
        p.z_front = br && br->cheek ? br->cheek_z_front : ax.lever_front;
      }
      plan.pins.push_back(p);
    }

    // The pins as bought: ISO 2341 B clevis pins for the plates they hold, then their heads
    // and tails placed.
    for (PinPlan& p : plan.pins) {
      p.grip_back = p.z_back;
      p.grip_front = p.z_front;
      p.set = standard::choose_pin(design.band.pin_diameter, p.grip_front - p.grip_back);
    }
    const StackPush extra = place_pin_ends(plan, design, turn, fps, lever_w, lever_points, handle, pivot);
    if (!extra.any() || round >= 4) {
      if (extra.any()) {
        refuse("cannot fit the pins' heads and split pins: " + extra.why + ", still after " +
               std::to_string(round) + " widenings");
      } else if (!extra.unresolved.empty()) {
        refuse("cannot fit the pins' heads and split pins: " + extra.unresolved);
      }
      break;
    }
    push.behind += extra.behind;
    push.lever += extra.lever;
    push.front += extra.front;
  }
  return plan;
}

}  // namespace bandforge
