// Reports of a solved design: the readable table printed by `solve` and the JSON object of
// `solve --json`. The drawing's results table and calculation sheet read the same Solution.
#pragma once

#include <string>

#include <nlohmann/json.hpp>

#include "src/design.hpp"
#include "src/mechanics.hpp"
#include "src/units.hpp"

namespace bandforge {

/// The readable results table: inputs echoed with units, results, checks, warnings.
std::string text_report(const Design& design, const Solution& solution, UnitSystem units);

/// One JSON object, SI units, the unit as each key's suffix (README.md "JSON output").
nlohmann::json json_report(const Design& design, const Solution& solution);

}  // namespace bandforge
