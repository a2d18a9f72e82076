// geometry/: the solids are where the mechanics put them, with the sizes the design gives.
// Every expected value is an independent hand computation written out here (plane geometry of
// REFERENCE §1.8, areas of strips, annuli and circular segments), never a number read back from
// the code under test.
#include <cmath>
#include <filesystem>
#include <numbers>
#include <string>

#include <gtest/gtest.h>

#include <gp_Pnt2d.hxx>

#include <BRepAlgoAPI_Common.hxx>
#include <BRepBuilderAPI_MakeVertex.hxx>
#include <BRepClass3d_SolidClassifier.hxx>
#include <BRepExtrema_DistShapeShape.hxx>
#include <BRepGProp.hxx>
#include <BRepPrimAPI_MakeCylinder.hxx>
#include <BRep_Tool.hxx>
#include <GProp_GProps.hxx>
#include <TopExp_Explorer.hxx>
#include <TopoDS.hxx>
#include <gp_Ax2.hxx>

#include "geometry/assemble.hpp"
#include "src/band_path.hpp"
#include "src/hardware.hpp"
#include "geometry/brake_model.hpp"
#include "geometry/occt_model.hpp"
#include "src/design_reader.hpp"
#include "src/errors.hpp"
#include "src/mechanics.hpp"
#include "src/proportions.hpp"
#include "tests/support.hpp"

namespace bandforge::geom {
namespace {

constexpr double pi = std::numbers::pi;
const std::string kExample = std::string(BANDFORGE_SOURCE_DIR) + "/examples/bin-hoist.toml";

// The example with one line replaced (the line must exist, or the test would prove nothing).
std::string edited(const std::string& from, const std::string& to) {
  std::string text = test::slurp(kExample);
  const std::size_t at = text.find(from);
  EXPECT_NE(at, std::string::npos) << from;
  if (at != std::string::npos) text.replace(at, from.size(), to);
  return text;
}

struct Built {
  Design design;
  Solution solution;
  BrakeModel model;
};

Built build(const Design& d, bool released = false, bool reject = true) {
  const Solution s = solve(d);
  BuildOptions o;
  o.released = released;
  o.reject_failures = reject;
  return {d, s, build_brake(d, s, o)};
}

std::size_t instance_index(const BrakeModel& m, const std::string& name) {
  const auto& in = m.impl().instances;
  for (std::size_t i = 0; i < in.size(); ++i) {
    if (in[i].name == name) return i;
  }
  ADD_FAILURE() << "no instance " << name;
  return 0;
}

TopoDS_Shape placed(const BrakeModel& m, const std::string& name) {
  return m.impl().placed_shape(instance_index(m, name));
}

double distance(const TopoDS_Shape& s, gp_Pnt p) {
  BRepExtrema_DistShapeShape d(s, BRepBuilderAPI_MakeVertex(p).Vertex());
  EXPECT_TRUE(d.IsDone());
  return d.Value();
}

bool inside(const TopoDS_Shape& s, gp_Pnt p) {
  BRepClass3d_SolidClassifier c(s, p, 1e-9);
  return c.State() == TopAbs_IN;
}

double volume(const TopoDS_Shape& s) {
  GProp_GProps g;
  BRepGProp::VolumeProperties(s, g);
  return g.Mass();
}

gp_Pnt centroid(const TopoDS_Shape& s) {
  GProp_GProps g;
  BRepGProp::VolumeProperties(s, g);
  return g.CentreOfMass();
}

const PartInfo& part(const BrakeModel& m, const std::string& name) {
  for (const PartInfo& p : m.parts()) {
    if (p.name == name) return p;
  }
  ADD_FAILURE() << "no part " << name;
  return m.parts().front();
}

// Tangent angle from a pin to the circle R about the origin, written out again here
// (REFERENCE §1.8 step 2): β_A = ψ + s·acos(R/d), β_B = ψ − s·acos(R/d).
double tangent_angle(double x, double y, double R, int s, bool end_a) {
  const double d = std::hypot(x, y), psi = std::atan2(y, x), alpha = std::acos(R / d);
  return end_a ? psi + s * alpha : psi - s * alpha;
}

// The example in millimetres, from the design file (examples/bin-hoist.toml).
constexpr double D = 400, w = 100, t_lin = 5, t = 3, b = 80, d_pin = 16, clr = 1.5;
constexpr double Ax = -60, Ay = -300, Bx = 60, By = -300, Ox = -110, Oy = -300;
constexpr double r_b = D / 2 + t_lin + t / 2;  // band centreline radius 206.5 mm
constexpr int s_cw = -1;                       // [band] sense = "cw"

TEST(BandSolid, VolumeIsThicknessTimesWidthTimesCentrelineLengthPlusTheEyes) {
  const Built x = build(read_design_file(kExample));
  // Centreline from the mechanics (ℓ_A + ℓ_B + r_b·φ), checked against the hand value first.
  const double phi = std::fmod(s_cw * (tangent_angle(Bx, By, r_b, s_cw, false) -
                                       tangent_angle(Ax, Ay, r_b, s_cw, true)) + 4 * pi, 2 * pi);
  const double L = std::sqrt(Ax * Ax + Ay * Ay - r_b * r_b) +
                   std::sqrt(Bx * Bx + By * By - r_b * r_b) + r_b * phi;
  ASSERT_NEAR(x.solution.layout.band_length * 1000, L, 1e-9);
  // The strip between its offset lines has area t·L exactly (the arc's annular sector is
  // φ·((r_b+h)² − (r_b−h)²)/2 = t·r_b·φ). Each eye is a ring of inner radius ρ (pin) and
  // outer R = ρ + t; the strip runs to the pin centre, so the part of the strip inside the
  // eye's disc (|y| ≤ h, x ≥ 0, x² + y² ≤ R²) is counted once: area ∫_{−h}^{h} √(R² − y²) dy
  // = h·√(R² − h²) + R²·asin(h/R).
  const double h = t / 2, rho = d_pin / 2, R = rho + t;
  const double strip_in_disc = h * std::sqrt(R * R - h * h) + R * R * std::asin(h / R);
  const double eye = pi * (R * R - rho * rho) - strip_in_disc;
  const double expected = b * (t * L + 2 * eye);
  EXPECT_NEAR(part(x.model, "BAND").volume, expected, 1e-7 * expected);
}

TEST(BandSolid, EyeHugsThePinSoTheBandReachesIt) {
  const Built x = build(read_design_file(kExample));
  const TopoDS_Shape band = placed(x.model, "BAND");
  const double rho = d_pin / 2;
  for (auto [px, py] : {std::pair{Ax, Ay}, std::pair{Bx, By}}) {
    // The pin centre is one pin radius from the band: the eye's bore is the pin's surface.
    EXPECT_NEAR(distance(band, gp_Pnt(px, py, 0)), rho, 1e-6);
    // All round the pin, just outside the bore, there is band material (a closed eye).
    for (int k = 0; k < 12; ++k) {
      const double a = 2 * pi * k / 12;
      EXPECT_TRUE(inside(band, gp_Pnt(px + (rho + 0.5 * t) * std::cos(a),
                                      py + (rho + 0.5 * t) * std::sin(a), 0)))
          << "angle " << a;
    }
  }
}

TEST(BandSolid, InnerFaceTouchesTheLiningOverExactlyTheWrap) {
  const Built x = build(read_design_file(kExample));
  const TopoDS_Shape band = placed(x.model, "BAND"), lining = placed(x.model, "LINING");
  const double beta_a = tangent_angle(Ax, Ay, r_b, s_cw, true);
  const double beta_b = tangent_angle(Bx, By, r_b, s_cw, false);
  // Hand values agree with solve (REFERENCE §1.8 step 2).
  ASSERT_NEAR(x.solution.layout.a.tangent_angle, beta_a, 1e-12);
  ASSERT_NEAR(x.solution.layout.b.tangent_angle, beta_b, 1e-12);
  const double phi = x.solution.layout.wrap;
  const double contact = r_b - t / 2;  // band inner face = lining outer face = r + t_lining
  for (int k = 0; k <= 24; ++k) {
    const double a = beta_a + s_cw * phi * k / 24;
    for (double z : {-b / 2 + 1, 0.0, b / 2 - 1}) {
      const gp_Pnt p(contact * std::cos(a), contact * std::sin(a), z);
      EXPECT_LT(distance(band, p), 1e-6) << "k " << k;
      EXPECT_LT(distance(lining, p), 1e-6) << "k " << k;
    }
  }
  // The lining stops at the tangent points: 0.01 rad beyond either end there is none at the
  // contact radius (the nearest lining is its radial end face, contact·sin(0.01) away).
  for (double a : {beta_a - s_cw * 0.01, beta_b + s_cw * 0.01}) {
    const gp_Pnt p(contact * std::cos(a), contact * std::sin(a), 0);
    EXPECT_NEAR(distance(lining, p), contact * std::sin(0.01), 1e-6);
  }
}

TEST(BandSolid, StraightRunsLeaveAtTheTangentPointsSolveReports) {
  const Built x = build(read_design_file(kExample));
  const TopoDS_Shape band = placed(x.model, "BAND");
  for (const EndLayout* e : {&x.solution.layout.a, &x.solution.layout.b}) {
    const double tx = e->tangent_point.x * 1000, ty = e->tangent_point.y * 1000;
    const double ex = std::cos(e->tangent_angle), ey = std::sin(e->tangent_angle);
    // The centreline tangent point is inside the band, the faces are ±t/2 from it.
    EXPECT_TRUE(inside(band, gp_Pnt(tx, ty, 0)));
    EXPECT_NEAR(distance(band, gp_Pnt(tx + (t / 2 + 1) * ex, ty + (t / 2 + 1) * ey, 0)), 1.0, 1e-6);
    // Halfway along the run, the band is centred on the line from the pin to the tangent point.
    const double mx = (tx + e->pin.x * 1000) / 2, my = (ty + e->pin.y * 1000) / 2;
    EXPECT_TRUE(inside(band, gp_Pnt(mx, my, 0)));
    EXPECT_NEAR(distance(band, gp_Pnt(mx + (t / 2 + 1) * ex, my + (t / 2 + 1) * ey, 0)), 1.0, 1e-6);
    EXPECT_NEAR(distance(band, gp_Pnt(mx - (t / 2 + 1) * ex, my - (t / 2 + 1) * ey, 0)), 1.0, 1e-6);
  }
}

TEST(Drum, RimVolumeIsTheAnnulusTimesTheWidth) {
  const Built x = build(read_design_file(kExample));
  const TopoDS_Shape drum = placed(x.model, "DRUM");
  // Rim: rim thickness max(6 mm, 0.04·D) = 16 mm (src/proportions.hpp), so d = 368 mm.
  const double d = D - 2 * 16.0;
  const double rim = pi / 4 * (D * D - d * d) * w;
  // Cut the rim out of the drum with a tube d..D over the full width.
  const TopoDS_Shape outer = BRepPrimAPI_MakeCylinder(gp_Ax2(gp_Pnt(0, 0, -w / 2), gp_Dir(0, 0, 1)), D / 2, w).Shape();
  const TopoDS_Shape inner = BRepPrimAPI_MakeCylinder(gp_Ax2(gp_Pnt(0, 0, -w / 2), gp_Dir(0, 0, 1)), d / 2, w).Shape();
  const double in_outer = volume(BRepAlgoAPI_Common(drum, outer).Shape());
  const double in_inner = volume(BRepAlgoAPI_Common(drum, inner).Shape());
  EXPECT_NEAR(in_outer - in_inner, rim, 1e-6 * rim);
  // The whole drum: rim + web (hub Ø108 to d, 19.2 mm thick) + hub (bore Ø60 to Ø108, width w).
  // web = max(8 mm, 1.2·rim) = 19.2 mm; hub Ø = max(1.8·bore, bore + 24 mm) = 108 mm.
  const double web = pi / 4 * (d * d - 108.0 * 108.0) * 19.2;
  const double hub = pi / 4 * (108.0 * 108.0 - 60.0 * 60.0) * w;
  EXPECT_NEAR(part(x.model, "DRUM").volume, rim + web + hub, 1e-6 * (rim + web + hub));
  // The rim mass the thermal check uses (src/mechanics drum_rim_mass) is this rim.
  EXPECT_NEAR(drum_rim_mass(x.design), rim * 1e-9 * x.design.drum.density,
              1e-9 * drum_rim_mass(x.design));
  // The friction surface is a true cylinder of radius D/2: a point on it lies on the drum.
  EXPECT_LT(distance(drum, gp_Pnt(D / 2 * std::cos(1.0), D / 2 * std::sin(1.0), 10)), 1e-7);
}

TEST(Placement, PinCentresEqualTheDesignCoordinates) {
  const Built x = build(read_design_file(kExample));
  for (auto [name, px, py] : {std::tuple{"PIN-A", Ax, Ay}, std::tuple{"PIN-B", Bx, By},
                              std::tuple{"PIN-PIVOT", Ox, Oy}}) {
    const gp_Pnt g = centroid(placed(x.model, name));
    EXPECT_NEAR(g.X(), px, 1e-6) << name;
    EXPECT_NEAR(g.Y(), py, 1e-6) << name;
  }
  // The pins pass through the band (z = ±b/2) and reach into their plates.
  const AxialLayout& ax = x.model.impl().axial;
  for (const char* name : {"PIN-A", "PIN-B"}) {
    const TopoDS_Shape pin = placed(x.model, name);
    double zmin = 1e9, zmax = -1e9;
    for (TopExp_Explorer ex(pin, TopAbs_VERTEX); ex.More(); ex.Next()) {
      const double z = BRep_Tool::Pnt(TopoDS::Vertex(ex.Current())).Z();
      zmin = std::min(zmin, z);
      zmax = std::max(zmax, z);
    }
    EXPECT_LT(zmin, -b / 2) << name;
    EXPECT_GT(zmax, b / 2) << name;
    EXPECT_TRUE(zmax > ax.lever_front || zmin < ax.anchor_back) << name;
  }
  // The handle grip sits on the handle point.
  const gp_Pnt grip = centroid(placed(x.model, "GRIP"));
  EXPECT_NEAR(grip.X(), 700, 1e-6);
  EXPECT_NEAR(grip.Y(), -300, 1e-6);
}

TEST(Placement, RepeatedPinsAreInstancesOfOnePart) {
  const Built x = build(read_design_file(kExample));
  // The frame plates (src/hardware.hpp) are 20 mm for this example: the lightest stock plate at
  // least as thick as the 12 mm lever that passes the single-plate bending check at end A
  // (hand computation in tests/hardware_test.cpp). Grips along z, from the band's 80 mm (the
  // lever 1.5 mm further out for pin A's head under it, tests/hardware_test.cpp):
  //   pin A (frame): plate 20 + gap 4 + band 80 = 104 mm;
  //   pin B (lever): band 80 + gap 5.5 + lever 12 = 97.5 mm;
  //   pivot: plate 20 + gap 4 + band 80 + gap 5.5 + lever 12 + gap 4 + front cheek 20 = 145.5 mm.
  // ISO 2341 B Ø16: the split-pin hole's centre l − l_e (l_e 6 mm, from memory) must reach
  // grip + washer 3 (ISO 8738, from memory) + d_1/2 2 (REFERENCE §5.9): A 109, B 102.5, pivot
  // 150.5 mm; lengths of the series (…, 95, 100, 120, 140, 160, … from memory): A and B 120 mm
  // (100 gives 94), the pivot 160 mm (140 gives 134).
  const PartInfo& pin_b = part(x.model, "CLEVIS-PIN-16x120");
  EXPECT_EQ(pin_b.instance_names, (std::vector<std::string>{"PIN-A", "PIN-B"}));
  EXPECT_EQ(part(x.model, "CLEVIS-PIN-16x160").instance_names, std::vector<std::string>{"PIN-PIVOT"});
  // Head Ø25 × 4.5 (REFERENCE §5.9) and shank, less the Ø4 cross hole: its volume lies between
  // π·2²·2√(8² − 2²) (the hole's core) and π·2²·16 (a cylinder through).
  const double solid = pi / 4 * (25.0 * 25.0 * 4.5 + d_pin * d_pin * 120);
  EXPECT_LT(pin_b.volume, solid - pi * 4 * 2 * std::sqrt(64.0 - 4.0));
  EXPECT_GT(pin_b.volume, solid - pi * 4 * 16);
  EXPECT_EQ(part(x.model, "WASHER-16").instance_names,
            (std::vector<std::string>{"WASHER-A", "WASHER-B", "WASHER-PIVOT"}));
  // One lug shape for every frame pin: three instances of one part (the pivot has two cheeks).
  EXPECT_EQ(part(x.model, "ANCHOR").instance_names,
            (std::vector<std::string>{"ANCHOR-A", "ANCHOR-PIVOT", "ANCHOR-PIVOT-FRONT"}));
}

TEST(MassProperties, MassIsVolumeTimesDensity) {
  const Built x = build(read_design_file(kExample));
  for (const PartInfo& p : x.model.parts()) {
    EXPECT_GT(p.volume, 0) << p.name;
    EXPECT_NEAR(p.mass, p.volume * 1e-9 * p.density, 1e-12) << p.name;
  }
  // Steel 7850 kg/m³ (common practice), the drum from the design's material table.
  EXPECT_EQ(part(x.model, "BAND").density, 7850);
  EXPECT_EQ(part(x.model, "DRUM").density, x.design.drum.density);
  // Moulded lining: SG 2.8 (REFERENCE §2.2, Neale Table 7.5).
  EXPECT_EQ(part(x.model, "LINING").density, 2800);
  // The drum is symmetric about its axis and its mid-plane: centroid at the origin.
  const Vec3 g = part(x.model, "DRUM").centroid;
  EXPECT_NEAR(g.x, 0, 1e-6);
  EXPECT_NEAR(g.y, 0, 1e-6);
  EXPECT_NEAR(g.z, 0, 1e-6);
}

TEST(Checks, ExampleSolidsAreValidAndClear) {
  const Built x = build(read_design_file(kExample));
  EXPECT_TRUE(x.model.all_valid());
  bool band_lining = false, lever_pin = false;
  for (const ContactCheck& c : x.model.contacts()) {
    EXPECT_TRUE(c.ok) << c.part_a << " / " << c.part_b;
    if (c.part_a == "BAND" && c.part_b == "LINING") band_lining = c.intended;
    if (c.part_a == "LEVER" && c.part_b == "PIN-B") lever_pin = c.intended;
    // With a 5 mm lining the band stays 5 mm off the drum (applied state).
    if (c.part_a == "DRUM" && c.part_b == "BAND") {
      EXPECT_NEAR(c.distance, t_lin, 1e-6);
    }
  }
  EXPECT_TRUE(band_lining);
  EXPECT_TRUE(lever_pin);
}

TEST(Checks, AnOversizePinInItsHoleIsMeasuredAsOverlap) {
  Built x = build(read_design_file(kExample), false, false);
  BrakeModel::Impl& m = x.model.impl();
  const std::size_t pin = m.instances[instance_index(x.model, "PIN-B")].part;
  // 0.1 mm over the bore radius: the overlap with the 12 mm lever plate is the ring
  // π·((ρ+0.1)² − ρ²)·12 mm; it must be reported and the check must fail. The pin's part frame
  // starts under its head (z = 0) and runs 120 mm along the shank.
  const double rho = d_pin / 2, len = 120;
  m.parts[pin].shape =
      BRepPrimAPI_MakeCylinder(gp_Ax2(gp_Pnt(0, 0, 0), gp_Dir(0, 0, 1)), rho + 0.1, len).Shape();
  run_checks(m, m.intended, /*interference=*/true);
  bool seen = false;
  for (const ContactCheck& c : m.contacts) {
    if (c.part_a == "LEVER" && c.part_b == "PIN-B") {
      seen = true;
      EXPECT_FALSE(c.ok);
      EXPECT_NEAR(c.common_volume, pi * ((rho + 0.1) * (rho + 0.1) - rho * rho) * 12, 1e-6);
    }
  }
  EXPECT_TRUE(seen);
  try {
    reject_failures(m);
    ADD_FAILURE() << "an oversize pin passed";
  } catch (const BuildError& e) {
    EXPECT_NE(std::string(e.what()).find("LEVER and PIN-B"), std::string::npos) << e.what();
  }
}

TEST(Checks, ADrumTooLargeForItsLiningIsMeasuredAsOverlap) {
  // The drum's contacts first go through its envelope (an upper bound on the overlap); a failing
  // bound must be re-measured on the true shape. A plain drum 0.1 mm over the friction radius
  // overlaps the lining by the annular sector φ/2·((r+0.1)² − r²)·b (hand computation, φ from
  // the mechanics).
  const Design d = read_design_file(kExample);
  const Solution sol = solve(d);
  Built x = build(d, false, false);
  BrakeModel::Impl& m = x.model.impl();
  const std::size_t drum = m.instances[instance_index(x.model, "DRUM")].part;
  const double r = d.drum.diameter * 500, face = d.drum.width * 1000;
  const double band_w = d.band.width * 1000;
  const TopoDS_Shape plain =
      BRepPrimAPI_MakeCylinder(gp_Ax2(gp_Pnt(0, 0, 0), gp_Dir(0, 0, 1)), r + 0.1, face).Shape();
  m.parts[drum].shape = plain;
  m.parts[drum].envelope = plain;
  run_checks(m, m.intended, /*interference=*/true);
  bool seen = false;
  for (const ContactCheck& c : m.contacts) {
    if ((c.part_a == "DRUM" && c.part_b == "LINING") || (c.part_a == "LINING" && c.part_b == "DRUM")) {
      seen = true;
      EXPECT_FALSE(c.ok);
      const double sector = 0.5 * sol.layout.wrap * ((r + 0.1) * (r + 0.1) - r * r) * band_w;
      EXPECT_NEAR(c.common_volume, sector, 1e-6 * sector);
    }
  }
  EXPECT_TRUE(seen);
}

TEST(Interference, LeverCrossingTheDrumIsMovedInFrontOfItsFace) {
  // Pivot and handle 100 mm below the centre: the lever plate crosses the Ø400 drum in the front
  // view. The plan puts it in front of the drum's face (drum 100 mm wide: face at z = 50, plus
  // the 4 mm gap) instead of inside the drum's width, so the sound layout builds.
  std::string text = edited("pivot = [\"-110 mm\", \"-300 mm\"]", "pivot = [\"-300 mm\", \"-100 mm\"]");
  const std::size_t at = text.find("handle = [\"700 mm\", \"-300 mm\"]");
  ASSERT_NE(at, std::string::npos);
  text.replace(at, 30, "handle = [\"700 mm\", \"-100 mm\"]");
  const Design d = read_design_text(text, "lever-across-drum.toml");
  const Built x = build(d);
  EXPECT_TRUE(x.solution.hardware.axial.lever_outboard);
  EXPECT_NEAR(x.model.impl().axial.lever_back, 50 + 4, 1e-9);
  for (const ContactCheck& c : x.model.contacts()) {
    if (c.part_a == "DRUM" && c.part_b == "LEVER") {
      EXPECT_TRUE(c.ok);
      EXPECT_GE(c.distance, 4 - 1e-6);  // at least the axial gap
    }
  }
  // The interference check itself still rejects a lever forced back inside the drum's width.
  BrakeModel::Impl& m = x.model.impl();
  for (auto& in : m.instances) {
    if (in.name != "LEVER") continue;
    gp_Trsf back;
    back.SetTranslation(gp_Vec(0, 0, -(m.axial.lever_back - 44)));
    in.placement = back.Multiplied(in.placement);
  }
  m.contacts.clear();
  run_checks(m, m.intended, /*interference=*/true);
  bool seen = false;
  for (const ContactCheck& c : m.contacts) {
    if (c.part_a == "DRUM" && c.part_b == "LEVER") {
      seen = true;
      EXPECT_FALSE(c.ok);
      EXPECT_GT(c.common_volume, 100.0);
    }
  }
  EXPECT_TRUE(seen);
}

TEST(BuildErrors, RunTooShortForTheChosenJointNamesTheKeyAndHowFar) {
  // The example at 5000 N·m (× 1.25 service factor) with the riveted lap asked for by name.
  // Hand: P1 scales with the torque, 3831 N × 6250/500 = 47 888 N at end A; one Ø6 rivet carries
  // 34.64 MPa × π·6²/4 = 979.5 N, so 49 rivets, 4 columns, 13 rows; lap = 2·12 + 12·18 = 240 mm.
  // The straight strip beyond the eye is ℓ_A − ρ = 225.84 − 9.5 = 216.24 mm: 23.76 mm short.
  std::string text = edited("torque = \"400 N*m\"", "torque = \"5000 N*m\"");
  const std::size_t at = text.find("pin_diameter = ");
  ASSERT_NE(at, std::string::npos);
  const std::string ask = "end_joint = \"riveted-lap\"\n";
  text.insert(at, ask);
  const Design d = read_design_text(text, "long-lap.toml");
  const Solution s = solve(d);
  EXPECT_EQ(s.hardware.joint_a.rows, 13);
  EXPECT_NEAR(s.hardware.joint_a.lap * 1000, 240.0, 1e-9);
  try {
    build_brake(d, s, {});
    FAIL() << "accepted";
  } catch (const BuildError& e) {
    const std::string msg = e.what();
    EXPECT_NE(msg.find("band.end_a.at"), std::string::npos) << msg;
    EXPECT_NE(msg.find("at least 23.8 mm further from the drum"), std::string::npos) << msg;
    EXPECT_NE(msg.find("band.end_joint = \"auto\""), std::string::npos) << msg;
  }
  // Left to choose, bandforge takes a joint that fits that run (and it builds).
  const std::string automatic = text.substr(0, at) + text.substr(at + ask.size());
  const Design free = read_design_text(automatic, "long-lap-auto.toml");
  const Solution fs = solve(free);
  EXPECT_NE(fs.hardware.joint_a.kind, JointKind::riveted_lap);
  EXPECT_LE(fs.hardware.joint_a.needs, fs.hardware.joint_a.room);
  EXPECT_NO_THROW(build_brake(free, fs, {}));
}

TEST(BuildErrors, LeverShorterThanItsHolesNamesTheLever) {
  const Design d = read_design_text(edited("handle = [\"700 mm\", \"-300 mm\"]",
                                           "handle = [\"-100 mm\", \"-300 mm\"]"),
                                    "short-lever.toml");
  try {
    build(d);
    FAIL() << "accepted";
  } catch (const BuildError& e) {
    const std::string msg = e.what();
    EXPECT_NE(msg.find("cannot build the lever"), std::string::npos) << msg;
    EXPECT_NE(msg.find("lever.handle"), std::string::npos) << msg;
  }
  Design narrow = read_design_file(kExample);
  narrow.lever.width = 0.018;  // 18 mm plate round Ø16 holes: 1 mm of wall
  try {
    build(narrow);
    FAIL() << "accepted";
  } catch (const BuildError& e) {
    EXPECT_NE(std::string(e.what()).find("lever.width"), std::string::npos) << e.what();
  }
}

TEST(BuildErrors, AnOcctFailureBecomesABuildErrorSayingWhatWasBuilt) {
  Design d = read_design_file(kExample);
  const Solution s = solve(d);
  // A band of zero thickness (never accepted by the reader): its eye arcs would start and end
  // at the same point, and OCCT's arc constructor throws.
  d.band.thickness = 0;
  try {
    build_brake(d, s, {});
    FAIL() << "accepted";
  } catch (const BuildError& e) {
    EXPECT_EQ(std::string(e.what()).rfind("while building the band: ", 0), 0u) << e.what();
  }
}

TEST(BuildErrors, ConceptDesignHasNoGeometry) {
  const Design d = read_design_file(std::string(BANDFORGE_SOURCE_DIR) +
                                    "/examples/concept-differential.toml");
  try {
    build_brake(d, solve(d), {});
    FAIL() << "accepted";
  } catch (const DesignError& e) {
    EXPECT_NE(std::string(e.what()).find("no pin coordinates"), std::string::npos);
  }
}

TEST(Released, BandLiftedByTheClearanceAndLeverTurnedBack) {
  const Built x = build(read_design_file(kExample), true);
  const Layout& L = x.solution.layout;
  const BrakeModel::Impl& m = x.model.impl();
  // The lever turns against the apply sense by the release rotation about the pivot.
  const double turn = -L.apply_sense * L.release_rotation;
  EXPECT_NEAR(m.lever_rotation, turn, 1e-15);
  const double bx = Ox + std::cos(turn) * (Bx - Ox) - std::sin(turn) * (By - Oy);
  const double by = Oy + std::sin(turn) * (Bx - Ox) + std::cos(turn) * (By - Oy);
  const gp_Pnt pin_b = centroid(placed(x.model, "PIN-B"));
  EXPECT_NEAR(pin_b.X(), bx, 1e-6);
  EXPECT_NEAR(pin_b.Y(), by, 1e-6);
  // Frame pin and pivot stay put.
  EXPECT_NEAR(centroid(placed(x.model, "PIN-A")).X(), Ax, 1e-6);
  EXPECT_NEAR(centroid(placed(x.model, "PIN-PIVOT")).Y(), Oy, 1e-6);
  // The band re-tangents from the moved pin to r_b + c; its inner face is lifted by c.
  const double R = r_b + clr;
  const double beta_a = tangent_angle(Ax, Ay, R, s_cw, true);
  const double beta_b = tangent_angle(bx, by, R, s_cw, false);
  const TopoDS_Shape band = placed(x.model, "BAND"), lining = placed(x.model, "LINING");
  const double phi = std::fmod(s_cw * (beta_b - beta_a) + 4 * pi, 2 * pi);
  EXPECT_NEAR(m.layout.wrap, phi, 1e-12);
  for (int k = 0; k <= 8; ++k) {
    const double a = beta_a + s_cw * phi * k / 8;
    EXPECT_LT(distance(band, gp_Pnt((R - t / 2) * std::cos(a), (R - t / 2) * std::sin(a), 0)), 1e-6);
  }
  // Lining off the drum by c everywhere.
  EXPECT_NEAR(BRepExtrema_DistShapeShape(lining, placed(x.model, "DRUM")).Value(), clr, 1e-6);
  for (const ContactCheck& cc : x.model.contacts()) {
    EXPECT_TRUE(cc.ok) << cc.part_a << " / " << cc.part_b;
    if (cc.part_a == "DRUM" && cc.part_b == "LINING") {
      EXPECT_FALSE(cc.intended);
    }
  }
  // The handle moves by about the handle travel solve reports (chord of the arc).
  const gp_Pnt grip = centroid(placed(x.model, "GRIP"));
  const double travel = std::hypot(grip.X() - 700, grip.Y() + 300);
  EXPECT_NEAR(travel, 2 * 810 * std::sin(std::abs(turn) / 2), 1e-6);
  EXPECT_NEAR(travel, L.handle_travel * 1000, 1e-3 * L.handle_travel * 1000);
}

TEST(Examples, EveryPinLayoutExampleBuildsInBothStates) {
  int built = 0;
  for (const auto& entry : std::filesystem::directory_iterator(std::string(BANDFORGE_SOURCE_DIR) + "/examples")) {
    if (entry.path().extension() != ".toml") continue;
    const Design d = read_design_file(entry.path().string());
    if (d.concept_arms.present) continue;
    for (bool released : {false, true}) {
      SCOPED_TRACE(entry.path().filename().string() + (released ? " released" : " applied"));
      const Built x = build(d, released);
      EXPECT_TRUE(x.model.all_valid());
      for (const ContactCheck& c : x.model.contacts()) EXPECT_TRUE(c.ok) << c.part_a << "/" << c.part_b;
    }
    ++built;
  }
  EXPECT_GE(built, 1);
}

// ---- Generated hardware (issue 12) ---------------------------------------------------------

TEST(Hardware, SharedBracketBuildsWithNoInterference) {
  // End A 30 mm from the pivot: one bracket with two bores (tests/hardware_test.cpp), and the
  // assembly passes every validity and clearance check.
  const Built x = build(read_design_text(edited("pivot = [\"-110 mm\", \"-300 mm\"]",
                                                "pivot = [\"-90 mm\", \"-300 mm\"]"),
                                         "beside.toml"));
  EXPECT_TRUE(x.model.all_valid());
  for (const ContactCheck& c : x.model.contacts()) EXPECT_TRUE(c.ok) << c.part_a << "/" << c.part_b;
  const PartInfo& bracket = part(x.model, "BRACKET-A-PIVOT");
  EXPECT_EQ(bracket.instance_names, std::vector<std::string>{"BRACKET-A-PIVOT"});
  // The plate: the hull of the two bores and their lug ends grown by w/2, less two Ø16 holes,
  // times its thickness; its area by the shoelace formula on the hull offset (Steiner: area of
  // the hull + perimeter·r + π·r²).
  const BracketPlan& br = x.solution.hardware.brackets[0];
  std::vector<gp_Pnt2d> pts;
  for (Vec2 p : br.outline) pts.emplace_back(p.x * 1000, p.y * 1000);
  // Convex hull of the four points, counter-clockwise (gift wrapping, written out here).
  std::vector<gp_Pnt2d> hull;
  std::size_t start = 0;
  for (std::size_t i = 1; i < pts.size(); ++i) {
    if (pts[i].X() < pts[start].X()) start = i;
  }
  std::size_t cur = start;
  do {
    hull.push_back(pts[cur]);
    std::size_t next = (cur + 1) % pts.size();
    for (std::size_t i = 0; i < pts.size(); ++i) {
      const double c = (pts[next].X() - pts[cur].X()) * (pts[i].Y() - pts[cur].Y()) -
                       (pts[next].Y() - pts[cur].Y()) * (pts[i].X() - pts[cur].X());
      if (c < 0) next = i;
    }
    cur = next;
  } while (cur != start && hull.size() <= pts.size());
  double area = 0, perimeter = 0;
  for (std::size_t i = 0; i < hull.size(); ++i) {
    const gp_Pnt2d& p = hull[i];
    const gp_Pnt2d& q = hull[(i + 1) % hull.size()];
    area += (p.X() * q.Y() - q.X() * p.Y()) / 2;
    perimeter += p.Distance(q);
  }
  const double r = br.half_width * 1000, thick = br.thickness * 1000;
  const double plate = (area + perimeter * r + pi * r * r - 2 * pi * 8 * 8) * thick;
  EXPECT_NEAR(bracket.volume, plate, 1e-6 * plate);
}

TEST(Hardware, WeldedEndBlocksAreBuiltWhereThePlanPutsThem) {
  const Built x = build(read_design_text(
      edited("pin_diameter = ", "end_joint = \"welded-block\"\npin_diameter = "), "welded.toml"));
  EXPECT_TRUE(x.model.all_valid());
  for (const ContactCheck& c : x.model.contacts()) EXPECT_TRUE(c.ok) << c.part_a << "/" << c.part_b;
  // Block by hand (tests/hardware_test.cpp, WeldedBlockByHand): front 16, back 21, height 24,
  // slot 9 × 3, bore Ø16, 80 wide: (37·24 − 9·3 − π·8²)·80 = 52 795 mm³.
  const double block = (37 * 24 - 9 * 3 - pi * 64) * 80;
  EXPECT_NEAR(part(x.model, "END-BLOCK-A").volume, block, 1e-6 * block);
  EXPECT_NEAR(part(x.model, "END-BLOCK-B").volume, block, 1e-6 * block);
  // Each block is placed with its bore on its pin.
  const PartInfo& block_a = part(x.model, "END-BLOCK-A");
  ASSERT_EQ(block_a.instance_origins.size(), 1u);
  EXPECT_NEAR(block_a.instance_origins[0].x, Ax, 1e-9);
  EXPECT_NEAR(block_a.instance_origins[0].y, Ay, 1e-9);
  // The band now ends in the slots, 8 + 4 = 12 mm short of each pin centre: its volume is
  // t·b·(centreline − 2·12), the eyes gone.
  const double L = x.solution.layout.band_length * 1000;
  EXPECT_NEAR(part(x.model, "BAND").volume, t * b * (L - 24), 1e-7 * t * b * L);
  // The pins go through the blocks, not the band.
  bool pin_in_block = false;
  for (const auto& [p, q] : x.model.impl().intended) {
    pin_in_block = pin_in_block || (p == "END-BLOCK-A" && q == "PIN-A");
  }
  EXPECT_TRUE(pin_in_block);
}

TEST(Hardware, ReleaseThatCannotClearIsACheckNotARefusal) {
  // The first sweep's invalid band solid: a differential-like layout whose net lever arm is
  // 4 mm, so the release rotation φ·c/|m_A + m_B| is about 110°; turned that far, pin A swings
  // across the band and the released band profile crosses itself. The applied state is sound
  // and builds; the released state fails the check release_clearance, and asking for it names
  // the key to change.
  const Design d = read_design_text(R"(
[project]
title = "Released state regression"
number = "REL-1"
[drum]
diameter = "540.24 mm"
width = "180 mm"
bore = "100 mm"
rotation = "ccw"
material = "cast-iron"
[lining]
material = "iron"
thickness = "0 mm"
[band]
width = "145 mm"
thickness = "4 mm"
allowable_stress = "100 MPa"
sense = "cw"
end_a = { mount = "lever", at = ["-74.85 mm", "-287.12 mm"] }
end_b = { mount = "frame", at = ["-27.22 mm", "-308.25 mm"] }
pin_diameter = "24 mm"
[lever]
pivot = ["-3.88 mm", "-337.59 mm"]
handle = ["-444.48 mm", "93.55 mm"]
width = "55 mm"
thickness = "18 mm"
allowable_stress = "120 MPa"
[load]
torque = "2000 N*m"
)", "release.toml");
  const Solution s = solve(d);
  EXPECT_GT(std::abs(s.layout.release_rotation) * 180 / pi, 90);
  EXPECT_FALSE(s.hardware.release_ok);
  bool failed = false;
  for (const Check& c : s.checks) failed = failed || (c.id == "release_clearance" && !c.ok);
  EXPECT_TRUE(failed);
  const Built applied = build(d);
  EXPECT_TRUE(applied.model.all_valid());
  try {
    build(d, /*released=*/true);
    FAIL() << "the released state was built";
  } catch (const BuildError& e) {
    EXPECT_NE(std::string(e.what()).find("cannot build the released state"), std::string::npos) << e.what();
    EXPECT_NE(std::string(e.what()).find("at least"), std::string::npos) << e.what();
  }
}

}  // namespace
}  // namespace bandforge::geom
