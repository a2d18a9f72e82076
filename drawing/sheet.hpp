// The sheet: ISO 216 size, ISO 5457 frame with centring marks and grid references, ISO 5455
// scales, and our title block carrying the ISO 7200 data fields (REFERENCE §5.1–5.4).
#pragma once

#include <string>
#include <vector>

#include "drawing/canvas.hpp"

namespace bandforge::drawing {

struct SheetSize {
  std::string name;   ///< "A2", "A3", "A4"
  double width = 0;   ///< as drawn: A2/A3 landscape, A4 portrait [mm]
  double height = 0;  ///< [mm]
};

/// Known sheets; "" means A3. Throws BuildError for any other name.
SheetSize sheet_size(const std::string& name);

/// ISO 5455 scales, largest first (enlargements 2:1 … 50:1 are not used for a brake).
struct Scale {
  int num = 1;
  int den = 1;
  double factor() const { return static_cast<double>(num) / den; }
  std::string text() const { return std::to_string(num) + ":" + std::to_string(den); }
};
const std::vector<Scale>& standard_scales();

/// The drawing space inside the frame: 20 mm filing margin on the left, 10 mm elsewhere.
Box frame_box(const SheetSize& s);

/// ISO 3098 lettering heights used on the sheets [mm] (REFERENCE §5.7).
struct Lettering {
  static constexpr double label = 1.8;    ///< field labels in the title block
  static constexpr double body = 2.5;     ///< dimensions, tables, notes (min for A1–A4)
  static constexpr double heading = 3.5;  ///< table and section headings, balloons
  static constexpr double title = 5.0;    ///< drawing title
  static constexpr double number = 7.0;   ///< identification number on A0–A3
};

/// Title-block contents (ISO 7200 fields plus scale, units and projection method).
struct TitleData {
  std::string owner;          ///< legal owner
  std::string title;
  std::string supplementary;  ///< supplementary title
  std::string number;         ///< identification number
  std::string revision;
  std::string date;           ///< date of issue
  std::string creator;
  std::string approver;
  std::string doc_type;       ///< document type, e.g. "Assembly drawing"
  std::string scale;          ///< "1:5", or "—" for a sheet without views
  std::string units;          ///< "mm" or "in" (dimensions), plus the result units
  bool projection_symbol = true;  ///< draw the projection symbol
  bool third_angle = false;       ///< the third-angle symbol instead of the first-angle one
  int sheet = 1;
  int sheets = 1;
};

constexpr double kTitleBlockWidth = 180;  // ISO 7200: fits the A4 frame (REFERENCE §5.3)
constexpr double kTitleBlockHeight = 46;

/// Where the title block sits: bottom-right corner of the drawing space.
Box title_block_box(const SheetSize& s);

/// Frame, centring marks and grid reference fields.
void draw_frame(Canvas& c, const SheetSize& s);
void draw_title_block(Canvas& c, const SheetSize& s, const TitleData& t);

/// The ISO 5456-2 projection symbol, centred in `cell`: first angle, or third angle (mirrored).
void draw_projection_symbol(Canvas& c, Box cell, bool third_angle);

/// The caution every sheet carries (README "Safety").
const char* caution_text();

}  // namespace bandforge::drawing
