// How numbers are printed on the sheets. Results use significant figures in the display unit
// (src/units.hpp decides which unit); dimensions follow ISO 129 (mm without the unit symbol,
// or inches in --units us).
#pragma once

#include <string>

#include "src/units.hpp"

namespace bandforge::drawing {

/// `v` with `sig` significant figures, fixed notation, no exponent ("1235", "0.5123", "-12.30").
std::string sig_figs(double v, int sig = 4);

/// Value and unit: "3456 N", "0.5123 MPa", "777.5 lbf".
std::string qty(double si, Quantity q, UnitSystem u, int sig = 4);

/// Value only, in the display unit.
std::string qty_value(double si, Quantity q, UnitSystem u, int sig = 4);

/// A dimension value from metres: mm to 0.1 with the ".0" dropped ("400", "12.5"), or inches to
/// 0.01 (0.001 below 1 in).
std::string dim_length(double metres, UnitSystem u);

/// An ISO 286 limit deviation from metres, in mm as the standard writes it: "+0.110", "-0.095",
/// "0" (always mm, whatever the display units).
std::string deviation_mm(double metres);

/// An angle from radians in degrees with one decimal and the degree sign: "245.3°".
std::string degrees(double rad, int decimals = 1);

}  // namespace bandforge::drawing
