// Built-in material tables. Every value carries the source it was taken from
// (REFERENCE.md §2.2–2.4); the `materials` command prints them.
#pragma once

#include <string>
#include <string_view>
#include <vector>

namespace bandforge {

struct LiningMaterial {
  std::string key;            ///< design-file name, e.g. "woven"
  std::string description;
  double friction_min = 0;    ///< dynamic f, low end of the published range
  double friction_max = 0;    ///< high end
  double friction = 0;        ///< nominal f: the middle of the range
  double pressure_limit = 0;  ///< [Pa]
  double temperature_limit = 0;  ///< maximum bulk temperature [°C]
  double power_limit = 0;     ///< power per facing area [W/m²]; 0 = no published value
  std::string friction_source;
  std::string pressure_source;
  std::string temperature_source;
  std::string power_source;
};

struct DrumMaterial {
  std::string key;              ///< e.g. "cast-iron"
  std::string description;
  double density = 0;           ///< [kg/m³]
  double specific_heat = 0;     ///< [J/(kg·K)]
  std::string density_source;
  std::string specific_heat_source;
};

const std::vector<LiningMaterial>& lining_materials();
const std::vector<DrumMaterial>& drum_materials();

/// nullptr when unknown.
const LiningMaterial* find_lining(std::string_view key);
const DrumMaterial* find_drum_material(std::string_view key);

}  // namespace bandforge
