#include "drawing/sheet.hpp"

#include <cmath>
#include <numbers>

#include "drawing/text_fit.hpp"
#include "src/errors.hpp"

namespace bandforge::drawing {

SheetSize sheet_size(const std::string& name) {
  // ISO 216 trimmed sizes (REFERENCE §5.1); A4 portrait as ISO 5457 prescribes.
  if (name.empty() || name == "A3") return {"A3", 420, 297};
  if (name == "A2") return {"A2", 594, 420};
  if (name == "A4") return {"A4", 210, 297};
  throw BuildError("drawing: unknown sheet \"" + name + "\" (valid: A2, A3, A4)");
}

const std::vector<Scale>& standard_scales() {
  // ISO 5455 full size and reductions (REFERENCE §5.4); no 1:2.5 (a national extension).
  static const std::vector<Scale> scales = {{1, 1},  {1, 2},   {1, 5},   {1, 10},
                                            {1, 20}, {1, 50},  {1, 100}};
  return scales;
}

Box frame_box(const SheetSize& s) { return {20, 10, s.width - 10, s.height - 10}; }

Box title_block_box(const SheetSize& s) {
  const Box f = frame_box(s);
  return {f.x1 - kTitleBlockWidth, f.y0, f.x1, f.y0 + kTitleBlockHeight};
}

namespace {

// Grid fields are 50 mm long, measured outward from the centring marks (ISO 5457:1999).
std::vector<double> grid_ticks(double lo, double hi, double centre) {
  std::vector<double> t;
  for (double x = centre; x > lo + 1e-9; x -= 50) t.insert(t.begin(), x);
  for (double x = centre + 50; x < hi - 1e-9; x += 50) t.push_back(x);
  return t;
}

std::string grid_letter(int i) {
  // Capital letters without I and O (they read as 1 and 0).
  static const char* letters = "ABCDEFGHJKLMNPQRSTUVWXYZ";
  return std::string(1, letters[i % 24]);
}

}  // namespace

void draw_frame(Canvas& c, const SheetSize& s) {
  const Box f = frame_box(s);
  c.pen(Pen::frame);
  c.rect(f);
  // Centring marks on the four axes of symmetry, from the trimmed edge to 5 mm inside the frame.
  const double cx = s.width / 2, cy = s.height / 2;
  c.line({cx, 0}, {cx, f.y0 + 5});
  c.line({cx, s.height}, {cx, f.y1 - 5});
  c.line({0, cy}, {f.x0 + 5, cy});
  c.line({s.width, cy}, {f.x1 - 5, cy});

  // Grid reference fields: numerals along the top and bottom, letters down the sides, counted
  // from the top-left corner (opposite the title block).
  c.pen(Pen::narrow);
  const auto xs = grid_ticks(f.x0, f.x1, cx);
  const auto ys = grid_ticks(f.y0, f.y1, cy);
  const double h = Lettering::body;
  for (double x : xs) {
    c.line({x, f.y0}, {x, f.y0 - 5});
    c.line({x, f.y1}, {x, f.y1 + 5});
  }
  for (double y : ys) {
    c.line({f.x0, y}, {f.x0 - 5, y});
    c.line({f.x1, y}, {f.x1 + 5, y});
  }
  std::vector<double> xb = {f.x0};
  xb.insert(xb.end(), xs.begin(), xs.end());
  xb.push_back(f.x1);
  for (size_t i = 0; i + 1 < xb.size(); ++i) {
    const double mid = (xb[i] + xb[i + 1]) / 2;
    const std::string n = std::to_string(i + 1);
    c.text({mid, f.y1 + 5 - h / 2}, n, h, Align::centre);
    c.text({mid, f.y0 - 5 - h / 2}, n, h, Align::centre);
  }
  std::vector<double> yb = {f.y1};
  for (auto it = ys.rbegin(); it != ys.rend(); ++it) yb.push_back(*it);
  yb.push_back(f.y0);
  for (size_t i = 0; i + 1 < yb.size(); ++i) {
    const double mid = (yb[i] + yb[i + 1]) / 2 - h / 2;
    const std::string l = grid_letter(static_cast<int>(i));
    c.text({f.x0 - 10, mid}, l, h, Align::centre);
    c.text({f.x1 + 5, mid}, l, h, Align::centre);
  }
}

void draw_projection_symbol(Canvas& c, Box cell, bool third_angle) {
  // ISO 5456-2: a truncated cone seen from the side, small end toward the other view, and the
  // view from the small end: two concentric circles, the small end face in front of the large
  // one. First angle places that view on the right of the cone; third angle on its left (the
  // whole symbol mirrored).
  const double big = std::min(cell.height() * 0.42, cell.width() * 0.16);  // large end radius
  const double small = big / 2;
  const double length = 2 * big, gap = 0.8 * big;
  const double cy = (cell.y0 + cell.y1) / 2;
  const double mid = (cell.x0 + cell.x1) / 2;
  const double half = (length + gap + 2 * big) / 2;
  // x measured from the symbol's left end in first angle; mirrored about `mid` in third.
  const auto X = [&](double u) { return third_angle ? mid + half - u : mid - half + u; };
  c.pen(Pen::wide);
  c.polyline({{X(0), cy - small}, {X(length), cy - big}, {X(length), cy + big}, {X(0), cy + small},
              {X(0), cy - small}});
  const Pt cc{X(length + gap + big), cy};
  c.circle(cc, big);
  c.circle(cc, small);
  c.pen(Pen::centre);
  c.line({X(-1), cy}, {X(length + gap + 2 * big + 1), cy});
  c.line({cc.x, cy - big - 1}, {cc.x, cy + big + 1});
}

namespace {

struct Cell {
  double x0, x1;  // relative to the block's left edge
  const char* label;
  std::string value;
  double h;       // value letter height
};

void draw_row(Canvas& c, double left, double y_top, double row_h, const std::vector<Cell>& cells) {
  c.pen(Pen::narrow);
  for (const Cell& cell : cells) {
    const Box b{left + cell.x0, y_top - row_h, left + cell.x1, y_top};
    c.rect(b);
    c.text({b.x0 + 1.2, b.y1 - 1.2 - Lettering::label}, cell.label, Lettering::label, Align::left, 0,
           {0.3, 0.3, 0.3});
    if (!cell.value.empty()) {
      const double w = b.width() - 2.4;
      const double h = fitted_height(c, cell.value, cell.h, w);
      c.text({b.x0 + 1.2, b.y0 + 1.6}, ellipsize(c, cell.value, h, w), h);
    }
  }
}

}  // namespace

void draw_title_block(Canvas& c, const SheetSize& s, const TitleData& t) {
  const Box tb = title_block_box(s);
  const double L = tb.x0;
  double y = tb.y1;
  c.fill_rect(tb, {1, 1, 1});
  draw_row(c, L, y, 9,
           {{0, 110, "Legal owner", t.owner, Lettering::heading},
            {110, 180, "Document type", t.doc_type, Lettering::heading}});
  y -= 9;
  {
    const Box b{L, y - 14, L + 180, y};
    c.pen(Pen::narrow);
    c.rect(b);
    c.text({b.x0 + 1.2, b.y1 - 1.2 - Lettering::label}, "Title", Lettering::label, Align::left, 0,
           {0.3, 0.3, 0.3});
    const double w = b.width() - 2.4;
    const double h = fitted_height(c, t.title, Lettering::title, w);
    c.text({b.x0 + 1.2, b.y0 + 5.2}, ellipsize(c, t.title, h, w), h);
    c.text({b.x0 + 1.2, b.y0 + 1.4}, ellipsize(c, t.supplementary, Lettering::label, w),
           Lettering::label);
  }
  y -= 14;
  draw_row(c, L, y, 9,
           {{0, 45, "Creator", t.creator, Lettering::body},
            {45, 90, "Approval person", t.approver, Lettering::body},
            {90, 122, "Date of issue", t.date, Lettering::body},
            {122, 146, "Scale", t.scale, Lettering::heading},
            {146, 180, "Units", t.units, Lettering::body}});
  y -= 9;
  draw_row(c, L, y, 14,
           {{0, 90, "Identification number", t.number, Lettering::number},
            {90, 106, "Rev.", t.revision, Lettering::heading},
            {106, 130, "Sheet", std::to_string(t.sheet) + " / " + std::to_string(t.sheets),
             Lettering::heading},
            {130, 144, "Lang.", "en", Lettering::body},
            {144, 180, "Projection", "", Lettering::body}});
  const Box proj{L + 144, y - 14, L + 180, y - Lettering::label - 1.5};
  if (t.projection_symbol) draw_projection_symbol(c, proj, t.third_angle);
  c.pen(Pen::wide);
  c.rect(tb);
}

const char* caution_text() {
  return "CAUTION: a design aid, not an approval. A brake may hold loads over people: check these "
         "results against the applicable codes and have the design verified by a licensed engineer "
         "before it is built or used.";
}

}  // namespace bandforge::drawing
