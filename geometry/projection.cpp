#include "geometry/projection.hpp"

#include <BRepAdaptor_Curve.hxx>
#include <BRepLib.hxx>
#include <BRep_Builder.hxx>
#include <GCPnts_TangentialDeflection.hxx>
#include <HLRAlgo_Projector.hxx>
#include <HLRBRep_Algo.hxx>
#include <HLRBRep_HLRToShape.hxx>
#include <Standard_Failure.hxx>
#include <TopExp_Explorer.hxx>
#include <TopLoc_Location.hxx>
#include <TopoDS.hxx>
#include <TopoDS_Compound.hxx>
#include <TopoDS_Edge.hxx>
#include <gp_Ax2.hxx>
#include <gp_Circ.hxx>

#include <algorithm>
#include <chrono>
#include <cmath>
#include <limits>
#include <numbers>

#include "geometry/occt_model.hpp"
#include "src/errors.hpp"

// Cuts for section views (ProjectOptions::cut), defined at the end of this file.
#include <BRepAdaptor_Surface.hxx>
#include <BRepAlgoAPI_Cut.hxx>
#include <BRepBndLib.hxx>
#include <BRepPrimAPI_MakeBox.hxx>
#include <BRepTools_WireExplorer.hxx>
#include <gp_Pln.hxx>
#include <Bnd_Box.hxx>
#include <TopoDS_Face.hxx>
#include <TopoDS_Wire.hxx>

namespace bandforge::geom {

namespace {
TopoDS_Shape cut_for_section(const TopoDS_Shape& shape, const ViewSpec& view, Vec3 point,
                             const std::string& instance, const std::string& kind,
                             std::vector<SectionFace>& faces);
}  // namespace

ViewSpec front_view() { return {{0, 0, 1}, {1, 0, 0}, "front view"}; }
ViewSpec left_view() { return {{-1, 0, 0}, {0, 0, 1}, "view from the left"}; }
ViewSpec top_view() { return {{0, 1, 0}, {1, 0, 0}, "view from above"}; }
// right = y × toward_viewer, normalised: (1, 0, −1)/√2; up = toward_viewer × right = (−1, 2, −1)/√6.
ViewSpec isometric_view() {
  const double d = 1 / std::sqrt(3.0), r = 1 / std::sqrt(2.0);
  return {{d, d, d}, {r, 0, -r}, "isometric view"};
}

namespace {

constexpr double kTol = 1e-4;  // mm: deviation below which a sampled curve is a line or an arc

Point2 p2(const gp_Pnt& p) { return {p.X(), p.Y()}; }

double dist(Point2 a, Point2 b) { return std::hypot(a.x - b.x, a.y - b.y); }

// Circle through three points; false when they are (nearly) collinear.
bool circle_through(Point2 a, Point2 b, Point2 c, Point2& centre, double& r) {
  const double d = 2 * (a.x * (b.y - c.y) + b.x * (c.y - a.y) + c.x * (a.y - b.y));
  if (std::abs(d) < 1e-12) return false;
  const double a2 = a.x * a.x + a.y * a.y, b2 = b.x * b.x + b.y * b.y, c2 = c.x * c.x + c.y * c.y;
  centre = {(a2 * (b.y - c.y) + b2 * (c.y - a.y) + c2 * (a.y - b.y)) / d,
            (a2 * (c.x - b.x) + b2 * (a.x - c.x) + c2 * (b.x - a.x)) / d};
  r = dist(centre, a);
  return true;
}

double polar(Point2 c, Point2 p) { return std::atan2(p.y - c.y, p.x - c.x); }

// Counter-clockwise sweep from angle a to angle b in (0, 2π].
double ccw_sweep(double a, double b) {
  double s = std::fmod(b - a, 2 * std::numbers::pi);
  if (s <= 1e-12) s += 2 * std::numbers::pi;
  return s;
}

ViewEdge make_line(Point2 a, Point2 b) {
  ViewEdge e;
  e.kind = ViewEdge::Kind::line;
  e.a = a;
  e.b = b;
  return e;
}

// An arc that passes through `mid` between its ends a and b.
ViewEdge make_arc(Point2 c, double r, Point2 a, Point2 b, Point2 mid, bool closed) {
  ViewEdge e;
  e.kind = ViewEdge::Kind::arc;
  e.centre = c;
  e.radius = r;
  if (closed) {
    e.start = polar(c, a);
    e.sweep = 2 * std::numbers::pi;
    e.a = e.b = a;
    return e;
  }
  const double ta = polar(c, a), tb = polar(c, b), tm = polar(c, mid);
  // Run counter-clockwise from whichever end makes the arc pass through the middle point.
  if (ccw_sweep(ta, tm) < ccw_sweep(ta, tb)) {
    e.start = ta;
    e.sweep = ccw_sweep(ta, tb);
    e.a = a;
    e.b = b;
  } else {
    e.start = tb;
    e.sweep = ccw_sweep(tb, ta);
    e.a = b;
    e.b = a;
  }
  return e;
}

// One HLR result edge → a true line, a true arc, or a polyline for anything else (ellipses of
// circles seen obliquely). HLR sometimes returns a circle or a line as a B-spline: samples
// decide.
void convert_edge(const TopoDS_Edge& edge, bool visible, bool smooth, std::vector<ViewEdge>& out) {
  BRepAdaptor_Curve c(edge);
  const double u0 = c.FirstParameter(), u1 = c.LastParameter();
  const Point2 a = p2(c.Value(u0)), b = p2(c.Value(u1));
  const Point2 mid = p2(c.Value((u0 + u1) / 2));
  ViewEdge e;
  bool done = false;
  if (c.GetType() == GeomAbs_Line) {
    if (dist(a, b) < kTol) return;
    e = make_line(a, b);
    done = true;
  } else if (c.GetType() == GeomAbs_Circle) {
    const gp_Circ circ = c.Circle();
    const bool closed = dist(a, b) < kTol && std::abs(u1 - u0) > std::numbers::pi;
    e = make_arc(p2(circ.Location()), circ.Radius(), a, b, mid, closed);
    done = true;
  }
  if (!done) {
    std::vector<Point2> pts;
    GCPnts_TangentialDeflection sampler(c, 0.05, 0.02);
    for (int i = 1; i <= sampler.NbPoints(); ++i) pts.push_back(p2(sampler.Value(i)));
    if (pts.size() < 2) return;
    const double size = std::max(dist(pts.front(), pts.back()), dist(pts.front(), mid));
    if (size < kTol) return;
    // A line?
    const Point2 f = pts.front(), l = pts.back();
    const double len = dist(f, l);
    double dev = 0;
    if (len > kTol) {
      for (Point2 p : pts) {
        dev = std::max(dev, std::abs((l.x - f.x) * (p.y - f.y) - (l.y - f.y) * (p.x - f.x)) / len);
      }
    }
    if (len > kTol && dev < kTol * std::max(1.0, len / 100)) {
      e = make_line(f, l);
    } else {
      Point2 centre;
      double r = 0;
      bool arc = circle_through(f, mid, l, centre, r) && r < 1e5;
      if (arc) {
        for (Point2 p : pts) arc = arc && std::abs(dist(centre, p) - r) < kTol * std::max(1.0, r / 100);
      }
      if (arc) {
        e = make_arc(centre, r, f, l, mid, len < kTol);
      } else {
        e.kind = ViewEdge::Kind::polyline;
        e.points = std::move(pts);
        e.a = e.points.front();
        e.b = e.points.back();
      }
    }
  }
  e.visible = visible;
  e.smooth = smooth;
  out.push_back(std::move(e));
}

void convert_all(const TopoDS_Shape& s, bool visible, bool smooth, std::vector<ViewEdge>& out) {
  if (s.IsNull()) return;  // an empty class comes back as a null shape
  TopoDS_Shape shape = s;
  BRepLib::BuildCurves3d(shape);
  for (TopExp_Explorer ex(shape, TopAbs_EDGE); ex.More(); ex.Next()) {
    convert_edge(TopoDS::Edge(ex.Current()), visible, smooth, out);
  }
}

void extend(ProjectedView& v, Point2 p) {
  v.min.x = std::min(v.min.x, p.x);
  v.min.y = std::min(v.min.y, p.y);
  v.max.x = std::max(v.max.x, p.x);
  v.max.y = std::max(v.max.y, p.y);
}

void bound(ProjectedView& v) {
  constexpr double inf = std::numeric_limits<double>::infinity();
  v.min = {inf, inf};
  v.max = {-inf, -inf};
  for (const ViewEdge& e : v.edges) {
    switch (e.kind) {
      case ViewEdge::Kind::line:
        extend(v, e.a);
        extend(v, e.b);
        break;
      case ViewEdge::Kind::arc: {
        extend(v, e.a);
        extend(v, e.b);
        // Add the quadrant points the arc passes.
        for (int q = 0; q < 4; ++q) {
          const double t = q * std::numbers::pi / 2;
          if (ccw_sweep(e.start, t) <= e.sweep + 1e-12) {
            extend(v, {e.centre.x + e.radius * std::cos(t), e.centre.y + e.radius * std::sin(t)});
          }
        }
        break;
      }
      case ViewEdge::Kind::polyline:
        for (Point2 p : e.points) extend(v, p);
        break;
    }
  }
  if (v.edges.empty()) v.min = v.max = {0, 0};
}

}  // namespace

std::vector<std::string> part_kinds(const BrakeModel& model) {
  std::vector<std::string> kinds;
  for (const auto& part : model.impl().parts) kinds.push_back(to_string(part.kind));
  return kinds;
}

ProjectedView project(const BrakeModel& model, const ViewSpec& view, const ProjectOptions& options) {
  const auto t0 = std::chrono::steady_clock::now();
  const BrakeModel::Impl& m = model.impl();
  ProjectedView out;
  try {
    // One compound rather than one Add() per solid: the same visible and hidden edges (checked
    // by total length on the example) in less than half the time, since the algorithm then
    // does not hide each shape against every other one separately.
    TopoDS_Compound all;
    BRep_Builder builder;
    builder.MakeCompound(all);
    int added = 0;
    for (const auto& placed : m.placed()) {
      const TopoDS_Shape& display = m.parts.at(placed.part).display;
      const TopoDS_Shape shown =
          display.IsNull() ? placed.shape : display.Moved(TopLoc_Location(m.instances.at(placed.instance).placement));
      const std::string kind = to_string(m.parts.at(placed.part).kind);
      if (!options.kinds.empty() &&
          std::find(options.kinds.begin(), options.kinds.end(), kind) == options.kinds.end()) {
        continue;
      }
      if (!options.instances.empty() &&
          std::find(options.instances.begin(), options.instances.end(), m.instances.at(placed.instance).name) ==
              options.instances.end()) {
        continue;
      }
      if (options.cut) {
        const TopoDS_Shape kept = cut_for_section(shown, view, options.cut_point,
                                                  m.instances.at(placed.instance).name, kind, out.sections);
        if (kept.IsNull()) continue;
        builder.Add(all, kept);
      } else {
        builder.Add(all, shown);
      }
      ++added;
    }
    if (added == 0) return out;
    Handle(HLRBRep_Algo) algo = new HLRBRep_Algo();
    algo->Add(all);
    const gp_Ax2 axes(gp_Pnt(0, 0, 0),
                      gp_Dir(view.toward_viewer.x, view.toward_viewer.y, view.toward_viewer.z),
                      gp_Dir(view.right.x, view.right.y, view.right.z));
    algo->Projector(HLRAlgo_Projector(axes));
    algo->Update();
    algo->Hide();
    HLRBRep_HLRToShape shapes(algo);
    // Hidden first: the drawing strokes them first so that visible lines sit on top.
    if (options.hidden) {
      convert_all(shapes.HCompound(), false, false, out.edges);
      convert_all(shapes.OutLineHCompound(), false, false, out.edges);
    }
    if (options.smooth) convert_all(shapes.Rg1LineVCompound(), true, true, out.edges);
    convert_all(shapes.VCompound(), true, false, out.edges);
    convert_all(shapes.OutLineVCompound(), true, false, out.edges);
    // RgNLine (seams) are never drawn.
  } catch (const Standard_Failure& f) {
    throw BuildError("drawing: hidden-line removal failed for the " + view.name + ": " +
                     (f.GetMessageString() ? f.GetMessageString() : "OpenCASCADE error"));
  }
  bound(out);
  out.milliseconds =
      std::chrono::duration<double, std::milli>(std::chrono::steady_clock::now() - t0).count();
  return out;
}

// ---- cuts for section views (ProjectOptions::cut) -------------------------------------------

namespace {

// The solid less a box that fills the viewer's side of the plane; the faces of the result that
// lie in the plane are the section, returned as loops in view coordinates (the same projection
// as the hidden-line removal: x along `right`, y along toward_viewer × right, origin at 0).
TopoDS_Shape cut_for_section(const TopoDS_Shape& shape, const ViewSpec& view, Vec3 point,
                             const std::string& instance, const std::string& kind,
                             std::vector<SectionFace>& faces) {
  const gp_Dir n(view.toward_viewer.x, view.toward_viewer.y, view.toward_viewer.z);
  const gp_Dir right(view.right.x, view.right.y, view.right.z);
  const gp_Dir up = n.Crossed(right);
  const gp_Pnt p0(point.x, point.y, point.z);
  Bnd_Box bb;
  BRepBndLib::Add(shape, bb);
  if (bb.IsVoid()) return {};
  double x0, y0, z0, x1, y1, z1;
  bb.Get(x0, y0, z0, x1, y1, z1);
  // Large enough to cover the solid wherever the plane passes.
  const double size = 2 * (std::hypot(x1 - x0, y1 - y0, z1 - z0) + p0.Distance(gp_Pnt(x0, y0, z0))) + 10;
  const gp_Pnt corner = p0.Translated(gp_Vec(right) * (-size / 2)).Translated(gp_Vec(up) * (-size / 2));
  const TopoDS_Shape box = BRepPrimAPI_MakeBox(gp_Ax2(corner, n, right), size, size, size).Shape();
  BRepAlgoAPI_Cut cut(shape, box);
  if (!cut.IsDone()) throw Standard_Failure("the section cut failed");
  const TopoDS_Shape kept = cut.Shape();
  if (kept.IsNull()) return {};
  TopExp_Explorer solids(kept, TopAbs_SOLID);
  if (!solids.More()) return {};
  auto to2 = [&](const gp_Pnt& p) {
    const gp_Vec v(p.XYZ());
    return Point2{v.Dot(gp_Vec(right)), v.Dot(gp_Vec(up))};
  };
  SectionFace face_out;
  face_out.instance = instance;
  face_out.kind = kind;
  for (TopExp_Explorer fx(kept, TopAbs_FACE); fx.More(); fx.Next()) {
    const TopoDS_Face f = TopoDS::Face(fx.Current());
    BRepAdaptor_Surface surf(f);
    if (surf.GetType() != GeomAbs_Plane) continue;
    const gp_Pln pln = surf.Plane();
    if (!pln.Axis().Direction().IsParallel(n, 1e-9) || pln.Distance(p0) > 1e-6) continue;
    for (TopExp_Explorer wx(f, TopAbs_WIRE); wx.More(); wx.Next()) {
      std::vector<Point2> loop;
      for (BRepTools_WireExplorer ex(TopoDS::Wire(wx.Current()), f); ex.More(); ex.Next()) {
        BRepAdaptor_Curve c(ex.Current());
        std::vector<gp_Pnt> pts;
        if (c.GetType() == GeomAbs_Line) {
          pts = {c.Value(c.FirstParameter()), c.Value(c.LastParameter())};
        } else {
          GCPnts_TangentialDeflection sampler(c, 0.05, 0.02);
          for (int i = 1; i <= sampler.NbPoints(); ++i) pts.push_back(sampler.Value(i));
        }
        if (ex.Orientation() == TopAbs_REVERSED) std::reverse(pts.begin(), pts.end());
        // Each edge without its last point: the next edge starts there.
        for (std::size_t i = 0; i + 1 < pts.size(); ++i) loop.push_back(to2(pts[i]));
      }
      if (loop.size() >= 3) face_out.loops.push_back(std::move(loop));
    }
  }
  if (!face_out.loops.empty()) faces.push_back(std::move(face_out));
  return kept;
}

}  // namespace

}  // namespace bandforge::geom
