// Checks run on every build: solid validity, mass properties, interference and clearance.
#include <algorithm>
#include <cstdio>
#include <string>
#include <vector>

#include <BRepAlgoAPI_Common.hxx>
#include <BRepBndLib.hxx>
#include <BRepCheck_Analyzer.hxx>
#include <BRepExtrema_DistShapeShape.hxx>
#include <BRepGProp.hxx>
#include <Bnd_Box.hxx>
#include <Standard_Failure.hxx>
#include <TopTools_ListOfShape.hxx>
#include <GProp_GProps.hxx>
#include <TopExp_Explorer.hxx>
#include <TopLoc_Location.hxx>
#include <TopoDS.hxx>

#include "geometry/assemble.hpp"
#include "src/errors.hpp"

namespace bandforge::geom {
namespace {

// Common volume allowed between two parts [mm³]: round-off of the boolean on touching faces,
// far below any real overlap (a 0.01 mm interference over 1 mm² is 0.01 mm³).
constexpr double common_tolerance = 1e-3;
// Parts that are not meant to touch must keep at least this apart [mm].
constexpr double least_clearance = 0.01;

double volume_of(const TopoDS_Shape& s) {
  GProp_GProps props;
  BRepGProp::VolumeProperties(s, props);
  return props.Mass();
}

int solid_count(const TopoDS_Shape& s) {
  int n = 0;
  for (TopExp_Explorer ex(s, TopAbs_SOLID); ex.More(); ex.Next()) ++n;
  return n;
}

// Boolean common of two solids; zero when the boolean finds nothing shared.
double common_volume(const TopoDS_Shape& a, const TopoDS_Shape& b) {
  BRepAlgoAPI_Common common;
  TopTools_ListOfShape args, tools;
  args.Append(a);
  tools.Append(b);
  common.SetArguments(args);
  common.SetTools(tools);
  // Leave the arguments untouched: they are the model's shapes, shared by several instances.
  common.SetNonDestructive(Standard_True);
  common.Build();
  if (!common.IsDone() || common.HasErrors()) {
    throw BuildError("the boolean common failed");
  }
  const TopoDS_Shape& r = common.Shape();
  return r.IsNull() || solid_count(r) == 0 ? 0.0 : volume_of(r);
}

}  // namespace

// Closest points of two segments, clamped to both: C. Ericson, Real-Time Collision Detection,
// 2005, §5.1.9 (from memory).
double segment_distance(const gp_Pnt& p0, const gp_Pnt& p1, const gp_Pnt& q0, const gp_Pnt& q1) {
  const gp_Vec d1(p0, p1), d2(q0, q1), r(q0, p0);
  const double a = d1.SquareMagnitude(), e = d2.SquareMagnitude(), f = d2.Dot(r);
  constexpr double eps = 1e-12;
  double s = 0, t = 0;
  if (a <= eps && e <= eps) return p0.Distance(q0);
  if (a <= eps) {
    t = std::clamp(f / e, 0.0, 1.0);
  } else {
    const double c = d1.Dot(r);
    if (e <= eps) {
      s = std::clamp(-c / a, 0.0, 1.0);
    } else {
      const double b = d1.Dot(d2), denom = a * e - b * b;
      s = denom > eps ? std::clamp((b * f - c * e) / denom, 0.0, 1.0) : 0.0;
      t = (b * s + f) / e;
      if (t < 0) {
        t = 0;
        s = std::clamp(-c / a, 0.0, 1.0);
      } else if (t > 1) {
        t = 1;
        s = std::clamp((b - c) / a, 0.0, 1.0);
      }
    }
  }
  const gp_Pnt cp = p0.Translated(d1 * s), cq = q0.Translated(d2 * t);
  return cp.Distance(cq);
}

void run_checks(BrakeModel::Impl& m, const IntendedContacts& intended, bool interference,
                bool validity) {
  // One thread on purpose: on two shared cores, OCCT's thread pool made the checks slower and
  // less predictable (measured, geometry/README.md), and sequential checks need no care about
  // OCCT's thread safety.
  m.valid = true;
  m.solid_ok.assign(m.parts.size(), false);
  for (std::size_t i = 0; i < m.parts.size(); ++i) {
    const TopoDS_Shape& s = m.parts[i].shape;
    PartInfo& info = m.infos[i];
    gp_Pnt centroid = m.parts[i].known_centroid;
    info.volume = m.parts[i].known_volume;
    if (info.volume <= 0) {
      GProp_GProps props;
      BRepGProp::VolumeProperties(s, props);
      info.volume = props.Mass();
      centroid = props.CentreOfMass();
    }
    info.mass = info.volume * 1e-9 * info.density;  // mm³ → m³
    // Centroid of the first instance, in assembly coordinates.
    for (const auto& in : m.instances) {
      if (in.part != i) continue;
      const gp_Pnt c = centroid.Transformed(in.placement);
      info.centroid = {c.X(), c.Y(), c.Z()};
      break;
    }
    // One closed solid, valid, with material inside (an inside-out solid has negative volume:
    // for a part whose volume is known from its construction, the solid's own Gauss-rule volume
    // is still measured for its sign when the model is validated).
    const bool inside = info.volume > 0 && (m.parts[i].known_volume <= 0 || !validity || volume_of(s) > 0);
    m.solid_ok[i] = solid_count(s) == 1 && (!validity || BRepCheck_Analyzer(s).IsValid()) && inside;
    m.valid = m.valid && m.solid_ok[i];
  }
  if (!interference) return;
  const std::vector<BrakeModel::Impl::Placed> placed = m.placed();

  // Pairs whose bounding boxes come within the clearance of each other. Intended contacts must
  // not overlap (common volume); all other pairs must keep clear (distance, and their overlap
  // when they do not).
  std::vector<Bnd_Box> boxes(placed.size());
  for (std::size_t i = 0; i < placed.size(); ++i) BRepBndLib::Add(placed[i].shape, boxes[i]);
  struct Pair {
    std::size_t i, j;
    bool boxes_apart;  // only watched: the boxes already keep the parts apart
  };
  // The lever's clearance to the band and to the drum is always reported (REFERENCE §1.9:
  // the lever must clear the drum), even when the boxes alone prove it.
  auto watched = [&](std::size_t i, std::size_t j) {
    const PartKind a = m.parts[placed[i].part].kind, b = m.parts[placed[j].part].kind;
    auto is = [&](PartKind x, PartKind y) { return (a == x && b == y) || (a == y && b == x); };
    return is(PartKind::lever, PartKind::band) || is(PartKind::lever, PartKind::drum);
  };
  std::vector<Pair> pairs;
  for (std::size_t i = 0; i < placed.size(); ++i) {
    for (std::size_t j = i + 1; j < placed.size(); ++j) {
      Bnd_Box bi = boxes[i];
      bi.Enlarge(least_clearance);
      const bool apart = bi.IsOut(boxes[j]);
      if (!apart || watched(i, j)) pairs.push_back({i, j, apart});
    }
  }
  auto envelope = [&](std::size_t i) {
    const auto& part = m.parts[placed[i].part];
    return part.envelope.IsNull() ? placed[i].shape
                                  : part.envelope.Moved(TopLoc_Location(m.instances[i].placement));
  };
  // Distance between the bounding capsules of two round parts (Part::bound_radius), in
  // assembly coordinates; −1 when either has none.
  auto capsule_distance = [&](std::size_t i, std::size_t j) {
    const auto& a = m.parts[placed[i].part];
    const auto& b = m.parts[placed[j].part];
    if (a.bound_radius <= 0 || b.bound_radius <= 0) return -1.0;
    const gp_Trsf& ta = m.instances[placed[i].instance].placement;
    const gp_Trsf& tb = m.instances[placed[j].instance].placement;
    const double axes = segment_distance(a.axis_from.Transformed(ta), a.axis_to.Transformed(ta),
                                         b.axis_from.Transformed(tb), b.axis_to.Transformed(tb));
    return std::max(0.0, axes - a.bound_radius - b.bound_radius);
  };
  m.contacts.assign(pairs.size(), ContactCheck{});
  for (std::size_t k = 0; k < pairs.size(); ++k) {
    const auto [i, j, boxes_apart] = pairs[k];
    ContactCheck& c = m.contacts[k];
    c.part_a = m.instances[i].name;
    c.part_b = m.instances[j].name;
    const auto key = std::minmax(c.part_a, c.part_b);
    c.intended = intended.count({key.first, key.second}) > 0;
    c.tolerance = common_tolerance;
    if (!c.intended) {
      c.min_distance = least_clearance;
      if (boxes_apart) {
        // A lower bound, and exact for plates facing each other across an axial gap.
        c.distance = boxes[i].Distance(boxes[j]);
      } else if (const double bound = capsule_distance(i, j); bound >= least_clearance) {
        // Round parts apart by their capsules: a lower bound, enough to pass.
        c.distance = bound;
      } else {
        BRepExtrema_DistShapeShape d(envelope(i), envelope(j));
        if (!d.IsDone()) {
          throw BuildError("the distance between " + c.part_a + " and " + c.part_b + " failed");
        }
        c.distance = d.Value();
      }
    }
    // Parts apart by more than the clearance share no volume: skip the boolean. An envelope
    // contains its shape, so the overlap with the envelope bounds the true overlap from above:
    // when the bound is within tolerance the exact boolean is not needed (for the drum, whose
    // web and hub make the boolean about twice as slow); otherwise the true overlap is measured.
    // A pin's washer and split pin sit where the plan put them, against the plate's face and
    // through the pin's hole, as do the joint rivets in their holes and the spring's ground ends
    // on their seats (in the released state the lever's seat turns by the release rotation, a
    // tilt the coils take up): their intended contacts are not measured (a boolean each, 12 for
    // three pins, trebled the checks' time; the spring's coils would cost more); their clearance
    // to every other part still is.
    auto retention = [&](std::size_t n) {
      const PartKind kind = m.parts[placed[n].part].kind;
      return kind == PartKind::washer || kind == PartKind::split_pin || kind == PartKind::rivet ||
             kind == PartKind::spring;
    };
    if (c.distance > least_clearance || (c.intended && (retention(i) || retention(j)))) {
      c.common_volume = 0.0;
    } else {
      const bool simplified = !m.parts[placed[i].part].envelope.IsNull() ||
                              !m.parts[placed[j].part].envelope.IsNull();
      c.common_volume = simplified ? common_volume(envelope(i), envelope(j))
                                   : common_volume(placed[i].shape, placed[j].shape);
      if (simplified && c.common_volume > c.tolerance) {
        c.common_volume = common_volume(placed[i].shape, placed[j].shape);
      }
    }
    c.ok = c.common_volume <= c.tolerance && (c.intended || c.distance >= c.min_distance);
  }
}

void reject_failures(const BrakeModel::Impl& m) {
  for (std::size_t i = 0; i < m.parts.size(); ++i) {
    if (!m.solid_ok[i]) {
      throw BuildError("cannot build the " + m.infos[i].name +
                       ": OpenCASCADE made an invalid solid (BRepCheck_Analyzer)");
    }
  }
  // Every failing pair, so that one run shows all that must move.
  std::string failures;
  bool element = false;  // the spring or weight, placed by [apply]
  auto is_element = [](const std::string& n) {
    return n == "SPRING" || n == "SEAT-LEVER" || n == "SEAT-FRAME" || n == "WEIGHT" || n == "HANGER";
  };
  for (const ContactCheck& c : m.contacts) {
    if (c.ok) continue;
    element = element || is_element(c.part_a) || is_element(c.part_b);
    char buf[200];
    if (c.common_volume > c.tolerance) {
      std::snprintf(buf, sizeof buf, "%s and %s overlap by %.3f mm³ (allowed %.3g mm³)",
                    c.part_a.c_str(), c.part_b.c_str(), c.common_volume, c.tolerance);
    } else {
      std::snprintf(buf, sizeof buf, "%s and %s are %.3f mm apart (they must clear by %.3g mm)",
                    c.part_a.c_str(), c.part_b.c_str(), c.distance, c.min_distance);
    }
    failures.append(failures.empty() ? "" : "; ").append(buf);
  }
  if (!failures.empty()) {
    throw BuildError("the parts interfere: " + failures +
                     (element ? ". The spring with its seats, or the weight on its hanger, stands where "
                                "[apply] puts it: move apply.at (and apply.seat), or the pins, the "
                                "pivot or the handle, so that the parts clear"
                              : ". Move the pins, the pivot or the handle, or change the plate sizes, so "
                                "that the parts clear"));
  }
}

}  // namespace bandforge::geom
