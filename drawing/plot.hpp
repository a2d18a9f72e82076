// Vector x–y plots for the calculation sheet: axes with round-number ticks, curves, limit lines
// and a shaded region (e.g. where the brake self-locks).
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "drawing/canvas.hpp"

namespace bandforge::drawing {

struct Series {
  std::vector<Pt> points;  ///< data coordinates
  Pen pen = Pen::plot;
  std::string label;       ///< written at the curve's last point
};

struct RefLine {
  double value = 0;        ///< data coordinate (y for horizontal lines, x for vertical)
  bool horizontal = true;
  std::string label;
  Ink ink{0.8, 0, 0};
};

struct Plot {
  std::string title;
  std::string x_label, y_label;
  /// A second y axis on the right showing y·y2_factor (same curve, other quantity).
  std::optional<double> y2_factor;
  std::string y2_label;
  std::vector<Series> series;
  std::vector<RefLine> lines;
  /// Shaded x interval with a label, e.g. the self-locking range of friction.
  std::optional<std::pair<double, double>> shade;
  std::string shade_label;
  double x_min = 0, x_max = 1, y_min = 0, y_max = 1;  ///< data range (extended to round ticks)
};

/// "Nice" tick step (1, 2 or 5 × 10^k) giving about `n` intervals over `span`.
double nice_step(double span, int n);

/// Draws `p` inside `frame` (axes, labels and title included).
void draw_plot(Canvas& c, const Plot& p, Box frame);

}  // namespace bandforge::drawing
