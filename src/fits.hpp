// Limits and fits (ISO 286-1/-2) and general tolerances (ISO 2768-1) for the sizes bandforge
// makes, from tables that carry the standards' values (REFERENCE §5.8); core only, no I/O.
// Sizes in metres, deviations in metres; "over A up to and including B" as the standard ranges.
#pragma once

#include <optional>
#include <string>

namespace bandforge::fits {

/// Limit deviations of a tolerance zone [m], upper ≥ lower.
struct Zone {
  double upper = 0;
  double lower = 0;
};

/// Standard tolerance ITn [m] for nominal size `size` [m], grades 6…11, 3 < size ≤ 180 mm;
/// nullopt outside the table.
std::optional<double> standard_tolerance(double size, int grade);

/// A hole zone: letter 'H' only (EI = 0, ES = +IT). nullopt outside the table.
std::optional<Zone> hole(double size, char letter, int grade);

/// A shaft zone: letters 'c', 'd', 'f', 'g', 'h' (fundamental deviation es, ei = es − IT) and
/// 'k' (ei, grades 4…7; es = ei + IT), 3 < size ≤ 120 mm. nullopt outside the table.
std::optional<Zone> shaft(double size, char letter, int grade);

/// One fit of a hole-basis pair, e.g. Ø16 H11/c11.
struct Fit {
  double size = 0;
  std::string hole_code, shaft_code;  ///< "H11", "c11"
  Zone hole, shaft;
  double clearance_min() const { return hole.lower - shaft.upper; }  ///< negative: interference
  double clearance_max() const { return hole.upper - shaft.lower; }
  /// "Ø16 H11/c11".
  std::string designation() const;
};

/// The fit `hole_code`/`shaft_code` ("H11", "c11") at `size`; nullopt outside the tables.
std::optional<Fit> fit(double size, const std::string& hole_code, const std::string& shaft_code);

/// ISO 2768-1 general tolerance ± [m] of a linear size in class 'f', 'm', 'c' or 'v',
/// 0.5 mm < size ≤ 2000 mm; nullopt outside (or where the class gives none).
std::optional<double> general_linear(double size, char cls);

/// The fits bandforge specifies and why (common practice, REFERENCE §5.8): clevis and pivot pins
/// H11/c11, loose and tolerant of paint and dirt; the drum on its shaft H7/k6.
inline constexpr const char* kPinHole = "H11";
inline constexpr const char* kPinShaft = "c11";
inline constexpr const char* kBoreHole = "H7";
inline constexpr const char* kBoreShaft = "k6";

}  // namespace bandforge::fits
