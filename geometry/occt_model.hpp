// The OpenCASCADE side of BrakeModel. Included only by geometry/*.cpp and drawing/*.cpp: it is the
// one place where OCCT types meet the brake. Keep it stable: drawing/projection.{hpp,cpp} builds
// its hidden-line views on `placed()`.
//
// Coordinates [mm], the front view of the design file: x right, y up, drum centre at the origin,
// drum axis = z toward the viewer (the front view looks along −z). Along z (AxialLayout below):
//   - drum, band and lining are centred on z = 0, the band mid-plane;
//   - the z positions of everything bandforge adds come from the hardware plan
//     (src/hardware.hpp, Solution::hardware), never from here: the lever plate in front of the
//     band, or in front of the drum's face when its outline crosses the drum in the front view;
//   - the frame plates behind the band (behind the drum's face when they cross the drum), with a
//     front cheek in front of the band or of the lever where one fits; a pivot whose pin cannot
//     pass the band has its plate in front of the lever;
//   - pins run along z through the band eyes (or welded end blocks), the lever and the plates.
#pragma once

#include <cstddef>
#include <set>
#include <string>
#include <utility>
#include <vector>

#include <TopoDS_Shape.hxx>
#include <gp_Pnt.hxx>
#include <gp_Trsf.hxx>

#include "geometry/brake_model.hpp"

namespace bandforge::geom {

/// What a part is, so that views and reports can style it (e.g. draw pins with centre lines).
enum class PartKind {
  drum, lining, band, lever, grip, pin, anchor, block, washer, split_pin, sleeve,
  rivet,                  ///< band-joint rivet (bought, standard designation)
  spring, seat, weight, hanger,  ///< applying element (src/apply.hpp) and what carries it
};

const char* to_string(PartKind kind);

/// Axial (z) positions of the plates [mm]; band mid-plane at z = 0. front > back.
struct AxialLayout {
  double drum_back = 0, drum_front = 0;      ///< drum rim and hub faces (±w/2)
  double band_back = 0, band_front = 0;      ///< band and lining (±b/2)
  double lever_back = 0, lever_front = 0;    ///< lever plate
  double anchor_back = 0, anchor_front = 0;  ///< extent of the frame plates behind the band
  double grip_front = 0;                     ///< front end of the handle grip
  double gap = 0;                            ///< axial gap between band and lever / anchors
};

struct BrakeModel::Impl {
  /// One distinct part (one STEP product). parts[i] belongs with infos[i].
  struct Part {
    PartKind kind = PartKind::drum;
    TopoDS_Shape shape;     ///< a single valid solid in part coordinates [mm]
    /// A simpler solid that contains `shape` (same coordinates), used for clearance distances
    /// (the drum: its outer cylinder); null = the shape itself. An overlap is reported as
    /// measured on `shape`; the envelope only lets a passing contact skip the exact boolean.
    TopoDS_Shape envelope;
    /// What the drawing's hidden-line views show in its place (same coordinates); null = the
    /// shape itself. The clevis pins without their split-pin hole and the split pins by their
    /// eye: the hole's intersection curves cost the hidden-line removal seconds (4.5 s against
    /// 0.55 s for the example's front view) for detail no drawing scale shows.
    TopoDS_Shape display;
    /// When > 0, the part's volume [mm³] and centroid (part coordinates) from its own
    /// construction, used for its mass properties instead of BRepGProp. The spring: its long
    /// B-spline faces fool the Gauss rule by up to 8 % (the adaptive rule agrees with the
    /// centreline integral to 2e-5 but takes 0.4 s); centroid at the centre of its envelope.
    /// The clevis pins: from their dimensions (clevis_pin_mass), so that the drawing's copy,
    /// built without the split-pin holes, lists the same masses as the checked model.
    double known_volume = 0;
    gp_Pnt known_centroid;
    /// A round part (clevis pin, joint rivet): a segment on its axis and the radius of a
    /// cylinder round it that holds the whole solid (part coordinates). The capsule of that
    /// radius round the segment holds the cylinder, so the distance between two parts' capsules
    /// never exceeds their true clearance: when it is enough, the exact distance is not needed
    /// (a joint rivet beside a pin cost 4–8 ms each to measure). bound_radius 0: none.
    gp_Pnt axis_from, axis_to;
    double bound_radius = 0;
  };
  /// One placement of a part (one STEP instance, NAUO).
  struct Instance {
    std::size_t part = 0;  ///< index into parts / infos
    std::string name;      ///< unique instance name, e.g. "PIN-PIVOT", "ANCHOR-A"
    gp_Trsf placement;     ///< part coordinates → assembly coordinates (rigid, no scale)
  };
  /// A solid where it sits in the assembly, for hidden-line views and interference checks.
  struct Placed {
    TopoDS_Shape shape;     ///< the part's shape moved by the instance placement
    std::size_t part = 0;   ///< index into parts / infos
    std::size_t instance = 0;  ///< index into instances
  };

  std::vector<Part> parts;
  std::vector<PartInfo> infos;  ///< same order as parts; what BrakeModel::parts() returns
  std::vector<Instance> instances;
  std::vector<ContactCheck> contacts;
  /// Instance-name pairs (each pair sorted) meant to touch: pins in their holes and eyes, the
  /// lining on the band and, applied, on the drum (bare band: the band on the drum), the grip
  /// on the lever. Every other pair must keep clear.
  std::set<std::pair<std::string, std::string>> intended;
  bool valid = true;           ///< every solid passed BRepCheck_Analyzer
  std::vector<bool> solid_ok;  ///< per part: one valid closed solid of positive volume

  bool released = false;  ///< built in the released state (band lifted, lever rotated back)
  /// The layout actually built, SI units like src/mechanics.hpp: the solved layout in the applied
  /// state; in the released state the moved lever pins, the lifted circle r_b + c and the new
  /// tangent points and wrap.
  Layout layout;
  double lever_rotation = 0;  ///< rotation of the lever about the pivot from the applied state [rad]
  AxialLayout axial;

  /// Every instance's solid in assembly coordinates, in instance order.
  std::vector<Placed> placed() const;
  /// The solid of one instance in assembly coordinates.
  TopoDS_Shape placed_shape(std::size_t instance) const;
  /// Index of the first part of this kind, or parts.size() when absent (e.g. no lining).
  std::size_t find(PartKind kind) const;
};

}  // namespace bandforge::geom
