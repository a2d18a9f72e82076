// Proportions the design file does not give, derived from the drum diameter and the band.
// Shared by the thermal check (rim mass) and geometry/ (the solids), so both use the same drum.
// These are common drafting proportions, no published source; README.md "Derived proportions"
// lists them for the user.
#pragma once

#include "src/design.hpp"

namespace bandforge {

struct DrumProportions {
  double rim_thickness = 0;  ///< radial thickness of the rim under the friction surface [m]
  double web_thickness = 0;  ///< axial thickness of the web joining rim and hub [m]
  double hub_diameter = 0;   ///< outside diameter of the hub [m]
  double hub_length = 0;     ///< axial length of the hub (= rim width) [m]
};

/// rim = max(6 mm, 0.04·D); web = max(8 mm, 1.2·rim); hub Ø = max(1.8·bore, bore + 24 mm),
/// capped below the rim's inside diameter.
DrumProportions drum_proportions(const Drum& drum);

}  // namespace bandforge
