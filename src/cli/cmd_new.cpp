// `bandforge new > my-brake.toml`: a commented starter design.
#include <iostream>

#include "src/cli/commands.hpp"
#include "src/design_reader.hpp"

namespace bandforge::cli {

void setup_new(CLI::App& app) {
  auto* sub = app.add_subcommand(
      "new", "Print a commented starter design file (redirect it: bandforge new > my-brake.toml)");
  sub->callback([] { std::cout << starter_design(); });
}

}  // namespace bandforge::cli
