// Plane geometry of the band path (REFERENCE §1.8 steps 2–5), unit-free, no OCCT. Used for the
// released state, where the lever pins move and the band re-tangents to the lifted circle, and
// by the solids for the band eyes.
#pragma once

#include "src/design.hpp"
#include "src/mechanics.hpp"

namespace bandforge {

/// The band end at `pin` tangent to the circle `radius` about the origin. `leaving_a`: end A
/// (tangent angle ψ + s·α), otherwise end B (ψ − s·α). Throws BuildError if the pin is not
/// outside the circle. Only tangent_point, tangent_angle, free_length and run_dir are set.
EndLayout tangent_end(Vec2 pin, double radius, int sense, bool leaving_a);

/// φ = mod(s·(β_B − β_A), 2π).
double wrap_between(double beta_a, double beta_b, int sense);

/// `p` turned by `angle` (CCW positive) about `centre`.
Vec2 rotate_about(Vec2 p, Vec2 centre, double angle);

/// The layout of the released state (SI): lever-mounted pins turned back about the pivot by the
/// release rotation (against the apply sense), the band centreline on r_b + clearance and
/// re-tangent from the moved pins; wrap, band length and arms recomputed.
Layout released_layout(const Design& design, const Layout& applied);

}  // namespace bandforge
