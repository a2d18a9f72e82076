// Orthographic views of the placed solids by exact hidden-line removal (OCCT HLRBRep_Algo),
// returned as plain 2-D lines, circular arcs and polylines in model millimetres. Standard types
// only, so drawing/ can lay out views without seeing OCCT.
#pragma once

#include <string>
#include <vector>

#include "geometry/brake_model.hpp"

namespace bandforge::geom {

struct Point2 {
  double x = 0;
  double y = 0;
};

/// One projected edge piece.
struct ViewEdge {
  enum class Kind { line, arc, polyline };
  Kind kind = Kind::line;
  bool visible = true;  ///< false: hidden behind another solid
  bool smooth = false;  ///< a tangent-continuous (Rg1) edge: draw thin or omit
  Point2 a, b;          ///< end points (line and arc)
  Point2 centre;        ///< arc centre
  double radius = 0;    ///< arc radius
  double start = 0;     ///< arc start angle [rad]; the arc runs counter-clockwise from here
  double sweep = 0;     ///< arc sweep (> 0) [rad]
  std::vector<Point2> points;  ///< polyline vertices (curves that are neither line nor arc)
};

/// A viewing direction: `toward_viewer` points from the model to the eye, `right` is the
/// direction that appears to the right on paper (up = toward_viewer × right).
struct ViewSpec {
  Vec3 toward_viewer;
  Vec3 right;
  std::string name;
};

/// Front view: looking along −z (the drum axis toward the viewer), x right, y up.
ViewSpec front_view();
/// View from the left (eye on −x, looking along +x); in first-angle projection it is placed to
/// the right of the front view. Paper right = +z, up = +y.
ViewSpec left_view();
/// View from above (eye on +y); in first-angle projection it is placed below the front view.
/// Paper right = +x, up = −z.
ViewSpec top_view();
/// Isometric view (ISO 5456-3 isometric axonometry): the eye on the space diagonal (1, 1, 1),
/// the model's y axis upright on paper. It shows the front (+z, the face the front view shows),
/// the right side (+x) and the top (+y); the x axis runs down to the right at 30°, z down to the
/// left at 30°, y up, 120° apart, each foreshortened to √(2/3) (a true orthographic projection,
/// not the simplified scale 1 that ISO 5456-3 also allows).
ViewSpec isometric_view();

struct ProjectOptions {
  bool hidden = true;  ///< also return hidden edges
  bool smooth = true;  ///< also return visible smooth (tangent) edges; seams are always dropped
  /// Only instances whose part kind is listed ("lever", "grip", "pin", ...); empty = all.
  std::vector<std::string> kinds;
  /// Only the instances of these names (PartInfo::instance_names); empty = all.
  std::vector<std::string> instances;
  /// A cut (ISO 128-40): remove what lies on the viewer's side of the plane through `cut_point`
  /// whose normal is the view's toward_viewer, before the hidden-line removal; the faces the
  /// plane leaves come back in ProjectedView::sections.
  bool cut = false;
  Vec3 cut_point;  ///< a point of the cutting plane [mm], assembly coordinates
};

/// One face a cutting plane leaves on one instance, in view coordinates.
struct SectionFace {
  std::string instance;  ///< PartInfo::instance_names entry
  std::string kind;      ///< its part kind ("drum", "band", ...)
  /// Closed boundary loops (outer and holes; fill by the even-odd rule), first point not
  /// repeated; curved edges as chords within 0.02 mm.
  std::vector<std::vector<Point2>> loops;
};

struct ProjectedView {
  std::vector<ViewEdge> edges;
  Point2 min, max;   ///< bounding box of all returned edges [mm]
  double milliseconds = 0;  ///< wall time of the hidden-line removal and conversion
  std::vector<SectionFace> sections;  ///< with ProjectOptions::cut: the cut faces
};

/// The kind of each part ("drum", "lining", "band", "lever", "grip", "pin", "anchor"), in the
/// order of BrakeModel::parts().
std::vector<std::string> part_kinds(const BrakeModel& model);

/// Projects the placed solids. Throws BuildError naming the view if OCCT fails.
ProjectedView project(const BrakeModel& model, const ViewSpec& view, const ProjectOptions& options = {});

}  // namespace bandforge::geom
