// ISO 129 dimensions, leaders, balloons and labels, placed so that no text overlaps another
// text, a view line, a table or the title block: every candidate position is tested against an
// occupancy record, and an annotation with no free position is dropped and reported.
#pragma once

#include <string>
#include <vector>

#include "drawing/canvas.hpp"

namespace bandforge::drawing {

/// A convex quadrilateral (a text's rectangle, possibly rotated), corners in order.
struct Quad {
  Pt p[4];
  static Quad of(const Box& b) { return {{{b.x0, b.y0}, {b.x1, b.y0}, {b.x1, b.y1}, {b.x0, b.y1}}}; }
};

/// What is already on the sheet: text and table areas, and line segments (view edges,
/// dimension lines).
class Occupancy {
 public:
  void add_box(const Box& b) { quads_.push_back(Quad::of(b)); }
  void add_quad(const Quad& q) { quads_.push_back(q); }
  void add_segment(Pt a, Pt b) { segs_.push_back({a, b}); }
  void add_polyline(const std::vector<Pt>& pts);
  void add_arc(Pt c, double r, double a0, double a1);
  /// Annotations must stay inside this box (the drawing space).
  void set_limits(const Box& b) { limits_ = b; }

  /// True when the area lies inside the limits and touches no recorded area and no segment.
  bool free(const Quad& q) const;
  bool free(const Box& b) const { return free(Quad::of(b)); }
  /// True when the segment crosses no recorded area (a leader or dimension line through text).
  bool segment_clear(Pt a, Pt b) const;
  /// A coarse map for finding room for a large box: cells of `cell` mm over `area`, row by row
  /// from the lower-left, 1 where a recorded area's bounding box or a segment reaches the cell.
  /// A box over 0-cells only is very likely free: confirm with free().
  std::vector<unsigned char> coverage(const Box& area, double cell, int& cols, int& rows) const;

 private:
  struct Seg {
    Pt a, b;
  };
  std::vector<Quad> quads_;
  std::vector<Seg> segs_;
  Box limits_{-1e9, -1e9, 1e9, 1e9};
};

/// Dimension style (ISO 129-1, REFERENCE §5.6): filled 30° arrowheads 3 mm long, text 2.5 mm
/// above the dimension line, extension lines 1 mm clear of the feature and 2 mm past the line.
struct DimStyle {
  double h = 2.5;
  double arrow = 3.0;
  double gap = 1.0;
  double overshoot = 2.0;
};

/// The area of text of height h whose baseline starts at `at` and runs along `angle`.
Quad text_quad(const Canvas& c, Pt at, const std::string& s, double h, double angle);
/// Its axis-aligned bounding box.
Box text_box(const Canvas& c, Pt at, const std::string& s, double h, double angle);

/// A filled arrowhead with its tip at `tip`, pointing along the unit vector `dir`.
void arrowhead(Canvas& c, Pt tip, Pt dir, double length = 3.0);

/// Linear dimension of the distance between feature points p1 and p2 measured along the unit
/// vector `along`. The dimension line lies at `level` = (point on it)·n, n = `along` turned
/// +90°; the first free level of `levels` is used.
struct LinearDim {
  Pt p1, p2;
  Pt along{1, 0};
  std::string text;
  std::vector<double> levels;
  bool ext1 = true, ext2 = true;  ///< draw the extension lines
};

/// Draws the first placement whose text is free; false when none is (nothing drawn).
bool place_linear(Canvas& c, Occupancy& occ, const LinearDim& d, const DimStyle& st = {});

/// Angular dimension about `centre` from polar angle a0 counter-clockwise to a1, with radial
/// extension lines from radius `from_r`; the arc radius is the first free of `radii`.
bool place_angular(Canvas& c, Occupancy& occ, Pt centre, double a0, double a1, double from_r,
                   const std::vector<double>& radii, const std::string& text,
                   const DimStyle& st = {});

/// Text with a leader to `target` (ending in a dot: the target lies on a part), at the first
/// free candidate position. Returns false when none is free.
bool place_label(Canvas& c, Occupancy& occ, Pt target, const std::vector<Pt>& candidates,
                 const std::string& text, double h, bool leader, Ink ink = {});

/// Balloon (circle with the item number) at the first free candidate, leader to `target`.
bool place_balloon(Canvas& c, Occupancy& occ, Pt target, const std::vector<Pt>& candidates,
                   const std::string& item);

}  // namespace bandforge::drawing
