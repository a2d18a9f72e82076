#include "drawing/annotate.hpp"

#include <algorithm>
#include <cmath>

#include "drawing/vec2.hpp"

namespace bandforge::drawing {
namespace {

// Separating-axis test for two convex polygons given as point lists (a segment is a 2-gon).
bool separated(const Pt* a, int na, const Pt* b, int nb) {
  auto test = [](const Pt* p, int np, const Pt* q, int nq) {
    for (int i = 0; i < np; ++i) {
      const Pt e = p[(i + 1) % np] - p[i];
      const Pt n{-e.y, e.x};
      if (n.x == 0 && n.y == 0) continue;
      double amin = 1e300, amax = -1e300, bmin = 1e300, bmax = -1e300;
      for (int k = 0; k < np; ++k) {
        const double v = dot(p[k], n);
        amin = std::min(amin, v);
        amax = std::max(amax, v);
      }
      for (int k = 0; k < nq; ++k) {
        const double v = dot(q[k], n);
        bmin = std::min(bmin, v);
        bmax = std::max(bmax, v);
      }
      if (amax < bmin || bmax < amin) return true;
    }
    return false;
  };
  return test(a, na, b, nb) || test(b, nb, a, na);
}

bool segment_hits_quad(Pt a, Pt b, const Quad& q) {
  const Pt s[2] = {a, b};
  return !separated(s, 2, q.p, 4);
}

// Shrinks a quad toward its centre by d (so that touching edges do not count as overlap).
Quad shrunk(const Quad& q, double d) {
  const Pt c = (q.p[0] + q.p[1] + q.p[2] + q.p[3]) * 0.25;
  Quad r = q;
  for (Pt& p : r.p) {
    const Pt v = p - c;
    const double n = norm(v);
    if (n > d) p = c + v * ((n - d) / n);
  }
  return r;
}

void dot_mark(Canvas& c, Pt p) { c.fill_circle(p, 0.6); }

}  // namespace

void Occupancy::add_polyline(const std::vector<Pt>& pts) {
  for (size_t i = 1; i < pts.size(); ++i) add_segment(pts[i - 1], pts[i]);
}

void Occupancy::add_arc(Pt c, double r, double a0, double a1) {
  const int n = std::max(2, static_cast<int>(std::ceil(std::abs(a1 - a0) * r / 2.0)));  // ~2 mm chords
  Pt prev{c.x + r * std::cos(a0), c.y + r * std::sin(a0)};
  for (int i = 1; i <= n; ++i) {
    const double t = a0 + (a1 - a0) * i / n;
    const Pt p{c.x + r * std::cos(t), c.y + r * std::sin(t)};
    add_segment(prev, p);
    prev = p;
  }
}

bool Occupancy::free(const Quad& q) const {
  for (const Pt& p : q.p) {
    if (p.x < limits_.x0 || p.x > limits_.x1 || p.y < limits_.y0 || p.y > limits_.y1) return false;
  }
  for (const Quad& o : quads_) {
    if (!separated(q.p, 4, o.p, 4)) return false;
  }
  for (const Seg& s : segs_) {
    if (segment_hits_quad(s.a, s.b, q)) return false;
  }
  return true;
}

bool Occupancy::segment_clear(Pt a, Pt b) const {
  for (const Quad& o : quads_) {
    if (segment_hits_quad(a, b, shrunk(o, 0.2))) return false;
  }
  return true;
}

std::vector<unsigned char> Occupancy::coverage(const Box& area, double cell, int& cols, int& rows) const {
  cols = std::max(1, static_cast<int>(std::ceil(area.width() / cell)));
  rows = std::max(1, static_cast<int>(std::ceil(area.height() / cell)));
  std::vector<unsigned char> grid(static_cast<size_t>(cols) * static_cast<size_t>(rows), 0);
  auto index = [&](double v, double lo, int n) { return std::clamp(static_cast<int>(std::floor((v - lo) / cell)), 0, n - 1); };
  auto mark = [&](double x0, double y0, double x1, double y1) {
    if (x1 < area.x0 || y1 < area.y0 || x0 > area.x1 || y0 > area.y1) return;
    const int i0 = index(x0, area.x0, cols), i1 = index(x1, area.x0, cols);
    const int j0 = index(y0, area.y0, rows), j1 = index(y1, area.y0, rows);
    for (int j = j0; j <= j1; ++j)
      for (int i = i0; i <= i1; ++i) grid[static_cast<size_t>(j) * static_cast<size_t>(cols) + static_cast<size_t>(i)] = 1;
  };
  for (const Quad& q : quads_) {
    double x0 = 1e300, y0 = 1e300, x1 = -1e300, y1 = -1e300;
    for (const Pt& p : q.p) {
      x0 = std::min(x0, p.x);
      y0 = std::min(y0, p.y);
      x1 = std::max(x1, p.x);
      y1 = std::max(y1, p.y);
    }
    mark(x0, y0, x1, y1);
  }
  // Samples a quarter cell apart: a segment cannot cross a cell's middle unseen.
  for (const Seg& s : segs_) {
    const int n = std::max(1, static_cast<int>(std::ceil(norm(s.b - s.a) / (cell / 4))));
    for (int k = 0; k <= n; ++k) {
      const Pt p = s.a + (s.b - s.a) * (static_cast<double>(k) / n);
      mark(p.x, p.y, p.x, p.y);
    }
  }
  return grid;
}

Quad text_quad(const Canvas& c, Pt at, const std::string& s, double h, double angle) {
  const double w = c.text_width(s, h);
  const Pt t{std::cos(angle), std::sin(angle)}, up = perp(t);
  const double pad = 0.6;
  return {{at + t * (-pad) + up * (-kDescent * h - pad * 0.5), at + t * (w + pad) + up * (-kDescent * h - pad * 0.5),
           at + t * (w + pad) + up * (h + pad), at + t * (-pad) + up * (h + pad)}};
}

Box text_box(const Canvas& c, Pt at, const std::string& s, double h, double angle) {
  const Quad q = text_quad(c, at, s, h, angle);
  Box b{1e18, 1e18, -1e18, -1e18};
  for (Pt p : q.p) {
    b.x0 = std::min(b.x0, p.x);
    b.y0 = std::min(b.y0, p.y);
    b.x1 = std::max(b.x1, p.x);
    b.y1 = std::max(b.y1, p.y);
  }
  return b;
}

void arrowhead(Canvas& c, Pt tip, Pt dir, double length) {
  // 30° included angle (ISO 129-1 filled closed arrowhead).
  const Pt d = unit(dir), n = perp(d);
  const double half = length * std::tan(15.0 * kPi / 180.0);
  const Pt base = tip - d * length;
  c.fill_polygon({tip, base + n * half, base - n * half});
}

bool place_linear(Canvas& c, Occupancy& occ, const LinearDim& d, const DimStyle& st) {
  const Pt u = unit(d.along), n = perp(u);
  // Text reads from the bottom or from the right (ISO 129-1): baseline angle in (−90°, 90°].
  double ang = std::atan2(u.y, u.x);
  if (ang > kPi / 2 + 1e-9) ang -= kPi;
  if (ang <= -kPi / 2 + 1e-9) ang += kPi;
  const Pt t{std::cos(ang), std::sin(ang)}, up = perp(t);
  const double tw = c.text_width(d.text, st.h);

  for (double level : d.levels) {
    Pt d1 = d.p1 + n * (level - dot(d.p1, n));
    Pt d2 = d.p2 + n * (level - dot(d.p2, n));
    Pt f1 = d.p1, f2 = d.p2;
    if (dot(d2 - d1, t) < 0) {
      std::swap(d1, d2);
      std::swap(f1, f2);
    }
    const double len = norm(d2 - d1);
    if (len < 1e-6) return false;
    const bool arrows_inside = len >= 2 * st.arrow + 1.0;
    const bool text_inside = len >= tw + 2 * st.arrow + 2.0;
    std::vector<Pt> starts;
    if (text_inside) {
      // Middle first, then off-centre along the line when something sits over the middle.
      for (int i = 0; i < 40; ++i) {
        const double shift = (i % 2 ? 1 : -1) * 1.5 * ((i + 1) / 2);  // 0, +1.5, −1.5, +3, ...
        const double a = len / 2 - tw / 2 + shift;
        if (a < st.arrow + 0.5 || a + tw > len - st.arrow - 0.5) continue;
        starts.push_back(d1 + t * a + up * st.gap);
      }
    } else {
      // Beside an outer arrowhead, further out, or centred above a short line (ISO 129-1 lets
      // the value sit outside when the space between the extension lines is too small).
      for (double more : {0.0, 6.0, 12.0}) {
        starts.push_back(d2 + t * (st.arrow + 1.5 + more) + up * st.gap);
        starts.push_back(d1 - t * (st.arrow + 1.5 + tw + more) + up * st.gap);
      }
      starts.push_back((d1 + d2) * 0.5 - t * (tw / 2) + up * st.gap);
    }
    for (Pt s : starts) {
      const Quad tb = text_quad(c, s, d.text, st.h, ang);
      if (!occ.free(tb)) continue;
      // Dimension line from end to end, extended to the text when the text sits outside.
      Pt l1 = d1, l2 = d2;
      if (!arrows_inside) {
        l1 = d1 - t * (st.arrow + 1.5);
        l2 = d2 + t * (st.arrow + 1.5);
      }
      if (!text_inside) {
        const double s0 = dot(s - d1, t), s1 = s0 + tw;
        if (s1 > dot(l2 - d1, t)) l2 = d1 + t * s1;
        if (s0 < dot(l1 - d1, t)) l1 = d1 + t * s0;
      }
      if (!occ.segment_clear(l1, l2)) continue;
      // Extension lines: from 1 mm off the feature to 2 mm past the dimension line.
      Pt e1a, e1b, e2a, e2b;
      const bool has1 = d.ext1 && norm(d1 - f1) > st.gap + 0.2;
      const bool has2 = d.ext2 && norm(d2 - f2) > st.gap + 0.2;
      if (has1) {
        const Pt v = unit(d1 - f1);
        e1a = f1 + v * st.gap;
        e1b = d1 + v * st.overshoot;
        if (!occ.segment_clear(e1a, e1b)) continue;
      }
      if (has2) {
        const Pt v = unit(d2 - f2);
        e2a = f2 + v * st.gap;
        e2b = d2 + v * st.overshoot;
        if (!occ.segment_clear(e2a, e2b)) continue;
      }
      c.pen(Pen::narrow);
      if (has1) c.line(e1a, e1b);
      if (has2) c.line(e2a, e2b);
      c.line(l1, l2);
      if (arrows_inside) {
        arrowhead(c, d1, d1 - d2, st.arrow);
        arrowhead(c, d2, d2 - d1, st.arrow);
      } else {
        arrowhead(c, d1, d2 - d1, st.arrow);
        arrowhead(c, d2, d1 - d2, st.arrow);
      }
      c.text(s, d.text, st.h, Align::left, ang);
      occ.add_quad(tb);
      occ.add_segment(l1, l2);
      if (has1) occ.add_segment(e1a, e1b);
      if (has2) occ.add_segment(e2a, e2b);
      return true;
    }
  }
  return false;
}

bool place_angular(Canvas& c, Occupancy& occ, Pt centre, double a0, double a1, double from_r,
                   const std::vector<double>& radii, const std::string& text, const DimStyle& st) {
  while (a1 <= a0) a1 += 2 * kPi;
  const double mid = (a0 + a1) / 2;
  const Pt dm{std::cos(mid), std::sin(mid)};
  const double tw = c.text_width(text, st.h);
  for (double R : radii) {
    // Horizontal text just outside the arc at the middle of the angle.
    const double reach = std::abs(dm.x) * (tw / 2 + 0.6) + std::abs(dm.y) * (st.h / 2 + 0.8);
    const Pt centre_t = centre + dm * (R + 1.2 + reach);
    const Pt start{centre_t.x - tw / 2, centre_t.y - st.h / 2};
    const Box tb = text_box(c, start, text, st.h, 0);
    if (!occ.free(tb)) continue;
    bool clear = true;
    const int n = std::max(8, static_cast<int>((a1 - a0) * R / 2.0));
    std::vector<Pt> arc;
    for (int i = 0; i <= n; ++i) {
      const double a = a0 + (a1 - a0) * i / n;
      arc.push_back({centre.x + R * std::cos(a), centre.y + R * std::sin(a)});
      if (i > 0) clear = clear && occ.segment_clear(arc[i - 1], arc[i]);
    }
    if (!clear) continue;
    c.pen(Pen::narrow);
    c.arc(centre, R, a0, a1);
    for (double a : {a0, a1}) {
      const Pt r{std::cos(a), std::sin(a)};
      c.line(centre + r * (from_r + st.gap), centre + r * (R + st.overshoot));
      occ.add_segment(centre + r * (from_r + st.gap), centre + r * (R + st.overshoot));
    }
    arrowhead(c, {centre.x + R * std::cos(a0), centre.y + R * std::sin(a0)},
              {std::sin(a0), -std::cos(a0)}, st.arrow);
    arrowhead(c, {centre.x + R * std::cos(a1), centre.y + R * std::sin(a1)},
              {-std::sin(a1), std::cos(a1)}, st.arrow);
    c.text(start, text, st.h);
    occ.add_box(tb);
    occ.add_polyline(arc);
    return true;
  }
  return false;
}

namespace {

// The point where a leader from `from` toward `to` leaves the box around `from`.
Pt leave_box(const Box& b, Pt to) {
  const Pt c{(b.x0 + b.x1) / 2, (b.y0 + b.y1) / 2};
  const Pt d = to - c;
  const double sx = d.x != 0 ? (b.width() / 2) / std::abs(d.x) : 1e18;
  const double sy = d.y != 0 ? (b.height() / 2) / std::abs(d.y) : 1e18;
  const double s = std::min({sx, sy, 1.0});
  return c + d * s;
}

}  // namespace

bool place_label(Canvas& c, Occupancy& occ, Pt target, const std::vector<Pt>& candidates,
                 const std::string& text, double h, bool leader, Ink ink) {
  const double tw = c.text_width(text, h);
  for (Pt centre : candidates) {
    const Pt start{centre.x - tw / 2, centre.y - h / 2};
    const Box tb = text_box(c, start, text, h, 0);
    if (!occ.free(tb)) continue;
    Pt from = leave_box(tb, target);
    if (leader && !occ.segment_clear(from, target)) continue;
    c.text(start, text, h, Align::left, 0, ink);
    occ.add_box(tb);
    if (leader && norm(target - from) > 1.0) {
      c.pen(Pen::narrow, ink);
      c.line(from, target);
      dot_mark(c, target);
      occ.add_segment(from, target);
    }
    return true;
  }
  return false;
}

bool place_balloon(Canvas& c, Occupancy& occ, Pt target, const std::vector<Pt>& candidates,
                   const std::string& item) {
  const double r = 4.0, h = 3.5;
  for (Pt centre : candidates) {
    const Box b{centre.x - r - 0.5, centre.y - r - 0.5, centre.x + r + 0.5, centre.y + r + 0.5};
    if (!occ.free(b)) continue;
    const Pt from = centre + unit(target - centre) * r;
    if (!occ.segment_clear(from, target)) continue;
    c.pen(Pen::narrow);
    c.circle(centre, r);
    c.line(from, target);
    dot_mark(c, target);
    c.text({centre.x, centre.y - h / 2}, item, h, Align::centre);
    occ.add_box(b);
    occ.add_segment(from, target);
    return true;
  }
  return false;
}

}  // namespace bandforge::drawing
