// The design model: one band brake as read from a design file.
// Plain values in SI units (m, N, Pa, rad, kg, s, J); absolute temperatures in °C.
// Nothing here converts units: the reader (design_reader.cpp) does that once, at the border.
#pragma once

#include <map>
#include <string>

namespace bandforge {

/// A point or vector in the front view: x right, y up, drum centre at the origin [m].
struct Vec2 {
  double x = 0.0;
  double y = 0.0;
};

/// A rotation sense seen from the front (drum axis toward the viewer).
enum class Turn { cw, ccw };

/// Where a band end is attached.
enum class Mount { lever, frame };

/// How the two band tensions act on the lever.
enum class BrakeKind { simple, differential, summing };

/// Which joint the band ends get ([band] end_joint); automatic: the first that fits the run
/// (riveted lap, compact riveted lap, welded end block), src/hardware.hpp.
enum class EndJointChoice { automatic, riveted_lap, riveted_compact, welded_block };

/// Which tension model relates the band to the drum (REFERENCE §1.11).
enum class TensionModel { thin, thick };

/// Where a value came from in the design file, for error messages and traceability.
struct SourcePos {
  int line = 0;    ///< 1-based, 0 when unknown (defaults)
  int column = 0;  ///< 1-based, 0 when unknown
};

/// Title-block data (ISO 7200 fields). Only `title` is required.
struct Project {
  std::string title;
  std::string number = "BRAKE-1";  ///< identification number; also the output file stem
  std::string revision;
  std::string owner;
  std::string creator;
  std::string approver;
  std::string date;  ///< ISO 8601 date of issue, e.g. "2026-11-30"
};

struct Drum {
  double diameter = 0.0;       ///< friction surface diameter D = 2r [m]
  double width = 0.0;          ///< face width of the rim [m]
  double bore = 0.0;           ///< shaft bore [m]
  Turn rotation = Turn::cw;    ///< the load's rotation that the brake must stop, seen from the front
  std::string material;        ///< key into the drum material table
  double density = 0.0;        ///< [kg/m³], from the table
  double specific_heat = 0.0;  ///< [J/(kg·K)], from the table
  std::string material_source; ///< where density and specific heat come from
};

struct Lining {
  std::string material;             ///< key into the lining table, or "" for explicit values
  double friction = 0.0;            ///< nominal coefficient of friction f
  double friction_min = 0.0;        ///< lowest credible f
  double friction_max = 0.0;        ///< highest credible f
  double pressure_limit = 0.0;      ///< allowable lining pressure [Pa]
  double temperature_limit = 0.0;   ///< maximum bulk temperature [°C]; 0 = not given
  double power_limit = 0.0;         ///< power per lining area [W/m²]; 0 = not given
  double thickness = 0.0;           ///< radial thickness; 0 = bare band [m]
  std::string friction_source;      ///< source of the friction values
  std::string pressure_source;      ///< source of the pressure limit
  std::string temperature_source;   ///< source of the temperature limit
  std::string power_source;         ///< source of the power limit
};

/// One end of the band: a pin on the lever or on the frame.
struct BandEnd {
  Mount mount = Mount::frame;
  Vec2 at;  ///< pin centre [m]
};

struct Band {
  double width = 0.0;             ///< steel band width b (the lining has the same width) [m]
  double thickness = 0.0;         ///< steel band thickness t [m]
  double allowable_stress = 0.0;  ///< allowable tensile stress, gross section [Pa]
  Turn sense = Turn::ccw;         ///< the way the band runs from end A round the drum to end B
  BandEnd end_a;
  BandEnd end_b;
  double pin_diameter = 0.0;         ///< band-end and pivot pin diameter [m]
  double pin_allowable_shear = 0.0;  ///< allowable pin shear stress [Pa]; default σ_allow/√3
  double clearance = 0.0;            ///< radial clearance when released [m]
  TensionModel model = TensionModel::thin;
  EndJointChoice end_joint = EndJointChoice::automatic;  ///< both ends
};

struct Lever {
  Vec2 pivot;                     ///< pivot centre O [m]
  Vec2 handle;                    ///< point H where the operator's force acts [m]
  double width = 0.0;             ///< plate width (in the view plane) [m]
  double thickness = 0.0;         ///< plate thickness (along the drum axis) [m]
  double allowable_stress = 0.0;  ///< allowable bending stress [Pa]
};

/// What the brake must do. Exactly one of torque / lever_force is given.
struct Load {
  enum class Given { torque, lever_force };
  Given given = Given::torque;
  double torque = 0.0;          ///< required braking torque before the service factor [N·m]
  double lever_force = 0.0;     ///< available operator force at the handle [N]
  double service_factor = 1.0;  ///< multiplies the required torque
};

/// What drives a hoist ([duty] drive): the hoist rules of REFERENCE §7 are for powered hoists.
enum class HoistDrive {
  unspecified,  ///< not said: solve() treats the hoist as powered (the safe assumption)
  powered,      ///< a motor lifts and lowers: the holding brake must set itself (29 CFR 1910.179(f))
  manual,       ///< hand-operated (a winch with a pawl): the hand brake controls the lowering
};

/// Optional thermal duty.
struct Duty {
  bool present = false;
  double speed = 0.0;           ///< drum speed at the start of a stop [rad/s]
  double inertia = 0.0;         ///< rotating inertia reflected to the drum shaft [kg·m²]
  double hoist_mass = 0.0;      ///< lowered mass; 0 = no hoist [kg]
  double hoist_speed = 0.0;     ///< load speed at the start of the stop [m/s]
  double stop_distance = 0.0;   ///< load travel during the stop [m]
  double rope_radius = 0.0;     ///< hoist rope radius on the brake shaft [m]
  double stops_per_hour = 0.0;  ///< [1/h]
  double ambient = 40.0;        ///< ambient temperature [°C]; default common practice
  HoistDrive drive = HoistDrive::unspecified;  ///< hoist duty only: powered or manual
};

/// What applies the brake ([apply] by).
enum class ApplyBy {
  hand,    ///< the operator's force at the handle (the default)
  weight,  ///< a weight hung on the lever; released by an actuator
  spring,  ///< a helical compression spring between the lever and the frame; released by an actuator
};

/// How a compression spring's ends are finished (Shigley 9th ed. Table 10-1).
enum class SpringEnds { plain, plain_ground, squared, squared_ground };

/// How the spring's ends are held, for its buckling limit (Shigley 9th ed. eq. 10-13, α).
enum class SpringSeats {
  flat_flat,        ///< both ends on parallel flat plates (α = 0.5)
  flat_pivoted,     ///< one end flat, one pivoted (α = 0.707)
  pivoted_pivoted,  ///< both ends pivoted (α = 1)
};

/// The applying element and its release actuator ([apply]); REFERENCE §8.
struct Apply {
  ApplyBy by = ApplyBy::hand;
  Vec2 at;                        ///< where the weight hangs or the spring acts on the lever [m]
  Vec2 seat;                      ///< spring: its other end, on the frame (axis at→seat) [m]
  double mass = 0.0;              ///< weight: the hanging mass [kg]
  double wear_allowance = 0.0;    ///< radial lining wear the element must still cover [m]
  Vec2 actuator_at;               ///< where the release actuator acts on the lever [m]
  bool both_rotations = false;    ///< size for the worse drum rotation, not only the design one
  std::string spring_material = "oil-tempered";  ///< key into the spring-wire table (src/spring.hpp)
  SpringEnds spring_ends = SpringEnds::squared_ground;
  SpringSeats spring_seats = SpringSeats::flat_pivoted;
  double spring_max_outer_diameter = 0.0;  ///< room for the coils; 0 = no limit [m]
};

/// Early sizing without pin coordinates: arms as in textbook figures.
struct Concept {
  bool present = false;
  BrakeKind kind = BrakeKind::simple;
  double wrap = 0.0;        ///< wrap angle φ [rad]
  double handle_arm = 0.0;  ///< perpendicular arm of the operator's force L [m]
  double arm_a = 0.0;       ///< perpendicular arm of end A about the pivot [m]
  double arm_b = 0.0;       ///< perpendicular arm of end B about the pivot [m]
};

/// Projection method of the drawing's views (ISO 5456-2).
enum class Projection {
  first,  ///< first angle: the view from the left placed on the right of the front view (ISO default)
  third,  ///< third angle: the view from the left placed on its left (ASME Y14.3, US shops)
};

/// Drawing options (used by drawing/).
struct DrawingOptions {
  std::string sheet;   ///< "A2", "A3", "A4"; "" = A3
  Projection projection = Projection::first;
  int scale_num = 0;   ///< scale numerator, 0 = choose automatically
  int scale_den = 0;   ///< scale denominator
};

struct Design {
  std::string file;  ///< path the design was read from (for messages)
  Project project;
  Drum drum;
  Lining lining;
  Band band;
  Lever lever;
  Load load;
  Duty duty;
  Apply apply;           ///< the [apply] block; by = hand when absent
  Concept concept_arms;  ///< the [concept] block; present => no pin layout, no geometry
  DrawingOptions drawing;
  /// Where each key was read, by dotted path ("band.end_a.at" → line 27, column 9), so that
  /// checks made after reading (the layout) can still point at the file.
  std::map<std::string, SourcePos> where;
};

/// Throws a DesignError for `key` ("band.end_a.at"), using the position recorded in `where`.
[[noreturn]] void design_fail(const Design& design, const std::string& key,
                              const std::string& value, const std::string& problem);

const char* to_string(Turn t);
const char* to_string(Mount m);
const char* to_string(BrakeKind k);
const char* to_string(ApplyBy b);         ///< "hand", "weight", "spring" (the design-file values)
const char* to_string(SpringEnds e);      ///< "plain", "plain-ground", "squared", "squared-ground"
const char* to_string(SpringSeats s);     ///< "flat-flat", "flat-pivoted", "pivoted-pivoted"
const char* to_string(HoistDrive d);      ///< "", "powered", "manual"

}  // namespace bandforge
