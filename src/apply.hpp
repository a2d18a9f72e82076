// Applying the brake without a hand (REFERENCE §8): the lever statics of a weight or a
// compression spring at the applied, worn and released positions, the lever's own weight, the
// spring's specification (src/spring.hpp), the release actuator's requirement, and the hoist
// rules of REFERENCE §7 as checks. solve() calls solve_apply() and puts the result in
// Solution::apply; reports and drawings read it, nothing recomputes it.
#pragma once

#include <string>
#include <vector>

#include "src/check.hpp"
#include "src/design.hpp"
#include "src/spring.hpp"

namespace bandforge {

struct Solution;

/// The lever at one position, turned about the pivot from the applied (designed) position.
struct ApplyPosition {
  double rotation = 0;        ///< lever rotation from the applied position, ccw positive [rad]
  Vec2 at;                    ///< where the weight hangs or the spring acts [m]
  double arm = 0;             ///< the element's arm about the pivot: spring, perpendicular distance
                              ///< to its axis; weight, horizontal distance to its hanging point [m]
  double element_moment = 0;  ///< moment of the weight or spring about the pivot, applying sense
                              ///< positive [N·m]
  double lever_moment = 0;    ///< moment of the lever's own weight, applying sense positive [N·m]
};

/// The release actuator's requirement: what the buyer gives the actuator maker.
struct ActuatorNeed {
  Vec2 at;             ///< where it acts on the lever, applied position [m]
  double arm = 0;      ///< |at − pivot|: its force is taken perpendicular to pivot→at [m]
  double travel = 0;   ///< arm × release rotation: the lift that opens the clearance [m]
  double margin = 0;   ///< arm × wear rotation: reserve so the worn brake still sets [m]
  double stroke = 0;   ///< travel + margin [m]
  double force = 0;    ///< holds the lever released against the element and the lever [N]
};

/// A spring seat that bandforge adds (src/apply.cpp, rules "common practice, no source", README
/// "Generated hardware"): a steel disc square to the spring's axis, with a spigot on its face that
/// locates the end coil. Applied position.
struct SeatPlan {
  Vec2 face;               ///< centre of the face the spring's end bears on [m]
  Vec2 normal;             ///< unit, from that face into the plate (away from the spring)
  double diameter = 0;     ///< [m]
  double thickness = 0;    ///< along `normal` [m]; the lever's seat reaches the lever's edge and
                           ///< is notched over it (welded there)
  double spigot_diameter = 0;  ///< inside the coils, clear of them [m]
  double spigot_height = 0;    ///< from the face toward the spring [m]
};

/// A weight on a hanger that bandforge adds: a steel rod down from the lever's lower edge under
/// apply.at, through a steel cylinder; block and rod together are apply.mass. Applied position.
struct WeightMount {
  Vec2 hang;                   ///< top of the hanger on the lever's lower edge [m]
  double rod_diameter = 0;     ///< [m]
  double rod_length = 0;       ///< from `hang` to the block's bottom face [m]
  double drop = 0;             ///< from `hang` to the block's top face [m]
  double block_diameter = 0;   ///< vertical axis under `hang` [m]
  double block_height = 0;     ///< [m]
  double block_mass = 0;       ///< block alone (bored for the rod) [kg]
  double rod_mass = 0;         ///< [kg]
};

/// What carries the element: seats for a spring, hanger and block for a weight. `refusal` says
/// why it cannot be made where the design file puts the element (build exit 3), with the key.
struct ElementMount {
  bool present = false;
  std::string refusal;
  SeatPlan lever_seat, frame_seat;  ///< by spring
  WeightMount weight;               ///< by weight
};

/// Everything about how the brake is applied; `present` only for a weight or a spring.
struct ApplyResult {
  ApplyBy by = ApplyBy::hand;
  bool present = false;            ///< by weight or spring, with a pin layout
  double required_moment = 0;      ///< actuating moment the element must supply (f_min) [N·m]
  std::string governing;           ///< which rotation and friction need `required_moment`
  double wear_allowance = 0;       ///< radial lining wear covered [m]
  double wear_rotation = 0;        ///< lever rotation that takes it up, φ·w/|m_A + m_B| [rad]
  double release_rotation = 0;     ///< lever rotation that opens the clearance (Layout) [rad]
  double lever_mass = 0;           ///< lever plate (holes out) and grip, steel [kg]
  Vec2 lever_centroid;             ///< their centre of mass, applied position [m]
  double weight_mass = 0;          ///< by weight: the hanging mass [kg]
  ApplyPosition applied;           ///< lining new, brake applied
  ApplyPosition worn;              ///< lining worn by the wear allowance, brake applied
  ApplyPosition released;          ///< lifted by the actuator
  double available_moment = 0;     ///< element + lever at the worn position [N·m]
  double holding_torque = 0;       ///< torque held at the worn position, f_min [N·m]
  SpringResult spring;             ///< by spring: the specified spring (found) or why none
  Vec2 seat;                       ///< by spring: its frame end [m]
  ActuatorNeed actuator;
  ElementMount mount;              ///< seats, or hanger and block (geometry/ builds them)
  std::string refusal;             ///< by spring, none found: the binding requirement and the fix
  std::vector<Check> checks;       ///< apply and hoist checks (also in Solution::checks)
  std::vector<std::string> warnings;
};

/// Lever plate (convex hull of discs of lever.width/2 about the handle and the lever's holes,
/// holes removed, lever.thickness thick) and grip (hardware_rules), steel: mass [kg] and centre
/// of mass [m], applied position. Zero mass without a hardware plan (concept designs).
struct LeverMass {
  double mass = 0;
  Vec2 centroid;
};
LeverMass lever_mass(const Design& design, const Solution& solution);

/// Seat plate rules (common practice, no source): diameter OD + 2·max(5 mm, 0.1·OD), thickness
/// the least of the series ≥ 0.1·OD, spigot ID − max(1 mm, 0.05·ID) across and min(2d, 0.2·L)
/// high; a seat on the lever needs at least `seat_bridge` of plate between the spring's end and
/// the lever's edge. Weight: rod ≥ min(12 mm, lever thickness − 1 mm) at ≤ 60 MPa tension, block height = diameter, block top
/// max(20 mm, D_w/4) below the lever.
namespace mount_rules {
inline constexpr double seat_rim_min = 0.005;      ///< [m]
inline constexpr double seat_rim_fraction = 0.1;   ///< of the outer diameter
inline constexpr double seat_series[] = {0.006, 0.008, 0.010, 0.012, 0.016, 0.020};  ///< [m]
inline constexpr double seat_bridge = 0.003;       ///< [m]
inline constexpr double rod_min = 0.012;           ///< [m], or the lever's thickness − rod_inset
inline constexpr double rod_inset = 0.001;         ///< [m]
inline constexpr double rod_stress = 60e6;         ///< [Pa]
inline constexpr double drop_min = 0.020;          ///< [m]
}  // namespace mount_rules

/// The applying element's statics, spring and actuator, and the apply and hoist checks, for a
/// solved design (layout, results and hardware plan filled in).
ApplyResult solve_apply(const Design& design, const Solution& solution);

}  // namespace bandforge
