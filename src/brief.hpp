// A brief: what a brake must do and where it may sit, for `bandforge propose` (src/propose.hpp).
// Read by src/brief_reader.cpp with the design file's conventions and machinery. Plain values in
// SI, front view with the drum centre at the origin (x right, y up), as in a design file.
#pragma once

#include <map>
#include <string>
#include <vector>

#include "src/design.hpp"

namespace bandforge {

/// A region of the front view: a convex or concave polygon (≥ 3 corners), or a line segment
/// (2 points), or a single point (1 point: the position is fixed).
struct Region {
  std::vector<Vec2> corners;  ///< [m]
};

/// What the search minimises ([goal] minimise).
enum class Goal { force, band_mass, travel, size };

const char* to_string(Goal g);

/// Standard stock the search chooses from (each list ascending).
struct Stock {
  std::vector<double> band_width;      ///< [m]
  std::vector<double> band_thickness;  ///< [m]
  std::vector<double> pin_diameter;    ///< [m]
  std::vector<double> lever_width;     ///< lever plate width in the view plane [m]
  std::vector<double> lever_thickness; ///< lever plate thickness along the axis [m]
  double band_allowable_stress = 0;    ///< [Pa]
  double lever_allowable_stress = 0;   ///< [Pa]
  std::string band_width_source, band_thickness_source, pin_diameter_source, lever_plate_source;
  std::string band_stress_source, lever_stress_source;
};

struct Brief {
  std::string file;  ///< path the brief was read from (for messages)
  Project project;

  // [drum]
  std::vector<double> drum_diameters;  ///< one, or a list to choose from [m]
  double drum_width = 0;               ///< 0: the band width + margin (README "Briefs")
  double bore = 0;                     ///< [m]
  Turn rotation = Turn::cw;
  Drum drum_material;                  ///< material key, density, specific heat, source

  Lining lining;

  // [load]
  double torque = 0;          ///< required braking torque before the service factor [N·m]
  double service_factor = 1;
  bool both_directions = false;

  // [operator]
  double max_force = 0;       ///< at the handle, at the lowest friction [N]
  double max_travel = 0;      ///< handle travel to take up the clearance; 0 = not limited [m]

  // [space]
  Region pins;                ///< every pin (band ends and pivot) unless narrowed below
  Region frame_pin;           ///< optional: where a frame-held band end may go (empty = pins)
  Region lever_pins;          ///< optional: where a band end on the lever may go (empty = pins)
  Region pivot;               ///< optional: where the pivot may go (empty = pins)
  Region handle;              ///< where the operator's force may act
  std::vector<Region> keep_out;  ///< nothing may enter these

  // [limits]
  double self_lock_margin = 1.25;  ///< lowest self-locking f ≥ margin × f_max
  bool allow_self_locking = false;
  double clearance = 0.0015;       ///< radial release clearance [m]

  Stock stock;

  // [goal]
  Goal goal = Goal::force;
  int proposals = 5;
  std::vector<BrakeKind> kinds = {BrakeKind::simple, BrakeKind::differential, BrakeKind::summing};

  Duty duty;                  ///< optional [duty], passed on to every proposal

  std::map<std::string, SourcePos> where;
};

/// Reads and validates a brief ("-": standard input). Throws DesignError (exit 2) or IoError.
Brief read_brief_file(const std::string& path);
Brief read_brief_text(std::string_view text, const std::string& name);

/// Even–odd point-in-polygon test (boundary points may fall either way).
bool polygon_contains(const std::vector<Vec2>& corners, Vec2 p);

/// Point-in-region: inside or on the boundary of a polygon (within `tol`), on a segment, or at
/// the point.
bool region_contains(const Region& r, Vec2 p, double tol = 1e-9);
/// The closest point of the region to `p` (`p` itself when inside).
Vec2 region_closest(const Region& r, Vec2 p);
/// Distance from `p` to the region (0 inside) [m].
double region_distance(const Region& r, Vec2 p);

}  // namespace bandforge
