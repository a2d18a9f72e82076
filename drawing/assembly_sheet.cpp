#include "drawing/assembly_sheet.hpp"

#include <algorithm>
#include <cmath>
#include <map>
#include <numbers>

#include "drawing/annotate.hpp"
#include "drawing/calc_sheet.hpp"
#include "drawing/format.hpp"
#include "drawing/table.hpp"
#include "drawing/text_fit.hpp"
#include "src/errors.hpp"
#include "src/proportions.hpp"

namespace bandforge::drawing {
namespace {

constexpr double kPi = std::numbers::pi;
constexpr double kM = 1000.0;  // mm per m: the solids are in mm, the design in m
constexpr double kGap = 4.0;   // between zones [mm]
constexpr double kLevel = 7.0; // spacing of stacked dimension lines [mm]

using geom::ViewEdge;

Pt polar(Pt c, double r, double a) { return {c.x + r * std::cos(a), c.y + r * std::sin(a)}; }
double dot(Pt a, Pt b) { return a.x * b.x + a.y * b.y; }
double norm(Pt a) { return std::hypot(a.x, a.y); }
Pt unit(Pt a) {
  const double n = norm(a);
  return n > 0 ? Pt{a.x / n, a.y / n} : Pt{1, 0};
}
Pt mm(Vec2 v) { return {v.x * kM, v.y * kM}; }

const char* turn_word(Turn t) { return t == Turn::cw ? "CW" : "CCW"; }

// ---- tables --------------------------------------------------------------------------------

Table results_table(const Design& d, const Solution& s, UnitSystem u) {
  Table t;
  t.widths = {54, 46, 46, 34};
  t.align = {Align::left, Align::right, Align::right, Align::right};
  const bool pa = s.primary_a_tight;
  const DirectionResult& p = s.nominal(pa);
  const DirectionResult& q = s.nominal(!pa);
  t.rows.push_back({"Results (nominal f)", std::string("Design ") + turn_word(d.drum.rotation) +
                                               (pa ? ", A tight" : ", B tight"),
                    std::string("Reverse ") + turn_word(d.drum.rotation == Turn::cw ? Turn::ccw : Turn::cw) +
                        (pa ? ", B tight" : ", A tight"),
                    "Limit"});
  const std::string wrap = degrees(s.layout.wrap);
  t.rows.push_back({"Wrap angle φ", wrap, wrap, ""});
  const std::string f = sig_figs(d.lining.friction, 3) + " (" + sig_figs(d.lining.friction_min, 3) +
                        "…" + sig_figs(d.lining.friction_max, 3) + ")";
  t.rows.push_back({"Friction f (range)", f, f, ""});
  auto row = [&](const char* name, double a, double b, Quantity qq, std::string limit = "") {
    t.rows.push_back({name, qty(a, qq, u), qty(b, qq, u), std::move(limit)});
  };
  row("Tight tension P1", p.tension_tight, q.tension_tight, Quantity::force);
  row("Slack tension P2", p.tension_slack, q.tension_slack, Quantity::force);
  row("Braking torque T", p.torque, q.torque, Quantity::torque);
  auto force_text = [&](const DirectionResult& r) {
    return r.self_locking ? std::string("self-locking") : qty(r.lever_force, Quantity::force, u);
  };
  std::string hand_limit;
  for (const Check& c : s.checks) {
    if (c.id == "hand_force") hand_limit = "≤ " + qty(c.limit, Quantity::force, u);
  }
  t.rows.push_back({"Lever force F", force_text(p), force_text(q), hand_limit});
  row("Max lining pressure", p.pressure_max, q.pressure_max, Quantity::stress,
      d.lining.pressure_limit > 0 ? "≤ " + qty(d.lining.pressure_limit, Quantity::stress, u) : "");
  row("Band stress σ", p.band_stress, q.band_stress, Quantity::stress,
      d.band.allowable_stress > 0 ? "≤ " + qty(d.band.allowable_stress, Quantity::stress, u) : "");
  const DirectionResult& pmax = s.results[pa ? 0 : 1][2];
  const DirectionResult& qmax = s.results[pa ? 1 : 0][2];
  t.rows.push_back({"Self-locking at f_max", pmax.self_locking ? "YES" : "no",
                    qmax.self_locking ? "YES" : "no", ""});
  std::string margin = "cannot self-lock";
  if (s.self_lock_friction) {
    margin = "locks at f ≥ " + sig_figs(*s.self_lock_friction, 3) + " = " +
             sig_figs(*s.self_lock_friction / d.lining.friction_max, 3) + " × f_max";
  }
  t.rows.push_back({"Self-locking margin", margin, "", ""});
  return t;
}

Table parts_table(const geom::BrakeModel& model, UnitSystem u) {
  Table t;
  t.widths = {12, 52, 12, 72, 32};
  t.align = {Align::centre, Align::left, Align::centre, Align::left, Align::right};
  t.rows.push_back({"Item", "Name", "Qty", "Material", "Mass each"});
  int item = 0;
  for (const geom::PartInfo& p : model.parts()) {
    t.rows.push_back({std::to_string(++item), p.name, std::to_string(p.instance_names.size()),
                      p.material, qty(p.mass, Quantity::mass, u, 3)});
  }
  return t;
}

std::vector<std::string> general_notes(const Design& d, UnitSystem u) {
  std::vector<std::string> n;
  n.push_back(std::string("Dimensions in ") + (u == UnitSystem::si ? "mm" : "inches") +
              " from the drum centre; ( ) = reference dimension computed from the pin layout.");
  n.push_back("Applied position shown; lever released (radial clearance " +
              dim_length(d.band.clearance, u) + ") as a phantom line.");
  return n;
}

// ---- zones ---------------------------------------------------------------------------------

// Lines of the notes area: the heading, the general notes as wrapped, two spare for
// annotations that had to be dropped.
double notes_lines(const Canvas& c, const std::vector<std::string>& notes, double width) {
  double n = 1 + 1;
  for (size_t i = 0; i < notes.size(); ++i) {
    n += static_cast<double>(wrap_lines(c, std::to_string(i + 1) + ". " + notes[i], Lettering::body, width).size());
  }
  return n;
}

// Tables, notes, caution and title block: nothing else may be drawn over them.
std::vector<Box> obstacles(const Zones& z) {
  return {z.title_block.grown(1), z.caution.grown(1), z.parts.grown(1), z.results.grown(1),
          z.notes.grown(1)};
}

Zones make_zones(const Canvas& c, const SheetSize& s, double results_h, double parts_h,
                 double notes_lines) {
  Zones z;
  const Box f = frame_box(s);
  z.title_block = title_block_box(s);
  z.caution = caution_box(c, s);
  const double notes_h = notes_lines * Lettering::body * 1.65 + 1;
  if (s.width > s.height) {
    z.parts = {z.title_block.x0, z.caution.y1 + kGap, z.title_block.x1, z.caution.y1 + kGap + parts_h};
    const double w = std::min(180.0, z.title_block.x0 - f.x0 - 2 * kGap);
    z.results = {f.x0 + kGap, f.y0 + kGap, f.x0 + kGap + w, f.y0 + kGap + results_h};
    z.notes = {z.results.x0, z.results.y1 + kGap, z.title_block.x0 - kGap, z.results.y1 + kGap + notes_h};
  } else {
    z.parts = {z.title_block.x0, z.caution.y1 + kGap, z.title_block.x1, z.caution.y1 + kGap + parts_h};
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

// How many distinct coordinates get a dimension (pins and pivot relative to the drum centre).
std::vector<double> distinct(std::vector<double> v) {
  std::vector<double> out;
  std::sort(v.begin(), v.end());
  for (double x : v) {
    if (std::abs(x) < 1e-6) continue;  // on the drum's centre line: nothing to dimension
    if (out.empty() || std::abs(x - out.back()) > 1e-6) out.push_back(x);
  }
  return out;
}

struct Features {
  Pt pivot, handle, a, b;  // model mm
  bool a_on_lever = false, b_on_lever = false;
};

Features features(const Design& d) {
  Features f;
  f.pivot = mm(d.lever.pivot);
  f.handle = mm(d.lever.handle);
  f.a = mm(d.band.end_a.at);
  f.b = mm(d.band.end_b.at);
  f.a_on_lever = d.band.end_a.mount == Mount::lever;
  f.b_on_lever = d.band.end_b.mount == Mount::lever;
  return f;
}

// Horizontal coordinate dimensions go on the side of the drum where the pins are; vertical ones
// on the side away from the handle.
bool dims_below(const Features& f) { return f.a.y + f.b.y + f.pivot.y <= 0; }
bool dims_left(const Features& f) { return f.handle.x >= f.pivot.x; }

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
                           const geom::BrakeModel& model, const SheetSize& sheet) {
  AssemblyPlan plan;
  plan.sheet = sheet;
  plan.front = geom::project(model, geom::front_view());
  plan.side = geom::project(model, geom::left_view());
  plan.hlr_ms = plan.front.milliseconds + plan.side.milliseconds;

  const UnitSystem any = UnitSystem::si;  // table heights do not depend on the units
  {
    const Box f = frame_box(sheet);
    const double notes_w = sheet.width > sheet.height ? title_block_box(sheet).x0 - f.x0 - 2 * kGap
                                                      : f.width() - 2 * kGap;
    plan.zones = make_zones(c, sheet, table_height(c, results_table(d, s, any)),
                            table_height(c, parts_table(model, any)),
                            notes_lines(c, general_notes(d, any), notes_w));
  }
  const Box area = plan.zones.views;
  const Features f = features(d);
  const Margins fm = front_margins(f), sm = side_margins();
  const auto& F = plan.front;
  const auto& S = plan.side;

  std::vector<Scale> tried;
  if (d.drawing.scale_num > 0 && d.drawing.scale_den > 0) {
    tried.push_back({d.drawing.scale_num, d.drawing.scale_den});
  } else {
    tried = standard_scales();
  }
  const double gap = 12;
  const auto blocked = obstacles(plan.zones);
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
    const double dx = fg.x1 + gap + sm.left - S.min.x * k;
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
    plan.scale = sc;
    plan.front_origin = best;
    plan.side_origin = {best.x + dx, best.y};
    plan.drum_centre = plan.front_origin;
    plan.views_box = {plan.front_origin.x + F.min.x * k,
                      plan.front_origin.y + std::min(F.min.y, S.min.y) * k,
                      plan.side_origin.x + S.max.x * k,
                      plan.front_origin.y + std::max(F.max.y, S.max.y) * k};
    return plan;
  }
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

// ---- views -------------------------------------------------------------------------------

struct Mapper {
  Pt origin;
  double k = 1;
  Pt operator()(geom::Point2 p) const { return {origin.x + p.x * k, origin.y + p.y * k}; }
  Pt operator()(Pt p) const { return {origin.x + p.x * k, origin.y + p.y * k}; }
};

std::vector<Pt> sample(const ViewEdge& e, const Mapper& m) {
  std::vector<Pt> pts;
  switch (e.kind) {
    case ViewEdge::Kind::line:
      pts = {m(e.a), m(e.b)};
      break;
    case ViewEdge::Kind::arc: {
      const int n = std::max(2, static_cast<int>(std::ceil(e.sweep * e.radius * m.k / 1.5)));
      for (int i = 0; i <= n; ++i) {
        const double t = e.start + e.sweep * i / n;
        pts.push_back(m(geom::Point2{e.centre.x + e.radius * std::cos(t), e.centre.y + e.radius * std::sin(t)}));
      }
      break;
    }
    case ViewEdge::Kind::polyline:
      for (auto p : e.points) pts.push_back(m(p));
      break;
  }
  return pts;
}

void stroke(Canvas& c, const ViewEdge& e, const Mapper& m) {
  if (e.kind == ViewEdge::Kind::line) {
    c.line(m(e.a), m(e.b));
  } else if (e.kind == ViewEdge::Kind::arc) {
    c.arc(m(e.centre), e.radius * m.k, e.start, e.start + e.sweep);
  } else {
    c.polyline(sample(e, m));
  }
}

enum class Style { normal, phantom };

// Hidden lines first, then smooth edges thin, then visible edges wide (TOOLCHAIN.md: dashes
// drawn over visible lines would tint them).
void draw_view(Canvas& c, Occupancy& occ, const geom::ProjectedView& v, const Mapper& m, Style style) {
  if (style == Style::phantom) {
    c.pen(Pen::phantom);
    for (const auto& e : v.edges) {
      if (e.visible && !e.smooth) stroke(c, e, m);
    }
    return;
  }
  c.pen(Pen::hidden);
  for (const auto& e : v.edges) {
    if (!e.visible) stroke(c, e, m);
  }
  c.pen(Pen::fine);
  for (const auto& e : v.edges) {
    if (e.visible && e.smooth) stroke(c, e, m);
  }
  c.pen(Pen::wide);
  for (const auto& e : v.edges) {
    if (e.visible && !e.smooth) stroke(c, e, m);
  }
  for (const auto& e : v.edges) occ.add_polyline(sample(e, m));
}

// Liang–Barsky clip of a segment to a box; false when nothing is left.
bool clip(Pt& a, Pt& b, const Box& r) {
  double t0 = 0, t1 = 1;
  const double dx = b.x - a.x, dy = b.y - a.y;
  const double p[4] = {-dx, dx, -dy, dy};
  const double q[4] = {a.x - r.x0, r.x1 - a.x, a.y - r.y0, r.y1 - a.y};
  for (int i = 0; i < 4; ++i) {
    if (p[i] == 0) {
      if (q[i] < 0) return false;
    } else {
      const double t = q[i] / p[i];
      if (p[i] < 0) t0 = std::max(t0, t);
      else t1 = std::min(t1, t);
      if (t0 > t1) return false;
    }
  }
  const Pt a0 = a;
  a = {a0.x + t0 * dx, a0.y + t0 * dy};
  b = {a0.x + t1 * dx, a0.y + t1 * dy};
  return true;
}

// A detail: the view's edges inside `window` (model mm), enlarged.
void draw_clipped(Canvas& c, const geom::ProjectedView& v, const Box& window, const Mapper& m) {
  const Mapper identity{{0, 0}, 1};
  for (int pass = 0; pass < 3; ++pass) {
    c.pen(pass == 0 ? Pen::hidden : pass == 1 ? Pen::fine : Pen::wide);
    for (const auto& e : v.edges) {
      const int cls = !e.visible ? 0 : e.smooth ? 1 : 2;
      if (cls != pass) continue;
      const auto pts = sample(e, identity);
      for (size_t i = 1; i < pts.size(); ++i) {
        Pt a = pts[i - 1], b = pts[i];
        if (clip(a, b, window)) c.line(m(a), m(b));
      }
    }
  }
}

// ---- annotations -------------------------------------------------------------------------

std::vector<double> levels_from(double first, double step, int n) {
  std::vector<double> v;
  for (int i = 0; i < n; ++i) v.push_back(first + step * i);
  return v;
}

// Candidate centres on rings around a box, nearest to `target` first.
std::vector<Pt> ring_candidates(const Box& b, Pt target, std::initializer_list<double> offsets) {
  std::vector<Pt> pts;
  for (double off : offsets) {
    const Box r = b.grown(off);
    for (double x = r.x0; x <= r.x1; x += 3) {
      pts.push_back({x, r.y0});
      pts.push_back({x, r.y1});
    }
    for (double y = r.y0; y <= r.y1; y += 3) {
      pts.push_back({r.x0, y});
      pts.push_back({r.x1, y});
    }
  }
  std::stable_sort(pts.begin(), pts.end(), [&](Pt p, Pt q) { return norm(p - target) < norm(q - target); });
  return pts;
}

std::vector<Pt> around(Pt p, double r0, double r1) {
  std::vector<Pt> pts;
  for (double r = r0; r <= r1; r += 2.5) {
    for (int i = 0; i < 16; ++i) pts.push_back(polar(p, r, i * kPi / 8 + kPi / 16));
  }
  return pts;
}

struct Ctx {
  Canvas& c;
  Occupancy& occ;
  std::vector<std::string>& notes;
  UnitSystem u;
};

void dim_or_note(Ctx& x, const LinearDim& d, const std::string& what) {
  if (!place_linear(x.c, x.occ, d)) {
    x.notes.push_back(what + " " + d.text + ": no free place on the sheet, see the calculation sheet");
  }
}

}  // namespace

void draw_assembly(Canvas& c, const AssemblyPlan& plan, const Design& d, const Solution& s,
                   const geom::BrakeModel& model, const geom::BrakeModel* released, UnitSystem u,
                   std::vector<std::string>& notes) {
  const double k = plan.scale.factor();
  const Mapper front{plan.front_origin, k};
  const Mapper side{plan.side_origin, k};
  const Layout& L = s.layout;
  const Features f = features(d);
  const Zones& z = plan.zones;
  Occupancy occ;
  occ.set_limits(z.views);
  for (const Box& o : obstacles(z)) occ.add_box(o);
  Ctx x{c, occ, notes, u};

  const double r = L.r * kM, t_l = d.lining.thickness * kM, t = d.band.thickness * kM;
  const double b = d.band.width * kM, w = d.drum.width * kM;
  const double band_outer = r + t_l + t;
  const Pt C = plan.front_origin;

  // 1. Views.
  draw_view(c, occ, plan.front, front, Style::normal);
  draw_view(c, occ, plan.side, side, Style::normal);
  if (released) {
    geom::ProjectOptions o;
    o.hidden = false;
    o.smooth = false;
    o.kinds = {"lever", "grip"};
    const geom::ProjectedView ph = geom::project(*released, geom::front_view(), o);
    draw_view(c, occ, ph, front, Style::phantom);
    for (const auto& e : ph.edges) occ.add_polyline(sample(e, front));
  }

  // 2. Centre lines: drum axis in both views, every pin and the handle.
  c.pen(Pen::centre);
  auto centre_cross = [&](Pt p, double half) {
    c.line({p.x - half, p.y}, {p.x + half, p.y});
    c.line({p.x, p.y - half}, {p.x, p.y + half});
    occ.add_segment({p.x - half, p.y}, {p.x + half, p.y});
    occ.add_segment({p.x, p.y - half}, {p.x, p.y + half});
  };
  const double drum_cl = band_outer * k + 5;
  centre_cross(C, drum_cl);
  const double pin_cl = d.band.pin_diameter * kM * k + 3;
  std::vector<Pt> pin_points = {f.pivot, f.a, f.b};
  for (Pt p : pin_points) centre_cross(front(p), pin_cl);
  centre_cross(front(f.handle), pin_cl);
  {
    const double x0 = side(geom::Point2{plan.side.min.x, 0}).x - 4;
    const double x1 = side(geom::Point2{plan.side.max.x, 0}).x + 4;
    const double yc = plan.side_origin.y;
    c.line({x0, yc}, {x1, yc});
    occ.add_segment({x0, yc}, {x1, yc});
    std::vector<double> ys;
    for (Pt p : pin_points) ys.push_back(p.y);
    for (double y : distinct(ys)) {
      const double yy = side(Pt{0, y}).y;
      c.line({x0, yy}, {x1, yy});
      occ.add_segment({x0, yy}, {x1, yy});
    }
  }

  // 3. Band-section detail (band and lining thickness at a readable scale), placed in free space.
  {
    const double rim = drum_proportions(d.drum).rim_thickness * kM;
    const double zx0 = b / 2 - 14, zx1 = std::max(w, b) / 2 + 10;
    (void)rim;
    const Box window{zx0, r - 9, zx1, band_outer + 9};
    // Largest ISO 5455 scale (enlargements allowed for details) giving a detail ≤ 80 × 60 mm.
    const int scales[] = {10, 5, 2, 1};
    int kd = 0;
    for (int sc : scales) {
      if (window.width() * sc <= 80 && window.height() * sc <= 60 && sc >= 2 * k) {
        kd = sc;
        break;
      }
    }
    bool placed = false;
    if (kd > 0) {
      const double dw = window.width() * kd, dh = window.height() * kd;
      const double label_h = Lettering::heading + 3;
      // Try spots right of the side view first, then anywhere in the views area, top down.
      std::vector<Pt> spots;
      const double sx = side(geom::Point2{plan.side.max.x, 0}).x + 24;
      for (double y = z.views.y1 - 2; y > z.views.y0 + dh; y -= 4) spots.push_back({sx, y});
      for (double y = z.views.y1 - 2; y > z.views.y0 + dh; y -= 6)
        for (double xx = z.views.x1 - dw - 2; xx > z.views.x0; xx -= 6) spots.push_back({xx, y});
      for (Pt top_left : spots) {
        const Box box{top_left.x, top_left.y - dh - label_h, top_left.x + dw, top_left.y};
        if (!occ.free(box.grown(10))) continue;
        const Mapper dm{{box.x0 - window.x0 * kd, box.y0 + label_h - window.y0 * kd}, static_cast<double>(kd)};
        draw_clipped(c, plan.side, window, dm);
        c.pen(Pen::narrow);
        const Box frame{box.x0, box.y0 + label_h, box.x1, box.y1};
        c.rect(frame);
        const std::string label = "DETAIL X (" + std::to_string(kd) + ":1)";
        c.text({box.x0, box.y0 + 0.5}, label, Lettering::heading);
        occ.add_box(box.grown(1));
        // Mark the detailed region on the side view.
        const Pt mc = side(Pt{(window.x0 + window.x1) / 2, (window.y0 + window.y1) / 2});
        const double mr = std::max(window.width(), window.height()) * k / 2 + 2;
        c.circle(mc, mr);
        occ.add_arc(mc, mr, 0, 2 * kPi);
        place_label(c, occ, polar(mc, mr, kPi / 4), around(polar(mc, mr, kPi / 4), 3, 10), "X",
                    Lettering::heading, false);
        // Thickness dimensions inside the detail, to the right of the band's edge.
        Occupancy local;
        local.set_limits(frame);
        const double ex = b / 2;
        LinearDim band_t{dm(Pt{ex, r + t_l}), dm(Pt{ex, band_outer}), {0, 1}, dim_length(t / kM, u), {}};
        LinearDim lin_t{dm(Pt{ex, r}), dm(Pt{ex, r + t_l}), {0, 1}, dim_length(t_l / kM, u), {}};
        const double lx = dm(Pt{ex, 0}).x;
        for (double off = 8; off <= 40; off += 4) band_t.levels.push_back(-(lx + off));
        for (double off = 16; off <= 44; off += 4) lin_t.levels.push_back(-(lx + off));
        if (!place_linear(c, local, band_t)) notes.push_back("band thickness " + band_t.text + ": no room in detail X");
        if (t_l > 0 && !place_linear(c, local, lin_t)) notes.push_back("lining thickness " + lin_t.text + ": no room in detail X");
        // Name the layers at the left of the detail, where the band covers the drum.
        const double h_small = Lettering::label;
        auto layer = [&](const char* name, double y0, double y1) {
          const Pt at = dm(Pt{window.x0, (y0 + y1) / 2});
          if ((y1 - y0) * kd >= h_small + 0.8) c.text({at.x + 1.5, at.y - h_small / 2}, name, h_small);
        };
        layer("band", r + t_l, band_outer);
        if (t_l > 0) layer("lining", r, r + t_l);
        layer("drum rim", window.y0, r);
        break;
      }
    }
    if (!placed) {
      notes.push_back("band section detail omitted for lack of space: band " + dim_length(d.band.width, u) +
                      " × " + dim_length(d.band.thickness, u) + ", lining " + dim_length(d.lining.thickness, u) +
                      " thick");
    }
  }

  // 4. Dimensions of the front view.
  const Box fv{front(plan.front.min).x, front(plan.front.min).y, front(plan.front.max).x,
               front(plan.front.max).y};
  {
    // Wrap angle: an arc about the drum centre between the tangent points (ISO 129 angular).
    double a0 = L.a.tangent_angle, a1 = L.b.tangent_angle;
    if (L.sense < 0) std::swap(a0, a1);
    std::vector<double> radii;
    for (int i = 0; i < 6; ++i) radii.push_back(band_outer * k + 7 + 5 * i);
    if (!place_angular(c, occ, C, a0, a1, band_outer * k, radii, degrees(L.wrap))) {
      notes.push_back("wrap angle " + degrees(L.wrap) + ": no free place for its dimension");
    }
  }
  {
    // Pin and pivot coordinates from the drum centre: x below (or above) the view, y beside it.
    const bool below = dims_below(f);
    struct Item {
      Pt p;
      double half;  // length of its centre line: extension lines start where it ends
    };
    std::vector<Item> items = {{f.pivot, pin_cl}, {f.a, pin_cl}, {f.b, pin_cl}};
    std::map<long, Item> by_x, by_y;  // one dimension per distinct coordinate
    for (const Item& it : items) {
      const long kx = std::lround(it.p.x * 1000), ky = std::lround(it.p.y * 1000);
      if (kx != 0 && (!by_x.count(kx) || (below ? it.p.y < by_x[kx].p.y : it.p.y > by_x[kx].p.y))) by_x[kx] = it;
      const bool left = dims_left(f);
      if (ky != 0 && (!by_y.count(ky) || (left ? it.p.x < by_y[ky].p.x : it.p.x > by_y[ky].p.x))) by_y[ky] = it;
    }
    std::vector<Item> xs, ys;
    for (auto& [key, it] : by_x) xs.push_back(it);
    for (auto& [key, it] : by_y) ys.push_back(it);
    std::sort(xs.begin(), xs.end(), [](const Item& p, const Item& q) { return std::abs(p.p.x) < std::abs(q.p.x); });
    std::sort(ys.begin(), ys.end(), [](const Item& p, const Item& q) { return std::abs(p.p.y) < std::abs(q.p.y); });
    std::vector<LinearDim> dims;
    int level = 0;
    for (const Item& it : xs) {
      const Pt fp = front(it.p);
      LinearDim dd;
      dd.p1 = {C.x, below ? C.y - drum_cl : C.y + drum_cl};
      dd.p2 = {fp.x, below ? fp.y - it.half : fp.y + it.half};
      dd.along = {1, 0};
      dd.text = dim_length(it.p.x / kM, u);
      const double base = below ? fv.y0 - 8 : fv.y1 + 8;
      dd.levels = levels_from(below ? base - kLevel * level : base + kLevel * level, below ? -kLevel : kLevel, 6);
      dims.push_back(dd);
      ++level;
    }
    level = 0;
    const bool left = dims_left(f);
    for (const Item& it : ys) {
      const Pt fp = front(it.p);
      LinearDim dd;
      dd.p1 = {left ? C.x - drum_cl : C.x + drum_cl, C.y};
      dd.p2 = {left ? fp.x - it.half : fp.x + it.half, fp.y};
      dd.along = {0, 1};
      dd.text = dim_length(it.p.y / kM, u);
      // n = (−1, 0): level = −x of the dimension line.
      const double base = left ? fv.x0 - 8 : fv.x1 + 8;
      std::vector<double> lv;
      for (int i = 0; i < 6; ++i) lv.push_back(-(left ? base - kLevel * (level + i) : base + kLevel * (level + i)));
      dd.levels = lv;
      dims.push_back(dd);
      ++level;
    }
    // Keep the values off the extension lines still to come: reserve each feature's corridor
    // out to its first candidate line before any value is placed.
    for (const LinearDim& dd : dims) {
      const Pt n{-dd.along.y, dd.along.x};
      for (Pt p : {dd.p1, dd.p2}) {
        const double far = dd.levels.front();
        occ.add_segment(p, p + n * (far - dot(p, n)));
      }
    }
    for (const LinearDim& dd : dims) {
      dim_or_note(x, dd, dd.along.x != 0 ? "horizontal position" : "vertical position");
    }
  }
  {
    // Handle arm: pivot to handle, aligned with the lever.
    const Pt O = front(f.pivot), H = front(f.handle);
    LinearDim dd;
    dd.p1 = O;
    dd.p2 = H;
    dd.along = unit(H - O);
    dd.text = dim_length(L.handle_arm, u);
    const Pt n{-dd.along.y, dd.along.x};
    const double base = dot(O, n);
    const double half_w = d.lever.width * kM * k / 2;
    for (int i = 0; i < 5; ++i) {
      dd.levels.push_back(base + half_w + 6 + kLevel * i);
      dd.levels.push_back(base - half_w - 6 - kLevel * i);
    }
    dim_or_note(x, dd, "handle arm");
  }
  {
    // The perpendicular arms of the runs on the lever, as reference dimensions from the pivot
    // to the (extended) run line.
    const Pt O = f.pivot;
    for (int i = 0; i < 2; ++i) {
      const EndLayout& e = i == 0 ? L.a : L.b;
      if (e.mount != Mount::lever) continue;
      const Pt E = mm(e.pin), T = mm(e.tangent_point);
      const Pt uu = unit(T - E);
      const Pt F = E + uu * dot(O - E, uu);
      if (norm(F - O) * k < 3) continue;
      // Extend the run line to the foot of the perpendicular when it lies beyond the pin.
      if (dot(F - E, uu) < 0) {
        c.pen(Pen::narrow);
        c.line(front(E), front(F + (F - E) * (2 / (norm(F - E) * k + 1e-9))));
        occ.add_segment(front(E), front(F));
      }
      LinearDim dd;
      dd.p1 = front(O);
      dd.p2 = front(F);
      dd.along = unit(dd.p2 - dd.p1);
      const Pt n{-dd.along.y, dd.along.x};
      // On the perpendicular itself first, then slid along the run (a dimension between the run
      // line and its parallel through the pivot, with extension lines parallel to the run).
      dd.levels = {dot(dd.p1, n)};
      for (double j = 5; j <= 60; j += 5) {
        dd.levels.push_back(dot(dd.p1, n) + j);
        dd.levels.push_back(dot(dd.p1, n) - j);
      }
      dd.text = "(" + dim_length(std::abs(e.arm), u) + ")";
      dim_or_note(x, dd, std::string("perpendicular arm of run ") + (i == 0 ? "A" : "B"));
    }
  }

  // 5. Side view: drum Ø, drum width, band width.
  {
    const Box sv{side(plan.side.min).x, side(plan.side.min).y, side(plan.side.max).x, side(plan.side.max).y};
    LinearDim dia;
    dia.p1 = side(Pt{w / 2, -r});
    dia.p2 = side(Pt{w / 2, r});
    dia.along = {0, 1};
    dia.text = "Ø" + dim_length(d.drum.diameter, u);
    for (int i = 0; i < 5; ++i) dia.levels.push_back(-(sv.x1 + 8 + kLevel * i));
    dim_or_note(x, dia, "drum diameter");
    const double top = side(Pt{0, band_outer}).y;
    LinearDim bw{side(Pt{-b / 2, band_outer}), side(Pt{b / 2, band_outer}), {1, 0}, dim_length(d.band.width, u), {}};
    for (int i = 0; i < 4; ++i) bw.levels.push_back(top + 8 + kLevel * i);
    dim_or_note(x, bw, "band width");
    LinearDim dw{side(Pt{-w / 2, r}), side(Pt{w / 2, r}), {1, 0}, dim_length(d.drum.width, u), {}};
    for (int i = 1; i < 5; ++i) dw.levels.push_back(top + 8 + kLevel * i);
    dim_or_note(x, dw, "drum width");
  }

  // 6. Rotation arrow inside the drum face, and tight/slack labels on the free runs.
  {
    const DrumProportions dp = drum_proportions(d.drum);
    const double rho = ((r - dp.rim_thickness * kM) + dp.hub_diameter * kM / 2) / 2 * k;
    const double mid = 3 * kPi / 4, half = kPi / 7;
    c.pen(Pen::narrow);
    c.arc(C, rho, mid - half, mid + half);
    occ.add_arc(C, rho, mid - half, mid + half);
    const bool cw = d.drum.rotation == Turn::cw;
    const double tip = cw ? mid - half : mid + half;
    arrowhead(c, polar(C, rho, tip), cw ? Pt{std::sin(tip), -std::cos(tip)} : Pt{-std::sin(tip), std::cos(tip)}, 3.5);
    const std::string text = std::string("drum rotation ") + turn_word(d.drum.rotation);
    const Pt am = polar(C, rho, mid);
    // Beside the arrow if there is room (shortened if need be), else with a leader.
    if (!place_label(c, occ, am, around(am, 4, 14), text, Lettering::body, false) &&
        !place_label(c, occ, am, around(am, 4, 14), std::string("rotation ") + turn_word(d.drum.rotation),
                     Lettering::body, false) &&
        !place_label(c, occ, am, around(am, 4, 10), turn_word(d.drum.rotation), Lettering::heading, false) &&
        !place_label(c, occ, am, around(am, 18, 70), text, Lettering::body, true)) {
      notes.push_back("the drum rotation the brake is designed for is " + std::string(turn_word(d.drum.rotation)));
    }
    for (int i = 0; i < 2; ++i) {
      const EndLayout& e = i == 0 ? L.a : L.b;
      const bool tight = (i == 0) == s.primary_a_tight;
      const Pt p = front((mm(e.pin) + mm(e.tangent_point)) * 0.5);
      const std::string label = std::string(tight ? "TIGHT END " : "SLACK END ") + (i == 0 ? "A" : "B");
      if (!place_label(c, occ, p, around(p, 8, 30), label, Lettering::body, true)) {
        notes.push_back(std::string("end ") + (i == 0 ? "A" : "B") + " is the " + (tight ? "tight" : "slack") +
                        " end in the design rotation");
      }
    }
  }

  // 7. Balloons keyed to the parts list.
  {
    const auto kinds = geom::part_kinds(model);
    const auto& parts = model.parts();
    const double mid_wrap = [&] {
      double a0 = L.a.tangent_angle, a1 = L.b.tangent_angle;
      if (L.sense < 0) std::swap(a0, a1);
      while (a1 <= a0) a1 += 2 * kPi;
      return (a0 + a1) / 2;
    }();
    const double rim = drum_proportions(d.drum).rim_thickness * kM;
    for (size_t i = 0; i < parts.size(); ++i) {
      Pt target;
      const std::string& kd = kinds[i];
      if (kd == "drum") target = polar({0, 0}, r - rim / 2, mid_wrap - kPi / 2);
      else if (kd == "lining") target = polar({0, 0}, r + t_l / 2, mid_wrap + 0.35);
      else if (kd == "band") target = polar({0, 0}, r + t_l + t / 2, mid_wrap - 0.35);
      else if (kd == "lever") target = f.pivot + (f.handle - f.pivot) * 0.6;
      else if (kd == "grip") target = f.handle;
      else if (kd == "pin") target = f.pivot;
      else target = {parts[i].centroid.x, parts[i].centroid.y};
      const Pt tp = front(target);
      if (!place_balloon(c, occ, tp, ring_candidates(fv, tp, {10, 18, 26}), std::to_string(i + 1))) {
        notes.push_back("balloon for item " + std::to_string(i + 1) + " (" + parts[i].name + ") omitted: no free place");
      }
    }
  }

  // 8. Results table, parts list, notes.
  {
    Table rt = results_table(d, s, u);
    fit_width(rt, z.results.width());
    draw_table(c, rt, {z.results.x0, z.results.y1});
    Table pt = parts_table(model, u);
    fit_width(pt, z.parts.width());
    draw_table(c, pt, {z.parts.x0, z.parts.y1});
    std::vector<std::string> text = {"NOTES"};
    std::vector<std::string> items = general_notes(d, u);
    for (const auto& n : notes) items.push_back(n);
    for (size_t i = 0; i < items.size(); ++i) {
      for (auto& l : wrap_lines(c, std::to_string(i + 1) + ". " + items[i], Lettering::body, z.notes.width())) {
        text.push_back(std::move(l));
      }
    }
    const double pitch = Lettering::body * 1.65;
    const double need = static_cast<double>(text.size()) * pitch;
    Box box = z.notes;
    if (box.height() < need) {
      // Not reserved (portrait) or too small: the first free band above the tables.
      bool found = false;
      for (double y0 = z.notes.y0; y0 + need < z.views.y1 && !found; y0 += 2) {
        const Box band{z.notes.x0, y0, z.notes.x1, y0 + need};
        if (occ.free(band)) {
          box = band;
          found = true;
        }
      }
      if (!found) box.y1 = box.y0 + need;  // overflow below: better than no notes
    }
    double y = box.y1 - Lettering::body;
    for (const auto& l : text) {
      c.text({box.x0, y}, l, Lettering::body);
      y -= pitch;
    }
  }
}

}  // namespace bandforge::drawing
