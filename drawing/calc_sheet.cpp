#include "drawing/calc_sheet.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <filesystem>
#include <functional>
#include <optional>
#include <numbers>

#include "drawing/format.hpp"
#include "drawing/plot.hpp"
#include "drawing/sheet.hpp"
#include "drawing/table.hpp"
#include "drawing/text_fit.hpp"
#include "src/standard_parts.hpp"
#include "src/fits.hpp"
#include "src/report.hpp"
#include "src/spring.hpp"

namespace bandforge::drawing {
namespace {

constexpr double kH = Lettering::body;
constexpr double kPitch = kH * 1.5;

Block heading(std::string text) {
  Block b;
  b.height = [](const Canvas&, double) { return Lettering::heading + 1.5; };
  b.draw = [text](Canvas& c, Pt p, double w) {
    c.text({p.x, p.y - Lettering::heading}, text, Lettering::heading);
    c.pen(Pen::narrow);
    c.line({p.x, p.y - Lettering::heading - 1.2}, {p.x + w, p.y - Lettering::heading - 1.2});
  };
  b.keep_with_next = true;
  b.space_after = 2.0;
  return b;
}

/// Numbered or plain lines of prose, each wrapped to the column.
Block paragraphs(std::vector<std::string> items, bool numbered) {
  auto lines_of = [items, numbered](const Canvas& c, double w) {
    std::vector<std::pair<std::string, bool>> out;  // text, first line of an item
    for (size_t i = 0; i < items.size(); ++i) {
      const double indent = numbered ? 5.0 : 0.0;
      auto ls = wrap_lines(c, items[i], kH, w - indent);
      for (size_t k = 0; k < ls.size(); ++k) out.push_back({ls[k], k == 0});
    }
    return out;
  };
  Block b;
  b.height = [lines_of](const Canvas& c, double w) {
    return static_cast<double>(lines_of(c, w).size()) * kPitch;
  };
  b.draw = [lines_of, numbered](Canvas& c, Pt p, double w) {
    double y = p.y - kH;
    int n = 0;
    for (const auto& [text, first] : lines_of(c, w)) {
      if (numbered && first) c.text({p.x, y}, std::to_string(++n) + ".", kH);
      c.text({p.x + (numbered ? 5.0 : 0.0), y}, text, kH);
      y -= kPitch;
    }
  };
  return b;
}

// How a table takes the column's width at layout time (text is measured there).
using TableFit = std::function<Table(const Canvas&, Table, double width)>;

Table proportional(const Canvas&, Table t, double width) {
  fit_width(t, width);
  return t;
}

Block table_block(Table t, TableFit fit = proportional) {
  Block b;
  b.height = [t, fit](const Canvas& c, double w) { return table_height(c, fit(c, t, w)); };
  b.draw = [t, fit](Canvas& c, Pt p, double w) { draw_table(c, fit(c, t, w), p); };
  // Split between rows, the header repeated on the continuation; at least two rows each side.
  b.split = [t, fit](const Canvas& c, double w, double avail) -> std::optional<std::pair<Block, Block>> {
    const Table f = fit(c, t, w);
    const size_t body = f.rows.size() - (f.header ? 1 : 0);
    size_t n = rows_fitting(c, f, avail);
    if (n >= body || body < 4) return std::nullopt;
    n = std::min(n, body - 2);  // never leave a lone row for the continuation
    if (n < 2) return std::nullopt;
    const size_t first = f.header ? 1 : 0;
    return std::make_pair(table_block(table_rows(t, first, first + n), fit),
                          table_block(table_rows(t, first + n, t.rows.size()), fit));
  };
  return b;
}

/// Numbered sources: tables cite "[n]", one list gives the full text.
class Refs {
 public:
  std::string cite(const std::string& source) {
    if (source.empty()) return "";
    for (size_t i = 0; i < list_.size(); ++i) {
      if (list_[i] == source) return "[" + std::to_string(i + 1) + "]";
    }
    list_.push_back(source);
    return "[" + std::to_string(list_.size()) + "]";
  }
  std::vector<std::string> lines() const {
    std::vector<std::string> out;
    for (size_t i = 0; i < list_.size(); ++i) {
      std::string line = "[";
      line += std::to_string(i + 1);
      line += "] ";
      line += list_[i];
      out.push_back(std::move(line));
    }
    return out;
  }
  bool empty() const { return list_.empty(); }

 private:
  std::vector<std::string> list_;
};

// Plain value in the display unit, trailing zeros dropped ("400", "0.125").
std::string plain(double si, Quantity q, UnitSystem u, int decimals) {
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.*f", decimals, to_display(si, q, u));
  std::string s = buf;
  if (s.find('.') != std::string::npos) {
    while (s.back() == '0') s.pop_back();
    if (s.back() == '.') s.pop_back();
  }
  if (s == "-0") s = "0";
  return s;
}

std::string len(double m, UnitSystem u) {
  return plain(m, Quantity::length, u, u == UnitSystem::si ? 2 : 4) + " " +
         display_unit(Quantity::length, u);
}

std::string point(Vec2 p, UnitSystem u) {
  const int dec = u == UnitSystem::si ? 2 : 4;
  // Appended piecewise: GCC 12 warns (-Wrestrict, a false positive) on "(" + std::string chains.
  std::string s = "(";
  s += plain(p.x, Quantity::length, u, dec);
  s += ", ";
  s += plain(p.y, Quantity::length, u, dec);
  s += ") ";
  s += display_unit(Quantity::length, u);
  return s;
}

std::string fnum(double v) { return sig_figs(v, 3); }

const char* turn_name(Turn t) { return t == Turn::cw ? "CW" : "CCW"; }

std::string kind_name(BrakeKind k) { return to_string(k); }

// ---- content --------------------------------------------------------------------------------

std::vector<std::string> method_items(const Design& d, const Solution& s) {
  const bool thick = d.band.model == TensionModel::thick;
  const bool torque_given = d.load.given == Load::Given::torque;
  std::vector<std::string> m;
  m.push_back(std::string("Band on drum: a flexible band slipping over the whole wrap; the tensions "
                          "follow the capstan (Euler–Eytelwein) relation ") +
              (thick ? "P1/P2 = e^(f·φ·r/r_b) and T = (P1 − P2)·r_b (thick band, line of action "
                       "at r_b = r + t_lining + t/2, friction at r: element equilibrium, derived here)."
                     : "P1/P2 = e^(f·φ) and T = (P1 − P2)·r (thin band; Mott, Machine Elements in Mechanical Design, 4th ed., eq. 22-26; Machinery's Handbook, 31st ed., p. 2535)."));
  if (s.layout.from_pins) {
    m.push_back("Layout from the pins: each free run leaves the band circle r_b tangentially, "
                "β = ψ ± acos(r_b/d) from a pin at distance d and polar angle ψ; the wrap φ is the "
                "angle between the two tangent points (plane geometry of tangents to a circle).");
    m.push_back("Lever statics: moments about the pivot O. Each run pulls its pin along the run "
                "line, so its arm is the signed perpendicular distance m = (E − O) × u, not the "
                "pin offset. The lever turns in the sense σ = −sign(m_A + m_B) to tighten the band; "
                "m' = σ·m > 0 means the tension helps apply.");
  } else {
    m.push_back("Concept layout: wrap and perpendicular arms taken as given ([concept] " +
                kind_name(s.layout.kind) + " brake, textbook figures, r_b = r).");
  }
  m.push_back(torque_given
                  ? "Torque given: P2 = T/(r·(e^(f·φ) − 1)), P1 = e^(f·φ)·P2; operator force "
                    "F = P2·(−(e^(f·φ)·m'_t + m'_s))/L at the handle arm L."
                  : "Lever force given: P2 = F·L/(−(e^(f·φ)·m'_t + m'_s)), P1 = e^(f·φ)·P2, "
                    "T = (P1 − P2)·r.");
  m.push_back("Self-locking when e^(f·φ)·m'_t + m'_s ≥ 0: the band then applies itself "
              "(Machinery's Handbook, 31st ed., p. 2535, Fig. 3, in its general form); the critical friction is f = ln(−m'_s/m'_t)/φ.");
  m.push_back("Lining pressure p(θ) = P(θ)/(b·r), P(θ) = P2·e^(f·θ) from the slack end, largest at "
              "the tight end: p_max = P1/(b·r) (Mott, 4th ed., eq. 22-27). Band stress σ = P1/(b·t), gross "
              "section; pin in double shear τ = P1/(2·π·d²/4); lever bending σ = M/Z at the "
              "net section, Z = t·(w³ − d³)/(6·w).");
  if (s.thermal.present) {
    m.push_back("Thermal (Bhandari Ex. 12.14; Jindal Ex. 23-1, 23-5): energy per stop E = m·g·s + ½·m·v² + ½·I·ω²; the drum rim "
                "absorbs it, ΔT = E/(m_rim·c); power per lining area q = E/(t_stop·b·r·φ), peak "
                "2 × mean at the start of a uniform stop.");
  }
  m.push_back("Every result is given for both drum rotations at f_min, f_nominal and f_max of the "
              "lining; checks take the worst of these cases.");
  return m;
}

Table inputs_table(const Design& d, const Solution& s, UnitSystem u, Refs& refs) {
  Table t;
  t.widths = {62, 20, 62, 42};
  t.rows.push_back({"Input", "Symbol", "Value", "Source / note"});
  auto row = [&](std::string a, std::string b, std::string c, std::string e = "") {
    t.rows.push_back({std::move(a), std::move(b), std::move(c), std::move(e)});
  };
  row("Drum friction diameter", "D = 2r", len(d.drum.diameter, u));
  row("Drum face width", "w", len(d.drum.width, u));
  if (d.drum.bore > 0) row("Drum bore", "", len(d.drum.bore, u));
  row("Drum rotation to be braked", "", std::string(turn_name(d.drum.rotation)) + " (seen from the front)");
  if (!d.drum.material.empty()) {
    row("Drum material", "", d.drum.material,
        "ρ = " + sig_figs(d.drum.density, 4) + " kg/m³, c = " +
            sig_figs(d.drum.specific_heat, 3) + " J/(kg·K) " + refs.cite(d.drum.material_source));
  }
  row("Lining", "", d.lining.material.empty() ? "explicit values" : d.lining.material);
  row("Friction coefficient", "f", fnum(d.lining.friction) + " (" + fnum(d.lining.friction_min) +
                                        " … " + fnum(d.lining.friction_max) + ")",
      refs.cite(d.lining.friction_source));
  if (d.lining.pressure_limit > 0) {
    row("Lining pressure limit", "p_allow", qty(d.lining.pressure_limit, Quantity::stress, u),
        refs.cite(d.lining.pressure_source));
  }
  if (d.lining.temperature_limit > 0) {
    row("Lining temperature limit", "", qty(d.lining.temperature_limit, Quantity::temperature, u, 3),
        refs.cite(d.lining.temperature_source));
  }
  if (d.lining.power_limit > 0) {
    row("Lining power limit", "q_allow", qty(d.lining.power_limit, Quantity::power_density, u, 3),
        refs.cite(d.lining.power_source));
  }
  row("Lining thickness", "t_lining", len(d.lining.thickness, u));
  row("Band width", "b", len(d.band.width, u));
  row("Band thickness", "t", len(d.band.thickness, u));
  row("Band allowable stress", "σ_allow", qty(d.band.allowable_stress, Quantity::stress, u),
      "gross section");
  row("Band sense, A → B", "s", std::string(turn_name(d.band.sense)));
  row("Tension model", "", d.band.model == TensionModel::thick ? "thick band" : "thin band (r_b = r)");
  if (s.layout.from_pins) {
    row("End A pin", "E_A", point(d.band.end_a.at, u), std::string("on the ") + to_string(d.band.end_a.mount));
    row("End B pin", "E_B", point(d.band.end_b.at, u), std::string("on the ") + to_string(d.band.end_b.mount));
    row("Lever pivot", "O", point(d.lever.pivot, u));
    row("Handle (force point)", "H", point(d.lever.handle, u), "force ⊥ O→H, applying sense");
  } else {
    const Concept& k = d.concept_arms;
    row("Brake kind", "", kind_name(k.kind), "[concept]");
    row("Wrap angle", "φ", degrees(k.wrap));
    row("Handle arm", "L", len(k.handle_arm, u));
    row("Arm of end A", "a_A", len(k.arm_a, u));
    row("Arm of end B", "a_B", len(k.arm_b, u));
  }
  if (d.band.pin_diameter > 0) row("Pin diameter", "d", len(d.band.pin_diameter, u));
  if (d.band.clearance > 0) row("Release clearance (radial)", "c", len(d.band.clearance, u));
  if (d.lever.width > 0) {
    row("Lever plate", "w × t_l", len(d.lever.width, u) + " × " + len(d.lever.thickness, u));
  }
  if (d.lever.allowable_stress > 0) {
    row("Lever allowable stress", "", qty(d.lever.allowable_stress, Quantity::stress, u));
  }
  if (d.load.given == Load::Given::torque) {
    row("Required torque", "T_load", qty(d.load.torque, Quantity::torque, u));
  } else {
    row("Operator force", "F", qty(d.load.lever_force, Quantity::force, u));
  }
  row("Service factor", "K", sig_figs(d.load.service_factor, 3));
  if (d.duty.present) {
    const Duty& du = d.duty;
    if (du.hoist_mass > 0) {
      row("Hoist load", "m", qty(du.hoist_mass, Quantity::mass, u));
      row("Load speed", "v", qty(du.hoist_speed, Quantity::linear_speed, u, 3));
      row("Stopping distance", "s", len(du.stop_distance, u));
      row("Rope radius on the brake shaft", "r_rope", len(du.rope_radius, u));
    }
    if (du.speed > 0) row("Drum speed", "ω", qty(du.speed, Quantity::angular_speed, u, 4));
    if (du.inertia > 0) row("Rotating inertia", "I", qty(du.inertia, Quantity::inertia, u));
    if (du.stops_per_hour > 0) row("Stops per hour", "", sig_figs(du.stops_per_hour, 3));
    row("Ambient temperature", "T∞", qty(du.ambient, Quantity::temperature, u, 3));
  }
  return t;
}

Table layout_table(const Design& d, const Solution& s, UnitSystem u) {
  const Layout& L = s.layout;
  Table t;
  t.widths = {50, 66, 40};
  t.rows.push_back({"Quantity", "Formula", "Value"});
  auto row = [&](std::string a, std::string b, std::string c) {
    t.rows.push_back({std::move(a), std::move(b), std::move(c)});
  };
  row("Friction radius", "r = D/2", len(L.r, u));
  if (L.from_pins) {
    row("Band line radius", "r_b = r + t_lining + t/2", len(L.r_band, u));
    for (int i = 0; i < 2; ++i) {
      const EndLayout& e = i == 0 ? L.a : L.b;
      const std::string n = i == 0 ? "A" : "B";
      const double dist = std::hypot(e.pin.x, e.pin.y);
      row("Pin " + n + " distance", "d_" + n + " = |E_" + n + "|", len(dist, u));
      row("Tangent angle " + n, std::string("β_") + n + " = ψ_" + n + (i == 0 ? " + " : " − ") +
                                    "s·acos(r_b/d_" + n + ")",
          degrees(e.tangent_angle));
      row("Tangent point " + n, "T_" + n + " = r_b·(cos β, sin β)", point(e.tangent_point, u));
      row("Free run " + n, "ℓ_" + n + " = √(d² − r_b²)", len(e.free_length, u));
    }
    row("Wrap angle", "φ = s·(β_B − β_A) mod 2π", degrees(L.wrap) + " = " + sig_figs(L.wrap, 4) + " rad");
    row("Band centreline length", "ℓ_A + ℓ_B + r_b·φ", len(L.band_length, u));
    for (int i = 0; i < 2; ++i) {
      const EndLayout& e = i == 0 ? L.a : L.b;
      const std::string n = i == 0 ? "A" : "B";
      if (e.mount == Mount::frame) {
        row("Arm of run " + n, "end on the frame", "—");
      } else {
        row("Arm of run " + n, "m_" + n + " = (E_" + n + " − O) × u_" + n,
            len(e.arm, u) + " (m' = " + plain(e.arm_applied, Quantity::length, u, 2) + ")");
      }
    }
    row("Apply sense", "σ = −sign(m_A + m_B)", L.apply_sense > 0 ? "+1 (CCW)" : "−1 (CW)");
    row("Handle arm", "L = |H − O|", len(L.handle_arm, u));
  } else {
    row("Wrap angle", "given", degrees(L.wrap));
    row("Arm of end A (m')", "given", len(L.a.arm_applied, u));
    row("Arm of end B (m')", "given", len(L.b.arm_applied, u));
    row("Handle arm", "given", len(L.handle_arm, u));
  }
  row("Brake kind", "from the signs of m'", kind_name(L.kind));
  if (L.from_pins && d.band.clearance > 0) {
    row("Lever rotation to release", "δψ = φ·c/|m_A + m_B|", degrees(L.release_rotation, 2));
    row("Handle travel", "L·δψ", len(L.handle_travel, u));
  }
  return t;
}

Table forces_table(const Design& d, const Solution& s, UnitSystem u) {
  const bool thick = d.band.model == TensionModel::thick;
  const bool torque_given = d.load.given == Load::Given::torque;
  const std::string r = thick ? "r_b" : "r";
  const std::string e = thick ? "e^(fφr/r_b)" : "e^(fφ)";
  Table t;
  t.widths = {30, 40, 16, 16, 16, 16, 16, 16};
  t.align = {Align::left, Align::left, Align::right, Align::right, Align::right,
             Align::right, Align::right, Align::right};
  std::vector<std::string> head = {"Result", "Formula"};
  // Design rotation first.
  const int order[2] = {s.primary_a_tight ? 0 : 1, s.primary_a_tight ? 1 : 0};
  for (int k = 0; k < 2; ++k) {
    const bool a_tight = order[k] == 0;
    for (int f = 0; f < 3; ++f) {
      const auto& res = s.results[order[k]][f];
      head.push_back(std::string(turn_name(rotation_for(s, a_tight))) + (a_tight ? " A" : " B") +
                     "\nf " + fnum(res.friction));
    }
  }
  t.rows.push_back(head);
  auto row = [&](std::string name, std::string formula, auto value_of) {
    std::vector<std::string> cells = {std::move(name), std::move(formula)};
    for (int k = 0; k < 2; ++k)
      for (int f = 0; f < 3; ++f) cells.push_back(value_of(s.results[order[k]][f]));
    t.rows.push_back(cells);
  };
  auto q = [&](Quantity qq, double DirectionResult::*field) {
    return [=](const DirectionResult& res) { return qty_value(res.*field, qq, u); };
  };
  row("Capstan ratio", "P1/P2 = " + e, [](const DirectionResult& res) { return sig_figs(res.capstan_ratio, 4); });
  row("Slack tension P2 [" + display_unit(Quantity::force, u) + "]",
      torque_given ? "T/(" + r + "·(" + e + " − 1))" : "F·L/−(" + e + "·m't + m's)",
      q(Quantity::force, &DirectionResult::tension_slack));
  row("Tight tension P1 [" + display_unit(Quantity::force, u) + "]", e + "·P2",
      q(Quantity::force, &DirectionResult::tension_tight));
  row("Torque T [" + display_unit(Quantity::torque, u) + "]",
      torque_given ? "T_load·K (given)" : "(P1 − P2)·" + r, q(Quantity::torque, &DirectionResult::torque));
  row("Lever force F [" + display_unit(Quantity::force, u) + "]",
      torque_given ? "−P2·(" + e + "·m't + m's)/L" : "given",
      [&](const DirectionResult& res) {
        return res.self_locking ? std::string("self-locks") : qty_value(res.lever_force, Quantity::force, u);
      });
  row("Max pressure p_max [" + display_unit(Quantity::stress, u) + "]", "P1/(b·r)",
      q(Quantity::stress, &DirectionResult::pressure_max));
  row("Mean pressure [" + display_unit(Quantity::stress, u) + "]", "T/(f·b·r²·φ)",
      q(Quantity::stress, &DirectionResult::pressure_mean));
  row("Band stress σ [" + display_unit(Quantity::stress, u) + "]", "P1/(b·t)",
      q(Quantity::stress, &DirectionResult::band_stress));
  if (d.band.pin_diameter > 0) {
    row("Pin shear τ [" + display_unit(Quantity::stress, u) + "]", "P1/(2·πd²/4)",
        q(Quantity::stress, &DirectionResult::pin_shear));
  }
  row("Lever moment M [" + display_unit(Quantity::torque, u) + "]", "largest section moment",
      q(Quantity::torque, &DirectionResult::lever_moment));
  if (d.lever.width > 0) {
    row("Lever stress [" + display_unit(Quantity::stress, u) + "]", "M/Z_net",
        q(Quantity::stress, &DirectionResult::lever_stress));
  }
  if (s.layout.from_pins) {
    row("Drum bearing load [" + display_unit(Quantity::force, u) + "]", "|P_A·u_A + P_B·u_B|",
        [&](const DirectionResult& res) {
          return qty_value(std::hypot(res.drum_load.x, res.drum_load.y), Quantity::force, u);
        });
    row("Pivot reaction [" + display_unit(Quantity::force, u) + "]", "|−(F·d_F + Σ P·u)|",
        [&](const DirectionResult& res) {
          return qty_value(std::hypot(res.pivot_reaction.x, res.pivot_reaction.y), Quantity::force, u);
        });
  }
  row("Self-locking", "e·m't + m's ≥ 0",
      [](const DirectionResult& res) { return std::string(res.self_locking ? "YES" : "no"); });
  return t;
}

Table capacity_thermal_table(const Design& d, const Solution& s, UnitSystem u) {
  const bool thick = d.band.model == TensionModel::thick;
  const std::string r = thick ? "r_b" : "r";
  const std::string e = thick ? "e^(−fφr/r_b)" : "e^(−fφ)";
  Table t;
  t.widths = {60, 70, 40};
  t.rows.push_back({"Quantity", "Formula", "Value"});
  auto row = [&](std::string a, std::string b, std::string c) {
    t.rows.push_back({std::move(a), std::move(b), std::move(c)});
  };
  const Capacity& c = s.capacity;
  if (d.load.given == Load::Given::torque) {
    row("Design torque", "T_load·K", qty(s.required_torque, Quantity::torque, u));
  }
  row("Torque at band allowable stress (f = " + fnum(c.friction) + ")",
      "σ_allow·b·t·" + r + "·(1 − " + e + ")", qty(c.torque_band, Quantity::torque, u));
  row("Torque at lining pressure limit", "p_allow·b·r·" + r + "·(1 − " + e + ")",
      qty(c.torque_pressure, Quantity::torque, u));
  row("Capacity", "the smaller", qty(c.torque, Quantity::torque, u));
  if (s.self_lock_friction) {
    row("Self-locking friction", "f = ln(−m's/m't)/φ", fnum(*s.self_lock_friction));
  } else {
    row("Self-locking friction", "—", "none: cannot self-lock");
  }
  const Thermal& th = s.thermal;
  if (th.present) {
    row("Energy per stop", d.duty.hoist_mass > 0 ? "m·g·s + ½·m·v² + ½·I·ω²" : "½·I·ω²",
        qty(th.energy, Quantity::energy, u));
    if (th.stop_time > 0) row("Stop time", "2·s/v or 2·θ/ω", sig_figs(th.stop_time, 3) + " s");
    if (th.hoist_torque > 0) row("Mean torque to stop the load", "E/θ_stop", qty(th.hoist_torque, Quantity::torque, u));
    row("Drum rim mass", "ρ·π/4·(D² − D_i²)·w", qty(th.rim_mass, Quantity::mass, u));
    row("Temperature rise per stop", "ΔT = E/(m_rim·c)", qty(th.temperature_rise, Quantity::temperature_difference, u, 3));
    row("Drum temperature", "T∞ + ΔT", qty(th.peak_temperature, Quantity::temperature, u, 3));
    row("Lining area in contact", "b·r·φ", sig_figs(to_display(th.lining_area, Quantity::length, u) *
                                                        to_display(1.0, Quantity::length, u), 4) +
                                               " " + display_unit(Quantity::length, u) + "²");
    row("Power per lining area, mean", "E/(t_stop·b·r·φ)", qty(th.power_density_mean, Quantity::power_density, u, 3));
    row("Power per lining area, peak", "2 × mean", qty(th.power_density_peak, Quantity::power_density, u, 3));
    if (th.mean_power > 0) row("Mean braking power", "E·stops/3600 s", qty(th.mean_power, Quantity::power, u, 3));
  }
  return t;
}

Table checks_table(const Solution& s, UnitSystem u) {
  Table t;
  t.widths = {44, 21, 21, 80, 12};
  t.align = {Align::left, Align::right, Align::right, Align::left, Align::centre};
  t.rows.push_back({"Check (governing case)", "Value", "Limit", "Source of the limit", "Result"});
  for (const Check& c : s.checks) {
    const Quantity q = quantity_of_unit(c.unit);
    const std::string unit = display_unit(q, u);
    const std::string rel = c.upper ? "≤ " : "≥ ";
    t.rows.push_back({c.title + (c.note.empty() ? "" : " (" + c.note + ")"),
                      qty_value(c.value, q, u, 4) + (unit.empty() ? "" : " " + unit),
                      rel + qty_value(c.limit, q, u, 4) + (unit.empty() ? "" : " " + unit), c.source,
                      c.ok ? "pass" : "FAIL"});
  }
  return t;
}

Plot tension_plot(const Design& d, const Solution& s, UnitSystem u) {
  const Layout& L = s.layout;
  Plot p;
  p.title = "Band tension P(θ) and lining pressure p(θ) along the wrap, design rotation";
  p.x_label = "θ from the slack end [°]";
  p.y_label = "P [" + display_unit(Quantity::force, u) + "]";
  p.y2_label = "p [" + display_unit(Quantity::stress, u) + "]";
  const auto& dir = s.results[s.primary_a_tight ? 0 : 1];
  // P(θ) = P2·ratio^(θ/φ) covers the thin and the thick model alike; p = P·p_max/P1.
  double y_max = 0;
  const Pen pens[3] = {Pen::plot_dashed, Pen::plot, Pen::fine};
  const double deg = 180.0 / std::numbers::pi;
  for (int f = 0; f < 3; ++f) {
    const DirectionResult& r = dir[f];
    Series se;
    se.pen = pens[f];
    se.label = "f = " + fnum(r.friction);
    for (int i = 0; i <= 60; ++i) {
      const double th = L.wrap * i / 60.0;
      const double P = r.tension_slack * std::pow(r.capstan_ratio, th / L.wrap);
      se.points.push_back({th * deg, to_display(P, Quantity::force, u)});
      y_max = std::max(y_max, se.points.back().y);
    }
    p.series.push_back(se);
  }
  const DirectionResult& nom = dir[1];
  if (nom.tension_tight > 0 && nom.pressure_max > 0) {
    // Right axis: p = P/(b·r) in display units.
    const double k = to_display(nom.pressure_max, Quantity::stress, u) /
                     to_display(nom.tension_tight, Quantity::force, u);
    p.y2_factor = k;
    if (d.lining.pressure_limit > 0) {
      const double limit_P = to_display(d.lining.pressure_limit, Quantity::stress, u) / k;
      p.lines.push_back({limit_P, true, "pressure limit " + qty(d.lining.pressure_limit, Quantity::stress, u)});
      y_max = std::max(y_max, limit_P * 1.05);
    }
  }
  p.x_min = 0;
  p.x_max = L.wrap * deg;
  p.y_min = 0;
  p.y_max = y_max > 0 ? y_max : 1;
  return p;
}

Plot lever_plot(const Design& d, const Solution& s, UnitSystem u) {
  const Layout& L = s.layout;
  const bool torque_given = d.load.given == Load::Given::torque;
  Plot p;
  p.title = torque_given ? "Lever force against friction coefficient"
                         : "Braking torque against friction coefficient";
  p.x_label = "friction coefficient f";
  p.y_label = torque_given ? "F [" + display_unit(Quantity::force, u) + "]"
                           : "T [" + display_unit(Quantity::torque, u) + "]";
  const double f0 = d.lining.friction_min, f1 = d.lining.friction_max;
  const double span = std::max(f1 - f0, 0.05);
  const double lo = std::max(0.01, f0 - 0.25 * span), hi = std::min(0.99, f1 + 0.25 * span);
  double y_max = 0;
  for (int k = 0; k < 2; ++k) {
    const bool a_tight = k == 0 ? s.primary_a_tight : !s.primary_a_tight;
    Series se;
    se.pen = k == 0 ? Pen::plot : Pen::plot_dashed;
    se.label = std::string(k == 0 ? "design " : "reverse ") + turn_name(rotation_for(s, a_tight));
    for (int i = 0; i <= 80; ++i) {
      const double f = lo + (hi - lo) * i / 80.0;
      const DirectionResult r = solve_direction(d, L, a_tight, f);
      const double v = torque_given ? to_display(r.lever_force, Quantity::force, u)
                                    : to_display(r.torque, Quantity::torque, u);
      se.points.push_back({f, v});
      y_max = std::max(y_max, v);
    }
    p.series.push_back(se);
  }
  p.lines.push_back({f0, false, "f_min", {0.3, 0.3, 0.3}});
  p.lines.push_back({f1, false, "f_max", {0.3, 0.3, 0.3}});
  if (s.self_lock_friction) {
    p.shade = std::make_pair(*s.self_lock_friction, 1.0);
    p.shade_label = "self-locking f ≥ " + fnum(*s.self_lock_friction);
    p.lines.push_back({*s.self_lock_friction, false, "", {0.8, 0, 0}});
  }
  if (torque_given && d.load.given == Load::Given::torque) {
    // Reference: what a hand gives regularly (common practice, REFERENCE §3).
    const double hand = 250.0;
    if (to_display(hand, Quantity::force, u) < y_max * 1.6) {
      p.lines.push_back({to_display(hand, Quantity::force, u), true, "250 N hand force (common practice)",
                         {0.3, 0.3, 0.3}});
    }
  }
  p.x_min = lo;
  p.x_max = hi;
  p.y_min = 0;
  p.y_max = y_max > 0 ? y_max * 1.05 : 1;
  return p;
}

Block plot_block(Plot plot) {
  constexpr double kHeight = 55;
  Block b;
  b.height = [](const Canvas&, double) { return kHeight; };
  b.draw = [plot](Canvas& c, Pt p, double w) { draw_plot(c, plot, {p.x, p.y - kHeight, p.x + w, p.y}); };
  b.space_after = 5;
  return b;
}

// ---- cut list -------------------------------------------------------------------------------
// The rows of fab/cutlist.csv as they are (geom::cut_list), sizes in the display unit. Columns are
// sized to their content at layout time and the note takes what is left, shortened to three lines.

constexpr size_t kCutColumns = 9;
constexpr size_t kNoteColumn = 8;
constexpr size_t kNoteLines = 3;
constexpr double kMinNoteWidth = 30;  // [mm] below it the other columns give way (they wrap)

std::string cut_length(double mm, UnitSystem u) { return dim_length(mm / 1000.0, u); }

std::string cut_mass(double kg, UnitSystem u) {
  char buf[32];
  std::snprintf(buf, sizeof buf, "%.3f", to_display(kg, Quantity::mass, u));  // grams, as the CSV
  return buf;
}

Table cut_list_table(const std::vector<geom::CutListRow>& rows, UnitSystem u) {
  const std::string L = " [" + display_unit(Quantity::length, u) + "]";
  const std::string M = " [" + display_unit(Quantity::mass, u) + "]";
  Table t;
  t.widths.assign(kCutColumns, 1.0);  // measured in cut_list_fit
  t.align = {Align::left,  Align::left,  Align::left,  Align::right, Align::right,
             Align::right, Align::right, Align::right, Align::left};
  t.fail_marker.clear();  // part names and notes are not check results
  t.rows.push_back({"Part", "Material", "Stock", "Thick-\nness" + L, "Blank length × width" + L, "Qty",
                    "Mass each" + M, "Mass total" + M, "Note (shortened)"});
  double total = 0;
  for (const geom::CutListRow& r : rows) {
    // Round bar: the thickness field is the bar diameter and the blank is the sawn length.
    const bool bar = r.stock == "round bar";
    t.rows.push_back({r.part, r.material, r.stock, (bar ? "Ø" : "") + cut_length(r.thickness, u),
                      bar ? cut_length(r.length, u)
                          : cut_length(r.length, u) + " × " + cut_length(r.width, u),
                      std::to_string(r.quantity), cut_mass(r.mass, u),
                      cut_mass(r.mass * r.quantity, u), r.note});
    total += r.mass * r.quantity;
  }
  t.rows.push_back({"Total", "", "", "", "", "", "", cut_mass(total, u), ""});
  return t;
}

// `text` cut after a whole word and ended with " …" when wider than `width` (a number is never
// cut in its digits); a first word too wide on its own is cut at a character.
std::string ellipsize_words(const Canvas& c, const std::string& text, double h, double width) {
  if (c.text_width(text, h) <= width) return text;
  for (size_t end = text.rfind(' '); end != std::string::npos && end > 0; end = text.rfind(' ', end - 1)) {
    std::string head = text.substr(0, end);
    while (!head.empty() && (head.back() == ' ' || head.back() == ',' || head.back() == ':')) head.pop_back();
    if (!head.empty() && c.text_width(head + " …", h) <= width) return head + " …";
  }
  return ellipsize(c, text, h, width);
}

// A note in at most three lines: its first clause ("; "-separated: the developed length and its
// allowances) wrapped over up to two, the rest (what the blank becomes) on the last; each part
// cut after a whole word with "…". A note of one clause may use all three lines.
std::string shortened_note(const Canvas& c, const std::string& note, double h, double width) {
  const size_t semi = note.find("; ");
  const std::string first = note.substr(0, semi);
  const std::string rest = semi == std::string::npos ? "" : note.substr(semi + 2);
  auto fit_lines = [&](const std::string& text, size_t max_lines) {
    const std::vector<std::string> lines = wrap_lines(c, text, h, width);
    std::string out;
    for (size_t k = 0; k < lines.size() && k + 1 < max_lines; ++k) out += (k ? "\n" : "") + lines[k];
    if (lines.size() < max_lines) return out;
    std::string tail;
    for (size_t k = max_lines - 1; k < lines.size(); ++k) tail += (tail.empty() ? "" : " ") + lines[k];
    return out + (max_lines > 1 ? "\n" : "") + ellipsize_words(c, tail, h, width);
  };
  if (rest.empty()) return fit_lines(first, kNoteLines);
  return fit_lines(first, kNoteLines - 1) + "\n" + fit_lines(rest, 1);
}

// Every column but the note as wide as its widest cell (header: its widest word, it may wrap),
// measured over the whole list so that a continuation on the next sheet keeps the columns.
Table cut_list_fit(const Canvas& c, Table t, double width, const Table& full) {
  std::vector<double> need(kCutColumns, 0);
  for (size_t r = 0; r < full.rows.size(); ++r) {
    for (size_t i = 0; i < kCutColumns; ++i) {
      if (i == kNoteColumn) continue;
      const std::string& s = full.rows[r][i];
      if (r == 0) {
        for (size_t a = 0; a < s.size();) {
          size_t b = s.find_first_of(" \n", a);
          if (b == std::string::npos) b = s.size();
          need[i] = std::max(need[i], c.text_width(s.substr(a, b - a), t.h));
          a = b + 1;
        }
      } else {
        need[i] = std::max(need[i], c.text_width(s, t.h));
      }
    }
  }
  double used = 0;
  for (size_t i = 0; i < kCutColumns; ++i) {
    t.widths[i] = i == kNoteColumn ? 0 : need[i] + 2 * t.pad + 0.5;
    used += t.widths[i];
  }
  if (width - used < kMinNoteWidth) {
    const double k = (width - kMinNoteWidth) / used;
    for (double& w : t.widths) w *= k;
    used = width - kMinNoteWidth;
  }
  t.widths[kNoteColumn] = width - used;
  const double note_w = t.widths[kNoteColumn] - 2 * t.pad;
  for (size_t r = t.header ? 1 : 0; r < t.rows.size(); ++r) {
    std::string& note = t.rows[r][kNoteColumn];
    if (!note.empty()) note = shortened_note(c, note, t.h, note_w);
  }
  return t;
}

Block cut_list_block(const std::vector<geom::CutListRow>& rows, UnitSystem u) {
  const Table full = cut_list_table(rows, u);
  return table_block(full, [full](const Canvas& c, Table t, double w) {
    return cut_list_fit(c, std::move(t), w, full);
  });
}

std::vector<std::string> cut_list_footnote(UnitSystem u) {
  std::string s =
      "Rows as written to fab/cutlist.csv. Notes are shortened to fit: the full notes, with "
      "every allowance of a developed length, are in fab/cutlist.csv and on the NOTES layer of "
      "each part's DXF. Masses as cut (holes out); for round bar the thickness is the bar "
      "diameter and the blank the sawn length.";
  if (u == UnitSystem::us) {
    s += " Sizes here in inches and pounds; the notes, the CSV and the DXF files (1:1) are in "
         "millimetres and kilograms.";
  }
  return {s};
}

// ---- applying the brake (REFERENCE §8) ------------------------------------------------------
// The weight's or the spring's statics at the applied, worn and released lever positions, the
// spring as a maker quotes it, the release actuator's requirement and the hoist rules. Every
// figure is read from Solution::apply (src/apply.hpp); the tables put the value beside the
// quantity's name, then how it is found and its source.

const char* const kShigleyFull =
    "Shigley 9th ed.: Budynas & Nisbett, Shigley's Mechanical Engineering Design, 9th ed., ch. 10.";

// Spring rate in the display units' force per length: "2.473 N/mm", "14.12 lbf/in".
std::string rate_text(double n_per_m, UnitSystem u) {
  const double v = to_display(n_per_m, Quantity::force, u) / to_display(1.0, Quantity::length, u);
  return sig_figs(v, 4) + " " + display_unit(Quantity::force, u) + "/" + display_unit(Quantity::length, u);
}

// A count or a constant without trailing zeros: "13", "13.5", "0.707".
std::string short_number(double v) {
  char buf[32];
  std::snprintf(buf, sizeof buf, "%.4g", v);
  return buf;
}

std::string unit_tag(Quantity q, UnitSystem u) { return " [" + display_unit(q, u) + "]"; }

const char* sense_sign(const Layout& L) { return L.apply_sense > 0 ? "+1" : "−1"; }

Table value_table() {
  Table t;
  t.widths = {50, 27, 59, 52};
  t.rows.push_back({"Quantity", "Value", "Formula / how found", "Source"});
  return t;
}

void add_row(Table& t, std::string a, std::string b, std::string c, std::string e) {
  t.rows.push_back({std::move(a), std::move(b), std::move(c), std::move(e)});
}

std::vector<std::string> apply_method(const Design& d, const Solution& s) {
  const ApplyResult& a = s.apply;
  const std::string element = a.by == ApplyBy::spring ? "spring" : "weight";
  std::vector<std::string> m;
  m.push_back("The " + element + " replaces the operator's force: about the pivot O it must supply the "
              "actuating moment M_act = F·L of section 4 at the lowest friction of the range, the most "
              "the brake ever asks for (" +
              (d.apply.both_rotations ? std::string("the worse drum rotation") : std::string("design rotation")) +
              "), the lever's own weight included. Statics, moments about O, positive in the applying "
              "sense σ; gravity along −y of the front view.");
  m.push_back("Lining wear: a uniform radial wear w shortens the band on the wrap by φ·w, as the "
              "release clearance c does, so that with the lining worn the lever stands turned further "
              "in the applying sense by δψ_w = φ·w/|m_A + m_B|; released, it is turned back by "
              "δψ = φ·c/|m_A + m_B| (geometry of the wrap). The band forces are those of the applied "
              "layout at all three positions (small rotations).");
  if (a.by == ApplyBy::spring) {
    m.push_back("A compression spring lengthens as the lining wears and its force falls by k·Δ: it is "
                "sized for the worn position. bandforge takes the lightest spring of the preferred wire "
                "series (d), index 4 ≤ C ≤ 12 (D in 0.5 mm steps), active coils in half turns (N_a ≥ 3), "
                "whose force at the worn position supplies M_act, whose shear stress at the released "
                "position (the most compressed in service) is within the static allowable, with "
                "overrun to closure ξ ≥ 0.15 and a free length below the buckling limit (Shigley 9th ed. "
                "§10-9). The band and the lining must also take its full force with the lining new (the "
                "checks under the applying element's full moment).");
  } else {
    m.push_back("A weight keeps its force W = m·g as the lining wears; its arm is the horizontal "
                "distance from O to where it hangs, which turns with the lever.");
  }
  m.push_back("Release actuator: it lifts the lever by δψ against the " + element + " and the lever's "
              "weight at the released position, its force perpendicular to O→A at its point A; the "
              "stroke holds the wear rotation δψ_w in reserve, so that the lever can follow the worn "
              "lining down and the brake still sets.");
  return m;
}

Table apply_statics_table(const Design& d, const Solution& s, UnitSystem u) {
  const ApplyResult& a = s.apply;
  const Layout& L = s.layout;
  Table t = value_table();
  const std::string e = d.band.model == TensionModel::thick ? "e^(fφr/r_b)" : "e^(fφ)";
  add_row(t, "Actuating moment needed M_act", qty(a.required_moment, Quantity::torque, u),
          "F·L = −P2·(" + e + "·m't + m's), the largest over the friction range: " + a.governing,
          "statics, section 4");
  add_row(t, "Net arm of the runs |m_A + m_B|", len(std::abs(L.a.arm + L.b.arm), u),
          "perpendicular arms of the runs about O", "section 3");
  const bool wear_given = d.where.count("apply.wear_allowance") > 0;
  add_row(t, "Wear allowance w", len(a.wear_allowance, u), "radial lining wear the element still covers",
          wear_given ? "design file [apply] wear_allowance"
                     : "default: half the lining thickness (common practice, no source)");
  add_row(t, "Worn rotation δψ_w", degrees(a.wear_rotation, 3), "φ·w/|m_A + m_B|",
          "geometry of the wrap, derived here");
  add_row(t, "Release rotation δψ", degrees(a.release_rotation, 3),
          "φ·c/|m_A + m_B|, c = " + len(d.band.clearance, u), "geometry of the wrap, derived here");
  add_row(t, "Lever mass m_l", qty(a.lever_mass, Quantity::mass, u),
          "plate (holes out) and grip, steel ρ = 7850 kg/m³", "generated hardware");
  add_row(t, "Lever centre of mass G", point(a.lever_centroid, u), "applied position", "");
  if (a.by == ApplyBy::weight) {
    add_row(t, "Hanging mass m", qty(a.weight_mass, Quantity::mass, u), "", "design file [apply] mass");
    // W from the core's own figures (its moment over its arm), so that nothing is recomputed.
    const double w = a.applied.arm > 0 ? a.applied.element_moment / a.applied.arm : 0.0;
    add_row(t, "Weight W", qty(w, Quantity::force, u), "m·g, g = 9.80665 m/s²",
            "standard gravity (3rd CGPM, 1901)");
    add_row(t, "Hung at P", point(a.applied.at, u), "applied position", "design file [apply] at");
  } else {
    add_row(t, "Spring acts on the lever at P", point(a.applied.at, u), "applied position",
            "design file [apply] at");
    add_row(t, "Spring seat on the frame S", point(a.seat, u), "the spring's axis runs S → P",
            "design file [apply] seat");
  }
  add_row(t, "Available moment, worn", qty(a.available_moment, Quantity::torque, u),
          "M_el + M_l at the worn position, ≥ M_act", "statics, moments about O");
  return t;
}

Table apply_positions_table(const Solution& s, UnitSystem u) {
  const ApplyResult& a = s.apply;
  const bool spring = a.by == ApplyBy::spring && a.spring.found;
  Table t;
  t.widths = {50, 21, 21, 21, 75};
  t.align = {Align::left, Align::right, Align::right, Align::right, Align::left};
  t.rows.push_back({"Lever position", "Applied", "Worn", "Released", "Formula"});
  const ApplyPosition* p[3] = {&a.applied, &a.worn, &a.released};
  auto row = [&](std::string name, std::string formula, auto value_of) {
    t.rows.push_back({std::move(name), value_of(0), value_of(1), value_of(2), std::move(formula)});
  };
  const std::string L = unit_tag(Quantity::length, u), F = unit_tag(Quantity::force, u),
                    M = unit_tag(Quantity::torque, u);
  row("Lever rotation ψ [°]", "from the applied position, ccw positive: worn σ·δψ_w, released −σ·δψ",
      [&](int i) { return sig_figs(p[i]->rotation * 180.0 / std::numbers::pi, 4); });
  if (a.by == ApplyBy::weight) {
    row("Arm of the weight a" + L, "σ·(x_O − x_P): horizontal distance, P turned with the lever",
        [&](int i) { return qty_value(p[i]->arm, Quantity::length, u); });
  } else {
    row("Arm of the spring a" + L, "σ·(P − O) × u, u = (P − S)/|P − S|: O to the spring's axis",
        [&](int i) { return qty_value(p[i]->arm, Quantity::length, u); });
  }
  if (spring) {
    const SpringResult& sp = a.spring;
    const SpringState* st[3] = {&sp.applied, &sp.worn, &sp.released};
    row("Spring length L" + L, "|P − S|, P turned with the lever",
        [&](int i) { return qty_value(st[i]->length, Quantity::length, u); });
    row("Spring deflection y" + L, "L_0 − L",
        [&](int i) { return qty_value(sp.free_length - st[i]->length, Quantity::length, u); });
    row("Spring force F" + F, "k·y", [&](int i) { return qty_value(st[i]->force, Quantity::force, u); });
    row("Shear stress τ" + unit_tag(Quantity::stress, u), "K_B·8·F·D/(π·d³)",
        [&](int i) { return qty_value(st[i]->stress, Quantity::stress, u); });
  }
  row(std::string(a.by == ApplyBy::weight ? "Weight's" : "Spring's") + " moment M_el" + M,
      a.by == ApplyBy::weight ? "W·a" : "F·a",
      [&](int i) { return qty_value(p[i]->element_moment, Quantity::torque, u); });
  row("Lever weight's moment M_l" + M,
      std::string("m_l·g·σ·(x_O − x_G), G turned with the lever; σ = ") + sense_sign(s.layout),
      [&](int i) { return qty_value(p[i]->lever_moment, Quantity::torque, u); });
  row("Applying moment M_el + M_l" + M, "worn: ≥ M_act = " + qty(a.required_moment, Quantity::torque, u),
      [&](int i) { return qty_value(p[i]->element_moment + p[i]->lever_moment, Quantity::torque, u); });
  return t;
}

std::string ends_text(SpringEnds e) {
  switch (e) {
    case SpringEnds::plain: return "plain";
    case SpringEnds::plain_ground: return "plain and ground";
    case SpringEnds::squared: return "squared, not ground";
    case SpringEnds::squared_ground: return "squared and ground";
  }
  return to_string(e);
}

Table spring_table(const Design& d, const Solution& s, UnitSystem u, Refs& refs) {
  const SpringResult& sp = s.apply.spring;
  const SpringWire* wire = find_spring_wire(sp.material);
  Table t = value_table();
  // The key goes with its source: a long single word would not fit the value column.
  add_row(t, "Wire", "", wire != nullptr ? wire->description : sp.material,
          std::string(d.where.count("apply.spring_material") > 0 ? "design file [apply]"
                                                                 : "default of [apply]") +
              " spring_material = \"" + sp.material + "\"");
  add_row(t, "Wire diameter d", len(sp.wire_diameter, u), "the lightest spring that passes",
          "preferred series " + refs.cite(kWireDiameterSource));
  add_row(t, "Mean coil diameter D", len(sp.mean_diameter, u), "in 0.5 mm steps, 4 ≤ C ≤ 12",
          "Shigley 9th ed. eq. 10-18");
  add_row(t, "Outside diameter D_o", len(sp.outer_diameter, u), "D + d", "");
  add_row(t, "Spring index C", sig_figs(sp.index, 4), "C = D/d", "Shigley 9th ed. eq. 10-1");
  add_row(t, "Bergsträsser factor K_B", sig_figs(bergstrasser(sp.index), 4),
          "(4C + 2)/(4C − 3)\nEN 13906-1: k = (C + 0.5)/(C − 0.75), the same factor",
          "Shigley 9th ed. eq. 10-5; EN 13906-1");
  if (wire != nullptr) {
    add_row(t, "Tensile strength S_ut", qty(sp.tensile_strength, Quantity::stress, u),
            "A/d^m (eq. 10-14), d in mm: A = " + sig_figs(wire->a_mpa, 4) + " MPa·mm^m, m = " +
                sig_figs(wire->m, 3),
            "Shigley 9th ed. Table 10-4 " + refs.cite(wire->strength_source));
    add_row(t, "Allowable shear stress", qty(sp.allowable, Quantity::stress, u),
            sig_figs(wire->allowable_fraction * 100, 2) + " % of S_ut, static service",
            "Shigley 9th ed. Table 10-6 " + refs.cite(wire->allowable_source));
    add_row(t, "Shear modulus G", qty(sp.shear_modulus, Quantity::stress, u), "for the wire and d",
            "Shigley 9th ed. Table 10-5 " + refs.cite(wire->modulus_source));
  }
  add_row(t, "Coils, active N_a", short_number(sp.active_coils),
          "fewest half turns that keep τ ≤ allowable when released, N_a ≥ 3", "Shigley 9th ed. eq. 10-19");
  const bool two = sp.ends == SpringEnds::squared || sp.ends == SpringEnds::squared_ground;
  add_row(t, "Coils, total N_t", short_number(sp.total_coils),
          sp.ends == SpringEnds::plain ? "N_a (plain ends)"
                                       : std::string(two ? "N_a + 2" : "N_a + 1") + ", ends " + ends_text(sp.ends),
          "Shigley 9th ed. Table 10-1");
  add_row(t, "Spring rate k", rate_text(sp.rate, u), "d⁴·G/(8·D³·N_a)", "Shigley 9th ed. eq. 10-9");
  add_row(t, "Shear stress, released τ", qty(sp.released.stress, Quantity::stress, u),
          "K_B·8·F·D/(π·d³) at the released force, ≤ the allowable", "Shigley 9th ed. eq. 10-7");
  add_row(t, "Free length L_0", len(sp.free_length, u), "L_worn + F_worn/k: the force needed when worn",
          "statics above");
  const bool ground = sp.ends == SpringEnds::plain_ground || sp.ends == SpringEnds::squared_ground;
  add_row(t, "Solid length L_s", len(sp.solid_length, u), ground ? "d·N_t" : "d·(N_t + 1)",
          "Shigley 9th ed. Table 10-1");
  add_row(t, "Overrun to closure ξ", sig_figs(sp.overrun, 3), "(L_0 − L_s)/(L_0 − L_released) − 1 ≥ 0.15",
          "Shigley 9th ed. eq. 10-20");
  add_row(t, "Buckling limit", len(sp.buckling_length, u),
          "L_0 < 2.63·D/α, α = " + short_number(sp.alpha) + " (seats " + to_string(d.apply.spring_seats) + ")",
          "Shigley 9th ed. eq. 10-13");
  add_row(t, "Wire mass", qty(sp.mass, Quantity::mass, u), "ρ·(π·d²/4)·(π·D·N_t), ρ = 7850 kg/m³", "");
  return t;
}

// One sentence a spring maker can quote from.
std::string spring_specification(const SpringResult& sp, UnitSystem u) {
  const SpringWire* wire = find_spring_wire(sp.material);
  auto at = [&](const SpringState& st) {
    return qty(st.force, Quantity::force, u) + " at " + len(st.length, u);
  };
  return "Specification: helical compression spring, " +
         (wire != nullptr ? wire->description : sp.material) + "; d = " + len(sp.wire_diameter, u) +
         ", mean Ø" + len(sp.mean_diameter, u) + " (outside Ø" + len(sp.outer_diameter, u) + "), " +
         short_number(sp.total_coils) + " total coils (" + short_number(sp.active_coils) + " active), ends " +
         ends_text(sp.ends) + "; free length " + len(sp.free_length, u) + ", solid length " +
         len(sp.solid_length, u) + ", rate " + rate_text(sp.rate, u) + "; working points " +
         at(sp.applied) + " (applied), " + at(sp.worn) + " (worn), " + at(sp.released) +
         " (released, the most compressed); static service.";
}

Table actuator_table(const Solution& s, UnitSystem u) {
  const ApplyResult& a = s.apply;
  const ActuatorNeed& act = a.actuator;
  Table t = value_table();
  add_row(t, "Actuator point A", point(act.at, u), "on the lever, applied position",
          "design file [apply] actuator_at (default: apply.at)");
  add_row(t, "Actuator arm L_a", len(act.arm, u), "|A − O|; force perpendicular to O→A", "");
  add_row(t, "Actuator lift", len(act.travel, u), "L_a·δψ: opens the clearance", "geometry of the lever");
  add_row(t, "Reserve for the wear", len(act.margin, u), "L_a·δψ_w",
          "the wear allowance; common practice, no source");
  add_row(t, "Actuator stroke", len(act.stroke, u), "lift + reserve", "");
  add_row(t, "Actuator force", qty(act.force, Quantity::force, u),
          "(M_el + M_l)/L_a at the released position = (" +
              qty_value(a.released.element_moment, Quantity::torque, u) + " + " +
              qty_value(a.released.lever_moment, Quantity::torque, u) + ") " +
              display_unit(Quantity::torque, u) + "/L_a",
          "statics, moments about O");
  return t;
}

// What bandforge adds to carry the element (src/apply.hpp ElementMount, mount_rules).
Table mount_table(const Solution& s, UnitSystem u) {
  const ApplyResult& a = s.apply;
  const ElementMount& m = a.mount;
  Table t = value_table();
  const std::string rule = "common practice, no source";
  if (a.by == ApplyBy::spring) {
    const double od = a.spring.outer_diameter;
    for (const SeatPlan* st : {&m.lever_seat, &m.frame_seat}) {
      const bool lever = st == &m.lever_seat;
      const std::string who = lever ? "Lever seat" : "Frame seat";
      add_row(t, who + " face", point(st->face, u), lever ? "apply.at" : "apply.seat", "design file [apply]");
      add_row(t, who + " Ø", len(st->diameter, u),
              "OD + 2·max(5 mm, 0.1·OD), OD = " + len(od, u), rule);
      add_row(t, who + " thickness", len(st->thickness, u),
              lever ? "least of 6/8/10/12/16/20 mm ≥ 0.1·OD, or to the lever's edge along the axis"
                    : "least of 6/8/10/12/16/20 mm ≥ 0.1·OD",
              rule);
      add_row(t, who + " spigot", "Ø" + len(st->spigot_diameter, u) + " × " + len(st->spigot_height, u),
              "ID − max(1 mm, 0.05·ID); min(2d, 0.2·L_released)", rule);
    }
  } else {
    const WeightMount& w = m.weight;
    add_row(t, "Hanger top", point(w.hang, u), "lever's lower edge on the vertical through apply.at", "geometry of the lever");
    add_row(t, "Hanger rod", "Ø" + len(w.rod_diameter, u) + " × " + len(w.rod_length, u),
            "≥ min(12 mm, lever thickness − 1 mm), m·g/(πd²/4) ≤ 60 MPa; drop + block height", rule);
    add_row(t, "Weight block", "Ø" + len(w.block_diameter, u) + " × " + len(w.block_height, u),
            "steel cylinder, height = Ø, bored for the rod; top max(20 mm, Ø/4) below the lever", rule);
    add_row(t, "Block + rod mass", qty(w.block_mass, Quantity::mass, u) + " + " + qty(w.rod_mass, Quantity::mass, u),
            "= apply.mass, steel 7850 kg/m³", rule);
  }
  if (!m.refusal.empty()) add_row(t, "Cannot be built", m.refusal, "", "");
  return t;
}

// The hoist rules of 29 CFR 1910.179(f)(2) as the checks state them; empty without hoist duty.
Table hoist_rules_table(const Design& d, const Solution& s, UnitSystem u) {
  Table t;
  t.widths = {44, 56, 70, 16};
  t.align = {Align::left, Align::left, Align::left, Align::centre};
  t.rows.push_back({"Rule", "This brake", "Source", "Result"});
  for (const Check& c : s.checks) {
    if (c.id == "self_setting") {
      t.rows.push_back({c.title, c.note, c.source, c.ok ? "pass" : "FAIL"});
    } else if (c.id == "hoist_holding") {
      const ApplyResult& a = s.apply;
      std::string how;
      if (a.present) {
        how = "T_hold = T_design·(M_el + M_l)_worn/M_act = " + qty(s.required_torque, Quantity::torque, u) +
              " × " + qty_value(a.available_moment, Quantity::torque, u) + "/" +
              qty_value(a.required_moment, Quantity::torque, u);
      } else {
        how = d.load.given == Load::Given::torque ? "T_hold = T_load·K, the design torque"
                                                  : "T_hold at the given lever force, f_min";
      }
      t.rows.push_back({c.title,
                        how + " = " + qty(c.value, Quantity::torque, u) + " ≥ 1.25·m·g·r_rope = " +
                            qty(c.limit, Quantity::torque, u),
                        c.source, c.ok ? "pass" : "FAIL"});
    }
  }
  if (t.rows.size() == 1) t.rows.clear();
  return t;
}

// A line that introduces the table after it and goes with it to the next column.
Block caption(std::string text) {
  Block b = paragraphs({std::move(text)}, false);
  b.keep_with_next = true;
  b.space_after = 1.0;
  return b;
}

void apply_blocks(std::vector<Block>& b, int& section, const Design& d, const Solution& s, UnitSystem u,
                  Refs& refs) {
  const ApplyResult& a = s.apply;
  const Table hoist = hoist_rules_table(d, s, u);
  const std::string n = std::to_string(section++) + "  ";
  if (!a.present) {
    b.push_back(heading(n + "Applying the brake: " + std::string(a.by == ApplyBy::hand ? "by hand" : to_string(a.by))));
    std::vector<std::string> lines;
    if (a.by == ApplyBy::hand) {
      lines.push_back("Applied by hand: the operator's force F at the handle H supplies the actuating "
                      "moment (section 4); nothing sets the brake by itself when the operator lets go.");
    } else {
      lines.push_back(std::string("Applied by a ") + to_string(a.by) +
                      ": a concept design has no lever coordinates to size it on.");
    }
    b.push_back(paragraphs(lines, false));
    if (!hoist.rows.empty()) {
      b.push_back(caption("Hoist rules (also in the checks):"));
      b.push_back(table_block(hoist));
    }
    return;
  }
  const bool spring = a.by == ApplyBy::spring;
  b.push_back(heading(n + (spring ? "Applying the brake: a compression spring, released by an actuator"
                                  : "Applying the brake: a weight, released by an actuator")));
  b.push_back(paragraphs(apply_method(d, s), true));
  b.push_back(table_block(apply_statics_table(d, s, u)));
  b.push_back(table_block(apply_positions_table(s, u)));
  const size_t cited = refs.lines().size();  // the inputs' sources are listed with the inputs
  if (spring) {
    if (a.spring.found) {
      b.push_back(caption("The spring (every figure for the spring maker):"));
      b.push_back(table_block(spring_table(d, s, u, refs)));
      b.push_back(paragraphs({spring_specification(a.spring, u)}, false));
    } else {
      b.push_back(paragraphs({"NO SPRING FOUND: " + a.refusal}, false));
    }
  }
  if (!spring || a.spring.found) {
    b.push_back(caption("The release actuator's requirement (the buyer chooses the product):"));
    b.push_back(table_block(actuator_table(s, u)));
  }
  if (a.mount.present) {
    b.push_back(caption(spring ? "What carries the spring (bandforge adds it; built in the STEP):"
                               : "What carries the weight (bandforge adds it; built in the STEP):"));
    b.push_back(table_block(mount_table(s, u)));
  }
  if (!hoist.rows.empty()) {
    b.push_back(caption("Hoist rules (also in the checks):"));
    b.push_back(table_block(hoist));
  }
  if (spring) {
    std::vector<std::string> sources = {std::string("Sources: ") + kShigleyFull};
    const std::vector<std::string> all = refs.lines();
    for (size_t i = cited; i < all.size(); ++i) sources.push_back(all[i]);
    b.push_back(paragraphs(sources, false));
  }
}

}  // namespace

Turn rotation_for(const Solution& s, bool a_tight) {
  // A is tight when the drum turns the way the band runs from A (REFERENCE §1.8 step 6).
  const bool ccw = (s.layout.sense > 0) == a_tight;
  return ccw ? Turn::ccw : Turn::cw;
}

std::vector<Block> calculation_blocks(const Design& d, const Solution& s,
                                      const std::vector<geom::CutListRow>& cut, UnitSystem u) {
  std::vector<Block> b;
  b.push_back(heading("1  Method"));
  b.push_back(paragraphs(method_items(d, s), true));
  Refs refs;
  b.push_back(heading("2  Inputs (design file " + std::filesystem::path(d.file).filename().string() + ")"));
  b.push_back(table_block(inputs_table(d, s, u, refs)));
  if (!refs.empty()) {
    std::vector<std::string> lines = {"Sources of the material data:"};
    for (auto& l : refs.lines()) lines.push_back(std::move(l));
    b.push_back(paragraphs(lines, false));
  }
  b.push_back(heading(s.layout.from_pins ? "3  Layout from the pins" : "3  Concept layout"));
  b.push_back(table_block(layout_table(d, s, u)));
  {
    const bool pa = s.primary_a_tight;
    b.push_back(heading(std::string("4  Forces and stresses: design ") + turn_name(rotation_for(s, pa)) +
                        " and reverse, over the friction range"));
  }
  b.push_back(table_block(forces_table(d, s, u)));
  b.push_back(heading("5  Plots"));
  b.push_back(plot_block(tension_plot(d, s, u)));
  b.push_back(plot_block(lever_plot(d, s, u)));
  b.push_back(heading(s.thermal.present ? "6  Capacity and thermal duty" : "6  Capacity"));
  b.push_back(table_block(capacity_thermal_table(d, s, u)));
  int section = 7;
  apply_blocks(b, section, d, s, u, refs);
  b.push_back(heading(std::to_string(section++) + "  Checks"));
  b.push_back(table_block(checks_table(s, u)));
  if (s.hardware.present) {
    // What bandforge added by itself, with the rules behind it (README "Generated hardware").
    std::vector<std::string> lines = hardware_summary(s.hardware, u);
    lines.push_back("Joints: the first of riveted-lap (rivet d = max(5 mm, 2t), edge 2d, pitch 3d; "
                    "common practice), riveted-compact (round-head rivet of the "
                    "DIN 660 / DIN 124 series, EN 1993-1-8 Table 3.3 least spacings) and welded-block (fillet welds at the slot mouth) that fits the run and "
                    "passes its checks. Frame plates: S235 (EN 10025-2), one stock thickness, the least "
                    "that passes bore bearing 0.90 F_y and plate bending 0.60 F_y (single plate) or "
                    "cheek net section 0.45 F_y (two cheeks) (AISC ASD 1989, from memory).");
    b.push_back(heading(std::to_string(section++) + "  Generated hardware"));
    b.push_back(paragraphs(lines, true));
  }
  {
    // Fits and tolerances (ISO 286 deviations always in mm, as the standard gives them).
    std::vector<std::string> lines;
    const auto dev = deviation_mm;
    auto describe = [&](const char* what, const fits::Fit& f, const char* why) {
      lines.push_back(std::string(what) + " " + f.designation() + ": hole " + f.hole_code + " " +
                      dev(f.hole.upper) + "/" + dev(f.hole.lower) + " mm, shaft " + f.shaft_code + " " +
                      dev(f.shaft.upper) + "/" + dev(f.shaft.lower) + " mm; clearance " +
                      dev(f.clearance_min()) + "…" + dev(f.clearance_max()) + " mm (negative: interference). " +
                      why);
    };
    if (s.hardware.present) {
      if (const auto f = fits::fit(standard::clevis_nominal(d.band.pin_diameter), fits::kPinHole, fits::kPinShaft)) {
        describe("Band-end and pivot pins", *f,
                 "A loose clearance fit for clevis joints, tolerant of paint and dirt (common practice, "
                 "no source).");
      } else {
        lines.push_back("Pins Ø" + dim_length(standard::clevis_nominal(d.band.pin_diameter), UnitSystem::si) +
                        " mm: outside the ISO 286 range bandforge carries (3–120 mm); specify the fit by hand.");
      }
      // The pins as bought (src/standard_parts.hpp): nominal, length from the grip, retention.
      for (const PinPlan& pin : s.hardware.pins) {
        const standard::PinSet& ps = pin.set;
        lines.push_back("Pin " + pin.id + ": " + ps.pin_designation() + ", " + ps.washer_designation() +
                        ", " + ps.split_designation() + "; grip " + dim_length(ps.grip, UnitSystem::si) +
                        " mm, hole l − l_e = " + dim_length(ps.hole_at, UnitSystem::si) + " mm ≥ grip + h + d₁/2 = " +
                        dim_length(ps.grip + ps.washer.h + ps.pin.d1 / 2, UnitSystem::si) + " mm, head at the " +
                        (pin.head_front ? "front" : "back") + ". " + standard::kPinSource + "; " +
                        standard::kWasherSource + "; " + standard::kSplitPinSource + ".");
      }
    }
    if (const auto f = fits::fit(d.drum.bore, fits::kBoreHole, fits::kBoreShaft)) {
      describe("Drum bore on its shaft", *f, "A transition fit for a keyed hub (common practice, no source).");
    } else {
      lines.push_back("Drum bore Ø" + dim_length(d.drum.bore, UnitSystem::si) +
                      " mm: outside the ISO 286 range bandforge carries (3–120 mm); specify the fit by hand.");
    }
    if (const auto g = fits::general_linear(d.drum.diameter, 'm')) {
      char buf[512];
      std::snprintf(buf, sizeof buf,
                    "Drum friction surface Ø%g mm: ±%.1f mm (ISO 2768-1 class m); total runout 0.1 mm to "
                    "the bore axis (common practice, no source: a surface that runs true keeps the "
                    "lining pressure even over the wrap).",
                    d.drum.diameter * 1000, *g * 1000);
      lines.push_back(buf);
    }
    lines.push_back("Limit deviations from ISO 286-1:2010 (standard tolerance grades) and ISO 286-2:2010 "
                    "(fundamental deviations), always in mm. Sizes without "
                    "their own tolerance: ISO 2768-1 class m, geometry ISO 2768-2 class K. Drum friction "
                    "surface turned to Ra 1.6 µm (usual 0.8–3.2 µm; common practice, no source).");
    b.push_back(heading(std::to_string(section++) + "  Fits and tolerances"));
    b.push_back(paragraphs(lines, true));
  }
  if (!s.warnings.empty()) {
    b.push_back(heading(std::to_string(section++) + "  Warnings"));
    b.push_back(paragraphs(s.warnings, true));
  }
  // A concept design has no parts to cut: no section.
  if (s.layout.from_pins && !cut.empty()) {
    b.push_back(heading(std::to_string(section) + "  Cut list"));
    b.push_back(cut_list_block(cut, u));
    b.push_back(paragraphs(cut_list_footnote(u), false));
  }
  return b;
}

}  // namespace bandforge::drawing
