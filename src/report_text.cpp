// The readable results table printed by `bandforge solve`.
#include <cmath>
#include <cstdio>
#include <sstream>
#include <string>
#include <vector>

#include "src/report.hpp"

namespace bandforge {
namespace {

constexpr double kPi = 3.14159265358979323846;

class Out {
 public:
  explicit Out(UnitSystem u) : units_(u) {}
  std::string q(double v, Quantity k, int digits = 4) const {
    return format_quantity(v, k, units_, digits);
  }
  std::string point(const Vec2& p) const {
    std::string out = "(";
    out.append(num(to_display(p.x, Quantity::length, units_)))
        .append(", ")
        .append(num(to_display(p.y, Quantity::length, units_)))
        .append(") ")
        .append(display_unit(Quantity::length, units_));
    return out;
  }
  static std::string num(double v, int digits = 4) {
    char buf[64];
    std::snprintf(buf, sizeof buf, "%.*g", digits, v == 0.0 ? 0.0 : v);
    return buf;
  }
  void row(const std::string& label, const std::string& value) {
    s_ << "  " << pad(label, 26) << value << '\n';
  }
  void heading(const std::string& h) { s_ << '\n' << h << '\n'; }
  void line(const std::string& text) { s_ << text << '\n'; }
  static std::string pad(const std::string& text, std::size_t width) {
    // Width counted in code points so that "φ" or "Ø" do not shift the columns.
    std::size_t cps = 0;
    for (unsigned char c : text) cps += (c & 0xC0) != 0x80;
    return cps >= width ? text + " " : text + std::string(width - cps, ' ');
  }
  std::string str() const { return s_.str(); }
  UnitSystem units() const { return units_; }

 private:
  UnitSystem units_;
  std::ostringstream s_;
};

std::string deg(double rad, int digits = 4) { return Out::num(rad * 180.0 / kPi, digits) + "°"; }

void inputs(Out& o, const Design& d, const Solution& s) {
  o.heading("Inputs");
  const auto& dr = d.drum;
  o.row("drum", "Ø" + o.q(dr.diameter, Quantity::length) + " × " + o.q(dr.width, Quantity::length) +
                     " wide, bore Ø" + o.q(dr.bore, Quantity::length) + ", " + dr.material +
                     "; load turns " + to_string(dr.rotation));
  const auto& li = d.lining;
  o.row("lining", (li.material.empty() ? std::string("explicit values") : li.material) + ", " +
                      o.q(li.thickness, Quantity::length) + " thick");
  o.row("friction f", Out::num(li.friction, 3) + " (range " + Out::num(li.friction_min, 3) + " … " +
                          Out::num(li.friction_max, 3) + ")");
  o.row("lining pressure limit", o.q(li.pressure_limit, Quantity::stress));
  const auto& b = d.band;
  o.row("band", o.q(b.width, Quantity::length) + " × " + o.q(b.thickness, Quantity::length) +
                    ", allowable " + o.q(b.allowable_stress, Quantity::stress) + ", runs " +
                    to_string(b.sense) + " from A to B" +
                    (b.model == TensionModel::thick ? ", thick-band model" : ""));
  if (s.layout.from_pins) {
    o.row("end A", std::string(to_string(b.end_a.mount)) + " pin at " + o.point(b.end_a.at));
    o.row("end B", std::string(to_string(b.end_b.mount)) + " pin at " + o.point(b.end_b.at));
    o.row("pins", "Ø" + o.q(b.pin_diameter, Quantity::length) + ", allowable shear " +
                      o.q(b.pin_allowable_shear, Quantity::stress));
    o.row("lever", "pivot " + o.point(d.lever.pivot) + ", handle " + o.point(d.lever.handle));
  } else {
    const auto& c = d.concept_arms;
    o.row("concept", std::string(to_string(c.kind)) + ", wrap " + deg(c.wrap) + ", handle arm " +
                         o.q(c.handle_arm, Quantity::length) + ", arm A " +
                         o.q(c.arm_a, Quantity::length) + ", arm B " +
                         o.q(c.arm_b, Quantity::length));
  }
  if (d.lever.width > 0) {
    o.row("lever section", o.q(d.lever.width, Quantity::length) + " × " +
                               o.q(d.lever.thickness, Quantity::length) + ", allowable " +
                               o.q(d.lever.allowable_stress, Quantity::stress));
  }
  if (d.load.given == Load::Given::torque) {
    o.row("required torque", o.q(d.load.torque, Quantity::torque) + " × service factor " +
                                 Out::num(d.load.service_factor, 3) + " = " +
                                 o.q(s.required_torque, Quantity::torque));
  } else {
    o.row("available lever force", o.q(d.load.lever_force, Quantity::force));
  }
}

void layout(Out& o, const Solution& s) {
  const Layout& L = s.layout;
  o.heading("Layout");
  o.row("kind", to_string(L.kind));
  o.row("wrap angle φ", deg(L.wrap) + " (" + Out::num(L.wrap, 5) + " rad)");
  o.row("friction radius r", o.q(L.r, Quantity::length));
  o.row("band line radius r_b", o.q(L.r_band, Quantity::length));
  if (L.from_pins) {
    o.row("band centreline length", o.q(L.band_length, Quantity::length));
    for (int i = 0; i < 2; ++i) {
      const EndLayout& e = i == 0 ? L.a : L.b;
      const std::string n = i == 0 ? "A" : "B";
      o.row("end " + n + " tangent point", o.point(e.tangent_point) + " at " + deg(e.tangent_angle));
      o.row("end " + n + " free run", o.q(e.free_length, Quantity::length));
      o.row("end " + n + " arm about pivot",
            e.mount == Mount::frame
                ? std::string("— (on the frame)")
                : o.q(std::fabs(e.arm), Quantity::length) +
                      (e.arm_applied > 0 ? " (tension helps apply)" : " (tension resists)"));
    }
    o.row("handle arm L", o.q(L.handle_arm, Quantity::length));
    o.row("applying rotation", L.apply_sense > 0 ? "ccw" : "cw");
    o.row("release", deg(L.release_rotation, 3) + " lever rotation, " +
                         o.q(L.handle_travel, Quantity::length, 3) + " handle travel");
  } else {
    o.row("arm A / arm B", o.q(std::fabs(L.a.arm_applied), Quantity::length) + " / " +
                               o.q(std::fabs(L.b.arm_applied), Quantity::length));
    o.row("handle arm L", o.q(L.handle_arm, Quantity::length));
  }
}

void results(Out& o, const Design& d, const Solution& s) {
  const bool pa = s.primary_a_tight;
  const DirectionResult& p = s.nominal(pa);
  const DirectionResult& r = s.nominal(!pa);
  const char* rot = to_string(d.drum.rotation);
  const char* rev = d.drum.rotation == Turn::cw ? "ccw" : "cw";
  o.heading("Results at nominal f = " + Out::num(d.lining.friction, 3));
  o.line("  " + Out::pad("", 26) + Out::pad(std::string("design rotation (") + rot + ")", 24) +
         "reverse (" + rev + ")");
  o.line("  " + Out::pad("", 26) + Out::pad(pa ? "A tight, B slack" : "B tight, A slack", 24) +
         (pa ? "B tight, A slack" : "A tight, B slack"));
  auto both = [&](const std::string& label, const std::string& a, const std::string& b) {
    o.line("  " + Out::pad(label, 26) + Out::pad(a, 24) + b);
  };
  both("capstan ratio P1/P2", Out::num(p.capstan_ratio), Out::num(r.capstan_ratio));
  both("tight tension P1", o.q(p.tension_tight, Quantity::force), o.q(r.tension_tight, Quantity::force));
  both("slack tension P2", o.q(p.tension_slack, Quantity::force), o.q(r.tension_slack, Quantity::force));
  both("braking torque T", o.q(p.torque, Quantity::torque), o.q(r.torque, Quantity::torque));
  auto force = [&](const DirectionResult& x) {
    return x.self_locking ? std::string("0 (self-locking)") : o.q(x.lever_force, Quantity::force);
  };
  both("lever force F", force(p), force(r));
  both("max lining pressure", o.q(p.pressure_max, Quantity::stress), o.q(r.pressure_max, Quantity::stress));
  both("mean lining pressure", o.q(p.pressure_mean, Quantity::stress), o.q(r.pressure_mean, Quantity::stress));
  both("band stress", o.q(p.band_stress, Quantity::stress), o.q(r.band_stress, Quantity::stress));
  if (p.pin_shear > 0) both("pin shear", o.q(p.pin_shear, Quantity::stress), o.q(r.pin_shear, Quantity::stress));
  if (p.lever_stress > 0)
    both("lever bending stress", o.q(p.lever_stress, Quantity::stress), o.q(r.lever_stress, Quantity::stress));
  if (s.layout.from_pins) {
    auto mag = [&](const Vec2& v) { return o.q(std::hypot(v.x, v.y), Quantity::force); };
    both("drum bearing load", mag(p.drum_load), mag(r.drum_load));
    both("pivot reaction", mag(p.pivot_reaction), mag(r.pivot_reaction));
  }

  o.heading("Friction range, design rotation");
  o.line("  " + Out::pad("", 26) + Out::pad("f_min " + Out::num(d.lining.friction_min, 3), 16) +
         Out::pad("f_nom " + Out::num(d.lining.friction, 3), 16) + "f_max " +
         Out::num(d.lining.friction_max, 3));
  const auto& row = s.results[pa ? 0 : 1];
  auto three = [&](const std::string& label, auto get) {
    o.line("  " + Out::pad(label, 26) + Out::pad(get(row[0]), 16) + Out::pad(get(row[1]), 16) +
           get(row[2]));
  };
  three("lever force F", [&](const DirectionResult& x) { return force(x); });
  three("braking torque T", [&](const DirectionResult& x) { return o.q(x.torque, Quantity::torque); });
  three("tight tension P1", [&](const DirectionResult& x) { return o.q(x.tension_tight, Quantity::force); });
  three("max lining pressure", [&](const DirectionResult& x) { return o.q(x.pressure_max, Quantity::stress); });
  o.row("self-locking friction",
        s.self_lock_friction ? "f = " + Out::num(*s.self_lock_friction, 4) : std::string("none (cannot self-lock)"));
  o.row("capacity at f_min", o.q(s.capacity.torque, Quantity::torque) + " (band stress " +
                                 o.q(s.capacity.torque_band, Quantity::torque) + ", lining pressure " +
                                 o.q(s.capacity.torque_pressure, Quantity::torque) + ")");
}

void thermal(Out& o, const Solution& s) {
  if (!s.thermal.present) return;
  const Thermal& t = s.thermal;
  o.heading("Heat (per stop, design rotation)");
  o.row("energy per stop", o.q(t.energy, Quantity::energy));
  o.row("stop time", Out::num(t.stop_time, 3) + " s");
  if (t.hoist_torque > 0) o.row("mean stopping torque", o.q(t.hoist_torque, Quantity::torque));
  o.row("drum rim mass", o.q(t.rim_mass, Quantity::mass));
  o.row("temperature rise", o.q(t.temperature_rise, Quantity::temperature_difference));
  o.row("peak temperature", o.q(t.peak_temperature, Quantity::temperature));
  o.row("power per lining area", o.q(t.power_density_mean, Quantity::power_density) + " mean, " +
                                     o.q(t.power_density_peak, Quantity::power_density) + " peak");
  if (t.mean_power > 0) o.row("mean power (duty)", o.q(t.mean_power, Quantity::power));
}

// How the brake is applied by a weight or a spring (REFERENCE §8): the statics at the three lever
// positions, the spring a maker can quote from, and the release actuator's requirement.
void applying(Out& o, const Solution& s) {
  const ApplyResult& a = s.apply;
  if (!a.present) return;
  o.heading("Applying the brake");
  const auto nm = [&](double v) { return o.q(v, Quantity::torque); };
  const auto len = [&](double v) { return o.q(v, Quantity::length); };
  if (a.by == ApplyBy::weight) {
    o.row("applied by", "a weight of " + o.q(a.weight_mass, Quantity::mass) + " hung at " + o.point(a.applied.at));
  } else {
    o.row("applied by", "a compression spring from " + o.point(a.applied.at) + " on the lever to its seat " +
                            o.point(a.seat) + " on the frame");
  }
  o.row("moment needed", nm(a.required_moment) + " (" + a.governing + ")");
  o.row("wear allowance", len(a.wear_allowance) + " radial, lever turned " + deg(a.wear_rotation, 3) +
                              " further (φ·w/|m_A + m_B|)");
  o.row("lever's own weight", o.q(a.lever_mass, Quantity::mass) + " at " + o.point(a.lever_centroid) +
                                  ", moment " + nm(a.worn.lever_moment) + " at the worn position");
  o.line("  " + Out::pad("", 26) + Out::pad("applied", 16) + Out::pad("worn", 16) + "released");
  const ApplyPosition* p[3] = {&a.applied, &a.worn, &a.released};
  auto three = [&](const std::string& label, auto get) {
    o.line("  " + Out::pad(label, 26) + Out::pad(get(*p[0], 0), 16) + Out::pad(get(*p[1], 1), 16) + get(*p[2], 2));
  };
  three("lever rotation", [&](const ApplyPosition& x, int) { return deg(x.rotation, 3); });
  three("arm about the pivot", [&](const ApplyPosition& x, int) { return len(x.arm); });
  const SpringResult& sp = a.spring;
  const SpringState* st[3] = {&sp.applied, &sp.worn, &sp.released};
  if (a.by == ApplyBy::spring && sp.found) {
    three("spring length", [&](const ApplyPosition&, int i) { return len(st[i]->length); });
    three("spring force", [&](const ApplyPosition&, int i) { return o.q(st[i]->force, Quantity::force); });
    three("spring shear stress", [&](const ApplyPosition&, int i) { return o.q(st[i]->stress, Quantity::stress); });
  }
  three("element's moment", [&](const ApplyPosition& x, int) { return nm(x.element_moment); });
  three("lever weight's moment", [&](const ApplyPosition& x, int) { return nm(x.lever_moment); });
  o.row("available when worn", nm(a.available_moment) + " against " + nm(a.required_moment) + " needed");
  if (a.by == ApplyBy::spring) {
    if (sp.found) {
      o.line("  Spring (Shigley 9th ed. ch. 10):");
      o.row("  wire", sp.material + ", d = " + len(sp.wire_diameter) + ", S_ut " +
                          o.q(sp.tensile_strength, Quantity::stress) + ", allowable " +
                          o.q(sp.allowable, Quantity::stress));
      o.row("  coil", "mean Ø" + len(sp.mean_diameter) + ", outside Ø" + len(sp.outer_diameter) +
                          ", index C = " + Out::num(sp.index, 3));
      o.row("  coils", Out::num(sp.active_coils, 3) + " active, " + Out::num(sp.total_coils, 3) +
                           " total, ends " + to_string(sp.ends));
      o.row("  lengths", "free " + len(sp.free_length) + ", solid " + len(sp.solid_length) +
                             ", buckling limit " + len(sp.buckling_length));
      o.row("  rate", Out::num(sp.rate / 1000.0, 4) + " N/mm; overrun to closure ξ = " +
                          Out::num(sp.overrun, 3) + "; wire mass " + o.q(sp.mass, Quantity::mass));
    } else {
      o.row("spring", "NONE FOUND: " + a.refusal);
    }
  }
  const ActuatorNeed& act = a.actuator;
  o.line("  Release actuator (the requirement for its maker):");
  o.row("  acts at", o.point(act.at) + ", arm " + len(act.arm) + " (force perpendicular to the lever)");
  o.row("  stroke", len(act.stroke) + " = " + len(act.travel) + " lift + " + len(act.margin) +
                        " reserve for the wear allowance");
  o.row("  force", o.q(act.force, Quantity::force) + " holding the lever released");
  // What bandforge adds to carry the element (built by `build`).
  const ElementMount& m = a.mount;
  if (!m.present) return;
  o.line(a.by == ApplyBy::spring ? "  Spring seats (bandforge adds them):" : "  Weight and hanger (bandforge adds them):");
  if (a.by == ApplyBy::spring) {
    for (const SeatPlan* seat : {&m.lever_seat, &m.frame_seat}) {
      o.row(seat == &m.lever_seat ? "  on the lever" : "  on the frame",
            "plate Ø" + len(seat->diameter) + " × " + len(seat->thickness) + " with spigot Ø" +
                len(seat->spigot_diameter) + " × " + len(seat->spigot_height) + ", face at " + o.point(seat->face));
    }
  } else {
    const WeightMount& w = m.weight;
    o.row("  hanger", "rod Ø" + len(w.rod_diameter) + " × " + len(w.rod_length) + " from " + o.point(w.hang));
    o.row("  block", "steel Ø" + len(w.block_diameter) + " × " + len(w.block_height) + ", " +
                         o.q(w.block_mass, Quantity::mass) + " (+ rod " + o.q(w.rod_mass, Quantity::mass) + ")");
  }
  if (!m.refusal.empty()) o.row("  cannot build", m.refusal);
}

void checks(Out& o, const Solution& s) {
  o.heading("Checks");
  for (const Check& c : s.checks) {
    const Quantity k = quantity_of_unit(c.unit);
    auto show = [&](double v) {
      return k == Quantity::dimensionless ? Out::num(v, 4) : o.q(v, k);
    };
    o.line(std::string("  ") + (c.ok ? "[ ok ] " : "[FAIL] ") + c.title);
    o.line("         " + show(c.value) + (c.upper ? " ≤ " : " ≥ ") + show(c.limit) +
           (c.note.empty() ? "" : "   (" + c.note + ")"));
    o.line("         limit: " + c.source);
  }
  if (!s.warnings.empty()) {
    o.heading("Warnings");
    for (const auto& w : s.warnings) o.line("  - " + w);
  }
}

}  // namespace

std::vector<std::string> hardware_summary(const HardwarePlan& h, UnitSystem units) {
  std::vector<std::string> out;
  if (!h.present) return out;
  auto len = [&](double v) { return format_quantity(v, Quantity::length, units); };
  for (const JointPlan* j : {&h.joint_a, &h.joint_b}) {
    std::string line = "end " + j->end + ": " + to_string(j->kind) + " (" +
                       (j->chosen_automatically ? "chosen automatically" : "asked for in the design file") + "), ";
    if (j->kind == JointKind::welded_block) {
      line += "end block " + len(j->block_front + j->block_back) + " × " + len(j->block_height) +
              ", band end in a slot " + len(j->slot_depth) + " deep, fillet welds leg " + len(j->weld_leg);
    } else {
      line += std::to_string(j->rows) + " rows × " + std::to_string(j->columns) + " rivets Ø" +
              len(j->rivet) + ", lap " + len(j->lap);
    }
    line += "; takes " + len(j->needs) + " of the " + len(j->room) + " the run leaves";
    out.push_back(line);
  }
  for (const BracketPlan& b : h.brackets) {
    std::string held;
    for (const std::string& p : b.pins) held += (held.empty() ? "" : ", ") + p;
    out.push_back(b.name + ": " + (b.cheek ? "two plates (cheeks) " : "plate ") + len(b.thickness) + " thick, " +
                  len(2 * b.half_width) + " wide, holds pin " + held + "; " +
                  (b.side == BracketSide::front ? "in front of the lever"
                   : b.behind_drum          ? "behind the drum face"
                                            : "behind the band") +
                  (b.cheek ? ", front cheek z " + len(b.cheek_z_back) + " to " + len(b.cheek_z_front) : ""));
  }
  if (h.axial.lever_outboard) out.push_back("lever moved in front of the drum face (z from " + len(h.axial.lever_back) + ")");
  if (!h.release_ok) out.push_back("released state not built: " + h.release_problem);
  if (!h.refusal.empty()) out.push_back("CANNOT BE BUILT: " + h.refusal);
  return out;
}

std::string text_report(const Design& design, const Solution& solution, UnitSystem units) {
  Out o(units);
  o.line("bandforge — " + design.project.title +
         (design.project.number.empty() ? "" : " (" + design.project.number +
                                                   (design.project.revision.empty() ? "" : " rev " + design.project.revision) + ")"));
  if (!design.file.empty()) o.line("design file: " + design.file);
  o.line("CAUTION: a design aid only. A brake holds loads over people: check these results against");
  o.line("the applicable codes and have them approved by a licensed engineer.");
  inputs(o, design, solution);
  layout(o, solution);
  results(o, design, solution);
  thermal(o, solution);
  applying(o, solution);
  if (solution.hardware.present) {
    o.heading("Generated hardware (what build adds)");
    for (const std::string& l : hardware_summary(solution.hardware, units)) o.line("  - " + l);
  }
  checks(o, solution);
  int failed = 0;
  for (const Check& c : solution.checks) failed += c.ok ? 0 : 1;
  o.heading(failed == 0 ? "All " + std::to_string(solution.checks.size()) + " checks pass."
                        : std::to_string(failed) + " of " + std::to_string(solution.checks.size()) +
                              " checks FAIL.");
  return o.str();
}

}  // namespace bandforge
