// One file per subcommand: each setup_* adds its subcommand with its options and the action to
// run. Actions report failure by throwing bandforge::Error; main() turns that into a message on
// stderr and the documented exit status.
#pragma once

#include <CLI/CLI.hpp>

namespace bandforge::cli {

/// The command line as given to main(), kept for handing `build` to bandforge-cad.
void remember_argv(char** argv);
char** original_argv();

void setup_solve(CLI::App& app);
void setup_new(CLI::App& app);
void setup_materials(CLI::App& app);
void setup_build(CLI::App& app);

}  // namespace bandforge::cli
