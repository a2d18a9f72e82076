// Helical compression spring solid (see spring_solid.hpp for the model).
//
// Construction: the wire's lateral surface is built directly as one B-spline surface, not swept:
// U = the winding angle θ [rad], V = the angle round the wire (a rational quadratic circle, so
// every U-iso line is an exact circle square to the centreline). In U the poles come from quintic
// Hermite interpolation of the exact surface rows (points, first and second θ-derivatives; about
// 7 spans per turn for D 45, triple knots: C2), within 5e-4 mm of the true tube.
// The faces and edges are then assembled by hand (wire_solid): grinding is a trim of the lateral
// face in its parameter plane along the solved seat-plane curve, not a Boolean. Earlier
// versions measured: sweeping with BRepOffsetAPI_MakePipe(Shell) was slow (seconds) or invalid
// for whole springs; cutting separate end pieces with a box (BRepAlgoAPI_Cut, 60-90 ms per end)
// and sewing (~30 ms) took 160-230 ms for 12-16 coils; sewing also left some unground springs
// inside out after BRepLib::OrientClosedSolid.
#include "geometry/spring_solid.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <numbers>
#include <sstream>
#include <stdexcept>
#include <string>
#include <vector>

#include <BRepLib.hxx>
#include <BRep_Builder.hxx>
#include <BRep_Tool.hxx>
#include <GC_MakeSegment.hxx>
#include <Geom2dAPI_Interpolate.hxx>
#include <Geom2d_BSplineCurve.hxx>
#include <Geom2d_Line.hxx>
#include <Geom_Plane.hxx>
#include <Geom_TrimmedCurve.hxx>
#include <Geom_BSplineSurface.hxx>
#include <Standard_Failure.hxx>
#include <TColStd_Array1OfInteger.hxx>
#include <TColStd_Array1OfReal.hxx>
#include <TColStd_Array2OfReal.hxx>
#include <TColStd_HArray1OfBoolean.hxx>
#include <TColStd_HArray1OfReal.hxx>
#include <TColgp_Array1OfVec2d.hxx>
#include <TColgp_HArray1OfPnt2d.hxx>
#include <TColgp_Array2OfPnt.hxx>
#include <TopoDS.hxx>
#include <TopoDS_Face.hxx>
#include <TopoDS_Shell.hxx>
#include <TopoDS_Solid.hxx>
#include <TopoDS_Vertex.hxx>
#include <TopoDS_Wire.hxx>
#include <gp_Ax3.hxx>
#include <gp_Dir2d.hxx>
#include <gp_Pnt2d.hxx>
#include <gp_Vec2d.hxx>
#include <gp_Pnt.hxx>
#include <gp_Vec.hxx>

namespace bandforge::geom {
namespace {

constexpr double pi = std::numbers::pi;
constexpr double kEndClearance = 0.02;   ///< closed end turns: clearance square to the wire / d
constexpr double kBlendWidth = 0.5;      ///< pitch blend width [turns], centred on the end turn's end
constexpr double kSurfaceTarget = 5e-4;  ///< aimed-at distance of the surface from the tube [mm]

// Smoothstep S(x) = 3x² − 2x³ on [0, 1] (0 before, 1 after), its derivative and its integral.
double step(double x) { return x <= 0 ? 0 : x >= 1 ? 1 : x * x * (3 - 2 * x); }
double step_slope(double x) { return x <= 0 || x >= 1 ? 0 : 6 * x * (1 - x); }
double step_integral(double x) { return x <= 0 ? 0 : x >= 1 ? x - 0.5 : x * x * x - 0.5 * x * x * x * x; }

// cos of the helix angle for a pitch p on radius R.
double cos_helix(double p, double R) { return 2 * pi * R / std::hypot(2 * pi * R, p); }

std::string mm(double v) {
  std::ostringstream o;
  o.precision(6);
  o << v << " mm";
  return o.str();
}

// The wire's centreline: (R cos θ, R sin θ, z(θ)), t = θ/2π turns. The pitch is p_end in the end
// turns and p_act between, blended by smoothsteps of width w centred on t1 and t2.
struct Centreline {
  double R = 0, r = 0;
  double turns = 0;  ///< N_t
  double z0 = 0;     ///< z at t = 0
  double p_end = 0, p_act = 0;
  double t1 = 1, t2 = 1, w = kBlendWidth;
  double length = 0;
  bool ground = false;

  double pitch(double t) const {  // [mm/turn]
    return p_end + (p_act - p_end) * (step((t - t1) / w + 0.5) - step((t - t2) / w + 0.5));
  }
  double pitch_slope(double t) const {  // d pitch / dt
    return (p_act - p_end) / w * (step_slope((t - t1) / w + 0.5) - step_slope((t - t2) / w + 0.5));
  }
  double z(double t) const {
    return z0 + p_end * t +
           (p_act - p_end) * w * (step_integral((t - t1) / w + 0.5) - step_integral((t - t2) / w + 0.5));
  }
  double end_angle() const { return 2 * pi * turns; }
  // Derivatives with respect to θ.
  double dz(double th) const { return pitch(th / (2 * pi)) / (2 * pi); }
  double ddz(double th) const { return pitch_slope(th / (2 * pi)) / (4 * pi * pi); }
  double metric(double th) const { return std::hypot(R, dz(th)); }  // |dC/dθ|

  gp_Pnt point(double th) const { return {R * std::cos(th), R * std::sin(th), z(th / (2 * pi))}; }
  gp_Vec tangent(double th) const {
    return gp_Vec(-R * std::sin(th), R * std::cos(th), dz(th)).Normalized();
  }

  // The section frame at θ: a = e_r (radial, outward: the surface's seam runs along the coil's
  // outside) and b = u2 = (z' sin θ, −z' cos θ, R)/|C'|, the upward unit vector square to e_r.
  // Both square to the tangent, T × u2 = e_r; their θ-derivatives in da, db.
  void frame(double th, gp_Vec& a, gp_Vec& b, gp_Vec& da, gp_Vec& db) const {
    const double c = std::cos(th), s = std::sin(th);
    const double zp = dz(th), zpp = ddz(th);
    const double m = std::hypot(R, zp), dm = zp * zpp / m;
    const gp_Vec n(zp * s, -zp * c, R);
    const gp_Vec dn(zpp * s + zp * c, -zpp * c + zp * s, 0);
    a = gp_Vec(c, s, 0);
    da = gp_Vec(-s, c, 0);
    b = n / m;
    db = (dn * m - n * dm) / (m * m);
  }
};

bool is_ground(SpringEnds e) { return e == SpringEnds::plain_ground || e == SpringEnds::squared_ground; }
bool is_squared(SpringEnds e) { return e == SpringEnds::squared || e == SpringEnds::squared_ground; }

// The centreline for s, or std::invalid_argument.
Centreline plan(const SpringDims& s) {
  const auto bad = [](const std::string& what) { throw std::invalid_argument("spring: " + what); };
  for (double v : {s.wire, s.mean_diameter, s.total_coils, s.active_coils, s.length}) {
    if (!std::isfinite(v)) bad("dimensions must be finite numbers");
  }
  if (s.wire <= 0) bad("wire diameter " + mm(s.wire) + " must be positive");
  if (s.mean_diameter <= s.wire) {
    bad("mean diameter " + mm(s.mean_diameter) + " must exceed the wire diameter " + mm(s.wire));
  }
  if (s.active_coils < 1) bad("at least one active coil is needed");
  const double extra = s.ends == SpringEnds::plain ? 0 : s.ends == SpringEnds::plain_ground ? 1 : 2;
  if (std::abs(s.total_coils - (s.active_coils + extra)) > 1e-9) {
    std::ostringstream o;
    o << "total coils " << s.total_coils << " do not match " << s.active_coils << " active coils and "
      << to_string(s.ends) << " ends (Shigley Table 10-1: N_t = N_a + " << extra << ")";
    bad(o.str());
  }
  if (s.length <= 0) bad("length " + mm(s.length) + " must be positive");

  Centreline c;
  c.R = s.mean_diameter / 2;
  c.r = s.wire / 2;
  c.turns = s.total_coils;
  c.length = s.length;
  c.ground = is_ground(s.ends);
  c.t1 = 1;
  c.t2 = c.turns - 1;
  const double d = s.wire;

  // Unground: the end disc touches the seat plane, z0 = r·cos α at the end pitch.
  const auto start = [&](double p) { return c.ground ? 0.0 : c.r * cos_helix(p, c.R); };
  // One pitch p for the N_t turns between z0 and L − z0 (fixed point: z0 depends on p weakly).
  const auto uniform = [&]() {
    double p = (s.length - 2 * start(d)) / c.turns;
    for (int i = 0; i < 20; ++i) p = (s.length - 2 * start(p)) / c.turns;
    return p;
  };
  if (is_squared(s.ends)) {
    double pe = (1 + kEndClearance) * d;  // p·cos α = 1.02 d
    for (int i = 0; i < 20; ++i) pe = (1 + kEndClearance) * d / cos_helix(pe, c.R);
    const double z0 = start(pe);
    const double pa = (s.length - 2 * z0 - 2 * pe) / s.active_coils;
    if (pa >= pe) {
      c.p_end = pe;
      c.p_act = pa;
      c.z0 = z0;
    } else {  // nearly solid: one pitch throughout (checked below)
      c.p_end = c.p_act = uniform();
      c.z0 = start(c.p_end);
    }
  } else {
    c.p_end = c.p_act = uniform();
    c.z0 = start(c.p_end);
  }
  const double p = std::min(c.p_end, c.p_act);
  if (!(p * cos_helix(p, c.R) > d)) {
    const double solid = d * (c.ground ? s.total_coils : s.total_coils + 1);
    bad("active pitch " + mm(p) + " (square to the wire " + mm(p * cos_helix(p, c.R)) +
        ") does not exceed the wire diameter " + mm(d) + ": the coils would overlap (installed length " +
        mm(s.length) + ", solid length d·" + (c.ground ? "N_t" : "(N_t + 1)") + " = " + mm(solid) + ")");
  }
  return c;
}

// The lateral surface of the wire for θ in [th0, th1] (see the file comment).
//
// In U: quintic Hermite interpolation of the surface rows (the section circle's nine control
// points as functions of θ) from their values, first and second θ-derivatives at the nodes,
// one Bézier piece per span joined with C2 continuity (knots of multiplicity 3: the Hermite data
// agree on both sides). The pitch blends' ends are nodes too: there the third derivative of z
// jumps and with it the rows' second derivative (the section frame turns with the pitch), so
// those knots keep multiplicity 4 (C1) and each side takes its own second derivative. Quintic
// Hermite error ≤ h⁶/46080 · max|P⁽⁶⁾| for span h (the sixth derivative of cos θ about a radius
// R + r is R + r): spans from that bound at kSurfaceTarget, about 7 per turn for D 45 where the
// cubic needed 22 (a third of the control points, half the STEP file).
int quintic_spans_per_turn(double reach) {
  const double h = std::pow(46080 * kSurfaceTarget / reach, 1.0 / 6);
  return std::max(4, static_cast<int>(std::ceil(2 * pi / h - 1e-9)));
}

Handle(Geom_BSplineSurface) tube_surface(const Centreline& c, double th0, double th1) {
  // Breaks: the ends and the pitch blends' edges strictly inside; each piece in equal spans.
  std::vector<double> breaks{th0};
  std::vector<bool> blend_edge{false};
  if (c.p_act != c.p_end) {
    for (double t : {c.t1 - c.w / 2, c.t1 + c.w / 2, c.t2 - c.w / 2, c.t2 + c.w / 2}) {
      const double th = 2 * pi * t;
      if (th > breaks.back() + 1e-9 && th < th1 - 1e-9) {
        breaks.push_back(th);
        blend_edge.push_back(true);
      }
    }
  }
  breaks.push_back(th1);
  blend_edge.push_back(false);
  const int per_turn = quintic_spans_per_turn(c.R + c.r);
  std::vector<double> nodes{th0};
  std::vector<bool> c1_node{false};  // a blend edge: multiplicity 4
  for (std::size_t k = 0; k + 1 < breaks.size(); ++k) {
    const double a = breaks[k], b = breaks[k + 1];
    const int n = std::max(1, static_cast<int>(std::ceil((b - a) / (2 * pi) * per_turn - 1e-9)));
    for (int i = 1; i <= n; ++i) {
      nodes.push_back(i == n ? b : a + (b - a) * i / n);
      c1_node.push_back(i == n && blend_edge[k + 1]);
    }
  }
  const int spans = static_cast<int>(nodes.size()) - 1;
  // Unit circle as a rational quadratic: 9 poles on the square, weights 1 and √2/2.
  const double qx[9] = {1, 1, 0, -1, -1, -1, 0, 1, 1};
  const double qy[9] = {0, 1, 1, 1, 0, -1, -1, -1, 0};
  const double wc = std::sqrt(0.5);
  // Row j's point and θ-derivative at θ: P = C + r(a·qx + b·qy).
  auto row = [&](double th, int j, gp_Vec& P, gp_Vec& dP) {
    const double ct = std::cos(th), st = std::sin(th);
    const gp_Vec C(c.R * ct, c.R * st, c.z(th / (2 * pi)));
    const gp_Vec dC(-c.R * st, c.R * ct, c.dz(th));
    gp_Vec a, b, da, db;
    c.frame(th, a, b, da, db);
    P = C + (a * qx[j] + b * qy[j]) * c.r;
    dP = dC + (da * qx[j] + db * qy[j]) * c.r;
  };
  // Second derivative from the analytic first by a second-order one-sided difference, on the
  // side of the span (side −1: the span before θ, +1: after), so that it never straddles a
  // blend edge; δ = 1e-5 rad: truncation ~1e-10, round-off ~1e-10 of |P''|.
  auto second = [&](double th, int j, int side) {
    constexpr double delta = 1e-5;
    gp_Vec P, d0, d1, d2;
    row(th, j, P, d0);
    row(th + side * delta, j, P, d1);
    row(th + 2 * side * delta, j, P, d2);
    return (d1 * 4 - d0 * 3 - d2) * (side / (2 * delta));
  };
  // Bézier poles of every span, then the B-spline's: at a C2 node (multiplicity 3) the left
  // span's b4, the joint and the right span's b1 collapse into one de Boor point D, with b4 on
  // b3–D and b1 on D–b2 in the ratio of the spans (the basis function of D spans only those
  // two); at a blend edge (multiplicity 4) b4 and b1 stay and the joint, between them, goes.
  std::vector<std::array<gp_Vec, 6>> bez(static_cast<std::size_t>(spans) * 9);
  for (int k = 0; k < spans; ++k) {
    const double u0 = nodes[k], u1 = nodes[k + 1], h = u1 - u0;
    for (int j = 0; j < 9; ++j) {
      gp_Vec P0, D0, P1, D1;
      row(u0, j, P0, D0);
      row(u1, j, P1, D1);
      const gp_Vec S0 = second(u0, j, +1), S1 = second(u1, j, -1);
      bez[k * 9 + j] = {P0,
                        P0 + D0 * (h / 5),
                        P0 + D0 * (2 * h / 5) + S0 * (h * h / 20),
                        P1 - D1 * (2 * h / 5) + S1 * (h * h / 20),
                        P1 - D1 * (h / 5),
                        P1};
    }
  }
  int nu = 3 * spans + 3;
  for (int k = 1; k < spans; ++k) nu += c1_node[k] ? 1 : 0;
  TColgp_Array2OfPnt poles(1, nu, 1, 9);
  TColStd_Array2OfReal weights(1, nu, 1, 9);
  for (int j = 0; j < 9; ++j) {
    const double w = j % 2 == 1 ? wc : 1.0;
    int i = 0;
    auto put = [&](const gp_Vec& v) {
      ++i;
      poles(i, j + 1) = gp_Pnt(v.XYZ());
      weights(i, j + 1) = w;
    };
    for (int k = 0; k < spans; ++k) {
      const auto& b = bez[k * 9 + j];
      if (k == 0) {
        put(b[0]);
        put(b[1]);
      }
      put(b[2]);
      put(b[3]);
      if (k == spans - 1) {
        put(b[4]);
        put(b[5]);
      } else if (c1_node[k + 1]) {
        put(b[4]);
        put(bez[(k + 1) * 9 + j][1]);
      } else {
        const auto& n = bez[(k + 1) * 9 + j];
        const double hl = nodes[k + 1] - nodes[k], hr = nodes[k + 2] - nodes[k + 1];
        const gp_Vec from_left = b[3] + (b[4] - b[3]) * ((hl + hr) / hl);
        const gp_Vec from_right = n[2] + (n[1] - n[2]) * ((hl + hr) / hr);
        put((from_left + from_right) * 0.5);
      }
    }
  }
  TColStd_Array1OfReal uk(1, spans + 1);
  TColStd_Array1OfInteger um(1, spans + 1);
  for (int k = 0; k <= spans; ++k) {
    uk(k + 1) = nodes[k];
    um(k + 1) = k == 0 || k == spans ? 6 : c1_node[k] ? 4 : 3;
  }
  TColStd_Array1OfReal vk(1, 5);
  TColStd_Array1OfInteger vm(1, 5);
  for (int i = 0; i < 5; ++i) {
    vk(i + 1) = i * pi / 2;
    vm(i + 1) = i == 0 || i == 4 ? 3 : 2;
  }
  Handle(Geom_BSplineSurface) S = new Geom_BSplineSurface(poles, weights, uk, vk, um, vm, 5, 2, false, false);
  return S;
}

// Where the seat plane z = seat cuts the lateral surface S near its end u_end: the 2D curve
// (u(v), v), parameter v over [v0, v1] (the half of the section beyond the plane), with
// u = u_end at both ends (the wire's end section is cut at its outer and inner points).
// Each point is solved on S itself (Newton on z(u, v) = seat), then interpolated with its
// tangent du/dv = −z_v/z_u.
Handle(Geom2d_BSplineCurve) seat_trim(const Handle(Geom_Surface)& S, double seat, double u_end, double v0,
                                      double v1) {
  constexpr int n = 64;
  Handle(TColgp_HArray1OfPnt2d) points = new TColgp_HArray1OfPnt2d(1, n + 1);
  Handle(TColStd_HArray1OfReal) params = new TColStd_HArray1OfReal(1, n + 1);
  Handle(TColStd_HArray1OfBoolean) flags = new TColStd_HArray1OfBoolean(1, n + 1);
  TColgp_Array1OfVec2d tangents(1, n + 1);
  double u = u_end;
  for (int k = 0; k <= n; ++k) {
    const double v = k == n ? v1 : v0 + (v1 - v0) * k / n;
    gp_Pnt P;
    gp_Vec Su, Sv;
    if (k == 0 || k == n) {
      u = u_end;
      S->D1(u, v, P, Su, Sv);
    } else {
      for (int i = 0; i < 50; ++i) {
        S->D1(u, v, P, Su, Sv);
        const double du = -(P.Z() - seat) / Su.Z();
        u += du;
        if (std::abs(du) < 1e-13) break;
      }
      S->D1(u, v, P, Su, Sv);
      if (std::abs(P.Z() - seat) > 1e-9) throw Standard_Failure("spring: the seat plane cut was not found");
    }
    points->SetValue(k + 1, gp_Pnt2d(u, v));
    params->SetValue(k + 1, v);
    tangents(k + 1) = gp_Vec2d(-Sv.Z() / Su.Z(), 1.0);
    flags->SetValue(k + 1, true);
  }
  Geom2dAPI_Interpolate ip(points, params, false, 1e-9);
  ip.Load(tangents, flags, false);
  ip.Perform();
  if (!ip.IsDone()) throw Standard_Failure("spring: the seat plane cut could not be interpolated");
  return ip.Curve();
}

// The solid, built face by face with shared edges (no Boolean, no sewing): one lateral face on
// the surface S of the whole wire (u = θ in [0, U], v round the wire; v = 0 and 2π: the seam on
// the coil's outside; its normal S_u × S_v points out of the wire) and flat faces at the ends.
// - Unground: the end faces are the wire's whole end discs, bounded by the circles u = 0, u = U.
// - Ground: the seat planes cut the lateral face along curves in its parameter plane (v in
//   [π, 2π] at the bottom, [0, π] at the top, the half of the section beyond the plane), and at
//   each end the flat ground crescent in the seat plane meets the remaining half of the end disc
//   along the chord where the seat plane halves it (the centreline ends in the seat plane).
// Each planar face has an outward normal and its boundary counter-clockwise about it, and each
// edge is used once in each direction: the shell is closed and oriented by construction.
TopoDS_Shape wire_solid(const Centreline& c) {
  const double U = c.end_angle(), L = c.length;
  constexpr double tol = 1e-7;
  const Handle(Geom_BSplineSurface) S = tube_surface(c, 0, U);
  BRep_Builder B;
  TopoDS_Face lateral;
  B.MakeFace(lateral, S, tol);

  const auto vertex = [&](double u, double v) {
    TopoDS_Vertex V;
    B.MakeVertex(V, S->Value(u, v), tol);
    return V;
  };
  const TopoDS_Vertex v0 = vertex(0, 0), v1 = vertex(0, pi), v2 = vertex(U, 0), v3 = vertex(U, pi);
  const auto ends = [&](TopoDS_Edge& E, const TopoDS_Vertex& a, const TopoDS_Vertex& b) {
    B.Add(E, a.Oriented(TopAbs_FORWARD));
    B.Add(E, b.Oriented(TopAbs_REVERSED));
  };
  const auto edge = [&](const Handle(Geom_Curve)& c3d, const TopoDS_Vertex& a, const TopoDS_Vertex& b) {
    TopoDS_Edge E;
    B.MakeEdge(E, c3d, tol);
    ends(E, a, b);
    return E;
  };
  // Iso lines of S: the seam along u (two pcurves), the end circles (or half circles) along v.
  TopoDS_Edge seam = edge(S->VIso(0), v0, v2);
  B.UpdateEdge(seam, new Geom2d_Line(gp_Pnt2d(0, 0), gp_Dir2d(1, 0)),
               new Geom2d_Line(gp_Pnt2d(0, 2 * pi), gp_Dir2d(1, 0)), lateral, tol);
  B.Range(seam, 0, U);
  const auto end_arc = [&](double u, const TopoDS_Vertex& a, const TopoDS_Vertex& b, double f, double l) {
    TopoDS_Edge E = edge(S->UIso(u), a, b);
    B.UpdateEdge(E, new Geom2d_Line(gp_Pnt2d(u, 0), gp_Dir2d(0, 1)), lateral, tol);
    B.Range(E, f, l);
    return E;
  };
  const auto wire = [&](std::initializer_list<TopoDS_Shape> edges) {
    TopoDS_Wire W;
    B.MakeWire(W);
    for (const TopoDS_Shape& e : edges) B.Add(W, e);
    W.Closed(true);
    return W;
  };
  const auto planar = [&](const gp_Ax3& axes, std::initializer_list<TopoDS_Shape> edges) {
    TopoDS_Face F;
    B.MakeFace(F, new Geom_Plane(axes), tol);
    B.Add(F, wire(edges));
    for (const TopoDS_Shape& e : edges) BRepLib::BuildPCurveForEdgeOnPlane(TopoDS::Edge(e), F);
    return F;
  };
  gp_Vec a0, b0, a1, b1, da, db;
  c.frame(0, a0, b0, da, db);
  c.frame(U, a1, b1, da, db);
  const gp_Ax3 bottom_disc(c.point(0), gp_Dir(-c.tangent(0)), gp_Dir(a0));
  const gp_Ax3 top_disc(c.point(U), gp_Dir(c.tangent(U)), gp_Dir(a1));
  std::vector<TopoDS_Face> faces{lateral};

  if (!c.ground) {
    const TopoDS_Edge circle_bottom = end_arc(0, v0, v0, 0, 2 * pi);
    const TopoDS_Edge circle_top = end_arc(U, v2, v2, 0, 2 * pi);
    B.Add(lateral, wire({seam, circle_top, seam.Reversed(), circle_bottom.Reversed()}));
    faces.push_back(planar(bottom_disc, {circle_bottom}));
    faces.push_back(planar(top_disc, {circle_top.Reversed()}));
  } else {
    const TopoDS_Edge arc_bottom = end_arc(0, v0, v1, 0, pi);
    const TopoDS_Edge arc_top = end_arc(U, v3, v2, pi, 2 * pi);
    // The seat cuts: pcurves on S, 3D curves built from them.
    const auto trim = [&](double seat, double u_end, const TopoDS_Vertex& a, const TopoDS_Vertex& b, double f,
                          double l) {
      TopoDS_Edge E;
      B.MakeEdge(E);
      ends(E, a, b);
      B.UpdateEdge(E, seat_trim(S, seat, u_end, f, l), lateral, tol);
      B.Range(E, f, l);
      if (!BRepLib::BuildCurves3d(E, tol)) throw Standard_Failure("spring: a seat cut edge could not be made");
      return E;
    };
    TopoDS_Edge trim_bottom = trim(0, 0, v1, v0, pi, 2 * pi);
    TopoDS_Edge trim_top = trim(L, U, v2, v3, 0, pi);
    // The chords where the seat planes halve the end discs (inner point to outer point).
    const auto chord = [&](const TopoDS_Vertex& a, const TopoDS_Vertex& b) {
      const Handle(Geom_TrimmedCurve) line = GC_MakeSegment(BRep_Tool::Pnt(a), BRep_Tool::Pnt(b)).Value();
      TopoDS_Edge E = edge(line, a, b);
      B.Range(E, line->FirstParameter(), line->LastParameter());
      return E;
    };
    const TopoDS_Edge chord_bottom = chord(v1, v0), chord_top = chord(v3, v2);
    B.Add(lateral, wire({seam, trim_top, arc_top, seam.Reversed(), trim_bottom.Reversed(), arc_bottom.Reversed()}));
    faces.push_back(planar(bottom_disc, {arc_bottom, chord_bottom}));
    faces.push_back(planar(gp_Ax3(gp_Pnt(0, 0, 0), gp_Dir(0, 0, -1), gp_Dir(1, 0, 0)),
                           {trim_bottom, chord_bottom.Reversed()}));
    faces.push_back(planar(top_disc, {arc_top.Reversed(), chord_top}));
    faces.push_back(planar(gp_Ax3(gp_Pnt(0, 0, L), gp_Dir(0, 0, 1), gp_Dir(1, 0, 0)),
                           {trim_top.Reversed(), chord_top.Reversed()}));
    // The seat cuts' 3D curves are approximations: let their tolerance cover the planes' pcurves.
    for (TopoDS_Edge* e : {&trim_bottom, &trim_top}) {
      B.SameParameter(*e, false);
      BRepLib::SameParameter(*e, tol);
    }
  }

  TopoDS_Shell shell;
  B.MakeShell(shell);
  for (const TopoDS_Face& f : faces) B.Add(shell, f);
  shell.Closed(true);
  TopoDS_Solid solid;
  B.MakeSolid(solid);
  B.Add(solid, shell);
  BRepLib::UpdateTolerances(solid);
  return solid;
}

}  // namespace

TopoDS_Shape make_spring(const SpringDims& s) {
  const Centreline c = plan(s);
  return wire_solid(c);
}

double spring_volume_estimate(const SpringDims& s) {
  const Centreline c = plan(s);
  const double end = c.end_angle();
  // Simpson's rule of f over [a, b] with n (even) intervals.
  const auto simpson = [](auto f, double a, double b, int n) {
    const double h = (b - a) / n;
    double sum = f(a) + f(b);
    for (int i = 1; i < n; ++i) sum += f(a + i * h) * (i % 2 == 1 ? 4 : 2);
    return sum * h / 3;
  };
  const int n = 2 * static_cast<int>(std::ceil(c.turns * 64));
  const double length = simpson([&](double th) { return c.metric(th); }, 0.0, end, n);
  double volume = length * pi * c.r * c.r;
  if (c.ground) {
    // Segment of the section beyond the plane at height dz above/below the centre, per unit
    // length of centreline: the plane meets the section (square to the wire) at h = dz/cos α.
    const auto removed = [&](double th, double dz) {
      const double h = std::max(0.0, dz) * c.metric(th) / c.R;
      if (h >= c.r) return 0.0;
      return (c.r * c.r * std::acos(h / c.r) - h * std::sqrt(c.r * c.r - h * h)) * c.metric(th);
    };
    const double span = 2 * pi * 0.75;  // the cut ends within 0.5 turn (pitch > d)
    volume -= simpson([&](double th) { return removed(th, c.z(th / (2 * pi))); }, 0.0, span, 20000);
    volume -= simpson([&](double th) { return removed(th, c.length - c.z(th / (2 * pi))); }, end - span, end,
                      20000);
  }
  return volume;
}

}  // namespace bandforge::geom
