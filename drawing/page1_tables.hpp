// The tables and notes of the assembly drawing: results for both rotations, parts list keyed
// to the balloons, general notes.
#pragma once

#include <string>
#include <vector>

#include "drawing/table.hpp"
#include "geometry/brake_model.hpp"
#include "src/design.hpp"
#include "src/mechanics.hpp"
#include "src/units.hpp"

namespace bandforge::drawing {

/// "CW" / "CCW".
const char* turn_word(Turn t);

/// Wrap, friction, tensions, torque, lever force, pressure and band stress against their
/// limits, self-locking and its margin: design rotation and reverse, nominal friction.
Table results_table(const Design& d, const Solution& s, UnitSystem u);

/// Item (= balloon number), name, quantity, material, mass of one.
Table parts_table(const geom::BrakeModel& model, UnitSystem u);

/// Units, reference dimensions, the phantom line.
std::vector<std::string> general_notes(const Design& d, const Solution& s, UnitSystem u);

}  // namespace bandforge::drawing
