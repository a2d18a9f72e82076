// The brake as exact solids (OpenCASCADE B-rep), behind a wall: this header uses standard types
// only, so src/ and drawing/ headers never see an OCCT type. All lengths here are millimetres
// (the CAD convention); the design model is SI, converted once in build_brake().
#pragma once

#include <array>
#include <memory>
#include <string>
#include <vector>

#include "src/design.hpp"
#include "src/mechanics.hpp"

namespace bandforge::geom {

struct Vec3 {
  double x = 0, y = 0, z = 0;
};

/// sRGB colour, components 0..1, written exactly into the STEP file.
struct Rgb {
  double r = 0, g = 0, b = 0;
};

/// One distinct part (a STEP product). Instances share the part's shape.
struct PartInfo {
  std::string name;          ///< readable product name, e.g. "DRUM", "PIN-D16"
  std::string material;      ///< e.g. "cast-iron", "steel", "woven lining"
  /// A bought part's standard designation ("Clevis pin ISO 2341 - B - 16 × 60 - St"), or what
  /// a simple made part is cut from; empty for the other made parts.
  std::string designation;
  double density = 0;        ///< [kg/m³]
  double volume = 0;         ///< one instance [mm³]
  double mass = 0;           ///< one instance [kg]
  Vec3 centroid;             ///< of the first instance, assembly coordinates [mm]
  Rgb colour;
  std::vector<std::string> instance_names;  ///< one per placement, e.g. "PIN-PIVOT"
  std::vector<Vec3> instance_origins;       ///< placement of each instance [mm]
};

/// One interference or clearance finding between two parts.
struct ContactCheck {
  std::string part_a, part_b;
  double common_volume = 0;  ///< [mm³] measured with a boolean common
  double tolerance = 0;      ///< allowed common volume [mm³]
  bool intended = false;     ///< an intended contact (band on drum, pin in hole)
  bool ok = true;
  /// Smallest distance between the two [mm] for parts that must stay clear; −1 when not
  /// measured (intended contacts, whose distance is zero by design). Measured to the drum's
  /// outer cylinder (Ø D × face width), from the bounding boxes when those alone keep the parts
  /// apart, and between the bounding capsules of round parts (pins, rivets) when those alone
  /// keep them apart: all can only understate the clearance.
  double distance = -1;
  double min_distance = 0;   ///< required clearance for parts that must stay clear [mm]
};

struct BuildOptions {
  bool released = false;  ///< band lifted by the radial clearance, lever rotated back
  /// Throw BuildError on an invalid solid or a failed contact check (the command's behaviour).
  /// false returns the model with the failures recorded, for inspection.
  bool reject_failures = true;
  /// Run the checks (validity, mass properties, interference). Only the benchmark turns this
  /// off, to time the solids alone; without checks parts() has no volumes or masses.
  bool checks = true;
  /// With checks: also the pairwise interference and clearance checks. false keeps validity
  /// and mass properties only (the drawing's own copy of a model already checked).
  bool interference = true;
  /// With checks: BRepCheck_Analyzer on every solid. false for the drawing's own copy of a
  /// model that the command builds and checks in full beside it.
  bool validity = true;
  /// Stop after the lever and its grip (no brackets, pins, rivets or applying element): the
  /// drawing's phantom of the released lever, which shows those two only.
  bool lever_only = false;
  /// The drawing's copy: every part as the views and detail sheets show it, the clevis pins
  /// without their split-pin holes and the spring as its outer cylinder (their booleans and
  /// B-spline faces are two thirds of the solids' time). Their masses come from their
  /// dimensions as in every model (Part::known_volume), so the lists agree with the checked
  /// model; such a copy is not for export or interference checks.
  bool for_views = false;
};

/// While any QuietOcct is alive, OpenCASCADE's messages go to stderr and only at failure level,
/// so stdout stays clean (the STEP writer prints transfer statistics otherwise). The messenger is
/// process-wide: guards nest and may be held by several threads at once; the first one in
/// replaces the printers, the last one out puts them back. A caller that runs OCCT work on several
/// threads holds one for the whole time, so the printers never change under a running thread.
class QuietOcct {
 public:
  QuietOcct();
  ~QuietOcct();
  QuietOcct(const QuietOcct&) = delete;
  QuietOcct& operator=(const QuietOcct&) = delete;
};

class BrakeModel {
 public:
  ~BrakeModel();
  BrakeModel(BrakeModel&&) noexcept;
  BrakeModel& operator=(BrakeModel&&) noexcept;

  const std::vector<PartInfo>& parts() const;
  const std::vector<ContactCheck>& contacts() const;
  /// Every solid passed BRepCheck_Analyzer.
  bool all_valid() const;

  struct Impl;  // OCCT shapes; defined in geometry/occt_model.hpp (geometry/ and drawing/ only)
  Impl& impl() const { return *impl_; }
  explicit BrakeModel(std::unique_ptr<Impl> impl);

 private:
  std::unique_ptr<Impl> impl_;
};

/// Builds the solids where the mechanics put them. Throws BuildError (exit 3) naming the part
/// and dimension when a part cannot be made; never lets an OCCT exception escape.
BrakeModel build_brake(const Design& design, const Solution& solution, const BuildOptions& options);

/// The checks of a model built with `checks` off (validity, mass properties and, per `options`,
/// interference), then, with options.reject_failures, the BuildError build_brake would throw.
/// Lets a caller start work on the solids (the STEP export, in a child process) before the
/// checks run.
void check_model(BrakeModel& model, const BuildOptions& options);

/// Writes an AP214 STEP assembly to `path` (reproducible bytes). Throws IoError / BuildError.
void write_step(const BrakeModel& model, const Design& design, const std::string& path);

}  // namespace bandforge::geom
