// Band and lining blanks, developed from the solved band path (REFERENCE §1.8): the straight runs
// from each pin to its tangent point, the wrap on r_b, and the band eyes of the band solid
// (geometry/solids.cpp make_band: a ring of inner radius = pin radius round each pin, the run's
// centreline aimed at the pin centre). The rules below that the design file does not fix are
// common practice, no source; each is printed on the part's NOTES layer and in the cut list.
#include <algorithm>
#include <cmath>
#include <numbers>
#include <string>
#include <vector>

#include "geometry/flat_internal.hpp"
#include "src/errors.hpp"

namespace bandforge::geom {
namespace {

constexpr double mm_per_m = 1000.0;
constexpr double pi = std::numbers::pi;

// Lining rivets (common practice, no source).
constexpr double lining_rivet_hole = 5.0;   // [mm] tubular brass/copper brake rivet, 3/16 in class
constexpr double riveted_lining_min = 3.0;  // [mm] thinner linings are bonded: no rivet holes
constexpr double lining_end_margin = 20.0;  // [mm] lining end to the first rivet, on its neutral arc
constexpr double lining_max_pitch = 80.0;   // [mm] largest rivet pitch along the wrap
// A flat lining is rolled to its radius: its outer-fibre strain t_L/(2·r_L) may not exceed this
// (common practice, no source); a stiffer lining has to be bought moulded to the drum radius.
constexpr double lining_max_strain = 0.03;

// Eye joint (the tail laid back on the run and riveted; common practice, no source): rivet
// diameter 2t rounded up to a whole millimetre, at least 5 mm; edge and end distance 2d; pitch 3d;
// as many columns as fit across the width; at least two rows, more until the rivets in single
// shear at the design's pin allowable shear carry the largest tight-side tension.
constexpr double joint_rivet_min = 5.0;  // [mm]

const char* end_key(bool a) { return a ? "band.end_a.at" : "band.end_b.at"; }

[[noreturn]] void cannot(const std::string& part, const std::string& what) {
  throw BuildError("cannot flatten the " + part + ": " + what);
}

// The rivet pattern that holds the lining to the band: angles from the A tangent point (same on
// band and lining) and positions across the width.
struct LiningRivets {
  double hole = 0;             // [mm]; 0 = bonded lining, no holes
  std::vector<double> angles;  // [rad] from the A end of the wrap
  std::vector<double> across;  // [mm] from one band edge
};

// The eye joint at each end.
struct Joint {
  double rivet = 0;            // hole diameter [mm]
  double edge = 0, pitch = 0;  // [mm]
  int rows = 0;                // rows along the strip
  std::vector<double> across;  // [mm] columns across the width
  double lap = 0;              // [mm] tail length laid back on the run
  double tension = 0;          // largest tight-side tension the joint carries [N]
  double capacity = 0;         // rivet shear capacity of one joint [N]
  double tau = 0;              // allowable rivet shear stress [Pa]
};

// Everything in millimetres, from the design and the applied layout.
struct Plan {
  double t = 0, b = 0;           // band thickness and width
  double pin_r = 0, rho = 0;     // pin radius; eye neutral radius pin_r + t/2
  double r = 0, r_b = 0;         // drum friction radius; band neutral radius (the solved r_b)
  double lining_t = 0, r_lin = 0;  // lining thickness and neutral radius
  double wrap = 0;               // [rad]
  double run_a = 0, run_b = 0;   // free runs, pin centre to tangent point
  double centreline = 0;         // the solve's band length, pin centre to pin centre
  double eye = 0;                // allowance per eye: (2π − 1)·ρ
  LiningRivets rivets;
  Joint joint;
};

LiningRivets lining_rivets(const Plan& p) {
  LiningRivets rv;
  if (p.lining_t < riveted_lining_min) return rv;  // bare band or bonded lining
  rv.hole = lining_rivet_hole;
  // Columns across the width: one below 50 mm, two below 120 mm, else three; evenly spread.
  const int cols = p.b < 50 ? 1 : p.b < 120 ? 2 : 3;
  for (int k = 0; k < cols; ++k) rv.across.push_back(p.b * (2 * k + 1) / (2.0 * cols));
  const double arc = p.r_lin * p.wrap;
  if (!(arc > 2 * lining_end_margin)) {
    cannot("lining", "the wrap is " + num(arc, 1) + " mm long on the lining, too short for rivets " +
                         num(lining_end_margin, 0) + " mm from each end");
  }
  const int n = std::max(2, static_cast<int>(std::ceil((arc - 2 * lining_end_margin) /
                                                        lining_max_pitch - 1e-9)) + 1);
  const double margin = lining_end_margin / p.r_lin;  // as an angle
  for (int i = 0; i < n; ++i) rv.angles.push_back(margin + i * (p.wrap - 2 * margin) / (n - 1));
  return rv;
}

Joint eye_joint(const Design& d, const Solution& s, const Plan& p) {
  Joint j;
  j.rivet = std::max(joint_rivet_min, std::ceil(2 * p.t - 1e-9));
  j.edge = 2 * j.rivet;
  j.pitch = 3 * j.rivet;
  if (p.b < 2 * j.edge) {
    cannot("band", "band.width = " + num(p.b, 1) + " mm is too narrow for the eye-joint rivets (Ø" +
                       num(j.rivet, 0) + " mm, " + num(j.edge, 0) +
                       " mm from each edge): it needs at least " + num(2 * j.edge, 0) + " mm");
  }
  const int cols = static_cast<int>(std::floor((p.b - 2 * j.edge) / j.pitch + 1e-9)) + 1;
  for (int k = 0; k < cols; ++k) {
    j.across.push_back(cols == 1 ? p.b / 2 : j.edge + k * (p.b - 2 * j.edge) / (cols - 1));
  }
  for (const auto& dir : s.results) {
    for (const DirectionResult& r : dir) j.tension = std::max(j.tension, r.tension_tight);
  }
  j.tau = d.band.pin_allowable_shear > 0 ? d.band.pin_allowable_shear
                                          : d.band.allowable_stress / std::sqrt(3.0);
  const double per_rivet = j.tau * pi * j.rivet * j.rivet / 4 * 1e-6;  // Pa·mm² → N
  const int need = static_cast<int>(std::ceil(j.tension / per_rivet - 1e-9));
  // At least two rows, so that the lap does not hinge about a single row of rivets.
  j.rows = std::max(2, (need + cols - 1) / cols);
  j.capacity = per_rivet * j.rows * cols;
  j.lap = 2 * j.edge + (j.rows - 1) * j.pitch;
  return j;
}

Plan plan(const Design& d, const Solution& s) {
  const Layout& L = s.layout;
  Plan p;
  p.t = d.band.thickness * mm_per_m;
  p.b = d.band.width * mm_per_m;
  p.pin_r = d.band.pin_diameter / 2 * mm_per_m;
  p.rho = p.pin_r + p.t / 2;
  p.r = L.r * mm_per_m;
  p.r_b = L.r_band * mm_per_m;
  p.lining_t = d.lining.thickness * mm_per_m;
  // The lining solid lies between r_b − t/2 − t_L and r_b − t/2 (geometry/assemble.cpp).
  p.r_lin = p.r_b - p.t / 2 - p.lining_t / 2;
  p.wrap = L.wrap;
  p.run_a = L.a.free_length * mm_per_m;
  p.run_b = L.b.free_length * mm_per_m;
  p.centreline = L.band_length * mm_per_m;
  p.eye = (2 * pi - 1) * p.rho;
  // The eye is bent round the pin with inside radius = pin radius; cold-formed strip needs an
  // inside bend radius of at least its thickness (common practice, no source).
  if (p.pin_r < p.t) {
    cannot("band", "the eye round the Ø" + num(2 * p.pin_r, 1) + " mm pin (band.pin_diameter) has an "
                   "inside bend radius of " + num(p.pin_r, 1) + " mm, less than the band thickness " +
                   num(p.t, 1) + " mm (band.thickness): a cold-formed eye needs an inside radius of "
                   "at least one thickness");
  }
  p.rivets = lining_rivets(p);
  p.joint = eye_joint(d, s, p);
  for (bool a : {true, false}) {
    const double room = (a ? p.run_a : p.run_b) - p.rho;
    if (p.joint.lap > room) {
      cannot("band", "the free run at pin " + std::string(a ? "A" : "B") + " (" + end_key(a) +
                         ") leaves " + num(room, 1) + " mm of straight strip beyond the eye; the "
                         "eye joint (" + std::to_string(p.joint.rows) + " rows of Ø" +
                         num(p.joint.rivet, 0) + " mm rivets) needs a lap of " +
                         num(p.joint.lap, 1) + " mm: move the pin away from the drum");
    }
  }
  return p;
}

std::vector<FlatVertex> rectangle(double length, double width) {
  return {{0, 0, 0}, {length, 0, 0}, {length, width, 0}, {0, width, 0}};
}

std::string rivet_line(const LiningRivets& rv, double pitch_here) {
  return std::to_string(rv.across.size()) + " rows x " + std::to_string(rv.angles.size()) +
         " holes dia " + num(rv.hole, 1) + ", " + num(lining_end_margin, 0) +
         " from each lining end on its neutral arc, pitch " + num(pitch_here, 2) +
         " here; 1 row below 50 mm width, 2 below 120 mm, else 3 (common practice, no source)";
}

}  // namespace

FlatPart band_blank(const Design& d, const Solution& s, const PartInfo& band) {
  const Plan p = plan(d, s);
  const Joint& j = p.joint;
  FlatPart f = flat_part_for(band);
  f.name = "BAND-BLANK";
  f.file = "band-blank.dxf";
  f.thickness = p.t;

  // Stations along the blank from the free end of end A (x = 0).
  const double x1 = j.lap;                    // B1: eye A starts
  const double x2 = x1 + 2 * pi * p.rho;      // B2: eye A closes at the run
  const double x3 = x2 + p.run_a - p.rho;     // B3: tangent point A, roll starts
  const double x4 = x3 + p.r_b * p.wrap;      // B4: tangent point B, roll ends
  const double x5 = x4 + p.run_b - p.rho;     // B5: eye B starts
  const double x6 = x5 + 2 * pi * p.rho;      // B6: eye B closes
  const double length = x6 + j.lap;

  f.developed = {
      {"centreline pin A to pin B (solve: run A + wrap arc on r_b + run B)", p.centreline},
      {"eye A: one turn round the pin on rho = pin radius + t/2, less the rho of run inside it",
       p.eye},
      {"eye B: the same", p.eye},
      {"lap A: tail laid back on run A and riveted (eye joint)", j.lap},
      {"lap B: the same at end B", j.lap},
  };
  f.contours.push_back(rectangle(length, p.b));

  const double xs[] = {x1, x2, x3, x4, x5, x6};
  for (int i = 0; i < 6; ++i) {
    f.bend_lines.push_back({xs[i], 0, xs[i], p.b});
    std::string tag = "B";
    tag += std::to_string(i + 1);  // not "B" + std::to_string(): a false -Wrestrict in GCC 12
    f.tags.push_back({xs[i] + 1.5, p.b + 2.0, 3.5, tag});
  }
  // Lining rivets: the same angles as on the lining, developed on the band's neutral radius.
  for (double theta : p.rivets.angles) {
    for (double y : p.rivets.across) f.holes.push_back({x3 + p.r_b * theta, y, p.rivets.hole / 2});
  }
  // Eye joints: tail holes e, e + pitch, … from each free end, and the run holes they land on
  // once the eye is closed (the tail point at x lies lap − x from the eye's closing point).
  for (int row = 0; row < j.rows; ++row) {
    const double from_end = j.edge + row * j.pitch;
    for (double y : j.across) {
      f.holes.push_back({from_end, y, j.rivet / 2});                    // tail A
      f.holes.push_back({x2 + j.lap - from_end, y, j.rivet / 2});       // run A
      f.holes.push_back({x5 - (j.lap - from_end), y, j.rivet / 2});     // run B
      f.holes.push_back({length - from_end, y, j.rivet / 2});           // tail B
    }
  }
  std::sort(f.holes.begin(), f.holes.end(), [](const FlatCircle& a, const FlatCircle& b) {
    return a.x < b.x || (a.x == b.x && a.y < b.y);
  });

  const std::string t = num(p.t, 2), b = num(p.b, 2);
  f.notes = {
      "BAND BLANK  " + d.project.number + "  " + d.project.title,
      f.material + " strip " + t + " thick x " + b + " wide, length " + num(length, 2) +
          " developed on the neutral axis (mid-thickness), quantity " + std::to_string(f.quantity),
      "x = 0 at the free end of end A; B1..B6 on layer BEND; all lengths in mm",
      "length " + num(length, 3) + " = centreline pin A to pin B " + num(p.centreline, 3) +
          " (run A " + num(p.run_a, 3) + " + arc " + num(p.r_b, 3) + " x " + num(p.wrap, 5) +
          " rad + run B " + num(p.run_b, 3) + ")",
      "  + eye A " + num(p.eye, 3) + " + eye B " + num(p.eye, 3) + ": (2 pi - 1) x rho, rho = pin r " +
          num(p.pin_r, 2) + " + t/2 = " + num(p.rho, 3) + " (one turn round the pin, less the rho of run inside the eye)",
      "  + lap A " + num(j.lap, 3) + " + lap B " + num(j.lap, 3) +
          ": tail laid back on the run outside and riveted (eye joint)",
      "B1-B2, B5-B6: form eyes A and B round a dia " + num(2 * p.pin_r, 2) +
          " mandrel (inside radius " + num(p.pin_r, 2) + " >= t), tail outside the run; no pin "
          "holes: the pins pass through the eyes",
      "B3-B4: roll to neutral radius " + num(p.r_b, 3) + " (inside radius " +
          num(p.r_b - p.t / 2, 3) + " = drum radius " + num(p.r, 2) + " + lining " +
          num(p.lining_t, 2) + "), lining side inside",
      "eye joint holes dia " + num(j.rivet, 1) + ": " + std::to_string(j.across.size()) +
          " across x " + std::to_string(j.rows) + " rows in each tail and run, edge " +
          num(j.edge, 1) + ", pitch " + num(j.pitch, 1) + "; single shear " + num(j.capacity / 1000, 2) +
          " kN >= largest tight-side tension " + num(j.tension / 1000, 2) + " kN",
      "  rule: d = max(5, 2t), edge 2d, pitch 3d, at least 2 rows, shear at the pin allowable " +
          num(j.tau / 1e6, 1) + " MPa (common practice, no source); check the joint for the duty",
  };
  if (p.rivets.hole > 0) {
    f.notes.push_back("lining rivet holes: " +
                      rivet_line(p.rivets, p.rivets.angles.size() > 1
                                               ? p.r_b * (p.rivets.angles[1] - p.rivets.angles[0])
                                               : 0.0) +
                      "; same angles as the lining blank");
  } else if (p.lining_t > 0) {
    f.notes.push_back("lining " + num(p.lining_t, 2) + " thick is bonded, not riveted (rivets from " +
                      num(riveted_lining_min, 1) + " mm lining thickness): no lining rivet holes");
  }
  f.notes.push_back(
      "allowances are nominal (neutral axis at mid-thickness, as the solids): try them on a "
      "sample before cutting a batch");
  finish(f);
  return f;
}

std::optional<FlatPart> lining_blank(const Design& d, const Solution& s, const PartInfo& lining) {
  if (!(d.lining.thickness > 0)) return std::nullopt;
  const Plan p = plan(d, s);
  const double strain = p.lining_t / (2 * p.r_lin);
  if (strain > lining_max_strain) {
    cannot("lining", "lining.thickness = " + num(p.lining_t, 2) + " mm rolled from flat to its neutral "
                     "radius " + num(p.r_lin, 2) + " mm strains its faces by t/(2r) = " +
                     num(100 * strain, 2) + " %, more than " + num(100 * lining_max_strain, 0) +
                     " % (common practice, no source): use a lining moulded to the drum radius, "
                     "or at most " + num(2 * lining_max_strain * p.r / (1 - lining_max_strain), 1) +
                     " mm thickness");
  }
  FlatPart f = flat_part_for(lining);
  f.name = "LINING-BLANK";
  f.file = "lining-blank.dxf";
  f.thickness = p.lining_t;
  const double length = p.r_lin * p.wrap;
  f.developed = {{"wrap angle x lining neutral radius (r_b - t/2 - t_lining/2)", length}};
  f.contours.push_back(rectangle(length, p.b));
  for (double theta : p.rivets.angles) {
    for (double y : p.rivets.across) f.holes.push_back({p.r_lin * theta, y, p.rivets.hole / 2});
  }
  f.notes = {
      "LINING BLANK  " + d.project.number + "  " + d.project.title,
      f.material + " lining " + num(p.lining_t, 2) + " thick x " + num(p.b, 2) + " wide, length " +
          num(length, 2) + ", quantity " + std::to_string(f.quantity),
      "length = wrap " + num(p.wrap, 5) + " rad x neutral radius " + num(p.r_lin, 3) +
          " (drum radius " + num(p.r, 2) + " + t_lining/2), tangent point A to tangent point B",
      "x = 0 at the end A tangent point; roll with the friction face inside (face strain " +
          num(100 * strain, 2) + " %, limit " + num(100 * lining_max_strain, 0) + " %)",
  };
  if (p.rivets.hole > 0) {
    f.notes.push_back("rivet holes: " +
                      rivet_line(p.rivets, p.rivets.angles.size() > 1
                                               ? p.r_lin * (p.rivets.angles[1] - p.rivets.angles[0])
                                               : 0.0));
    f.notes.push_back("same angles as the band blank's lining holes; counterbore from the friction "
                      "face so that the rivet heads sit below it");
  } else {
    f.notes.push_back("bonded to the band (thinner than " + num(riveted_lining_min, 1) +
                      " mm): no rivet holes");
  }
  finish(f);
  return f;
}

}  // namespace bandforge::geom
