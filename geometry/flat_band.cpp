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
#include "src/hardware.hpp"
#include "src/standard_parts.hpp"

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

// Everything in millimetres, from the design and the applied layout.
struct Plan {
  double t = 0, b = 0;           // band thickness and width
  double pin_r = 0, rho = 0;     // pin radius; eye neutral radius pin_r + t/2
  double r = 0, r_b = 0;         // drum friction radius; band neutral radius (the solved r_b)
  double lining_t = 0, r_lin = 0;  // lining thickness and neutral radius
  double wrap = 0;               // [rad]
  double run_a = 0, run_b = 0;   // free runs, pin centre to tangent point
  double centreline = 0;         // the solve's band length, pin centre to pin centre
  LiningRivets rivets;
  const JointPlan* joint[2] = {nullptr, nullptr};  // A, B (src/hardware.hpp)
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

Plan plan(const Design& d, const Solution& s) {
  const Layout& L = s.layout;
  Plan p;
  p.t = d.band.thickness * mm_per_m;
  p.b = d.band.width * mm_per_m;
  // The eye is formed round the pin as bought, the ISO 2341 nominal (src/standard_parts.hpp),
  // as the band solid is (geometry/assemble.cpp): not the design's figure when that is no size
  // of the series.
  p.pin_r = standard::clevis_nominal(d.band.pin_diameter) / 2 * mm_per_m;
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
  p.joint[0] = &s.hardware.joint_a;
  p.joint[1] = &s.hardware.joint_b;
  // An eye is bent round the pin with inside radius = pin radius; cold-formed strip needs an
  // inside bend radius of at least its thickness (common practice, no source).
  const bool eyes = p.joint[0]->kind != JointKind::welded_block ||
                    p.joint[1]->kind != JointKind::welded_block;
  if (eyes && p.pin_r < p.t) {
    cannot("band", "the eye round the Ø" + num(2 * p.pin_r, 1) + " mm pin (band.pin_diameter) has an "
                   "inside bend radius of " + num(p.pin_r, 1) + " mm, less than the band thickness " +
                   num(p.t, 1) + " mm (band.thickness): a cold-formed eye needs an inside radius of "
                   "at least one thickness; make band.pin_diameter at least " +
                   num(2 * p.t, 1) + " mm, or set band.end_joint = \"welded-block\"");
  }
  p.rivets = lining_rivets(p);
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
  FlatPart f = flat_part_for(band);
  f.name = "BAND-BLANK";
  f.file = "band-blank.dxf";
  f.thickness = p.t;

  // Each end as it is made (src/hardware.hpp): a riveted joint is a tail (the lap), an eye of
  // one turn round the pin on ρ = pin radius + t/2, then the straight run to its tangent point
  // less the ρ inside the eye; a welded end block takes the strip into its slot, which ends
  // `cut` from the pin centre, so the strip is the run less that.
  struct End {
    const JointPlan* j;
    bool riveted;
    double tail, eye, straight, cut;
  };
  End ends[2];
  for (int i = 0; i < 2; ++i) {
    const JointPlan* j = p.joint[i];
    const double run = i == 0 ? p.run_a : p.run_b;
    const bool riveted = j->kind != JointKind::welded_block;
    const double cut = riveted ? 0 : (j->block_back - j->slot_depth) * mm_per_m;
    ends[i] = {j, riveted, riveted ? j->lap * mm_per_m : 0, riveted ? 2 * pi * p.rho : 0,
               riveted ? run - p.rho : run - cut, cut};
  }
  // Stations along the blank from the free end at A (x = 0).
  std::vector<std::pair<double, std::string>> bends;  // x, what
  double x = ends[0].tail;
  if (ends[0].riveted) {
    bends.push_back({x, "eye A starts"});
    x += ends[0].eye;
    bends.push_back({x, "eye A closes"});
  }
  const double eye_a_closed = x;
  x += ends[0].straight;
  const double roll_start = x;
  bends.push_back({x, "roll starts (tangent point A)"});
  x += p.r_b * p.wrap;
  bends.push_back({x, "roll ends (tangent point B)"});
  x += ends[1].straight;
  const double eye_b_start = x;
  if (ends[1].riveted) {
    bends.push_back({x, "eye B starts"});
    x += ends[1].eye;
    bends.push_back({x, "eye B closes"});
  }
  const double length = x + ends[1].tail;

  f.developed = {{"centreline pin A to pin B (solve: run A + wrap arc on r_b + run B)", p.centreline}};
  for (int i = 0; i < 2; ++i) {
    const std::string e = i == 0 ? "A" : "B";
    if (ends[i].riveted) {
      f.developed.push_back({"eye " + e + ": one turn round the pin on rho = pin radius + t/2, less "
                             "the rho of run inside it", (2 * pi - 1) * p.rho});
      f.developed.push_back({"lap " + e + ": tail laid back on run " + e + " and riveted (" +
                             to_string(ends[i].j->kind) + ")", ends[i].tail});
    } else {
      f.developed.push_back({"end " + e + ": the strip stops in the end block's slot, this far short "
                             "of the pin centre (welded-block)", -ends[i].cut});
    }
  }
  f.contours.push_back(rectangle(length, p.b));
  for (std::size_t i = 0; i < bends.size(); ++i) {
    f.bend_lines.push_back({bends[i].first, 0, bends[i].first, p.b});
    std::string tag = "B";
    tag += std::to_string(i + 1);  // not "B" + std::to_string(): a false -Wrestrict in GCC 12
    f.tags.push_back({bends[i].first + 1.5, p.b + 2.0, 3.5, tag});
  }
  // Lining rivets: the same angles as on the lining, developed on the band's neutral radius.
  for (double theta : p.rivets.angles) {
    for (double y : p.rivets.across) f.holes.push_back({roll_start + p.r_b * theta, y, p.rivets.hole / 2});
  }
  // Riveted joints: tail holes e, e + pitch, … from each free end, and the run holes they land
  // on once the eye is closed (the tail point at x lies lap − x from the eye's closing point).
  for (int i = 0; i < 2; ++i) {
    if (!ends[i].riveted) continue;
    const JointPlan& j = *ends[i].j;
    const double rivet = j.rivet * mm_per_m, edge = j.edge * mm_per_m, pitch = j.pitch * mm_per_m;
    const double lap = ends[i].tail;
    for (int row = 0; row < j.rows; ++row) {
      const double from_end = edge + row * pitch;
      for (double y_m : j.across) {
        const double y = y_m * mm_per_m;
        if (i == 0) {
          f.holes.push_back({from_end, y, rivet / 2});                       // tail A
          f.holes.push_back({eye_a_closed + lap - from_end, y, rivet / 2});  // run A
        } else {
          f.holes.push_back({eye_b_start - (lap - from_end), y, rivet / 2});  // run B
          f.holes.push_back({length - from_end, y, rivet / 2});               // tail B
        }
      }
    }
  }
  std::sort(f.holes.begin(), f.holes.end(), [](const FlatCircle& a, const FlatCircle& b) {
    return a.x < b.x || (a.x == b.x && a.y < b.y);
  });

  const std::string t = num(p.t, 2), b = num(p.b, 2);
  std::string bend_list;
  for (std::size_t i = 0; i < bends.size(); ++i) {
    bend_list += (i ? ", B" : "B") + std::to_string(i + 1) + " " + bends[i].second;
  }
  f.notes = {
      "BAND BLANK  " + d.project.number + "  " + d.project.title,
      f.material + " strip " + t + " thick x " + b + " wide, length " + num(length, 2) +
          " developed on the neutral axis (mid-thickness), quantity " + std::to_string(f.quantity),
      "x = 0 at the free end of end A; bend lines on layer BEND: " + bend_list + "; all lengths in mm",
      "length " + num(length, 3) + " = centreline pin A to pin B " + num(p.centreline, 3) +
          " (run A " + num(p.run_a, 3) + " + arc " + num(p.r_b, 3) + " x " + num(p.wrap, 5) +
          " rad + run B " + num(p.run_b, 3) + ")",
  };
  for (int i = 0; i < 2; ++i) {
    const std::string e = i == 0 ? "A" : "B";
    const JointPlan& j = *ends[i].j;
    if (ends[i].riveted) {
      f.notes.push_back("  + eye " + e + " " + num((2 * pi - 1) * p.rho, 3) + ": (2 pi - 1) x rho, rho = pin r " +
                        num(p.pin_r, 2) + " + t/2 = " + num(p.rho, 3) +
                        " (one turn round the pin, less the rho of run inside the eye)");
      f.notes.push_back("  + lap " + e + " " + num(ends[i].tail, 3) + ": tail laid back on the run outside and riveted (" +
                        to_string(j.kind) + ")");
      f.notes.push_back(
          "end " + e + " joint holes dia " + num(j.rivet * mm_per_m, 1) + ": " +
          std::to_string(j.across.size()) + " across x " + std::to_string(j.rows) +
          " rows in the tail and the run, edge " + num(j.edge * mm_per_m, 1) + ", pitch " +
          num(j.pitch * mm_per_m, 1) + "; rivet shear capacity " + num(j.rivet_capacity / 1000, 2) +
          " kN >= largest tension at this end " + num(j.tension / 1000, 2) + " kN" +
          (j.kind == JointKind::riveted_lap
               ? " (rule: d = max(5, 2t), edge 2d, pitch 3d, at least 2 rows; common practice, no source)"
               : " (round-head rivet of the DIN 660 / DIN 124 series, least spacings of EN 1993-1-8 Table 3.3)"));
    } else {
      f.notes.push_back("  - end " + e + " " + num(ends[i].cut, 3) +
                        ": the strip ends in the slot of END-BLOCK-" + e + ", " + num(ends[i].cut, 2) +
                        " from the pin centre; weld both faces at the slot mouth, fillet leg " +
                        num(j.weld_leg * mm_per_m, 1) + " (welded-block)");
    }
  }
  if (ends[0].riveted || ends[1].riveted) {
    f.notes.push_back("eyes: form round a dia " + num(2 * p.pin_r, 2) + " mandrel (inside radius " +
                      num(p.pin_r, 2) + " >= t), tail outside the run; no pin holes: the pins pass "
                      "through the eyes");
  }
  f.notes.push_back("roll between tangent points to neutral radius " + num(p.r_b, 3) + " (inside radius " +
                    num(p.r_b - p.t / 2, 3) + " = drum radius " + num(p.r, 2) + " + lining " +
                    num(p.lining_t, 2) + "), lining side inside");
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
