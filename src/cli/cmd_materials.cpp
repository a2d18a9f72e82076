// `bandforge materials [--units si|us]`: the built-in lining and drum tables with their sources.
#include <iostream>
#include <memory>
#include <string>

#include "src/cli/commands.hpp"
#include "src/materials.hpp"
#include "src/units.hpp"

namespace bandforge::cli {
namespace {

void run_materials(const std::string& units_name) {
  const UnitSystem u = units_name == "us" ? UnitSystem::us : UnitSystem::si;
  std::cout << "Lining materials ([lining] material = \"<key>\")\n";
  for (const LiningMaterial& m : lining_materials()) {
    std::cout << "\n  " << m.key << ": " << m.description << '\n'
              << "    friction        " << m.friction_min << " … " << m.friction_max
              << " (nominal " << m.friction << ")\n"
              << "                    source: " << m.friction_source << '\n'
              << "    pressure limit  " << format_quantity(m.pressure_limit, Quantity::stress, u)
              << "\n                    source: " << m.pressure_source << '\n'
              << "    temperature     " << format_quantity(m.temperature_limit, Quantity::temperature, u)
              << "\n                    source: " << m.temperature_source << '\n';
    if (m.power_limit > 0) {
      std::cout << "    power per area  " << format_quantity(m.power_limit, Quantity::power_density, u)
                << "\n                    source: " << m.power_source << '\n';
    }
  }
  std::cout << "\nDrum materials ([drum] material = \"<key>\")\n";
  for (const DrumMaterial& m : drum_materials()) {
    std::cout << "\n  " << m.key << ": " << m.description << '\n'
              << "    density         " << m.density << " kg/m³\n"
              << "                    source: " << m.density_source << '\n'
              << "    specific heat   " << m.specific_heat << " J/(kg·K)\n"
              << "                    source: " << m.specific_heat_source << '\n';
  }
}

}  // namespace

void setup_materials(CLI::App& app) {
  auto units = std::make_shared<std::string>("si");
  auto* sub = app.add_subcommand("materials", "List the built-in lining and drum materials with their sources");
  sub->add_option("--units", *units, "si or us")->check(CLI::IsMember({"si", "us"}));
  sub->callback([units] { run_materials(*units); });
}

}  // namespace bandforge::cli
