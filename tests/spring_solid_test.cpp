// geometry/spring_solid: the helical compression spring solid with the end finishes of Shigley's
// Mechanical Engineering Design 9th ed. Table 10-1. Every expected value is a hand computation
// written out here (Table 10-1, the wire section and the helix), never a number read back from the
// code under test; spring_volume_estimate() is compared with the solid as a second, tighter check.
#include <chrono>
#include <algorithm>
#include <sstream>
#include <random>
#include <cmath>
#include <iostream>
#include <numbers>
#include <stdexcept>
#include <string>

#include <gtest/gtest.h>

#include <BRepAdaptor_Surface.hxx>
#include <BRepBndLib.hxx>
#include <BRepCheck_Analyzer.hxx>
#include <BRepClass3d_SolidClassifier.hxx>
#include <BRepGProp.hxx>
#include <Bnd_Box.hxx>
#include <GProp_GProps.hxx>
#include <TopExp_Explorer.hxx>
#include <TopoDS.hxx>
#include <TopoDS_Face.hxx>
#include <gp_Pln.hxx>

#include "geometry/spring_solid.hpp"
#include "src/design.hpp"

namespace bandforge::geom {
namespace {

constexpr double pi = std::numbers::pi;

// The springs of the issue: d = 6 mm, D = 45 mm, N_a = 8, installed length 100 mm.
constexpr double d = 6, D = 45, Na = 8, L = 100;
constexpr double R = D / 2, r = d / 2;

// Shigley 9th ed. Table 10-1: total coils by the end finish.
double total_coils(SpringEnds e, double na) {
  switch (e) {
    case SpringEnds::plain: return na;             // N_t = N_a
    case SpringEnds::plain_ground: return na + 1;  // N_t = N_a + 1
    case SpringEnds::squared:                      // N_t = N_a + 2
    case SpringEnds::squared_ground: return na + 2;
  }
  return na + 2;
}
bool ground(SpringEnds e) { return e == SpringEnds::plain_ground || e == SpringEnds::squared_ground; }
bool squared(SpringEnds e) { return e == SpringEnds::squared || e == SpringEnds::squared_ground; }

SpringDims spring(SpringEnds e, double wire = d, double mean = D, double na = Na, double length = L) {
  SpringDims s;
  s.wire = wire;
  s.mean_diameter = mean;
  s.active_coils = na;
  s.total_coils = total_coils(e, na);
  s.ends = e;
  s.length = length;
  return s;
}

int count(const TopoDS_Shape& s, TopAbs_ShapeEnum type) {
  int n = 0;
  for (TopExp_Explorer e(s, type); e.More(); e.Next()) ++n;
  return n;
}

// Integrated to a relative error of 1e-6: the default fixed Gauss order was 0.1 % low on these
// long B-spline surfaces.
double volume(const TopoDS_Shape& s) {
  GProp_GProps g;
  BRepGProp::VolumeProperties(s, g, 1e-6);
  return g.Mass();
}

double area(const TopoDS_Shape& f) {
  GProp_GProps g;
  BRepGProp::SurfaceProperties(f, g);
  return g.Mass();
}

bool inside(const TopoDS_Shape& s, gp_Pnt p) {
  BRepClass3d_SolidClassifier c(s, p, 1e-7);
  return c.State() == TopAbs_IN;
}

// The planar faces lying in the plane z = z_plane (normal ±z).
std::vector<TopoDS_Face> faces_in_plane(const TopoDS_Shape& s, double z_plane) {
  std::vector<TopoDS_Face> out;
  for (TopExp_Explorer e(s, TopAbs_FACE); e.More(); e.Next()) {
    const TopoDS_Face& f = TopoDS::Face(e.Current());
    const BRepAdaptor_Surface a(f, false);
    if (a.GetType() != GeomAbs_Plane) continue;
    const gp_Pln p = a.Plane();
    if (std::abs(std::abs(p.Axis().Direction().Z()) - 1) < 1e-9 && std::abs(p.Location().Z() - z_plane) < 1e-6) {
      out.push_back(f);
    }
  }
  return out;
}

template <class F>
double milliseconds(F&& f) {
  const auto t0 = std::chrono::steady_clock::now();
  f();
  return std::chrono::duration<double, std::milli>(std::chrono::steady_clock::now() - t0).count();
}

class SpringEndsTest : public testing::TestWithParam<SpringEnds> {};

std::string name(const testing::TestParamInfo<SpringEnds>& i) {
  switch (i.param) {
    case SpringEnds::plain: return "Plain";
    case SpringEnds::plain_ground: return "PlainGround";
    case SpringEnds::squared: return "Squared";
    case SpringEnds::squared_ground: return "SquaredGround";
  }
  return "Unknown";
}

TEST_P(SpringEndsTest, ValidOneSolidWithTheWireVolume) {
  const SpringDims s = spring(GetParam());
  TopoDS_Shape shape;
  const double ms = milliseconds([&] { shape = make_spring(s); });
  std::cout << "[ timing   ] " << name({GetParam(), 0}) << " d 6 D 45 N_t " << s.total_coils << ": " << ms
            << " ms\n";
  ASSERT_FALSE(shape.IsNull());
  EXPECT_TRUE(BRepCheck_Analyzer(shape).IsValid());
  EXPECT_EQ(count(shape, TopAbs_SOLID), 1);
  EXPECT_EQ(count(shape, TopAbs_SHELL), 1);

  // The acceptance figure: wire volume = section π d²/4 × wire length, the wire length
  // ≈ π D per turn (helix angle small) × N_t: V ≈ π²·D·d²·N_t/4. Not exact: the helix is longer
  // than π D per turn by √(1 + (p/πD)²) (+0.1 % to +0.4 % here) and grinding removes about
  // 4πRr³/(3p) per ground end (derived at PlainGroundVolumeIsTheHelixLessTwoGroundSegments: 1.3 % and
  // 2.1 % of the total for plain-ground and squared-ground), hence the ±2 % band.
  const double nominal = pi * pi * D * d * d * s.total_coils / 4;
  const double v = volume(shape);
  EXPECT_NEAR(v, nominal, 0.02 * nominal);
  // The estimate from the same centreline (helix length × π d²/4 by Simpson's rule, minus the
  // circular segments below the seat planes integrated along the wire): the solid is a tube, whose
  // volume is exactly section × centreline length (Pappus), so only the surface approximation
  // and the integration differ.
  const double estimate = spring_volume_estimate(s);
  EXPECT_NEAR(v, estimate, 0.005 * estimate);
  std::cout << "[ volume   ] " << name({GetParam(), 0}) << ": " << v << " mm³, " << 100 * (v / nominal - 1)
            << " % from π²DN_td²/4 = " << nominal << ", " << 100 * (v / estimate - 1) << " % from the estimate "
            << estimate << "\n";
}

TEST_P(SpringEndsTest, BoundingBoxIsTheSeatsAndTheOuterDiameter) {
  const SpringDims s = spring(GetParam());
  const TopoDS_Shape shape = make_spring(s);
  // Tight boxes (optimised on the geometry, no tolerances). BRepBndLib bounds a face by its
  // whole parameter rectangle, i.e. the lateral surface before the grinding trims it, so z comes
  // from the edges: the highest and lowest points are on edges, as the wire's lateral surface
  // has no horizontal tangent plane (positive pitch) and the planar faces reach their extremes on
  // their boundaries. x and y come from the whole shape.
  Bnd_Box box, edges;
  BRepBndLib::AddOptimal(shape, box, false, false);
  for (TopExp_Explorer e(shape, TopAbs_EDGE); e.More(); e.Next()) BRepBndLib::AddOptimal(e.Current(), edges, false, false);
  double x0, y0, z0, x1, y1, z1, ex0, ey0, ex1, ey1;
  box.Get(x0, y0, z0, x1, y1, z1);
  edges.Get(ex0, ey0, z0, ex1, ey1, z1);
  // Seats: ground ends are cut by z = 0 and z = L; unground ends touch them with the wire's end
  // disc (the coil sits on the seat plane).
  EXPECT_NEAR(z0, 0, 1e-3);
  EXPECT_NEAR(z1, L, 1e-3);
  // Radially the wire reaches (D + d)/2 = 25.5 mm from the axis, and every direction is passed.
  EXPECT_NEAR(x0, -(D + d) / 2, 0.05);
  EXPECT_NEAR(x1, (D + d) / 2, 0.05);
  EXPECT_NEAR(y0, -(D + d) / 2, 0.05);
  EXPECT_NEAR(y1, (D + d) / 2, 0.05);
}

TEST_P(SpringEndsTest, WireStartsOnPlusXAndWindsRightHanded) {
  const SpringEnds e = GetParam();
  const SpringDims s = spring(e);
  const TopoDS_Shape shape = make_spring(s);
  // First-turn pitch: squared ends close the end turn to ~1.02 d (header); plain ends have one
  // pitch over N_t turns between the centreline's ends (z d/2 to L − d/2, or 0 to L when ground).
  const double p = squared(e) ? 1.02 * d : ground(e) ? L / s.total_coils : (L - d) / s.total_coils;
  const double zc = ground(e) ? 0 : d / 2;  // centreline height at the start
  // Right-hand helix starting at angle 0: the centreline is at zc + p/4 over +y and zc + 3p/4
  // over −y (a left-hand one would have these swapped, half a pitch > d/2 away from these points).
  EXPECT_TRUE(inside(shape, gp_Pnt(0, R, zc + p / 4)));
  EXPECT_TRUE(inside(shape, gp_Pnt(0, -R, zc + 3 * p / 4)));
  EXPECT_FALSE(inside(shape, gp_Pnt(0, -R, zc + p / 4)));
  // The wire starts at angle 0: just after it (y = +1) the wire is there, just before (y = −1) not.
  const double zs = std::max(zc, 0.5);
  EXPECT_TRUE(inside(shape, gp_Pnt(R, 1, zs)));
  EXPECT_FALSE(inside(shape, gp_Pnt(R, -1, zs)));
}

INSTANTIATE_TEST_SUITE_P(Table10_1, SpringEndsTest,
                         testing::Values(SpringEnds::plain, SpringEnds::plain_ground, SpringEnds::squared,
                                         SpringEnds::squared_ground),
                         name);

// Ground ends: one flat face in each seat plane, the crescent where the plane cuts the end coil.
// Its area, with the centreline z = p·θ/2π over the cut (constant pitch there) and the section
// square to the wire: the plane cuts the section at h = z/cos α from its centre, a chord of
// 2√(r² − h²), and integrating over θ (the chord's ring element is R·dθ/cos²α) gives
//   A = π²·R·r²/(p·cos α)  (the integral of √(1 − u²) over [0, 1] is π/4).
// Squared-ground: closed end turn p·cos α = 1.02·d (header) → A = π²·D·d/8.16 = 326.6 mm², below
// the touching-coil bound π²·D·d/8 = 333.1 mm². Plain-ground: p = L/N_t = 11.11 mm,
// cos α = πD/√((πD)² + p²) → A = 180.4 mm². Both far above 0.3·πd²/4 = 8.5 mm².
TEST(GroundEnds, FlatFacesLieInTheSeatPlanesWithTheCrescentArea) {
  for (SpringEnds e : {SpringEnds::plain_ground, SpringEnds::squared_ground}) {
    const SpringDims s = spring(e);
    const TopoDS_Shape shape = make_spring(s);
    const double p = e == SpringEnds::squared_ground ? 0 : L / s.total_coils;
    const double expected = e == SpringEnds::squared_ground
                                ? pi * pi * D * d / 8.16
                                : pi * pi * R * r * r * std::hypot(pi * D, p) / (p * pi * D);
    for (double seat : {0.0, L}) {
      const std::vector<TopoDS_Face> faces = faces_in_plane(shape, seat);
      ASSERT_EQ(faces.size(), 1u) << to_string(e) << " z = " << seat;
      const double a = area(faces[0]);
      EXPECT_GT(a, 0.3 * pi * d * d / 4) << to_string(e);
      EXPECT_NEAR(a, expected, 0.01 * expected) << to_string(e) << " z = " << seat;
      if (e == SpringEnds::squared_ground) {
        EXPECT_LT(a, pi * pi * D * d / 8);  // touching-coil bound
      }
    }
  }
}

// Unground ends have no face in the seat planes: the wire only touches them.
TEST(UngroundEnds, NoFaceInTheSeatPlanes) {
  for (SpringEnds e : {SpringEnds::plain, SpringEnds::squared}) {
    const TopoDS_Shape shape = make_spring(spring(e));
    EXPECT_TRUE(faces_in_plane(shape, 0).empty()) << to_string(e);
    EXPECT_TRUE(faces_in_plane(shape, L).empty()) << to_string(e);
  }
}

// What grinding removes, by hand: per end ∫ segment(h) along the wire, h = z/cos α, ds = R dθ/cos α,
// z = pθ/2π: (2r³/3)·2πR/p = 4πRr³/(3p) (∫₀ʳ segment(h) dh = first moment of a half disc = 2r³/3).
// Plain-ground: one pitch p = L/N_t over N_t turns, wire length N_t·√((πD)² + p²).
TEST(GroundEnds, PlainGroundVolumeIsTheHelixLessTwoGroundSegments) {
  const SpringDims s = spring(SpringEnds::plain_ground);
  const double p = L / s.total_coils;                          // 11.11 mm
  const double wire = s.total_coils * std::hypot(pi * D, p);   // 1276.3 mm
  const double removed = 4 * pi * R * r * r * r / (3 * p);     // 229.0 mm³ per end
  const double expected = wire * pi * d * d / 4 - 2 * removed;  // 35 628 mm³
  EXPECT_NEAR(volume(make_spring(s)), expected, 1e-4 * expected);
  EXPECT_NEAR(spring_volume_estimate(s), expected, 1e-5 * expected);
}

// Plain: one pitch p = (L − 2·z₀)/N_t with the wire's end discs touching the seats,
// z₀ = r·cos α ≈ d/2; wire length N_t·√((πD)² + p²).
TEST(UngroundEnds, PlainVolumeIsTheHelix) {
  const SpringDims s = spring(SpringEnds::plain);
  double p = (L - d) / s.total_coils;
  for (int i = 0; i < 10; ++i) p = (L - 2 * r * pi * D / std::hypot(pi * D, p)) / s.total_coils;
  const double expected = s.total_coils * std::hypot(pi * D, p) * pi * d * d / 4;
  EXPECT_NEAR(volume(make_spring(s)), expected, 1e-4 * expected);
}

// How far the lateral B-spline face of `shape` lies from the tube of radius rc round the
// centreline (Rc cos θ, Rc sin θ, z(θ)) (z1, z2: dz/dθ, d²z/dθ²): 64 × ⌈turns⌉ × 16 samples in
// its parameter plane, each measured from the nearest centreline point (Newton on
// (q − C(θ))·C'(θ) = 0 from θ = u, the surface's u being the winding angle).
struct TubeFit {
  int faces = 0;    ///< B-spline faces met (the spring has one)
  int samples = 0;
  double farthest = 0;  ///< |distance to the centreline − rc|, the largest [mm]
};

template <class Z, class Z1, class Z2>
TubeFit fit_to_tube(const TopoDS_Shape& shape, double turns, double Rc, double rc, Z z, Z1 z1, Z2 z2) {
  TubeFit fit;
  for (TopExp_Explorer e(shape, TopAbs_FACE); e.More(); e.Next()) {
    const BRepAdaptor_Surface a(TopoDS::Face(e.Current()), false);
    if (a.GetType() != GeomAbs_BSplineSurface) continue;
    ++fit.faces;
    const int nu = 64 * static_cast<int>(std::ceil(turns)), nv = 16;
    for (int i = 0; i <= nu; ++i) {
      const double u = a.FirstUParameter() + (a.LastUParameter() - a.FirstUParameter()) * i / nu;
      for (int j = 0; j < nv; ++j) {
        const double v = a.FirstVParameter() + (a.LastVParameter() - a.FirstVParameter()) * j / nv;
        const gp_Vec q(a.Value(u, v).XYZ());
        double th = u;
        for (int it = 0; it < 40; ++it) {
          const gp_Vec cc(Rc * std::cos(th), Rc * std::sin(th), z(th));
          const gp_Vec c1(-Rc * std::sin(th), Rc * std::cos(th), z1(th));
          const gp_Vec c2(-Rc * std::cos(th), -Rc * std::sin(th), z2(th));
          const gp_Vec w = q - cc;
          const double step = w.Dot(c1) / (-c1.Dot(c1) + w.Dot(c2));
          th -= step;
          if (std::abs(step) < 1e-13) break;
        }
        const gp_Vec cc(Rc * std::cos(th), Rc * std::sin(th), z(th));
        fit.farthest = std::max(fit.farthest, std::abs((q - cc).Magnitude() - rc));
        ++fit.samples;
      }
    }
  }
  return fit;
}

// The lateral surface is an approximation of the tube (quintic Hermite spans in θ, exact circles
// across the wire): every point of it must lie within 1e-3 mm of the true tube, i.e. at r from
// the helix. 1e-3 mm is the modelling tolerance we hold the spring to: 1/30 of the ±0.03 mm
// diameter tolerance of 5–6 mm spring wire (EN 10270-2, from memory). Plain ends have one pitch,
// so the centreline is the helix (R cos θ, R sin θ, z₀ + pθ/2π) with p and z₀ as above.
TEST(UngroundEnds, LateralSurfaceLiesOnTheTube) {
  struct Case {
    double d, D, na, L;
  };
  // The spring, the bin-hoist example's, and a small and a large one.
  for (const Case c : {Case{6, 45, 8, 100}, Case{5, 59.5, 11.5, 150}, Case{2, 12, 10, 40}, Case{12, 120, 6, 200}}) {
    const SpringDims s = spring(SpringEnds::plain, c.d, c.D, c.na, c.L);
    const double Rc = c.D / 2, rc = c.d / 2;
    double p = (c.L - c.d) / s.total_coils;
    for (int i = 0; i < 20; ++i) p = (c.L - 2 * rc * pi * c.D / std::hypot(pi * c.D, p)) / s.total_coils;
    const double z0 = rc * pi * c.D / std::hypot(pi * c.D, p);
    const double k = p / (2 * pi);
    const TubeFit fit = fit_to_tube(
        make_spring(s), s.total_coils, Rc, rc, [&](double th) { return z0 + k * th; },
        [&](double) { return k; }, [](double) { return 0.0; });
    EXPECT_EQ(fit.faces, 1);
    EXPECT_GT(fit.samples, 3000);
    EXPECT_LT(fit.farthest, 1e-3) << "d " << c.d << " D " << c.D;
    std::cout << "[ surface  ] plain d " << c.d << " D " << c.D << ": " << fit.samples << " points, farthest "
              << fit.farthest << " mm from the tube\n";
  }
}

TEST(SquaredEnds, LateralSurfaceLiesOnTheTubeThroughThePitchBlends) {
  // Squared ends: closed end turns blended into the active pitch (the model in
  // geometry/spring_solid.hpp: p_end·cos α_end = 1.02·d, a smoothstep on the pitch over half a
  // turn centred on the end of each end turn, the end disc touching the seat plane). The
  // surface is held to the tube round that centreline as the plain springs' are, the blends
  // included (there the rows' second derivative jumps: the surface has knots at the blends' ends).
  struct Case {
    double d, D, na, L;
  };
  for (const Case c : {Case{6, 45, 8, 100}, Case{5, 59.5, 11.5, 240}, Case{12, 120, 6, 260}}) {
    const SpringDims s = spring(SpringEnds::squared, c.d, c.D, c.na, c.L);
    const double Rc = c.D / 2, rc = c.d / 2, Nt = s.total_coils;
    const auto cos_alpha = [&](double p) { return pi * c.D / std::hypot(pi * c.D, p); };
    double pe = 1.02 * c.d;
    for (int i = 0; i < 40; ++i) pe = 1.02 * c.d / cos_alpha(pe);
    const double z0 = rc * cos_alpha(pe);
    const double pa = (c.L - 2 * z0 - 2 * pe) / c.na;
    ASSERT_GT(pa, pe) << "the case must have a blend";
    const double t1 = 1, t2 = Nt - 1, w = 0.5;
    const auto S = [](double x) { return x <= 0 ? 0 : x >= 1 ? 1 : x * x * (3 - 2 * x); };
    const auto dS = [](double x) { return x <= 0 || x >= 1 ? 0 : 6 * x * (1 - x); };
    const auto iS = [](double x) { return x <= 0 ? 0 : x >= 1 ? x - 0.5 : x * x * x - 0.5 * x * x * x * x; };
    // Centreline z(θ) and its θ-derivatives, t = θ/2π turns.
    const auto z = [&](double th) {
      const double t = th / (2 * pi);
      return z0 + pe * t + (pa - pe) * w * (iS((t - t1) / w + 0.5) - iS((t - t2) / w + 0.5));
    };
    const auto z1 = [&](double th) {
      const double t = th / (2 * pi);
      return (pe + (pa - pe) * (S((t - t1) / w + 0.5) - S((t - t2) / w + 0.5))) / (2 * pi);
    };
    const auto z2 = [&](double th) {
      const double t = th / (2 * pi);
      return (pa - pe) / w * (dS((t - t1) / w + 0.5) - dS((t - t2) / w + 0.5)) / (4 * pi * pi);
    };
    const TubeFit fit = fit_to_tube(make_spring(s), Nt, Rc, rc, z, z1, z2);
    EXPECT_EQ(fit.faces, 1);
    EXPECT_GT(fit.samples, 3000);
    // Within the 5e-4 mm the surface aims at (geometry/spring_solid.cpp kSurfaceTarget), not only
    // the plain test's 1e-3: this is what the knots at the blends' ends buy (without them the
    // second case measured 8.1e-4 mm).
    EXPECT_LT(fit.farthest, 5e-4) << "d " << c.d << " D " << c.D;
    std::cout << "[ surface  ] squared d " << c.d << " D " << c.D << ": " << fit.samples << " points, farthest "
              << fit.farthest << " mm from the tube\n";
  }
}

TEST(Limits, LengthAtOrBelowSolidLengthThrows) {
  // Squared-ground, N_t = 10: L_s = d·N_t = 60 mm (Table 10-1). At L_s the pitch is d: no clearance.
  EXPECT_THROW(make_spring(spring(SpringEnds::squared_ground, d, D, Na, 59)), std::invalid_argument);
  EXPECT_THROW(make_spring(spring(SpringEnds::squared_ground, d, D, Na, 60)), std::invalid_argument);
  // Plain, N_t = 8: L_s = d·(N_t + 1) = 54 mm.
  EXPECT_THROW(make_spring(spring(SpringEnds::plain, d, D, Na, 54)), std::invalid_argument);
  EXPECT_THROW(spring_volume_estimate(spring(SpringEnds::squared, d, D, Na, 50)), std::invalid_argument);
  // N_t must agree with the ends (squared: N_a + 2).
  SpringDims s = spring(SpringEnds::squared);
  s.total_coils = Na + 1;
  EXPECT_THROW(make_spring(s), std::invalid_argument);
  // The wire must fit inside the coil.
  EXPECT_THROW(make_spring(spring(SpringEnds::plain, d, d, Na, L)), std::invalid_argument);
}

// One millimetre above the solid length (L_s = 60 mm): uniform pitch 6.1 mm, clearance square to
// the wire 6.1·cos α − 6 ≈ 0.09 mm: still a valid solid.
TEST(Limits, NearlySolidSpringIsValid) {
  const SpringDims s = spring(SpringEnds::squared_ground, d, D, Na, 61);
  const TopoDS_Shape shape = make_spring(s);
  EXPECT_TRUE(BRepCheck_Analyzer(shape).IsValid());
  EXPECT_EQ(count(shape, TopAbs_SOLID), 1);
  EXPECT_NEAR(volume(shape), spring_volume_estimate(s), 0.005 * spring_volume_estimate(s));
}

// Springs generated over the ranges a design file may ask for (every end finish, wire 1–16 mm,
// spring index D/d 4–14, 2–20 active coils, installed from just above solid to a long pitch):
// each is one valid solid whose volume is the centreline estimate's. Shigley 9th ed. §10-2
// recommends 4 ≤ C ≤ 12 and 3 ≤ N_a ≤ 15 (from memory); the ranges go a little beyond, since a
// design file may. A fixed seed keeps the run repeatable.
TEST(Generated, EverySpringIsOneValidSolidWithItsVolume) {
  std::mt19937 rng(20261202);
  auto uniform = [&](double a, double b) { return std::uniform_real_distribution<double>(a, b)(rng); };
  const SpringEnds kinds[] = {SpringEnds::plain, SpringEnds::plain_ground, SpringEnds::squared,
                              SpringEnds::squared_ground};
  double worst = 0;
  for (int i = 0; i < 48; ++i) {
    const SpringEnds e = kinds[i % 4];
    const double wire = uniform(1, 16), index = uniform(4, 14);
    const double na = std::round(uniform(2, 20) * 2) / 2;  // half coils
    SpringDims s = spring(e, wire, wire * index, na, 0);
    const bool ground = e == SpringEnds::plain_ground || e == SpringEnds::squared_ground;
    const double solid = wire * (ground ? s.total_coils : s.total_coils + 1);
    s.length = solid + na * wire * uniform(0.2, 1.5);
    std::ostringstream what;
    what << static_cast<int>(e) << " d " << wire << " D " << s.mean_diameter << " N_a " << na << " L " << s.length;
    TopoDS_Shape shape;
    ASSERT_NO_THROW(shape = make_spring(s)) << what.str();
    EXPECT_TRUE(BRepCheck_Analyzer(shape).IsValid()) << what.str();
    EXPECT_EQ(count(shape, TopAbs_SOLID), 1) << what.str();
    const double estimate = spring_volume_estimate(s);
    const double off = std::abs(volume(shape) / estimate - 1);
    EXPECT_LT(off, 1e-3) << what.str();
    worst = std::max(worst, off);
  }
  std::cout << "[ volume   ] 48 generated springs: at most " << worst * 100 << " % from the estimate\n";
}

// The interactive sizes: 12 coils (d 6, D 45, N_a 10, squared-ground, L 120) and 16 coils
// (d 8, D 60, N_a 14, squared-ground, L 200). Times are printed, not asserted.
TEST(Speed, TwelveAndSixteenCoilSpringsBuildValid) {
  struct Case {
    const char* what;
    SpringDims s;
  };
  const Case cases[] = {{"12 coils", spring(SpringEnds::squared_ground, 6, 45, 10, 120)},
                        {"16 coils", spring(SpringEnds::squared_ground, 8, 60, 14, 200)}};
  for (const Case& c : cases) {
    TopoDS_Shape shape;
    make_spring(c.s);  // warm-up (first use of the OCCT algorithms)
    const double ms = milliseconds([&] { shape = make_spring(c.s); });
    std::cout << "[ timing   ] " << c.what << " squared-ground: " << ms << " ms\n";
    RecordProperty(std::string(c.what) == "12 coils" ? "ms_12_coils" : "ms_16_coils", std::to_string(ms));
    EXPECT_TRUE(BRepCheck_Analyzer(shape).IsValid()) << c.what;
    EXPECT_EQ(count(shape, TopAbs_SOLID), 1) << c.what;
    const double nominal = pi * pi * c.s.mean_diameter * c.s.wire * c.s.wire * c.s.total_coils / 4;
    EXPECT_NEAR(volume(shape), nominal, 0.02 * nominal) << c.what;
    EXPECT_NEAR(volume(shape), spring_volume_estimate(c.s), 0.005 * nominal) << c.what;
  }
}

}  // namespace
}  // namespace bandforge::geom
