// Internal to the assembly drawing (page 1): what its drawing steps share, and the steps.
#pragma once

#include <string>
#include <vector>

#include "drawing/annotate.hpp"
#include "drawing/assembly_sheet.hpp"
#include "drawing/views.hpp"

namespace bandforge::drawing {

constexpr double kMmPerM = 1000.0;  // the solids are in mm, the design in m
constexpr double kLevel = 7.0;      // spacing of stacked dimension lines [mm]

/// A design point [m] in model millimetres.
inline Pt mm(Vec2 v) { return {v.x * kMmPerM, v.y * kMmPerM}; }

/// Pivot, handle and pin centres in model millimetres.
struct Features {
  Pt pivot, handle, a, b;
};
Features features(const Design& d);

/// Horizontal coordinate dimensions go on the side of the drum where the pins are; vertical
/// ones on the side away from the handle.
bool dims_below(const Features& f);
bool dims_left(const Features& f);

/// Sorted distinct non-zero values (coordinates that need a dimension).
std::vector<double> distinct(std::vector<double> v);

Pt polar(Pt c, double r, double a);
/// Candidate positions on rings around `p`, from radius r0 to r1 [mm].
std::vector<Pt> around(Pt p, double r0, double r1);

/// Everything the steps of page 1 share.
struct Page1 {
  Canvas& c;
  Occupancy& occ;
  std::vector<std::string>& notes;  ///< annotations moved or dropped, for the notes
  const Design& d;
  const Solution& s;
  const AssemblyPlan& plan;
  UnitSystem u;
  Mapper front, side;
  double k = 1;  ///< sheet scale
  // Section sizes [model mm].
  double r = 0, t_l = 0, t = 0, b = 0, w = 0, band_outer = 0;
  Pt centre{};         ///< drum centre on the sheet
  double drum_cl = 0;  ///< half-length of the drum's centre lines [sheet mm]
  double pin_cl = 0;   ///< half-length of a pin's centre lines [sheet mm]
  Features f{};
  Box fv{};  ///< front view geometry [sheet mm]
  AssemblyDrawn drawn{};  ///< what found its place while drawing

  /// Places a linear dimension, or records in the notes that it had no room.
  void dimension(const LinearDim& dim, const std::string& what);
};

void draw_centre_lines(Page1& p);
/// A spring-applied brake: the spring's axis and its coils as straight lines inside the outline
/// its display solid projects (a simplified view, ISO 2162-1, from memory).
void draw_spring_coils(Page1& p);
void draw_band_detail(Page1& p);
void dimension_front_view(Page1& p);
void dimension_side_view(Page1& p);
void draw_rotation_and_ends(Page1& p);
void draw_balloons(Page1& p, const geom::BrakeModel& model);

/// The list of the sheets in the set as a ruled table: sheet n/N, title, size, columns as wide
/// as their text; `groups` entries side by side (1 or 2), trading height for width.
Table sheet_list_table(const Canvas& c, const std::vector<SheetEntry>& sheets, int groups);

/// The isometric view (plan.iso) in free space: the largest ISO 5455 scale, not above the sheet
/// scale, at which it finds room clear of everything drawn so far and of the main views' boxes.
/// False when it finds none at a legible size (nothing drawn).
bool draw_isometric(Page1& p);

/// A short note of what the sheet had no room for, in free room of the views area, else in the
/// notes.
void note_missing(Page1& p, const std::string& text);

}  // namespace bandforge::drawing
