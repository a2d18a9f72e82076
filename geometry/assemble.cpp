// build_brake(): the solids placed where the mechanics put them (REFERENCE §1.8), millimetres.
// Proportions the design file does not give are the constants below (common practice, no
// source) and src/proportions.hpp for the drum; geometry/README.md lists them.
#include <algorithm>
#include <cmath>
#include <functional>
#include <map>
#include <cstdio>
#include <numbers>
#include <stdexcept>
#include <string>
#include <vector>

#include <BRepAlgoAPI_Cut.hxx>
#include <BRepAlgoAPI_Fuse.hxx>
#include <BRepPrimAPI_MakeBox.hxx>
#include <Standard_Failure.hxx>
#include <gp_Ax1.hxx>
#include <gp_Ax3.hxx>
#include <gp_Vec.hxx>

#include "geometry/assemble.hpp"
#include "src/band_path.hpp"
#include "geometry/solids.hpp"
#include "geometry/spring_solid.hpp"
#include "src/apply.hpp"
#include "src/errors.hpp"
#include "src/hardware.hpp"
#include "src/proportions.hpp"

namespace bandforge::geom {
namespace {

constexpr double mm_per_m = 1000.0;
constexpr double grip_diameter = hardware_rules::grip_diameter * mm_per_m;  // [mm]
constexpr double grip_length = hardware_rules::grip_length * mm_per_m;      // [mm]
constexpr double steel_density = 7850; // carbon steel [kg/m³]: common practice, no source

// Part colours (sRGB, written with exactly these decimals into the STEP file).
constexpr Rgb drum_colour{0.50, 0.50, 0.52};
constexpr Rgb lining_colour{0.45, 0.30, 0.20};
constexpr Rgb band_colour{0.25, 0.40, 0.60};
constexpr Rgb lever_colour{0.85, 0.45, 0.10};
constexpr Rgb grip_colour{0.10, 0.10, 0.10};
constexpr Rgb pin_colour{0.75, 0.75, 0.75};
constexpr Rgb anchor_colour{0.25, 0.50, 0.30};
constexpr Rgb block_colour{0.30, 0.35, 0.45};
constexpr Rgb spring_colour{0.70, 0.15, 0.15};
constexpr Rgb seat_colour{0.40, 0.45, 0.35};

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
    BrakeModel::Impl::Part p;
    p.kind = kind;
    p.shape = shape;
    m_.parts.push_back(p);
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
  } catch (const std::invalid_argument& e) {
    throw BuildError("while building the " + what + ": " + e.what());
  }
}

// Part coordinates (axis z, origin o) → assembly: z along the in-plane direction `axis`, the
// origin at (o, z_mid), part x along the assembly's z (toward the viewer).
gp_Trsf along(Vec2 o, double z_mid, Vec2 axis) {
  gp_Trsf t;  // moves the part's frame onto the placed one
  t.SetDisplacement(gp_Ax3(gp_Pnt(0, 0, 0), gp_Dir(0, 0, 1), gp_Dir(1, 0, 0)),
                    gp_Ax3(gp_Pnt(o.x, o.y, z_mid), gp_Dir(axis.x, axis.y, 0), gp_Dir(0, 0, 1)));
  return t;
}

// `a` fused with `b`, or cut by `b`; one solid expected.
TopoDS_Shape fused(const TopoDS_Shape& a, const TopoDS_Shape& b) {
  BRepAlgoAPI_Fuse f(a, b);
  if (!f.IsDone()) throw BuildError("the boolean fuse failed");
  return f.Shape();
}
TopoDS_Shape cut(const TopoDS_Shape& a, const TopoDS_Shape& b) {
  BRepAlgoAPI_Cut c(a, b);
  if (!c.IsDone()) throw BuildError("the boolean cut failed");
  return c.Shape();
}

std::string dim(double metres, int decimals = 1) {
  char buf[32];
  std::snprintf(buf, sizeof buf, "%.*f", decimals, metres * mm_per_m);
  return buf;
}

// The spring as a spring maker quotes it (src/apply.hpp ApplyResult::spring).
std::string spring_designation(const SpringResult& sp) {
  char nt[16];
  std::snprintf(nt, sizeof nt, "%g", sp.total_coils);
  return "Helical compression spring, d " + dim(sp.wire_diameter, 2) + " × D " + dim(sp.mean_diameter) +
         " mm, N_t " + nt + ", " + to_string(sp.ends) + " ends, L_0 " + dim(sp.free_length) +
         " mm, rate " + dim(sp.rate / 1e6, 2) + " N/mm, " + sp.material + " wire";
}

// The band end as built: an eye round the pin (riveted joints), or a straight end in the slot
// of a welded end block, `block back − slot depth` from the pin.
BandEndPath end_path(const EndLayout& e, const JointPlan& j) {
  BandEndPath p{mm(e.pin), mm(e.tangent_point), e.tangent_angle};
  if (j.kind == JointKind::welded_block) {
    p.eye = false;
    p.cut = (j.block_back - j.slot_depth) * mm_per_m;
  } else {
    p.lap = j.lap * mm_per_m;  // the riveted lap's tail
  }
  return p;
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

  // What bandforge adds (brackets, joints, axial stack) is decided in the core, once
  // (src/hardware.hpp); a layout that cannot be built is refused there, with the key to change.
  const HardwarePlan& hw = solution.hardware;
  if (!hw.refusal.empty()) throw BuildError(hw.refusal);
  if (options.released && !hw.release_ok) throw BuildError(hw.release_problem);
  const double band_t = design.band.thickness * mm_per_m, band_b = design.band.width * mm_per_m;
  const double lining_t = design.lining.thickness * mm_per_m;
  // Holes for the pins as bought: the ISO 2341 nominal (src/standard_parts.hpp).
  const double pin_r = standard::clevis_nominal(design.band.pin_diameter) / 2 * mm_per_m;
  const double lever_w = design.lever.width * mm_per_m, lever_t = design.lever.thickness * mm_per_m;

  AxialLayout& ax = m.axial;
  ax.drum_back = hw.axial.drum_back * mm_per_m;
  ax.drum_front = hw.axial.drum_front * mm_per_m;
  ax.band_back = hw.axial.band_back * mm_per_m;
  ax.band_front = hw.axial.band_front * mm_per_m;
  ax.gap = hw.axial.gap * mm_per_m;
  ax.lever_back = hw.axial.lever_back * mm_per_m;
  ax.lever_front = hw.axial.lever_front * mm_per_m;
  // The deepest frame plate behind the band, for views and tests (the plan has each plate's own).
  ax.anchor_back = ax.anchor_front = ax.band_back;
  bool first = true;
  for (const BracketPlan& br : hw.brackets) {
    if (br.side != BracketSide::behind) continue;
    ax.anchor_back = first ? br.z_back * mm_per_m : std::min(ax.anchor_back, br.z_back * mm_per_m);
    ax.anchor_front = first ? br.z_front * mm_per_m : std::max(ax.anchor_front, br.z_front * mm_per_m);
    first = false;
  }
  ax.grip_front = hw.axial.grip_front * mm_per_m;
  const double w = design.drum.width * mm_per_m;

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
  bp.thickness = band_t;
  bp.width = band_b;
  bp.eye_inner = pin_r;
  bp.sense = lay.sense;
  bp.wrap = lay.wrap;
  bp.a = end_path(lay.a, hw.joint_a);
  bp.b = end_path(lay.b, hw.joint_b);
  const std::size_t band = b.part(PartKind::band, "BAND", "steel", steel_density, band_colour,
                                  building("band", [&] { return make_band(bp); }));
  b.instance(band, "BAND", translation({0, 0}, ax.band_back));

  IntendedContacts intended;
  auto touch = [&](std::string p, std::string q) {
    if (q < p) std::swap(p, q);
    intended.insert({p, q});
  };
  if (lining_t > 0) {
    const double inner = bp.r_band - band_t / 2 - lining_t;
    const std::size_t lining = b.part(
        PartKind::lining, "LINING", design.lining.material, lining_density(design.lining.material),
        lining_colour, building("lining", [&] {
          return make_arc_segment(inner, inner + lining_t, lay.a.tangent_angle, lay.sense,
                                  lay.wrap, 0, band_b);
        }));
    b.instance(lining, "LINING", translation({0, 0}, ax.band_back));
    touch("LINING", "BAND");
    if (!m.released) touch("LINING", "DRUM");
  } else if (!m.released) {
    touch("BAND", "DRUM");
  }

  // Welded end blocks: part coordinates with the pin at the origin, the run along −x, the band
  // slot on the mid-plane y = 0; placed at the pin, turned to the run, across the band's width.
  for (bool a : {true, false}) {
    const JointPlan& j = a ? hw.joint_a : hw.joint_b;
    if (j.kind != JointKind::welded_block) continue;
    const EndLayout& e = a ? lay.a : lay.b;
    const std::string id = a ? "A" : "B";
    BlockDims bd;
    bd.front = j.block_front * mm_per_m;
    bd.back = j.block_back * mm_per_m;
    bd.height = j.block_height * mm_per_m;
    bd.slot_depth = j.slot_depth * mm_per_m;
    bd.slot_width = band_t;
    bd.bore = pin_r;
    bd.width = band_b;
    const std::string name = "END-BLOCK-" + id;
    const std::size_t part = b.part(PartKind::block, name, "steel", steel_density, block_colour,
                                    building("end block " + id, [&] { return make_end_block(bd); }));
    // The run points from the pin toward the drum: part −x along it.
    const double angle = std::atan2(e.run_dir.y, e.run_dir.x) + std::numbers::pi;
    b.instance(part, name, compose(translation(mm(e.pin), ax.band_back), rotation(angle)));
    touch(name, "BAND");
  }

  // Bought parts (rivets, pins, washers, split pins, sleeves): one part per name.
  std::map<std::string, std::size_t> bought;  // part name → part
  auto part_once = [&](PartKind kind, const std::string& name, const std::string& designation,
                       Rgb colour, const std::function<TopoDS_Shape()>& make) {
    auto it = bought.find(name);
    if (it != bought.end()) return it->second;
    const std::size_t part = b.part(kind, name, "steel", steel_density, colour, building(name, make));
    m.infos[part].designation = designation;
    bought.emplace(name, part);
    return part;
  };

  // Joint rivets (src/hardware.hpp JointPlan::rivets, rivet_at, across): one part per size,
  // length and closing, one instance per rivet, "RIVET-A-1"… row by row from the tail's free
  // end. Part z runs from the tail's outside face (the manufactured head's underside) through
  // tail and run toward the drum; placed at the row's distance from the pin along the run, at
  // the column's z from the band's back edge. The shank fills the band where its holes would
  // be: the band solid has no rivet holes (their 2·16 cylinders would cost a boolean and the
  // views their intersection curves), the overlap is an intended contact whose boolean the
  // checks skip (geometry/checks.cpp).
  for (bool a : {true, false}) {
    const JointPlan& j = a ? hw.joint_a : hw.joint_b;
    if (j.kind == JointKind::welded_block) continue;
    const EndLayout& e = a ? lay.a : lay.b;
    const standard::RivetSet& rs = j.rivets;
    const bool flush = rs.closing == standard::RivetClosing::flush;
    const std::string name = "RIVET-" + num(rs.size.d * mm_per_m) + "x" + num(rs.length * mm_per_m) +
                             (flush ? "-FLUSH" : "");
    const RivetDims rd{rs.size.d * mm_per_m, rs.size.dk * mm_per_m, rs.size.k * mm_per_m,
                       2 * band_t, rs.closing_height() * mm_per_m};
    const std::size_t rivet = part_once(PartKind::rivet, name, rs.designation(), pin_colour,
                                        [&] { return make_rivet(rd); });
    // The views show the rivet as the box round its heads (d_k square, head to head): the
    // exact caps cost the example's three hidden-line views ~0.4 s, a cylinder ~0.2 s
    // (measured), for 2 mm of detail at their scale. The STEP and the checks keep the solid.
    if (m.parts[rivet].display.IsNull()) {
      m.parts[rivet].axis_from = gp_Pnt(0, 0, -rd.k);
      m.parts[rivet].axis_to = gp_Pnt(0, 0, rd.clamp + rd.closing);
      m.parts[rivet].bound_radius = std::max(rd.dk, rd.d) / 2;
      m.parts[rivet].display = building("rivet " + name, [&] {
        return BRepPrimAPI_MakeBox(gp_Pnt(-rd.dk / 2, -rd.dk / 2, -rd.k), rd.dk, rd.dk,
                                   rd.k + rd.clamp + rd.closing).Shape();
      });
    }
    const Vec2 pin = mm(e.pin), tp = mm(e.tangent_point);
    const double len = dist(pin, tp);
    const Vec2 u{(tp.x - pin.x) / len, (tp.y - pin.y) / len};
    // The run's outward normal (away from the drum), exactly square to the run.
    const double out = -u.y * std::cos(e.tangent_angle) + u.x * std::sin(e.tangent_angle);
    const Vec2 r = out >= 0 ? Vec2{-u.y, u.x} : Vec2{u.y, -u.x};
    const double yz = r.y * u.x - r.x * u.y;  // part y = part z × part x, along ±z
    int n = 0;
    for (double s : j.rivet_at) {
      for (double across : j.across) {
        const Vec2 o{pin.x + u.x * s * mm_per_m + r.x * 1.5 * band_t,
                     pin.y + u.y * s * mm_per_m + r.y * 1.5 * band_t};
        gp_Trsf place;  // columns: part x → along the run, y → ±z, z → toward the drum
        place.SetValues(u.x, 0, -r.x, o.x, u.y, 0, -r.y, o.y, 0, yz, 0, ax.band_back + across * mm_per_m);
        const std::string id = "RIVET-" + std::string(a ? "A" : "B") + "-" + std::to_string(++n);
        b.instance(rivet, id, place);
        touch(id, "BAND");
      }
    }
  }

  // Lever: part coordinates with the pivot at the origin, plate centred on z = 0; placed at the
  // pivot in front of the band (in front of the drum face when it crosses the drum) and turned
  // about it by the release rotation.
  const Vec2 pivot = mm(design.lever.pivot);
  const Vec2 handle = mm(design.lever.handle);
  auto rel = [&](Vec2 p) { return Vec2{p.x - pivot.x, p.y - pivot.y}; };
  std::vector<Vec2> lever_points{rel(handle)}, lever_holes;
  for (const PinPlan& p : hw.pins) {
    if (p.on_lever) {
      lever_points.push_back(rel(mm(p.at)));
      lever_holes.push_back(rel(mm(p.at)));
    }
  }
  const double lever_mid = (ax.lever_back + ax.lever_front) / 2;
  const gp_Trsf lever_place =
      compose(translation(pivot, lever_mid), rotation(m.lever_rotation));
  const std::size_t lever = b.part(
      PartKind::lever, "LEVER", "steel", steel_density, lever_colour, building("lever", [&] {
        return make_plate(lever_points, lever_w / 2, lever_holes, pin_r, -lever_t / 2, lever_t);
      }));
  b.instance(lever, "LEVER", lever_place);
  const std::size_t grip = b.part(PartKind::grip, "GRIP", "steel", steel_density, grip_colour,
                                  building("grip", [&] {
                                    return make_rod(grip_diameter / 2, 0, grip_length);
                                  }));
  b.instance(grip, "GRIP",
             compose(lever_place, translation(rel(handle), lever_t / 2)));
  touch("GRIP", "LEVER");
  if (options.lever_only) {
    m.intended = intended;
    if (options.checks) run_checks(m, intended, options.interference, options.validity);
    return BrakeModel(std::move(impl));
  }

  // Frame brackets (src/hardware.hpp). A lug for one pin: part "ANCHOR", hole at the origin, lug
  // along −y, plate centred on z = 0, one instance per pin; a bracket shared by several pins is
  // a part of its own, built in assembly coordinates about its first bore.
  std::size_t anchor = m.parts.size();
  for (const BracketPlan& br : hw.brackets) {
    const double hw_mm = br.half_width * mm_per_m, thick = br.thickness * mm_per_m;
    const double mid = (br.z_back + br.z_front) / 2 * mm_per_m;
    if (br.pins.size() == 1) {
      if (anchor == m.parts.size()) {
        const double lug = dist(mm(br.outline[0]), mm(br.outline[1]));
        anchor = b.part(PartKind::anchor, "ANCHOR", "steel", steel_density, anchor_colour,
                        building("anchor", [&] {
                          return make_plate({{0, 0}, {0, -lug}}, hw_mm, {{0, 0}}, pin_r,
                                            -thick / 2, thick);
                        }));
      }
      const Vec2 at = mm(br.holes[0]), foot = mm(br.outline[1]);
      const double dir = std::atan2(foot.y - at.y, foot.x - at.x);
      b.instance(anchor, br.name,
                 compose(translation(at, mid), rotation(dir + std::numbers::pi / 2)));
      if (br.cheek) {
        b.instance(anchor, br.name + "-FRONT",
                   compose(translation(at, (br.cheek_z_back + br.cheek_z_front) / 2 * mm_per_m),
                           rotation(dir + std::numbers::pi / 2)));
      }
    } else {
      const Vec2 o = mm(br.holes[0]);
      std::vector<Vec2> pts, holes;
      for (Vec2 p : br.outline) pts.push_back({p.x * mm_per_m - o.x, p.y * mm_per_m - o.y});
      for (Vec2 p : br.holes) holes.push_back({p.x * mm_per_m - o.x, p.y * mm_per_m - o.y});
      const std::size_t part = b.part(PartKind::anchor, br.name, "steel", steel_density,
                                      anchor_colour, building(br.name, [&] {
                                        return make_plate(pts, hw_mm, holes, pin_r, -thick / 2, thick);
                                      }));
      b.instance(part, br.name, translation(o, mid));
      if (br.cheek) {
        b.instance(part, br.name + "-FRONT",
                   translation(o, (br.cheek_z_back + br.cheek_z_front) / 2 * mm_per_m));
      }
    }
  }

  // Pins as bought (src/standard_parts.hpp): ISO 2341 B clevis pins, one part per size and
  // length, the head's underside at z = 0 in part coordinates; ISO 8738 washers and ISO 1234
  // split pins on the tail; spacer sleeves where the plan stands an end off. Each pin's parts
  // move with it.
  for (const PinPlan& s : hw.pins) {
    const standard::PinSet& set = s.set;
    const double d = set.pin.d * mm_per_m;
    const std::string size = num(d) + "x" + num(set.length * mm_per_m);
    const ClevisPinDims pin_dims{d, set.pin.dk * mm_per_m, set.pin.k * mm_per_m, set.length * mm_per_m,
                                 set.pin.d1 * mm_per_m, set.hole_at * mm_per_m};
    const std::size_t pin_part = part_once(
        PartKind::pin, "CLEVIS-PIN-" + size, set.pin_designation(), pin_colour,
        [&] { return make_clevis_pin(pin_dims, !options.for_views); });
    const std::size_t washer_part = part_once(
        PartKind::washer, "WASHER-" + num(d), set.washer_designation(), pin_colour, [&] {
          return make_ring(set.washer.d1 * mm_per_m, set.washer.d2 * mm_per_m, 0, set.washer.h * mm_per_m);
        });
    const std::size_t split_part = part_once(
        PartKind::split_pin, "SPLIT-PIN-" + num(set.split.nominal * mm_per_m) + "x" + num(set.split_length * mm_per_m),
        set.split_designation(), pin_colour, [&] {
          return make_split_pin(d, set.split.d * mm_per_m, set.split.c * mm_per_m);
        });
    // The pin's frame: z along the pin from the head's underside toward its end (flipped when the
    // head is in front), x along the split-pin hole (toward the eye).
    const double sign = s.head_front ? -1 : 1;
    const double under_head = s.head_front ? (s.grip_front + s.sleeve_front) * mm_per_m
                                           : (s.grip_back - s.sleeve_back) * mm_per_m;
    gp_Trsf flip;
    if (s.head_front) flip.SetRotation(gp_Ax1(gp_Pnt(0, 0, 0), gp_Dir(1, 0, 0)), std::numbers::pi);
    const bool moves = s.on_lever && s.id != "PIVOT";
    auto place = [&](double along, double extra_turn) {
      // `along`: distance from the head's underside along the pin [mm].
      gp_Trsf spin;
      spin.SetRotation(gp_Ax1(gp_Pnt(0, 0, 0), gp_Dir(0, 0, 1)), s.split_angle * sign + extra_turn);
      const gp_Trsf local = compose(flip, compose(translation(Vec2{0, 0}, along), spin));
      const gp_Trsf world = moves ? compose(lever_place, translation(rel(mm(s.at)), under_head - lever_mid))
                                  : translation(mm(s.at), under_head);
      return compose(world, local);
    };
    const std::string name = "PIN-" + s.id;
    // The drawing shows the pin without its hole and the split pin by its eye (Part::display).
    if (m.parts[pin_part].display.IsNull()) {
      m.parts[pin_part].display = options.for_views ? m.parts[pin_part].shape
                                                    : building("pin " + name, [&] {
                                                        return make_clevis_pin(pin_dims, false);
                                                      });
      m.parts[pin_part].axis_from = gp_Pnt(0, 0, -pin_dims.k);
      m.parts[pin_part].axis_to = gp_Pnt(0, 0, pin_dims.length);
      m.parts[pin_part].bound_radius = std::max(pin_dims.dk, pin_dims.d) / 2;
      const AxialMass pm = clevis_pin_mass(pin_dims);
      m.parts[pin_part].known_volume = pm.volume;
      m.parts[pin_part].known_centroid = gp_Pnt(0, 0, pm.z);
    }
    if (m.parts[split_part].display.IsNull()) {
      m.parts[split_part].display = building("split pin " + name, [&] {
        return make_split_pin(d, set.split.d * mm_per_m, set.split.c * mm_per_m, false);
      });
    }
    b.instance(pin_part, name, place(0, 0));
    // The washer lies against the tail's face, the split pin through the hole.
    const double tail_face = (s.grip_front - s.grip_back + s.sleeve_back + s.sleeve_front) * mm_per_m;
    b.instance(washer_part, "WASHER-" + s.id, place(tail_face, 0));
    b.instance(split_part, "SPLIT-PIN-" + s.id, place(set.hole_at * mm_per_m, 0));
    touch(name, "WASHER-" + s.id);
    touch(name, "SPLIT-PIN-" + s.id);
    touch("WASHER-" + s.id, "SPLIT-PIN-" + s.id);
    std::vector<std::string> holds;  // the plates it passes through
    if (s.carries_band) {
      const JointPlan* j = s.id == "A" ? &hw.joint_a : s.id == "B" ? &hw.joint_b : nullptr;
      holds.push_back(j && j->kind == JointKind::welded_block ? "END-BLOCK-" + s.id : "BAND");
      // The band's edges lie flush with the end block's faces, where the head or washer bears.
      if (j && j->kind == JointKind::welded_block) holds.push_back("BAND");
    }
    if (s.on_lever) holds.push_back("LEVER");
    if (!s.bracket.empty()) {
      holds.push_back(s.bracket);
      for (const BracketPlan& br : hw.brackets) {
        if (br.name == s.bracket && br.cheek) holds.push_back(s.bracket + "-FRONT");
      }
    }
    for (const std::string& h : holds) {
      touch(name, h);
      touch("WASHER-" + s.id, h);  // bears on the outer plate
    }
    for (bool front : {false, true}) {
      const double len = (front ? s.sleeve_front : s.sleeve_back) * mm_per_m;
      if (len <= 0) continue;
      const std::size_t sleeve_part = part_once(
          PartKind::sleeve, "SLEEVE-" + num(d) + "x" + num(len), "spacer sleeve, steel tube Ø" +
              num(s.sleeve_diameter * mm_per_m) + " × " + num((s.sleeve_diameter - set.pin.d) / 2 * mm_per_m) +
              " wall, " + num(len) + " long",
          pin_colour, [&] { return make_ring(d, s.sleeve_diameter * mm_per_m, 0, len); });
      // Its near end on the pin's axis coordinate: from under the head (head side) or from the
      // outer plate's face (tail side).
      const bool head_side = front == s.head_front;
      const double start = head_side ? 0 : (s.grip_front - s.grip_back + (front ? s.sleeve_back : s.sleeve_front)) * mm_per_m;
      const std::string sleeve_name = std::string("SLEEVE-") + s.id + (front ? "-FRONT" : "-BACK");
      b.instance(sleeve_part, sleeve_name, place(start, 0));
      touch(sleeve_name, name);
      touch(sleeve_name, "WASHER-" + s.id);
      for (const std::string& h : holds) touch(sleeve_name, h);
    }
  }

  // The applying element (src/apply.hpp): the spring between its seats, or the weight on its
  // hanger. Seats, hanger and block are what bandforge adds (ApplyResult::mount); what rides on
  // the lever turns with it in the released state.
  const ApplyResult& ap = solution.apply;
  if (ap.present && ap.mount.present) {
    const ElementMount& mount = ap.mount;
    if (!mount.refusal.empty()) throw BuildError(mount.refusal);
    gp_Trsf lever_motion;
    lever_motion.SetRotation(gp_Ax1(gp_Pnt(pivot.x, pivot.y, 0), gp_Dir(0, 0, 1)), m.lever_rotation);
    const gp_Trsf lever_applied = translation(pivot, lever_mid);
    const TopoDS_Shape& lever_shape = m.parts[lever].shape;
    if (design.apply.by == ApplyBy::spring) {
      const SpringResult& sp = ap.spring;
      // A seat: disc and spigot about z, the spring's face at z = 0, the plate behind it.
      auto seat_shape = [&](const SeatPlan& st) {
        const TopoDS_Shape disc = make_rod(st.diameter / 2 * mm_per_m, -st.thickness * mm_per_m,
                                           st.thickness * mm_per_m);
        const TopoDS_Shape spigot = make_rod(st.spigot_diameter / 2 * mm_per_m, -st.thickness * mm_per_m / 2,
                                             (st.thickness / 2 + st.spigot_height) * mm_per_m);
        return fused(disc, spigot);
      };
      const SeatPlan& ls = mount.lever_seat;
      const SeatPlan& fs = mount.frame_seat;
      // The lever's seat reaches its edge and is notched over it (welded there).
      const gp_Trsf lever_seat_place = along(mm(ls.face), lever_mid, {-ls.normal.x, -ls.normal.y});
      const std::size_t seat_l = b.part(PartKind::seat, "SEAT-LEVER", "steel", steel_density, seat_colour,
                                        building("spring seat on the lever", [&] {
                                          const TopoDS_Shape lever_here = lever_shape.Moved(
                                              TopLoc_Location(lever_seat_place.Inverted().Multiplied(lever_applied)));
                                          return cut(seat_shape(ls), lever_here);
                                        }));
      m.infos[seat_l].designation = "seat plate Ø" + dim(ls.diameter) + " × " + dim(ls.thickness) +
                                    ", spigot Ø" + dim(ls.spigot_diameter) + " × " + dim(ls.spigot_height) +
                                    ", notched over the lever and welded";
      b.instance(seat_l, "SEAT-LEVER", compose(lever_motion, lever_seat_place));
      const std::size_t seat_f = b.part(PartKind::seat, "SEAT-FRAME", "steel", steel_density, seat_colour,
                                        building("spring seat on the frame", [&] { return seat_shape(fs); }));
      m.infos[seat_f].designation = "seat plate Ø" + dim(fs.diameter) + " × " + dim(fs.thickness) +
                                    ", spigot Ø" + dim(fs.spigot_diameter) + " × " + dim(fs.spigot_height) +
                                    ", fixed to the machine frame";
      b.instance(seat_f, "SEAT-FRAME", along(mm(fs.face), lever_mid, {-fs.normal.x, -fs.normal.y}));
      // The spring between the two faces of the state built: its lever end turns with the lever.
      const gp_Pnt lever_end = gp_Pnt(mm(ls.face).x, mm(ls.face).y, 0).Transformed(lever_motion);
      const Vec2 from{lever_end.X(), lever_end.Y()}, to = mm(fs.face);
      const double length = dist(from, to);
      SpringDims sd;
      sd.wire = sp.wire_diameter * mm_per_m;
      sd.mean_diameter = sp.mean_diameter * mm_per_m;
      sd.total_coils = sp.total_coils;
      sd.active_coils = sp.active_coils;
      sd.ends = sp.ends;
      sd.length = length;
      // The material column says "spring steel"; the wire is named in the specification.
      const double od = sp.outer_diameter * mm_per_m;
      // Clearances are measured to the coils' outer cylinder, and the views project it: a
      // simplified view (ISO 2162-1) whose coil lines the assembly sheet draws inside the outline.
      const TopoDS_Shape outline = building("spring envelope", [&] { return make_rod(od / 2, 0, length); });
      const std::size_t spring =
          b.part(PartKind::spring, "SPRING", "spring steel", steel_density, spring_colour,
                 options.for_views ? outline : building("spring", [&] { return make_spring(sd); }));
      m.infos[spring].designation = spring_designation(sp);
      m.parts[spring].envelope = outline;
      m.parts[spring].display = outline;
      // The wire's volume from the same centreline the solid is built on (within 2e-5 of the
      // solid's adaptive integral: tests/spring_solid_test.cpp), its centroid the envelope's.
      m.parts[spring].known_volume = spring_volume_estimate(sd);
      m.parts[spring].known_centroid = gp_Pnt(0, 0, length / 2);
      b.instance(spring, "SPRING", along(from, lever_mid, {(to.x - from.x) / length, (to.y - from.y) / length}));
      touch("SPRING", "SEAT-LEVER");
      touch("SPRING", "SEAT-FRAME");
      touch("SEAT-LEVER", "LEVER");
    } else {
      const WeightMount& wm = mount.weight;
      const Vec2 hang = mm(wm.hang);
      const Vec2 down{0, -1};
      // The hanger rod, its top notched to the lever's edge (welded), down through the block.
      const double reach_in = 5;  // [mm] into the lever before the notch cut
      const gp_Trsf rod_place = along({hang.x, hang.y + reach_in}, lever_mid, down);
      const std::size_t rod = b.part(PartKind::hanger, "HANGER", "steel", steel_density, seat_colour,
                                     building("weight hanger", [&] {
                                       const TopoDS_Shape lever_here = lever_shape.Moved(
                                           TopLoc_Location(rod_place.Inverted().Multiplied(lever_applied)));
                                       return cut(make_rod(wm.rod_diameter / 2 * mm_per_m, 0,
                                                           wm.rod_length * mm_per_m + reach_in),
                                                  lever_here);
                                     }));
      m.infos[rod].designation = "round bar Ø" + dim(wm.rod_diameter) + ", welded to the lever and the block";
      b.instance(rod, "HANGER", compose(lever_motion, rod_place));
      const std::size_t block = b.part(PartKind::weight, "WEIGHT", "steel", steel_density, block_colour,
                                       building("weight block", [&] {
                                         return make_ring(wm.rod_diameter * mm_per_m, wm.block_diameter * mm_per_m,
                                                          0, wm.block_height * mm_per_m);
                                       }));
      char mass[48];
      std::snprintf(mass, sizeof mass, "%.2f kg with the hanger", design.apply.mass);
      m.infos[block].designation = "round bar Ø" + dim(wm.block_diameter) + " × " + dim(wm.block_height) +
                                   ", bored Ø" + dim(wm.rod_diameter) + "; " + mass;
      b.instance(block, "WEIGHT",
                 compose(lever_motion, along({hang.x, hang.y - wm.drop * mm_per_m}, lever_mid, down)));
      touch("HANGER", "LEVER");
      touch("HANGER", "WEIGHT");
    }
  }

  m.intended = intended;
  BrakeModel model(std::move(impl));
  if (options.checks) check_model(model, options);
  return model;
}

void check_model(BrakeModel& model, const BuildOptions& options) {
  BrakeModel::Impl& m = model.impl();
  try {
    run_checks(m, m.intended, options.interference, options.validity);
  } catch (const Standard_Failure& e) {
    throw BuildError(std::string("while checking the assembly: ") + e.GetMessageString());
  }
  if (options.reject_failures) reject_failures(m);
}

}  // namespace bandforge::geom
