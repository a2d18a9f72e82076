// The calculation sheet: method, inputs, layout, forces by direction and friction, capacity,
// thermal duty, checks with their sources, warnings, the plots and the cut list — as blocks to
// flow over the sheet's columns.
#pragma once

#include <vector>

#include "drawing/flow.hpp"
#include "geometry/flat_patterns.hpp"
#include "src/design.hpp"
#include "src/mechanics.hpp"
#include "src/units.hpp"

namespace bandforge::drawing {

/// The sheet's blocks in order. `cut` is the cut list (geom::cut_list, the rows of
/// fab/cutlist.csv); empty (a concept design): no cut-list section.
std::vector<Block> calculation_blocks(const Design& d, const Solution& s,
                                      const std::vector<geom::CutListRow>& cut, UnitSystem u);

/// The drum rotation (seen from the front) that makes end A (or B) the tight end.
Turn rotation_for(const Solution& s, bool a_tight);

}  // namespace bandforge::drawing
