// Page 1, the assembly drawing: front view and view from the left in first-angle projection
// (exact hidden-line removal of the solids), a band-section detail, ISO 129 dimensions, rotation
// arrow, tight/slack labels, balloons, results table and parts list.
#pragma once

#include <string>
#include <vector>

#include "drawing/canvas.hpp"
#include "drawing/sheet.hpp"
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
  Box views;    ///< what is left for views and their annotations
};

struct AssemblyPlan {
  SheetSize sheet;
  Scale scale;
  Zones zones;
  geom::ProjectedView front;  ///< model mm
  geom::ProjectedView side;
  Pt front_origin;  ///< sheet position of the model origin (drum centre) in the front view
  Pt side_origin;   ///< sheet position of the model origin in the view from the left
  Pt drum_centre;   ///< = front_origin
  Box views_box;    ///< around both views' geometry [sheet mm]
  double hlr_ms = 0;  ///< hidden-line removal time of both views
};

/// Projects the views and chooses the scale ([drawing] scale, or the largest ISO 5455 scale at
/// which the views and their dimension space fit). Throws BuildError naming the sheet and the
/// scales tried when nothing fits.
AssemblyPlan plan_assembly(const Canvas& c, const Design& d, const Solution& s,
                           const geom::BrakeModel& model, const SheetSize& sheet);

/// Draws page 1 except frame, caution and title block. Notes on dropped or moved annotations
/// are appended to `notes`.
void draw_assembly(Canvas& c, const AssemblyPlan& plan, const Design& d, const Solution& s,
                   const geom::BrakeModel& model, const geom::BrakeModel* released, UnitSystem u,
                   std::vector<std::string>& notes);

/// The caution box above the title block (shared with the calculation sheet).
Box caution_box(const Canvas& c, const SheetSize& sheet);
void draw_caution(Canvas& c, const Box& box);

/// Supplementary title: "Simple band brake, drum Ø400, wrap 245.3°".
std::string assembly_subtitle(const Design& d, const Solution& s, UnitSystem u);

}  // namespace bandforge::drawing
