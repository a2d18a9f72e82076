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

/// The made parts that get a detail sheet, in sheet order (issue 10): the drum ("DRUM"), the
/// band assembly (named by its band part, "BAND": band, lining and end joints), the lever, then
/// each frame-bracket part.
std::vector<std::string> detail_parts(const geom::BrakeModel& model);

/// The kind of a detail_parts() entry: "drum", "band", "lever" or "anchor".
std::string detail_kind(const geom::BrakeModel& model, const std::string& part);

/// Where the drum sheet drew its tolerance symbols [sheet mm from the lower-left corner].
struct DrumSheetMarks {
  Box texture_symbol;  ///< the ISO 1302 surface texture symbol with its "Ra 1.6"
  Box runout_frame;    ///< the ISO 1101 total-runout frame
  Box datum;           ///< the datum A frame (ISO 5459)
  int scale_num = 1, scale_den = 1;  ///< the sheet's ISO 5455 scale
};

/// The drum's sheet (drawing/detail_drum.cpp): view along the axis and section A–A, sizes from
/// the solid's section, bore fit and datum, friction-surface tolerance, runout and texture.
DrumSheetMarks draw_drum_sheet(Canvas& c, const SheetSize& sheet, const Design& design,
                               const geom::BrakeModel& model, UnitSystem units, const TitleData& title);

/// The band assembly's sheet (drawing/detail_band.cpp): the band with its lining and end joints
/// as wrapped, section B–B across band and lining, a detail of each end joint, the developed
/// length of the fab pack's band blank, rivets and blocks.
void draw_band_sheet(Canvas& c, const SheetSize& sheet, const Design& design, const Solution& solution,
                     const geom::BrakeModel& model, UnitSystem units, const TitleData& title);

/// Draws the detail sheet of `part` (a name from detail_parts()) on a new page of `c`; returns
/// its holes as tabulated.
std::vector<DetailHole> draw_detail_sheet(Canvas& c, const SheetSize& sheet, const Design& design,
                                          const geom::BrakeModel& model, const std::string& part,
                                          UnitSystem units, const TitleData& title);

}  // namespace bandforge::drawing
