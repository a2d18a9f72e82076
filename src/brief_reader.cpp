// The brief schema (README "Briefs and proposals") on the shared machinery of
// src/toml_schema.hpp: the same unit parsing, positions, messages and did-you-mean as a design
// file, and the same [project], [lining] and [duty] sections.
#include <algorithm>
#include <array>
#include <cmath>
#include <numbers>

#include "src/brief.hpp"
#include "src/toml_schema.hpp"

namespace bandforge {

const char* to_string(Goal g) {
  switch (g) {
    case Goal::force: return "force";
    case Goal::band_mass: return "band_mass";
    case Goal::travel: return "travel";
    case Goal::size: return "size";
  }
  return "?";
}

namespace {

using schema::in_quotes;
using schema::join;
using schema::Section;

constexpr std::size_t kMaxBriefBytes = 1 << 20;

double mm(double v) { return v / 1000.0; }
std::vector<double> mm_list(std::initializer_list<double> values) {
  std::vector<double> out;
  for (double v : values) out.push_back(mm(v));
  return out;
}

/// The built-in stock series, each with its source (README "Briefs and proposals").
Stock default_stock() {
  Stock s;
  // ISO 3 / ISO 497 rounded R'10 preferred numbers (from memory, high confidence).
  s.band_width = mm_list({25, 32, 40, 50, 63, 80, 100, 125, 160, 200});
  s.band_width_source = "ISO 497 rounded R'10 preferred numbers, 25–200 mm (from memory)";
  s.band_thickness = mm_list({1.6, 2, 2.5, 3.2, 4, 5});
  s.band_thickness_source =
      "ISO 497 rounded R'10 preferred numbers (from memory) within the usual 1.5–6 mm of "
      "cold-rolled strip (common practice, no source)";
  s.pin_diameter = mm_list({8, 10, 12, 14, 16, 18, 20, 22, 24, 27, 30});
  s.pin_diameter_source = "ISO 2341 clevis pin nominal diameters 8–30 mm (REFERENCE §5.9, from "
                          "memory, medium confidence)";
  s.lever_width = mm_list({25, 32, 40, 50, 63, 80, 100, 125, 160});
  s.lever_thickness = mm_list({8, 10, 12.5, 16, 20, 25});
  s.lever_plate_source = "ISO 497 rounded R'10 preferred numbers (from memory)";
  s.band_allowable_stress = 60e6;
  s.band_stress_source = "60 MPa: the 50–70 MPa gross-section allowables of textbook examples "
                         "(REFERENCE §3)";
  s.lever_allowable_stress = 120e6;
  s.lever_stress_source = "120 MPa: about half the 235 MPa yield of S235 plate (common practice, "
                          "no source)";
  return s;
}

class BriefReader : public schema::Reader {
 public:
  BriefReader(std::string_view text, std::string name) : schema::Reader(text, name) {
    b_.file = std::move(name);
  }

  Brief read() {
    const toml::table root = parse_root("bandforge brief");
    static const std::vector<std::string> kSections = {
        "project", "drum", "lining", "load", "operator", "space", "limits", "stock", "goal", "duty"};
    check_sections(root, kSections, "[load] or [space]");
    const Section project = section(root, "project");
    const Section drum = section(root, "drum");
    const Section lining = section(root, "lining");
    const Section load = section(root, "load");
    const Section op = section(root, "operator");
    const Section space = section(root, "space");
    const Section limits = section(root, "limits");
    const Section stock = section(root, "stock");
    const Section goal = section(root, "goal");
    const Section duty = section(root, "duty");
    if (!project) missing_section("project", "it gives at least the title, e.g. title = \"Hoist brake\"");
    if (!drum) missing_section("drum", "it gives the drum diameter (or a list), bore and rotation");
    if (!lining) missing_section("lining", "it gives the lining material (or friction) and thickness");
    if (!load) missing_section("load", "it gives the torque the brake must hold");
    if (!op) missing_section("operator", "it gives the operator's force limit, max_force");
    if (!space) missing_section("space", "it gives the regions for the pins and the handle");

    read_project(project, b_.project);
    read_lining(lining, b_.lining);
    read_stock(stock);  // before [drum]: the default drum width follows the band widths
    read_drum(drum);
    read_load(load);
    read_operator(op);
    read_space(space);
    read_limits(limits);
    read_goal(goal);
    if (duty) read_duty(duty, b_.duty);
    b_.where = std::move(where_);
    return std::move(b_);
  }

 private:
  Brief b_;

  std::optional<bool> boolean(const Section& s, std::string_view key) {
    const toml::node* n = node(s, key);
    if (n == nullptr) return std::nullopt;
    if (const auto* v = n->as_boolean()) return v->get();
    bad_value(s, key, "expected true or false (bare, without quotes)");
  }

  /// One length or a list of lengths, each > 0; sorted ascending, duplicates removed.
  std::vector<double> lengths(const Section& s, std::string_view key, const std::string& example) {
    const toml::node* n = node(s, key);
    if (n == nullptr) return {};
    const std::string path = s.path + "." + std::string(key);
    std::vector<double> out;
    auto one = [&](const toml::node& v) {
      const double x = quantity_of(v, path, Quantity::length);
      if (!(x > 0)) fail(pos(v), path, written(v), "each size must be greater than zero, e.g. " + example);
      out.push_back(x);
    };
    if (const auto* arr = n->as_array()) {
      if (arr->empty()) bad_value(s, key, "the list is empty: give at least one size, e.g. " + example);
      for (const toml::node& v : *arr) one(v);
    } else {
      one(*n);
    }
    std::sort(out.begin(), out.end());
    out.erase(std::unique(out.begin(), out.end()), out.end());
    return out;
  }

  Region region_of(const toml::node& n, const std::string& path) {
    const char* example = "[[\"-250 mm\", \"-420 mm\"], [\"250 mm\", \"-420 mm\"], [\"0 mm\", \"-250 mm\"]]";
    const auto* arr = n.as_array();
    if (arr == nullptr || arr->empty()) {
      fail(pos(n), path, written(n),
           std::string("expected a region as a list of points [x, y] (a polygon, two points for a "
                       "line segment, one point for a fixed position), e.g. ") + example);
    }
    Region r;
    for (const toml::node& p : *arr) {
      const auto* xy = p.as_array();
      if (xy == nullptr || xy->size() != 2) {
        fail(pos(p), path, written(p),
             "each corner is a point as two lengths [\"x\", \"y\"], e.g. [\"-250 mm\", \"-420 mm\"]");
      }
      r.corners.push_back({quantity_of(*xy->get(0), path, Quantity::length),
                           quantity_of(*xy->get(1), path, Quantity::length)});
    }
    if (r.corners.size() >= 4) {
      // Edges that cross (corners not in order round the region) make a bow-tie.
      const auto& c = r.corners;
      const std::size_t count = c.size();
      const auto orient = [](Vec2 p, Vec2 q, Vec2 t) { return (q.x - p.x) * (t.y - p.y) - (q.y - p.y) * (t.x - p.x); };
      for (std::size_t i = 0; i < count; ++i) {
        for (std::size_t k = i + 2; k < count; ++k) {
          if (i == 0 && k == count - 1) continue;  // neighbours through the closing edge
          const Vec2 a = c[i], b = c[(i + 1) % count], p = c[k], q = c[(k + 1) % count];
          const double o1 = orient(a, b, p), o2 = orient(a, b, q), o3 = orient(p, q, a), o4 = orient(p, q, b);
          if (((o1 > 0 && o2 < 0) || (o1 < 0 && o2 > 0)) && ((o3 > 0 && o4 < 0) || (o3 < 0 && o4 > 0))) {
            fail(pos(n), path, written(n),
                 "the region's edges cross each other (corner " + std::to_string(i + 1) + "–" +
                     std::to_string(i + 2) + " and corner " + std::to_string(k + 1) + "–" +
                     std::to_string((k + 1) % count + 1) + "): list the corners in order round the region");
          }
        }
      }
    }
    if (r.corners.size() >= 3) {
      double area2 = 0;
      for (std::size_t i = 0; i < r.corners.size(); ++i) {
        const Vec2 a = r.corners[i], b = r.corners[(i + 1) % r.corners.size()];
        area2 += a.x * b.y - b.x * a.y;
      }
      double extent = 0;
      for (const Vec2& c : r.corners) extent = std::max({extent, std::abs(c.x), std::abs(c.y)});
      if (std::abs(area2) < 1e-9 * std::max(extent * extent, 1e-6)) {
        fail(pos(n), path, written(n),
             "the corners enclose no area (they lie on one line): give two points for a line "
             "segment, or corners that enclose the region");
      }
    }
    return r;
  }

  Region region(const Section& s, std::string_view key) {
    const toml::node* n = node(s, key);
    if (n == nullptr) return {};
    return region_of(*n, s.path + "." + std::string(key));
  }

  void read_drum(const Section& s) {
    check_keys(s, {"diameter", "width", "bore", "rotation", "material"});
    b_.drum_diameters = lengths(s, "diameter", "\"400 mm\" or [\"350 mm\", \"400 mm\"]");
    if (b_.drum_diameters.empty()) {
      missing(s, "diameter", "the friction-surface diameter, or a list to choose from, e.g. "
                             "diameter = [\"350 mm\", \"400 mm\"]");
    }
    if (auto w = quantity(s, "width", Quantity::length)) {
      must_be_positive(s, "width", *w, Quantity::length);
      b_.drum_width = *w;
      if (b_.stock.band_width.front() > *w) {
        bad_value(s, "width", "the narrowest band in [stock] band_width (" +
                  format_quantity(b_.stock.band_width.front(), Quantity::length, UnitSystem::si) +
                  ") is wider than the drum face: give a wider drum or narrower bands");
      }
    }
    b_.bore = positive(s, "bore", Quantity::length, "the shaft bore");
    if (b_.bore >= b_.drum_diameters.front() / 2) {
      bad_value(s, "bore", "the bore must be smaller than half the smallest drum diameter (" +
                format_quantity(b_.drum_diameters.front() / 2, Quantity::length, UnitSystem::si) +
                ") to leave a hub and a rim");
    }
    b_.rotation = turn(s, "rotation", "the load's rotation to be braked, seen from the front: "
                                      "rotation = \"cw\" or \"ccw\"");
    read_drum_material(s, b_.drum_material);
  }

  void read_load(const Section& s) {
    check_keys(s, {"torque", "service_factor", "both_directions"});
    b_.torque = positive(s, "torque", Quantity::torque, "the braking torque the brake must hold");
    if (auto sf = number(s, "service_factor", "service_factor = 1.25")) {
      if (!(*sf > 0.0)) bad_value(s, "service_factor", "the service factor must be greater than zero, e.g. 1.25");
      b_.service_factor = *sf;
    }
    b_.both_directions = boolean(s, "both_directions").value_or(false);
  }

  void read_operator(const Section& s) {
    check_keys(s, {"max_force", "max_travel"});
    b_.max_force = positive(s, "max_force", Quantity::force,
                            "the largest force the operator may apply at the handle");
    if (auto t = quantity(s, "max_travel", Quantity::length)) {
      must_be_positive(s, "max_travel", *t, Quantity::length);
      b_.max_travel = *t;
    }
  }

  void read_space(const Section& s) {
    check_keys(s, {"pins", "frame_pin", "lever_pins", "pivot", "handle", "keep_out"});
    b_.pins = region(s, "pins");
    if (b_.pins.corners.empty()) {
      missing(s, "pins", "the region where the pins (band ends and pivot) may go, e.g. pins = "
                         "[[\"-250 mm\", \"-420 mm\"], [\"250 mm\", \"-420 mm\"], [\"250 mm\", \"-250 mm\"], "
                         "[\"-250 mm\", \"-250 mm\"]]");
    }
    b_.frame_pin = region(s, "frame_pin");
    b_.lever_pins = region(s, "lever_pins");
    b_.pivot = region(s, "pivot");
    b_.handle = region(s, "handle");
    if (b_.handle.corners.empty()) {
      missing(s, "handle", "the region where the operator's force may act, e.g. handle = "
                           "[[\"300 mm\", \"-450 mm\"], [\"900 mm\", \"-450 mm\"], [\"900 mm\", \"-200 mm\"], "
                           "[\"300 mm\", \"-200 mm\"]]");
    }
    if (const toml::node* n = node(s, "keep_out")) {
      const auto* arr = n->as_array();
      if (arr == nullptr) {
        bad_value(s, "keep_out", "expected a list of regions, e.g. keep_out = [[[\"-50 mm\", \"-300 mm\"], "
                                 "[\"50 mm\", \"-300 mm\"], [\"0 mm\", \"-350 mm\"]]] (or [] for none)");
      }
      for (const toml::node& r : *arr) {
        Region k = region_of(r, "space.keep_out");
        if (k.corners.size() < 3) {
          fail(pos(r), "space.keep_out", written(r),
               "a keep-out region needs at least three corners enclosing an area");
        }
        b_.keep_out.push_back(std::move(k));
      }
    }
  }

  void read_limits(const Section& s) {
    if (!s) return;
    check_keys(s, {"self_lock_margin", "allow_self_locking", "clearance"});
    if (auto m = number(s, "self_lock_margin", "self_lock_margin = 1.25")) {
      if (!(*m >= 1.0 && *m <= 10.0)) {
        bad_value(s, "self_lock_margin",
                  "the margin multiplies the highest friction: it must lie between 1 and 10, e.g. 1.25");
      }
      b_.self_lock_margin = *m;
    }
    b_.allow_self_locking = boolean(s, "allow_self_locking").value_or(false);
    if (auto c = quantity(s, "clearance", Quantity::length)) {
      if (*c < 0) bad_value(s, "clearance", "the radial release clearance must not be negative, e.g. \"1.5 mm\"");
      b_.clearance = *c;
    }
  }

  void read_stock(const Section& s) {
    b_.stock = default_stock();
    if (!s) return;
    check_keys(s, {"band_width", "band_thickness", "pin_diameter", "lever_width", "lever_thickness",
                   "band_allowable_stress", "lever_allowable_stress"});
    Stock& st = b_.stock;
    auto list = [&](std::string_view key, std::vector<double>& into, std::string& source,
                    const char* example) {
      auto v = lengths(s, key, example);
      if (!v.empty()) {
        into = std::move(v);
        source = "brief [stock] " + std::string(key);
      }
    };
    std::string lever_source = st.lever_plate_source;
    list("band_width", st.band_width, st.band_width_source, "[\"50 mm\", \"60 mm\"]");
    list("band_thickness", st.band_thickness, st.band_thickness_source, "[\"2 mm\", \"3 mm\"]");
    list("pin_diameter", st.pin_diameter, st.pin_diameter_source, "[\"12 mm\", \"16 mm\"]");
    list("lever_width", st.lever_width, lever_source, "[\"40 mm\", \"50 mm\"]");
    list("lever_thickness", st.lever_thickness, lever_source, "[\"10 mm\", \"12 mm\"]");
    st.lever_plate_source = lever_source;
    if (auto v = quantity(s, "band_allowable_stress", Quantity::stress)) {
      must_be_positive(s, "band_allowable_stress", *v, Quantity::stress);
      st.band_allowable_stress = *v;
      st.band_stress_source = "brief [stock] band_allowable_stress";
    }
    if (auto v = quantity(s, "lever_allowable_stress", Quantity::stress)) {
      must_be_positive(s, "lever_allowable_stress", *v, Quantity::stress);
      st.lever_allowable_stress = *v;
      st.lever_stress_source = "brief [stock] lever_allowable_stress";
    }
  }

  void read_goal(const Section& s) {
    if (!s) return;
    check_keys(s, {"minimise", "proposals", "kinds"});
    if (auto g = choice(s, "minimise", {"force", "band_mass", "travel", "size"})) {
      b_.goal = std::array<Goal, 4>{Goal::force, Goal::band_mass, Goal::travel, Goal::size}[*g];
    }
    if (auto n = number(s, "proposals", "proposals = 5")) {
      if (!(*n >= 1 && *n <= 20 && std::floor(*n) == *n)) {
        bad_value(s, "proposals", "a whole number of proposals from 1 to 20, e.g. 5");
      }
      b_.proposals = static_cast<int>(*n);
    }
    if (const toml::node* n = node(s, "kinds")) {
      const auto* arr = n->as_array();
      const char* what = "expected a list of brake kinds, e.g. kinds = [\"simple\", \"differential\", \"summing\"]";
      if (arr == nullptr || arr->empty()) bad_value(s, "kinds", what);
      b_.kinds.clear();
      for (const toml::node& k : *arr) {
        const auto* str = k.as_string();
        const std::vector<std::string> names = {"simple", "differential", "summing"};
        const auto it = str ? std::find(names.begin(), names.end(), str->get()) : names.end();
        if (it == names.end()) fail(pos(k), "goal.kinds", written(k), what);
        const BrakeKind kind = std::array<BrakeKind, 3>{BrakeKind::simple, BrakeKind::differential,
                                                        BrakeKind::summing}[it - names.begin()];
        if (std::find(b_.kinds.begin(), b_.kinds.end(), kind) == b_.kinds.end()) b_.kinds.push_back(kind);
      }
    }
  }
};

Vec2 closest_on_segment(Vec2 p, Vec2 a, Vec2 b) {
  const Vec2 ab{b.x - a.x, b.y - a.y};
  const double len2 = ab.x * ab.x + ab.y * ab.y;
  const double u = len2 > 0 ? std::clamp(((p.x - a.x) * ab.x + (p.y - a.y) * ab.y) / len2, 0.0, 1.0) : 0.0;
  return {a.x + u * ab.x, a.y + u * ab.y};
}

}  // namespace

Brief read_brief_text(std::string_view text, const std::string& name) {
  if (text.size() > kMaxBriefBytes) {
    throw DesignError(name, 0, 0, "", "", "not a bandforge brief: larger than " +
                                              std::to_string(kMaxBriefBytes / 1024) + " KiB");
  }
  return BriefReader(text, name).read();
}

Brief read_brief_file(const std::string& path) {
  return read_brief_text(schema::read_source(path, "brief", kMaxBriefBytes), path == "-" ? "<stdin>" : path);
}

bool polygon_contains(const std::vector<Vec2>& c, Vec2 p) {
  bool in = false;  // even–odd rule
  for (std::size_t i = 0, j = c.size() - 1; i < c.size(); j = i++) {
    if ((c[i].y > p.y) != (c[j].y > p.y) &&
        p.x < (c[j].x - c[i].x) * (p.y - c[i].y) / (c[j].y - c[i].y) + c[i].x) {
      in = !in;
    }
  }
  return in;
}

Vec2 region_closest(const Region& r, Vec2 p) {
  const auto& c = r.corners;
  if (c.empty()) return p;
  if (c.size() == 1) return c[0];
  if (c.size() >= 3 && polygon_contains(c, p)) return p;
  Vec2 best = c[0];
  double best_d = 1e300;
  const std::size_t edges = c.size() == 2 ? 1 : c.size();
  for (std::size_t i = 0; i < edges; ++i) {
    const Vec2 q = closest_on_segment(p, c[i], c[(i + 1) % c.size()]);
    const double d = std::hypot(q.x - p.x, q.y - p.y);
    if (d < best_d) {
      best_d = d;
      best = q;
    }
  }
  return best;
}

double region_distance(const Region& r, Vec2 p) {
  const Vec2 q = region_closest(r, p);
  return std::hypot(q.x - p.x, q.y - p.y);
}

bool region_contains(const Region& r, Vec2 p, double tol) { return region_distance(r, p) <= tol; }

}  // namespace bandforge
