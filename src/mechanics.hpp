// Band-brake mechanics (REFERENCE.md §1–2). Pure functions of a Design; no I/O.
// All values SI: m, N, N·m, Pa, rad, J, W, K (temperature differences), °C (absolute).
#pragma once

#include <array>
#include <optional>
#include <string>
#include <vector>

#include "src/apply.hpp"
#include "src/check.hpp"
#include "src/design.hpp"
#include "src/hardware.hpp"

namespace bandforge {

/// Limits every design is checked against (common practice, no source; README "Checks").
namespace check_limits {
inline constexpr double hand_force = 350.0;         ///< operator force, occasional use [N] (REFERENCE §3)
inline constexpr double hand_force_regular = 250.0; ///< regular use [N] (REFERENCE §3)
inline constexpr double self_lock_margin = 1.2;     ///< differential: a_s ≥ 1.2·a_t·e^(f_max·φ) (§1.7)
/// Lever rotation to take up the release clearance: the layout is solved in the applied
/// position; a lever that must turn more than this barely tightens the band (a tiny net arm)
/// and its released position is far from the one analysed [rad] (10°).
inline constexpr double release_rotation = 10.0 * 3.14159265358979323846 / 180.0;
}  // namespace check_limits

/// One band end as laid out in the front view (REFERENCE §1.8 steps 2–5).
struct EndLayout {
  Mount mount = Mount::frame;
  Vec2 pin;                   ///< pin centre E [m]
  Vec2 tangent_point;         ///< where the band centreline meets the circle r_b [m]
  double tangent_angle = 0;   ///< polar angle β of the tangent point [rad]
  double free_length = 0;     ///< straight run ℓ = sqrt(d² − r_b²) [m]
  Vec2 run_dir;               ///< unit vector u from the pin toward the tangent point
  double arm = 0;             ///< signed moment arm m = (E − O) × u about the pivot [m]; 0 on frame
  double arm_applied = 0;     ///< m' = σ·m: > 0 the tension helps apply, < 0 it resists [m]
};

/// The band and lever geometry that follows from the pins (or from a [concept] block).
struct Layout {
  bool from_pins = true;        ///< false for a [concept] design: no coordinates, no geometry
  double r = 0;                 ///< drum friction radius [m]
  double r_band = 0;            ///< band centreline (line of action) radius r_b [m]
  int sense = 1;                ///< s: +1 if the band runs CCW from A to B, −1 if CW
  double wrap = 0;              ///< wrap angle φ [rad]
  double band_length = 0;       ///< centreline length ℓ_A + ℓ_B + r_b·φ [m] (arc only for concept)
  EndLayout a;
  EndLayout b;
  int apply_sense = 1;          ///< σ = −sign(m_A + m_B): lever rotation that tightens the band
  double handle_arm = 0;        ///< L = |H − O|: perpendicular arm of the operator's force [m]
  Vec2 force_dir;               ///< unit direction of the operator's force at H (applying)
  BrakeKind kind = BrakeKind::simple;
  double release_rotation = 0;  ///< lever rotation to take up the radial clearance [rad]
  double handle_travel = 0;     ///< handle travel for that rotation [m]
};

/// Forces and stresses for one drum rotation at one friction value.
struct DirectionResult {
  bool a_tight = true;          ///< end A carries the tight-side tension
  double friction = 0;          ///< f used
  double capstan_ratio = 0;     ///< P_t/P_s (e^(fφ) thin; e^(fφ r/r_b) thick)
  double tension_tight = 0;     ///< P1 [N]
  double tension_slack = 0;     ///< P2 [N]
  double torque = 0;            ///< braking torque [N·m]
  double lever_force = 0;       ///< operator force at the handle [N]; 0 when self-locking
  double actuating_moment = 0;  ///< moment about O the operator must supply [N·m]; ≤ 0 self-locking
  bool self_locking = false;
  double pressure_max = 0;      ///< lining pressure at the tight end [Pa]
  double pressure_min = 0;      ///< at the slack end [Pa]
  double pressure_mean = 0;     ///< (P1 − P2)/(f·b·r·φ) [Pa]
  double band_stress = 0;       ///< P1/(b·t), gross section [Pa]
  double pin_shear = 0;         ///< tight-end pin in double shear P1/(2·πd²/4) [Pa]
  double lever_moment = 0;      ///< largest bending moment along the lever (pivot and pin sections) [N·m]
  double lever_stress = 0;      ///< largest bending stress, net of the pin hole at that section [Pa]
  Vec2 drum_load;               ///< resultant band force on the drum (bearing load) [N]
  Vec2 pivot_reaction;          ///< force of the pivot pin on the lever [N]
};

/// Thermal results when the design has a [duty] block.
struct Thermal {
  bool present = false;
  double energy = 0;            ///< energy per stop [J]
  double stop_time = 0;         ///< [s]
  double rim_mass = 0;          ///< drum rim mass that absorbs the heat [kg]
  double temperature_rise = 0;  ///< per stop ΔT = E/(m·c) [K]
  double peak_temperature = 0;  ///< ambient + ΔT [°C]
  double lining_area = 0;       ///< b·r·φ [m²]
  double power_density_mean = 0;  ///< E/(t_stop·area) [W/m²]
  double power_density_peak = 0;  ///< 2 × mean at the start of a uniform stop [W/m²]
  double mean_power = 0;          ///< E × stops per hour / 3600 [W]
  double hoist_torque = 0;        ///< mean torque to stop the hoist, E/θ_stop [N·m]; 0 if no hoist
};

struct Capacity {
  double friction = 0;           ///< f used (f_min: the conservative end)
  double torque_band = 0;        ///< torque at the band's allowable stress [N·m]
  double torque_pressure = 0;    ///< torque at the lining pressure limit [N·m]
  double torque = 0;             ///< the smaller of the two [N·m]
};

struct Solution {
  Layout layout;
  bool primary_a_tight = true;   ///< the design's drum rotation makes end A tight
  double required_torque = 0;    ///< T × service factor when [load] torque is given [N·m]
  double given_force = 0;        ///< [load] lever_force when given [N]
  /// results[direction][friction]: direction 0 = A tight, 1 = B tight;
  /// friction 0 = f_min, 1 = f_nominal, 2 = f_max.
  std::array<std::array<DirectionResult, 3>, 2> results;
  std::optional<double> self_lock_friction;  ///< lowest f at which either direction self-locks
  Capacity capacity;
  Thermal thermal;
  std::vector<Check> checks;
  std::vector<std::string> warnings;
  HardwarePlan hardware;  ///< generated brackets, joints and axial stack (pin layouts only)
  ApplyResult apply;      ///< how the brake is applied: weight or spring, actuator, hoist rules

  const DirectionResult& nominal(bool a_tight) const { return results[a_tight ? 0 : 1][1]; }
  const DirectionResult& primary() const { return nominal(primary_a_tight); }
};

/// Geometry of the band and lever from the pins (§1.8) or the [concept] arms.
/// Throws DesignError for impossible layouts (pin inside r_b, φ ≈ 0 or ≥ 2π, crossing runs,
/// zero net arm, handle at the pivot, both ends on the frame).
Layout solve_layout(const Design& design);

/// Why a pin layout is impossible (solve_layout's refusals, without the message).
enum class LayoutFault {
  none, both_on_frame, pin_a_inside, pin_b_inside, pin_a_close, pin_b_close, wrap_range,
  runs_cross, eye_a_cuts_run, eye_b_cuts_run, ends_overlap, zero_net_arm, handle_at_pivot
};

/// solve_layout for a design with pins, for a search: the same rules, but the verdict is
/// returned instead of thrown, and nothing is allocated (`layout` is valid when none).
LayoutFault try_pin_layout(const Design& design, Layout& layout);

/// Forces for one direction at one friction value, given the layout and what [load] fixes.
DirectionResult solve_direction(const Design& design, const Layout& layout, bool a_tight,
                                double friction);

/// The thermal results of solve() for a layout, given the torque of the design rotation at the
/// nominal friction (what solve() uses); not present without a [duty] block.
Thermal solve_thermal(const Design& design, const Layout& layout, double primary_torque);

/// The whole solution: both directions at f_min, f_nominal and f_max, capacity, thermal, checks.
Solution solve(const Design& design);

/// Drum rim mass used by the thermal check (from the drum proportions) [kg].
double drum_rim_mass(const Design& design);

}  // namespace bandforge
