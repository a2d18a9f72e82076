// Flat plates read back from their solids: the lever and the frame anchors are extrusions along z
// (geometry/solids.cpp make_plate), so the face they were extruded from is their flat pattern.
// Reading it from the solid keeps one description of each outline.
#include <algorithm>
#include <cmath>
#include <limits>
#include <numbers>
#include <string>
#include <vector>

#include <BRepAdaptor_Curve.hxx>
#include <BRepAdaptor_Surface.hxx>
#include <BRepTools.hxx>
#include <BRepTools_WireExplorer.hxx>
#include <Standard_Failure.hxx>
#include <TopExp.hxx>
#include <TopExp_Explorer.hxx>
#include <TopoDS.hxx>
#include <TopoDS_Edge.hxx>
#include <TopoDS_Face.hxx>
#include <TopoDS_Wire.hxx>
#include <gp_Circ.hxx>
#include <gp_Cylinder.hxx>
#include <gp_Pln.hxx>

#include "geometry/flat_internal.hpp"
#include "geometry/occt_model.hpp"
#include "src/errors.hpp"

namespace bandforge::geom {
namespace {

constexpr double pi = std::numbers::pi;

[[noreturn]] void cannot(const std::string& part, const std::string& what) {
  throw BuildError("cannot flatten the " + part + ": " + what);
}

// A planar face whose normal is along z, with its height.
struct ZFace {
  TopoDS_Face face;
  double z = 0;
};

std::vector<ZFace> z_faces(const TopoDS_Shape& solid) {
  std::vector<ZFace> out;
  for (TopExp_Explorer ex(solid, TopAbs_FACE); ex.More(); ex.Next()) {
    const TopoDS_Face f = TopoDS::Face(ex.Current());
    BRepAdaptor_Surface s(f);
    if (s.GetType() != GeomAbs_Plane) continue;
    const gp_Pln pl = s.Plane();
    if (std::abs(std::abs(pl.Axis().Direction().Z()) - 1.0) > 1e-9) continue;
    out.push_back({f, pl.Location().Z()});
  }
  return out;
}

// The wire's edges in order as bulge-polyline vertices (lines and circular arcs only).
std::vector<FlatVertex> wire_vertices(const TopoDS_Wire& wire, const TopoDS_Face& face,
                                      const std::string& part) {
  std::vector<FlatVertex> out;
  for (BRepTools_WireExplorer wex(wire, face); wex.More(); wex.Next()) {
    const TopoDS_Edge& e = wex.Current();
    const bool forward = e.Orientation() != TopAbs_REVERSED;
    BRepAdaptor_Curve c(e);
    const double u0 = c.FirstParameter(), u1 = c.LastParameter();
    const gp_Pnt start = c.Value(forward ? u0 : u1);
    switch (c.GetType()) {
      case GeomAbs_Line:
        out.push_back({start.X(), start.Y(), 0.0});
        break;
      case GeomAbs_Circle: {
        // The parameter runs CCW about the circle's axis; seen from +z that is CCW when the axis
        // points up, and the edge's orientation may run it backwards.
        const gp_Circ circ = c.Circle();
        const double sense = (circ.Axis().Direction().Z() > 0 ? 1.0 : -1.0) * (forward ? 1 : -1);
        const double sweep = (u1 - u0) * sense;
        if (std::abs(u1 - u0) > pi) {
          // A bulge holds at most a half turn cleanly: split long arcs (full circles) in two.
          const gp_Pnt mid = c.Value((u0 + u1) / 2);
          out.push_back({start.X(), start.Y(), std::tan(sweep / 8)});
          out.push_back({mid.X(), mid.Y(), std::tan(sweep / 8)});
        } else {
          out.push_back({start.X(), start.Y(), std::tan(sweep / 4)});
        }
        break;
      }
      default:
        cannot(part, "its outline has an edge that is neither a line nor a circular arc");
    }
  }
  return out;
}

// A wire that is one full circle becomes a CIRCLE entity.
bool as_circle(const TopoDS_Wire& wire, FlatCircle& hole) {
  int edges = 0;
  TopoDS_Edge edge;
  for (TopExp_Explorer ex(wire, TopAbs_EDGE); ex.More(); ex.Next()) {
    edge = TopoDS::Edge(ex.Current());
    ++edges;
  }
  if (edges != 1) return false;
  BRepAdaptor_Curve c(edge);
  if (c.GetType() != GeomAbs_Circle) return false;
  if (std::abs(c.LastParameter() - c.FirstParameter() - 2 * pi) > 1e-9) return false;
  const gp_Circ circ = c.Circle();
  hole = {circ.Location().X(), circ.Location().Y(), circ.Radius()};
  return true;
}

const BrakeModel::Impl::Part& part_at(const BrakeModel& model, std::size_t part) {
  return model.impl().parts.at(part);
}

}  // namespace

FlatPart plate_from_solid(const BrakeModel& model, std::size_t index) {
  const PartInfo& info = model.parts().at(index);
  const std::string what = "plate " + info.name;
  FlatPart f = flat_part_for(info);
  try {
    const std::vector<ZFace> faces = z_faces(part_at(model, index).shape);
    if (faces.size() != 2) cannot(what, "it is not a plate extruded along z");
    const ZFace& low = faces[0].z < faces[1].z ? faces[0] : faces[1];
    f.thickness = std::abs(faces[1].z - faces[0].z);
    const TopoDS_Wire outer = BRepTools::OuterWire(low.face);
    std::vector<FlatVertex> outline = wire_vertices(outer, low.face, what);
    if (contour_area(outline) < 0) outline = reversed(outline);
    f.contours.push_back(outline);
    for (TopExp_Explorer ex(low.face, TopAbs_WIRE); ex.More(); ex.Next()) {
      const TopoDS_Wire w = TopoDS::Wire(ex.Current());
      if (w.IsSame(outer)) continue;
      FlatCircle hole;
      if (as_circle(w, hole)) {
        f.holes.push_back(hole);
      } else {
        std::vector<FlatVertex> inner = wire_vertices(w, low.face, what);
        if (contour_area(inner) < 0) inner = reversed(inner);
        f.contours.push_back(inner);
      }
    }
  } catch (const Standard_Failure& e) {
    throw BuildError("while flattening the " + what + ": " + e.GetMessageString());
  }
  std::sort(f.holes.begin(), f.holes.end(), [](const FlatCircle& a, const FlatCircle& b) {
    return a.x < b.x || (a.x == b.x && a.y < b.y);
  });
  finish(f);
  return f;
}

BarSize bar_size(const BrakeModel& model, std::size_t part) {
  // A rod: one cylindrical face and two planar end faces along z.
  const TopoDS_Shape& shape = part_at(model, part).shape;
  BarSize size;
  for (TopExp_Explorer ex(shape, TopAbs_FACE); ex.More(); ex.Next()) {
    BRepAdaptor_Surface s(TopoDS::Face(ex.Current()));
    if (s.GetType() == GeomAbs_Cylinder) size.diameter = std::max(size.diameter, 2 * s.Cylinder().Radius());
  }
  const std::vector<ZFace> ends = z_faces(shape);
  if (ends.size() != 2 || !(size.diameter > 0)) {
    cannot("bar " + model.parts().at(part).name, "it is not a round bar along z");
  }
  size.length = std::abs(ends[1].z - ends[0].z);
  return size;
}

std::vector<std::size_t> parts_of_kind(const BrakeModel& model, const char* kind) {
  std::vector<std::size_t> out;
  const auto& parts = model.impl().parts;
  for (std::size_t i = 0; i < parts.size(); ++i) {
    if (std::string(to_string(parts[i].kind)) == kind) out.push_back(i);
  }
  return out;
}

std::size_t find_part(const BrakeModel& model, const char* kind) {
  const std::vector<std::size_t> all = parts_of_kind(model, kind);
  return all.empty() ? model.parts().size() : all.front();
}

}  // namespace bandforge::geom
