#include "drawing/plot.hpp"

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <cstdio>
#include <numbers>

#include "drawing/format.hpp"

namespace bandforge::drawing {

double nice_step(double span, int n) {
  if (!(span > 0)) return 1;
  const double raw = span / n;
  const double mag = std::pow(10.0, std::floor(std::log10(raw)));
  for (double m : {1.0, 2.0, 5.0, 10.0}) {
    if (m * mag >= raw) return m * mag;
  }
  return 10 * mag;
}

namespace {

std::string tick_text(double v, double step) {
  const int decimals = std::max(0, -static_cast<int>(std::floor(std::log10(step) + 1e-9)));
  char buf[32];
  std::snprintf(buf, sizeof buf, "%.*f", decimals, std::abs(v) < step * 1e-6 ? 0.0 : v);
  return buf;
}

}  // namespace

void draw_plot(Canvas& c, const Plot& p, Box frame) {
  const double h = 2.5, hs = 1.8;
  // Axis box inside the frame, leaving room for tick labels and axis titles.
  const Box ax{frame.x0 + 16, frame.y0 + 12, frame.x1 - (p.y2_factor ? 16 : 4), frame.y1 - 7};
  const double xs = nice_step(p.x_max - p.x_min, 5);
  const double ys = nice_step(p.y_max - p.y_min, 5);
  const double x0 = std::floor(p.x_min / xs + 1e-9) * xs, x1 = std::ceil(p.x_max / xs - 1e-9) * xs;
  const double y0 = std::floor(p.y_min / ys + 1e-9) * ys, y1 = std::ceil(p.y_max / ys - 1e-9) * ys;
  auto map = [&](Pt d) {
    return Pt{ax.x0 + (d.x - x0) / (x1 - x0) * ax.width(), ax.y0 + (d.y - y0) / (y1 - y0) * ax.height()};
  };
  auto clip_y = [&](double y) { return std::clamp(y, y0, y1); };

  c.text({frame.x0, frame.y1 - h}, p.title, h, Align::left);

  if (p.shade) {
    const double a = std::clamp(p.shade->first, x0, x1), b = std::clamp(p.shade->second, x0, x1);
    if (b > a) {
      const Pt pa = map({a, y0}), pb = map({b, y1});
      c.fill_rect({pa.x, pa.y, pb.x, pb.y}, {0.88, 0.88, 0.88});
      c.text({(pa.x + pb.x) / 2, pb.y - hs - 1.5}, p.shade_label, hs, Align::centre);
    }
  }
  // Grid and ticks.
  c.pen(Pen::fine, {0.75, 0.75, 0.75});
  for (double x = x0 + xs; x < x1 - xs * 1e-6; x += xs) c.line(map({x, y0}), map({x, y1}));
  for (double y = y0 + ys; y < y1 - ys * 1e-6; y += ys) c.line(map({x0, y}), map({x1, y}));
  c.pen(Pen::narrow);
  c.rect(ax);
  for (double x = x0; x <= x1 + xs * 1e-6; x += xs) {
    const Pt q = map({x, y0});
    c.line(q, {q.x, q.y - 1});
    c.text({q.x, q.y - 1.8 - hs}, tick_text(x, xs), hs, Align::centre);
  }
  for (double y = y0; y <= y1 + ys * 1e-6; y += ys) {
    const Pt q = map({x0, y});
    c.line(q, {q.x - 1, q.y});
    c.text({q.x - 1.8, q.y - hs / 2}, tick_text(y, ys), hs, Align::right);
  }
  if (p.y2_factor) {
    const double k = *p.y2_factor;
    const double s2 = nice_step((y1 - y0) * k, 5);
    for (double v = std::ceil(y0 * k / s2 - 1e-9) * s2; v <= y1 * k + s2 * 1e-6; v += s2) {
      const Pt q = map({x1, v / k});
      c.line(q, {q.x + 1, q.y});
      c.text({q.x + 1.8, q.y - hs / 2}, tick_text(v, s2), hs, Align::left);
    }
    c.text({frame.x1 - 1, (ax.y0 + ax.y1) / 2}, p.y2_label, hs, Align::centre, -std::numbers::pi / 2);
  }
  c.text({(ax.x0 + ax.x1) / 2, frame.y0 + 1}, p.x_label, hs, Align::centre);
  c.text({frame.x0 + hs + 0.5, (ax.y0 + ax.y1) / 2}, p.y_label, hs, Align::centre, std::numbers::pi / 2);

  for (const RefLine& l : p.lines) {
    c.pen(Pen::narrow, l.ink);
    if (l.horizontal) {
      if (l.value < y0 || l.value > y1) continue;
      const Pt a = map({x0, l.value}), b = map({x1, l.value});
      c.line(a, b);
      c.text({b.x - 1.5, b.y + 0.8}, l.label, hs, Align::right, 0, l.ink);
    } else {
      if (l.value < x0 || l.value > x1) continue;
      const Pt a = map({l.value, y0}), b = map({l.value, y1});
      c.line(a, b);
      c.text({a.x - 1.2, a.y + 1.5}, l.label, hs, Align::left, std::numbers::pi / 2, l.ink);
    }
  }
  std::vector<Pt> drawn;  // every curve point on the sheet, to keep the legend off the curves
  for (const Series& s : p.series) {
    if (s.points.size() < 2) continue;
    std::vector<Pt> q;
    for (Pt d : s.points) q.push_back(map({d.x, clip_y(d.y)}));
    c.pen(s.pen);
    c.polyline(q);
    drawn.insert(drawn.end(), q.begin(), q.end());
  }
  // Legend in the axes corner that the curves leave free.
  double lw = 0;
  int n = 0;
  for (const Series& s : p.series) {
    if (s.label.empty()) continue;
    lw = std::max(lw, c.text_width(s.label, hs));
    ++n;
  }
  if (n > 0) {
    const double row = hs * 1.8, bw = 12 + lw + 2, bh = n * row + 1.5;
    const Box corners[4] = {{ax.x0 + 1.5, ax.y1 - 1.5 - bh, ax.x0 + 1.5 + bw, ax.y1 - 1.5},
                            {ax.x1 - 1.5 - bw, ax.y1 - 1.5 - bh, ax.x1 - 1.5, ax.y1 - 1.5},
                            {ax.x1 - 1.5 - bw, ax.y0 + 1.5, ax.x1 - 1.5, ax.y0 + 1.5 + bh},
                            {ax.x0 + 1.5, ax.y0 + 1.5, ax.x0 + 1.5 + bw, ax.y0 + 1.5 + bh}};
    size_t best = 0, best_hits = SIZE_MAX;
    for (size_t i = 0; i < 4; ++i) {
      size_t hits = 0;
      for (Pt q : drawn) hits += q.x >= corners[i].x0 && q.x <= corners[i].x1 && q.y >= corners[i].y0 && q.y <= corners[i].y1;
      if (hits < best_hits) {
        best = i;
        best_hits = hits;
      }
    }
    const Box lb = corners[best];
    c.fill_rect(lb, {1, 1, 1});
    c.pen(Pen::fine);
    c.rect(lb);
    double y = lb.y1 - row + 0.3;
    for (const Series& s : p.series) {
      if (s.label.empty()) continue;
      c.pen(s.pen);
      c.line({lb.x0 + 1.5, y + hs / 2}, {lb.x0 + 10, y + hs / 2});
      c.text({lb.x0 + 12, y}, s.label, hs);
      y -= row;
    }
  }
  c.pen(Pen::narrow);
}

}  // namespace bandforge::drawing
