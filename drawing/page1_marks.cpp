// Marks on the assembly drawing other than dimensions: centre lines, the drum rotation arrow,
// tight/slack labels and the balloons of the parts list; and the helpers page 1 shares.
#include <algorithm>
#include <cmath>

#include "drawing/page1.hpp"
#include "drawing/page1_tables.hpp"
#include "drawing/vec2.hpp"
#include "src/proportions.hpp"

namespace bandforge::drawing {
namespace {

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

// The middle of the wrap (polar angle), where the band and lining are surely in view.
double mid_wrap(const Layout& L) {
  double a0 = L.a.tangent_angle, a1 = L.b.tangent_angle;
  if (L.sense < 0) std::swap(a0, a1);
  while (a1 <= a0) a1 += 2 * kPi;
  return (a0 + a1) / 2;
}

}  // namespace

Features features(const Design& d) {
  return {mm(d.lever.pivot), mm(d.lever.handle), mm(d.band.end_a.at), mm(d.band.end_b.at)};
}

bool dims_below(const Features& f) { return f.a.y + f.b.y + f.pivot.y <= 0; }
bool dims_left(const Features& f) { return f.handle.x >= f.pivot.x; }

std::vector<double> distinct(std::vector<double> v) {
  std::vector<double> out;
  std::sort(v.begin(), v.end());
  for (double x : v) {
    if (std::abs(x) < 1e-6) continue;  // on the drum's centre line: nothing to dimension
    if (out.empty() || std::abs(x - out.back()) > 1e-6) out.push_back(x);
  }
  return out;
}

Pt polar(Pt c, double r, double a) { return {c.x + r * std::cos(a), c.y + r * std::sin(a)}; }

std::vector<Pt> around(Pt p, double r0, double r1) {
  std::vector<Pt> pts;
  for (double r = r0; r <= r1; r += 2.5) {
    for (int i = 0; i < 16; ++i) pts.push_back(polar(p, r, i * kPi / 8 + kPi / 16));
  }
  return pts;
}

void Page1::dimension(const LinearDim& dim, const std::string& what) {
  if (!place_linear(c, occ, dim)) {
    notes.push_back(what + " " + dim.text + ": no free place on the sheet, see the calculation sheet");
  }
}

void draw_centre_lines(Page1& p) {
  // ISO 128 type 04.1 through the drum axis and every pin and the handle, a little past the
  // outline; in the side view the axes run across the view.
  p.c.pen(Pen::centre);
  auto segment = [&](Pt a, Pt b) {
    p.c.line(a, b);
    p.occ.add_segment(a, b);
  };
  auto cross = [&](Pt q, double half) {
    segment({q.x - half, q.y}, {q.x + half, q.y});
    segment({q.x, q.y - half}, {q.x, q.y + half});
  };
  cross(p.centre, p.drum_cl);
  for (Pt q : {p.f.pivot, p.f.a, p.f.b, p.f.handle}) cross(p.front(q), p.pin_cl);
  const double x0 = p.side(geom::Point2{p.plan.side.min.x, 0}).x - 4;
  const double x1 = p.side(geom::Point2{p.plan.side.max.x, 0}).x + 4;
  segment({x0, p.plan.side_origin.y}, {x1, p.plan.side_origin.y});
  for (double y : distinct({p.f.pivot.y, p.f.a.y, p.f.b.y})) {
    const double yy = p.side(Pt{0, y}).y;
    segment({x0, yy}, {x1, yy});
  }
}

void draw_spring_coils(Page1& p) {
  const ApplyResult& a = p.s.apply;
  if (a.by != ApplyBy::spring || !a.mount.present || !a.mount.refusal.empty() || !a.spring.found) return;
  const SpringResult& sp = a.spring;
  const Pt from = p.front(Pt{a.mount.lever_seat.face.x * kMmPerM, a.mount.lever_seat.face.y * kMmPerM});
  const Pt to = p.front(Pt{a.mount.frame_seat.face.x * kMmPerM, a.mount.frame_seat.face.y * kMmPerM});
  const double len = std::hypot(to.x - from.x, to.y - from.y);
  if (!(len > 0)) return;
  const Pt u{(to.x - from.x) / len, (to.y - from.y) / len}, n{-u.y, u.x};
  const double ro = sp.outer_diameter * kMmPerM / 2 * p.k, ri = ro - sp.wire_diameter * kMmPerM * p.k;
  auto at = [&](double along, double across) {
    return Pt{from.x + along * u.x + across * n.x, from.y + along * u.y + across * n.y};
  };
  // The axis, a little past both ends (ISO 128 type 04.1).
  p.c.pen(Pen::centre);
  p.c.line(at(-3, 0), at(len + 3, 0));
  p.occ.add_segment(at(-3, 0), at(len + 3, 0));
  // One line per coil on the near side, from one flank to the other over half a pitch; the
  // inner flank lines of the wire's section where the coils would show it.
  p.c.pen(Pen::narrow);
  const int coils = static_cast<int>(std::ceil(sp.total_coils));
  const double pitch = len / sp.total_coils;
  for (int i = 0; i < coils; ++i) {
    const double s0 = std::min(len, i * pitch), s1 = std::min(len, (i + 0.5) * pitch);
    p.c.line(at(s0, -ri), at(s1, ri));
    p.occ.add_segment(at(s0, -ri), at(s1, ri));
  }
}

void draw_rotation_and_ends(Page1& p) {
  // The rotation the brake is designed for: an arrow on the drum face between hub and rim.
  const DrumProportions dp = drum_proportions(p.d.drum);
  const double rho = ((p.r - dp.rim_thickness * kMmPerM) + dp.hub_diameter * kMmPerM / 2) / 2 * p.k;
  const double mid = 3 * kPi / 4, half = kPi / 7;
  p.c.pen(Pen::narrow);
  p.c.arc(p.centre, rho, mid - half, mid + half);
  p.occ.add_arc(p.centre, rho, mid - half, mid + half);
  const Turn turn = p.d.drum.rotation;
  const bool cw = turn == Turn::cw;
  const double tip = cw ? mid - half : mid + half;
  arrowhead(p.c, polar(p.centre, rho, tip),
            cw ? Pt{std::sin(tip), -std::cos(tip)} : Pt{-std::sin(tip), std::cos(tip)}, 3.5);
  const std::string text = std::string("drum rotation ") + turn_word(turn);
  const Pt am = polar(p.centre, rho, mid);
  // Beside the arrow if there is room (shortened if need be), else with a leader.
  if (!place_label(p.c, p.occ, am, around(am, 4, 14), text, Lettering::body, false) &&
      !place_label(p.c, p.occ, am, around(am, 4, 14), std::string("rotation ") + turn_word(turn),
                   Lettering::body, false) &&
      !place_label(p.c, p.occ, am, around(am, 4, 10), turn_word(turn), Lettering::heading, false) &&
      !place_label(p.c, p.occ, am, around(am, 18, 70), text, Lettering::body, true)) {
    p.notes.push_back("the drum rotation the brake is designed for is " + std::string(turn_word(turn)));
  }
  // Which band end is tight in that rotation, on the free runs.
  const Layout& L = p.s.layout;
  for (int i = 0; i < 2; ++i) {
    const EndLayout& e = i == 0 ? L.a : L.b;
    const bool tight = (i == 0) == p.s.primary_a_tight;
    const Pt q = p.front((mm(e.pin) + mm(e.tangent_point)) * 0.5);
    const std::string label = std::string(tight ? "TIGHT END " : "SLACK END ") + (i == 0 ? "A" : "B");
    if (!place_label(p.c, p.occ, q, around(q, 8, 30), label, Lettering::body, true)) {
      p.notes.push_back(std::string("end ") + (i == 0 ? "A" : "B") + " is the " + (tight ? "tight" : "slack") +
                        " end in the design rotation");
    }
  }
}

void draw_balloons(Page1& p, const geom::BrakeModel& model) {
  // One balloon per parts-list item, on the front view, its leader ending on the part.
  const auto kinds = geom::part_kinds(model);
  const auto& parts = model.parts();
  const double wrap_mid = mid_wrap(p.s.layout);
  const double rim = drum_proportions(p.d.drum).rim_thickness * kMmPerM;
  const Features& f = p.f;
  std::string omitted;
  int n_omitted = 0;
  for (size_t i = 0; i < parts.size(); ++i) {
    Pt target;
    const std::string& kind = kinds[i];
    if (kind == "drum") target = polar({0, 0}, p.r - rim / 2, wrap_mid - kPi / 2);
    else if (kind == "lining") target = polar({0, 0}, p.r + p.t_l / 2, wrap_mid + 0.35);
    else if (kind == "band") target = polar({0, 0}, p.r + p.t_l + p.t / 2, wrap_mid - 0.35);
    else if (kind == "lever") target = f.pivot + (f.handle - f.pivot) * 0.6;
    else if (kind == "grip") target = f.handle;
    else if ((kind == "pin" || kind == "anchor") && !parts[i].instance_origins.empty()) {
      // Each pin length and each plate at its own first instance, not all at one point.
      target = {parts[i].instance_origins[0].x, parts[i].instance_origins[0].y};
    } else target = {parts[i].centroid.x, parts[i].centroid.y};
    const Pt tp = p.front(target);
    if (!place_balloon(p.c, p.occ, tp, ring_candidates(p.fv, tp, {10, 18, 26}), std::to_string(i + 1))) {
      omitted += (omitted.empty() ? "" : ", ") + std::to_string(i + 1) + " (" + parts[i].name + ")";
      ++n_omitted;
    }
  }
  // One note for every balloon that found no room, so the notes stay short on a small sheet.
  if (n_omitted > 0) {
    p.notes.push_back(std::string(n_omitted == 1 ? "balloon for item " : "balloons for items ") +
                      omitted + " omitted: no free place");
  }
}

}  // namespace bandforge::drawing
