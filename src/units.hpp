// Units at the border: text such as "400 mm", "16 in", "1.2 kN*m", "270°" becomes one SI number
// (udunits2 does the parsing); SI numbers become display text in the chosen unit system.
// Nothing else in bandforge converts units.
#pragma once

#include <string>
#include <string_view>

namespace bandforge {

/// The physical quantity a design-file field holds. Each maps to one SI unit.
enum class Quantity {
  length,         ///< m
  force,          ///< N
  torque,         ///< N·m
  stress,         ///< Pa (also pressure)
  angle,          ///< rad
  angular_speed,  ///< rad/s ("rpm" accepted)
  linear_speed,   ///< m/s
  mass,           ///< kg
  inertia,        ///< kg·m²
  energy,         ///< J
  power,          ///< W
  power_density,  ///< W/m²
  temperature,    ///< °C (absolute)
  temperature_difference,  ///< K
  rate,           ///< 1/s ("per hour" given as e.g. "20 /h" or "20 h-1")
  dimensionless,
};

enum class UnitSystem { si, us };

/// Parses `text` (a number followed by a unit) into the SI value of `q`.
/// Throws UnitParseError (what() says why: no number, unknown unit, or the unit measures
/// a different quantity, naming it) — the design reader turns it into a DesignError.
double parse_quantity(std::string_view text, Quantity q);

/// The unit bandforge displays `q` in for a unit system, e.g. length → "mm" / "in".
std::string display_unit(Quantity q, UnitSystem system);

/// SI value → value in display_unit(q, system).
double to_display(double value, Quantity q, UnitSystem system);

/// "400 mm", "15.7 in": value in the display unit with `digits` significant figures.
std::string format_quantity(double value, Quantity q, UnitSystem system, int digits = 4);

/// The quantity of an SI unit symbol as a Check writes it ("Pa" → stress, "N·m" → torque, "°C"
/// → temperature); dimensionless for any other text.
Quantity quantity_of_unit(std::string_view si_unit);

/// Human name of a quantity ("a length", "a force") and examples of valid input ("\"400 mm\"").
std::string quantity_name(Quantity q);
std::string quantity_examples(Quantity q);

class UnitParseError : public std::exception {
 public:
  explicit UnitParseError(std::string why) : why_(std::move(why)) {}
  const char* what() const noexcept override { return why_.c_str(); }

 private:
  std::string why_;
};

}  // namespace bandforge
