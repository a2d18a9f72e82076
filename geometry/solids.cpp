#include "geometry/solids.hpp"

#include <algorithm>
#include <cmath>
#include <numbers>

#include <BRepBuilderAPI_MakeEdge.hxx>
#include <BRepBuilderAPI_MakeFace.hxx>
#include <BRepBuilderAPI_MakeWire.hxx>
#include <BRepAlgoAPI_Cut.hxx>
#include <BRepAlgoAPI_Fuse.hxx>
#include <BRepPrimAPI_MakeCylinder.hxx>
#include <BRepPrimAPI_MakePrism.hxx>
#include <BRepPrimAPI_MakeRevol.hxx>
#include <GC_MakeArcOfCircle.hxx>
#include <GC_MakeSegment.hxx>
#include <Standard_Failure.hxx>
#include <TopoDS.hxx>
#include <TopoDS_Face.hxx>
#include <TopoDS_Wire.hxx>
#include <gp_Ax1.hxx>
#include <gp_Ax2.hxx>
#include <gp_Circ.hxx>
#include <gp_Pln.hxx>
#include <gp_Pnt.hxx>
#include <gp_Vec.hxx>

namespace bandforge::geom {
namespace {

constexpr double pi = std::numbers::pi;

Vec2 at(Vec2 c, double radius, double angle) {
  return {c.x + radius * std::cos(angle), c.y + radius * std::sin(angle)};
}
Vec2 add(Vec2 p, Vec2 d, double k) { return {p.x + k * d.x, p.y + k * d.y}; }

// A closed planar wire in the plane z = z0, made of lines and three-point arcs. Every joint is
// the same point for both edges, so the wire closes exactly.
class Profile {
 public:
  explicit Profile(double z0) : z_(z0) {}
  void line(Vec2 p, Vec2 q) {
    wire_.Add(BRepBuilderAPI_MakeEdge(GC_MakeSegment(pnt(p), pnt(q)).Value()).Edge());
  }
  void arc(Vec2 p, Vec2 mid, Vec2 q) {
    wire_.Add(BRepBuilderAPI_MakeEdge(GC_MakeArcOfCircle(pnt(p), pnt(mid), pnt(q)).Value()).Edge());
  }
  TopoDS_Wire wire() { return wire_.Wire(); }

 private:
  gp_Pnt pnt(Vec2 p) const { return gp_Pnt(p.x, p.y, z_); }
  double z_;
  BRepBuilderAPI_MakeWire wire_;
};

// A full circle wire in the plane z = z0, clockwise seen from +z: the orientation of a hole in a
// face whose outer wire runs counter-clockwise.
TopoDS_Wire hole_wire(Vec2 c, double radius, double z0) {
  gp_Circ circ(gp_Ax2(gp_Pnt(c.x, c.y, z0), gp_Dir(0, 0, 1)), radius);
  TopoDS_Wire w = BRepBuilderAPI_MakeWire(BRepBuilderAPI_MakeEdge(circ).Edge()).Wire();
  return TopoDS::Wire(w.Reversed());
}

// Outer wire counter-clockwise seen from +z, holes clockwise, extruded along +z.
TopoDS_Shape extrude(const TopoDS_Wire& outer, const std::vector<TopoDS_Wire>& holes, double z0,
                     double height) {
  // On an explicit +z plane, so that the wire orientations above mean outer and hole.
  BRepBuilderAPI_MakeFace mf(gp_Pln(gp_Pnt(0, 0, z0), gp_Dir(0, 0, 1)), outer, true);
  for (const TopoDS_Wire& h : holes) mf.Add(h);
  if (!mf.IsDone()) throw Standard_Failure("the planar profile does not close");
  return BRepPrimAPI_MakePrism(mf.Face(), gp_Vec(0, 0, height)).Shape();
}

double cross(Vec2 o, Vec2 a, Vec2 b) { return (a.x - o.x) * (b.y - o.y) - (a.y - o.y) * (b.x - o.x); }

// Andrew's monotone chain; counter-clockwise, collinear points dropped.
std::vector<Vec2> convex_hull(std::vector<Vec2> pts) {
  std::sort(pts.begin(), pts.end(),
            [](Vec2 p, Vec2 q) { return p.x < q.x || (p.x == q.x && p.y < q.y); });
  if (pts.size() < 3) return pts;
  std::vector<Vec2> h(2 * pts.size());
  std::size_t k = 0;
  // Points closer than this to a hull edge count as collinear (mm²·scale, relative).
  auto turns_left = [](Vec2 o, Vec2 a, Vec2 b) {
    const double scale = std::hypot(a.x - o.x, a.y - o.y) * std::hypot(b.x - o.x, b.y - o.y);
    return cross(o, a, b) > 1e-12 * scale;
  };
  for (std::size_t i = 0; i < pts.size(); ++i) {
    while (k >= 2 && !turns_left(h[k - 2], h[k - 1], pts[i])) --k;
    h[k++] = pts[i];
  }
  for (std::size_t i = pts.size() - 1, t = k + 1; i > 0; --i) {
    while (k >= t && !turns_left(h[k - 2], h[k - 1], pts[i - 1])) --k;
    h[k++] = pts[i - 1];
  }
  h.resize(k - 1);
  return h;
}

}  // namespace

TopoDS_Shape make_drum(const DrumDims& d) {
  // Half-section in the xz plane (x = radius), revolved about z.
  const double r = d.diameter / 2, ri = r - d.rim_thickness, rh = d.hub_diameter / 2,
               rb = d.bore / 2, w = d.width / 2, web = d.web_thickness / 2, hub = d.hub_length / 2;
  const double m = w;  // mid-plane
  const gp_Pnt pts[] = {{rb, 0, m - hub}, {rh, 0, m - hub}, {rh, 0, m - web}, {ri, 0, m - web},
                        {ri, 0, m - w},   {r, 0, m - w},    {r, 0, m + w},     {ri, 0, m + w},
                        {ri, 0, m + web}, {rh, 0, m + web}, {rh, 0, m + hub},  {rb, 0, m + hub}};
  BRepBuilderAPI_MakeWire mw;
  const std::size_t n = std::size(pts);
  for (std::size_t i = 0; i < n; ++i) {
    mw.Add(BRepBuilderAPI_MakeEdge(pts[i], pts[(i + 1) % n]).Edge());
  }
  const TopoDS_Face face = BRepBuilderAPI_MakeFace(mw.Wire(), true).Face();
  return BRepPrimAPI_MakeRevol(face, gp_Ax1(gp_Pnt(0, 0, 0), gp_Dir(0, 0, 1)), 2 * pi).Shape();
}

TopoDS_Shape make_arc_segment(double r_in, double r_out, double start, int sense, double sweep,
                              double z0, double width) {
  const Vec2 o{0, 0};
  const double end = start + sense * sweep, mid = start + sense * sweep / 2;
  Profile p(z0);
  p.arc(at(o, r_in, start), at(o, r_in, mid), at(o, r_in, end));
  p.line(at(o, r_in, end), at(o, r_out, end));
  p.arc(at(o, r_out, end), at(o, r_out, mid), at(o, r_out, start));
  p.line(at(o, r_out, start), at(o, r_in, start));
  TopoDS_Wire w = p.wire();
  // Running CCW along the inner arc leaves the sector on the right: reverse to make it CCW.
  if (sense > 0) w.Reverse();
  return extrude(w, {}, z0, width);
}

TopoDS_Shape make_band(const BandPath& p) {
  const double h = p.thickness / 2;
  const double eye_outer = p.eye_inner + p.thickness;
  // Where the strip's offset lines (±h from the run) meet the eye's outer circle.
  const double x0 = std::sqrt(eye_outer * eye_outer - h * h);
  // A riveted lap's tail (BandEndPath::lap) lies on the run's outside face, the face at +h
  // along `radial`, away from the drum centre: the band blank's "tail laid back on the run
  // outside" (geometry/flat_band.cpp), so that the lap is 2t thick there and the drum side of
  // the run stays flat. The eye is the ring round the pin (not the teardrop a real eye makes);
  // the tail meets the ring's outer circle at offset 3h and runs to ρ + lap from the pin, where
  // the blank's free end lands. One profile, no boolean: run, eye and tail are one face.
  struct EndPoints {
    Vec2 e_out, e_in, t_out, t_in, far;
    bool tail = false;
    Vec2 tail_eye, tail_top, tail_foot;  // ring at 3h, tail end at 3h and at h
  };
  auto end_points = [&](const BandEndPath& e) {
    const Vec2 radial{std::cos(e.tangent_angle), std::sin(e.tangent_angle)};
    const double len = std::hypot(e.tangent_point.x - e.pin.x, e.tangent_point.y - e.pin.y);
    const Vec2 u{(e.tangent_point.x - e.pin.x) / len, (e.tangent_point.y - e.pin.y) / len};
    EndPoints q;
    q.e_out = add(add(e.pin, u, x0), radial, h);
    q.e_in = add(add(e.pin, u, x0), radial, -h);
    q.t_out = add(e.tangent_point, radial, h);
    q.t_in = add(e.tangent_point, radial, -h);
    q.far = add(e.pin, u, -eye_outer);
    if (!e.eye) {  // a straight end across the strip
      q.e_out = add(add(e.pin, u, e.cut), radial, h);
      q.e_in = add(add(e.pin, u, e.cut), radial, -h);
    } else if (e.lap > 0) {
      // The tail ends at the tangent point at most (the plan's lap ≤ run − ρ).
      const double end = std::min(p.eye_inner + h + e.lap, len);
      q.tail = true;
      q.tail_eye = add(add(e.pin, u, std::sqrt(eye_outer * eye_outer - 9 * h * h)), radial, 3 * h);
      q.tail_top = add(add(e.pin, u, end), radial, 3 * h);
      q.tail_foot = add(add(e.pin, u, end), radial, h);
      if (len - end < 1e-6) q.tail_foot = q.t_out;
    }
    return q;
  };
  const EndPoints a = end_points(p.a), b = end_points(p.b);
  const double mid = p.a.tangent_angle + p.sense * p.wrap / 2;
  const double z0 = 0;
  Profile w(z0);
  if (a.tail) {  // the eye's arc ended at the tail's outer face
    w.line(a.tail_eye, a.tail_top);
    w.line(a.tail_top, a.tail_foot);
    if (a.tail_foot.x != a.t_out.x || a.tail_foot.y != a.t_out.y) w.line(a.tail_foot, a.t_out);
  } else {
    w.line(a.e_out, a.t_out);
  }
  w.arc(a.t_out, at({0, 0}, p.r_band + h, mid), b.t_out);
  if (b.tail) {
    if (b.tail_foot.x != b.t_out.x || b.tail_foot.y != b.t_out.y) w.line(b.t_out, b.tail_foot);
    w.line(b.tail_foot, b.tail_top);
    w.line(b.tail_top, b.tail_eye);
    w.arc(b.tail_eye, b.far, b.e_in);
  } else if (p.b.eye) {
    w.line(b.t_out, b.e_out);
    w.arc(b.e_out, b.far, b.e_in);
  } else {
    w.line(b.t_out, b.e_out);
    w.line(b.e_out, b.e_in);
  }
  w.line(b.e_in, b.t_in);
  w.arc(b.t_in, at({0, 0}, p.r_band - h, mid), a.t_in);
  w.line(a.t_in, a.e_in);
  if (a.tail) {
    w.arc(a.e_in, a.far, a.tail_eye);
  } else if (p.a.eye) {
    w.arc(a.e_in, a.far, a.e_out);
  } else {
    w.line(a.e_in, a.e_out);
  }
  TopoDS_Wire outer = w.wire();
  // The band lies left of its outer arc when that arc runs CCW (sense +1).
  if (p.sense < 0) outer.Reverse();
  std::vector<TopoDS_Wire> holes;
  if (p.a.eye) holes.push_back(hole_wire(p.a.pin, p.eye_inner, z0));
  if (p.b.eye) holes.push_back(hole_wire(p.b.pin, p.eye_inner, z0));
  return extrude(outer, holes, z0, p.width);
}

TopoDS_Shape make_end_block(const BlockDims& d) {
  const double h = d.height / 2, s = d.slot_width / 2, x_slot = -d.back + d.slot_depth;
  Profile w(0);
  const Vec2 pts[] = {{d.front, -h}, {d.front, h},    {-d.back, h}, {-d.back, s},
                      {x_slot, s},   {x_slot, -s},    {-d.back, -s}, {-d.back, -h}};
  const std::size_t n = std::size(pts);
  for (std::size_t i = 0; i < n; ++i) w.line(pts[i], pts[(i + 1) % n]);
  return extrude(w.wire(), {hole_wire({0, 0}, d.bore, 0)}, 0, d.width);
}

TopoDS_Shape make_plate(const std::vector<Vec2>& centres, double radius,
                        const std::vector<Vec2>& holes, double hole_radius, double z0,
                        double thickness) {
  const std::vector<Vec2> hull = convex_hull(centres);
  const std::size_t n = hull.size();
  if (n < 2) throw Standard_Failure("a plate needs two distinct points");
  // Outward normal of each hull edge (right of a CCW edge); consecutive edge offsets are joined
  // by arcs about the hull vertex between them.
  std::vector<double> normal_angle(n);
  for (std::size_t i = 0; i < n; ++i) {
    const Vec2 p = hull[i], q = hull[(i + 1) % n];
    normal_angle[i] = std::atan2(-(q.x - p.x), q.y - p.y);
  }
  Profile w(z0);
  for (std::size_t i = 0; i < n; ++i) {
    const std::size_t j = (i + 1) % n;
    const Vec2 p = hull[i], q = hull[j];
    w.line(at(p, radius, normal_angle[i]), at(q, radius, normal_angle[i]));
    double turn = std::fmod(normal_angle[j] - normal_angle[i], 2 * pi);
    if (turn <= 0) turn += 2 * pi;
    w.arc(at(q, radius, normal_angle[i]), at(q, radius, normal_angle[i] + turn / 2),
          at(q, radius, normal_angle[j]));
  }
  std::vector<TopoDS_Wire> hole_wires;
  for (Vec2 c : holes) hole_wires.push_back(hole_wire(c, hole_radius, z0));
  return extrude(w.wire(), hole_wires, z0, thickness);
}

TopoDS_Shape make_rod(double radius, double z0, double length) {
  return BRepPrimAPI_MakeCylinder(gp_Ax2(gp_Pnt(0, 0, z0), gp_Dir(0, 0, 1)), radius, length)
      .Shape();
}

namespace {

// A solid of revolution about z from a closed polygon in the xz plane (x = radius).
TopoDS_Shape revolve(const std::vector<gp_Pnt>& pts) {
  BRepBuilderAPI_MakeWire mw;
  for (std::size_t i = 0; i < pts.size(); ++i) {
    mw.Add(BRepBuilderAPI_MakeEdge(pts[i], pts[(i + 1) % pts.size()]).Edge());
  }
  const TopoDS_Face face = BRepBuilderAPI_MakeFace(mw.Wire(), true).Face();
  return BRepPrimAPI_MakeRevol(face, gp_Ax1(gp_Pnt(0, 0, 0), gp_Dir(0, 0, 1)), 2 * pi).Shape();
}

}  // namespace

TopoDS_Shape make_clevis_pin(const ClevisPinDims& d, bool with_hole) {
  const double r = d.d / 2, rk = d.dk / 2;
  const TopoDS_Shape body = revolve({{0, 0, -d.k}, {rk, 0, -d.k}, {rk, 0, 0}, {r, 0, 0},
                                     {r, 0, d.length}, {0, 0, d.length}});
  if (!with_hole) return body;
  const double over = r + 1;  // the hole's cylinder reaches past the shank on both sides
  const TopoDS_Shape hole =
      BRepPrimAPI_MakeCylinder(gp_Ax2(gp_Pnt(-over, 0, d.hole_at), gp_Dir(1, 0, 0)), d.d1 / 2, 2 * over)
          .Shape();
  BRepAlgoAPI_Cut cut(body, hole);
  if (!cut.IsDone()) throw Standard_Failure("the split-pin hole could not be cut");
  return cut.Shape();
}

AxialMass clevis_pin_mass(const ClevisPinDims& d) {
  const double r = d.d / 2, rk = d.dk / 2, a = d.d1 / 2;
  const double head = pi * rk * rk * d.k, shank = pi * r * r * d.length;
  // Simpson's rule over φ in [−π/2, π/2], y = a·sin φ, dy = a·cos φ dφ.
  const int n = 512;
  const double h = pi / n;
  double sum = 0;
  for (int i = 0; i <= n; ++i) {
    const double phi = -pi / 2 + i * h, c = std::cos(phi), s = std::sin(phi);
    const double f = 4 * a * a * c * c * std::sqrt(std::max(0.0, r * r - a * a * s * s));
    sum += f * (i == 0 || i == n ? 1 : i % 2 ? 4 : 2);
  }
  const double hole = sum * h / 3;
  AxialMass m;
  m.volume = head + shank - hole;
  m.z = (head * (-d.k / 2) + shank * (d.length / 2) - hole * d.hole_at) / m.volume;
  return m;
}

TopoDS_Shape make_rivet(const RivetDims& d) {
  // Half-section in the xz plane (x = radius), revolved about z: each head a spherical cap of
  // base radius a = d_k/2 and height k, sphere radius (a² + k²)/(2k).
  const double r = d.d / 2, a = d.dk / 2;
  auto cap_mid = [&](double k, double base_z, double sign) {
    // The cap's point at radius a/2, between its rim (a, base_z) and apex (0, base_z + sign·k).
    const double R = (a * a + k * k) / (2 * k), x = a / 2;
    return gp_Pnt(x, 0, base_z + sign * (std::sqrt(R * R - x * x) - (R - k)));
  };
  auto seg = [](gp_Pnt p, gp_Pnt q) { return BRepBuilderAPI_MakeEdge(p, q).Edge(); };
  auto arc = [](gp_Pnt p, gp_Pnt m, gp_Pnt q) {
    return BRepBuilderAPI_MakeEdge(GC_MakeArcOfCircle(p, m, q).Value()).Edge();
  };
  BRepBuilderAPI_MakeWire mw;
  const gp_Pnt apex(0, 0, -d.k), rim(a, 0, 0);
  mw.Add(arc(apex, cap_mid(d.k, 0, -1), rim));
  mw.Add(seg(rim, gp_Pnt(r, 0, 0)));
  mw.Add(seg(gp_Pnt(r, 0, 0), gp_Pnt(r, 0, d.clamp)));
  gp_Pnt end(0, 0, d.clamp);
  if (d.closing > 0) {
    end = gp_Pnt(0, 0, d.clamp + d.closing);
    mw.Add(seg(gp_Pnt(r, 0, d.clamp), gp_Pnt(a, 0, d.clamp)));
    mw.Add(arc(gp_Pnt(a, 0, d.clamp), cap_mid(d.closing, d.clamp, 1), end));
  } else {
    mw.Add(seg(gp_Pnt(r, 0, d.clamp), end));
  }
  mw.Add(seg(end, apex));
  const TopoDS_Face face = BRepBuilderAPI_MakeFace(mw.Wire(), true).Face();
  return BRepPrimAPI_MakeRevol(face, gp_Ax1(gp_Pnt(0, 0, 0), gp_Dir(0, 0, 1)), 2 * pi).Shape();
}

TopoDS_Shape make_ring(double inner_diameter, double outer_diameter, double z0, double height) {
  const double ri = inner_diameter / 2, ro = outer_diameter / 2;
  return revolve({{ri, 0, z0}, {ro, 0, z0}, {ro, 0, z0 + height}, {ri, 0, z0 + height}});
}

TopoDS_Shape make_split_pin(double pin_diameter, double leg_diameter, double eye_width, bool with_legs) {
  // One flat outline in the plane z = 0, extruded across it: the legs a bar from beyond the pin's
  // far side into the eye, the eye a disc of its width beside the pin on +x. A bar 0.7 d thick
  // and wide passes the round hole (its diagonal 0.99 d is below d ≤ d₁). No boolean: a fused
  // cylinder and disc cost the build a boolean and the drawing its intersection curves.
  const double r = pin_diameter / 2, h = 0.35 * leg_diameter;
  const double re = eye_width / 2, xc = r + re;
  const double from = with_legs ? -r - leg_diameter : r;
  const double xi = xc - std::sqrt(re * re - h * h);  // where the bar's sides meet the eye
  Profile p(-h);
  p.line({from, -h}, {xi, -h});
  p.arc({xi, -h}, {xc + re, 0}, {xi, h});
  p.line({xi, h}, {from, h});
  p.line({from, h}, {from, -h});
  return extrude(p.wire(), {}, -h, 2 * h);
}

}  // namespace bandforge::geom
