// The hardware bandforge adds by itself: frame brackets for the pivot and the frame-held band
// ends, the joint at each band end, the axial (z) stack of plates and pin lengths. Decided here,
// once, as plain 2-D numbers (front view, SI) from the design and the solved layout, so that the
// solids (geometry/), `solve --json`, the calculation sheet and the layout search all use the
// same decisions. What bandforge adds adapts to the designer's layout: a choice that collides is
// changed (bracket shared, moved behind the drum face or in front of the lever; a shorter joint),
// and only a layout that cannot be built at all is refused, with the key to change and by how
// much. Proportions and limits are listed in README.md "Generated hardware".
#pragma once

#include <string>
#include <vector>

#include "src/check.hpp"
#include "src/design.hpp"
#include "src/standard_parts.hpp"

namespace bandforge {

struct Layout;
struct Solution;

/// Axial (z) positions [m]: drum axis toward the viewer, band mid-plane at z = 0, front > back.
struct AxialPlan {
  double drum_back = 0, drum_front = 0;    ///< drum rim faces (±w/2)
  double band_back = 0, band_front = 0;    ///< band and lining (±b/2)
  double lever_back = 0, lever_front = 0;  ///< lever plate
  double grip_front = 0;                   ///< front end of the handle grip
  double gap = 0;                          ///< least axial gap between neighbouring plates
                                           ///< (wider where a pin's head or tail needs room)
  bool lever_outboard = false;             ///< lever moved in front of the drum face (its outline
                                           ///< crosses the drum in the front view)
};

enum class BracketSide { behind, front };

/// One frame bracket: a flat steel plate on the frame holding one or more frame pins.
struct BracketPlan {
  std::string name;               ///< "ANCHOR-A" (a lug for one pin) or "BRACKET-A-PIVOT" (shared)
  std::vector<std::string> pins;  ///< pin ids held: "A", "B", "PIVOT"
  std::vector<Vec2> holes;        ///< bore centres, same order as `pins` [m]
  std::vector<Vec2> outline;      ///< the plate: convex hull of discs of `half_width` about these [m]
  double half_width = 0;          ///< [m]
  double thickness = 0;           ///< [m]
  double z_back = 0, z_front = 0; ///< [m]
  BracketSide side = BracketSide::behind;
  bool behind_drum = false;       ///< moved behind the drum's back face (outline crosses the drum)
  /// A second plate of the same outline on the far side of the load (a pair of cheeks, the pins
  /// in double shear), when it fits: in front of the band, or in front of the lever.
  bool cheek = false;
  double cheek_z_back = 0, cheek_z_front = 0;  ///< [m]
  std::vector<double> loads;      ///< worst pin load at each bore [N]
  std::vector<double> offsets;    ///< single plate: axial distance from its mid-plane to each
                                  ///< load line [m] (the overhung pin bends the plate)
};

/// One pin: the pivot or a band end.
struct PinPlan {
  std::string id;          ///< "A", "B", "PIVOT"
  Vec2 at;                 ///< centre, applied state [m]
  bool on_lever = false;   ///< passes through the lever (moves with it, unless the pivot)
  bool carries_band = false;
  std::string bracket;     ///< the bracket that holds it ("" for a pin on the lever only)
  double grip_back = 0, grip_front = 0;  ///< outer faces of the outermost plates it holds [m]
  double z_back = 0, z_front = 0;  ///< ends of the pin as built: head face and shank end [m]
  bool head_front = false;         ///< head on the front (+z) face; washer and split pin behind
  standard::PinSet set;            ///< ISO 2341 B clevis pin, ISO 8738 washer, ISO 1234 split pin
  /// Spacer sleeves (tubes) between the outer plate and the head or washer, where an end must
  /// stand further out to clear a part beside it (0: none) [m].
  double sleeve_back = 0, sleeve_front = 0;
  double sleeve_diameter = 0;      ///< outside diameter of a sleeve [m]
  /// Direction of the split pin's eye from the pin's axis, front view, applied state [rad]
  /// (the split-pin hole lies along it).
  double split_angle = 0;
};

/// Band-end joint kinds (design key `[band] end_joint`).
enum class JointKind {
  riveted_lap,      ///< eye round the pin, tail laid back on the run and riveted (2d edge, 3d pitch)
  riveted_compact,  ///< the same lap with a rivet from the standard series and the least spacings
  welded_block,     ///< a steel end block with the pin bore; the band end welded into its slot
};

/// "riveted-lap", "riveted-compact", "welded-block".
const char* to_string(JointKind kind);

struct JointPlan {
  JointKind kind = JointKind::riveted_lap;
  std::string end;        ///< "A" or "B"
  bool chosen_automatically = true;
  double tension = 0;     ///< largest tension this end carries over all cases [N]
  double room = 0;        ///< straight strip the layout leaves for the joint [m]
  double needs = 0;       ///< length of run the joint takes [m]
  // Riveted laps.
  double rivet = 0;              ///< rivet (hole) diameter [m]
  double edge = 0;               ///< end and edge distance [m]
  double pitch = 0;              ///< row pitch along the strip [m]
  int rows = 0, columns = 0;
  std::vector<double> across;    ///< column positions from the band's back edge [m]
  double lap = 0;                ///< tail length laid back on the run [m]
  double rivet_capacity = 0;     ///< shear capacity of all rivets [N]
  /// Each row's distance from the pin centre along the run toward the drum [m], the row nearest
  /// the tail's free end first: ρ + lap − (edge + k·pitch), ρ = pin radius + t/2 (the band
  /// blank's holes with the eye closed, geometry/flat_band.cpp).
  std::vector<double> rivet_at;
  /// The rivets as bought and set: round head on the tail (outside), closed round on the run's
  /// drum side, or flush where a round closing head would come within `hardware_rules::
  /// clearance` of the band's circle (short runs: the rows near the tangent point).
  standard::RivetSet rivets;
  // Welded end block (part coordinates: pin at the origin, run along −x toward the drum).
  double block_front = 0;        ///< block face beyond the pin, from the pin centre [m]
  double block_back = 0;         ///< block face toward the drum, from the pin centre [m]
  double block_height = 0;       ///< across the run in the front view [m]
  double slot_depth = 0;         ///< how far the band end enters the block [m]
  double weld_leg = 0;           ///< fillet weld leg, both faces at the slot mouth [m]
};

/// Everything generated, for a design with pin coordinates.
struct HardwarePlan {
  bool present = false;    ///< false for a [concept] design
  std::string refusal;     ///< why the layout cannot be built (empty: it can); exit 3 at build
  /// The released state (lever turned back by the release rotation, band on r_b + clearance)
  /// keeps every band end clear of the lifted band. When not, the applied state still builds;
  /// the released one (`build --released`, the drawing's phantom lever) does not, and the check
  /// `release_clearance` fails with `release_problem` saying what to change.
  bool release_ok = true;
  std::string release_problem;
  AxialPlan axial;
  std::vector<BracketPlan> brackets;
  std::vector<PinPlan> pins;
  JointPlan joint_a, joint_b;
  std::vector<Check> checks;  ///< bracket and joint checks (also in Solution::checks)
};

/// Common practice, no source: stated in README.md "Generated hardware".
namespace hardware_rules {
inline constexpr double axial_gap = 0.004;       ///< between neighbouring plates [m]
inline constexpr double grip_diameter = 0.030;   ///< hand grip [m]
inline constexpr double grip_length = 0.100;     ///< one hand's width [m]
inline constexpr double clearance = 0.003;       ///< least gap the plan leaves between parts [m]
}  // namespace hardware_rules

/// The plan for a solved design with pins. Never throws for a layout that cannot be built: it
/// says why in `refusal` (build turns that into exit status 3).
HardwarePlan plan_hardware(const Design& design, const Solution& solution);

/// Smallest distance from `p` to the convex hull of `points` grown by `radius` (negative inside).
double distance_to_plate(Vec2 p, const std::vector<Vec2>& points, double radius);

/// Smallest distance between two such plates (0 when they touch or overlap).
double distance_between_plates(const std::vector<Vec2>& a, double ra, const std::vector<Vec2>& b,
                               double rb);

}  // namespace bandforge
