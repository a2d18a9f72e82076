// One file per subcommand: each setup_* adds its subcommand with its options and the action to
// run. Actions report failure by throwing bandforge::Error; main() turns that into a message on
// stderr and the documented exit status.
#pragma once

#include <CLI/CLI.hpp>

#include <string>

namespace bandforge::cli {

/// The command line as given to main(), kept for handing `build` to bandforge-cad.
void remember_argv(char** argv);
char** original_argv();

void setup_solve(CLI::App& app);
void setup_new(CLI::App& app);
void setup_materials(CLI::App& app);
void setup_build(CLI::App& app);
void setup_propose(CLI::App& app);

/// Replaces this process by bandforge-cad with the same arguments (the commands that need
/// OpenCASCADE or libharu); throws when it cannot be found or started.
[[noreturn]] void hand_over(const std::string& command);

#ifdef BANDFORGE_HAVE_GEOMETRY
/// `build DESIGN -o OUT_DIR` in this process; `print`: its report on stdout.
void build_design(const std::string& design, const std::string& out_dir, bool print);
#endif

}  // namespace bandforge::cli
