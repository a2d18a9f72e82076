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

/// The applying element's statics, spring and actuator, and the apply and hoist checks, for a
/// solved design (layout, results and hardware plan filled in).
ApplyResult solve_apply(const Design& design, const Solution& solution);

}  // namespace bandforge
