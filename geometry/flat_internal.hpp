// Internal steps of the fabrication pack (geometry/flat_*.cpp, geometry/fab_*.cpp only).
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "geometry/flat_patterns.hpp"

namespace bandforge::geom {

/// The band blank: the strip developed on its neutral axis (mid-thickness, as the band solid's
/// centreline) from the free end of end A to the free end of end B, with the lining and eye-joint
/// rivet holes and the bend/roll lines. `band` is the band solid's PartInfo (material, density).
FlatPart band_blank(const Design& design, const Solution& solution, const PartInfo& band);

/// The lining blank on the lining's neutral radius, or nothing for a bare band.
std::optional<FlatPart> lining_blank(const Design& design, const Solution& solution,
                                     const PartInfo& lining);

/// A flat plate read back from the solid of part `part` (an extrusion along z): outline and
/// holes of its lowest planar face, thickness from its two planar faces. OCCT inside.
FlatPart plate_from_solid(const BrakeModel& model, std::size_t part);

/// Diameter and length [mm] of a round-bar part (pin, grip: a cylinder along z).
struct BarSize {
  double diameter = 0, length = 0;
};
BarSize bar_size(const BrakeModel& model, std::size_t part);

/// Index of the first part of each kind, or parts().size() when absent. OCCT-free wrappers over
/// BrakeModel::Impl::find.
std::size_t find_part(const BrakeModel& model, const char* kind);
std::vector<std::size_t> parts_of_kind(const BrakeModel& model, const char* kind);

/// A flat part that becomes the solid `info`: its name, material, density and quantity.
inline FlatPart flat_part_for(const PartInfo& info) {
  FlatPart f;
  f.solid = info.name;
  f.material = info.material;
  f.density = info.density;
  f.quantity = static_cast<int>(info.instance_names.size());
  return f;
}

/// Fills length, width, area, perimeter and mass from the contours and holes.
void finish(FlatPart& part);

/// Reverses a closed bulge polyline (its arcs keep their place, their bulges change sign).
std::vector<FlatVertex> reversed(const std::vector<FlatVertex>& contour);

/// "%.*f" with trailing zeros (and a bare '.') removed: 80.000 → "80", 206.50 → "206.5".
std::string num(double value, int decimals);

/// Writes one flat part as a DXF file (dxflib). Throws IoError.
void write_dxf(const FlatPart& part, DxfVersion version, const std::string& path);

}  // namespace bandforge::geom
