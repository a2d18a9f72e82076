#include "drawing/detail_marks.hpp"

#include <algorithm>
#include <cmath>

#include "drawing/annotate.hpp"
#include "drawing/vec2.hpp"

namespace bandforge::drawing {
namespace {

constexpr double kH = 2.5;                   // lettering height of the symbols [mm]
constexpr double kH1 = 3.5, kH2 = 7.5;       // ISO 1302 symbol legs for h = 2.5 (from memory)
const double kCot60 = 1 / std::tan(kPi / 3);  // the legs are at 60° to the surface

}  // namespace

std::vector<std::pair<Pt, Pt>> hatch(Canvas& c, const std::vector<std::vector<Pt>>& loops, double angle,
                                     double spacing) {
  std::vector<std::pair<Pt, Pt>> drawn;
  // In a frame turned by −angle the hatch lines are horizontal: scan them, pair the crossings.
  const double ca = std::cos(angle), sa = std::sin(angle);
  auto to = [&](Pt p) { return Pt{p.x * ca + p.y * sa, -p.x * sa + p.y * ca}; };
  auto back = [&](Pt p) { return Pt{p.x * ca - p.y * sa, p.x * sa + p.y * ca}; };
  double lo = 1e300, hi = -1e300;
  std::vector<std::vector<Pt>> turned;
  for (const auto& loop : loops) {
    turned.emplace_back();
    for (Pt p : loop) {
      const Pt q = to(p);
      lo = std::min(lo, q.y);
      hi = std::max(hi, q.y);
      turned.back().push_back(q);
    }
  }
  if (!(hi > lo)) return drawn;
  c.pen(Pen::narrow);
  // Lines on a grid fixed to the sheet (multiples of the spacing), so neighbouring faces of one
  // part continue each other's lines.
  for (double y = std::ceil(lo / spacing) * spacing; y < hi; y += spacing) {
    std::vector<double> xs;
    for (const auto& loop : turned) {
      for (std::size_t i = 0; i < loop.size(); ++i) {
        const Pt a = loop[i], b = loop[(i + 1) % loop.size()];
        if ((a.y <= y) == (b.y <= y)) continue;  // half-open: a vertex counts once
        xs.push_back(a.x + (y - a.y) * (b.x - a.x) / (b.y - a.y));
      }
    }
    std::sort(xs.begin(), xs.end());
    for (std::size_t i = 0; i + 1 < xs.size(); i += 2) {
      if (xs[i + 1] - xs[i] <= 0.05) continue;
      drawn.push_back({back({xs[i], y}), back({xs[i + 1], y})});
      c.line(drawn.back().first, drawn.back().second);
    }
  }
  return drawn;
}

Box cutting_plane_end(Canvas& c, Pt end, Pt along, Pt look, const std::string& letter) {
  const Pt a = unit(along), v = unit(look);
  // ISO 128-40 type 04.2 at the ends: a wide stroke 6 mm long ending at the plane's end.
  c.pen(Pen::wide);
  const Pt inner = end - a * 6;
  c.line(inner, end);
  // The arrow from the middle of the wide stroke, 7 mm in the viewing direction.
  const Pt from = end - a * 3, tip = from + v * 7;
  c.pen(Pen::narrow);
  c.line(from, tip);
  arrowhead(c, tip, v, 3.0);
  const double tw = c.text_width(letter, 3.5);
  const Pt centre = tip + v * 3.5;
  c.text({centre.x - tw / 2, centre.y - 3.5 / 2}, letter, 3.5);
  Box b{std::min({inner.x, end.x, tip.x}), std::min({inner.y, end.y, tip.y}), std::max({inner.x, end.x, tip.x}),
        std::max({inner.y, end.y, tip.y})};
  b.x0 = std::min(b.x0, centre.x - tw / 2 - 0.5);
  b.x1 = std::max(b.x1, centre.x + tw / 2 + 0.5);
  b.y0 = std::min(b.y0, centre.y - 2.5);
  b.y1 = std::max(b.y1, centre.y + 2.5);
  return b;
}

Box surface_texture_box(const Canvas& c, Pt tip, const std::string& text) {
  const double x_long = tip.x + kH2 * kCot60;
  return {tip.x - kH1 * kCot60 - 0.3, tip.y, x_long + 0.6 + c.text_width(text, kH) + 0.6, tip.y + kH2 + 0.3};
}

Box surface_texture_symbol(Canvas& c, Pt tip, const std::string& text) {
  const Pt short_top = tip + Pt{-kH1 * kCot60, kH1};
  const Pt long_top = tip + Pt{kH2 * kCot60, kH2};
  const Pt bar_end = tip + Pt{kH1 * kCot60, kH1};
  const double tw = c.text_width(text, kH);
  c.pen(Pen::narrow);
  c.polyline({short_top, tip, long_top});
  c.line(short_top, bar_end);  // the bar: material removal required
  // The requirement under the long leg's extension (ISO 1302 position a).
  c.line(long_top, long_top + Pt{0.6 + tw + 0.6, 0});
  c.text({long_top.x + 0.6, tip.y + kH1 + 0.5}, text, kH);
  return surface_texture_box(c, tip, text);
}

double runout_frame_width(const Canvas& c, const std::string& tolerance, const std::string& datum) {
  return kFrameHeight + (c.text_width(tolerance, kH) + 2) + std::max(kFrameHeight, c.text_width(datum, kH) + 2);
}

Box runout_frame(Canvas& c, Pt left_mid, const std::string& tolerance, const std::string& datum) {
  const double h = kFrameHeight, y0 = left_mid.y - h / 2, y1 = left_mid.y + h / 2;
  const double x0 = left_mid.x, x1 = x0 + h, x2 = x1 + c.text_width(tolerance, kH) + 2,
               x3 = x2 + std::max(h, c.text_width(datum, kH) + 2);
  c.pen(Pen::narrow);
  c.rect({x0, y0, x3, y1});
  c.line({x1, y0}, {x1, y1});
  c.line({x2, y0}, {x2, y1});
  // Total runout (ISO 1101): two parallel arrows at 45° whose tails a base line joins.
  const Pt d = unit({1, 1});
  for (double bx : {x0 + 1.0, x0 + 2.4}) {
    const Pt tail{bx, y0 + 1.0}, tip = tail + d * 2.9;
    c.line(tail, tip - d * 0.8);
    arrowhead(c, tip, d, 1.1);
  }
  c.line({x0 + 1.0, y0 + 1.0}, {x0 + 2.4, y0 + 1.0});
  const double base = left_mid.y - kH / 2;
  c.text({x1 + 1, base}, tolerance, kH);
  c.text({(x2 + x3) / 2, base}, datum, kH, Align::centre);
  return {x0, y0, x3, y1};
}

Box datum_indicator(Canvas& c, Pt base, Pt out, double leader, const std::string& letter) {
  const Pt v = unit(out), n = perp(v);
  const double side = 3.0, height = side * std::sqrt(3.0) / 2;
  const Pt apex = base + v * height;
  c.fill_polygon({base + n * (side / 2), base - n * (side / 2), apex});
  const Pt end = apex + v * leader;
  c.pen(Pen::narrow);
  c.line(apex, end);
  // The square frame 2h on its side, centred on the leader's end and beyond it.
  const double s = kFrameHeight;
  const Pt centre = end + v * (s / 2);
  const Box frame{centre.x - s / 2, centre.y - s / 2, centre.x + s / 2, centre.y + s / 2};
  c.rect(frame);
  c.text({centre.x, centre.y - kH / 2}, letter, kH, Align::centre);
  return frame;
}

Box fillet_weld_box(const Canvas& c, Pt knee, int side, const std::string& leg) {
  const double len = c.text_width(leg, kH) + 1 + 3.0 + 3;
  const double x_end = knee.x + side * len;
  return {std::min(knee.x, x_end), knee.y - 3.4, std::max(knee.x, x_end), knee.y + 3.4};
}

Box fillet_weld_both_sides(Canvas& c, Pt joint, Pt knee, int side, const std::string& leg) {
  c.pen(Pen::narrow);
  c.line(knee, joint);
  arrowhead(c, joint, joint - knee, 2.5);
  const double tw = c.text_width(leg, kH), leg_size = 3.0;
  const double len = tw + 1 + leg_size + 3;
  c.line(knee, knee + Pt{side * len, 0});
  // The symbol's middle on the reference line, the leg size to its left (ISO 2553: the fillet
  // triangle with its vertical side on the left, drawn on both sides for a symmetric weld).
  const double x_sym = side > 0 ? knee.x + tw + 1.5 : knee.x - len + tw + 1.5;
  for (int s : {1, -1}) {
    c.polyline({{x_sym, knee.y}, {x_sym, knee.y + s * leg_size}, {x_sym + leg_size, knee.y}});
    c.text({x_sym - 0.8 - tw, s > 0 ? knee.y + 0.6 : knee.y - 0.6 - kH}, leg, kH);
  }
  return fillet_weld_box(c, knee, side, leg);
}

}  // namespace bandforge::drawing
