// Helical compression springs of round wire: the relations of Budynas & Nisbett, Shigley's
// Mechanical Engineering Design, 9th ed., ch. 10 (REFERENCE §8.2), the spring-wire tables with
// their sources, and the design of the lightest spring that meets a brake's requirement.
// Pure functions of plain values, SI units (m, N, Pa). EN 13906-1 uses the same stress formula
// with its stress correction factor k = (C + 0.5)/(C − 0.75), which is the Bergsträsser factor.
#pragma once

#include <string>
#include <string_view>
#include <vector>

#include "src/design.hpp"

namespace bandforge {

/// One spring wire: its strength fit (Table 10-4), shear modulus (Table 10-5) and static
/// allowable (Table 10-6), each with its source.
struct SpringWire {
  std::string key;             ///< design-file name, e.g. "oil-tempered"
  std::string description;     ///< e.g. "oil-tempered carbon steel wire, ASTM A229"
  double d_min = 0;            ///< smallest diameter of the strength fit [m]
  double d_max = 0;            ///< largest diameter of the strength fit [m]
  double a_mpa = 0;            ///< A of S_ut = A/d^m with d in mm, S_ut in MPa [MPa·mm^m]
  double m = 0;                ///< exponent m of the fit
  double allowable_fraction = 0;  ///< static allowable torsional stress / S_ut
  std::string strength_source;    ///< where A, m and the size range come from
  std::string modulus_source;     ///< where G comes from
  std::string allowable_source;   ///< where the allowable fraction comes from
};

const std::vector<SpringWire>& spring_wires();
/// nullptr when unknown.
const SpringWire* find_spring_wire(std::string_view key);

/// Preferred wire diameters [m], ascending, and their source.
const std::vector<double>& wire_diameters();
extern const char* const kWireDiameterSource;

/// Minimum tensile strength S_ut = A/d^m (Shigley eq. 10-14, Table 10-4) [Pa].
double wire_strength(const SpringWire& wire, double d);
/// Shear modulus G for the wire at diameter d (Shigley Table 10-5) [Pa].
double shear_modulus(const SpringWire& wire, double d);
/// Static allowable torsional stress, the fraction of S_ut of Table 10-6 [Pa].
double allowable_shear(const SpringWire& wire, double d);

/// Bergsträsser factor K_B = (4C + 2)/(4C − 3) (Shigley eq. 10-5).
double bergstrasser(double index);
/// Largest shear stress τ = K_B·8·F·D/(π·d³) (Shigley eq. 10-7) [Pa].
double spring_stress(double force, double mean_diameter, double wire_diameter);
/// Rate k = d⁴·G/(8·D³·N_a) (Shigley eq. 10-9) [N/m].
double spring_rate(double wire_diameter, double mean_diameter, double active_coils, double shear_modulus);
/// Total coils N_t for N_a active coils and the end finish (Shigley Table 10-1).
double total_coils(SpringEnds ends, double active_coils);
/// Solid length L_s (Shigley Table 10-1) [m].
double solid_length(SpringEnds ends, double wire_diameter, double total_coils);
/// End-condition constant α of the buckling limit (Shigley 9th ed. §10-10, eq. 10-13).
double end_constant(SpringSeats seats);
/// Free length below which a steel spring cannot buckle: L_0 < 2.63·D/α (eq. 10-13) [m].
double buckling_free_length(double mean_diameter, SpringSeats seats);

/// Limits of the design (Shigley 9th ed. §10-9, the recommended ranges of a static design).
namespace spring_limits {
inline constexpr double index_min = 4.0;     ///< C ≥ 4 (Shigley eq. 10-18)
inline constexpr double index_max = 12.0;    ///< C ≤ 12 (Shigley eq. 10-18)
inline constexpr double active_min = 3.0;    ///< N_a ≥ 3 (Shigley eq. 10-19)
inline constexpr double overrun_min = 0.15;  ///< fractional overrun to closure ξ ≥ 0.15 (eq. 10-20)
/// Active coils are rounded up to this step: a spring maker's half turn (common practice, no source).
inline constexpr double coil_step = 0.5;
}  // namespace spring_limits

/// What the applying element needs from the spring, along its axis (REFERENCE §8.1).
struct SpringDemand {
  double force_worn = 0;        ///< least force at the worn position (the spring longest) [N]
  double installed_length = 0;  ///< length between the seats with the brake applied [m]
  double wear_travel = 0;       ///< extension from applied to worn [m]
  double release_travel = 0;    ///< further compression from applied to released [m]
  double max_outer_diameter = 0;  ///< room for the coils; 0 = no limit [m]
  /// Most force the brake takes at the applied position (lining new): the spring's force falls
  /// by k·wear_travel as the lining wears, so this caps the rate; 0 = no limit [N].
  double max_force_applied = 0;
  std::string material = "oil-tempered";  ///< key into spring_wires()
  SpringEnds ends = SpringEnds::squared_ground;
  SpringSeats seats = SpringSeats::flat_pivoted;
};

/// A spring's length, force and largest shear stress at one lever position.
struct SpringState {
  double length = 0;  ///< [m]
  double force = 0;   ///< [N]
  double stress = 0;  ///< τ with K_B [Pa]
};

/// Which requirement leaves no spring when none passes (in the order they are applied).
enum class SpringLimit {
  none,      ///< a spring was found
  material,  ///< unknown wire, or no diameter of the series within its size range
  band,      ///< the brake cannot take at the applied position even the worn force
  diameter,  ///< not even the smallest spring fits the outer-diameter limit
  strength,  ///< no wire within the limits carries the released force at the allowable stress
  solid,     ///< the coils do not fit: fractional overrun to closure below 0.15
  buckling,  ///< every spring that fits would buckle
};

/// The specified spring, its three states and its figures against the limits.
struct SpringResult {
  bool found = false;
  std::string material;          ///< wire key
  double wire_diameter = 0;      ///< d [m]
  double mean_diameter = 0;      ///< D [m]
  double outer_diameter = 0;     ///< D + d [m]
  double index = 0;              ///< C = D/d
  double active_coils = 0;       ///< N_a
  double total_coils = 0;        ///< N_t
  SpringEnds ends = SpringEnds::squared_ground;
  double free_length = 0;        ///< L_0 [m]
  double solid_length = 0;       ///< L_s [m]
  double rate = 0;               ///< k [N/m]
  double mass = 0;               ///< wire mass ρ·(π d²/4)·(π D N_t), steel 7850 kg/m³ [kg]
  double tensile_strength = 0;   ///< S_ut at d [Pa]
  double allowable = 0;          ///< static allowable torsional stress [Pa]
  double shear_modulus = 0;      ///< G [Pa]
  double overrun = 0;            ///< ξ = (L_0 − L_s)/(L_0 − L_released) − 1
  double buckling_length = 0;    ///< 2.63·D/α: the free length it must stay below [m]
  double alpha = 0;              ///< end-condition constant α
  SpringState applied;           ///< brake applied, new lining
  SpringState worn;              ///< applied with the lining worn by the wear allowance
  SpringState released;          ///< lifted by the actuator (the most compressed in service)
  SpringLimit binding = SpringLimit::none;  ///< when not found: the requirement that binds
  /// When not found, the relaxation that would let a spring pass, in the unit of the binding
  /// requirement: band: the factor the worn force exceeds the applied limit by (> 1);
  /// diameter: the outer diameter needed [m]; strength: the factor the force must
  /// fall by (> 1), and `needed_diameter` the outer diameter that would carry it (0: none);
  /// solid: the extra installed length [m]; buckling: the shortening of the installation [m]
  /// that would make the best spring stable (0: none helps).
  double needed = 0;
  double needed_diameter = 0;    ///< strength: an outer-diameter limit that would do [m]
};

/// The spring's states for a given spring and demand (forces from the free length and rate).
SpringResult spring_states(SpringResult spring, const SpringDemand& demand);

/// The lightest spring from the wire series (d), index 4–12 (D in 0.5 mm steps), N_a in half
/// turns, the demand's ends, whose force at the worn position is at least `force_worn`, whose
/// force at the applied position is at most `max_force_applied`, whose stress at the released
/// position is within the allowable, with ξ ≥ 0.15, stable against
/// buckling and within the outer-diameter limit. When none passes, `binding` and `needed` say
/// which requirement binds and by how much.
SpringResult design_spring(const SpringDemand& demand);

const char* to_string(SpringLimit l);

}  // namespace bandforge
