// Reports of a solved design: the readable table printed by `solve` and the JSON object of
// `solve --json`. The drawing's results table and calculation sheet read the same Solution.
#pragma once

#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "src/design.hpp"
#include "src/mechanics.hpp"
#include "src/units.hpp"

namespace bandforge {

/// The readable results table: inputs echoed with units, results, checks, warnings.
std::string text_report(const Design& design, const Solution& solution, UnitSystem units);

/// One JSON object, SI units, the unit as each key's suffix (README.md "JSON output").
nlohmann::json json_report(const Design& design, const Solution& solution);

/// The generated hardware (src/hardware.hpp) as a JSON object (the "hardware" key of
/// `solve --json` and `build --json`); null for a design without pins.
nlohmann::json hardware_json(const HardwarePlan& hardware);

/// The generated hardware in a few readable lines: each band end's joint and whether it was
/// chosen automatically, each frame bracket, where the lever sits. For `solve`, the `build`
/// summary and the drawing's notes.
std::vector<std::string> hardware_summary(const HardwarePlan& hardware, UnitSystem units);

}  // namespace bandforge
