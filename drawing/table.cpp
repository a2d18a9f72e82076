#include "drawing/table.hpp"

#include <algorithm>
#include <numeric>

#include "drawing/text_fit.hpp"

namespace bandforge::drawing {
namespace {

double pitch(const Table& t) { return t.h * 1.5; }  // ISO 3098 line pitch, tight end of 1.5–1.9 h

std::vector<std::string> cell_lines(const Canvas& c, const Table& t, size_t col, const std::string& s) {
  if (s.empty()) return {};
  return wrap_lines(c, s, t.h, t.widths[col] - 2 * t.pad);
}

double row_height(const Canvas& c, const Table& t, const std::vector<std::string>& row) {
  size_t lines = 1;
  for (size_t i = 0; i < row.size() && i < t.widths.size(); ++i) {
    lines = std::max(lines, cell_lines(c, t, i, row[i]).size());
  }
  return static_cast<double>(lines) * pitch(t) + 0.45 * t.h;
}

}  // namespace

double Table::width() const { return std::accumulate(widths.begin(), widths.end(), 0.0); }

Table table_rows(const Table& t, size_t first, size_t last) {
  Table part = t;
  part.rows.clear();
  if (t.header && !t.rows.empty()) part.rows.push_back(t.rows[0]);
  for (size_t i = first; i < last && i < t.rows.size(); ++i) part.rows.push_back(t.rows[i]);
  return part;
}

size_t rows_fitting(const Canvas& c, const Table& t, double height) {
  double used = t.header && !t.rows.empty() ? row_height(c, t, t.rows[0]) : 0;
  size_t n = 0;
  for (size_t i = t.header ? 1 : 0; i < t.rows.size(); ++i) {
    used += row_height(c, t, t.rows[i]);
    if (used > height) break;
    ++n;
  }
  return n;
}

void fit_width(Table& t, double width) {
  const double k = width / t.width();
  for (double& w : t.widths) w *= k;
}

double table_height(const Canvas& c, const Table& t) {
  double total = 0;
  for (const auto& row : t.rows) total += row_height(c, t, row);
  return total;
}

double draw_table(Canvas& c, const Table& t, Pt top_left) {
  const double total_w = t.width();
  double y = top_left.y;
  // A white ground hides whatever the frame put under the table (centring marks, grid ticks).
  c.fill_rect({top_left.x, top_left.y - table_height(c, t), top_left.x + total_w, top_left.y}, {1, 1, 1});
  c.pen(Pen::narrow);
  for (size_t r = 0; r < t.rows.size(); ++r) {
    const auto& row = t.rows[r];
    const double rh = row_height(c, t, row);
    if (r == 0 && t.header) c.fill_rect({top_left.x, y - rh, top_left.x + total_w, y}, {0.9, 0.9, 0.9});
    double x = top_left.x;
    for (size_t i = 0; i < row.size() && i < t.widths.size(); ++i) {
      const auto lines = cell_lines(c, t, i, row[i]);
      const Align a = i < t.align.size() ? t.align[i] : Align::left;
      const bool fail = !t.fail_marker.empty() && row[i].rfind(t.fail_marker, 0) == 0;
      const Ink ink = fail ? Ink{0.8, 0, 0} : Ink{};
      double ty = y - 0.225 * t.h - (pitch(t) - t.h) / 2 - t.h;
      for (const auto& line : lines) {
        const double tx = a == Align::left    ? x + t.pad
                          : a == Align::right ? x + t.widths[i] - t.pad
                                              : x + t.widths[i] / 2;
        c.text({tx, ty}, line, t.h, a, 0, ink);
        ty -= pitch(t);
      }
      x += t.widths[i];
    }
    y -= rh;
    c.pen(r == 0 && t.header ? Pen::wide : Pen::narrow);
    c.line({top_left.x, y}, {top_left.x + total_w, y});
  }
  // Outer border and column rules.
  c.pen(Pen::narrow);
  c.line({top_left.x, top_left.y}, {top_left.x + total_w, top_left.y});
  double x = top_left.x;
  for (size_t i = 0; i <= t.widths.size(); ++i) {
    c.line({x, top_left.y}, {x, y});
    if (i < t.widths.size()) x += t.widths[i];
  }
  return top_left.y - y;
}

}  // namespace bandforge::drawing
