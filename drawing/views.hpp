// Projected views on the sheet: model millimetres mapped by scale and origin, strokes in the
// ISO 128 line types (hidden dashed narrow, smooth edges fine, visible continuous wide).
#pragma once

#include <vector>

#include "drawing/annotate.hpp"
#include "drawing/canvas.hpp"
#include "geometry/projection.hpp"

namespace bandforge::drawing {

/// Model millimetres (view coordinates) → sheet millimetres.
struct Mapper {
  Pt origin;   ///< sheet position of the model origin
  double k = 1;  ///< scale factor
  Pt operator()(geom::Point2 p) const { return {origin.x + p.x * k, origin.y + p.y * k}; }
  Pt operator()(Pt p) const { return {origin.x + p.x * k, origin.y + p.y * k}; }
};

/// The edge as points on the sheet (arcs in chords of about 1.5 mm).
std::vector<Pt> sample(const geom::ViewEdge& e, const Mapper& m);

enum class ViewStyle {
  normal,   ///< hidden, smooth and visible edges in their line types
  phantom,  ///< visible sharp edges only, ISO 128 type 05.1 (extreme position of a moving part)
};

/// Strokes the view and records its edges in `occ` so that annotations keep off them.
void draw_view(Canvas& c, Occupancy& occ, const geom::ProjectedView& v, const Mapper& m, ViewStyle style);

/// The part of a view inside `window` (view coordinates), drawn through `m` (a detail view).
void draw_clipped(Canvas& c, const geom::ProjectedView& v, const Box& window, const Mapper& m);

}  // namespace bandforge::drawing
