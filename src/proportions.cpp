#include "src/proportions.hpp"

#include <algorithm>

namespace bandforge {

DrumProportions drum_proportions(const Drum& drum) {
  DrumProportions p;
  p.rim_thickness = std::max(0.006, 0.04 * drum.diameter);
  p.web_thickness = std::max(0.008, 1.2 * p.rim_thickness);
  const double rim_inner = drum.diameter - 2.0 * p.rim_thickness;
  p.hub_diameter = std::max(1.8 * drum.bore, drum.bore + 0.024);
  // Leave at least one rim thickness of web between hub and rim.
  p.hub_diameter = std::min(p.hub_diameter, rim_inner - 2.0 * p.rim_thickness);
  p.hub_length = drum.width;
  return p;
}

}  // namespace bandforge
