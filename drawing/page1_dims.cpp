// ISO 129 dimensions of the assembly drawing: the front view (wrap angle, pin and pivot
// coordinates, handle arm, perpendicular arms), the side view (drum Ø and widths) and the
// band-section detail (band and lining thickness). Values come from the design and the solved
// layout that the solids were built from.
#include <algorithm>
#include <cmath>
#include <cstdio>
#include <map>

#include "drawing/format.hpp"
#include "drawing/page1.hpp"
#include "drawing/vec2.hpp"

namespace bandforge::drawing {
namespace {

std::vector<double> levels_from(double first, double step, int n) {
  std::vector<double> v;
  for (int i = 0; i < n; ++i) v.push_back(first + step * i);
  return v;
}

void wrap_angle(Page1& p) {
  // An arc about the drum centre between the tangent points (ISO 129 angular dimension).
  const Layout& L = p.s.layout;
  double a0 = L.a.tangent_angle, a1 = L.b.tangent_angle;
  if (L.sense < 0) std::swap(a0, a1);
  std::vector<double> radii;
  for (int i = 0; i < 6; ++i) radii.push_back(p.band_outer * p.k + 7 + 5 * i);
  if (!place_angular(p.c, p.occ, p.centre, a0, a1, p.band_outer * p.k, radii, degrees(L.wrap))) {
    p.notes.push_back("wrap angle " + degrees(L.wrap) + ": no free place for its dimension");
  }
}

// Pin and pivot coordinates from the drum centre: x below (or above) the view, y beside it.
void coordinates(Page1& p) {
  const Features& f = p.f;
  const bool below = dims_below(f), left = dims_left(f);
  std::map<long, Pt> by_x, by_y;  // one dimension per distinct coordinate, nearest feature
  for (Pt q : {f.pivot, f.a, f.b}) {
    const long kx = std::lround(q.x * 1000), ky = std::lround(q.y * 1000);
    if (kx != 0 && (!by_x.count(kx) || (below ? q.y < by_x[kx].y : q.y > by_x[kx].y))) by_x[kx] = q;
    if (ky != 0 && (!by_y.count(ky) || (left ? q.x < by_y[ky].x : q.x > by_y[ky].x))) by_y[ky] = q;
  }
  std::vector<Pt> xs, ys;
  for (auto& [key, q] : by_x) xs.push_back(q);
  for (auto& [key, q] : by_y) ys.push_back(q);
  // The shorter dimensions nearer the view.
  std::sort(xs.begin(), xs.end(), [](Pt a, Pt b) { return std::abs(a.x) < std::abs(b.x); });
  std::sort(ys.begin(), ys.end(), [](Pt a, Pt b) { return std::abs(a.y) < std::abs(b.y); });

  // Extension lines start where the centre lines end (the centre line continues as extension).
  std::vector<LinearDim> dims;
  int level = 0;
  for (Pt q : xs) {
    const Pt fp = p.front(q);
    LinearDim dd;
    dd.p1 = {p.centre.x, below ? p.centre.y - p.drum_cl : p.centre.y + p.drum_cl};
    dd.p2 = {fp.x, below ? fp.y - p.pin_cl : fp.y + p.pin_cl};
    dd.along = {1, 0};
    dd.text = dim_length(q.x / kMmPerM, p.u);
    const double base = below ? p.fv.y0 - 8 : p.fv.y1 + 8;
    dd.levels = levels_from(below ? base - kLevel * level : base + kLevel * level, below ? -kLevel : kLevel, 6);
    dims.push_back(dd);
    ++level;
  }
  level = 0;
  for (Pt q : ys) {
    const Pt fp = p.front(q);
    LinearDim dd;
    dd.p1 = {left ? p.centre.x - p.drum_cl : p.centre.x + p.drum_cl, p.centre.y};
    dd.p2 = {left ? fp.x - p.pin_cl : fp.x + p.pin_cl, fp.y};
    dd.along = {0, 1};
    dd.text = dim_length(q.y / kMmPerM, p.u);
    // along = (0, 1) → n = (−1, 0): the level is −x of the dimension line.
    const double base = left ? p.fv.x0 - 8 : p.fv.x1 + 8;
    for (int i = 0; i < 6; ++i) dd.levels.push_back(-(left ? base - kLevel * (level + i) : base + kLevel * (level + i)));
    dims.push_back(dd);
    ++level;
  }
  // Keep the values off the extension lines still to come: reserve each feature's corridor
  // out to its first candidate line before any value is placed.
  for (const LinearDim& dd : dims) {
    const Pt n{-dd.along.y, dd.along.x};
    for (Pt q : {dd.p1, dd.p2}) p.occ.add_segment(q, q + n * (dd.levels.front() - dot(q, n)));
  }
  for (const LinearDim& dd : dims) p.dimension(dd, dd.along.x != 0 ? "horizontal position" : "vertical position");
}

void handle_arm(Page1& p) {
  // Pivot to handle, aligned with the lever, on either side of the plate.
  const Pt O = p.front(p.f.pivot), H = p.front(p.f.handle);
  LinearDim dd;
  dd.p1 = O;
  dd.p2 = H;
  dd.along = unit(H - O);
  dd.text = dim_length(p.s.layout.handle_arm, p.u);
  const Pt n{-dd.along.y, dd.along.x};
  const double base = dot(O, n);
  const double half_w = p.d.lever.width * kMmPerM * p.k / 2;
  for (int i = 0; i < 5; ++i) {
    dd.levels.push_back(base + half_w + 6 + kLevel * i);
    dd.levels.push_back(base - half_w - 6 - kLevel * i);
  }
  p.dimension(dd, "handle arm");
}

// The perpendicular arms of the runs on the lever: reference dimensions from the pivot to the
// (extended) run line, which is what the lever statics uses (REFERENCE §1.8).
void perpendicular_arms(Page1& p) {
  const Layout& L = p.s.layout;
  const Pt O = p.f.pivot;
  for (int i = 0; i < 2; ++i) {
    const EndLayout& e = i == 0 ? L.a : L.b;
    if (e.mount != Mount::lever) continue;
    const Pt E = mm(e.pin), T = mm(e.tangent_point);
    const Pt u = unit(T - E);
    const Pt F = E + u * dot(O - E, u);  // foot of the perpendicular from the pivot
    if (norm(F - O) * p.k < 3) continue;
    if (dot(F - E, u) < 0) {
      // The foot lies beyond the pin: extend the run line (thin) to it.
      p.c.pen(Pen::narrow);
      p.c.line(p.front(E), p.front(F + (F - E) * (2 / (norm(F - E) * p.k + 1e-9))));
      p.occ.add_segment(p.front(E), p.front(F));
    }
    LinearDim dd;
    dd.p1 = p.front(O);
    dd.p2 = p.front(F);
    dd.along = unit(dd.p2 - dd.p1);
    const Pt n{-dd.along.y, dd.along.x};
    // On the perpendicular itself first, then slid along the run: a dimension between the run
    // line and its parallel through the pivot, extension lines parallel to the run.
    dd.levels = {dot(dd.p1, n)};
    for (double j = 5; j <= 60; j += 5) {
      dd.levels.push_back(dot(dd.p1, n) + j);
      dd.levels.push_back(dot(dd.p1, n) - j);
    }
    // A reference dimension, in parentheses (formatted, not concatenated: GCC 12 reports a
    // false -Wrestrict on "(" + std::string here).
    char text[48];
    std::snprintf(text, sizeof text, "(%s)", dim_length(std::abs(e.arm), p.u).c_str());
    dd.text = text;
    p.dimension(dd, std::string("perpendicular arm of run ") + (i == 0 ? "A" : "B"));
  }
}

}  // namespace

void dimension_front_view(Page1& p) {
  wrap_angle(p);
  coordinates(p);
  handle_arm(p);
  perpendicular_arms(p);
}

void dimension_side_view(Page1& p) {
  // The view from the left: paper x = model z, paper y = model y.
  const auto& S = p.plan.side;
  const Box sv{p.side(S.min).x, p.side(S.min).y, p.side(S.max).x, p.side(S.max).y};
  LinearDim dia;
  dia.p1 = p.side(Pt{p.w / 2, -p.r});
  dia.p2 = p.side(Pt{p.w / 2, p.r});
  dia.along = {0, 1};
  dia.text = "Ø" + dim_length(p.d.drum.diameter, p.u);
  for (int i = 0; i < 5; ++i) dia.levels.push_back(-(sv.x1 + 8 + kLevel * i));
  p.dimension(dia, "drum diameter");
  const double top = p.side(Pt{0, p.band_outer}).y;
  LinearDim bw{p.side(Pt{-p.b / 2, p.band_outer}), p.side(Pt{p.b / 2, p.band_outer}), {1, 0},
               dim_length(p.d.band.width, p.u), {}};
  for (int i = 0; i < 4; ++i) bw.levels.push_back(top + 8 + kLevel * i);
  p.dimension(bw, "band width");
  LinearDim dw{p.side(Pt{-p.w / 2, p.r}), p.side(Pt{p.w / 2, p.r}), {1, 0}, dim_length(p.d.drum.width, p.u), {}};
  for (int i = 1; i < 5; ++i) dw.levels.push_back(top + 8 + kLevel * i);
  p.dimension(dw, "drum width");
}

void draw_band_detail(Page1& p) {
  // The band's edge over the drum rim, from the side view, at a scale where the band and
  // lining thicknesses can be dimensioned; placed in free space and marked "X" on the view.
  const double zx0 = p.b / 2 - 14, zx1 = std::max(p.w, p.b) / 2 + 10;
  const Box window{zx0, p.r - 9, zx1, p.band_outer + 9};
  // Largest ISO 5455 scale (enlargements allowed for details) giving a detail ≤ 80 × 60 mm,
  // and at least twice the sheet scale (else the detail shows nothing new).
  int kd = 0;
  for (int sc : {10, 5, 2, 1}) {
    if (window.width() * sc <= 80 && window.height() * sc <= 60 && sc >= 2 * p.k) {
      kd = sc;
      break;
    }
  }
  const Zones& z = p.plan.zones;
  if (kd > 0) {
    const double dw = window.width() * kd, dh = window.height() * kd;
    const double label_h = Lettering::heading + 3;
    // Spots right of the side view first, then anywhere in the views area, top down.
    std::vector<Pt> spots;
    const double sx = p.side(geom::Point2{p.plan.side.max.x, 0}).x + 24;
    for (double y = z.views.y1 - 2; y > z.views.y0 + dh; y -= 4) spots.push_back({sx, y});
    for (double y = z.views.y1 - 2; y > z.views.y0 + dh; y -= 6)
      for (double xx = z.views.x1 - dw - 2; xx > z.views.x0; xx -= 6) spots.push_back({xx, y});
    for (Pt top_left : spots) {
      const Box box{top_left.x, top_left.y - dh - label_h, top_left.x + dw, top_left.y};
      if (!p.occ.free(box.grown(10))) continue;
      const Mapper dm{{box.x0 - window.x0 * kd, box.y0 + label_h - window.y0 * kd}, static_cast<double>(kd)};
      draw_clipped(p.c, p.plan.side, window, dm);
      p.c.pen(Pen::narrow);
      const Box frame{box.x0, box.y0 + label_h, box.x1, box.y1};
      p.c.rect(frame);
      p.c.text({box.x0, box.y0 + 0.5}, "DETAIL X (" + std::to_string(kd) + ":1)", Lettering::heading);
      p.occ.add_box(box.grown(1));
      p.drawn.detail_x = true;
      p.drawn.detail_x_box = box;
      // Mark the detailed region on the side view.
      const Pt mc = p.side(Pt{(window.x0 + window.x1) / 2, (window.y0 + window.y1) / 2});
      const double mr = std::max(window.width(), window.height()) * p.k / 2 + 2;
      p.c.circle(mc, mr);
      p.occ.add_arc(mc, mr, 0, 2 * kPi);
      const Pt tag = polar(mc, mr, kPi / 4);
      place_label(p.c, p.occ, tag, around(tag, 3, 10), "X", Lettering::heading, false);
      // Thickness dimensions inside the detail, right of the band's edge.
      Occupancy local;
      local.set_limits(frame);
      const double ex = p.b / 2, lx = dm(Pt{ex, 0}).x;
      LinearDim band_t{dm(Pt{ex, p.r + p.t_l}), dm(Pt{ex, p.band_outer}), {0, 1}, dim_length(p.t / kMmPerM, p.u), {}};
      LinearDim lin_t{dm(Pt{ex, p.r}), dm(Pt{ex, p.r + p.t_l}), {0, 1}, dim_length(p.t_l / kMmPerM, p.u), {}};
      for (double off = 8; off <= 40; off += 4) band_t.levels.push_back(-(lx + off));
      for (double off = 16; off <= 44; off += 4) lin_t.levels.push_back(-(lx + off));
      if (!place_linear(p.c, local, band_t)) p.notes.push_back("band thickness " + band_t.text + ": no room in detail X");
      if (p.t_l > 0 && !place_linear(p.c, local, lin_t)) {
        p.notes.push_back("lining thickness " + lin_t.text + ": no room in detail X");
      }
      // Name the layers at the left of the detail, where the band covers the drum.
      auto layer = [&](const char* name, double y0, double y1) {
        const Pt at = dm(Pt{window.x0, (y0 + y1) / 2});
        if ((y1 - y0) * kd >= Lettering::label + 0.8) {
          p.c.text({at.x + 1.5, at.y - Lettering::label / 2}, name, Lettering::label);
        }
      };
      layer("band", p.r + p.t_l, p.band_outer);
      if (p.t_l > 0) layer("lining", p.r, p.r + p.t_l);
      layer("drum rim", window.y0, p.r);
      return;
    }
  }
  p.notes.push_back("band section detail omitted for lack of space: band " + dim_length(p.d.band.width, p.u) +
                    " × " + dim_length(p.d.band.thickness, p.u) + ", lining " +
                    dim_length(p.d.lining.thickness, p.u) + " thick");
}

}  // namespace bandforge::drawing
