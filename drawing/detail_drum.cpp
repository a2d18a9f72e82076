// The drum's detail sheet (issue 10): the view along the axis and the full section A–A through
// it (ISO 128-40/-44/-50), every size read from the drum solid's own section (rim, web, hub and
// bore levels of the cut face), the bore's ISO 286 fit with datum A on its axis (ISO 5459), the
// friction surface's tolerance, its total runout to A (ISO 1101) and its surface texture
// (ISO 1302 symbol).
#include <algorithm>
#include <cmath>
#include <cstdio>
#include <map>

#include "drawing/annotate.hpp"
#include "drawing/detail_marks.hpp"
#include "drawing/detail_page.hpp"
#include "drawing/detail_sheet.hpp"
#include "drawing/format.hpp"
#include "drawing/vec2.hpp"
#include "drawing/views.hpp"
#include "geometry/projection.hpp"
#include "src/errors.hpp"
#include "src/fits.hpp"

namespace bandforge::drawing {
namespace {

// Sizes of the drum as its section gives them [mm]; u along the axis (section view), v radial.
struct DrumSection {
  double r = 0, r_rim_in = 0, r_hub = 0, r_bore = 0;  // radial levels of the cut face
  double face0 = 0, face1 = 0;  // rim faces (u) at the friction surface
  double web0 = 0, web1 = 0;    // web faces (u) where the web meets the rim
  double hub0 = 0, hub1 = 0;    // hub faces (u) at the bore
};

// The levels of the upper cut face (v > 0): every vertex grouped by v; a drum has four (bore,
// hub, rim inside, friction surface), each with the u of the faces that meet there.
DrumSection measure(const geom::ProjectedView& section) {
  // Vertices within 0.01 mm of each other radially are one level: a size converted from inches
  // can leave two vertices of one level a rounding apart, on either side of a µm.
  std::vector<geom::Point2> upper;
  for (const geom::SectionFace& f : section.sections) {
    for (const auto& loop : f.loops) {
      double cy = 0;
      for (geom::Point2 p : loop) cy += p.y;
      if (cy <= 0) continue;  // the lower half mirrors the upper one
      upper.insert(upper.end(), loop.begin(), loop.end());
    }
  }
  std::sort(upper.begin(), upper.end(), [](geom::Point2 a, geom::Point2 b) { return a.y < b.y; });
  std::map<long, std::vector<double>> levels;  // first v of the level in µm → u values
  long key = 0;
  double last = -1e300;
  for (geom::Point2 p : upper) {
    if (p.y - last > 0.01) key = std::lround(p.y * 1000);
    last = p.y;
    levels[key].push_back(p.x);
  }
  if (levels.size() != 4) {
    throw BuildError("drawing: the drum's section has " + std::to_string(levels.size()) +
                     " radial levels, not the four of bore, hub, rim and friction surface");
  }
  std::vector<std::pair<double, std::vector<double>>> lv;
  for (auto& [v, us] : levels) {
    std::sort(us.begin(), us.end());
    std::vector<double> distinct;
    for (double x : us)
      if (distinct.empty() || x - distinct.back() > 1e-3) distinct.push_back(x);
    lv.push_back({v / 1000.0, distinct});
  }
  DrumSection s;
  s.r_bore = lv[0].first;
  s.r_hub = lv[1].first;
  s.r_rim_in = lv[2].first;
  s.r = lv[3].first;
  s.hub0 = lv[0].second.front();
  s.hub1 = lv[0].second.back();
  s.face0 = lv[3].second.front();
  s.face1 = lv[3].second.back();
  const auto& rim_in = lv[2].second;  // rim faces and web faces
  if (rim_in.size() != 4) throw BuildError("drawing: the drum's section shows no web between rim and hub");
  s.web0 = rim_in[1];
  s.web1 = rim_in[2];
  return s;
}

std::string dia(double mm, UnitSystem u) { return "Ø" + dim_length(mm / 1000, u); }

// A leader from `tip` on a circle (centre `c`, radius `r`) outward at the first free angle,
// ending in a horizontal shoulder toward `side`; `what` draws the symbol on the shoulder's end
// and gives its box for a test. The arrowhead points at the centre (onto the surface).
template <class Measure, class Draw>
bool place_on_circle(Canvas& c, Occupancy& occ, Pt centre, double r, const std::vector<double>& angles,
                     int side, Measure measure_box, Draw draw, Box& placed) {
  for (double reach : {8.0, 13.0, 18.0}) {
    for (double deg : angles) {
      const double a = deg * kPi / 180;
      const Pt e{std::cos(a), std::sin(a)};
      const Pt tip = centre + e * r, knee = centre + e * (r + reach);
      const Pt end = knee + Pt{side * 3.0, 0};
      const Box box = measure_box(end);
      if (!occ.free(box) || !occ.segment_clear(tip + e * 3, knee) || !occ.segment_clear(knee, end)) continue;
      c.pen(Pen::narrow);
      c.polyline({tip, knee, end});
      arrowhead(c, tip, e * -1, 3.0);
      placed = draw(end);
      occ.add_box(placed);
      occ.add_segment(tip, knee);
      occ.add_segment(knee, end);
      return true;
    }
  }
  return false;
}

}  // namespace

DrumSheetMarks draw_drum_sheet(Canvas& c, const SheetSize& sheet, const Design& d, const geom::BrakeModel& model,
                               UnitSystem u, const TitleData& title) {
  const geom::PartInfo* part = nullptr;
  const std::vector<std::string> kinds = geom::part_kinds(model);
  for (std::size_t i = 0; i < model.parts().size(); ++i)
    if (kinds[i] == "drum") part = &model.parts()[i];
  if (part == nullptr || part->instance_names.empty()) throw BuildError("drawing: no drum for its detail sheet");
  geom::ProjectOptions only;
  only.smooth = false;
  only.kinds = {"drum"};
  only.instances = {part->instance_names.front()};
  const geom::ProjectedView front = geom::project(model, geom::front_view(), only);
  // The section A–A: the plane through the axis seen from the left (x = 0, the near half away).
  geom::ProjectOptions cut = only;
  cut.hidden = false;
  cut.cut = true;
  const geom::ProjectedView section = geom::project(model, geom::left_view(), cut);
  const DrumSection s = measure(section);
  const double D = 2 * s.r, width = s.face1 - s.face0, web = s.web1 - s.web0, hub_len = s.hub1 - s.hub0;

  // Notes: part, fits and tolerances (ISO 286 values from src/fits, always in mm).
  const bool us = u == UnitSystem::us;
  const auto bore_fit = fits::fit(2 * s.r_bore / 1000, fits::kBoreHole, fits::kBoreShaft);
  const auto general = fits::general_linear(D / 1000, 'm');
  char tol[32] = "";
  if (general) std::snprintf(tol, sizeof tol, "±%.1f", *general * 1000);
  std::vector<std::string> notes = {
      "Part " + part->name + ", quantity " + std::to_string(part->instance_names.size()) + ", " + part->material +
          ", mass " + qty(part->mass, Quantity::mass, u, 3) + " each. Sizes from the drum solid: section A–A "
          "through the axis; rim, web and hub in one piece.",
      bore_fit ? "Bore Ø" + dim_length(2 * s.r_bore / 1000, UnitSystem::si) + " " + fits::kBoreHole + ": " +
                     deviation_mm(bore_fit->hole.upper) + "/" + deviation_mm(bore_fit->hole.lower) +
                     " mm (ISO 286-2) for a " + fits::kBoreShaft + " shaft (" + deviation_mm(bore_fit->shaft.upper) +
                     "/" + deviation_mm(bore_fit->shaft.lower) + " mm), a transition fit for a keyed hub. "
                     "Datum A: the bore's axis."
               : "Bore: fit to be specified (size outside the ISO 286 table carried). Datum A: the bore's axis.",
      std::string("Friction surface Ø") + dim_length(D / 1000, UnitSystem::si) + " mm " + tol +
          " mm (ISO 2768-1 class m); total runout 0.1 mm to A (common practice, no source); turned, "
          "Ra 1.6 µm (common practice, no source).",
      std::string(us ? "Dimensions in inches; fits, geometrical tolerances and their values in mm. " : "") +
          "General tolerances ISO 2768-mK. Remove burrs; break sharp edges 0.5 mm."};
  DetailPage page = start_detail_page(c, sheet, notes, Table{});
  Occupancy& occ = page.occ;

  // Layout along x (first angle): leader room, front view, gap for the bore dimension, the
  // section, room for its diameters. Third angle: the section on the left, mirrored order.
  const bool third = d.drawing.projection == Projection::third;
  const double sec_w = section.max.x - section.min.x;
  const double lead_room = 40, gap = 44, dims_room = 34, above = 24, below = 16;
  const Scale scale = fitting_scale(D + sec_w, D, lead_room + gap + dims_room, above + below, page.area, false);
  const double k = scale.factor();
  const double total_w = (D + sec_w) * k + lead_room + gap + dims_room;
  const double x_left = page.area.x0 + std::max(0.0, (page.area.width() - total_w) / 2);
  const double cy = page.area.y0 + below + (page.area.height() - above - below) / 2;
  double front_cx, sec_x0;  // front view centre; sheet x of the section's min u
  if (!third) {
    front_cx = x_left + lead_room + D * k / 2;
    sec_x0 = front_cx + D * k / 2 + gap;
  } else {
    sec_x0 = x_left + dims_room;
    front_cx = sec_x0 + sec_w * k + gap + D * k / 2;
  }
  const Mapper mf{{front_cx, cy}, k};
  const Mapper ms{{sec_x0 - section.min.x * k, cy}, k};
  const int out_side = third ? -1 : 1;  // the section's side away from the front view

  // Section faces hatched (ISO 128-50: thin lines at 45°), then the edges.
  std::vector<std::vector<Pt>> loops;
  for (const geom::SectionFace& f : section.sections)
    for (const auto& loop : f.loops) {
      loops.emplace_back();
      for (geom::Point2 p : loop) loops.back().push_back(ms(p));
    }
  for (const auto& [a, b] : hatch(c, loops, kPi / 4, 2.5)) occ.add_segment(a, b);  // text keeps off
  draw_view(c, occ, section, ms, ViewStyle::normal);
  draw_view(c, occ, front, mf, ViewStyle::normal);

  // Centre lines: the axis through the section, the horizontal one through the front view; the
  // vertical one is the cutting plane, drawn as ISO 128-40 04.2 (chain, wide at the ends).
  const double R = D / 2 * k;
  c.pen(Pen::centre);
  c.line(ms(Pt{section.min.x, 0}) - Pt{4, 0}, ms(Pt{section.max.x, 0}) + Pt{4, 0});
  c.line({front_cx - R - 4, cy}, {front_cx + R + 4, cy});
  c.line({front_cx, cy - R - 6}, {front_cx, cy + R + 6});
  occ.add_segment({front_cx, cy - R - 6}, {front_cx, cy + R + 6});
  occ.add_segment({front_cx - R - 4, cy}, {front_cx + R + 4, cy});
  const Pt look{1, 0};  // the section is seen from the left: the arrows point along +x
  for (int end : {1, -1}) {
    occ.add_box(cutting_plane_end(c, {front_cx, cy + end * (R + 6)}, {0, static_cast<double>(end)}, look, "A"));
  }

  // The section's dimensions. Face width above it.
  const double top = cy + R, bottom = cy - R;
  place_linear(c, occ, {ms(Pt{s.face0, s.r}), ms(Pt{s.face1, s.r}), {1, 0}, dim_length(width / 1000, u),
                        {top + 8, top + 12}});
  if (std::abs(hub_len - width) > 0.05) {
    place_linear(c, occ, {ms(Pt{s.hub0, -s.r_hub}), ms(Pt{s.hub1, -s.r_hub}), {1, 0}, dim_length(hub_len / 1000, u),
                          {bottom - 8, bottom - 12}});
  }
  // The web in the gap between rim and hub, above or below the axis.
  const double v_mid = (s.r_hub + s.r_rim_in) / 2;
  place_linear(c, occ, {ms(Pt{s.web0, v_mid}), ms(Pt{s.web1, v_mid}), {1, 0}, dim_length(web / 1000, u),
                        {ms(Pt{0, v_mid}).y, ms(Pt{0, -v_mid}).y, ms(Pt{0, v_mid + (s.r_rim_in - s.r_hub) / 4}).y}});
  // Diameters on the outer side, nested: hub nearest, rim inside, friction surface outermost.
  const double u_out = out_side > 0 ? section.max.x : section.min.x;
  const double x_out = ms(Pt{u_out, 0}).x;
  auto level = [](double x) { return -x; };  // n = (−1, 0) for along (0, 1): level = −x
  const std::string d_text = dia(D, u) + (general ? (us ? " (" + std::string(tol) + " mm)" : " " + std::string(tol)) : "");
  struct Diam {
    double v, u;
    std::string text;
  };
  const Diam diams[] = {{s.r_hub, out_side > 0 ? s.hub1 : s.hub0, dia(2 * s.r_hub, u)},
                        {s.r_rim_in, out_side > 0 ? s.face1 : s.face0, dia(2 * s.r_rim_in, u)},
                        {s.r, out_side > 0 ? s.face1 : s.face0, d_text}};
  for (int i = 0; i < 3; ++i) {
    const double x = x_out + out_side * (9.0 + 9.0 * i);
    place_linear(c, occ, {ms(Pt{diams[i].u, -diams[i].v}), ms(Pt{diams[i].u, diams[i].v}), {0, 1}, diams[i].text,
                          {level(x), level(x + out_side * 4.0)}});
  }

  // The bore on the inner side, drawn here so that datum A sits on its dimension line: arrows
  // onto the extension lines, the datum triangle in line with the dimension line (ISO 5459).
  DrumSheetMarks marks;
  {
    const double u_in = out_side > 0 ? s.hub0 : s.hub1;
    const Pt e_top = ms(Pt{u_in, s.r_bore}), e_bot = ms(Pt{u_in, -s.r_bore});
    const std::string text = dia(2 * s.r_bore, us ? UnitSystem::si : u) + (us ? " mm" : "") +
                             (bore_fit ? std::string(" ") + fits::kBoreHole + " (" + deviation_mm(bore_fit->hole.upper) +
                                             "/" + deviation_mm(bore_fit->hole.lower) + ")"
                                       : "");
    const double tw = c.text_width(text, Lettering::body);
    const double len = e_top.y - e_bot.y;
    bool done = false;
    for (double off : {10.0, 16.0, 22.0}) {
      const double x = e_top.x - out_side * off;
      // The value beside the line, reading from the right (rotated 90°), inside when it fits.
      const bool inside = len >= tw + 8;
      const Pt at = inside ? Pt{x - 1.0, (e_top.y + e_bot.y) / 2 - tw / 2} : Pt{x - 1.0, e_top.y + 4.5};
      const Quad q = text_quad(c, at, text, Lettering::body, kPi / 2);
      const Box datum_zone{x - 3, e_bot.y - 3 - 2.6 - 3 - kFrameHeight - 0.5, x + 3, e_bot.y};
      if (!occ.free(q) || !occ.free(datum_zone)) continue;
      c.pen(Pen::narrow);
      for (const Pt& e : {e_top, e_bot}) {
        const Pt a = e + Pt{-out_side * 1.0, 0}, b = Pt{x - out_side * 2.0, e.y};
        c.line(a, b);
        occ.add_segment(a, b);
      }
      c.line({x, e_bot.y}, {x, inside ? e_top.y : e_top.y + 4.5 + tw});
      occ.add_segment({x, e_bot.y}, {x, e_top.y});
      arrowhead(c, {x, e_top.y}, {0, 1}, 3.0);
      arrowhead(c, {x, e_bot.y}, {0, -1}, 3.0);
      c.text(at, text, Lettering::body, Align::left, kPi / 2);
      occ.add_quad(q);
      marks.datum = datum_indicator(c, {x, e_bot.y}, {0, -1}, 3.0, "A");
      occ.add_box(datum_zone);
      done = true;
      break;
    }
    if (!done) throw BuildError("drawing: no room for the drum bore's dimension on sheet " + sheet.name);
  }

  // On the view along the axis: the friction surface's texture symbol and runout frame, on
  // leaders from the circle on the side away from the section.
  const std::vector<double> up_angles = third ? std::vector<double>{45, 60, 30, 75} : std::vector<double>{135, 120, 150, 105};
  const std::vector<double> down_angles =
      third ? std::vector<double>{315, 300, 330, 285} : std::vector<double>{225, 240, 210, 255};
  const int lead_side = third ? 1 : -1;
  const std::string ra = "Ra 1.6";
  auto texture_at = [&](Pt end) {  // the shoulder runs on under the symbol; its tip on the shoulder
    const Box b = surface_texture_box(c, {0, 0}, ra);
    const double tip_x = lead_side > 0 ? end.x + 0.5 - b.x0 : end.x - 0.5 - b.x1;
    return Pt{tip_x, end.y};
  };
  const bool texture = place_on_circle(
      c, occ, {front_cx, cy}, R, up_angles, lead_side,
      [&](Pt end) { return surface_texture_box(c, texture_at(end), ra); },
      [&](Pt end) {
        const Box b = surface_texture_box(c, texture_at(end), ra);
        c.pen(Pen::narrow);
        c.line(end, {lead_side > 0 ? b.x1 : b.x0, end.y});
        return surface_texture_symbol(c, texture_at(end), ra);
      },
      marks.texture_symbol);
  const double fw = runout_frame_width(c, "0.1", "A");
  auto frame_left = [&](Pt end) { return lead_side > 0 ? end : end - Pt{fw, 0}; };
  const bool runout = place_on_circle(
      c, occ, {front_cx, cy}, R, down_angles, lead_side,
      [&](Pt end) {
        const Pt l = frame_left(end);
        return Box{l.x, l.y - kFrameHeight / 2, l.x + fw, l.y + kFrameHeight / 2};
      },
      [&](Pt end) { return runout_frame(c, frame_left(end), "0.1", "A"); }, marks.runout_frame);
  if (!texture || !runout) throw BuildError("drawing: no room for the drum's surface symbols on sheet " + sheet.name);

  // Labels: the section's designation above it (ISO 128-44), the view's name above the front.
  const double sec_mid = ms(Pt{(section.min.x + section.max.x) / 2, 0}).x;
  c.text({sec_mid, top + 16}, "A–A", Lettering::heading, Align::centre);
  c.text({page.area.x0, page.area.y1 - Lettering::heading}, part->name + "  (scale " + scale.text() + ")",
         Lettering::heading);

  TitleData td = title;
  td.supplementary = "Drum " + part->name + ": rim, web and hub, " + part->material + "; sizes from the solid";
  td.scale = scale.text();
  finish_detail_page(c, sheet, page, td);
  marks.scale_num = scale.num;
  marks.scale_den = scale.den;
  return marks;
}

}  // namespace bandforge::drawing
