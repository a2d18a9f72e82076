#include "drawing/assembly_sheet.hpp"

#include <algorithm>
#include <cmath>
#include <optional>

#include "drawing/format.hpp"
#include "drawing/page1.hpp"
#include "drawing/page1_tables.hpp"
#include "drawing/table.hpp"
#include "drawing/text_fit.hpp"
#include "src/standard_parts.hpp"
#include "src/errors.hpp"

namespace bandforge::drawing {
namespace {

constexpr double kGap = 4.0;  // between zones [mm]

// ---- zones ---------------------------------------------------------------------------------

// Lines of the notes area: the heading, the general notes as wrapped, one spare for an
// annotation that had to be dropped (more find room above the tables).
double notes_lines(const Canvas& c, const std::vector<std::string>& notes, double width) {
  double n = 1 + 1;
  for (size_t i = 0; i < notes.size(); ++i) {
    n += static_cast<double>(wrap_lines(c, std::to_string(i + 1) + ". " + notes[i], Lettering::body, width).size());
  }
  return n;
}

// The note that stands for the results table where a portrait sheet has no room for it.
constexpr const char* kResultsElsewhere =
    "Results for both rotations (tensions, torque, lever force, pressure, stress): on the "
    "calculation sheet; no room for the table on this sheet.";

// Tables, notes, caution and title block: nothing else may be drawn over them.
std::vector<Box> obstacles(const Zones& z) {
  std::vector<Box> out = {z.title_block.grown(1), z.caution.grown(1), z.parts.grown(1), z.results.grown(1),
                          z.notes.grown(1)};
  if (z.sheets.width() > 0) out.push_back(z.sheets.grown(1));
  return out;
}

Zones make_zones(const Canvas& c, const SheetSize& s, double results_h, double parts_h,
                 double notes_lines) {
  Zones z;
  const Box f = frame_box(s);
  z.title_block = title_block_box(s);
  z.caution = caution_box(c, s);
  const double notes_h = notes_lines * Lettering::body * 1.65 + 1;
  // The parts list above the caution and title block (ISO 7200 practice), the results table
  // beside them on landscape sheets and above them on A4 portrait.
  z.parts = {z.title_block.x0, z.caution.y1 + kGap, z.title_block.x1, z.caution.y1 + kGap + parts_h};
  if (s.width > s.height) {
    const double w = std::min(180.0, z.title_block.x0 - f.x0 - 2 * kGap);
    z.results = {f.x0 + kGap, f.y0 + kGap, f.x0 + kGap + w, f.y0 + kGap + results_h};
    z.notes = {z.results.x0, z.results.y1 + kGap, z.title_block.x0 - kGap, z.results.y1 + kGap + notes_h};
  } else {
    z.results = {z.title_block.x0, z.parts.y1 + kGap, z.title_block.x1, z.parts.y1 + kGap + results_h};
    z.notes = {f.x0 + kGap, z.results.y1 + kGap, f.x1 - kGap, z.results.y1 + kGap + notes_h};
  }
  z.views = {f.x0 + 2, f.y0 + 2, f.x1 - 2, f.y1 - 2};
  return z;
}

// Room around each view for dimensions and balloons [sheet mm].
struct Margins {
  double left = 0, right = 0, top = 0, bottom = 0;
};

Margins front_margins(const Features& f) {
  const size_t nx = distinct({f.pivot.x, f.a.x, f.b.x}).size();
  const size_t ny = distinct({f.pivot.y, f.a.y, f.b.y}).size();
  Margins m{6, 6, 6, 6};
  // First dimension line 8 mm off the view, then one level each, then the text.
  const double h = 8 + kLevel * (std::max<double>(1, static_cast<double>(nx)) - 1) + 5;
  const double v = 8 + kLevel * (std::max<double>(1, static_cast<double>(ny)) - 1) + 5;
  (dims_below(f) ? m.bottom : m.top) = h;
  (dims_left(f) ? m.left : m.right) = v;
  m.top = std::max(m.top, 14.0);  // wrap-angle arc and its text
  return m;
}

Margins side_margins() { return {6, 8 + 2 * kLevel, 8 + 2 * kLevel, 6}; }

// Where the front and side views go: the scale, the front view's origin on the sheet, the side
// view's origin's x offset from it, and the boxes the group takes on the sheet (geometry and the
// strips that carry its dimensions).
struct Placement {
  Scale scale;
  Pt origin;
  double dx = 0;
  std::vector<Box> foot;
};

// The largest scale of `tried` at which the front and side views and their dimension space fit
// the views area clear of `blocked`, at the free spot nearest the top centre of the sheet.
std::optional<Placement> place_views(const AssemblyPlan& plan, const Design& d, const std::vector<Scale>& tried,
                                     const std::vector<Box>& blocked) {
  const Box area = plan.zones.views;
  const Features f = features(d);
  const Margins fm = front_margins(f), sm = side_margins();
  const auto& F = plan.front;
  const auto& S = plan.side;
  const double gap = 12;
  for (const Scale& sc : tried) {
    const double k = sc.factor();
    // The group's footprint relative to the front origin: each view's geometry with a small
    // margin, the strips that carry the coordinate dimensions (only as wide as the features
    // they measure), and the side view, which shares the drum axis height.
    std::vector<Box> foot;
    const Box fg{F.min.x * k - 6, F.min.y * k - 6, F.max.x * k + 6, F.max.y * k + 14};
    foot.push_back(fg);
    {
      double lo = 0, hi = 0, vlo = 0, vhi = 0;
      for (Pt p : {f.pivot, f.a, f.b}) {
        lo = std::min(lo, p.x * k);
        hi = std::max(hi, p.x * k);
        vlo = std::min(vlo, p.y * k);
        vhi = std::max(vhi, p.y * k);
      }
      if (dims_below(f)) foot.push_back({lo - 16, F.min.y * k - fm.bottom, hi + 16, F.min.y * k});
      else foot.push_back({lo - 16, F.max.y * k, hi + 16, F.max.y * k + fm.top});
      if (dims_left(f)) foot.push_back({F.min.x * k - fm.left, vlo - 4, F.min.x * k, vhi + 4});
      else foot.push_back({F.max.x * k, vlo - 4, F.max.x * k + fm.right, vhi + 4});
    }
    // First angle: the view from the left goes on the right of the front view; third angle: on
    // its left, beyond the front view's own dimension strips (ISO 5456-2).
    double front_left = fg.x0;
    for (const Box& b : foot) front_left = std::min(front_left, b.x0);
    const bool third = d.drawing.projection == Projection::third;
    const double dx = third ? front_left - gap - sm.right - S.max.x * k : fg.x1 + gap + sm.left - S.min.x * k;
    const Box sr{dx + S.min.x * k - sm.left, S.min.y * k - sm.bottom, dx + S.max.x * k + sm.right,
                 S.max.y * k + sm.top};
    foot.push_back(sr);
    Box all = foot[0];
    for (const Box& b : foot) {
      all.x0 = std::min(all.x0, b.x0);
      all.y0 = std::min(all.y0, b.y0);
      all.x1 = std::max(all.x1, b.x1);
      all.y1 = std::max(all.y1, b.y1);
    }
    if (all.width() > area.width() || all.height() > area.height()) continue;
    // Scan origins on a 2 mm grid for the free spot nearest the top centre of the sheet.
    // Centred over the tables when there is room, else as high as needed.
    const double tables_top = std::max({plan.zones.parts.y1, plan.zones.notes.y1, plan.zones.results.y1});
    const Pt target{(area.x0 + area.x1) / 2,
                    std::min((tables_top + area.y1) / 2, area.y1 - all.height() / 2)};
    bool found = false;
    Pt best;
    double best_score = 1e18;
    for (double ox = area.x0 - all.x0; ox + all.x1 <= area.x1; ox += 2) {
      for (double oy = area.y1 - all.y1; oy + all.y0 >= area.y0; oy -= 2) {
        bool ok = true;
        for (const Box& b : foot) {
          const Box m{b.x0 + ox, b.y0 + oy, b.x1 + ox, b.y1 + oy};
          for (const Box& o : blocked) ok = ok && !m.overlaps(o);
        }
        if (!ok) continue;
        const Pt centre{(all.x0 + all.x1) / 2 + ox, (all.y0 + all.y1) / 2 + oy};
        const double score = std::hypot(centre.x - target.x, centre.y - target.y);
        if (score < best_score) {
          best_score = score;
          best = {ox, oy};
          found = true;
        }
      }
    }
    if (!found) continue;
    for (Box& b : foot) b = {b.x0 + best.x, b.y0 + best.y, b.x1 + best.x, b.y1 + best.y};
    return Placement{sc, best, dx, std::move(foot)};
  }
  return std::nullopt;
}

// The list of sheets' own place, w × h: right-aligned above the parts list on landscape sheets
// (the list belongs with the tables by the title block), above the notes on A4 portrait, where
// the parts list spans the frame and the views need the height.
Box list_zone(const Zones& z, const SheetSize& s, double w, double h) {
  const Box& under = s.width > s.height ? z.parts : z.notes;
  return {under.x1 - w, under.y1 + kGap, under.x1, under.y1 + kGap + h};
}

// A spot for a w × h box in `area` clear of the views' footprint (grown for the balloons and
// labels placed around it) and of `blocked`, its lower-right corner nearest `anchor`.
std::optional<Box> free_spot(const Box& area, double w, double h, const std::vector<Box>& foot,
                             const std::vector<Box>& blocked, Pt anchor) {
  std::optional<Box> best;
  double best_score = 1e18;
  for (double x0 = area.x0; x0 + w <= area.x1; x0 += 2) {
    for (double y0 = area.y0; y0 + h <= area.y1; y0 += 2) {
      const Box b{x0, y0, x0 + w, y0 + h};
      bool ok = true;
      for (const Box& f : foot) ok = ok && !b.overlaps(f, 10);
      for (const Box& o : blocked) ok = ok && !b.overlaps(o, kGap);
      if (!ok) continue;
      const double score = std::hypot(b.x1 - anchor.x, b.y0 - anchor.y);
      if (score < best_score) {
        best_score = score;
        best = b;
      }
    }
  }
  return best;
}

}  // namespace

Box caution_box(const Canvas& c, const SheetSize& sheet) {
  const Box tb = title_block_box(sheet);
  const double h =
      static_cast<double>(wrap_lines(c, caution_text(), Lettering::body, tb.width() - 4).size()) *
          Lettering::body * 1.65 + 3;
  return {tb.x0, tb.y1 + 3, tb.x1, tb.y1 + 3 + h};
}

void draw_caution(Canvas& c, const Box& b) {
  c.fill_rect(b, {1, 1, 1});
  c.pen(Pen::wide, {0.75, 0, 0});
  c.rect(b);
  double y = b.y1 - 1.5 - Lettering::body;
  for (const auto& line : wrap_lines(c, caution_text(), Lettering::body, b.width() - 4)) {
    c.text({b.x0 + 2, y}, line, Lettering::body, Align::left, 0, {0.75, 0, 0});
    y -= Lettering::body * 1.65;
  }
  c.pen(Pen::narrow);
}

std::string assembly_subtitle(const Design& d, const Solution& s, UnitSystem u) {
  std::string kind = to_string(s.layout.kind);
  kind[0] = static_cast<char>(std::toupper(kind[0]));
  return kind + " band brake, drum Ø" + dim_length(d.drum.diameter, u) +
         (u == UnitSystem::si ? " mm" : " in") + ", wrap " + degrees(s.layout.wrap) +
         ", design rotation " + turn_word(d.drum.rotation);
}

AssemblyPlan plan_assembly(const Canvas& c, const Design& d, const Solution& s,
                           const geom::BrakeModel& model, const SheetSize& sheet,
                           const std::vector<SheetEntry>& sheets) {
  AssemblyPlan plan;
  plan.sheet = sheet;
  plan.front = geom::project(model, geom::front_view());
  plan.side = geom::project(model, geom::left_view());
  plan.hlr_ms = plan.front.milliseconds + plan.side.milliseconds;
  {
    // Visible edges only: hidden lines would only clutter a view that shows the whole at a glance.
    geom::ProjectOptions o;
    o.hidden = false;
    plan.iso = geom::project(model, geom::isometric_view(), o);
    plan.iso_ms = plan.iso.milliseconds;
  }

  const UnitSystem any = UnitSystem::si;  // table heights do not depend on the units
  // On a portrait sheet every zone spans the frame; when the views then fit at no scale, the
  // results table (repeated on the calculation sheet) is left out and a note says where it is.
  for (const bool without_results : {false, true}) {
    if (without_results && !(sheet.height > sheet.width)) break;
    plan.results_omitted = without_results;
    {
      const Box f = frame_box(sheet);
      const double notes_w = sheet.width > sheet.height ? title_block_box(sheet).x0 - f.x0 - 2 * kGap
                                                        : f.width() - 2 * kGap;
      std::vector<std::string> notes = general_notes(d, s, any);
      if (without_results) notes.push_back(kResultsElsewhere);
      plan.zones = make_zones(c, sheet, without_results ? 0.0 : table_height(c, results_table(d, s, any)),
                              table_height(c, parts_table(model, any)),
                              notes_lines(c, notes, notes_w));
    }
    const Box area = plan.zones.views;
    std::vector<Scale> tried;
    if (d.drawing.scale_num > 0 && d.drawing.scale_den > 0) {
      tried.push_back({d.drawing.scale_num, d.drawing.scale_den});
    } else {
      tried = standard_scales();
    }
    const std::vector<Box> blocked = obstacles(plan.zones);
    const std::optional<Placement> free_run = place_views(plan, d, tried, blocked);
    std::optional<Placement> chosen;
    if (sheets.empty()) {
      chosen = free_run;
    } else {
      // The list of sheets: one column of entries, else two side by side (half as tall).
      const Table lists[2] = {sheet_list_table(c, sheets, 1), sheet_list_table(c, sheets, 2)};
      // Its own place (above the parts list), where the views keep the scale they have without it;
      // when `any_scale`, at whatever scale the views then fit.
      auto own_place = [&](bool any_scale) {
        for (const Table& t : lists) {
          Zones z = plan.zones;
          z.sheets = list_zone(z, sheet, t.width(), table_height(c, t));
          if (z.sheets.y1 > area.y1) continue;  // taller than the sheet has room for
          std::optional<Placement> run = place_views(plan, d, tried, obstacles(z));
          if (run && (any_scale || !free_run || run->scale.factor() >= free_run->scale.factor())) {
            plan.zones = z;
            plan.sheet_list = t;
            chosen = run;
            return;
          }
        }
      };
      own_place(false);
      // Else in free space beside the views as they are placed without it.
      if (!chosen && free_run) {
        const Box own = list_zone(plan.zones, sheet, 0, 0);
        for (const Table& t : lists) {
          const std::optional<Box> spot =
              free_spot(area, t.width(), table_height(c, t), free_run->foot, blocked, {own.x1, own.y0});
          if (spot) {
            plan.zones.sheets = *spot;
            plan.sheet_list = t;
            chosen = free_run;
            break;
          }
        }
      }
      if (!chosen) own_place(true);
      // Else (A4 portrait, where every zone spans the frame and the views keep 2 mm to spare) the
      // views as they are, and a note in place of the list.
      if (!chosen && free_run) {
        chosen = free_run;
        plan.sheet_list_omitted = true;
      }
    }
    if (chosen) {
      const double k = chosen->scale.factor();
      const auto& F = plan.front;
      const auto& S = plan.side;
      plan.scale = chosen->scale;
      plan.front_origin = chosen->origin;
      plan.side_origin = {chosen->origin.x + chosen->dx, chosen->origin.y};
      plan.drum_centre = plan.front_origin;
      plan.views_box = {std::min(plan.front_origin.x + F.min.x * k, plan.side_origin.x + S.min.x * k),
                        plan.front_origin.y + std::min(F.min.y, S.min.y) * k,
                        std::max(plan.front_origin.x + F.max.x * k, plan.side_origin.x + S.max.x * k),
                        plan.front_origin.y + std::max(F.max.y, S.max.y) * k};
      return plan;
    }
  }
  const Box area = plan.zones.views;
  std::vector<Scale> tried = standard_scales();
  if (d.drawing.scale_num > 0 && d.drawing.scale_den > 0) tried = {{d.drawing.scale_num, d.drawing.scale_den}};
  const auto& F = plan.front;
  const auto& S = plan.side;
  std::string list;
  for (const Scale& sc : tried) list += (list.empty() ? "" : ", ") + sc.text();
  char size[96];
  std::snprintf(size, sizeof size, "%.0f × %.0f mm", (F.max.x - F.min.x) + (S.max.x - S.min.x),
                std::max(F.max.y - F.min.y, S.max.y - S.min.y));
  throw BuildError("drawing: the front and side views (" + std::string(size) +
                   " in the model) do not fit the views area of sheet " + sheet.name + " (" +
                   sig_figs(area.width(), 3) + " × " + sig_figs(area.height(), 3) +
                   " mm) at scale " + list +
                   (tried.size() == 1 ? " ([drawing] scale)" : "") +
                   ": choose a larger [drawing] sheet or a smaller scale");
}

namespace {

void draw_tables_and_notes(Page1& p, const geom::BrakeModel& model) {
  const Zones& z = p.plan.zones;
  if (!p.plan.results_omitted) {
    Table rt = results_table(p.d, p.s, p.u);
    fit_width(rt, z.results.width());
    draw_table(p.c, rt, {z.results.x0, z.results.y1});
  }
  Table pt = parts_table(model, p.u);
  fit_width(pt, z.parts.width());
  draw_table(p.c, pt, {z.parts.x0, z.parts.y1});
  if (!p.plan.sheet_list.rows.empty()) draw_table(p.c, p.plan.sheet_list, {z.sheets.x0, z.sheets.y1});

  std::vector<std::string> text = {"NOTES"};
  std::vector<std::string> items = general_notes(p.d, p.s, p.u);
  if (p.plan.results_omitted) items.push_back(kResultsElsewhere);
  for (const auto& n : p.notes) items.push_back(n);
  for (size_t i = 0; i < items.size(); ++i) {
    for (auto& l : wrap_lines(p.c, std::to_string(i + 1) + ". " + items[i], Lettering::body, z.notes.width())) {
      text.push_back(std::move(l));
    }
  }
  const double pitch = Lettering::body * 1.65;
  const double need = static_cast<double>(text.size()) * pitch;
  Box box = z.notes;
  if (box.height() < need) {
    // More dropped annotations than the reserved lines: the first free band above the tables.
    bool found = false;
    for (double y0 = z.notes.y0; y0 + need < z.views.y1 && !found; y0 += 2) {
      const Box band{z.notes.x0, y0, z.notes.x1, y0 + need};
      if (p.occ.free(band)) {
        box = band;
        found = true;
      }
    }
    if (!found) box.y1 = box.y0 + need;  // overflow: better than losing a note
  }
  p.drawn.notes_box = {box.x0, box.y1 - need, box.x1, box.y1};
  double y = box.y1 - Lettering::body;
  for (const auto& l : text) {
    p.c.text({box.x0, y}, l, Lettering::body);
    y -= pitch;
  }
}

}  // namespace

AssemblyDrawn draw_assembly(Canvas& c, const AssemblyPlan& plan, const Design& d, const Solution& s,
                            const geom::BrakeModel& model, const geom::BrakeModel* released,
                            UnitSystem u, std::vector<std::string>& notes) {
  Occupancy occ;
  occ.set_limits(plan.zones.views);
  for (const Box& o : obstacles(plan.zones)) occ.add_box(o);
  const double k = plan.scale.factor();
  Page1 p{c, occ, notes, d, s, plan, u, Mapper{plan.front_origin, k}, Mapper{plan.side_origin, k}};
  p.k = k;
  p.r = s.layout.r * kMmPerM;
  p.t_l = d.lining.thickness * kMmPerM;
  p.t = d.band.thickness * kMmPerM;
  p.b = d.band.width * kMmPerM;
  p.w = d.drum.width * kMmPerM;
  p.band_outer = p.r + p.t_l + p.t;
  p.centre = plan.front_origin;
  p.drum_cl = p.band_outer * k + 5;
  p.pin_cl = standard::clevis_nominal(d.band.pin_diameter) * kMmPerM * k + 3;
  p.f = features(d);
  p.fv = {p.front(plan.front.min).x, p.front(plan.front.min).y, p.front(plan.front.max).x,
          p.front(plan.front.max).y};

  // Geometry first, so that every annotation is placed clear of it.
  draw_view(c, occ, plan.front, p.front, ViewStyle::normal);
  draw_view(c, occ, plan.side, p.side, ViewStyle::normal);
  if (released) {
    geom::ProjectOptions o;
    o.hidden = false;
    o.smooth = false;
    o.kinds = {"lever", "grip"};
    draw_view(c, occ, geom::project(*released, geom::front_view(), o), p.front, ViewStyle::phantom);
  }
  draw_centre_lines(p);
  draw_spring_coils(p);
  draw_band_detail(p);
  dimension_front_view(p);
  dimension_side_view(p);
  draw_rotation_and_ends(p);
  draw_balloons(p, model);
  // Last of the views, in the room the annotations left: it shows nothing they need.
  const bool iso = draw_isometric(p);
  if (!iso || plan.sheet_list_omitted) {
    const std::string what = !iso && plan.sheet_list_omitted ? "the isometric view or the list of sheets"
                             : !iso                          ? "the isometric view"
                                                             : "the list of sheets";
    // Appended piecewise: GCC 12 warns falsely (-Wrestrict) on "literal" + string.
    std::string text = "No room on sheet ";
    text.append(plan.sheet.name).append(" for ").append(what);
    if (plan.sheet_list_omitted) text.append(" (each title block gives its sheet n / N)");
    note_missing(p, text.append("; a larger [drawing] sheet has room."));
  }
  draw_tables_and_notes(p, model);
  return p.drawn;
}

}  // namespace bandforge::drawing
