// One verified figure against its limit: what the mechanics and the generated hardware report,
// and what the text report, the JSON and the calculation sheet list.
#pragma once

#include <string>
#include <utility>

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

/// A check with its verdict: ok when value ≤ limit (`upper`) or value ≥ limit.
inline Check make_check(std::string id, std::string title, double value, double limit,
                        std::string unit, bool upper, std::string source, std::string note) {
  Check c;
  c.id = std::move(id);
  c.title = std::move(title);
  c.value = value;
  c.limit = limit;
  c.unit = std::move(unit);
  c.upper = upper;
  c.ok = upper ? value <= limit : value >= limit;
  c.source = std::move(source);
  c.note = std::move(note);
  return c;
}

}  // namespace bandforge
