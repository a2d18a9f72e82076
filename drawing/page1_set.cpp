// Page 1 steps about the set as a whole: the list of its sheets, and the isometric view
// (ISO 5456-3) that shows the assembly at a glance beside the orthographic views.
#include <algorithm>
#include <array>
#include <cmath>
#include <memory>
#include <optional>

#include "drawing/page1.hpp"
#include "drawing/text_fit.hpp"

namespace bandforge::drawing {
namespace {

// Below this size on paper the isometric view shows nothing the main views do not: leave it
// out (its larger side, mm; common practice, no source).
constexpr double kIsoMinSize = 30;
// Clear paper around the isometric view and its label [mm].
constexpr double kIsoMargin = 4;
// Cell of the coarse occupancy map searched for room [mm].
constexpr double kCell = 1;

// Sums over the cells of a 0/1 grid: any rectangle's count in four look-ups.
class CellSums {
 public:
  CellSums(const std::vector<unsigned char>& grid, int cols, int rows)
      : cols_(cols), sums_(static_cast<size_t>(cols + 1) * static_cast<size_t>(rows + 1), 0) {
    for (int j = 0; j < rows; ++j)
      for (int i = 0; i < cols; ++i)
        at(i + 1, j + 1) = grid[static_cast<size_t>(j) * static_cast<size_t>(cols) + static_cast<size_t>(i)] +
                           at(i, j + 1) + at(i + 1, j) - at(i, j);
  }
  /// Marked cells in columns [i0, i1) and rows [j0, j1).
  int count(int i0, int j0, int i1, int j1) const { return get(i1, j1) - get(i0, j1) - get(i1, j0) + get(i0, j0); }

 private:
  int& at(int i, int j) { return sums_[static_cast<size_t>(j) * static_cast<size_t>(cols_ + 1) + static_cast<size_t>(i)]; }
  int get(int i, int j) const { return sums_[static_cast<size_t>(j) * static_cast<size_t>(cols_ + 1) + static_cast<size_t>(i)]; }
  int cols_;
  std::vector<int> sums_;
};

}  // namespace

Table sheet_list_table(const Canvas& c, const std::vector<SheetEntry>& sheets, int groups) {
  Table t;
  const int n = static_cast<int>(sheets.size());
  const int rows = (n + groups - 1) / groups;
  const std::array<std::string, 3> head = {"Sheet", "Sheets in this set", "Size"};
  auto number = [&](const SheetEntry& e) { return std::to_string(e.number) + "/" + std::to_string(n); };
  // Each column as wide as its widest cell, so that no title wraps; 1 mm spare against rounding.
  std::array<double, 3> w{};
  auto fit = [&](int col, const std::string& s) {
    w[static_cast<size_t>(col)] = std::max(w[static_cast<size_t>(col)], c.text_width(s, t.h) + 2 * t.pad + 1);
  };
  for (int i = 0; i < 3; ++i) fit(i, head[static_cast<size_t>(i)]);
  for (const SheetEntry& e : sheets) {
    fit(0, number(e));
    fit(1, e.title);
    fit(2, e.size);
  }
  std::vector<std::string> header;
  for (int g = 0; g < groups; ++g) {
    t.widths.insert(t.widths.end(), w.begin(), w.end());
    t.align.insert(t.align.end(), {Align::centre, Align::left, Align::centre});
    header.insert(header.end(), head.begin(), head.end());
  }
  t.rows.push_back(header);
  // Down the first group, then the next.
  for (int r = 0; r < rows; ++r) {
    std::vector<std::string> row;
    for (int g = 0; g < groups; ++g) {
      const int k = g * rows + r;
      if (k < n) {
        const SheetEntry& e = sheets[static_cast<size_t>(k)];
        row.insert(row.end(), {number(e), e.title, e.size});
      } else {
        row.insert(row.end(), {"", "", ""});
      }
    }
    t.rows.push_back(row);
  }
  return t;
}

namespace {

// The free room of page 1 as drawn so far: a 1 mm map of the occupancy record plus the main
// views' boxes, which belong to them even where blank (a view or note set inside the front
// view's box would read as part of it).
class Room {
 public:
  explicit Room(const Page1& p) : p_(p), area_(p.plan.zones.views) {
    std::vector<unsigned char> grid = p.occ.coverage(area_, kCell, cols_, rows_);
    const Box side{p.side(p.plan.side.min).x, p.side(p.plan.side.min).y, p.side(p.plan.side.max).x,
                   p.side(p.plan.side.max).y};
    for (const Box& b : {p.fv.grown(kIsoMargin), side.grown(kIsoMargin)}) {
      const int i0 = cell(b.x0 - area_.x0, cols_), i1 = cell(b.x1 - area_.x0, cols_);
      const int j0 = cell(b.y0 - area_.y0, rows_), j1 = cell(b.y1 - area_.y0, rows_);
      for (int j = j0; j <= j1; ++j)
        for (int i = i0; i <= i1; ++i) grid[static_cast<size_t>(j) * static_cast<size_t>(cols_) + static_cast<size_t>(i)] = 1;
    }
    sums_ = std::make_unique<CellSums>(grid, cols_, rows_);
  }

  /// A w × h box with `kIsoMargin` of clear paper around it, nearest `prefer` (its upper-right
  /// corner), confirmed against the exact record; none when the page has no such room.
  std::optional<Box> find(double w, double h, Pt prefer) const {
    const int cw = static_cast<int>(std::ceil((w + 2 * kIsoMargin) / kCell));
    const int ch = static_cast<int>(std::ceil((h + 2 * kIsoMargin) / kCell));
    struct Spot {
      double score;
      Box box;
    };
    std::vector<Spot> spots;
    for (int j = 0; j + ch <= rows_; ++j) {
      for (int i = 0; i + cw <= cols_; ++i) {
        if (sums_->count(i, j, i + cw, j + ch) != 0) continue;
        const Box b{area_.x0 + i * kCell + kIsoMargin, area_.y0 + j * kCell + kIsoMargin,
                    area_.x0 + i * kCell + kIsoMargin + w, area_.y0 + j * kCell + kIsoMargin + h};
        spots.push_back({std::hypot(prefer.x - b.x1, prefer.y - b.y1), b});
      }
    }
    const auto before = [](const Spot& a, const Spot& b) {
      return a.score < b.score || (a.score == b.score && (a.box.x0 < b.box.x0 || (a.box.x0 == b.box.x0 && a.box.y0 < b.box.y0)));
    };
    // Best first; the map is coarse, so the exact record decides (the first spot nearly always passes).
    while (!spots.empty()) {
      const auto best = std::min_element(spots.begin(), spots.end(), before);
      const Spot s = *best;
      *best = spots.back();
      spots.pop_back();
      if (p_.occ.free(s.box.grown(kIsoMargin))) return s.box;
    }
    return std::nullopt;
  }

  const Box& area() const { return area_; }

 private:
  int cell(double v, int n) const { return std::clamp(static_cast<int>(std::floor(v / kCell)), 0, n - 1); }
  const Page1& p_;
  Box area_;
  int cols_ = 0, rows_ = 0;
  std::unique_ptr<CellSums> sums_;
};

}  // namespace

bool draw_isometric(Page1& p) {
  const geom::ProjectedView& v = p.plan.iso;
  if (v.edges.empty()) return false;
  const Room room(p);
  // Nearest the top right of the views area: away from the tables, where a reader looks after
  // the main views.
  const Pt corner{room.area().x1, room.area().y1};
  const double label_h = Lettering::heading + 3;
  for (const Scale& sc : standard_scales()) {
    const double k = sc.factor();
    if (k > p.k * (1 + 1e-9)) continue;
    const double w = (v.max.x - v.min.x) * k, h = (v.max.y - v.min.y) * k;
    if (std::max(w, h) < kIsoMinSize) break;  // smaller scales only make it smaller
    const std::string label = "ISOMETRIC (" + sc.text() + ")";
    const double bw = std::max(w, p.c.text_width(label, Lettering::heading)), bh = h + label_h;
    const std::optional<Box> box = room.find(bw, bh, corner);
    if (!box) continue;
    const Mapper m{{box->x0 + (bw - w) / 2 - v.min.x * k, box->y0 + label_h - v.min.y * k}, k};
    draw_view(p.c, p.occ, v, m, ViewStyle::normal);
    p.c.text({(box->x0 + box->x1) / 2, box->y0 + 0.5}, label, Lettering::heading, Align::centre);
    p.occ.add_box(box->grown(1));
    p.drawn.iso = true;
    p.drawn.iso_box = *box;
    p.drawn.iso_scale = sc;
    return true;
  }
  return false;
}

void note_missing(Page1& p, const std::string& text) {
  // In free room of the views area, as a short block: on a crowded sheet (A4) the notes have no
  // line to spare above the tables.
  const Room room(p);
  const double pitch = Lettering::body * 1.65;
  for (double w : {120.0, 90.0, 70.0, 55.0, 45.0, 35.0}) {
    const std::vector<std::string> lines = wrap_lines(p.c, text, Lettering::body, w);
    double used = 0;
    for (const auto& l : lines) used = std::max(used, p.c.text_width(l, Lettering::body));
    const double h = static_cast<double>(lines.size()) * pitch;
    const std::optional<Box> box = room.find(used, h, {room.area().x1, room.area().y1});
    if (!box) continue;
    double y = box->y1 - Lettering::body;
    for (const auto& l : lines) {
      p.c.text({box->x0, y}, l, Lettering::body);
      y -= pitch;
    }
    p.occ.add_box(box->grown(1));
    return;
  }
  p.notes.push_back(text);
}

}  // namespace bandforge::drawing
