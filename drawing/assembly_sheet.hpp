// Page 1, the assembly drawing: front view and view from the left in first-angle projection
// (exact hidden-line removal of the solids), a band-section detail, ISO 129 dimensions, rotation
// arrow, tight/slack labels, balloons, results table and parts list, an isometric view (ISO 5456-3)
// and the list of the sheets in the set.
#pragma once

#include <string>
#include <vector>

#include "drawing/canvas.hpp"
#include "drawing/drawing.hpp"
#include "drawing/sheet.hpp"
#include "drawing/table.hpp"
#include "geometry/brake_model.hpp"
#include "geometry/projection.hpp"
#include "src/design.hpp"
#include "src/mechanics.hpp"
#include "src/units.hpp"

namespace bandforge::drawing {

/// The zones of page 1 [sheet mm].
struct Zones {
  Box title_block;
  Box caution;
  Box parts;    ///< parts list
  Box results;  ///< results table
  Box notes;    ///< general notes
  Box sheets;   ///< list of the sheets in the set (placed with the views, see plan_assembly)
  Box views;    ///< what is left for views and their annotations
};

struct AssemblyPlan {
  SheetSize sheet;
  Scale scale;
  Zones zones;
  geom::ProjectedView front;  ///< model mm
  geom::ProjectedView side;
  geom::ProjectedView iso;  ///< isometric view, visible edges only (ISO 5456-3)
  Table sheet_list;         ///< the sheets of the set, drawn in zones.sheets
  bool sheet_list_omitted = false;  ///< no room for the list at any scale the views fit (a note says so)
  bool results_omitted = false;  ///< portrait sheet: no room for the results table (a note says so)
  Pt front_origin;  ///< sheet position of the model origin (drum centre) in the front view
  Pt side_origin;   ///< sheet position of the model origin in the view from the left
  Pt drum_centre;   ///< = front_origin
  Box views_box;    ///< around both views' geometry [sheet mm]
  double hlr_ms = 0;  ///< hidden-line removal time of both views
  double iso_ms = 0;  ///< hidden-line removal time of the isometric view
};

/// What draw_assembly placed while drawing, beside the planned views and zones [sheet mm].
struct AssemblyDrawn {
  bool iso = false;       ///< the isometric view found room (else a note says it did not)
  Box iso_box;            ///< around its edges and its label
  Scale iso_scale;        ///< its ISO 5455 scale
  bool detail_x = false;  ///< the band-section detail found room
  Box detail_x_box;       ///< around detail X and its label
  Box notes_box;          ///< the notes as drawn (they may move above the tables)
};

/// Projects the views and chooses the scale ([drawing] scale, or the largest ISO 5455 scale at
/// which the views and their dimension space fit) and the place of the list of `sheets`: above
/// the parts list (above the notes on A4) when that costs the views no scale, else in free space
/// beside them, else there at a smaller scale. Throws BuildError naming the sheet and the scales
/// tried when nothing fits.
AssemblyPlan plan_assembly(const Canvas& c, const Design& d, const Solution& s,
                           const geom::BrakeModel& model, const SheetSize& sheet,
                           const std::vector<SheetEntry>& sheets);

/// Draws page 1 except frame, caution and title block. Notes on dropped or moved annotations
/// are appended to `notes`; returns what found its place while drawing.
AssemblyDrawn draw_assembly(Canvas& c, const AssemblyPlan& plan, const Design& d, const Solution& s,
                            const geom::BrakeModel& model, const geom::BrakeModel* released,
                            UnitSystem u, std::vector<std::string>& notes);

/// The caution box above the title block (shared with the calculation sheet).
Box caution_box(const Canvas& c, const SheetSize& sheet);
void draw_caution(Canvas& c, const Box& box);

/// Supplementary title: "Simple band brake, drum Ø400, wrap 245.3°".
std::string assembly_subtitle(const Design& d, const Solution& s, UnitSystem u);

}  // namespace bandforge::drawing
