// The band assembly's detail sheet (issue 10): band, lining and both end joints as one
// assembly. The view as wrapped is the exact projection of those solids; section B–B across band
// and lining is the solids' own cut face at the middle of the wrap; each end joint in detail:
// a riveted lap as the strip seen from outside with its rivets where the fab pack's band blank
// drills them, or a welded end block from its solid with the bore's fit and the ISO 2553 weld
// symbol. The developed length is the band blank's (geom::make_fab_pack, fab/band-blank.dxf).
#include <algorithm>
#include <cmath>
#include <cstdio>
#include <numbers>

#include "drawing/annotate.hpp"
#include "drawing/detail_marks.hpp"
#include "drawing/detail_page.hpp"
#include "drawing/detail_sheet.hpp"
#include "drawing/format.hpp"
#include "drawing/vec2.hpp"
#include "drawing/views.hpp"
#include "geometry/flat_patterns.hpp"
#include "geometry/projection.hpp"
#include "src/standard_parts.hpp"
#include "src/errors.hpp"
#include "src/fits.hpp"
#include "src/hardware.hpp"

namespace bandforge::drawing {
namespace {

std::string mm_text(double mm, int decimals) {
  char buf[32];
  std::snprintf(buf, sizeof buf, "%.*f", decimals, mm);
  return buf;
}

// One riveted end as the band blank drills it, in the frame of the assembled lap: x along the
// run from the pin centre toward the drum, y across the band from its back edge [mm].
struct Lap {
  double rho = 0;      // eye's neutral radius (pin radius + t/2)
  double tail_end = 0; // where the tail laid back on the run ends
  double rivet = 0;    // hole diameter
  std::vector<double> rows, columns;  // rivet x and y positions
};

// The band blank's bend stations (fab pack) for a riveted end: eye start and end, and the holes
// in the tail, give the lap as assembled (the tail point at x lies lap − x from the eye's end).
Lap lap_from_blank(const geom::FlatPart& blank, bool end_a, std::size_t bends_before) {
  Lap l;
  const auto& bl = blank.bend_lines;
  // A riveted end has two bend lines (eye starts, eye closes); end A's come first.
  const std::size_t i0 = end_a ? 0 : bends_before + 2;  // after A's and the roll's two
  const double eye0 = bl.at(i0).x1, eye1 = bl.at(i0 + 1).x1;
  l.rho = (eye1 - eye0) / (2 * std::numbers::pi);
  const double lap = end_a ? eye0 : blank.length - eye1;  // the tail from the free end
  l.tail_end = l.rho + lap;
  for (const geom::FlatCircle& h : blank.holes) {
    const double from_end = end_a ? h.x : blank.length - h.x;
    if (from_end > lap) continue;  // not in this end's tail
    l.rivet = 2 * h.radius;
    const double x = l.rho + lap - from_end;
    if (std::none_of(l.rows.begin(), l.rows.end(), [&](double r) { return std::abs(r - x) < 1e-6; })) l.rows.push_back(x);
    if (std::none_of(l.columns.begin(), l.columns.end(), [&](double c) { return std::abs(c - h.y) < 1e-6; }))
      l.columns.push_back(h.y);
  }
  std::sort(l.rows.begin(), l.rows.end());
  std::sort(l.columns.begin(), l.columns.end());
  return l;
}

// The box a detail may use, and its label at the top.
struct Panel {
  Box box;
  std::string label;
};

void label(Canvas& c, Occupancy& occ, const Panel& p) {
  c.text({p.box.x0 + 2, p.box.y1 - Lettering::heading}, p.label, Lettering::heading);
  occ.add_box({p.box.x0 + 1, p.box.y1 - Lettering::heading - 1.5, p.box.x0 + 3 + c.text_width(p.label, Lettering::heading),
               p.box.y1});
}

// The riveted lap seen from outside the band: strip, eye end, tail end, rivets; sizes dimensioned.
void draw_lap(Canvas& c, Occupancy& occ, const Panel& p, const Lap& l, double b, double t, double pin_r,
              UnitSystem u) {
  const double x0 = -(pin_r + t), x1 = l.tail_end + std::max(10.0, 0.3 * b);
  const double room_w = p.box.width() - 40, room_h = p.box.height() - Lettering::heading - 22;
  const Scale sc = fitting_scale(x1 - x0, b, 0, 0, {0, 0, room_w, room_h}, true);
  const double k = sc.factor();
  Panel labelled = p;
  labelled.label += "  (" + sc.text() + ")";
  label(c, occ, labelled);
  const Pt o{p.box.x0 + 10 - x0 * k, p.box.y0 + 18 + (room_h - b * k) / 2};
  auto at = [&](double x, double y) { return Pt{o.x + x * k, o.y + y * k}; };
  c.pen(Pen::wide);
  c.line(at(x0, 0), at(x1, 0));
  c.line(at(x0, b), at(x1, b));
  c.line(at(x0, 0), at(x0, b));           // the eye's far side
  c.line(at(l.tail_end, 0), at(l.tail_end, b));  // the tail's end on the run
  // The strip continues toward the drum: a break line (ISO 128, narrow freehand; here a zigzag).
  c.pen(Pen::narrow);
  std::vector<Pt> zig;
  for (int i = 0; i <= 8; ++i) zig.push_back(at(x1 + (i % 2 ? 1.2 : -1.2) / k, b * i / 8.0));
  c.polyline(zig);
  for (double y : {0.0, b}) {
    occ.add_segment(at(x0, y), at(x1, y));
  }
  occ.add_segment(at(x0, 0), at(x0, b));
  occ.add_segment(at(l.tail_end, 0), at(l.tail_end, b));
  occ.add_segment(at(x1, 0) + Pt{1.5, 0}, at(x1, b) + Pt{1.5, 0});
  // The pin's centre line and the rivets with theirs.
  c.pen(Pen::centre);
  c.line(at(0, 0) - Pt{0, 3}, at(0, b) + Pt{0, 3});
  occ.add_segment(at(0, 0) - Pt{0, 3}, at(0, b) + Pt{0, 3});
  for (double x : l.rows)
    for (double y : l.columns) {
      c.pen(Pen::wide);
      c.circle(at(x, y), l.rivet / 2 * k);
      c.pen(Pen::fine);
      const double r = l.rivet / 2 * k + 1;
      c.line(at(x, y) - Pt{r, 0}, at(x, y) + Pt{r, 0});
      c.line(at(x, y) - Pt{0, r}, at(x, y) + Pt{0, r});
      occ.add_arc(at(x, y), l.rivet / 2 * k, 0, 2 * kPi);
    }
  if (l.rows.empty() || l.columns.empty()) return;
  // Along the run, below the strip: pin centre to the first row, the pitch, the last row to the
  // tail's end (ISO 129 chain).
  const double below = at(0, 0).y;
  auto along = [&](double xa, double xb) {
    place_linear(c, occ, {at(xa, 0), at(xb, 0), {1, 0}, dim_length((xb - xa) / 1000, u),
                          {below - 7, below - 13, below - 19}});
  };
  along(0, l.rows.front());
  if (l.rows.size() > 1) along(l.rows[0], l.rows[1]);
  along(l.rows.back(), l.tail_end);
  // Across, on the drum side: the band's edge to the first column, the column pitch, the width.
  const double x_side = at(x1, 0).x + 5;
  auto across_from_rivets = [&](double ya, double yb, double off) {
    place_linear(c, occ, {at(l.rows.back(), ya), at(l.rows.back(), yb), {0, 1}, dim_length((yb - ya) / 1000, u),
                          {-(x_side + off), -(x_side + off + 6)}});
  };
  across_from_rivets(0, l.columns.front(), 2);
  if (l.columns.size() > 1) across_from_rivets(l.columns[0], l.columns[1], 2);
}

// The welded end block with the band in its slot, in the block's frame (pin at the origin, the
// run toward the drum along −x), from the solids; bore fit and the weld symbol.
void draw_block(Canvas& c, Occupancy& occ, const Panel& p, const geom::BrakeModel& model, const std::string& block,
                Vec2 pin_m, Vec2 run_dir, double t, double weld_leg_mm, double pin_d_m, UnitSystem u) {
  geom::ProjectOptions only;
  only.smooth = false;
  only.hidden = false;
  only.instances = {block};
  const double angle = std::atan2(run_dir.y, run_dir.x) + std::numbers::pi;
  const geom::Point2 pin{pin_m.x * 1000, pin_m.y * 1000};
  const geom::ProjectedView blk = to_part_frame(geom::project(model, geom::front_view(), only), pin, angle);
  only.instances.clear();
  only.kinds = {"band", "block"};
  const geom::ProjectedView both = to_part_frame(geom::project(model, geom::front_view(), only), pin, angle);
  const double front = blk.max.x, back = -blk.min.x, h = blk.max.y - blk.min.y;
  double bore = 0, slot_x = -back;
  for (const geom::ViewEdge& e : blk.edges) {
    if (e.kind == geom::ViewEdge::Kind::arc && std::hypot(e.centre.x, e.centre.y) < 0.01 && e.radius < h / 2)
      bore = 2 * e.radius;
    if (e.kind == geom::ViewEdge::Kind::line && std::abs(e.a.x - e.b.x) < 1e-6 && e.a.x < -0.01 && e.a.x > -back + 0.01 &&
        std::max(std::abs(e.a.y), std::abs(e.b.y)) < h / 2 - 0.01)
      slot_x = e.a.x;
  }
  const double x0 = -back - std::max(10.0, 0.5 * (back + front)), x1 = front + 2;
  const double room_w = p.box.width() - 36, room_h = p.box.height() - Lettering::heading - 30;
  const Scale sc = fitting_scale(x1 - x0, h + 4, 0, 0, {0, 0, room_w, room_h}, true);
  const double k = sc.factor();
  Panel labelled = p;
  labelled.label += "  (" + sc.text() + ")";
  label(c, occ, labelled);
  const Pt o{p.box.x0 + 24 - x0 * k, p.box.y0 + 14 + room_h / 2};
  const Mapper m{o, k};
  const Box window{x0, -h / 2 - 2, x1, h / 2 + 2};
  draw_clipped(c, both, window, m);
  const Box drawn{m(Pt{window.x0, window.y0}).x, m(Pt{window.x0, window.y0}).y, m(Pt{window.x1, window.y1}).x,
                  m(Pt{window.x1, window.y1}).y};
  // What was drawn, as lines for the annotations to keep off: block outline, band, bore.
  const Pt q0 = m(Pt{-back, -h / 2}), q1 = m(Pt{front, h / 2});
  occ.add_polyline({q0, {q1.x, q0.y}, q1, {q0.x, q1.y}, q0});
  for (double y : {-t / 2, t / 2}) occ.add_segment({drawn.x0, m(Pt{0, y}).y}, {q0.x, m(Pt{0, y}).y});
  c.pen(Pen::centre);
  c.line(m(Pt{-bore / 2 - 3, 0}), m(Pt{bore / 2 + 3, 0}));
  c.line(m(Pt{0, -bore / 2 - 3}), m(Pt{0, bore / 2 + 3}));
  c.pen(Pen::narrow);
  // Sizes of the block: length and height, the pin centre to its front face, the slot's depth.
  const double top = m(Pt{0, h / 2}).y, bottom = m(Pt{0, -h / 2}).y;
  place_linear(c, occ, {m(Pt{-back, -h / 2}), m(Pt{front, -h / 2}), {1, 0}, dim_length((back + front) / 1000, u),
                        {bottom - 8, bottom - 14}});
  place_linear(c, occ, {m(Pt{0, h / 2}), m(Pt{front, h / 2}), {1, 0}, dim_length(front / 1000, u), {top + 8, top + 14}});
  place_linear(c, occ, {m(Pt{-back, h / 2}), m(Pt{slot_x, h / 2}), {1, 0}, dim_length((slot_x + back) / 1000, u),
                        {top + 8, top + 14}});
  place_linear(c, occ, {m(Pt{front, -h / 2}), m(Pt{front, h / 2}), {0, 1}, dim_length(h / 1000, u),
                        {-(m(Pt{front, 0}).x + 8), -(m(Pt{front, 0}).x + 14)}});
  // The bore with its fit (ISO 286, always mm), on a leader.
  const auto fit = fits::fit(pin_d_m, fits::kPinHole, fits::kPinShaft);
  std::string bore_text = "Ø" + dim_length(bore / 1000, UnitSystem::si) + (u == UnitSystem::us ? " mm" : "");
  if (fit && std::abs(bore / 1000 - pin_d_m) < 1e-5) {
    bore_text += std::string(" ") + fits::kPinHole + " (" + deviation_mm(fit->hole.upper) + "/" +
                 deviation_mm(fit->hole.lower) + ")";
  }
  const Pt bc = m(Pt{0, 0});
  const double br = bore / 2 * k;
  const Pt target = bc + Pt{br * 0.7071, br * 0.7071};
  std::vector<Pt> spots;
  const double tw = c.text_width(bore_text, Lettering::body);
  for (double dy : {top - bc.y + 20, top - bc.y + 26, bottom - bc.y - 20})
    for (double dx : {front * k + 4 + tw / 2, front * k + 10 + tw / 2, tw / 2, -tw / 2}) spots.push_back(bc + Pt{dx, dy});
  place_label(c, occ, target, spots, bore_text, Lettering::body, true);
  // The weld: both faces of the band at the slot mouth, fillet leg z (ISO 2553).
  const Pt joint = m(Pt{-back, -t / 2});
  const std::string leg = "z" + mm_text(weld_leg_mm, weld_leg_mm == std::round(weld_leg_mm) ? 0 : 1);
  bool welded = false;
  for (double dy : {-8.0, -13.0, -18.0}) {
    for (double dx : {-8.0, -14.0, -20.0}) {
      const Pt knee{joint.x + dx, bottom + dy};
      const Box wb = fillet_weld_box(c, knee, -1, leg);
      if (!occ.free(wb) || !occ.segment_clear(knee, joint)) continue;
      occ.add_box(fillet_weld_both_sides(c, joint, knee, -1, leg));
      occ.add_segment(knee, joint);
      welded = true;
      break;
    }
    if (welded) break;
  }
}

}  // namespace

void draw_band_sheet(Canvas& c, const SheetSize& sheet, const Design& d, const Solution& sol,
                     const geom::BrakeModel& model, UnitSystem u, const TitleData& title) {
  const std::vector<std::string> kinds = geom::part_kinds(model);
  const auto& parts = model.parts();
  const geom::PartInfo* band = nullptr;
  const geom::PartInfo* lining = nullptr;
  std::vector<const geom::PartInfo*> blocks;
  for (std::size_t i = 0; i < parts.size(); ++i) {
    if (kinds[i] == "band") band = &parts[i];
    if (kinds[i] == "lining") lining = &parts[i];
    if (kinds[i] == "block") blocks.push_back(&parts[i]);
  }
  if (band == nullptr) throw BuildError("drawing: no band for its detail sheet");
  const geom::FabPack pack = geom::make_fab_pack(d, sol, model);
  const geom::FlatPart* blank = nullptr;
  const geom::FlatPart* lining_blank = nullptr;
  for (const geom::FlatPart& f : pack.parts) {
    if (f.solid == band->name) blank = &f;
    if (lining && f.solid == lining->name) lining_blank = &f;
  }
  if (blank == nullptr) throw BuildError("drawing: the fab pack has no band blank");

  // Section B–B: the plane through the axis at the middle of the wrap, seen along the band.
  const Layout& lay = sol.layout;
  const double mid = lay.a.tangent_angle + lay.sense * lay.wrap / 2;
  const geom::Vec3 radial{std::cos(mid), std::sin(mid), 0}, tangent{-std::sin(mid), std::cos(mid), 0};
  geom::ProjectOptions cut;
  cut.kinds = {"band", "lining"};
  cut.hidden = false;
  cut.smooth = false;
  cut.cut = true;
  const geom::ProjectedView sec = geom::project(model, {tangent, {0, 0, 1}, "section B–B"}, cut);
  struct Face {
    std::string kind;
    std::vector<std::vector<geom::Point2>> loops;
    geom::Point2 lo{1e300, 1e300}, hi{-1e300, -1e300};
  };
  std::vector<Face> faces;  // the cut faces on the wrap's side of the axis
  for (const geom::SectionFace& f : sec.sections) {
    Face face;
    face.kind = f.kind;
    for (const auto& loop : f.loops) {
      double cy = 0;
      for (geom::Point2 p : loop) cy += p.y;
      if (cy <= 0) continue;
      face.loops.push_back(loop);
      for (geom::Point2 p : loop) {
        face.lo = {std::min(face.lo.x, p.x), std::min(face.lo.y, p.y)};
        face.hi = {std::max(face.hi.x, p.x), std::max(face.hi.y, p.y)};
      }
    }
    if (!face.loops.empty()) faces.push_back(face);
  }
  const Face* band_face = nullptr;
  const Face* lining_face = nullptr;
  for (const Face& f : faces) {
    if (f.kind == "band") band_face = &f;
    if (f.kind == "lining") lining_face = &f;
  }
  if (band_face == nullptr) throw BuildError("drawing: section B–B does not meet the band");
  const double b = band_face->hi.x - band_face->lo.x, t = band_face->hi.y - band_face->lo.y;
  const double t_lining = lining_face ? lining_face->hi.y - lining_face->lo.y : 0;

  // Joints as planned (src/hardware.hpp) and drilled (the band blank).
  const JointPlan* joints[2] = {&sol.hardware.joint_a, &sol.hardware.joint_b};
  const bool riveted[2] = {joints[0]->kind != JointKind::welded_block, joints[1]->kind != JointKind::welded_block};
  Lap laps[2];
  for (int i = 0; i < 2; ++i) {
    if (!riveted[i]) continue;
    laps[i] = lap_from_blank(*blank, i == 0, riveted[0] ? 2 : 0);
  }
  const int lining_rivets = lining_blank ? static_cast<int>(lining_blank->holes.size()) : 0;
  const double lining_hole = lining_rivets > 0 ? 2 * lining_blank->holes.front().radius : 0;

  // Notes and the parts table.
  const bool us = u == UnitSystem::us;
  std::vector<std::string> notes = {
      "Band assembly: part " + band->name + " rolled from the band blank, developed length " +
          dim_length(blank->length / 1000, u) + (us ? " in" : " mm") + " on the neutral axis (fab/" + blank->file +
          "); " + band->material + " strip " + dim_length(t / 1000, u) + " × " + dim_length(b / 1000, u) +
          ", rolled between the tangent points to the drum" + (lining ? " with the lining inside." : "."),
  };
  if (lining) {
    notes.push_back("Lining " + lining->name + ": " + lining->material + " " + dim_length(t_lining / 1000, u) +
                    " thick, " + (lining_rivets > 0 ? std::to_string(lining_rivets) + " rivets Ø" +
                                                          dim_length(lining_hole / 1000, u) +
                                                          " (tubular, brass or copper; heads below the friction face)"
                                                    : std::string("bonded to the band")) +
                    ".");
  }
  for (int i = 0; i < 2; ++i) {
    const std::string e = i == 0 ? "A" : "B";
    const JointPlan& j = *joints[i];
    if (riveted[i]) {
      const Lap& l = laps[i];
      notes.push_back("End " + e + ": " + to_string(j.kind) + ", eye round the Ø" +
                      dim_length(d.band.pin_diameter, u) + " pin, tail laid back outside the run; " +
                      std::to_string(j.rows * j.columns) + " × " + j.rivets.designation() + " (hole Ø" +
                      dim_length(l.rivet / 1000, u) + "), grip " + dim_length(2 * t / 1000, u) +
                      " (tail and run), round head outside" +
                      (j.rivets.closing == standard::RivetClosing::flush ? ", closed flush on the drum side."
                                                                          : ", closed round on the drum side."));
    } else {
      const std::string blk = "END-BLOCK-" + e;
      notes.push_back("End " + e + ": welded end block " + blk + " (bore " + std::string(fits::kPinHole) +
                      " for " + fits::kPinShaft + " pins); band end in its slot, fillet welds on both faces.");
    }
  }
  notes.push_back(std::string(us ? "Dimensions in inches; fits in mm. " : "") +
                  "Sizes from the solids and the fab pack's band blank. General tolerances ISO 2768-mK. "
                  "Remove burrs; break sharp edges 0.5 mm.");
  Table table;
  table.widths = {40, 50, 14, 28};
  table.align = {Align::left, Align::left, Align::right, Align::right};
  table.rows.push_back({"Part", "Material", "Qty", "Mass each"});
  auto row = [&](const geom::PartInfo& p) {
    table.rows.push_back({p.name, p.material, std::to_string(p.instance_names.size()), qty(p.mass, Quantity::mass, u, 3)});
  };
  row(*band);
  if (lining) row(*lining);
  for (const auto* blk : blocks) row(*blk);
  // Joint rivets as the plan buys them: one row per designation (both ends alike: one row).
  for (int i = 0; i < 2; ++i) {
    if (!riveted[i]) continue;
    const JointPlan& j = *joints[i];
    if (i == 1 && riveted[0] && joints[0]->rivets.designation() == j.rivets.designation()) continue;
    int n = j.rows * j.columns;
    if (i == 0 && riveted[1] && joints[1]->rivets.designation() == j.rivets.designation()) {
      n += joints[1]->rows * joints[1]->columns;
    }
    // "Rivet DIN 660 - 6 × 16" to fit the column; the notes give the whole designation.
    std::string name = j.rivets.designation();
    if (name.rfind("Round head rivet ", 0) == 0) name = "Rivet " + name.substr(17);
    name = name.substr(0, name.find(" - St"));
    table.rows.push_back({name, "steel, bought", std::to_string(n), "—"});
  }
  if (lining_rivets > 0) {
    table.rows.push_back({"Rivet Ø" + dim_length(lining_hole / 1000, u) + " (lining)", "brass or copper, bought",
                          std::to_string(lining_rivets), "—"});
  }
  DetailPage page = start_detail_page(c, sheet, notes, table);
  Occupancy& occ = page.occ;

  // Panels: the wrapped view on the left (top on A4), section and joints beside (below) it.
  const Box& a = page.area;
  const bool landscape = sheet.width > sheet.height;
  Panel wrapped, section, joint[2];
  if (landscape) {
    // The wrapped view down to the notes; section and joints above the table, the joints side
    // by side.
    const double split = a.x0 + a.width() * 0.48;
    wrapped.box = {a.x0, page.notes_top + 4, split, a.y1};
    const double y_sec = a.y1 - std::min(45.0, a.height() * 0.35);
    section.box = {split, y_sec, a.x1, a.y1};
    const double half = (a.x1 - split) / 2;
    joint[0].box = {split, a.y0, split + half, y_sec};
    joint[1].box = {split + half, a.y0, a.x1, y_sec};
  } else {
    const double split = a.y0 + a.height() * 0.45;
    wrapped.box = {a.x0, split, a.x1, a.y1};
    const double w3 = a.width() / 3;
    section.box = {a.x0, a.y0, a.x0 + w3, split};
    joint[0].box = {a.x0 + w3, a.y0, a.x0 + 2 * w3, split};
    joint[1].box = {a.x0 + 2 * w3, a.y0, a.x1, split};
  }

  // The band as wrapped (front view of band, lining and end blocks).
  geom::ProjectOptions wrap_opt;
  wrap_opt.kinds = {"band", "lining", "block"};
  wrap_opt.smooth = false;
  const geom::ProjectedView wrapped_view = geom::project(model, geom::front_view(), wrap_opt);
  const double ww = wrapped_view.max.x - wrapped_view.min.x, wh = wrapped_view.max.y - wrapped_view.min.y;
  const Scale sw = fitting_scale(ww, wh, 30, 36, wrapped.box, false);
  const double kw = sw.factor();
  wrapped.label = "As wrapped, seen from the front  (" + sw.text() + ")";
  label(c, occ, wrapped);
  const Pt wc{(wrapped.box.x0 + wrapped.box.x1) / 2 - (wrapped_view.min.x + ww / 2) * kw,
              (wrapped.box.y0 + wrapped.box.y1 - Lettering::heading) / 2 - (wrapped_view.min.y + wh / 2) * kw};
  const Mapper mw{wc, kw};
  draw_view(c, occ, wrapped_view, mw, ViewStyle::normal);
  // Centre marks: the drum axis and both pins.
  c.pen(Pen::centre);
  for (Vec2 p : {Vec2{0, 0}, lay.a.pin, lay.b.pin}) {
    const Pt q = mw(Pt{p.x * 1000, p.y * 1000});
    c.line(q - Pt{4, 0}, q + Pt{4, 0});
    c.line(q - Pt{0, 4}, q + Pt{0, 4});
  }
  // The rolled radius: the lining's friction face (or the band's inside), from the view's arcs.
  double r_in = 1e300;
  for (const geom::ViewEdge& e : wrapped_view.edges)
    if (e.kind == geom::ViewEdge::Kind::arc && std::hypot(e.centre.x, e.centre.y) < 0.01 && e.radius > 1)
      r_in = std::min(r_in, e.radius);
  // The cutting plane B–B across the wrap's middle; the arrows look along the band (−tangent).
  const Pt rad{radial.x, radial.y}, look{-tangent.x, -tangent.y};
  const double r_out_band = lay.r_band * 1000 + t / 2;
  const Pt c_in = mw(Pt{rad.x * (r_in - 12 / kw), rad.y * (r_in - 12 / kw)});
  const Pt c_out = mw(Pt{rad.x * (r_out_band + 4 / kw), rad.y * (r_out_band + 4 / kw)});
  c.pen(Pen::centre);
  c.line(c_in, c_out);
  occ.add_segment(c_in, c_out);
  occ.add_box(cutting_plane_end(c, c_out, rad, look, "B"));
  occ.add_box(cutting_plane_end(c, c_in, rad * -1, look, "B"));
  if (r_in < 1e299) {
    // Radius: from the centre to the arc, one arrowhead on the arc, the value along the line.
    const std::string rt = "R" + dim_length(r_in / 1000, u);
    for (double turn : {-0.35, 0.35, -0.6, 0.6, -0.9, 0.9}) {
      const double ang = mid + turn;
      const Pt e{std::cos(ang), std::sin(ang)};
      const Pt from = mw(Pt{0, 0}) + e * 5, tip = mw(Pt{e.x * r_in, e.y * r_in});
      double ta = std::atan2(e.y, e.x);
      if (ta > kPi / 2 + 1e-9) ta -= kPi;
      if (ta <= -kPi / 2 + 1e-9) ta += kPi;
      const Pt tdir{std::cos(ta), std::sin(ta)};
      const double tw = c.text_width(rt, Lettering::body);
      const Pt middle = (from + tip) * 0.5;
      const Pt start = middle - tdir * (tw / 2) + perp(tdir) * 1.0;
      const Quad q = text_quad(c, start, rt, Lettering::body, ta);
      if (!occ.free(q)) continue;
      c.pen(Pen::narrow);
      c.line(from, tip);
      arrowhead(c, tip, e, 3.0);
      c.text(start, rt, Lettering::body, Align::left, ta);
      occ.add_quad(q);
      occ.add_segment(from, tip);
      break;
    }
  }

  // Section B–B, enlarged: band and lining hatched in different directions (ISO 128-50).
  {
    geom::Point2 lo{1e300, 1e300}, hi{-1e300, -1e300};
    for (const Face& f : faces) {
      lo = {std::min(lo.x, f.lo.x), std::min(lo.y, f.lo.y)};
      hi = {std::max(hi.x, f.hi.x), std::max(hi.y, f.hi.y)};
    }
    const Scale ss = fitting_scale(hi.x - lo.x, hi.y - lo.y, 40, 30 + Lettering::heading, section.box, true);
    const double ks = ss.factor();
    section.label = "B–B  (" + ss.text() + ")";
    label(c, occ, section);
    const Box& sb = section.box;
    const Mapper msec{{(sb.x0 + sb.x1) / 2 - 8 - (lo.x + hi.x) / 2 * ks,
                       (sb.y0 + sb.y1 - Lettering::heading) / 2 - (lo.y + hi.y) / 2 * ks},
                      ks};
    for (const Face& f : faces) {
      std::vector<std::vector<Pt>> loops;
      for (const auto& loop : f.loops) {
        loops.emplace_back();
        for (geom::Point2 p : loop) loops.back().push_back(msec(p));
      }
      const bool is_band = f.kind == "band";
      for (const auto& [p, q] : hatch(c, loops, is_band ? kPi / 4 : -kPi / 4, is_band ? 1.5 : 2.5)) occ.add_segment(p, q);
      c.pen(Pen::wide);
      for (const auto& loop : loops) {
        std::vector<Pt> closed = loop;
        closed.push_back(loop.front());
        c.polyline(closed);
        occ.add_polyline(closed);
      }
    }
    const geom::Point2 bl = band_face->lo, bh = band_face->hi;
    place_linear(c, occ, {msec(Pt{bl.x, hi.y}), msec(Pt{bh.x, hi.y}), {1, 0}, dim_length(b / 1000, u),
                          {msec(Pt{0, hi.y}).y + 7, msec(Pt{0, hi.y}).y + 12}});
    place_linear(c, occ, {msec(Pt{bh.x, bl.y}), msec(Pt{bh.x, bh.y}), {0, 1}, dim_length(t / 1000, u),
                          {-(msec(Pt{bh.x, 0}).x + 7), -(msec(Pt{bh.x, 0}).x + 14)}});
    if (lining_face) {
      const geom::Point2 ll = lining_face->lo, lh = lining_face->hi;
      place_linear(c, occ, {msec(Pt{lh.x, ll.y}), msec(Pt{lh.x, lh.y}), {0, 1}, dim_length(t_lining / 1000, u),
                            {-(msec(Pt{lh.x, 0}).x + 7), -(msec(Pt{lh.x, 0}).x + 14)}});
      const Pt lt = msec(Pt{(ll.x + lh.x) / 2, ll.y});
      place_label(c, occ, lt, {lt + Pt{-14, -7}, lt + Pt{14, -7}, lt + Pt{0, -9}}, "lining", Lettering::body, true);
    }
  }

  // The end joints.
  for (int i = 0; i < 2; ++i) {
    const std::string e = i == 0 ? "A" : "B";
    const JointPlan& j = *joints[i];
    if (riveted[i]) {
      joint[i].label = "End " + e + ": riveted lap";
      draw_lap(c, occ, joint[i], laps[i], b, t, standard::clevis_nominal(d.band.pin_diameter) * 500, u);
    } else {
      joint[i].label = "End " + e + ": END-BLOCK-" + e;
      const EndLayout& el = i == 0 ? lay.a : lay.b;
      draw_block(c, occ, joint[i], model, "END-BLOCK-" + e, el.pin, el.run_dir, t, j.weld_leg * 1000,
                 d.band.pin_diameter, u);
    }
  }

  TitleData td = title;
  td.supplementary = "Band assembly " + band->name + (lining ? " with " + lining->name : std::string()) +
                     ", end joints " + to_string(joints[0]->kind) + " / " + to_string(joints[1]->kind) +
                     "; developed length " + dim_length(blank->length / 1000, u) + (us ? " in" : " mm");
  td.scale = sw.text();
  finish_detail_page(c, sheet, page, td);
}

}  // namespace bandforge::drawing
