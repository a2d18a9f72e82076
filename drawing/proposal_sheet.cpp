#include "drawing/proposal_sheet.hpp"

#include <algorithm>
#include <cerrno>
#include <cmath>
#include <cstdio>
#include <cstring>
#include <filesystem>
#include <fstream>

#include "drawing/assembly_sheet.hpp"
#include "drawing/canvas.hpp"
#include "drawing/plot.hpp"
#include "drawing/sheet.hpp"
#include "drawing/table.hpp"
#include "src/errors.hpp"
#include "src/mechanics.hpp"
#include "src/version.hpp"

namespace bandforge::drawing {
namespace {

std::string fmt(const char* f, double v) {
  char buf[96];
  std::snprintf(buf, sizeof buf, f, v);
  return buf;
}

const Ink kProposalInk{0.0, 0.25, 0.7};
const Ink kCloudInk{0.55, 0.55, 0.55};

/// Force against band mass: every feasible layout as a grey dot, the proposals as numbered
/// circles.
void draw_scatter(Canvas& c, const Brief& b, const ProposeResult& r, Box frame) {
  double x0 = 1e300, x1 = -1e300, y0 = 1e300, y1 = -1e300;
  auto take = [&](double x, double y) {
    x0 = std::min(x0, x);
    x1 = std::max(x1, x);
    y0 = std::min(y0, y);
    y1 = std::max(y1, y);
  };
  for (const CloudPoint& p : r.cloud) take(p.band_mass, p.force);
  for (const Proposal& p : r.proposals) take(p.figures.band_mass, p.figures.force);
  if (x1 <= x0) { x0 -= 0.5; x1 += 0.5; }
  if (y1 <= y0) { y0 -= 1; y1 += 1; }
  const double sx = nice_step(x1 - x0, 6), sy = nice_step(y1 - y0, 6);
  x0 = std::floor(x0 / sx) * sx;
  x1 = std::ceil(x1 / sx) * sx;
  y0 = std::floor(y0 / sy) * sy;
  y1 = std::ceil(y1 / sy) * sy;
  const Box area{frame.x0 + 16, frame.y0 + 12, frame.x1 - 4, frame.y1 - 17};
  auto at = [&](double x, double y) {
    return Pt{area.x0 + (x - x0) / (x1 - x0) * area.width(), area.y0 + (y - y0) / (y1 - y0) * area.height()};
  };
  c.text({frame.x0, frame.y1 - Lettering::heading}, "Feasible layouts evaluated: operator force against band mass",
         Lettering::heading);
  c.pen(Pen::fine);
  for (double x = x0; x <= x1 + 1e-9 * sx; x += sx) {
    c.line(at(x, y0), at(x, y1));
    c.text(at(x, y0) + Pt{0, -4}, fmt("%g", std::round(x / sx) * sx), Lettering::label, Align::centre);
  }
  for (double y = y0; y <= y1 + 1e-9 * sy; y += sy) {
    c.line(at(x0, y), at(x1, y));
    c.text(at(x0, y) + Pt{-1.5, -0.7}, fmt("%g", std::round(y / sy) * sy), Lettering::label, Align::right);
  }
  c.pen(Pen::narrow);
  c.rect(area);
  c.text({(area.x0 + area.x1) / 2, frame.y0 + 1}, "band mass [kg]", Lettering::body, Align::centre);
  c.text({frame.x0 + 3, (area.y0 + area.y1) / 2}, "operator force at f_min [N]", Lettering::body, Align::centre,
         1.5707963267948966);
  for (const CloudPoint& p : r.cloud) c.fill_circle(at(p.band_mass, p.force), 0.35, kCloudInk);
  for (std::size_t i = 0; i < r.proposals.size(); ++i) {
    const Figures& f = r.proposals[i].figures;
    const Pt p = at(f.band_mass, f.force);
    c.pen(Pen::wide, kProposalInk);
    c.circle(p, 1.6);
    // Labels alternate right and left so that neighbours stay legible.
    const bool right = i % 2 == 0;
    c.text(p + Pt{right ? 2.2 : -2.2, (i % 4 < 2) ? 1.2 : -3.2}, std::string("P").append(std::to_string(i + 1)),
           Lettering::body, right ? Align::left : Align::right, 0, kProposalInk);
  }
  c.pen(Pen::narrow);
  std::string drums;
  for (double dd : b.drum_diameters) drums += (drums.empty() ? "Ø" : "/") + fmt("%g", dd * 1000);
  c.text({frame.x0, frame.y1 - Lettering::heading - 5},
         "Brief: " + fmt("%.4g N·m", b.torque) + " × " + fmt("%g", b.service_factor) +
             (b.both_directions ? " both rotations" : std::string(" drum ") + to_string(b.rotation)) + ", drum " +
             drums + " mm, " + (b.lining.material.empty() ? std::string("lining") : b.lining.material + " lining") +
             " f " + fmt("%.2f", b.lining.friction_min) + "–" + fmt("%.2f", b.lining.friction_max) + ", goal: " +
             to_string(b.goal),
         Lettering::label);
  c.text({frame.x0, frame.y1 - Lettering::heading - 8.5},
         std::to_string(r.cloud.size()) + " of " + std::to_string(r.stats.feasible) +
             " feasible layouts shown (grey); proposals in blue",
         Lettering::label);
}

/// One proposal in the front view, fitted into `frame`, with the space regions.
void draw_sketch(Canvas& c, const Brief& b, const Proposal& p, int rank, Box frame) {
  const Design& d = p.design;
  Layout L;
  if (try_pin_layout(d, L) != LayoutFault::none) return;  // cannot happen for a proposal
  // Extent: drum, regions, pins, handle.
  double x0 = -d.drum.diameter / 2, x1 = -x0, y0 = x0, y1 = x1;
  auto take = [&](Vec2 v) {
    x0 = std::min(x0, v.x); x1 = std::max(x1, v.x);
    y0 = std::min(y0, v.y); y1 = std::max(y1, v.y);
  };
  for (const Region* r : {&b.pins, &b.frame_pin, &b.lever_pins, &b.pivot, &b.handle})
    for (Vec2 v : r->corners) take(v);
  for (const Region& r : b.keep_out) for (Vec2 v : r.corners) take(v);
  take(d.lever.handle);
  const Box area{frame.x0 + 2, frame.y0 + 8, frame.x1 - 2, frame.y1 - 7};
  const double k = std::min(area.width() / (x1 - x0), area.height() / (y1 - y0));
  const Pt mid{(area.x0 + area.x1) / 2, (area.y0 + area.y1) / 2};
  const double cx = (x0 + x1) / 2, cy = (y0 + y1) / 2;
  auto at = [&](Vec2 v) { return Pt{mid.x + (v.x - cx) * k, mid.y + (v.y - cy) * k}; };
  auto region = [&](const Region& r, Pen pen, Ink ink) {
    if (r.corners.empty()) return;
    c.pen(pen, ink);
    std::vector<Pt> pts;
    for (Vec2 v : r.corners) pts.push_back(at(v));
    if (pts.size() == 1) {
      c.circle(pts[0], 1.0);
      return;
    }
    if (pts.size() > 2) pts.push_back(pts.front());
    c.polyline(pts);
  };
  c.pen(Pen::narrow);
  c.rect(frame);
  for (const Region& r : b.keep_out) {
    std::vector<Pt> pts;
    for (Vec2 v : r.corners) pts.push_back(at(v));
    c.fill_polygon(pts, {0.85, 0.85, 0.85});
  }
  region(b.pins, Pen::hidden, {0.1, 0.5, 0.1});
  region(b.frame_pin, Pen::hidden, {0.1, 0.5, 0.1});
  region(b.lever_pins, Pen::hidden, {0.1, 0.5, 0.1});
  region(b.pivot, Pen::hidden, {0.1, 0.5, 0.1});
  region(b.handle, Pen::hidden, {0.6, 0.3, 0.0});
  // Drum, band (runs and wrap arc), lever, pins.
  c.pen(Pen::narrow);
  c.circle(at({0, 0}), d.drum.diameter / 2 * k);
  c.pen(Pen::wide);
  c.line(at(L.a.pin), at(L.a.tangent_point));
  c.line(at(L.b.pin), at(L.b.tangent_point));
  const double a0 = L.a.tangent_angle, a1 = L.b.tangent_angle;
  double from = L.sense > 0 ? a0 : a1;
  double to = from + L.wrap;
  c.arc(at({0, 0}), L.r_band * k, from, to);
  c.pen(Pen::wide, kProposalInk);
  c.line(at(d.lever.pivot), at(d.lever.handle));
  for (const BandEnd* e : {&d.band.end_a, &d.band.end_b}) {
    if (e->mount == Mount::lever) c.line(at(d.lever.pivot), at(e->at));
  }
  c.pen(Pen::narrow);
  for (Vec2 v : {d.band.end_a.at, d.band.end_b.at, d.lever.pivot}) c.fill_circle(at(v), 0.9);
  c.fill_circle(at(d.lever.handle), 1.2, kProposalInk);
  c.text({frame.x0 + 1.5, frame.y1 - Lettering::body - 1.5},
         std::string("P").append(std::to_string(rank)) + "  " + to_string(p.kind) + ", " + fmt("%.0f N", p.figures.force) + ", " +
             fmt("%.0f°", p.figures.wrap * 180 / 3.14159265358979323846),
         Lettering::body);
  c.text({frame.x0 + 1.5, frame.y0 + 2}, "Ø" + fmt("%.0f", d.drum.diameter * 1000) + ", band " +
                                             fmt("%g", d.band.width * 1000) + " × " + fmt("%g", d.band.thickness * 1000) +
                                             ", pins Ø" + fmt("%g", d.band.pin_diameter * 1000),
         Lettering::label);
}

}  // namespace

std::string render_proposal_sheet(const Brief& b, const ProposeResult& r) {
  Canvas c;
  c.set_title(b.project.title + " — proposals", b.project.creator,
              "bandforge proposals for brief " + b.project.number);
  const SheetSize s = sheet_size("A3");
  c.new_page(s.width, s.height);
  draw_frame(c, s);
  const Box f = frame_box(s);
  const Box tb = title_block_box(s);
  const Box caution = caution_box(c, s);

  // Ranked table along the bottom left.
  Table t;
  t.widths = {10, 21, 12, 20, 10, 16, 17, 16, 16, 16, 14, 16};
  t.align = {Align::left, Align::left, Align::right, Align::left, Align::right, Align::right, Align::right,
             Align::right, Align::right, Align::right, Align::right, Align::right};
  t.rows.push_back({"Rank", "Kind", "Wrap", "Band b × t [mm]", "Pin Ø", "Force [N]", "Pressure [MPa]",
                    "Band σ [MPa]", "Lever σ [MPa]", "Self-lock f", "Band [kg]", "Travel [mm]"});
  for (std::size_t i = 0; i < r.proposals.size(); ++i) {
    const Proposal& p = r.proposals[i];
    const Figures& fi = p.figures;
    const Design& d = p.design;
    t.rows.push_back({std::string("P").append(std::to_string(i + 1)), to_string(p.kind),
                      fmt("%.0f°", fi.wrap * 180 / 3.14159265358979323846),
                      fmt("%g", d.band.width * 1000) + " × " + fmt("%g", d.band.thickness * 1000),
                      fmt("%g", d.band.pin_diameter * 1000), fmt("%.1f", fi.force), fmt("%.3f", fi.pressure / 1e6),
                      fmt("%.1f", fi.band_stress / 1e6), fmt("%.1f", fi.lever_stress / 1e6),
                      std::isfinite(fi.self_lock_friction) ? fmt("%.3f", fi.self_lock_friction) : std::string("none"),
                      fmt("%.2f", fi.band_mass), fmt("%.1f", fi.travel * 1000)});
  }
  const double table_w = tb.x0 - f.x0 - 8;
  fit_width(t, table_w);
  const double table_h = table_height(c, t);
  const Pt table_top{f.x0 + 4, f.y0 + 4 + table_h};
  c.text({table_top.x, table_top.y + 2 + Lettering::body * 1.6},
         "Ranked proposals (files " + b.project.number + "-Pn.toml), worst case over f_min…f_max" +
             (b.both_directions ? ", both rotations" : ""),
         Lettering::body);
  c.text({table_top.x, table_top.y + 2}, "Limits: force " + fmt("%.0f N", b.max_force) +
             (b.max_travel > 0 ? ", travel " + fmt("%.0f mm", b.max_travel * 1000) : std::string()) +
             ", pressure " + fmt("%.3g", b.lining.pressure_limit / 1e6) + ", band σ " +
             fmt("%.3g", b.stock.band_allowable_stress / 1e6) + ", lever σ " +
             fmt("%.3g MPa", b.stock.lever_allowable_stress / 1e6) +
             (b.allow_self_locking ? std::string() : ", self-lock f ≥ " + fmt("%.3g", b.self_lock_margin * b.lining.friction_max)),
         Lettering::body);
  draw_table(c, t, table_top);

  // Above the table: the plot on the left, the sketches on the right.
  const double top = f.y1 - 4, bottom = table_top.y + 12;
  const double plot_w = 150;
  draw_scatter(c, b, r, {f.x0 + 4, bottom, f.x0 + 4 + plot_w, top});
  const Box sketches{f.x0 + plot_w + 12, std::max(bottom, caution.y1 + 4), f.x1 - 4, top};
  const int n = static_cast<int>(r.proposals.size());
  const int cols = n <= 2 ? n : (n <= 4 ? 2 : 3);
  const int rows = (n + cols - 1) / std::max(cols, 1);
  const double cw = sketches.width() / std::max(cols, 1), ch = sketches.height() / std::max(rows, 1);
  for (int i = 0; i < n; ++i) {
    const int col = i % cols, row = i / cols;
    const Box cell{sketches.x0 + col * cw + 1, sketches.y1 - (row + 1) * ch + 1, sketches.x0 + (col + 1) * cw - 1,
                   sketches.y1 - row * ch - 1};
    draw_sketch(c, b, r.proposals[static_cast<std::size_t>(i)], i + 1, cell);
  }
  c.pen(Pen::narrow);
  c.text({sketches.x0, sketches.y0 - 4},
         "Front views, drum centre at the origin: pin regions green dashed, handle region brown dashed, "
         "keep-out grey, lever blue",
         Lettering::label);

  draw_caution(c, caution);
  TitleData td;
  td.owner = b.project.owner;
  td.title = b.project.title;
  td.supplementary = "Proposals for review: " + std::to_string(r.proposals.size()) + " ranked by " +
                     to_string(b.goal) + "; each passes every check of bandforge solve and builds";
  td.number = b.project.number + "-PROPOSALS";
  td.revision = b.project.revision;
  td.date = b.project.date;
  td.creator = b.project.creator;
  td.approver = b.project.approver;
  td.doc_type = "Proposal review sheet";
  td.scale = "—";
  td.units = "mm, N, MPa, kg";
  td.projection_symbol = false;
  draw_title_block(c, s, td);
  const std::vector<unsigned char> bytes = c.finish();
  return std::string(bytes.begin(), bytes.end());
}

void write_proposal_sheet(const Brief& b, const ProposeResult& r, const std::string& path) {
  const std::string bytes = render_proposal_sheet(b, r);
  std::ofstream out(path, std::ios::binary | std::ios::trunc);
  if (!out) throw IoError("cannot write " + path + ": " + std::strerror(errno));
  out.write(bytes.data(), static_cast<std::streamsize>(bytes.size()));
  out.close();
  if (!out) throw IoError("cannot write " + path + " (disk full?)");
}

}  // namespace bandforge::drawing
