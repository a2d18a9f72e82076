// The PDF drawing of a solved brake: page 1 the assembly drawing (views from exact hidden-line
// removal of the solids, ISO 129 dimensions, results table, parts list), then the calculation
// sheet. Standard types only: libharu and OCCT stay inside drawing/ and geometry/.
#pragma once

#include <array>
#include <string>
#include <vector>

#include "geometry/brake_model.hpp"
#include "geometry/flat_patterns.hpp"
#include "src/design.hpp"
#include "src/mechanics.hpp"
#include "src/units.hpp"

namespace bandforge::drawing {

/// One sheet of the set, as the plan lays the set out (the assembly sheet lists them).
struct SheetEntry {
  int number = 0;     ///< n of n/N, 1 for the first sheet
  std::string title;  ///< "Assembly drawing", "Detail drawing LEVER", "Calculation sheet", …
  std::string size;   ///< ISO 216 size it is drawn on: "A3"
};

/// A box on page 1 and what it holds, mm from the sheet's lower-left corner: x0, y0, x1, y1.
struct PlacedBox {
  std::string what;  ///< "front view", "side view", "isometric view", "parts list", …
  std::array<double, 4> box{};
};

/// Where things land on the sheets, so that callers and tests can find them.
struct SheetPlan {
  std::string sheet;        ///< "A2", "A3", "A4"
  double width_mm = 0;      ///< sheet as drawn (A2/A3 landscape, A4 portrait)
  double height_mm = 0;
  bool assembly = false;    ///< page 1 is the assembly drawing (false: a concept design)
  int scale_num = 1;        ///< assembly scale num:den (ISO 5455)
  int scale_den = 1;
  /// Drum centre in the front view, mm from the sheet's lower-left corner (PDF convention).
  double drum_x_mm = 0;
  double drum_y_mm = 0;
  /// Drum centre in the view from the left (the side view), same convention.
  double side_x_mm = 0;
  double side_y_mm = 0;
  bool third_angle = false;  ///< views placed in third-angle projection ([drawing] projection)
  /// Title block box, mm from the lower-left corner: x0, y0, x1, y1.
  double title_block[4] = {0, 0, 0, 0};
  /// Box around all view geometry (front, side and their centre lines) on page 1.
  double views_box[4] = {0, 0, 0, 0};
  /// The isometric view on page 1 (ISO 5456-3): box around its edges and label, mm from the
  /// lower-left corner; all zero when it had no room (a note on the sheet says so).
  double iso_box[4] = {0, 0, 0, 0};
  int iso_scale_num = 0;    ///< its ISO 5455 scale num:den; 0:0 when omitted
  int iso_scale_den = 0;
  /// Everything page 1 carries in a box: the views, detail X, the isometric view, the tables,
  /// the notes, the caution and the title block (for tests of overlap).
  std::vector<PlacedBox> page1_boxes;
  /// The sheets of the set in order, as listed on page 1 (empty for a concept design).
  std::vector<SheetEntry> sheet_list;
  int pages = 0;            ///< total pages in the PDF
  int detail_sheets = 0;    ///< detail sheets after the assembly sheet (drum, band, lever, each bracket)
  /// The lever sheet's hole table: x, y (lever frame, from the pivot hole) and diameter [mm].
  std::vector<std::array<double, 3>> lever_holes;
  /// The drum's detail sheet: its page, and the boxes of its surface texture symbol, total-runout
  /// frame and datum A frame (x0, y0, x1, y1, mm from the lower-left corner).
  int drum_page = 0;
  std::array<double, 4> drum_texture_symbol{};
  std::array<double, 4> drum_runout_frame{};
  std::array<double, 4> drum_datum{};
  int band_page = 0;  ///< the band assembly's detail sheet
  double hlr_ms = 0;        ///< hidden-line removal time of the two main views [ms]
  double iso_hlr_ms = 0;    ///< hidden-line removal time of the isometric view [ms]
  std::vector<std::string> notes;  ///< dimensions moved or dropped, and why
};

/// The fab pack's cut list for the calculation sheet's table: the rows geom::cut_list() gives
/// (those of OUTDIR/fab/cutlist.csv), taken as they are. Empty: no table (a concept design).
using CutList = std::vector<geom::CutListRow>;

/// The sheet and scale for this design: [drawing] sheet/scale when given (checked to fit),
/// otherwise A3 at the largest ISO 5455 scale at which the views fit. Throws BuildError naming
/// the sheet and the scales tried when nothing fits. `model` may be null (concept design).
SheetPlan plan_drawing(const Design& design, const Solution& solution,
                       const geom::BrakeModel* model, const CutList& cut_list,
                       UnitSystem units = UnitSystem::si);

/// Writes the PDF to `path` (through a temporary file renamed when complete). `model` is the
/// applied-state assembly (null for a concept design: calculation sheet only); `released` the
/// released state, drawn as the lever's phantom position (may be null); `cut_list` the rows of
/// the cut-list table on the calculation sheet.
/// Throws BuildError (layout cannot fit, libharu failure) or IoError (cannot write).
SheetPlan write_drawing(const Design& design, const Solution& solution,
                        const geom::BrakeModel* model, const geom::BrakeModel* released,
                        const CutList& cut_list, UnitSystem units, const std::string& path);

/// The same document as bytes (what write_drawing writes). With `sheets`: also each sheet as a
/// PDF of its own, in sheet order (`build --sheets separate`), from the same single drawing pass.
std::string render_drawing(const Design& design, const Solution& solution,
                           const geom::BrakeModel* model, const geom::BrakeModel* released,
                           const CutList& cut_list, UnitSystem units, SheetPlan* plan = nullptr,
                           std::vector<std::string>* sheets = nullptr);

}  // namespace bandforge::drawing
