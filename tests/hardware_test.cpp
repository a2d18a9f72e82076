// The generated hardware (src/hardware.hpp) against hand computations written here: bracket bore
// bearing and plate bending, the cheeks' load split, rivet shear and bearing, the band's net
// section, the welded end block's weld throat, bearing and net section; and the layouts the
// first sweep refused (issue 12) now planned without refusal. Core only: no OpenCASCADE.
#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <numbers>
#include <string>

#include "src/design_reader.hpp"
#include "src/hardware.hpp"
#include "src/mechanics.hpp"
#include "tests/support.hpp"

namespace bandforge {
namespace {

constexpr double pi = std::numbers::pi;
const std::string kExample = std::string(BANDFORGE_SOURCE_DIR) + "/examples/bin-hoist.toml";

std::string example_text() { return test::slurp(kExample); }

// The example with one piece of text replaced (the text must be there).
std::string edited(std::string text, const std::string& from, const std::string& to) {
  const auto at = text.find(from);
  EXPECT_NE(at, std::string::npos) << from;
  if (at != std::string::npos) text.replace(at, from.size(), to);
  return text;
}

const Check& check(const Solution& s, const std::string& id) {
  for (const Check& c : s.checks) {
    if (c.id == id) return c;
  }
  ADD_FAILURE() << "no check " << id;
  return s.checks.front();
}

const BracketPlan& bracket(const HardwarePlan& h, const std::string& name) {
  for (const BracketPlan& b : h.brackets) {
    if (b.name == name) return b;
  }
  ADD_FAILURE() << "no bracket " << name;
  return h.brackets.front();
}

double largest_tension_at_a(const Solution& s) {
  double p = 0;
  for (const DirectionResult& r : s.results[0]) p = std::max(p, r.tension_tight);  // A tight
  for (const DirectionResult& r : s.results[1]) p = std::max(p, r.tension_slack);  // A slack
  return p;
}

TEST(Brackets, BinHoistPlatesByHand) {
  const Design d = read_design_file(kExample);
  const Solution s = solve(d);
  const HardwarePlan& h = s.hardware;
  ASSERT_TRUE(h.refusal.empty()) << h.refusal;
  // End A (frame) and the pivot are 50 mm apart: their 40 × 40 mm lugs stay apart, one each.
  ASSERT_EQ(h.brackets.size(), 2u);
  const BracketPlan& a = bracket(h, "ANCHOR-A");
  const double F = largest_tension_at_a(s);
  EXPECT_NEAR(F, 3831.07, 0.01);  // P1 at f_min (mechanics_test checks it against W-examples)
  // End A sits under the lever (the lever runs from the pivot at x = −110 to the handle at
  // x = 700 along y = −300): no front cheek fits, so one plate carries an overhung pin.
  // Out-of-plane bending at the bore, σ = 6·F·e/((w − d)·t²) (elementary beam bending,
  // Shigley 9th ed. §3-10), w = 40, d = 16, e = gap 4 + band b/2 40 + t/2:
  //   t = 12 mm: e = 50,   σ = 6·3831·50/(24·12²)   = 332.6 MPa > 0.60·235 = 141 MPa;
  //   t = 15 mm: e = 51.5, σ = 6·3831·51.5/(24·15²) = 219.2 MPa > 141 MPa;
  //   t = 20 mm: e = 54,   σ = 6·3831·54/(24·20²)   = 129.3 MPa ≤ 0.60·225 = 135 MPa.
  // (Limits: AISC ASD 1989 F1, 0.60 F_y; S235 F_y 235 MPa to 16 mm, 225 MPa to 40 mm,
  // EN 10025-2 — both from memory.)
  EXPECT_FALSE(a.cheek);
  EXPECT_NEAR(a.thickness, 0.020, 1e-12);
  EXPECT_NEAR(a.z_front, -0.044, 1e-12);
  EXPECT_NEAR(check(s, "bracket_bending_A").value, 6 * F * 54 / (24 * 400) * 1e6, 1e-6 * 1e8);
  EXPECT_NEAR(check(s, "bracket_bending_A").value / 1e6, 129.3, 0.05);
  EXPECT_NEAR(check(s, "bracket_bending_A").limit, 0.60 * 225e6, 1);
  // Bore bearing p = F/(d·t) (REFERENCE: σ_br = P1/(d·t_eff), common practice): 3831/(16·20).
  EXPECT_NEAR(check(s, "bracket_bearing_A").value / 1e6, 3831.07 / 320, 1e-4);
  EXPECT_NEAR(check(s, "bracket_bearing_A").limit, 0.90 * 225e6, 1);
  // The lever stands 1.5 mm further out than the 4 mm gap: pin A (on the frame, under the
  // lever) has its head in front, ISO 2341 k = 4.5 mm for Ø16 (REFERENCE §5.9), and the plan
  // leaves 1 mm beyond it: band front 40 + 4.5 + 1 = 45.5 mm.
  EXPECT_NEAR(h.axial.lever_back, 0.0455, 1e-12);
  // The pivot: a back plate (same 20 mm stock) and a front cheek in front of the lever, the pin
  // a beam on two supports. z: back plate −64…−44 (mid −54), lever 45.5…57.5 (mid 51.5), cheek
  // 61.5…81.5 (mid 71.5); the front cheek takes F·(51.5 + 54)/(71.5 + 54) = F·105.5/125.5.
  const BracketPlan& o = bracket(h, "ANCHOR-PIVOT");
  EXPECT_TRUE(o.cheek);
  EXPECT_NEAR(o.cheek_z_back, 0.0615, 1e-12);
  EXPECT_NEAR(o.cheek_z_front, 0.0815, 1e-12);
  double R = 0;
  for (const auto& dir : s.results) {
    for (const DirectionResult& r : dir) R = std::max(R, std::hypot(r.pivot_reaction.x, r.pivot_reaction.y));
  }
  const double front = R * 105.5 / 125.5;
  EXPECT_NEAR(check(s, "bracket_bearing_PIVOT").value, front / (16e-3 * 20e-3), 1e-6 * 1e7);
  // Net section of a cheek at the bore, F/((w − d)·t) (pin-connected plate, AISC ASD D3.1).
  EXPECT_NEAR(check(s, "bracket_net_PIVOT").value, front / (24e-3 * 20e-3), 1e-6 * 1e7);
}

TEST(Brackets, FramePinBesideThePivotSharesOneBracket) {
  // The first sweep's most common refusal: a frame band end a few tens of millimetres from the
  // pivot, each with a lug of its own, and the two lugs overlapping. End A 30 mm from the pivot.
  const Design d = read_design_text(
      edited(example_text(), "pivot = [\"-110 mm\", \"-300 mm\"]", "pivot = [\"-90 mm\", \"-300 mm\"]"),
      "beside.toml");
  const Solution s = solve(d);
  const HardwarePlan& h = s.hardware;
  ASSERT_TRUE(h.refusal.empty()) << h.refusal;
  ASSERT_EQ(h.brackets.size(), 1u);
  const BracketPlan& b = h.brackets[0];
  EXPECT_EQ(b.name, "BRACKET-A-PIVOT");
  EXPECT_EQ(b.pins, (std::vector<std::string>{"A", "PIVOT"}));
  ASSERT_EQ(b.holes.size(), 2u);
  EXPECT_NEAR(std::hypot(b.holes[0].x - b.holes[1].x, b.holes[0].y - b.holes[1].y), 0.030, 1e-12);
  // Both pins are held by it.
  int held = 0;
  for (const PinPlan& p : h.pins) held += p.bracket == "BRACKET-A-PIVOT";
  EXPECT_EQ(held, 2);
}

TEST(Joints, RivetedLapByHand) {
  // bin-hoist: t = 3, b = 80, τ = 60 MPa/√3 = 34.64 MPa. d = max(5, 2t) = 6 mm, edge 12,
  // pitch 18, columns ⌊(80 − 24)/18⌋ + 1 = 4, rows 2 (8 rivets carry 8·979.5 = 7836 N ≥ 3831 N).
  const Design d = read_design_file(kExample);
  const Solution s = solve(d);
  const JointPlan& j = s.hardware.joint_a;
  EXPECT_EQ(j.kind, JointKind::riveted_lap);
  EXPECT_EQ(j.columns, 4);
  EXPECT_EQ(j.rows, 2);
  EXPECT_NEAR(j.lap, 0.042, 1e-12);
  const double P = 3831.07;
  // Rivet shear τ = P/(n·πd²/4), rivets in single shear (common practice, no source).
  EXPECT_NEAR(check(s, "joint_a_rivet_shear").value / 1e6, P / (8 * pi * 36 / 4), 1e-4);
  EXPECT_NEAR(check(s, "joint_a_rivet_shear").value / 1e6, 16.94, 0.005);
  // Rivet bearing σ = P/(n·d·t) = 3831/(8·6·3) = 26.60 MPa.
  EXPECT_NEAR(check(s, "joint_a_rivet_bearing").value / 1e6, P / (8 * 6 * 3), 1e-4);
  // Net section at a row σ = P/((b − n·d)·t) (REFERENCE §1.4, common practice) = 3831/(56·3).
  EXPECT_NEAR(check(s, "joint_a_net_section").value / 1e6, P / ((80 - 24) * 3), 1e-4);
  EXPECT_NEAR(check(s, "joint_a_net_section").limit, 60e6 / 0.6, 1);
}

TEST(Joints, RivetRowsAndTheRivetAsBought) {
  // bin-hoist end A: ρ_n = 8 + 1.5 = 9.5 mm (pin radius + t/2), lap 42, edge 12, pitch 18: rows at
  // ρ_n + lap − edge = 39.5 and 39.5 − 18 = 21.5 mm from the pin along the run (the band
  // blank's holes, geometry/flat_band.cpp). The run leaves 216.2 − 39.5 mm to the tangent point:
  // a round closing head 3.6 deep clears the band's circle (r_b − t/2 = 205 mm) there, so the
  // rivet is DIN 660 6 × 16 (clamp 6 + 1.5·6 = 15 → 16, standard_parts_test), closed round.
  const Solution s = solve(read_design_file(kExample));
  for (const JointPlan* j : {&s.hardware.joint_a, &s.hardware.joint_b}) {
    ASSERT_EQ(j->rivet_at.size(), 2u);
    EXPECT_NEAR(j->rivet_at[0], 0.0395, 1e-12);
    EXPECT_NEAR(j->rivet_at[1], 0.0215, 1e-12);
    EXPECT_EQ(j->rivets.closing, standard::RivetClosing::round);
    EXPECT_EQ(j->rivets.designation(), "Round head rivet DIN 660 - 6 × 16 - St");
  }
}

TEST(Joints, WeldedBlockByHand) {
  // The example with its ends asked to be welded blocks. P = 3831 N, t = 3, b = 80, d = 16.
  const Design d = read_design_text(
      edited(example_text(), "pin_diameter = ", "end_joint = \"welded-block\"\npin_diameter = "),
      "welded.toml");
  const Solution s = solve(d);
  const JointPlan& j = s.hardware.joint_a;
  ASSERT_EQ(j.kind, JointKind::welded_block);
  EXPECT_FALSE(j.chosen_automatically);
  const double P = 3831.07;
  // Fillet welds of leg h = t on both faces across the width: τ = P/(0.707·h·2b)
  // (Shigley 9th ed. §9-3, throat 0.707 h) = 3831/(0.707·3·160) = 11.29 MPa;
  // limit 0.30·482 MPa (E70xx, AISC as in Shigley 9th ed. Tables 9-3, 9-4; from memory).
  EXPECT_NEAR(check(s, "joint_a_weld_throat").value / 1e6, P / (0.707 * 3 * 160), 1e-4);
  EXPECT_NEAR(check(s, "joint_a_weld_throat").limit / 1e6, 144.6, 1e-9);
  // Block: wall round the bore max(2, d/4) = 4 mm; ligaments 4 mm (the tension needs only
  // P/(2·b·0.45·215 MPa) = 0.25 mm); H = 16 + 8 = 24 mm; beyond the bore max(4, d/2) = 8 mm;
  // slot depth max(3t, 8) = 9 mm; back = 8 + 4 + 9 = 21 mm, front = 8 + 8 = 16 mm.
  EXPECT_NEAR(j.block_height, 0.024, 1e-12);
  EXPECT_NEAR(j.block_front, 0.016, 1e-12);
  EXPECT_NEAR(j.block_back, 0.021, 1e-12);
  EXPECT_NEAR(j.slot_depth, 0.009, 1e-12);
  // Run it takes: block back 21 + weld leg 3 + clearance 3 = 27 mm.
  EXPECT_NEAR(j.needs, 0.027, 1e-12);
  // Bearing in the bore P/(d·b) = 3831/(16·80) = 2.993 MPa; net section P/((H − d)·b)
  // = 3831/(8·80) = 5.986 MPa (S235 over 63 mm taken as 215 MPa: EN 10025-2, from memory).
  EXPECT_NEAR(check(s, "joint_a_block_bearing").value / 1e6, P / (16 * 80), 1e-4);
  EXPECT_NEAR(check(s, "joint_a_block_net").value / 1e6, P / (8 * 80), 1e-4);
  EXPECT_NEAR(check(s, "joint_a_block_net").limit / 1e6, 0.45 * 215, 1e-9);
}

TEST(Joints, ShortRunGetsAShorterJointInsteadOfARefusal) {
  // The first sweep's third refusal: a 3 in × 1/8 in band whose run leaves about 151 mm beyond
  // the eye, where the riveted lap needs 9 rows of Ø7 rivets (196 mm). Pins at (±60, −255):
  // r_b = 200 + 5 + 3.175/2 = 206.59 mm, run √(262.0² − 206.59²) = 161.1 mm, less the eye's
  // ρ = 8 + 1.5875 = 9.59 mm: 151.5 mm of strip.
  std::string text = example_text();
  for (auto [from, to] : {std::pair<std::string, std::string>{"width = \"80 mm\"", "width = \"3 in\""},
                          {"thickness = \"3 mm\"", "thickness = \"0.125 in\""},
                          {"allowable_stress = \"60 MPa\"", "allowable_stress = \"100 MPa\"\npin_allowable_shear = \"20 MPa\""},
                          {"[\"-60 mm\", \"-300 mm\"]", "[\"-60 mm\", \"-255 mm\"]"},
                          {"[\"60 mm\", \"-300 mm\"]", "[\"60 mm\", \"-255 mm\"]"},
                          {"pivot = [\"-110 mm\", \"-300 mm\"]", "pivot = [\"-110 mm\", \"-255 mm\"]"},
                          {"handle = [\"700 mm\", \"-300 mm\"]", "handle = [\"700 mm\", \"-255 mm\"]"}}) {
    text = edited(text, from, to);
  }
  // Torque scaled so that end A carries 19.6 kN: 9 rows of the lap rule (Ø7 = ⌈2·3.175⌉,
  // 3 columns across 76.2 mm at edge 14 and pitch 21; 20 MPa·π·7²/4 = 769.7 N a rivet, 25 to 27
  // rivets), lap = 2·14 + 8·21 = 196 mm.
  const Solution first = solve(read_design_text(text, "short-run.toml"));
  const double scale = 19600 / largest_tension_at_a(first);
  text = edited(text, "torque = \"400 N*m\"", "torque = \"" + std::to_string(400 * scale) + " N*m\"");
  const std::string lap = edited(text, "pin_diameter = ", "end_joint = \"riveted-lap\"\npin_diameter = ");
  const Solution forced = solve(read_design_text(lap, "short-run-lap.toml"));
  EXPECT_NEAR(forced.hardware.joint_a.room * 1000, 151.5, 0.1);
  EXPECT_NEAR(forced.hardware.joint_a.rivet, 0.007, 1e-12);
  EXPECT_EQ(forced.hardware.joint_a.rows, 9);
  EXPECT_NEAR(forced.hardware.joint_a.lap, 0.196, 1e-12);
  EXPECT_FALSE(forced.hardware.refusal.empty());  // asked for by name, it cannot fit
  // Left to choose: a joint that fits, passes its checks, and no refusal.
  const Solution s = solve(read_design_text(text, "short-run.toml"));
  EXPECT_TRUE(s.hardware.refusal.empty()) << s.hardware.refusal;
  const JointPlan& j = s.hardware.joint_a;
  EXPECT_NE(j.kind, JointKind::riveted_lap);
  EXPECT_LE(j.needs, j.room);
  for (const Check& c : s.checks) {
    if (c.id.rfind("joint_a_", 0) == 0) {
      EXPECT_TRUE(c.ok) << c.id << " " << c.value << " " << c.limit;
    }
  }
}

TEST(Hardware, ExamplesPlanWithoutRefusalAndPassEveryHardwareCheck) {
  for (const char* name : {"bin-hoist", "ferry-differential", "trolley-two-way"}) {
    const Design d = read_design_file(std::string(BANDFORGE_SOURCE_DIR) + "/examples/" + name + ".toml");
    const Solution s = solve(d);
    EXPECT_TRUE(s.hardware.present) << name;
    EXPECT_TRUE(s.hardware.refusal.empty()) << name << ": " << s.hardware.refusal;
    EXPECT_TRUE(s.hardware.release_ok) << name;
    for (const Check& c : s.hardware.checks) EXPECT_TRUE(c.ok) << name << ": " << c.id;
  }
  const Design sketch = read_design_file(std::string(BANDFORGE_SOURCE_DIR) + "/examples/concept-differential.toml");
  EXPECT_FALSE(solve(sketch).hardware.present);
}

TEST(Hardware, PlateDistancesByHand) {
  // Two stadiums along x, radius 5: segments (0,0)–(10,0) and (30,0)–(40,0) are 20 apart, so the
  // plates are 20 − 10 = 10 apart; a point 8 above the first segment is 3 outside its plate.
  EXPECT_NEAR(distance_between_plates({{0, 0}, {10, 0}}, 5, {{30, 0}, {40, 0}}, 5), 10.0, 1e-12);
  EXPECT_NEAR(distance_to_plate({5, 8}, {{0, 0}, {10, 0}}, 5), 3.0, 1e-12);
  // Inside a hull: negative, the distance to the nearest edge plus the radius.
  EXPECT_NEAR(distance_to_plate({5, 5}, {{0, 0}, {10, 0}, {10, 10}, {0, 10}}, 1), -6.0, 1e-12);
  // Overlapping plates are 0 apart.
  EXPECT_EQ(distance_between_plates({{0, 0}, {10, 0}}, 5, {{5, 3}, {5, 20}}, 1), 0.0);
}

}  // namespace
}  // namespace bandforge
