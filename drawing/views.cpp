#include "drawing/views.hpp"

#include <algorithm>
#include <cmath>

namespace bandforge::drawing {

using geom::ViewEdge;

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

namespace {

// True lines and arcs go to the PDF as lines and Bézier arcs, not as sampled points.
void stroke(Canvas& c, const ViewEdge& e, const Mapper& m) {
  if (e.kind == ViewEdge::Kind::line) {
    c.line(m(e.a), m(e.b));
  } else if (e.kind == ViewEdge::Kind::arc) {
    c.arc(m(e.centre), e.radius * m.k, e.start, e.start + e.sweep);
  } else {
    c.polyline(sample(e, m));
  }
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

}  // namespace

// Hidden lines first, then smooth edges thin, then visible edges wide (TOOLCHAIN.md: dashes
// drawn over visible lines would tint them).
void draw_view(Canvas& c, Occupancy& occ, const geom::ProjectedView& v, const Mapper& m, ViewStyle style) {
  if (style == ViewStyle::phantom) {
    c.pen(Pen::phantom);
    for (const auto& e : v.edges) {
      if (e.visible && !e.smooth) stroke(c, e, m);
    }
  } else {
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
  }
  for (const auto& e : v.edges) occ.add_polyline(sample(e, m));
}

void draw_clipped(Canvas& c, const geom::ProjectedView& v, const Box& window, const Mapper& m) {
  const Mapper identity{{0, 0}, 1};
  const Pen pens[3] = {Pen::hidden, Pen::fine, Pen::wide};
  for (int pass = 0; pass < 3; ++pass) {
    c.pen(pens[pass]);
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

}  // namespace bandforge::drawing
