// `bandforge build design.toml -o OUTDIR`: solids + STEP (+ PDF, + fab/ when those land).
#include "src/cli/commands.hpp"
#include "src/errors.hpp"

namespace bandforge::cli {

void setup_build(CLI::App& app) {
  auto* sub = app.add_subcommand("build", "Build the solids and write the STEP assembly, drawing and flat patterns");
  sub->callback([] { throw Error(Exit::usage, "build: not available yet"); });
}

}  // namespace bandforge::cli
