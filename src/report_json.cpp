// `solve --json`: one object, SI units, the unit as each key's suffix. The keys listed in
// README.md "JSON output" are a contract with design-review tools: add keys, never rename.
#include <cmath>

#include "src/report.hpp"

namespace bandforge {
namespace {

using nlohmann::json;

constexpr double kPi = 3.14159265358979323846;

json xy(const Vec2& v) { return json::array({v.x, v.y}); }

json direction_json(const DirectionResult& d) {
  return json{
      {"friction", d.friction},
      {"capstan_ratio", d.capstan_ratio},
      {"tension_tight_N", d.tension_tight},
      {"tension_slack_N", d.tension_slack},
      {"torque_Nm", d.torque},
      {"lever_force_N", d.lever_force},
      {"actuating_moment_Nm", d.actuating_moment},
      {"self_locking", d.self_locking},
      {"pressure_max_Pa", d.pressure_max},
      {"pressure_min_Pa", d.pressure_min},
      {"pressure_mean_Pa", d.pressure_mean},
      {"band_stress_Pa", d.band_stress},
      {"pin_shear_Pa", d.pin_shear},
      {"lever_moment_Nm", d.lever_moment},
      {"lever_stress_Pa", d.lever_stress},
      {"drum_load_N", xy(d.drum_load)},
      {"pivot_reaction_N", xy(d.pivot_reaction)},
  };
}

json end_json(const EndLayout& e, bool from_pins) {
  json j{{"mount", to_string(e.mount)}, {"arm_m", std::fabs(from_pins ? e.arm : e.arm_applied)},
         {"arm_applied_m", e.arm_applied}};
  if (from_pins) {
    j["pin_m"] = xy(e.pin);
    j["tangent_point_m"] = xy(e.tangent_point);
    j["tangent_angle_deg"] = e.tangent_angle * 180.0 / kPi;
    j["free_length_m"] = e.free_length;
    j["run_direction"] = xy(e.run_dir);
  } else {
    j["pin_m"] = nullptr;
    j["tangent_point_m"] = nullptr;
    j["tangent_angle_deg"] = nullptr;
    j["free_length_m"] = nullptr;
    j["run_direction"] = nullptr;
  }
  return j;
}

json direction_block(const Solution& s, int dir) {
  json j = direction_json(s.results[dir][1]);
  json by_f = json::array();
  for (const auto& r : s.results[dir]) by_f.push_back(direction_json(r));
  j["by_friction"] = by_f;  // f_min, f_nominal, f_max
  return j;
}

}  // namespace

namespace {

json point(Vec2 p) { return json::array({p.x, p.y}); }

json joint_block(const JointPlan& jp) {
  json j{{"kind", to_string(jp.kind)},
         {"chosen", jp.chosen_automatically ? "automatic" : "design file"},
         {"tension_N", jp.tension},
         {"room_m", jp.room},
         {"needs_m", jp.needs}};
  if (jp.kind == JointKind::welded_block) {
    j["block"] = {{"front_m", jp.block_front},   {"back_m", jp.block_back},
                  {"height_m", jp.block_height}, {"slot_depth_m", jp.slot_depth},
                  {"weld_leg_m", jp.weld_leg}};
  } else {
    j["rivets"] = {{"diameter_m", jp.rivet}, {"edge_m", jp.edge},     {"pitch_m", jp.pitch},
                   {"rows", jp.rows},        {"columns", jp.columns}, {"lap_m", jp.lap},
                   {"capacity_N", jp.rivet_capacity},
                   {"designation", jp.rivets.designation()}, {"length_m", jp.rivets.length},
                   {"closing", jp.rivets.closing == standard::RivetClosing::round ? "round" : "flush"}};
  }
  return j;
}

}  // namespace

// The generated hardware (src/hardware.hpp): what build makes, decided before any solid.
json hardware_json(const HardwarePlan& h) {
  if (!h.present) return nullptr;
  json brackets = json::array();
  for (const BracketPlan& b : h.brackets) {
    json holes = json::array(), outline = json::array();
    for (Vec2 p : b.holes) holes.push_back(point(p));
    for (Vec2 p : b.outline) outline.push_back(point(p));
    brackets.push_back({{"name", b.name},
                        {"pins", b.pins},
                        {"holes_m", holes},
                        {"outline_m", outline},
                        {"half_width_m", b.half_width},
                        {"thickness_m", b.thickness},
                        {"z_back_m", b.z_back},
                        {"z_front_m", b.z_front},
                        {"side", b.side == BracketSide::behind ? "behind" : "front"},
                        {"behind_drum", b.behind_drum},
                        {"loads_N", b.loads}});
  }
  json pins = json::array();
  for (const PinPlan& p : h.pins) {
    pins.push_back({{"id", p.id},
                    {"at_m", point(p.at)},
                    {"on_lever", p.on_lever},
                    {"carries_band", p.carries_band},
                    {"bracket", p.bracket},
                    {"z_back_m", p.z_back},
                    {"z_front_m", p.z_front},
                    {"grip_m", p.grip_front - p.grip_back},
                    {"head", p.head_front ? "front" : "back"},
                    {"nominal_diameter_m", p.set.pin.d},
                    {"length_m", p.set.length},
                    {"designation", p.set.pin_designation()},
                    {"washer", p.set.washer_designation()},
                    {"split_pin", p.set.split_designation()}});
  }
  const AxialPlan& a = h.axial;
  return {{"buildable", h.refusal.empty()},
          {"refusal", h.refusal.empty() ? json(nullptr) : json(h.refusal)},
          {"axial", {{"lever_back_m", a.lever_back},
                     {"lever_front_m", a.lever_front},
                     {"lever_outboard", a.lever_outboard},
                     {"gap_m", a.gap}}},
          {"brackets", brackets},
          {"pins", pins},
          {"joints", {{"a", joint_block(h.joint_a)}, {"b", joint_block(h.joint_b)}}},
          {"release_ok", h.release_ok}};
}

namespace {

// How the brake is applied (src/apply.hpp): by, the spring or the weight, the actuator.
json apply_json(const ApplyResult& a) {
  json j{{"by", to_string(a.by)}};
  if (!a.present) return j;
  json positions = json::object();
  const char* names[3] = {"applied", "worn", "released"};
  const ApplyPosition* p[3] = {&a.applied, &a.worn, &a.released};
  for (int i = 0; i < 3; ++i) {
    positions[names[i]] = {{"rotation_deg", p[i]->rotation * 180.0 / kPi},
                           {"at_m", xy(p[i]->at)},
                           {"arm_m", p[i]->arm},
                           {"element_moment_Nm", p[i]->element_moment},
                           {"lever_moment_Nm", p[i]->lever_moment}};
  }
  j["positions"] = positions;
  j["required_moment_Nm"] = a.required_moment;
  j["governing_case"] = a.governing;
  j["available_moment_Nm"] = a.available_moment;
  j["holding_torque_Nm"] = a.holding_torque;
  j["wear_allowance_m"] = a.wear_allowance;
  j["wear_rotation_deg"] = a.wear_rotation * 180.0 / kPi;
  j["lever_mass_kg"] = a.lever_mass;
  j["lever_centroid_m"] = xy(a.lever_centroid);
  if (a.by == ApplyBy::weight) {
    j["weight"] = {{"mass_kg", a.weight_mass}, {"at_m", xy(a.applied.at)}};
  }
  if (a.by == ApplyBy::spring) {
    const SpringResult& sp = a.spring;
    if (sp.found) {
      j["spring"] = {{"material", sp.material},
                     {"wire_diameter_m", sp.wire_diameter},
                     {"mean_diameter_m", sp.mean_diameter},
                     {"outer_diameter_m", sp.outer_diameter},
                     {"index", sp.index},
                     {"active_coils", sp.active_coils},
                     {"total_coils", sp.total_coils},
                     {"ends", to_string(sp.ends)},
                     {"free_length_m", sp.free_length},
                     {"solid_length_m", sp.solid_length},
                     {"rate_N_per_m", sp.rate},
                     {"force_applied_N", sp.applied.force},
                     {"force_worn_N", sp.worn.force},
                     {"force_released_N", sp.released.force},
                     {"length_applied_m", sp.applied.length},
                     {"length_worn_m", sp.worn.length},
                     {"length_released_m", sp.released.length},
                     {"stress_applied_Pa", sp.applied.stress},
                     {"stress_worn_Pa", sp.worn.stress},
                     {"stress_released_Pa", sp.released.stress},
                     {"tensile_strength_Pa", sp.tensile_strength},
                     {"allowable_stress_Pa", sp.allowable},
                     {"shear_modulus_Pa", sp.shear_modulus},
                     {"overrun_to_closure", sp.overrun},
                     {"buckling_free_length_m", sp.buckling_length},
                     {"mass_kg", sp.mass},
                     {"at_m", xy(a.applied.at)},
                     {"seat_m", xy(a.seat)}};
    } else {
      j["spring"] = nullptr;
    }
    j["refusal"] = a.refusal.empty() ? json(nullptr) : json(a.refusal);
  }
  const ActuatorNeed& act = a.actuator;
  j["actuator"] = {{"stroke_m", act.stroke}, {"force_N", act.force},   {"at_m", xy(act.at)},
                   {"arm_m", act.arm},       {"travel_m", act.travel}, {"margin_m", act.margin}};
  // What bandforge adds to carry the element (src/apply.hpp ElementMount).
  const ElementMount& mt = a.mount;
  if (mt.present) {
    json m;
    auto seat = [&](const SeatPlan& st) {
      return json{{"face_m", xy(st.face)},          {"normal", xy(st.normal)},
                  {"diameter_m", st.diameter},      {"thickness_m", st.thickness},
                  {"spigot_diameter_m", st.spigot_diameter}, {"spigot_height_m", st.spigot_height}};
    };
    if (a.by == ApplyBy::spring) {
      m["lever_seat"] = seat(mt.lever_seat);
      m["frame_seat"] = seat(mt.frame_seat);
    } else {
      const WeightMount& w = mt.weight;
      m["weight"] = {{"hang_m", xy(w.hang)},           {"rod_diameter_m", w.rod_diameter},
                     {"rod_length_m", w.rod_length},   {"drop_m", w.drop},
                     {"block_diameter_m", w.block_diameter}, {"block_height_m", w.block_height},
                     {"block_mass_kg", w.block_mass},  {"rod_mass_kg", w.rod_mass}};
    }
    m["refusal"] = mt.refusal.empty() ? json(nullptr) : json(mt.refusal);
    j["mount"] = m;
  }
  return j;
}

}  // namespace

nlohmann::json json_report(const Design& design, const Solution& s) {
  const Layout& L = s.layout;
  json j;
  j["title"] = design.project.title;
  j["number"] = design.project.number;
  j["revision"] = design.project.revision;
  j["kind"] = to_string(L.kind);
  j["tension_model"] = design.band.model == TensionModel::thick ? "thick" : "thin";
  j["wrap_angle_deg"] = L.wrap * 180.0 / kPi;
  j["wrap_angle_rad"] = L.wrap;
  j["capstan_ratio"] = s.nominal(s.primary_a_tight).capstan_ratio;
  j["band_length_m"] = L.from_pins ? json(L.band_length) : json(nullptr);
  j["self_lock_friction"] = s.self_lock_friction ? json(*s.self_lock_friction) : json(nullptr);
  j["friction"] = {{"min", design.lining.friction_min},
                   {"nominal", design.lining.friction},
                   {"max", design.lining.friction_max}};
  j["drum_radius_m"] = L.r;
  j["band_radius_m"] = L.r_band;
  j["handle_arm_m"] = L.handle_arm;
  j["apply_sense"] = L.apply_sense > 0 ? "ccw" : "cw";
  j["ends"] = {{"a", end_json(L.a, L.from_pins)}, {"b", end_json(L.b, L.from_pins)}};
  j["primary"] = s.primary_a_tight ? "a_tight" : "b_tight";
  j["drum_rotation"] = to_string(design.drum.rotation);
  if (design.load.given == Load::Given::torque) {
    j["given"] = "torque";
    j["required_torque_Nm"] = s.required_torque;
  } else {
    j["given"] = "lever_force";
    j["given_lever_force_N"] = s.given_force;
  }
  j["directions"] = {{"a_tight", direction_block(s, 0)}, {"b_tight", direction_block(s, 1)}};
  j["capacity"] = {{"friction", s.capacity.friction},
                   {"torque_band_Nm", s.capacity.torque_band},
                   {"torque_pressure_Nm", s.capacity.torque_pressure},
                   {"torque_Nm", s.capacity.torque}};
  if (L.from_pins) {
    j["release"] = {{"lever_rotation_deg", L.release_rotation * 180.0 / kPi},
                    {"handle_travel_m", L.handle_travel}};
  } else {
    j["release"] = nullptr;
  }
  if (s.thermal.present) {
    const Thermal& t = s.thermal;
    j["thermal"] = {{"energy_per_stop_J", t.energy},
                    {"stop_time_s", t.stop_time},
                    {"rim_mass_kg", t.rim_mass},
                    {"temperature_rise_K", t.temperature_rise},
                    {"peak_temperature_C", t.peak_temperature},
                    {"lining_area_m2", t.lining_area},
                    {"power_density_mean_W_m2", t.power_density_mean},
                    {"power_density_peak_W_m2", t.power_density_peak},
                    {"mean_power_W", t.mean_power},
                    {"hoist_torque_Nm", t.hoist_torque}};
  } else {
    j["thermal"] = nullptr;
  }
  j["hardware"] = hardware_json(s.hardware);
  j["apply"] = apply_json(s.apply);
  json checks = json::array();
  for (const Check& c : s.checks) {
    checks.push_back({{"id", c.id},
                      {"title", c.title},
                      {"value", c.value},
                      {"limit", c.limit},
                      {"unit", c.unit},
                      {"kind", c.upper ? "max" : "min"},
                      {"ok", c.ok},
                      {"source", c.source},
                      {"governing_case", c.note}});
  }
  j["checks"] = checks;
  j["warnings"] = s.warnings;
  j["caution"] =
      "Design aid only. A brake holds loads over people: check these results against the "
      "applicable codes and have them approved by a licensed engineer.";
  return j;
}

}  // namespace bandforge
