// What every detail sheet of a non-flat part shares (the drum, the band assembly): the frame,
// the notes at the bottom left, a parts table above the caution, the area left for the views,
// the scale choice (ISO 5455) and the caution and title block at the end.
#pragma once

#include <string>
#include <vector>

#include "drawing/annotate.hpp"
#include "drawing/canvas.hpp"
#include "drawing/sheet.hpp"
#include "drawing/table.hpp"
#include "geometry/projection.hpp"

namespace bandforge::drawing {

struct DetailPage {
  Box frame;        ///< drawing space inside the ISO 5457 frame
  Box title_block;
  Box caution;
  Box area;         ///< left for the views and their annotations
  double notes_top = 0;  ///< top of the notes (the area's left part may reach down to it)
  double table_top = 0;  ///< top of the table, or of the caution without a table
  Occupancy occ;    ///< title block, caution, notes and table recorded
};

/// Starts the page: frame, the notes (wrapped, under a "NOTES" heading) at the bottom left and
/// `table` (if it has rows) above the caution box.
DetailPage start_detail_page(Canvas& c, const SheetSize& sheet, const std::vector<std::string>& notes,
                             const Table& table);

/// The caution and the title block (document type "Detail drawing", projection symbol).
void finish_detail_page(Canvas& c, const SheetSize& sheet, const DetailPage& page, TitleData title);

/// The largest ISO 5455 scale (enlargements 5:1 and 2:1 when `enlarge`) at which a drawing of
/// `w` × `h` model mm plus `extra_w` × `extra_h` sheet mm of annotation fits in `room`; the
/// smallest scale when none does.
Scale fitting_scale(double w, double h, double extra_w, double extra_h, const Box& room, bool enlarge);

/// The edges of a view turned into a part's frame: `origin` to (0, 0), the direction at `angle`
/// [rad] to +x; the bounding box recomputed.
geom::ProjectedView to_part_frame(const geom::ProjectedView& v, geom::Point2 origin, double angle);

}  // namespace bandforge::drawing
