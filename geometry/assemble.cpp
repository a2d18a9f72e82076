// build_brake(): the solids placed where the mechanics put them (REFERENCE §1.8), millimetres.
// Proportions the design file does not give are the constants below (common practice, no
// source) and src/proportions.hpp for the drum; geometry/README.md lists them.
#include <algorithm>
#include <cmath>
#include <cstdio>
#include <numbers>
#include <string>
#include <vector>

#include <Standard_Failure.hxx>
#include <gp_Ax1.hxx>
#include <gp_Vec.hxx>

#include "geometry/assemble.hpp"
#include "geometry/band_path.hpp"
#include "geometry/occt_guard.hpp"
#include "geometry/solids.hpp"
#include "src/errors.hpp"
#include "src/proportions.hpp"

namespace bandforge::geom {
namespace {

constexpr double mm_per_m = 1000.0;
constexpr double axial_gap = 4.0;      // band face to lever / anchor plate [mm]
constexpr double pin_overhang = 2.0;   // pin beyond its outer plate; < axial_gap so that a
                                       // frame pin under the lever stays clear of it [mm]
constexpr double grip_diameter = 30.0; // a hand grip: common practice, no source [mm]
constexpr double grip_length = 100.0;  // one hand's width [mm]
constexpr double steel_density = 7850; // carbon steel [kg/m³]: common practice, no source

// Part colours (sRGB, written with exactly these decimals into the STEP file).
constexpr Rgb drum_colour{0.50, 0.50, 0.52};
constexpr Rgb lining_colour{0.45, 0.30, 0.20};
constexpr Rgb band_colour{0.25, 0.40, 0.60};
constexpr Rgb lever_colour{0.85, 0.45, 0.10};
constexpr Rgb grip_colour{0.10, 0.10, 0.10};
constexpr Rgb pin_colour{0.75, 0.75, 0.75};
constexpr Rgb anchor_colour{0.25, 0.50, 0.30};

Vec2 mm(Vec2 v) { return {v.x * mm_per_m, v.y * mm_per_m}; }
double dist(Vec2 p, Vec2 q) { return std::hypot(p.x - q.x, p.y - q.y); }

std::string num(double v) {
  char buf[32];
  std::snprintf(buf, sizeof buf, "%.1f", v);
  std::string s = buf;
  if (s.size() > 2 && s.substr(s.size() - 2) == ".0") s.resize(s.size() - 2);
  return s;
}

// Lining density from its specific gravity (REFERENCE §2.2: Neale Table 7.5, clutch facings:
// SG 1.6 woven/wound, 2.8 moulded, 6.0 sintered metal).
double lining_density(const std::string& material) {
  auto has = [&](const char* word) { return material.find(word) != std::string::npos; };
  if (has("sinter")) return 6000;
  if (has("mould") || has("mold")) return 2800;
  return 1600;
}

// Everything in millimetres, taken from the design once.
struct Dims {
  double r = 0;           // drum friction radius
  double band_t = 0, band_b = 0, lining_t = 0;
  double pin_r = 0;
  double lever_w = 0, lever_t = 0;
  double eye_outer = 0;   // band eye ring outer radius
  double min_wall = 0;    // least material round a hole
};

Dims dimensions(const Design& d) {
  Dims m;
  m.r = d.drum.diameter / 2 * mm_per_m;
  m.band_t = d.band.thickness * mm_per_m;
  m.band_b = d.band.width * mm_per_m;
  m.lining_t = d.lining.thickness * mm_per_m;
  m.pin_r = d.band.pin_diameter / 2 * mm_per_m;
  m.lever_w = d.lever.width * mm_per_m;
  m.lever_t = d.lever.thickness * mm_per_m;
  m.eye_outer = m.pin_r + m.band_t;
  // A quarter of the pin diameter, at least 2 mm (common practice for lugs, no source).
  m.min_wall = std::max(2.0, 0.5 * m.pin_r);
  return m;
}

// The pins of the layout: band ends, pivot, and which of them share a centre.
struct Station {
  std::string id;   // "A", "B", "PIVOT"
  Vec2 at;          // [mm], applied state
  bool on_lever = false;
  bool carries_band = false;
  bool on_frame = false;  // held by an anchor
};

std::vector<Station> stations(const Design& d, const Layout& applied) {
  const Vec2 pivot = mm(d.lever.pivot);
  std::vector<Station> out;
  Station piv{"PIVOT", pivot, true, false, true};
  for (const auto* e : {&applied.a, &applied.b}) {
    const std::string id = e == &applied.a ? "A" : "B";
    const Vec2 at = mm(e->pin);
    // A band end on the pivot centre hangs on the pivot pin itself (the textbook simple brake).
    if (dist(at, pivot) < 1e-3) {
      piv.carries_band = true;
      continue;
    }
    out.push_back({id, at, e->mount == Mount::lever, true, e->mount == Mount::frame});
  }
  out.push_back(piv);
  return out;
}

std::string end_key(const std::string& id) {
  return id == "A" ? "band.end_a.at" : id == "B" ? "band.end_b.at" : "lever.pivot";
}

[[noreturn]] void cannot(const std::string& part, const std::string& what) {
  throw BuildError("cannot build the " + part + ": " + what);
}

// Sizes that make a part impossible, named by part and design key, before any OCCT call.
void check_buildable(const Design& d, const Layout& state, const Dims& m,
                     const std::vector<Station>& st) {
  const DrumProportions p = drum_proportions(d.drum);
  const double bore = d.drum.bore * mm_per_m, hub = p.hub_diameter * mm_per_m;
  // Hub wall at least a tenth of the bore and 3 mm (common practice, no source).
  const double hub_wall = std::max(3.0, 0.1 * bore);
  if (!(hub > bore + 2 * hub_wall)) {
    cannot("drum", "drum.bore = " + num(bore) + " mm leaves no hub inside the rim (the hub is Ø" +
                       num(hub) + " mm; the bore must be below " + num(hub - 2 * hub_wall) +
                       " mm)");
  }
  for (const EndLayout* e : {&state.a, &state.b}) {
    const std::string id = e == &state.a ? "A" : "B";
    const double run = e->free_length * mm_per_m;
    if (!(run > m.eye_outer)) {
      cannot("band", "pin " + id + " (" + end_key(id) + ") is too close to the drum for the band eye: "
                     "the free run is " + num(run) + " mm, the eye needs more than " +
                     num(m.eye_outer) + " mm (pin radius " + num(m.pin_r) +
                     " mm + band thickness " + num(m.band_t) + " mm)");
    }
    const double gap = std::hypot(e->pin.x, e->pin.y) * mm_per_m - m.eye_outer - m.r;
    if (!(gap > 0)) {
      cannot("band", "the eye at pin " + id + " (" + end_key(id) + ") reaches " + num(-gap) +
                         " mm into the drum (Ø" + num(2 * m.r) + " mm); move the pin out");
    }
  }
  if (dist(mm(state.a.pin), mm(state.b.pin)) <= 2 * m.eye_outer) {
    cannot("band", "the eyes at pins A and B overlap: the pins are " +
                       num(dist(mm(state.a.pin), mm(state.b.pin))) + " mm apart, the eyes need " +
                       num(2 * m.eye_outer) + " mm (band.end_a.at, band.end_b.at)");
  }
  if (!(m.lever_w / 2 - m.pin_r >= m.min_wall)) {
    cannot("lever", "lever.width = " + num(m.lever_w) + " mm is too narrow for the Ø" +
                        num(2 * m.pin_r) + " mm pin holes: it needs at least " +
                        num(2 * (m.pin_r + m.min_wall)) + " mm (the lever and the anchors use it)");
  }
  std::vector<const Station*> holes;
  for (const Station& s : st) {
    if (s.on_lever) holes.push_back(&s);
  }
  const double least = 2 * m.pin_r + m.min_wall;
  for (std::size_t i = 0; i < holes.size(); ++i) {
    for (std::size_t j = i + 1; j < holes.size(); ++j) {
      const double gap = dist(holes[i]->at, holes[j]->at);
      if (gap < least) {
        cannot("lever", "the lever is shorter than its holes: " + end_key(holes[i]->id) + " and " +
                            end_key(holes[j]->id) + " are " + num(gap) +
                            " mm apart, the Ø" + num(2 * m.pin_r) + " mm holes need " + num(least) +
                            " mm between centres");
      }
    }
  }
  const Vec2 handle = mm(d.lever.handle);
  for (const Station* h : holes) {
    const double need = grip_diameter / 2 + m.pin_r + m.min_wall;
    if (dist(handle, h->at) < need) {
      cannot("lever", "the lever is shorter than its holes: lever.handle is " +
                          num(dist(handle, h->at)) + " mm from the hole at " + end_key(h->id) +
                          ", the Ø" + num(grip_diameter) + " mm grip needs " + num(need) + " mm");
    }
  }
}

gp_Trsf translation(Vec2 p, double z) {
  gp_Trsf t;
  t.SetTranslation(gp_Vec(p.x, p.y, z));
  return t;
}

gp_Trsf rotation(double angle) {
  gp_Trsf t;
  t.SetRotation(gp_Ax1(gp_Pnt(0, 0, 0), gp_Dir(0, 0, 1)), angle);
  return t;
}

gp_Trsf compose(const gp_Trsf& outer, const gp_Trsf& inner) { return outer.Multiplied(inner); }

class Builder {
 public:
  explicit Builder(BrakeModel::Impl& m) : m_(m) {}

  std::size_t part(PartKind kind, const std::string& name, const std::string& material,
                   double density, Rgb colour, const TopoDS_Shape& shape) {
    m_.parts.push_back({kind, shape, TopoDS_Shape()});
    PartInfo info;
    info.name = name;
    info.material = material;
    info.density = density;
    info.colour = colour;
    m_.infos.push_back(info);
    return m_.parts.size() - 1;
  }

  void instance(std::size_t part, const std::string& name, const gp_Trsf& placement) {
    m_.instances.push_back({part, name, placement});
    const gp_XYZ o = placement.TranslationPart();
    m_.infos[part].instance_names.push_back(name);
    m_.infos[part].instance_origins.push_back({o.X(), o.Y(), o.Z()});
  }

 private:
  BrakeModel::Impl& m_;
};

// Runs one OCCT construction; an OCCT exception becomes a BuildError saying what was built.
template <class F>
TopoDS_Shape building(const std::string& what, F&& make) {
  try {
    TopoDS_Shape s = make();
    if (s.IsNull()) throw BuildError("while building the " + what + ": OpenCASCADE returned nothing");
    return s;
  } catch (const Standard_Failure& e) {
    throw BuildError("while building the " + what + ": " + e.GetMessageString());
  }
}

BandEndPath end_path(const EndLayout& e) {
  return {mm(e.pin), mm(e.tangent_point), e.tangent_angle};
}

}  // namespace

BrakeModel build_brake(const Design& design, const Solution& solution,
                       const BuildOptions& options) {
  if (!solution.layout.from_pins) {
    design_fail(design, "concept", "",
                "a [concept] design has no pin coordinates; build needs end_a/end_b/pivot/handle");
  }
  QuietOcct quiet;
  auto impl = std::make_unique<BrakeModel::Impl>();
  BrakeModel::Impl& m = *impl;
  const Layout& applied = solution.layout;
  m.released = options.released;
  m.layout = options.released ? released_layout(design, applied) : applied;
  m.lever_rotation = options.released ? -applied.apply_sense * applied.release_rotation : 0.0;

  const Dims dm = dimensions(design);
  const std::vector<Station> st = stations(design, applied);
  check_buildable(design, m.layout, dm, st);

  AxialLayout& ax = m.axial;
  const double w = design.drum.width * mm_per_m;
  ax.drum_back = -w / 2;
  ax.drum_front = w / 2;
  ax.band_back = -dm.band_b / 2;
  ax.band_front = dm.band_b / 2;
  ax.gap = axial_gap;
  ax.pin_overhang = pin_overhang;
  ax.lever_back = ax.band_front + axial_gap;
  ax.lever_front = ax.lever_back + dm.lever_t;
  ax.anchor_front = ax.band_back - axial_gap;
  ax.anchor_back = ax.anchor_front - dm.lever_t;  // anchors use the lever's plate
  ax.grip_front = ax.lever_front + grip_length;

  Builder b(m);

  // Drum: friction surface D, rim, web and hub from src/proportions.hpp.
  const DrumProportions prop = drum_proportions(design.drum);
  DrumDims dd;
  dd.diameter = design.drum.diameter * mm_per_m;
  dd.width = w;
  dd.rim_thickness = prop.rim_thickness * mm_per_m;
  dd.web_thickness = prop.web_thickness * mm_per_m;
  dd.hub_diameter = prop.hub_diameter * mm_per_m;
  dd.hub_length = prop.hub_length * mm_per_m;
  dd.bore = design.drum.bore * mm_per_m;
  const std::size_t drum =
      b.part(PartKind::drum, "DRUM", design.drum.material, design.drum.density, drum_colour,
             building("drum", [&] { return make_drum(dd); }));
  // Drum, band and lining are built from their back faces (z = 0) and placed by a translation:
  // an identity placement would make OCCT's STEP writer drop the instance name.
  b.instance(drum, "DRUM", translation({0, 0}, ax.drum_back));
  // Clearances to the drum are measured to its outer cylinder: anything that must clear the
  // friction surface clears the web and hub inside it, and the distance is ~5× faster.
  m.parts[drum].envelope = building("drum envelope", [&] {
    return make_rod(dd.diameter / 2, (dd.width - std::max(dd.width, dd.hub_length)) / 2,
                    std::max(dd.width, dd.hub_length));
  });

  // Band and lining on the circle of the state built: r_b applied, r_b + c released.
  const Layout& lay = m.layout;
  BandPath bp;
  bp.r_band = lay.r_band * mm_per_m;
  bp.thickness = dm.band_t;
  bp.width = dm.band_b;
  bp.eye_inner = dm.pin_r;
  bp.sense = lay.sense;
  bp.wrap = lay.wrap;
  bp.a = end_path(lay.a);
  bp.b = end_path(lay.b);
  const std::size_t band = b.part(PartKind::band, "BAND", "steel", steel_density, band_colour,
                                  building("band", [&] { return make_band(bp); }));
  b.instance(band, "BAND", translation({0, 0}, ax.band_back));

  IntendedContacts intended;
  auto touch = [&](std::string p, std::string q) {
    if (q < p) std::swap(p, q);
    intended.insert({p, q});
  };
  if (dm.lining_t > 0) {
    const double inner = bp.r_band - dm.band_t / 2 - dm.lining_t;
    const std::size_t lining = b.part(
        PartKind::lining, "LINING", design.lining.material, lining_density(design.lining.material),
        lining_colour, building("lining", [&] {
          return make_arc_segment(inner, inner + dm.lining_t, lay.a.tangent_angle, lay.sense,
                                  lay.wrap, 0, dm.band_b);
        }));
    b.instance(lining, "LINING", translation({0, 0}, ax.band_back));
    touch("LINING", "BAND");
    if (!m.released) touch("LINING", "DRUM");
  } else if (!m.released) {
    touch("BAND", "DRUM");
  }

  // Lever: part coordinates with the pivot at the origin, plate centred on z = 0; placed at the
  // pivot in front of the band and turned about it by the release rotation.
  const Vec2 pivot = mm(design.lever.pivot);
  const Vec2 handle = mm(design.lever.handle);
  auto rel = [&](Vec2 p) { return Vec2{p.x - pivot.x, p.y - pivot.y}; };
  std::vector<Vec2> lever_points{rel(handle)}, lever_holes;
  for (const Station& s : st) {
    if (s.on_lever) {
      lever_points.push_back(rel(s.at));
      lever_holes.push_back(rel(s.at));
    }
  }
  const double lever_mid = (ax.lever_back + ax.lever_front) / 2;
  const gp_Trsf lever_place =
      compose(translation(pivot, lever_mid), rotation(m.lever_rotation));
  const std::size_t lever = b.part(
      PartKind::lever, "LEVER", "steel", steel_density, lever_colour, building("lever", [&] {
        return make_plate(lever_points, dm.lever_w / 2, lever_holes, dm.pin_r, -dm.lever_t / 2,
                          dm.lever_t);
      }));
  b.instance(lever, "LEVER", lever_place);
  const std::size_t grip = b.part(PartKind::grip, "GRIP", "steel", steel_density, grip_colour,
                                  building("grip", [&] {
                                    return make_rod(grip_diameter / 2, 0, grip_length);
                                  }));
  b.instance(grip, "GRIP",
             compose(lever_place, translation(rel(handle), dm.lever_t / 2)));
  touch("GRIP", "LEVER");

  // Anchors: one lug per frame-held pin, pointing away from the drum centre. Part coordinates:
  // hole at the origin, lug along −y, plate centred on z = 0.
  const double lug = dm.lever_w;
  const std::size_t anchor = b.part(
      PartKind::anchor, "ANCHOR", "steel", steel_density, anchor_colour, building("anchor", [&] {
        return make_plate({{0, 0}, {0, -lug}}, dm.lever_w / 2, {{0, 0}}, dm.pin_r,
                          -dm.lever_t / 2, dm.lever_t);
      }));
  const double anchor_mid = (ax.anchor_back + ax.anchor_front) / 2;
  for (const Station& s : st) {
    if (!s.on_frame) continue;
    const double outward = std::atan2(s.at.y, s.at.x);
    b.instance(anchor, "ANCHOR-" + s.id,
               compose(translation(s.at, anchor_mid), rotation(outward + std::numbers::pi / 2)));
  }

  // Pins: one part per distinct length, centred on z = 0 in part coordinates.
  std::vector<std::pair<double, std::size_t>> pin_parts;  // length → part
  for (const Station& s : st) {
    const double back = s.on_frame ? ax.anchor_back : ax.band_back;
    const double front = s.on_lever ? ax.lever_front : ax.band_front;
    const double length = front - back + 2 * pin_overhang;
    std::size_t part = m.parts.size();
    for (const auto& [len, idx] : pin_parts) {
      if (std::abs(len - length) < 1e-6) part = idx;
    }
    if (part == m.parts.size()) {
      const std::string name = "PIN-D" + num(2 * dm.pin_r) + "x" + num(length);
      part = b.part(PartKind::pin, name, "steel", steel_density, pin_colour,
                    building("pin " + name, [&] { return make_rod(dm.pin_r, -length / 2, length); }));
      pin_parts.emplace_back(length, part);
    }
    const std::string name = "PIN-" + s.id;
    const double mid = (front + back) / 2;
    // Lever pins move with the lever; the pivot pin and frame pins stay put.
    const gp_Trsf place = s.on_lever && s.id != "PIVOT"
                              ? compose(lever_place, translation(rel(s.at), mid - lever_mid))
                              : translation(s.at, mid);
    b.instance(part, name, place);
    if (s.carries_band) touch(name, "BAND");
    if (s.on_lever) touch(name, "LEVER");
    if (s.on_frame) touch(name, "ANCHOR-" + s.id);
  }

  m.intended = intended;
  if (!options.checks) return BrakeModel(std::move(impl));
  try {
    run_checks(m, intended, options.interference);
  } catch (const Standard_Failure& e) {
    throw BuildError(std::string("while checking the assembly: ") + e.GetMessageString());
  }
  if (options.reject_failures) reject_failures(m);
  return BrakeModel(std::move(impl));
}

}  // namespace bandforge::geom
