#include "drawing/page1_tables.hpp"

#include "src/fits.hpp"
#include "src/standard_parts.hpp"

#include "drawing/format.hpp"

namespace bandforge::drawing {

const char* turn_word(Turn t) { return t == Turn::cw ? "CW" : "CCW"; }

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
  t.rows.push_back({"Item", "Name", "Qty", "Material or standard part", "Mass each"});
  int item = 0;
  for (const geom::PartInfo& p : model.parts()) {
    // Bought parts by their standard designation (ISO 2341, ISO 8738, ISO 1234).
    t.rows.push_back({std::to_string(++item), p.name, std::to_string(p.instance_names.size()),
                      p.designation.empty() ? p.material : p.designation,
                      qty(p.mass, Quantity::mass, u, 3)});
  }
  return t;
}

std::vector<std::string> general_notes(const Design& d, const Solution& s, UnitSystem u) {
  std::vector<std::string> n;
  n.push_back(std::string("Dimensions in ") + (u == UnitSystem::si ? "mm" : "inches") +
              " from the drum centre; ( ) = reference dimension computed from the pin layout.");
  if (s.hardware.present) {
    const HardwarePlan& h = s.hardware;
    auto joint = [](const JointPlan& j) {
      return std::string(to_string(j.kind)) + (j.chosen_automatically ? " (automatic)" : "");
    };
    n.push_back("Band ends: A " + joint(h.joint_a) + ", B " + joint(h.joint_b) +
                "; frame plates " + dim_length(h.brackets.empty() ? 0 : h.brackets[0].thickness, u) +
                " thick; sizes and checks on the calculation sheet.");
  }
  // Fits (ISO 286) and general tolerances; the limit deviations are on the calculation sheet.
  {
    std::string note = "Fits ISO 286: ";
    const auto pin = fits::fit(standard::clevis_nominal(d.band.pin_diameter), fits::kPinHole, fits::kPinShaft);
    const auto bore = fits::fit(d.drum.bore, fits::kBoreHole, fits::kBoreShaft);
    if (s.hardware.present && pin) note += "pins " + pin->designation() + ", ";
    if (bore) note += "drum bore " + bore->designation() + ", ";
    n.push_back((pin || bore ? note + "deviations on the calculation sheet. " : std::string()) +
                "General tolerances ISO 2768-mK; friction surface Ra 1.6 µm.");
  }
  if (s.hardware.release_ok) {
    n.push_back("Applied position shown; lever released (radial clearance " +
                dim_length(d.band.clearance, u) + ") as a phantom line.");
  } else {
    n.push_back("Applied position shown; the released position is not drawn: it fails the check "
                "release_clearance (calculation sheet).");
  }
  return n;
}

}  // namespace bandforge::drawing
