// Weight- and spring-applied brakes (src/apply.hpp, REFERENCE §8): the [apply] section read and
// written back, the lever statics against hand computations written here, the release
// actuator, the spring's checks, and the hoist rules of REFERENCE §7.
#include "src/apply.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <string>
#include <vector>

#include "src/design_reader.hpp"
#include "src/design_writer.hpp"
#include "src/errors.hpp"
#include "src/hardware.hpp"
#include "src/mechanics.hpp"
#include "src/report.hpp"

namespace bandforge {
namespace {

constexpr double kPi = 3.14159265358979323846;
constexpr double kG = 9.80665;  // standard gravity (3rd CGPM, 1901)
constexpr double kSteel = 7850;  // src/materials.cpp "steel" (7850 kg/m³, from memory)

#define EXPECT_REL(actual, expected, tol) \
  EXPECT_NEAR((actual), (expected), (tol) * std::abs(static_cast<double>(expected)))

// A simple brake of our own: end A on the frame, end B and the handle on the lever, everything on
// the line y = −250 mm; drum and band both cw, so end A (on the frame) is tight in the design
// rotation and the lever turns cw to apply.
const std::string kBase = R"([project]
title = "Apply test brake"
number = "AP-1"

[drum]
diameter = "320 mm"
width = "80 mm"
bore = "50 mm"
rotation = "cw"

[lining]
material = "molded"
thickness = "5 mm"

[band]
width = "60 mm"
thickness = "2.5 mm"
allowable_stress = "80 MPa"
sense = "cw"
end_a = { mount = "frame", at = ["-50 mm", "-250 mm"] }
end_b = { mount = "lever", at = ["50 mm", "-250 mm"] }
pin_diameter = "14 mm"
clearance = "1.5 mm"

[lever]
pivot = ["-95 mm", "-250 mm"]
handle = ["600 mm", "-250 mm"]
width = "40 mm"
thickness = "12 mm"
allowable_stress = "120 MPa"

[load]
torque = "250 N*m"
service_factor = 1.25
)";

const std::string kHoist = R"(
[duty]
mass = "200 kg"
speed = "0.4 m/s"
stop_distance = "0.1 m"
rope_radius = "120 mm"
)";

const std::string kSpring = R"(
[apply]
by = "spring"
at = ["250 mm", "-250 mm"]
seat = ["250 mm", "-90 mm"]
wear_allowance = "2 mm"
)";

const std::string kWeight = R"(
[apply]
by = "weight"
at = ["600 mm", "-250 mm"]
mass = "30 kg"
wear_allowance = "2 mm"
actuator_at = ["400 mm", "-250 mm"]
)";

Design read(const std::string& text) { return read_design_text(text, "t.toml"); }

int line_of(const std::string& text, const std::string& needle) {
  const std::size_t at = text.find(needle);
  EXPECT_NE(at, std::string::npos) << "test bug: no " << needle;
  return 1 + static_cast<int>(std::count(text.begin(), text.begin() + static_cast<long>(at), '\n'));
}

void expect_mistake(const std::string& text, const std::string& key, int line,
                    const std::vector<std::string>& parts) {
  try {
    read(text);
    ADD_FAILURE() << "accepted:\n" << text;
  } catch (const DesignError& e) {
    EXPECT_EQ(e.key(), key) << e.what();
    EXPECT_EQ(e.line(), line) << e.what();
    EXPECT_EQ(std::string(e.what()).rfind("t.toml:", 0), 0u) << e.what();
    for (const auto& p : parts) EXPECT_NE(std::string(e.what()).find(p), std::string::npos) << e.what() << "\nmissing: " << p;
  }
}

const Check* find_check(const Solution& s, const std::string& id) {
  for (const Check& c : s.checks)
    if (c.id == id) return &c;
  return nullptr;
}

Vec2 rotate(Vec2 p, Vec2 o, double a) {
  const double x = p.x - o.x, y = p.y - o.y;
  return {o.x + std::cos(a) * x - std::sin(a) * y, o.y + std::sin(a) * x + std::cos(a) * y};
}

// ------------------------------------------------------------------------------------ reader

TEST(ApplyReader, EveryKeyIsReadWithItsUnit) {
  const Design d = read(kBase + R"(
[apply]
by = "spring"
at = ["60 cm", "-250 mm"]
seat = ["0.6 m", "-3.5 in"]
wear_allowance = "0.08 in"
actuator_at = ["500 mm", "-250 mm"]
both_rotations = true
spring_material = "chrome-vanadium"
spring_ends = "squared"
spring_seats = "flat-flat"
spring_max_outer_diameter = "3 in"
)");
  const Apply& a = d.apply;
  EXPECT_EQ(a.by, ApplyBy::spring);
  EXPECT_NEAR(a.at.x, 0.600, 1e-12);
  EXPECT_NEAR(a.seat.y, -3.5 * 0.0254, 1e-12);  // 1 in = 25.4 mm exactly
  EXPECT_NEAR(a.wear_allowance, 0.08 * 0.0254, 1e-12);
  EXPECT_NEAR(a.actuator_at.x, 0.500, 1e-12);
  EXPECT_TRUE(a.both_rotations);
  EXPECT_EQ(a.spring_material, "chrome-vanadium");
  EXPECT_EQ(a.spring_ends, SpringEnds::squared);
  EXPECT_EQ(a.spring_seats, SpringSeats::flat_flat);
  EXPECT_NEAR(a.spring_max_outer_diameter, 3 * 0.0254, 1e-12);

  const Design w = read(kBase + kWeight);
  EXPECT_EQ(w.apply.by, ApplyBy::weight);
  EXPECT_DOUBLE_EQ(w.apply.mass, 30.0);
  EXPECT_NEAR(w.apply.actuator_at.x, 0.400, 1e-12);
}

TEST(ApplyReader, Defaults) {
  const Design h = read(kBase);
  EXPECT_EQ(h.apply.by, ApplyBy::hand);
  const Design d = read(kBase + "\n[apply]\nby = \"spring\"\nseat = [\"600 mm\", \"-90 mm\"]\n");
  EXPECT_DOUBLE_EQ(d.apply.at.x, d.lever.handle.x);       // at: the handle point
  EXPECT_DOUBLE_EQ(d.apply.actuator_at.x, d.apply.at.x);  // actuator_at: at
  EXPECT_DOUBLE_EQ(d.apply.wear_allowance, 0.0025);       // half the 5 mm lining (common practice, no source)
  EXPECT_EQ(d.apply.spring_material, "oil-tempered");
  EXPECT_EQ(d.apply.spring_ends, SpringEnds::squared_ground);
  EXPECT_EQ(d.apply.spring_seats, SpringSeats::flat_pivoted);
  EXPECT_FALSE(d.apply.both_rotations);
}

TEST(ApplyReader, MistakesNameKeyLineAndWhatIsValid) {
  std::string t = kBase + "\n[apply]\nby = \"springs\"\n";
  expect_mistake(t, "apply.by", line_of(t, "by = "), {"\"springs\"", "\"hand\", \"weight\" or \"spring\""});
  t = kBase + kSpring + "mass = \"20 kg\"\n";
  expect_mistake(t, "apply.mass", line_of(t, "mass = "), {"belongs to a weight", "seat"});
  t = kBase + "\n[apply]\nby = \"spring\"\nat = [\"600 mm\", \"-250 mm\"]\n";
  expect_mistake(t, "apply.seat", line_of(t, "[apply]"), {"missing key 'seat'", "seat = ["});
  t = kBase + kWeight + "seat = [\"600 mm\", \"-90 mm\"]\n";
  expect_mistake(t, "apply.seat", line_of(t, "seat = "), {"belongs to a spring"});
  t = kBase + "\n[apply]\nat = [\"600 mm\", \"-250 mm\"]\n";
  expect_mistake(t, "apply.at", line_of(t, "at = [\"600"), {"applied by hand", "by = \"weight\" or \"spring\""});
  t = kBase + kSpring + "spring_material = \"oil-temperd\"\n";
  expect_mistake(t, "apply.spring_material", line_of(t, "spring_material"), {"did you mean \"oil-tempered\"", "\"music-wire\""});
  t = kBase + "\n[apply]\nby = \"weight\"\nmass = \"20 kg\"\nwear_allowance = \"6 mm\"\n";
  expect_mistake(t, "apply.wear_allowance", line_of(t, "wear_allowance"), {"\"6 mm\"", "lining thickness (5 mm)"});
  t = kBase + kSpring + "both_rotations = \"yes\"\n";
  expect_mistake(t, "apply.both_rotations", line_of(t, "both_rotations"), {"expected true"});
  t = kBase + kSpring + "spring_ends = \"closed\"\n";
  expect_mistake(t, "apply.spring_ends", line_of(t, "spring_ends"), {"\"squared-ground\""});
  std::string lf = kBase;
  lf.replace(lf.find("torque = \"250 N*m\""), 18, "lever_force = \"200 N\"");
  t = lf + kSpring;
  expect_mistake(t, "apply.by", line_of(t, "by = "), {"[load] torque"});
  t = kBase + "\n[duty]\nspeed = \"100 rpm\"\ninertia = \"2 kg*m^2\"\ndrive = \"manual\"\n";
  expect_mistake(t, "duty.drive", line_of(t, "drive = "), {"belongs to a hoist duty"});
  t = kBase + kHoist + "drive = \"electric\"\n";
  expect_mistake(t, "duty.drive", line_of(t, "drive = "), {"\"powered\" or \"manual\""});
}

TEST(ApplyReader, WrittenBackReadsTheSame) {
  for (const std::string& extra : {kSpring + "spring_max_outer_diameter = \"70 mm\"\nboth_rotations = true\n",
                                   kWeight, kHoist + "drive = \"powered\"\n" + kSpring}) {
    const Design d = read(kBase + extra);
    const Design e = read_design_text(design_toml(d, ""), "back.toml");
    EXPECT_EQ(e.apply.by, d.apply.by);
    EXPECT_DOUBLE_EQ(e.apply.at.x, d.apply.at.x);
    EXPECT_DOUBLE_EQ(e.apply.at.y, d.apply.at.y);
    EXPECT_DOUBLE_EQ(e.apply.seat.y, d.apply.seat.y);
    EXPECT_DOUBLE_EQ(e.apply.mass, d.apply.mass);
    EXPECT_DOUBLE_EQ(e.apply.wear_allowance, d.apply.wear_allowance);
    EXPECT_DOUBLE_EQ(e.apply.actuator_at.x, d.apply.actuator_at.x);
    EXPECT_EQ(e.apply.both_rotations, d.apply.both_rotations);
    EXPECT_EQ(e.apply.spring_material, d.apply.spring_material);
    EXPECT_EQ(e.apply.spring_ends, d.apply.spring_ends);
    EXPECT_EQ(e.apply.spring_seats, d.apply.spring_seats);
    EXPECT_DOUBLE_EQ(e.apply.spring_max_outer_diameter, d.apply.spring_max_outer_diameter);
    EXPECT_EQ(e.duty.drive, d.duty.drive);
    EXPECT_EQ(json_report(e, solve(e)).dump(), json_report(d, solve(d)).dump());
  }
}

// By hand, said or not, the results are today's: the same JSON, no apply checks.
TEST(ApplyStatics, HandDefaultIsUnchanged) {
  const Design d = read(kBase);
  const Design h = read(kBase + "\n[apply]\nby = \"hand\"\n");
  const Solution s = solve(d);
  EXPECT_EQ(json_report(d, s).dump(), json_report(h, solve(h)).dump());
  EXPECT_FALSE(s.apply.present);
  for (const Check& c : s.checks) EXPECT_EQ(c.id.find("spring"), std::string::npos) << c.id;
  EXPECT_NE(find_check(s, "hand_force"), nullptr);
  EXPECT_EQ(find_check(s, "apply_moment"), nullptr);
}

// ------------------------------------------------------------------------------------ statics

/// The lever of kBase by hand: pivot, pin B and handle on one line, so the plate is a 695 mm ×
/// 40 mm strip with round ends (radius 20 mm) about x = 252.5 mm, less two Ø14 holes (pivot at
/// −95, pin B at 50), 12 mm thick; the grip Ø30 × 100 mm at the handle (hardware_rules).
struct HandLever {
  double mass;
  double x;  // centre of mass, y = −0.25
};
HandLever lever_by_hand() {
  const double t = 0.012, w = 0.040, r = 0.007;
  const double strip = 0.695 * w + kPi * (w / 2) * (w / 2);
  const double hole = kPi * r * r;
  const double plate = kSteel * t * (strip - 2 * hole);
  const double grip = kSteel * kPi * 0.015 * 0.015 * 0.100;
  const double moment = kSteel * t * (strip * 0.2525 - hole * (-0.095) - hole * 0.050) + grip * 0.600;
  return {plate + grip, moment / (plate + grip)};
}

TEST(ApplyStatics, WeightAppliedByHandComputation) {
  const Design d = read(kBase + kWeight);
  const Solution s = solve(d);
  const ApplyResult& a = s.apply;
  ASSERT_TRUE(a.present);
  const Layout& L = s.layout;
  ASSERT_EQ(L.apply_sense, -1);  // cw applies (test layout)
  const HandLever lever = lever_by_hand();
  EXPECT_REL(a.lever_mass, lever.mass, 1e-9);
  EXPECT_REL(a.lever_centroid.x, lever.x, 1e-9);
  // Worn: the lever turned cw by φ·w/|m_A + m_B| (REFERENCE §1.10 with the wear for c).
  const double turn = L.wrap * 0.002 / std::abs(L.a.arm + L.b.arm);
  EXPECT_REL(a.wear_rotation, turn, 1e-12);
  const Vec2 O{-0.095, -0.25};
  const Vec2 hang = rotate({0.600, -0.25}, O, -turn);
  const Vec2 c = rotate({lever.x, -0.25}, O, -turn);
  // Gravity −y: a weight right of the pivot turns the lever cw, the applying sense.
  const double weight_moment = 30 * kG * (hang.x - O.x);
  const double lever_moment = lever.mass * kG * (c.x - O.x);
  EXPECT_REL(a.worn.element_moment, weight_moment, 1e-9);
  EXPECT_REL(a.worn.lever_moment, lever_moment, 1e-9);
  EXPECT_REL(a.available_moment, weight_moment + lever_moment, 1e-9);
  const double needed = s.results[s.primary_a_tight ? 0 : 1][0].actuating_moment;  // f_min
  EXPECT_REL(a.required_moment, needed, 1e-12);
  const Check* m = find_check(s, "apply_moment");
  ASSERT_NE(m, nullptr);
  EXPECT_EQ(m->ok, weight_moment + lever_moment >= needed);
  // Holding torque scales with the moment (a brake that does not lock): T·M_avail/M_needed.
  EXPECT_REL(a.holding_torque, 312.5 * (weight_moment + lever_moment) / needed, 1e-9);
  // The actuator at x = 400 mm: arm 495 mm, holds the weight and the lever at the released position.
  const double back = L.release_rotation;
  const Vec2 hang_r = rotate({0.600, -0.25}, O, back), c_r = rotate({lever.x, -0.25}, O, back);
  EXPECT_REL(a.actuator.arm, 0.495, 1e-12);
  EXPECT_REL(a.actuator.force, (30 * kG * (hang_r.x - O.x) + lever.mass * kG * (c_r.x - O.x)) / 0.495, 1e-9);
  // A lighter weight that no longer covers the moment fails the check.
  Design light = d;
  light.apply.mass = 1.0;
  EXPECT_FALSE(find_check(solve(light), "apply_moment")->ok);
}

TEST(ApplyStatics, SpringAppliedByHandComputation) {
  const Design d = read(kBase + kSpring);
  const Solution s = solve(d);
  const ApplyResult& a = s.apply;
  ASSERT_TRUE(a.present);
  ASSERT_TRUE(a.spring.found) << a.refusal;
  const Layout& L = s.layout;
  const Vec2 O{-0.095, -0.25}, S{0.250, -0.090};
  const HandLever lever = lever_by_hand();
  const double turn = L.wrap * 0.002 / std::abs(L.a.arm + L.b.arm);
  const Vec2 P = rotate({0.250, -0.25}, O, -turn);
  const Vec2 c = rotate({lever.x, -0.25}, O, -turn);
  const double length = std::hypot(P.x - S.x, P.y - S.y);
  // Perpendicular distance from the pivot to the spring's axis P–S.
  const double arm = std::abs((P.x - O.x) * (P.y - S.y) - (P.y - O.y) * (P.x - S.x)) / length;
  const double force = a.spring.rate * (a.spring.free_length - length);
  EXPECT_REL(a.spring.worn.length, length, 1e-12);
  EXPECT_REL(a.spring.worn.force, force, 1e-9);
  EXPECT_REL(a.worn.arm, arm, 1e-9);
  const double available = force * arm + lever.mass * kG * (c.x - O.x);
  const double needed = s.results[s.primary_a_tight ? 0 : 1][0].actuating_moment;
  EXPECT_GE(available, needed);            // the spring covers the worn position ...
  EXPECT_REL(available, needed, 1e-6);     // ... sized for it, not more
  // Applied and released lengths by hand: 160 mm between the seats; released, the lever turned
  // back by the release rotation.
  EXPECT_REL(a.spring.applied.length, 0.160, 1e-12);
  const Vec2 Pr = rotate({0.250, -0.25}, O, L.release_rotation);
  EXPECT_REL(a.spring.released.length, std::hypot(Pr.x - S.x, Pr.y - S.y), 1e-12);
  EXPECT_GT(a.spring.applied.force, a.spring.worn.force);
  EXPECT_GT(a.spring.released.force, a.spring.applied.force);
  for (const char* id : {"apply_moment", "spring_stress", "spring_index", "spring_index_min",
                         "spring_overrun", "spring_buckling", "apply_band_stress"}) {
    const Check* ck = find_check(s, id);
    ASSERT_NE(ck, nullptr) << id;
    EXPECT_TRUE(ck->ok) << id << " " << ck->value << " " << ck->limit << " " << ck->note;
  }
  EXPECT_EQ(find_check(s, "hand_force"), nullptr);  // no operator
}

// The actuator's stroke is its arm times the release rotation solve reports, plus the stated
// margin: the same arm times the wear rotation.
TEST(ApplyStatics, ActuatorStrokeIsArmTimesReleaseRotationPlusMargin) {
  const Design d = read(kBase + kSpring + "actuator_at = [\"300 mm\", \"-250 mm\"]\n");
  const Solution s = solve(d);
  const double arm = 0.300 + 0.095;
  const double wear_turn = s.layout.wrap * 0.002 / std::abs(s.layout.a.arm + s.layout.b.arm);
  EXPECT_REL(s.apply.actuator.arm, arm, 1e-12);
  EXPECT_REL(s.apply.actuator.travel, arm * s.layout.release_rotation, 1e-12);
  EXPECT_REL(s.apply.actuator.stroke, arm * s.layout.release_rotation + arm * wear_turn, 1e-12);
  // Force: the spring's released moment and the lever's, over the actuator's arm.
  EXPECT_REL(s.apply.actuator.force,
             (s.apply.spring.released.force * s.apply.released.arm + s.apply.released.lever_moment) / arm, 1e-9);
  const nlohmann::json j = json_report(d, s)["apply"];
  EXPECT_EQ(j["by"], "spring");
  for (const char* k : {"wire_diameter_m", "mean_diameter_m", "active_coils", "total_coils",
                        "free_length_m", "solid_length_m", "rate_N_per_m", "force_applied_N",
                        "force_worn_N", "force_released_N", "material"}) {
    EXPECT_TRUE(j["spring"].contains(k)) << k;
  }
  EXPECT_DOUBLE_EQ(j["actuator"]["stroke_m"].get<double>(), s.apply.actuator.stroke);
  EXPECT_DOUBLE_EQ(j["actuator"]["force_N"].get<double>(), s.apply.actuator.force);
  EXPECT_DOUBLE_EQ(json_report(read(kBase + kWeight), solve(read(kBase + kWeight)))["apply"]["weight"]["mass_kg"].get<double>(), 30.0);
}

// With the lining new the element grips with more than the worn moment; the band takes it at the
// highest friction. Capstan by hand: simple brake, tight end on the frame, so the lever end is
// slack, P_s = M/|m_B| and P_t = e^(f_max·φ)·P_s (REFERENCE §1.1, §1.8), σ = P_t/(b·t).
TEST(ApplyStatics, BandStressUnderTheFullMomentByCapstan) {
  const Design d = read(kBase + kWeight);
  const Solution s = solve(d);
  const double M = s.apply.applied.element_moment + s.apply.applied.lever_moment;
  const double ps = M / std::abs(s.layout.b.arm);
  const double pt = std::exp(d.lining.friction_max * s.layout.wrap) * ps;
  const Check* c = find_check(s, "apply_band_stress");
  ASSERT_NE(c, nullptr);
  EXPECT_REL(c->value, pt / (0.060 * 0.0025), 1e-9);
}

// ------------------------------------------------------------------------------------ refusals

TEST(ApplyStatics, ImpossibleSpringNamesTheKeyAndHowMuch) {
  std::string t = kBase + kSpring;
  t.replace(t.find("seat = [\"250 mm\", \"-90 mm\"]"), 27, "seat = [\"250 mm\", \"-235 mm\"]");
  const Solution s = solve(read(t));
  const Check* c = find_check(s, "spring_design");
  ASSERT_NE(c, nullptr);
  EXPECT_FALSE(c->ok);
  EXPECT_NE(c->note.find("move apply.seat at least"), std::string::npos) << c->note;
  EXPECT_EQ(s.apply.spring.binding, SpringLimit::solid);
}

TEST(ApplyStatics, SeatOnTheWrongSideIsAnError) {
  std::string t = kBase + kSpring;
  t.replace(t.find("seat = [\"250 mm\", \"-90 mm\"]"), 27, "seat = [\"250 mm\", \"-400 mm\"]");
  try {
    solve(read(t));
    ADD_FAILURE() << "accepted";
  } catch (const DesignError& e) {
    EXPECT_EQ(e.key(), "apply.seat");
    EXPECT_EQ(e.line(), line_of(t, "seat = "));
    EXPECT_NE(std::string(e.what()).find("releasing sense"), std::string::npos) << e.what();
  }
}

// ------------------------------------------------------------------------------------ hoists

// REFERENCE §7: 29 CFR 1910.179(f)(2), holding brakes "applied automatically when power is
// removed"; (f)(2)(i), at least 125 % of the full-load hoisting torque at the brake.
// ---- What carries the element (ApplyResult::mount; rules in src/apply.hpp mount_rules,
// common practice, no source). The lever of kBase is 40 mm wide about y = −250 mm, so its upper
// edge at x = 250 mm is y = −230 mm.

std::string spring_at(const std::string& at) {
  return "\n[apply]\nby = \"spring\"\nat = " + at + "\nseat = [\"250 mm\", \"-90 mm\"]\nwear_allowance = \"2 mm\"\n";
}

TEST(ApplyMount, SpringSeatsFollowTheRulesAndTheLeverSeatReachesTheEdge) {
  const Design d = read(kBase + spring_at(R"(["250 mm", "-226 mm"])"));
  const ApplyResult& a = solve(d).apply;
  ASSERT_TRUE(a.spring.found) << a.refusal;
  const ElementMount& m = a.mount;
  ASSERT_TRUE(m.present);
  EXPECT_EQ(m.refusal, "");
  const double od = a.spring.outer_diameter, id = a.spring.mean_diameter - a.spring.wire_diameter;
  // Rules written out again: Ø = OD + 2·max(5 mm, 0.1·OD); t = least of 6/8/10/12/16/20 mm ≥ 0.1·OD.
  const double dia = od + 2 * std::max(0.005, 0.1 * od);
  double t = 0.020;
  for (double c : {0.006, 0.008, 0.010, 0.012, 0.016, 0.020}) {
    if (c >= 0.1 * od) { t = c; break; }
  }
  for (const SeatPlan* st : {&m.lever_seat, &m.frame_seat}) {
    EXPECT_NEAR(st->diameter, dia, 1e-12);
    EXPECT_NEAR(st->spigot_diameter, id - std::max(0.001, 0.05 * id), 1e-12);
    EXPECT_NEAR(st->spigot_height, std::min(2 * a.spring.wire_diameter, 0.2 * a.spring.released.length), 1e-12);
    EXPECT_LT(st->spigot_diameter, id);  // clear of the coils
  }
  EXPECT_NEAR(m.frame_seat.thickness, t, 1e-12);
  // The lever's seat reaches the edge 4 mm behind apply.at, or is the series plate when thicker.
  EXPECT_NEAR(m.lever_seat.thickness, std::max(t, 0.004), 1e-9);
  // Faces at the two ends of the spring, normals pointing away from it (axis vertical here).
  EXPECT_NEAR(m.lever_seat.face.y, -0.226, 1e-12);
  EXPECT_NEAR(m.frame_seat.face.y, -0.090, 1e-12);
  EXPECT_NEAR(m.lever_seat.normal.y, -1, 1e-12);
  EXPECT_NEAR(m.frame_seat.normal.y, 1, 1e-12);
}

TEST(ApplyMount, SpringEndInsideOrAgainstTheLeverIsRefusedWithWhereToPutIt) {
  // On the lever's centre line: inside the plate; the edge along the axis is at y = −230 mm.
  const ApplyResult inside = solve(read(kBase + spring_at(R"(["250 mm", "-250 mm"])"))).apply;
  ASSERT_TRUE(inside.spring.found);
  EXPECT_NE(inside.mount.refusal.find("apply.at"), std::string::npos) << inside.mount.refusal;
  EXPECT_NE(inside.mount.refusal.find("inside the lever plate"), std::string::npos);
  EXPECT_NE(inside.mount.refusal.find("[\"250.0 mm\", \"-230.0 mm\"]"), std::string::npos) << inside.mount.refusal;
  // 1 mm above the edge: no room for the 3 mm of seat plate; it must move 2 mm.
  const ApplyResult close = solve(read(kBase + spring_at(R"(["250 mm", "-229 mm"])"))).apply;
  ASSERT_TRUE(close.spring.found);
  EXPECT_NE(close.mount.refusal.find("is 1.0 mm from the lever's edge"), std::string::npos) << close.mount.refusal;
  EXPECT_NE(close.mount.refusal.find("at least 2.0 mm further"), std::string::npos) << close.mount.refusal;
}

TEST(ApplyMount, SpringTiltedOverASlantingEdgeIsRefusedAcrossTheSeatNotOnlyOnTheAxis) {
  // Axis 20° off the lever's normal: 4 mm above the edge on the axis, but the seat's face dips
  // (seat radius)·sin 20° below the edge plane at one side of the seat.
  const double a = 20 * kPi / 180;
  const std::string seat = "[\"" + std::to_string(250 + 160 * std::sin(a)) + " mm\", \"" +
                           std::to_string(-226 + 160 * std::cos(a)) + " mm\"]";
  const ApplyResult r = solve(read(kBase + "\n[apply]\nby = \"spring\"\nat = [\"250 mm\", \"-226 mm\"]\nseat = " +
                                   seat + "\nwear_allowance = \"2 mm\"\n")).apply;
  ASSERT_TRUE(r.spring.found) << r.refusal;
  EXPECT_NE(r.mount.refusal.find("slants or rounds across it"), std::string::npos) << r.mount.refusal;
  EXPECT_NE(r.mount.refusal.find("further from the lever along the axis"), std::string::npos);
}

TEST(ApplyMount, WeightBlockAndHangerTogetherWeighTheMass) {
  const ApplyResult a = solve(read(kBase + kWeight)).apply;
  const WeightMount& w = a.mount.weight;
  ASSERT_TRUE(a.mount.present);
  EXPECT_EQ(a.mount.refusal, "");
  // apply.at is the handle point, inside the plate: the rod hangs from the lower edge below it.
  EXPECT_NEAR(w.hang.x, 0.600, 1e-12);
  EXPECT_NEAR(w.hang.y, -0.270, 1e-9);
  // 30 kg pulls 294 N: Ø2.5 mm at 60 MPa, so the least rod, min(12 mm, 12 mm lever − 1 mm).
  EXPECT_NEAR(w.rod_diameter, 0.011, 1e-12);
  const double rod_area = kPi * 0.011 * 0.011 / 4, D = w.block_diameter;
  EXPECT_NEAR(w.block_height, D, 1e-12);
  EXPECT_NEAR(w.drop, std::max(0.020, D / 4), 1e-12);
  EXPECT_NEAR(w.rod_length, w.drop + D, 1e-12);
  // Block (bored for the rod) and rod are the mass, steel 7850 kg/m³.
  const double block = kSteel * (kPi * D * D * D / 4 - rod_area * D);
  const double rod = kSteel * rod_area * w.rod_length;
  EXPECT_NEAR(block + rod, 30.0, 1e-9);
  EXPECT_NEAR(w.block_mass, block, 1e-9);
  EXPECT_NEAR(w.rod_mass, rod, 1e-9);
}

TEST(ApplyMount, HandAppliedHasNone) {
  EXPECT_FALSE(solve(read(kBase)).apply.mount.present);
}

TEST(HoistRules, HandAppliedHoistBrakeFailsSelfSetting) {
  const Solution hand = solve(read(kBase + kHoist));
  const Check* c = find_check(hand, "self_setting");
  ASSERT_NE(c, nullptr);
  EXPECT_FALSE(c->ok);
  EXPECT_NE(c->source.find("1910.179(f)(2)"), std::string::npos);
  const Solution spring = solve(read(kBase + kHoist + kSpring));
  ASSERT_NE(find_check(spring, "self_setting"), nullptr);
  EXPECT_TRUE(find_check(spring, "self_setting")->ok);
  // 125 %: 200 kg × 9.80665 × 0.120 m = 235.36 N·m, × 1.25 = 294.20 N·m.
  const Check* h = find_check(hand, "hoist_holding");
  ASSERT_NE(h, nullptr);
  EXPECT_REL(h->limit, 1.25 * 200 * kG * 0.120, 1e-12);
  EXPECT_REL(h->value, 312.5, 1e-12);  // hand: the required torque × service factor
  EXPECT_TRUE(h->ok);
  std::string weak = kBase + kHoist;
  weak.replace(weak.find("service_factor = 1.25"), 21, "service_factor = 1.1");  // 275 N·m < 294.2
  EXPECT_FALSE(find_check(solve(read(weak)), "hoist_holding")->ok);
  // A hand-operated hoist: the rule is for powered hoists; a warning asks for the backstop.
  const Solution manual = solve(read(kBase + kHoist + "drive = \"manual\"\n"));
  EXPECT_EQ(find_check(manual, "self_setting"), nullptr);
  EXPECT_EQ(find_check(manual, "hoist_holding"), nullptr);
  bool warned = false;
  for (const auto& w : manual.warnings) warned = warned || w.find("pawl") != std::string::npos;
  EXPECT_TRUE(warned);
  // No hoist, no hoist rules.
  EXPECT_EQ(find_check(solve(read(kBase)), "self_setting"), nullptr);
}

}  // namespace
}  // namespace bandforge
