// Graphical symbols of the detail sheets, drawn as the standards draw them (not as words):
// section hatching and cutting planes (ISO 128-40/-44/-50), the surface texture symbol
// (ISO 1302 / ISO 21920-1), the geometrical tolerance frame (ISO 1101) with the total-runout
// symbol, the datum feature indicator (ISO 5459) and the fillet-weld symbol (ISO 2553).
// Sizes follow the lettering height h = 2.5 mm (REFERENCE §5.7): frames 2h high.
#pragma once

#include <string>
#include <utility>
#include <vector>

#include "drawing/canvas.hpp"

namespace bandforge::drawing {

/// Hatches the region bounded by `loops` (sheet mm, even-odd rule) with narrow lines at `angle`
/// [rad] `spacing` apart (ISO 128-50: 45° thin lines). Returns the lines drawn (end points), so
/// that annotations can keep off them.
std::vector<std::pair<Pt, Pt>> hatch(Canvas& c, const std::vector<std::vector<Pt>>& loops, double angle,
                                     double spacing);

/// The cutting-plane mark of one end (ISO 128-44): a short wide stroke at `end` along `along`,
/// an arrow from it in the viewing direction `look`, and the letter beyond the arrow. Returns
/// the box it covers.
Box cutting_plane_end(Canvas& c, Pt end, Pt along, Pt look, const std::string& letter);

/// The ISO 1302 surface texture symbol, material removal required (basic symbol with the bar),
/// its tip at `tip` and the symbol above it, `text` (e.g. "Ra 1.6") under the extension of the
/// long leg. Legs H1 = 3.5 mm and H2 = 7.5 mm for h = 2.5 mm lettering (ISO 1302:2002 symbol
/// proportions, from memory).
Box surface_texture_symbol(Canvas& c, Pt tip, const std::string& text);
/// Its box without drawing it.
Box surface_texture_box(const Canvas& c, Pt tip, const std::string& text);

/// A tolerance frame (ISO 1101) for total runout: symbol cell, tolerance cell, datum cell;
/// `left_mid` the middle of its left side. Returns its box.
Box runout_frame(Canvas& c, Pt left_mid, const std::string& tolerance, const std::string& datum);
double runout_frame_width(const Canvas& c, const std::string& tolerance, const std::string& datum);
constexpr double kFrameHeight = 5.0;  ///< 2h for h = 2.5 mm

/// A datum feature indicator (ISO 5459): filled datum triangle with its base centred on `base`
/// (on the feature or its extension line) pointing along the unit vector `out` (away from the
/// feature), a leader of `leader` mm and the square frame with the letter. Returns the frame's box.
Box datum_indicator(Canvas& c, Pt base, Pt out, double leader, const std::string& letter);

/// A double fillet weld (ISO 2553, symmetric: both sides of the reference line, no
/// identification line): arrow at `joint`, arrow line to `knee`, horizontal reference line from
/// there toward `side` (+1 right, −1 left), leg size `leg` (e.g. "z4") left of each triangle.
/// Returns the box of the reference line, symbol and text.
Box fillet_weld_both_sides(Canvas& c, Pt joint, Pt knee, int side, const std::string& leg);
/// Its box without drawing it.
Box fillet_weld_box(const Canvas& c, Pt knee, int side, const std::string& leg);

}  // namespace bandforge::drawing
