#include "src/design_writer.hpp"

#include <cmath>
#include <cstdio>
#include <numbers>
#include <sstream>

#include "src/materials.hpp"

namespace bandforge {
namespace {

std::string num(double v) {
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.10g", v);
  return buf;
}
std::string q(double v, double scale, const char* unit) {
  std::string out;  // appended piecewise: GCC 12 warns falsely (-Wrestrict) on "literal" + string
  out.append(1, '"').append(num(v * scale)).append(1, ' ').append(unit).append(1, '"');
  return out;
}
std::string len(double m) { return q(m, 1000.0, "mm"); }
std::string point(Vec2 p) {
  std::string out;
  out.append(1, '[').append(len(p.x)).append(", ").append(len(p.y)).append(1, ']');
  return out;
}
std::string str(const std::string& s) {
  std::string out = "\"";
  for (char c : s) {
    if (c == '"' || c == '\\') out += '\\';
    out += c;
  }
  return out + "\"";
}

}  // namespace

std::string design_toml(const Design& d, const std::string& header) {
  std::ostringstream o;
  std::istringstream h(header);
  for (std::string line; std::getline(h, line);) o << (line.empty() ? "#" : "# " + line) << '\n';
  if (!header.empty()) o << '\n';

  o << "[project]\n";
  o << "title = " << str(d.project.title) << '\n';
  o << "number = " << str(d.project.number) << '\n';
  if (!d.project.revision.empty()) o << "revision = " << str(d.project.revision) << '\n';
  if (!d.project.owner.empty()) o << "owner = " << str(d.project.owner) << '\n';
  if (!d.project.creator.empty()) o << "creator = " << str(d.project.creator) << '\n';
  if (!d.project.approver.empty()) o << "approver = " << str(d.project.approver) << '\n';
  if (!d.project.date.empty()) o << "date = " << str(d.project.date) << '\n';

  o << "\n[drum]\n";
  o << "diameter = " << len(d.drum.diameter) << '\n';
  o << "width = " << len(d.drum.width) << '\n';
  o << "bore = " << len(d.drum.bore) << '\n';
  o << "rotation = \"" << to_string(d.drum.rotation) << "\"\n";
  o << "material = " << str(d.drum.material) << '\n';

  o << "\n[lining]\n";
  const Lining& li = d.lining;
  const LiningMaterial* m = li.material.empty() ? nullptr : find_lining(li.material);
  if (m != nullptr) o << "material = " << str(m->key) << '\n';
  const bool same_range = m != nullptr && li.friction_min == m->friction_min && li.friction_max == m->friction_max;
  if (!same_range) o << "friction_range = [" << num(li.friction_min) << ", " << num(li.friction_max) << "]\n";
  const bool nominal_implied = same_range ? li.friction == m->friction
                                          : li.friction == 0.5 * (li.friction_min + li.friction_max) && m != nullptr;
  if (!nominal_implied) o << "friction = " << num(li.friction) << '\n';
  if (m == nullptr || li.pressure_limit != m->pressure_limit) o << "pressure_limit = " << q(li.pressure_limit, 1e-6, "MPa") << '\n';
  if (li.temperature_limit > 0 && (m == nullptr || li.temperature_limit != m->temperature_limit))
    o << "temperature_limit = " << q(li.temperature_limit, 1.0, "°C") << '\n';
  if (li.power_limit > 0 && (m == nullptr || li.power_limit != m->power_limit))
    o << "power_limit = " << q(li.power_limit, 1e-6, "W/mm^2") << '\n';
  o << "thickness = " << len(li.thickness) << '\n';

  const Band& b = d.band;
  o << "\n[band]\n";
  o << "width = " << len(b.width) << '\n';
  o << "thickness = " << len(b.thickness) << '\n';
  o << "allowable_stress = " << q(b.allowable_stress, 1e-6, "MPa") << '\n';
  o << "sense = \"" << to_string(b.sense) << "\"\n";
  o << "end_a = { mount = \"" << to_string(b.end_a.mount) << "\", at = " << point(b.end_a.at) << " }\n";
  o << "end_b = { mount = \"" << to_string(b.end_b.mount) << "\", at = " << point(b.end_b.at) << " }\n";
  o << "pin_diameter = " << len(b.pin_diameter) << '\n';
  o << "clearance = " << len(b.clearance) << '\n';
  if (std::abs(b.pin_allowable_shear - b.allowable_stress / std::numbers::sqrt3) > 1e-6 * b.allowable_stress)
    o << "pin_allowable_shear = " << q(b.pin_allowable_shear, 1e-6, "MPa") << '\n';
  if (b.model == TensionModel::thick) o << "model = \"thick\"\n";
  static const char* const joints[] = {"auto", "riveted-lap", "riveted-compact", "welded-block"};
  if (b.end_joint != EndJointChoice::automatic)
    o << "end_joint = \"" << joints[static_cast<int>(b.end_joint)] << "\"\n";

  o << "\n[lever]\n";
  o << "pivot = " << point(d.lever.pivot) << '\n';
  o << "handle = " << point(d.lever.handle) << '\n';
  o << "width = " << len(d.lever.width) << '\n';
  o << "thickness = " << len(d.lever.thickness) << '\n';
  o << "allowable_stress = " << q(d.lever.allowable_stress, 1e-6, "MPa") << '\n';

  o << "\n[load]\n";
  if (d.load.given == Load::Given::torque) {
    o << "torque = " << q(d.load.torque, 1.0, "N*m") << '\n';
  } else {
    o << "lever_force = " << q(d.load.lever_force, 1.0, "N") << '\n';
  }
  o << "service_factor = " << num(d.load.service_factor) << '\n';

  if (d.duty.present) {
    const Duty& du = d.duty;
    o << "\n[duty]\n";
    if (du.hoist_mass > 0) {
      o << "speed = " << q(du.hoist_speed, 1.0, "m/s") << '\n';
      o << "mass = " << q(du.hoist_mass, 1.0, "kg") << '\n';
      o << "stop_distance = " << len(du.stop_distance) << '\n';
      o << "rope_radius = " << len(du.rope_radius) << '\n';
      if (du.inertia > 0) o << "inertia = " << q(du.inertia, 1.0, "kg*m^2") << '\n';
    } else {
      o << "speed = " << q(du.speed, 60.0 / (2.0 * std::numbers::pi), "rpm") << '\n';
      o << "inertia = " << q(du.inertia, 1.0, "kg*m^2") << '\n';
    }
    if (du.stops_per_hour > 0) o << "stops_per_hour = " << num(du.stops_per_hour) << '\n';
    o << "ambient = " << q(du.ambient, 1.0, "°C") << '\n';
    if (du.drive != HoistDrive::unspecified) o << "drive = \"" << to_string(du.drive) << "\"\n";
  }

  if (d.apply.by != ApplyBy::hand) {
    const Apply& ap = d.apply;
    o << "\n[apply]\n";
    o << "by = \"" << to_string(ap.by) << "\"\n";
    o << "at = " << point(ap.at) << '\n';
    if (ap.by == ApplyBy::spring) o << "seat = " << point(ap.seat) << '\n';
    if (ap.by == ApplyBy::weight) o << "mass = " << q(ap.mass, 1.0, "kg") << '\n';
    o << "wear_allowance = " << len(ap.wear_allowance) << '\n';
    o << "actuator_at = " << point(ap.actuator_at) << '\n';
    if (ap.both_rotations) o << "both_rotations = true\n";
    if (ap.by == ApplyBy::spring) {
      o << "spring_material = " << str(ap.spring_material) << '\n';
      o << "spring_ends = \"" << to_string(ap.spring_ends) << "\"\n";
      o << "spring_seats = \"" << to_string(ap.spring_seats) << "\"\n";
      if (ap.spring_max_outer_diameter > 0)
        o << "spring_max_outer_diameter = " << len(ap.spring_max_outer_diameter) << '\n';
    }
  }

  if (!d.drawing.sheet.empty() || d.drawing.scale_num > 0 || d.drawing.projection == Projection::third) {
    o << "\n[drawing]\n";
    if (d.drawing.projection == Projection::third) o << "projection = \"third\"\n";
    if (!d.drawing.sheet.empty()) o << "sheet = " << str(d.drawing.sheet) << '\n';
    if (d.drawing.scale_num > 0) o << "scale = \"" << d.drawing.scale_num << ":" << d.drawing.scale_den << "\"\n";
  }
  return o.str();
}

}  // namespace bandforge
