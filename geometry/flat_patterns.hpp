// Fabrication pack (issue 5): flat patterns of the parts that are cut from sheet or strip, and the
// cut list. Standard types only, millimetres and kilograms, like brake_model.hpp.
//
// Where each outline comes from (the same model as the solids, never a second description):
//   - band and lining blanks: the solved band path (Solution::layout: tangent runs, wrap, r_b) and
//     the eye the band solid is built with (ring of inner radius = pin radius round each pin),
//     developed on their neutral radii;
//   - lever and frame-anchor plates: read back from the solids themselves (the planar end face
//     of the extruded plate: its outer wire and hole wires, lines and arcs), so the DXF is the
//     face the solid was extruded from.
#pragma once

#include <functional>
#include <string>
#include <vector>

#include "geometry/brake_model.hpp"
#include "src/design.hpp"
#include "src/mechanics.hpp"

namespace bandforge::geom {

/// DXF flavour: R2000 (AC1015, LWPOLYLINE, $INSUNITS) by default; R12 (AC1009) for old cutters.
enum class DxfVersion { r2000, r12 };

/// One polyline vertex [mm]; `bulge` = tan(θ/4) of the arc to the next vertex (θ > 0 CCW), 0 = line.
struct FlatVertex {
  double x = 0, y = 0;
  double bulge = 0;
};

/// A round hole [mm].
struct FlatCircle {
  double x = 0, y = 0;
  double radius = 0;
};

/// A mark line (bend, roll or centre mark) [mm].
struct FlatLine {
  double x1 = 0, y1 = 0, x2 = 0, y2 = 0;
};

/// A short text at a point [mm] (tags beside bend lines).
struct FlatText {
  double x = 0, y = 0;
  double height = 0;
  std::string text;  ///< ASCII only: R12/R2000 text is not UTF-8
};

/// One length that makes up a developed blank, stated in the notes and the cut list.
struct DevelopedPiece {
  std::string what;   ///< e.g. "eye A: full turn round the pin, less the run inside it"
  double length = 0;  ///< [mm]
};

/// A part cut flat, one DXF file.
struct FlatPart {
  std::string name;      ///< cut-list name, e.g. "BAND-BLANK"
  std::string file;      ///< file name inside fab/, e.g. "band-blank.dxf"
  std::string solid;     ///< name of the solid it becomes (PartInfo::name), e.g. "BAND"
  std::string material;
  double thickness = 0;  ///< [mm]
  double density = 0;    ///< [kg/m³]
  int quantity = 0;
  /// Closed cut contours [mm]: [0] is the outline (counter-clockwise); any further ones are
  /// inner cut-outs that are not round holes.
  std::vector<std::vector<FlatVertex>> contours;
  std::vector<FlatCircle> holes;       ///< round holes (cut)
  std::vector<FlatLine> bend_lines;    ///< bend and roll lines (marked, not cut)
  std::vector<FlatLine> marks;         ///< centre marks (marked, not cut)
  std::vector<FlatText> tags;          ///< labels of the bend lines
  std::vector<std::string> notes;      ///< the NOTES layer, one line each
  std::vector<DevelopedPiece> developed;  ///< blank length as a sum (rolled parts only)
  double x_min = 0, y_min = 0;  ///< lower-left corner of the outline's bounding rectangle [mm]
  double length = 0;     ///< bounding rectangle of the outline along x [mm]
  double width = 0;      ///< along y [mm]
  double area = 0;       ///< net of holes and cut-outs [mm²]
  double perimeter = 0;  ///< of all cut contours and holes [mm]
  double mass = 0;       ///< one piece [kg]
};

/// One cut-list row. Flat parts have a DXF; pins and the grip are sawn from round bar.
struct CutListRow {
  std::string part;      ///< e.g. "BAND-BLANK", "PIN-D16x100"
  std::string file;      ///< DXF inside fab/, or "" for bar stock
  std::string material;
  std::string stock;     ///< "plate", "strip", "sheet", "round bar", "tube" or "bought"
  double thickness = 0;  ///< plate thickness, or bar diameter [mm]
  double length = 0;     ///< blank length [mm]
  double width = 0;      ///< blank width; bar diameter for round bar [mm]
  int quantity = 0;
  double mass = 0;       ///< one piece, as cut (holes out) [kg]
  std::string note;      ///< allowances, forming, what it becomes
};

/// Everything the fab/ folder holds, computed before anything is written.
struct FabPack {
  std::vector<FlatPart> parts;
  std::vector<CutListRow> rows;
};

/// Flattens the brake built by build_brake(). The band and lining are developed in the applied
/// state (the band as it lies on the drum: Solution::layout), whichever state `model` was built
/// in. Throws BuildError naming the part and the design key when a part cannot be flattened
/// (a lining too stiff to roll to its radius, a pin too small to form the band eye round it, a
/// run too short for the eye joint).
FabPack make_fab_pack(const Design& design, const Solution& solution, const BrakeModel& model);

/// The cut-list rows alone (for the calculation sheet's table).
std::vector<CutListRow> cut_list(const Design& design, const Solution& solution,
                                 const BrakeModel& model);

/// Writes every file of the pack ("<part>.dxf" per flat part and "cutlist.csv"), each to
/// path_for(file name). Throws IoError when a file cannot be written.
void write_fab_files(const FabPack& pack, DxfVersion version,
                     const std::function<std::string(const std::string& name)>& path_for);

/// make_fab_pack() and write_fab_files() into OUTDIR/fab/ through StagedOutputs (src/staging.hpp,
/// the same staging `build` uses): nothing is written when a part cannot be flattened, files
/// move into fab/ only when all exist, and pack files an earlier build left there are removed.
void write_fab_pack(const Design& design, const Solution& solution, const BrakeModel& model,
                    const std::string& outdir, DxfVersion version);

/// Removes from `fab_dir` the DXF files and cut list that `pack` did not write (an earlier build
/// of a design with more parts, e.g. a lining since set to zero thickness). Other files stay.
void remove_stale_fab_files(const std::string& fab_dir, const FabPack& pack);

/// The cut list as CSV text (RFC 4180, header line, '.' decimals, '\n' line ends).
std::string cutlist_csv(const std::vector<CutListRow>& rows);

/// Net area [mm²] and length [mm] of a closed bulge polyline (lines and arcs), counter-clockwise
/// positive. Shared by the pack and its tests.
double contour_area(const std::vector<FlatVertex>& contour);
double contour_length(const std::vector<FlatVertex>& contour);

}  // namespace bandforge::geom
