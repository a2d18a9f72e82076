// Ruled tables (results, parts list, calculation sheet): fixed column widths, cells wrapped to
// their column, one header row set off by a wide rule.
#pragma once

#include <string>
#include <vector>

#include "drawing/canvas.hpp"

namespace bandforge::drawing {

struct Table {
  std::vector<double> widths;  ///< column widths [mm]
  std::vector<Align> align;    ///< per column (default left)
  std::vector<std::vector<std::string>> rows;  ///< rows[0] is the header when header = true
  bool header = true;
  double h = 2.5;              ///< letter height [mm]
  double pad = 1.0;            ///< horizontal cell padding [mm]
  /// Cells whose text starts with this marker are drawn in red (a failed check).
  std::string fail_marker = "FAIL";

  double width() const;
};

/// Height of the table when drawn (wrapped cells make taller rows).
double table_height(const Canvas& c, const Table& t);

/// Draws with the top-left corner at `top_left`; returns the height used.
double draw_table(Canvas& c, const Table& t, Pt top_left);

/// A table of the header (if any) and rows [first, last) of `t`.
Table table_rows(const Table& t, size_t first, size_t last);

/// How many body rows (after the header) fit, header included, in `height`.
size_t rows_fitting(const Canvas& c, const Table& t, double height);

/// Scales the columns so that the table is exactly `width` wide.
void fit_width(Table& t, double width);

}  // namespace bandforge::drawing
