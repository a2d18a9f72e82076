// Builders for the individual solids, millimetres, OCCT types (geometry/*.cpp only).
// Each returns one closed solid; the caller names, places and checks it.
#pragma once

#include <vector>

#include <TopoDS_Shape.hxx>

#include "src/design.hpp"

namespace bandforge::geom {

/// Drum dimensions [mm]: a rim, a web at mid-width and a hub with the bore. In part coordinates
/// the rim's back face is at z = 0 and its mid-plane at z = width/2.
struct DrumDims {
  double diameter = 0;       ///< friction surface D
  double width = 0;          ///< rim face width w (axial)
  double rim_thickness = 0;  ///< radial
  double web_thickness = 0;  ///< axial, centred on the rim's mid-plane
  double hub_diameter = 0;
  double hub_length = 0;     ///< axial, centred on the rim's mid-plane
  double bore = 0;
};

/// The drum as one revolved profile: the friction surface is a true cylinder of radius D/2.
TopoDS_Shape make_drum(const DrumDims& d);

/// An annular sector about the z axis from angle `start` turning `sense` (+1 CCW) by `sweep`,
/// radii r_in..r_out, z from z0 to z0 + width. Used for the lining.
TopoDS_Shape make_arc_segment(double r_in, double r_out, double start, int sense, double sweep,
                              double z0, double width);

/// One band end in the front view [mm]: the pin centre and where the centreline meets the circle.
struct BandEndPath {
  Vec2 pin;            ///< pin centre E
  Vec2 tangent_point;  ///< T on the centreline circle
  double tangent_angle = 0;
  bool eye = true;     ///< an eye round the pin; false: a straight end `cut` from the pin
  double cut = 0;      ///< distance from the pin centre to a straight end, along the run [mm]
  /// Riveted lap (eye only): length of the tail laid back on the run's outside face [mm]; it ends
  /// ρ + lap from the pin centre along the run (ρ = eye_inner + thickness/2, where the band
  /// blank's eye closes); 0 = no tail.
  double lap = 0;
};

/// Band profile [mm]: centreline line–arc–line from pin A to pin B, tangent to `r_band`, offset
/// ±thickness/2; at each pin an eye (ring of inner radius `eye_inner` = pin radius, wall =
/// band thickness) that the straight strip runs into. Extruded over z from 0 to width.
struct BandPath {
  double r_band = 0;
  double thickness = 0;
  double width = 0;
  double eye_inner = 0;
  int sense = 1;  ///< +1: the band runs CCW from A to B
  double wrap = 0;
  BandEndPath a, b;
};

TopoDS_Shape make_band(const BandPath& p);

/// A solid round-head rivet as set [mm], part coordinates: axis z, the manufactured head's
/// underside at z = 0 (a spherical cap d_k × k from −k to 0), the shank Ø d to `clamp`, the
/// closing head a second cap d_k × `closing` from `clamp` (0: closed flush, shank only).
struct RivetDims {
  double d = 0, dk = 0, k = 0, clamp = 0, closing = 0;
};
TopoDS_Shape make_rivet(const RivetDims& d);

/// A welded end block [mm], part coordinates: the pin bore at the origin, the band's run along
/// −x, the band slot on the mid-plane y = 0 opening in the back face, z from 0 to `width`.
struct BlockDims {
  double front = 0;       ///< block face beyond the pin (+x), from the pin centre
  double back = 0;        ///< block face toward the drum (−x), from the pin centre
  double height = 0;      ///< across the run (y)
  double slot_depth = 0;  ///< slot from the back face toward the bore
  double slot_width = 0;  ///< = band thickness
  double bore = 0;        ///< bore radius
  double width = 0;       ///< along z (= band width)
};

TopoDS_Shape make_end_block(const BlockDims& d);

/// A plate in the z = const plane whose outline is the convex hull of discs of `radius` about
/// `centres`, with round holes of `hole_radius` at `holes`, z from z0 to z0 + thickness.
TopoDS_Shape make_plate(const std::vector<Vec2>& centres, double radius,
                        const std::vector<Vec2>& holes, double hole_radius, double z0,
                        double thickness);

/// A cylinder of `radius` along z from z0 to z0 + length, axis through (0, 0).
TopoDS_Shape make_rod(double radius, double z0, double length);

/// ISO 2341 form B clevis pin in part coordinates: axis z, the head's underside at z = 0, head
/// from −k to 0, shank to `length`, the split-pin hole along x at z = hole_at [mm].
struct ClevisPinDims {
  double d = 0, dk = 0, k = 0, length = 0, d1 = 0, hole_at = 0;
};
/// `with_hole` false: without the split-pin hole (the drawing's copies, see BuildOptions::for_views).
TopoDS_Shape make_clevis_pin(const ClevisPinDims& d, bool with_hole = true);

/// Volume [mm³] and centroid height on the axis [mm] of a solid of revolution about z.
struct AxialMass {
  double volume = 0, z = 0;
};
/// The mass properties of make_clevis_pin(d) with its hole, from the dimensions: head and shank
/// cylinders less the hole's common with the shank, V = ∫ 2√(a² − y²)·2√(r² − y²) dy over
/// −a…a (a = d₁/2, r = d/2), by Simpson's rule in y = a·sin φ, whose integrand is smooth; the
/// common is symmetric about z = hole_at. BRepGProp's Gauss rule is as exact on the solid, but
/// the drawing's copy of the model has no hole to measure (tests/geometry_test.cpp compares both).
AxialMass clevis_pin_mass(const ClevisPinDims& d);

/// A flat ring (washer, spacer sleeve) about z from z0 to z0 + height [mm].
TopoDS_Shape make_ring(double inner_diameter, double outer_diameter, double z0, double height);

/// A split pin as fitted, simplified to one flat piece 0.7 × its leg diameter thick: its legs a
/// bar along x through a pin of `pin_diameter` on the z axis, cut where they bend back round it,
/// its eye a disc of `eye_width` beside the pin on +x, centred on z = 0 [mm]. `with_legs` false:
/// the eye alone.
TopoDS_Shape make_split_pin(double pin_diameter, double leg_diameter, double eye_width,
                            bool with_legs = true);

}  // namespace bandforge::geom
