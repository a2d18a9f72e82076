#include "drawing/detail_page.hpp"

#include <algorithm>
#include <cmath>

#include "drawing/assembly_sheet.hpp"
#include "drawing/text_fit.hpp"

namespace bandforge::drawing {

DetailPage start_detail_page(Canvas& c, const SheetSize& sheet, const std::vector<std::string>& notes,
                             const Table& table) {
  DetailPage p;
  c.new_page(sheet.width, sheet.height);
  draw_frame(c, sheet);
  p.frame = frame_box(sheet);
  p.title_block = title_block_box(sheet);
  p.caution = caution_box(c, sheet);
  const Box& f = p.frame;
  p.occ.set_limits(f);
  p.occ.add_box(p.title_block.grown(1));
  p.occ.add_box(p.caution.grown(1));
  // The table above the caution, as wide as the title block.
  double right_top = p.caution.y1;
  if (table.rows.size() > (table.header ? 1u : 0u)) {
    Table t = table;
    fit_width(t, p.title_block.width());
    const double th = table_height(c, t);
    const Pt top_left{p.title_block.x0, p.caution.y1 + 4 + th};
    draw_table(c, t, top_left);
    p.occ.add_box({top_left.x - 1, p.caution.y1, p.title_block.x1, top_left.y + 1});
    right_top = top_left.y;
  }
  // The notes beside the title block on landscape sheets, above the table on A4 portrait.
  const bool beside = p.title_block.x0 - f.x0 >= 150;
  const double x0 = f.x0 + 6;
  const double width = (beside ? p.title_block.x0 - 6 : f.x1 - 6) - x0;
  std::vector<std::string> lines;
  for (const std::string& n : notes) {
    const auto w = wrap_lines(c, n, Lettering::body, width);
    lines.insert(lines.end(), w.begin(), w.end());
  }
  const double step = Lettering::body * 1.6;
  double y = (beside ? f.y0 + 4 : right_top + 5) + Lettering::body * kDescent;
  for (auto it = lines.rbegin(); it != lines.rend(); ++it) {
    c.text({x0, y}, *it, Lettering::body);
    y += step;
  }
  c.text({x0, y + 1}, "NOTES", Lettering::body);
  const double notes_top = y + 1 + Lettering::body + 1;
  p.occ.add_box({x0 - 1, beside ? f.y0 : right_top, x0 + width + 1, notes_top});
  p.notes_top = notes_top;
  p.table_top = right_top;
  const double bottom = std::max(notes_top, right_top) + 4;
  p.area = {f.x0 + 4, bottom, f.x1 - 4, f.y1 - 4};
  return p;
}

void finish_detail_page(Canvas& c, const SheetSize& sheet, const DetailPage& page, TitleData title) {
  draw_caution(c, page.caution);
  title.doc_type = "Detail drawing";
  title.projection_symbol = true;
  draw_title_block(c, sheet, title);
}

Scale fitting_scale(double w, double h, double extra_w, double extra_h, const Box& room, bool enlarge) {
  std::vector<Scale> scales;
  if (enlarge) scales = {{5, 1}, {2, 1}};  // ISO 5455 enlargements (REFERENCE §5.4)
  for (const Scale& s : standard_scales()) scales.push_back(s);
  for (const Scale& s : scales) {
    const double k = s.factor();
    if (w * k + extra_w <= room.width() && h * k + extra_h <= room.height()) return s;
  }
  return scales.back();
}

geom::ProjectedView to_part_frame(const geom::ProjectedView& v, geom::Point2 origin, double angle) {
  const double c = std::cos(-angle), s = std::sin(-angle);
  auto turn = [&](geom::Point2 p) {
    const double x = p.x - origin.x, y = p.y - origin.y;
    return geom::Point2{c * x - s * y, s * x + c * y};
  };
  geom::ProjectedView out;
  out.min = {1e300, 1e300};
  out.max = {-1e300, -1e300};
  auto take = [&](geom::Point2 p) {
    out.min = {std::min(out.min.x, p.x), std::min(out.min.y, p.y)};
    out.max = {std::max(out.max.x, p.x), std::max(out.max.y, p.y)};
  };
  for (geom::ViewEdge e : v.edges) {
    e.a = turn(e.a);
    e.b = turn(e.b);
    e.centre = turn(e.centre);
    e.start -= angle;
    for (auto& p : e.points) p = turn(p);
    take(e.a);
    take(e.b);
    if (e.kind == geom::ViewEdge::Kind::arc) {
      take({e.centre.x - e.radius, e.centre.y - e.radius});
      take({e.centre.x + e.radius, e.centre.y + e.radius});
    }
    for (const auto& p : e.points) take(p);
    out.edges.push_back(std::move(e));
  }
  return out;
}

}  // namespace bandforge::drawing
