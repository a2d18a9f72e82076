#include "drawing/detail_sheet.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>

#include "drawing/annotate.hpp"
#include "drawing/assembly_sheet.hpp"
#include "drawing/detail_page.hpp"
#include "drawing/format.hpp"
#include "drawing/table.hpp"
#include "drawing/views.hpp"
#include "geometry/projection.hpp"
#include "src/standard_parts.hpp"
#include "src/errors.hpp"
#include "src/fits.hpp"

namespace bandforge::drawing {
namespace {

std::string mm1(double v) {
  char buf[32];
  std::snprintf(buf, sizeof buf, "%.1f", std::abs(v) < 0.05 ? 0.0 : v);
  return buf;
}

}  // namespace

std::vector<std::string> detail_parts(const geom::BrakeModel& model) {
  std::vector<std::string> out;
  const std::vector<std::string> kinds = geom::part_kinds(model);
  for (const char* first : {"drum", "band"}) {
    for (std::size_t i = 0; i < model.parts().size(); ++i)
      if (kinds[i] == first) {
        out.push_back(model.parts()[i].name);
        break;
      }
  }
  for (std::size_t i = 0; i < model.parts().size(); ++i)
    if (kinds[i] == "lever") out.push_back(model.parts()[i].name);
  for (std::size_t i = 0; i < model.parts().size(); ++i)
    if (kinds[i] == "anchor") out.push_back(model.parts()[i].name);
  return out;
}

std::string detail_kind(const geom::BrakeModel& model, const std::string& part) {
  const std::vector<std::string> kinds = geom::part_kinds(model);
  for (std::size_t i = 0; i < model.parts().size(); ++i)
    if (model.parts()[i].name == part) return kinds[i];
  return "";
}

std::vector<DetailHole> draw_detail_sheet(Canvas& c, const SheetSize& sheet, const Design& d,
                                          const geom::BrakeModel& model, const std::string& part_name,
                                          UnitSystem u, const TitleData& title) {
  const geom::PartInfo* part = nullptr;
  std::string kind;
  const std::vector<std::string> kinds = geom::part_kinds(model);
  for (std::size_t i = 0; i < model.parts().size(); ++i) {
    if (model.parts()[i].name == part_name) {
      part = &model.parts()[i];
      kind = kinds[i];
    }
  }
  if (part == nullptr || part->instance_names.empty()) {
    throw BuildError("drawing: no part " + part_name + " for its detail sheet");
  }
  const bool lever = kind == "lever";
  geom::ProjectOptions only;
  only.smooth = false;
  only.kinds = {kind};
  only.instances = {part->instance_names.front()};
  const geom::ProjectedView raw = geom::project(model, geom::front_view(), only);
  // Bores: circles no larger than the largest pin; the outline's corner arcs are larger.
  const double max_bore = standard::clevis_nominal(d.band.pin_diameter) * 1000 / 2 + 0.01;
  std::vector<geom::Point2> bores;
  for (const geom::ViewEdge& e : raw.edges) {
    if (e.kind != geom::ViewEdge::Kind::arc || e.radius > max_bore) continue;
    const bool seen = std::any_of(bores.begin(), bores.end(), [&](geom::Point2 q) {
      return std::hypot(q.x - e.centre.x, q.y - e.centre.y) < 0.01;
    });
    if (!seen) bores.push_back(e.centre);
  }
  // The part's frame: the lever from its pivot toward the handle; a bracket from its first bore
  // (lowest x, then y) toward its farthest bore.
  geom::Point2 origin{d.lever.pivot.x * 1000, d.lever.pivot.y * 1000};
  double angle = std::atan2(d.lever.handle.y - d.lever.pivot.y, d.lever.handle.x - d.lever.pivot.x);
  if (!lever) {
    if (bores.empty()) throw BuildError("drawing: " + part_name + " has no bore to dimension from");
    origin = *std::min_element(bores.begin(), bores.end(), [](geom::Point2 a, geom::Point2 b) {
      return a.x < b.x - 1e-6 || (std::abs(a.x - b.x) <= 1e-6 && a.y < b.y);
    });
    double far = 0;
    angle = 0;
    for (geom::Point2 q : bores) {
      const double r = std::hypot(q.x - origin.x, q.y - origin.y);
      if (r > far + 1e-6) {
        far = r;
        angle = std::atan2(q.y - origin.y, q.x - origin.x);
      }
    }
  }
  const geom::ProjectedView front = to_part_frame(raw, origin, angle);
  // The edge view: looking at the plate's long edge from the frame's +y side (paper right = the
  // frame's x axis, up = −z).
  const geom::Vec3 along{std::cos(angle), std::sin(angle), 0}, side{-std::sin(angle), std::cos(angle), 0};
  const geom::ViewSpec edge_spec{side, along, part_name + " edge"};
  const geom::ProjectedView edge_raw = geom::project(model, edge_spec, only);
  // Its horizontal coordinate is the position along the frame's x axis from the model origin;
  // shift it so that the frame origin is at 0 like the front view.
  const double shift = origin.x * along.x + origin.y * along.y;
  geom::ProjectedView edge = to_part_frame(edge_raw, {shift, 0}, 0);
  const double thickness = edge.max.y - edge.min.y;

  std::vector<DetailHole> holes;
  for (const geom::ViewEdge& e : front.edges) {
    if (e.kind != geom::ViewEdge::Kind::arc || !e.visible || e.radius > max_bore) continue;
    const bool seen = std::any_of(holes.begin(), holes.end(), [&](const DetailHole& h) {
      return std::hypot(h.x - e.centre.x, h.y - e.centre.y) < 0.01;
    });
    if (!seen) holes.push_back({"", e.centre.x, e.centre.y, 2 * e.radius});
  }
  std::sort(holes.begin(), holes.end(), [](const DetailHole& a, const DetailHole& b) {
    return a.x < b.x - 1e-6 || (std::abs(a.x - b.x) <= 1e-6 && a.y < b.y);
  });
  for (std::size_t i = 0; i < holes.size(); ++i) holes[i].name = "H" + std::to_string(i + 1);

  c.new_page(sheet.width, sheet.height);
  draw_frame(c, sheet);
  const Box f = frame_box(sheet);
  const Box tb = title_block_box(sheet);
  const Box caution = caution_box(c, sheet);

  // Hole table and notes at the bottom left.
  Table t;
  t.widths = {14, 26, 26, 44};
  t.align = {Align::left, Align::right, Align::right, Align::left};
  t.rows.push_back({"Hole", "x", "y", "Size (ISO 286)"});
  const auto pin_fit = fits::fit(standard::clevis_nominal(d.band.pin_diameter), fits::kPinHole, fits::kPinShaft);
  for (const DetailHole& h : holes) {
    std::string size = "Ø" + mm1(h.diameter);
    if (pin_fit && std::abs(h.diameter - standard::clevis_nominal(d.band.pin_diameter) * 1000) < 0.01) size += std::string(" ") + fits::kPinHole;
    t.rows.push_back({h.name, mm1(h.x), mm1(h.y), size});
  }
  const double table_h = table_height(c, t);
  // Beside the title block on landscape sheets; above the caution on A4 portrait, where the title
  // block spans the drawing space.
  const bool beside = tb.x0 - f.x0 >= 150;
  const double base = beside ? f.y0 + 6 : caution.y1 + 6;
  const Pt table_top{f.x0 + 6, base + table_h};
  draw_table(c, t, table_top);

  std::vector<std::string> notes = {
      "Part " + part_name + ", quantity " + std::to_string(part->instance_names.size()) + ", " +
          part->material + " plate " + mm1(thickness) + " thick, mass " + qty(part->mass, Quantity::mass, u, 3) +
          " each.",
      lever ? "Hole coordinates in mm from the centre of H1 (the pivot), x along the lever axis toward the handle."
            : "Hole coordinates in mm from the centre of H1, x toward the farthest hole.",
      pin_fit ? "Holes " + pin_fit->designation().substr(0, pin_fit->designation().find(' ')) + " " +
                    fits::kPinHole + " (" + deviation_mm(pin_fit->hole.upper) + "/" + deviation_mm(pin_fit->hole.lower) +
                    " mm, ISO 286) for " + fits::kPinShaft + " pins."
              : "Holes: fit to be specified (size outside the ISO 286 table carried).",
      "General tolerances ISO 2768-mK. Remove burrs; break sharp edges 0.5."};
  if (lever) notes.push_back("The grip (part GRIP) is welded on at the handle end; see the assembly sheet.");
  double y = table_top.y + 6;
  for (auto it = notes.rbegin(); it != notes.rend(); ++it) {
    c.text({f.x0 + 6, y}, *it, Lettering::body);
    y += Lettering::body * 1.6;
  }
  c.text({f.x0 + 6, y + 1}, "NOTES", Lettering::body);
  const double notes_top = y + 1 + Lettering::body;

  // The views: as large an ISO 5455 scale as fits above the notes and left of the caution.
  const Box area{f.x0 + 12, notes_top + 10, f.x1 - 12, f.y1 - 12};
  const double w = front.max.x - front.min.x, h_front = front.max.y - front.min.y;
  const double h_edge = edge.max.y - edge.min.y;
  const double gap = 25;
  Scale chosen{1, 1};
  bool fits_any = false;
  for (const Scale& sc : standard_scales()) {
    const double k = sc.factor();
    if (w * k + 30 <= area.width() && (h_front + h_edge) * k + gap + 30 <= area.height()) {
      chosen = sc;
      fits_any = true;
      break;
    }
  }
  if (!fits_any) throw BuildError("drawing: " + part_name + " does not fit its detail sheet " + sheet.name);
  const double k = chosen.factor();
  const bool third = d.drawing.projection == Projection::third;
  const double x0 = (area.x0 + area.x1) / 2 - (front.min.x + w / 2) * k;
  const double top_view_y = area.y1 - 15;  // top of the upper view
  Mapper mf, me;
  if (!third) {
    mf = {{x0, top_view_y - front.max.y * k}, k};
    me = {{x0, top_view_y - h_front * k - gap - edge.max.y * k}, k};
  } else {
    me = {{x0, top_view_y - edge.max.y * k}, k};
    mf = {{x0, top_view_y - h_edge * k - gap - front.max.y * k}, k};
  }
  Occupancy occ;
  occ.set_limits(f);
  occ.add_box(tb.grown(1));
  occ.add_box(caution.grown(1));
  occ.add_box({table_top.x, beside ? f.y0 : base - 2, std::max(table_top.x + t.width(), beside ? tb.x0 - 2 : f.x1),
               notes_top + 2});
  draw_view(c, occ, front, mf, ViewStyle::normal);
  draw_view(c, occ, edge, me, ViewStyle::normal);
  // Centre lines of the holes and of the lever axis.
  c.pen(Pen::centre);
  for (const DetailHole& hole : holes) {
    const double r = hole.diameter / 2 * k + 2;
    const Pt p = mf(Pt{hole.x, hole.y});
    c.line({p.x - r, p.y}, {p.x + r, p.y});
    c.line({p.x, p.y - r}, {p.x, p.y + r});
    c.text(p + Pt{r * 0.7, r * 0.7}, hole.name, Lettering::body);
  }
  c.pen(Pen::narrow);
  // Overall length and width on the front view, the thickness on the edge view.
  const double below = front.min.y;
  place_linear(c, occ, {mf(Pt{front.min.x, below}), mf(Pt{front.max.x, below}), {1, 0},
                        dim_length((front.max.x - front.min.x) / 1000, u),
                        {mf(Pt{0, below}).y - 12, mf(Pt{0, below}).y - 20, mf(Pt{0, front.max.y}).y + 10}});
  place_linear(c, occ, {mf(Pt{front.min.x, front.min.y}), mf(Pt{front.min.x, front.max.y}), {0, 1},
                        dim_length((front.max.y - front.min.y) / 1000, u),
                        {-(mf(Pt{front.min.x, 0}).x - 10), -(mf(Pt{front.min.x, 0}).x - 18)}});
  place_linear(c, occ, {me(Pt{edge.min.x, edge.min.y}), me(Pt{edge.min.x, edge.max.y}), {0, 1},
                        dim_length(thickness / 1000, u),
                        {-(me(Pt{edge.min.x, 0}).x - 10), -(me(Pt{edge.min.x, 0}).x - 18)}});
  c.text({area.x0, area.y1 - 4}, part_name + "  (scale " + chosen.text() + ")", Lettering::heading);

  draw_caution(c, caution);
  TitleData td = title;
  td.doc_type = "Detail drawing";
  td.supplementary = std::string(lever ? "Lever plate" : "Frame bracket plate") + " " + part_name + ": " +
                     std::to_string(holes.size()) + (holes.size() == 1 ? " hole, " : " holes, ") + part->material +
                     "; sizes from the solid";
  td.scale = chosen.text();
  td.projection_symbol = true;
  draw_title_block(c, sheet, td);
  return holes;
}

}  // namespace bandforge::drawing
