#include "src/design_reader.hpp"

#include <toml++/toml.h>

#include <algorithm>
#include <array>
#include <cmath>
#include <cstdio>
#include <initializer_list>
#include <numbers>
#include <optional>
#include <vector>

#include "src/errors.hpp"
#include "src/materials.hpp"
#include "src/spring.hpp"
#include "src/toml_schema.hpp"
#include "src/units.hpp"

namespace bandforge {
namespace {

// A design file is a page of text; anything far larger is something else given by mistake.
constexpr std::size_t kMaxFileBytes = 1 << 20;
constexpr double kDefaultClearance = 0.0015;  // m; common practice, no source
// [apply] wear_allowance when not given: half the lining thickness (common practice, no source:
// a riveted lining is worn out well before the rivet heads reach the drum).
constexpr double kDefaultWearFraction = 0.5;

using schema::in_quotes;
using schema::join;
using schema::join_quoted;
using schema::nearest;
using schema::Section;

/// The design schema on the shared machinery (src/toml_schema.hpp).
class DesignReader : public schema::Reader {
 public:
  DesignReader(std::string_view text, std::string name) : schema::Reader(text, name) {
    d_.file = std::move(name);
  }

  Design read() {
    const toml::table root = parse_root("bandforge design file");
    read_root(root);
    d_.where = std::move(where_);
    return std::move(d_);
  }

 private:
  Design d_;

  // ---- the sections ----------------------------------------------------------------------

  void read_root(const toml::table& root) {
    static const std::vector<std::string> kSections = {
        "project", "drum", "lining", "band", "lever", "load", "duty", "concept", "drawing",
        "apply"};
    check_sections(root, kSections, "[project] or [drum]");

    const Section project = section(root, "project");
    const Section drum = section(root, "drum");
    const Section lining = section(root, "lining");
    const Section band = section(root, "band");
    const Section lever = section(root, "lever");
    const Section load = section(root, "load");
    const Section duty = section(root, "duty");
    const Section concept_sec = section(root, "concept");
    const Section drawing = section(root, "drawing");
    const Section apply = section(root, "apply");
    const bool is_concept = static_cast<bool>(concept_sec);

    if (!project) missing_section("project", "it gives at least the title, e.g. title = \"Hoist brake\"");
    if (!drum) missing_section("drum", "it gives the drum diameter, width, bore and rotation");
    if (!lining) missing_section("lining", "it gives the lining material (or friction) and thickness");
    if (!band) missing_section("band", "it gives the steel band's width, thickness and ends");
    if (!lever && !is_concept) {
      missing_section("lever", "it gives the pivot and handle points (or describe the arms in a "
                      "[concept] section)");
    }
    if (!load) missing_section("load", "it gives the torque needed or the lever force available");

    read_project(project, d_.project);
    read_drum(drum);
    read_lining(lining, d_.lining);
    read_band(band, is_concept);
    read_lever(lever, is_concept);
    read_load(load);
    if (duty) read_duty(duty, d_.duty);
    if (concept_sec) read_concept(concept_sec);
    if (drawing) read_drawing(drawing);
    read_apply(apply, is_concept);
  }

  /// [apply]: what applies the brake (REFERENCE §8). Absent: by hand, today's behaviour.
  void read_apply(const Section& s, bool is_concept) {
    Apply& ap = d_.apply;
    ap.at = d_.lever.handle;
    ap.actuator_at = ap.at;
    ap.wear_allowance = kDefaultWearFraction * d_.lining.thickness;
    if (!s) return;
    check_keys(s, {"by", "at", "seat", "mass", "wear_allowance", "actuator_at", "both_rotations",
                   "spring_material", "spring_ends", "spring_seats", "spring_max_outer_diameter"});
    if (auto by = choice(s, "by", {"hand", "weight", "spring"})) {
      constexpr ApplyBy kinds[] = {ApplyBy::hand, ApplyBy::weight, ApplyBy::spring};
      ap.by = kinds[*by];
    }
    // Keys that belong to another way of applying the brake.
    static const char* const kWeightKeys[] = {"mass"};
    static const char* const kSpringKeys[] = {"seat", "spring_material", "spring_ends",
                                              "spring_seats", "spring_max_outer_diameter"};
    const std::string by_text = in_quotes(to_string(ap.by));
    if (ap.by == ApplyBy::hand) {
      for (auto&& [k, v] : *s.table) {
        if (k.str() == "by") continue;
        bad_value(s, k.str(),
                  std::string(k.str()) + " describes a weight or a spring, but the brake is applied by " +
                      "hand (by = " + by_text + ", the default): give by = \"weight\" or \"spring\", "
                      "or remove " + std::string(k.str()));
      }
      return;
    }
    for (const char* key : kSpringKeys) {
      if (ap.by == ApplyBy::weight && node(s, key) != nullptr) {
        bad_value(s, key, std::string(key) + " belongs to a spring (by = \"spring\"); a weight " +
                          "(by = " + by_text + ") takes at, mass, wear_allowance, actuator_at and " +
                          "both_rotations");
      }
    }
    for (const char* key : kWeightKeys) {
      if (ap.by == ApplyBy::spring && node(s, key) != nullptr) {
        bad_value(s, key, std::string(key) + " belongs to a weight (by = \"weight\"); a spring " +
                          "(by = " + by_text + ") takes at, seat, wear_allowance, actuator_at, " +
                          "both_rotations and the spring_ keys");
      }
    }
    if (is_concept) {
      bad_value(s, "by", "a concept design has no lever coordinates to hang a weight or seat a "
                         "spring on: remove [apply] (by hand), or describe the pin layout");
    }
    if (d_.load.given != Load::Given::torque) {
      bad_value(s, "by", "a weight or a spring is sized for the torque the brake must hold: give "
                         "[load] torque = \"...N*m\" instead of lever_force");
    }
    const Vec2 pivot = d_.lever.pivot;
    auto at_pivot = [&](Vec2 p) { return std::hypot(p.x - pivot.x, p.y - pivot.y) < 1e-6; };
    if (auto at = point(s, "at")) {
      if (at_pivot(*at)) {
        bad_value(s, "at", "the point is at lever.pivot and has no arm: give a point on the lever away "
                           "from the pivot (default: lever.handle)");
      }
      ap.at = *at;
    }
    ap.actuator_at = ap.at;
    if (auto act = point(s, "actuator_at")) {
      if (at_pivot(*act)) {
        bad_value(s, "actuator_at", "the release actuator at lever.pivot has no arm: give a point on "
                                    "the lever away from the pivot (default: apply.at)");
      }
      ap.actuator_at = *act;
    }
    if (ap.by == ApplyBy::weight) {
      ap.mass = positive(s, "mass", Quantity::mass, "the mass of the weight hung at apply.at");
    } else {
      const auto seat = point(s, "seat");
      if (!seat) {
        missing(s, "seat", "a spring needs its other end, on the frame, e.g. seat = [\"700 mm\", "
                           "\"-480 mm\"] (the spring's axis runs from at to seat)");
      }
      if (std::hypot(seat->x - ap.at.x, seat->y - ap.at.y) < 1e-6) {
        bad_value(s, "seat", "the seat is at apply.at: the spring needs a length between its two "
                             "ends; put the seat on the frame away from apply.at");
      }
      ap.seat = *seat;
    }
    if (auto w = quantity(s, "wear_allowance", Quantity::length)) {
      if (*w < 0.0 || *w > d_.lining.thickness) {
        bad_value(s, "wear_allowance",
                  "the radial wear the applying element must cover lies between \"0 mm\" and the "
                  "lining thickness (" + format_quantity(d_.lining.thickness, Quantity::length, UnitSystem::si) +
                  "); default half the thickness");
      }
      ap.wear_allowance = *w;
    }
    if (const toml::node* n = node(s, "both_rotations")) {
      const auto* b = n->as_boolean();
      if (b == nullptr) {
        bad_value(s, "both_rotations", "expected true (size for the worse drum rotation: the load "
                                       "can turn either way) or false (the design rotation only)");
      }
      ap.both_rotations = b->get();
    }
    if (auto m = string(s, "spring_material")) {
      if (find_spring_wire(*m) == nullptr) {
        std::vector<std::string> keys, quoted;
        for (const auto& w : spring_wires()) {
          keys.push_back(w.key);
          quoted.push_back(in_quotes(w.key));
        }
        const std::string suggestion = nearest(*m, keys);
        bad_value(s, "spring_material",
                  "unknown spring wire" +
                      (suggestion.empty() ? std::string() : "; did you mean " + in_quotes(suggestion) + "?") +
                      "; valid: " + join(quoted) + " (Shigley 9th ed. Table 10-4)");
      }
      ap.spring_material = *m;
    }
    if (auto e = choice(s, "spring_ends", {"plain", "plain-ground", "squared", "squared-ground"})) {
      constexpr SpringEnds ends[] = {SpringEnds::plain, SpringEnds::plain_ground,
                                     SpringEnds::squared, SpringEnds::squared_ground};
      ap.spring_ends = ends[*e];
    }
    if (auto e = choice(s, "spring_seats", {"flat-flat", "flat-pivoted", "pivoted-pivoted"})) {
      constexpr SpringSeats seats[] = {SpringSeats::flat_flat, SpringSeats::flat_pivoted,
                                       SpringSeats::pivoted_pivoted};
      ap.spring_seats = seats[*e];
    }
    if (auto od = quantity(s, "spring_max_outer_diameter", Quantity::length)) {
      must_be_positive(s, "spring_max_outer_diameter", *od, Quantity::length);
      ap.spring_max_outer_diameter = *od;
    }
  }


  void read_drum(const Section& s) {
    check_keys(s, {"diameter", "width", "bore", "rotation", "material"});
    Drum& dr = d_.drum;
    dr.diameter = positive(s, "diameter", Quantity::length, "the friction-surface diameter");
    dr.width = positive(s, "width", Quantity::length, "the face width of the rim");
    dr.bore = positive(s, "bore", Quantity::length, "the shaft bore");
    if (dr.bore >= dr.diameter / 2) {
      bad_value(s, "bore", "the bore must be smaller than half the drum diameter (" +
                format_quantity(dr.diameter / 2, Quantity::length, UnitSystem::si) +
                ") to leave a hub and a rim");
    }
    dr.rotation = turn(s, "rotation", "the load's rotation to be braked, seen from the front: "
                                      "rotation = \"cw\" or \"ccw\"");
    read_drum_material(s, dr);
  }


  BandEnd read_end(const Section& band, std::string_view key) {
    const std::string example =
        std::string("{ mount = \"lever\", at = [\"60 mm\", \"-300 mm\"] }");
    const Section s = subtable(band, key, example);
    if (!s) missing(band, key, "give " + std::string(key) + " = " + example);
    check_keys(s, {"mount", "at"});
    BandEnd end;
    const auto mount = choice(s, "mount", {"lever", "frame"});
    if (!mount) missing(s, "mount", "where the end is pinned: mount = \"lever\" or \"frame\"");
    end.mount = *mount == 0 ? Mount::lever : Mount::frame;
    const auto at = point(s, "at");
    if (!at) missing(s, "at", "the pin centre, e.g. at = [\"60 mm\", \"-300 mm\"]");
    end.at = *at;
    return end;
  }

  void read_band(const Section& s, bool is_concept) {
    check_keys(s, {"width", "thickness", "allowable_stress", "sense", "end_a", "end_b",
                   "pin_diameter", "clearance", "pin_allowable_shear", "model", "end_joint"});
    Band& b = d_.band;
    b.width = positive(s, "width", Quantity::length, "the steel band width");
    if (b.width > d_.drum.width) {
      bad_value(s, "width", "the band is wider than the drum face (" +
                format_quantity(d_.drum.width, Quantity::length, UnitSystem::si) +
                "); the band width must not exceed drum.width");
    }
    b.thickness = positive(s, "thickness", Quantity::length, "the steel band thickness");
    b.allowable_stress = positive(s, "allowable_stress", Quantity::stress,
                                  "the allowable tensile stress of the band");
    b.sense = turn(s, "sense", "the way the band runs from end A round the drum to end B: "
                               "sense = \"cw\" or \"ccw\"");

    if (is_concept) {
      for (const char* key : {"end_a", "end_b"}) {
        if (node(s, key) != nullptr) {
          bad_value(s, key, "a concept design has no pin coordinates: remove " + std::string(key) +
                    ", or remove the [concept] section to describe the pin layout");
        }
      }
    } else {
      b.end_a = read_end(s, "end_a");
      b.end_b = read_end(s, "end_b");
      if (b.end_a.mount == Mount::frame && b.end_b.mount == Mount::frame) {
        const toml::node* n = s.table->get("end_b")->as_table()->get("mount");
        fail(pos(*n), "band.end_b.mount", written(*n),
             "at least one band end must be on the lever (both ends are on the frame, so the "
             "lever cannot tighten the band)");
      }
      if (std::hypot(b.end_a.at.x - b.end_b.at.x, b.end_a.at.y - b.end_b.at.y) < 1e-9) {
        const toml::node* n = s.table->get("end_b")->as_table()->get("at");
        fail(pos(*n), "band.end_b.at", written(*n),
             "end_b is at the same point as end_a; the two pins need distinct centres");
      }
    }

    if (auto pin = quantity(s, "pin_diameter", Quantity::length)) {
      must_be_positive(s, "pin_diameter", *pin, Quantity::length);
      b.pin_diameter = *pin;
    } else if (!is_concept) {
      missing(s, "pin_diameter", "the band-end and pivot pin diameter");
    }
    b.clearance = kDefaultClearance;
    if (auto c = quantity(s, "clearance", Quantity::length)) {
      if (*c < 0.0) {
        bad_value(s, "clearance",
                  "the radial release clearance must not be negative, e.g. \"1.5 mm\"");
      }
      b.clearance = *c;
    }
    // Distortion-energy relation between shear and tensile allowables.
    b.pin_allowable_shear = b.allowable_stress / std::numbers::sqrt3;
    if (auto tau = quantity(s, "pin_allowable_shear", Quantity::stress)) {
      must_be_positive(s, "pin_allowable_shear", *tau, Quantity::stress);
      b.pin_allowable_shear = *tau;
    }
    if (auto model = choice(s, "model", {"thin", "thick"})) {
      b.model = *model == 0 ? TensionModel::thin : TensionModel::thick;
    }
    if (auto joint = choice(s, "end_joint", {"auto", "riveted-lap", "riveted-compact", "welded-block"})) {
      constexpr EndJointChoice kinds[] = {EndJointChoice::automatic, EndJointChoice::riveted_lap,
                                          EndJointChoice::riveted_compact,
                                          EndJointChoice::welded_block};
      b.end_joint = kinds[*joint];
    }
  }

  void read_lever(const Section& s, bool is_concept) {
    if (!s) return;  // only allowed for a concept design (checked in read_root)
    check_keys(s, {"pivot", "handle", "width", "thickness", "allowable_stress"});
    Lever& l = d_.lever;
    if (is_concept) {
      for (const char* key : {"pivot", "handle"}) {
        if (node(s, key) != nullptr) {
          bad_value(s, key, "a concept design has no pin coordinates: remove " + std::string(key) +
                    ", or remove the [concept] section to describe the pin layout");
        }
      }
      // The lever section is optional here, but its bending check needs all three sizes.
      const bool any = s.table->contains("width") || s.table->contains("thickness") ||
                       s.table->contains("allowable_stress");
      if (!any) return;
    } else {
      const auto pivot = point(s, "pivot");
      if (!pivot) missing(s, "pivot", "the lever pivot centre, e.g. pivot = [\"-110 mm\", \"-300 mm\"]");
      const auto handle = point(s, "handle");
      if (!handle) {
        missing(s, "handle", "where the operator's force acts, e.g. handle = [\"700 mm\", \"-300 mm\"]");
      }
      l.pivot = *pivot;
      l.handle = *handle;
      if (std::hypot(l.handle.x - l.pivot.x, l.handle.y - l.pivot.y) < 1e-6) {
        bad_value(s, "handle",
                  "the handle is at the pivot, so the operator's force has no arm; put the handle "
                  "at the far end of the lever");
      }
    }
    l.width = positive(s, "width", Quantity::length, "the lever plate width (in the view plane)");
    l.thickness = positive(s, "thickness", Quantity::length,
                           "the lever plate thickness (along the drum axis)");
    l.allowable_stress = positive(s, "allowable_stress", Quantity::stress,
                                  "the allowable bending stress of the lever");
  }

  void read_load(const Section& s) {
    check_keys(s, {"torque", "lever_force", "service_factor"});
    Load& ld = d_.load;
    const auto torque = quantity(s, "torque", Quantity::torque);
    const auto force = quantity(s, "lever_force", Quantity::force);
    if (torque && force) {
      bad_value(s, "lever_force",
                "give either torque (solve the lever force) or lever_force (solve the torque), not both");
    }
    if (!torque && !force) {
      fail(s.pos, "load", "",
           "give either torque = \"400 N*m\" (the braking torque needed) or lever_force = "
           "\"200 N\" (the force the operator can apply)");
    }
    if (torque) {
      must_be_positive(s, "torque", *torque, Quantity::torque);
      ld.given = Load::Given::torque;
      ld.torque = *torque;
    } else {
      must_be_positive(s, "lever_force", *force, Quantity::force);
      ld.given = Load::Given::lever_force;
      ld.lever_force = *force;
    }
    if (auto sf = number(s, "service_factor", "service_factor = 1.25")) {
      if (!(*sf > 0.0)) {
        bad_value(s, "service_factor", "the service factor must be greater than zero, e.g. 1.25");
      }
      ld.service_factor = *sf;
    }
  }


  void read_concept(const Section& s) {
    check_keys(s, {"kind", "wrap", "handle_arm", "arm_a", "arm_b"});
    Concept& c = d_.concept_arms;
    c.present = true;
    const auto kind = choice(s, "kind", {"simple", "differential", "summing"});
    if (!kind) missing(s, "kind", "kind = \"simple\", \"differential\" or \"summing\"");
    c.kind = *kind == 0 ? BrakeKind::simple
                        : (*kind == 1 ? BrakeKind::differential : BrakeKind::summing);
    c.wrap = positive(s, "wrap", Quantity::angle, "the wrap angle");
    if (c.wrap >= 2.0 * std::numbers::pi) {
      bad_value(s, "wrap", "the wrap angle must be less than 360°, e.g. \"270°\"");
    }
    c.handle_arm = positive(s, "handle_arm", Quantity::length,
                            "the perpendicular arm of the operator's force about the pivot");
    c.arm_b = positive(s, "arm_b", Quantity::length,
                       "the perpendicular arm of end B about the pivot");
    if (c.kind == BrakeKind::simple) {
      if (auto a = quantity(s, "arm_a", Quantity::length); a && *a != 0.0) {
        bad_value(s, "arm_a",
                  "in a simple brake end A is anchored at the pivot: arm_a must be \"0 mm\" or left "
                  "out (use kind = \"differential\" or \"summing\" for two arms)");
      }
      c.arm_a = 0.0;
      d_.band.end_a.mount = Mount::frame;
      d_.band.end_b.mount = Mount::lever;
    } else {
      c.arm_a = positive(s, "arm_a", Quantity::length,
                         "the perpendicular arm of end A about the pivot");
      d_.band.end_a.mount = Mount::lever;
      d_.band.end_b.mount = Mount::lever;
    }
  }

  void read_drawing(const Section& s) {
    check_keys(s, {"sheet", "scale", "projection"});
    DrawingOptions& dw = d_.drawing;
    if (auto proj = choice(s, "projection", {"first", "third"})) {
      dw.projection = *proj == 0 ? Projection::first : Projection::third;
    }
    if (auto sheet = choice(s, "sheet", {"A2", "A3", "A4"})) {
      dw.sheet = std::array<const char*, 3>{"A2", "A3", "A4"}[*sheet];
    }
    if (const toml::node* n = node(s, "scale")) {
      // ISO 5455 (REFERENCE.md §5.4).
      static constexpr std::array<std::pair<int, int>, 18> kIso5455{{
          {50, 1}, {20, 1}, {10, 1}, {5, 1}, {2, 1}, {1, 1}, {1, 2}, {1, 5}, {1, 10}, {1, 20},
          {1, 50}, {1, 100}, {1, 200}, {1, 500}, {1, 1000}, {1, 2000}, {1, 5000}, {1, 10000}}};
      const auto* str = n->as_string();
      int num = 0, den = 0;
      bool ok = false;
      if (str != nullptr) {
        const std::string& t = str->get();
        const std::size_t colon = t.find(':');
        if (colon != std::string::npos && colon > 0 && colon + 1 < t.size() && t.size() < 16) {
          const auto digits = [](std::string_view v) {
            return std::all_of(v.begin(), v.end(), [](char c) { return c >= '0' && c <= '9'; });
          };
          const std::string_view a(t.data(), colon), b(t.data() + colon + 1, t.size() - colon - 1);
          if (digits(a) && digits(b)) {
            num = std::stoi(std::string(a));
            den = std::stoi(std::string(b));
            ok = std::find(kIso5455.begin(), kIso5455.end(), std::pair{num, den}) !=
                 kIso5455.end();
          }
        }
      }
      if (!ok) {
        fail(pos(*n), "drawing.scale", written(*n),
             "expected an ISO 5455 scale: \"1:1\", \"1:2\", \"1:5\", \"1:10\", \"1:20\", "
             "\"1:50\", \"1:100\" ... \"1:10000\" or \"2:1\", \"5:1\", \"10:1\", \"20:1\", "
             "\"50:1\"; leave scale out to choose it automatically");
      }
      dw.scale_num = num;
      dw.scale_den = den;
    }
  }
};

}  // namespace

Design read_design_text(std::string_view text, const std::string& name) {
  if (text.size() > kMaxFileBytes) {
    throw DesignError(name, 0, 0, "", "",
                      "not a bandforge design file: larger than " +
                          std::to_string(kMaxFileBytes / 1024) + " KiB");
  }
  return DesignReader(text, name).read();
}

Design read_design_file(const std::string& path) {
  return read_design_text(schema::read_source(path, "design file", kMaxFileBytes), design_display_name(path));
}

std::string starter_design() {
  return R"(# bandforge design file: one band brake. Edit the values, then run
#   bandforge solve this-file.toml
# Every size is a string with its unit ("250 mm", "10 in", "120 N*m", "55 MPa", "270°"); only
# plain ratios (friction, service_factor, stops_per_hour) are bare numbers.
# Front view: x right, y up, drum centre at the origin, drum axis toward the viewer.
# This starter describes an invented example: the holding brake of a conveyor take-up drum.

[project]                      # title-block data (ISO 7200); only title is required
title = "Conveyor take-up drum brake"  # drawing title
number = "NEW-BRAKE-1"         # identification number, also the output file name (letters, digits, - _ .)
revision = "0"                 # revision index
owner = "Your company"         # legal owner of the drawing
creator = "Your name"          # who drew it
approver = ""                  # who approved it
date = "2026-01-15"            # YYYY-MM-DD

[drum]
diameter = "250 mm"            # friction-surface diameter (a length: mm, cm, m, in, ft)
width = "60 mm"                # face width of the rim
bore = "35 mm"                 # shaft bore, less than half the diameter
rotation = "ccw"               # the load's rotation to be braked, seen from the front: "cw" or "ccw"
material = "steel"             # "cast-iron" or "steel" (density and specific heat; `bandforge materials`)

[lining]
material = "molded"            # "woven", "molded", "sintered", "cork", "wood" or "iron" (published table)
# friction = 0.3               # optional: nominal friction, a bare number between 0 and 1
# friction_range = [0.25, 0.4] # optional: lowest and highest credible friction, bare numbers
# pressure_limit = "0.7 MPa"   # optional: allowable lining pressure (Pa, kPa, MPa, psi)
# temperature_limit = "200 °C" # optional: maximum bulk temperature (°C, K, °F)
# power_limit = "0.5 W/mm^2"   # optional: power per lining area (W/mm^2, W/in^2)
thickness = "4 mm"             # radial lining thickness; "0 mm" for a bare steel band

[band]
width = "50 mm"                # steel band width (the lining has the same width), at most the drum width
thickness = "2 mm"             # steel band thickness
allowable_stress = "55 MPa"    # allowable tensile stress, gross section (Pa, kPa, MPa, psi)
sense = "ccw"                  # the way the band runs from end A round the drum to end B: "cw" or "ccw"
end_a = { mount = "frame", at = ["45 mm", "-190 mm"] }   # mount "lever" or "frame"; at = pin centre [x, y]
end_b = { mount = "lever", at = ["-45 mm", "-190 mm"] }  # at least one end must be on the lever
pin_diameter = "12 mm"         # band-end and pivot pin diameter
clearance = "1.5 mm"           # radial clearance when released (default 1.5 mm)
# pin_allowable_shear = "30 MPa"  # optional; default allowable_stress/√3
# model = "thick"              # optional: "thin" (default) or "thick" band tension model
# end_joint = "auto"           # optional: "auto" (default: the first that fits the run),
#                              # "riveted-lap", "riveted-compact" or "welded-block"

[lever]
pivot = ["110 mm", "-190 mm"]  # pivot centre [x, y]
handle = ["-450 mm", "-190 mm"] # where the operator's force acts, perpendicular to pivot→handle
width = "45 mm"                # plate width in the view plane
thickness = "12 mm"            # plate thickness along the drum axis
allowable_stress = "100 MPa"   # allowable bending stress

[load]                         # give exactly one of torque / lever_force
torque = "120 N*m"             # braking torque needed (N*m, kN*m, lbf*ft, lbf*in): solves the lever force
# lever_force = "200 N"        # or: the force available at the handle (N, kN, lbf): solves the torque
service_factor = 1.5           # bare number > 0, multiplies the torque (default 1)

[duty]                         # optional: thermal checks
speed = "120 rpm"              # drum speed at the start of a stop (rpm, rad/s); a hoist gives the
                               # load's linear speed instead ("0.5 m/s") with mass, stop_distance
                               # and rope_radius
inertia = "4 kg*m^2"           # rotating inertia reflected to the drum shaft (kg*m^2, lb*ft^2)
stops_per_hour = 30            # bare number, stops per hour
ambient = "30 °C"              # ambient temperature (°C, K, °F; default 40 °C)
# drive = "powered"            # hoist duty only: "powered" (the default) or "manual" (hand-operated)

# [apply]                      # optional: what applies the brake; left out = the operator's hand
# by = "spring"                # "hand" (default), "weight" or "spring"; an actuator releases it
# at = ["-450 mm", "-190 mm"]  # where the spring acts or the weight hangs on the lever (default: the handle)
# seat = ["-450 mm", "-330 mm"]  # spring only: its other end, on the frame (the axis runs at → seat)
# mass = "20 kg"               # weight only: the hanging mass
# wear_allowance = "2 mm"      # radial lining wear still covered (default: half the lining thickness)
# actuator_at = ["-300 mm", "-190 mm"]  # where the release actuator acts (default: at)
# both_rotations = false       # true: size for the worse drum rotation (the load can reverse)
# spring_material = "oil-tempered"  # "music-wire", "hard-drawn", "oil-tempered", "chrome-vanadium", "chrome-silicon"
# spring_ends = "squared-ground"    # "plain", "plain-ground", "squared" or "squared-ground" (default)
# spring_seats = "flat-pivoted"     # buckling: "flat-flat", "flat-pivoted" (default) or "pivoted-pivoted"
# spring_max_outer_diameter = "80 mm"  # optional: room for the coils

# [concept]                    # instead of end_a/end_b and pivot/handle: textbook arms, no geometry
# kind = "simple"              # "simple", "differential" or "summing"
# wrap = "250°"                # wrap angle (°, deg, rad), less than 360°
# handle_arm = "540 mm"        # perpendicular arm of the operator's force about the pivot
# arm_b = "110 mm"             # perpendicular arm of end B about the pivot
# arm_a = "0 mm"               # end A's arm; 0 or left out for a simple brake

[drawing]
sheet = "A3"                   # "A2", "A3" or "A4"
# projection = "first"         # "first" (ISO 5456-2 first angle, the default) or "third" (third
#                              # angle, ASME Y14.3): where the view from the left is placed
# scale = "1:5"                # ISO 5455 scale; left out = chosen automatically
)";
}

}  // namespace bandforge
