// Detail sheets of the made parts (issue 10), between the assembly sheet and the calculation
// sheets. So far the flat plates: the lever, drawn in its own frame (pivot hole at the origin,
// the lever axis toward the handle along +x), and each frame bracket (its first hole at the
// origin, x toward its farthest hole), from the solid's exact projection: front view and the
// edge view below it (first angle; above it in third angle), overall dimensions, and a hole
// table whose coordinates are read from the projected hole circles, with the ISO 286 fit.
#pragma once

#include <string>
#include <vector>

#include "drawing/canvas.hpp"
#include "drawing/sheet.hpp"
#include "geometry/brake_model.hpp"
#include "src/mechanics.hpp"
#include "src/units.hpp"

namespace bandforge::drawing {

/// One hole of a detail sheet, in the part's frame [mm].
struct DetailHole {
  std::string name;  ///< "H1" …
  double x = 0, y = 0;
  double diameter = 0;
};

/// The made parts that get a detail sheet, in sheet order: "LEVER", then each frame-bracket part.
std::vector<std::string> detail_parts(const geom::BrakeModel& model);

/// Draws the detail sheet of `part` (a name from detail_parts()) on a new page of `c`; returns
/// its holes as tabulated.
std::vector<DetailHole> draw_detail_sheet(Canvas& c, const SheetSize& sheet, const Design& design,
                                          const geom::BrakeModel& model, const std::string& part,
                                          UnitSystem units, const TitleData& title);

}  // namespace bandforge::drawing
