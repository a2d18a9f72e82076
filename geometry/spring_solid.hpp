// A true helical compression spring of round wire as one OpenCASCADE solid, with the end
// finishes of Shigley's Mechanical Engineering Design 9th ed. Table 10-1 (geometry/*.cpp and
// tests only: the header carries OCCT types).
//
// Model (millimetres, part coordinates):
// - The wire is a tube of diameter d around a centreline on the cylinder of radius D/2,
//   z rising with the angle θ; its cross-sections are exact circles square to the centreline and
//   the wire's ends are flat discs square to it.
// - Closed end turns (squared, squared-ground) have the pitch at which the clearance between
//   neighbouring coils, measured square to the wire, is 0.02·d (p_end·cos α_end = 1.02·d,
//   α the helix angle; p_end ≈ 1.02·d): coils must not touch, a tangential contact makes an
//   invalid solid. The pitch blends into the active pitch over half a turn centred on the end
//   of each end turn (a smoothstep on the pitch: the centreline is tangent- and
//   curvature-continuous). If the installed length leaves the active pitch below p_end, the whole
//   spring gets one uniform pitch instead.
// - Unground ends (plain, squared): the centreline starts at z = (d/2)·cos α_end, so the wire's
//   end disc touches the seat plane z = 0 (and likewise z = length at the other end).
// - Ground ends (plain-ground, squared-ground): the centreline runs from z = 0 to z = length and
//   the first and last part turn are cut flat by the planes z = 0 and z = length.
#pragma once

#include <TopoDS_Shape.hxx>

#include "src/design.hpp"  // enum class SpringEnds { plain, plain_ground, squared, squared_ground };

namespace bandforge::geom {

/// A helical compression spring as installed, millimetres, part coordinates: coil axis = z,
/// one end's seat plane z = 0, the other's z = length; the wire starts at angle 0 on +x and
/// winds counter-clockwise seen from +z (right-hand helix).
struct SpringDims {
  double wire = 0;           ///< wire diameter d [mm]
  double mean_diameter = 0;  ///< D [mm]
  double total_coils = 0;    ///< N_t (Shigley Table 10-1 relation to N_a by ends)
  double active_coils = 0;   ///< N_a
  SpringEnds ends = SpringEnds::squared_ground;
  double length = 0;         ///< installed length between the seat planes [mm], > solid length
};

/// One valid closed solid (throws Standard_Failure / std::invalid_argument on impossible input).
/// std::invalid_argument: d ≤ 0, D ≤ d, N_a < 1, N_t not N_a + (0 plain, 1 plain-ground,
/// 2 squared and squared-ground) as Table 10-1 has it, or a length that leaves no clearance
/// between the active coils (pitch·cos α ≤ d, i.e. the length is at or below the solid length).
/// Standard_Failure: OpenCASCADE could not close the solid (not expected for valid input).
TopoDS_Shape make_spring(const SpringDims& s);

/// The wire volume the solid should have, from the same centreline (helix length × π d²/4,
/// minus what the grinding removes for ground ends), for tests and reports [mm³].
/// Helix length: ∫ √(R² + z'(θ)²) dθ (R = D/2) by Simpson's rule. Grinding: at each θ the plane
/// cuts the circular cross-section (radius r = d/2) at the distance h = z/cos α from its centre,
/// removing the segment r²·acos(h/r) − h·√(r² − h²), integrated along the centreline's length.
/// A tube's volume is exactly its section × centreline length (Pappus), so the solid should
/// match this up to the surface approximation (2e-5 relative at 5e-4 mm from the tube).
double spring_volume_estimate(const SpringDims& s);

}  // namespace bandforge::geom
