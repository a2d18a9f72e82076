// One verified figure against its limit: what the mechanics and the generated hardware report,
// and what the text report, the JSON and the calculation sheet list.
#pragma once

#include <string>

namespace bandforge {

/// One verified figure against its limit.
struct Check {
  std::string id;           ///< stable identifier, e.g. "lining_pressure"
  std::string title;        ///< human wording, e.g. "Lining pressure at the tight end"
  double value = 0;         ///< in SI
  double limit = 0;         ///< in SI
  std::string unit;         ///< SI unit symbol of value and limit
  bool upper = true;        ///< true: ok when value ≤ limit; false: ok when value ≥ limit
  bool ok = true;
  std::string source;       ///< where the limit comes from
  std::string note;         ///< which case governs (direction, friction)
};

}  // namespace bandforge
