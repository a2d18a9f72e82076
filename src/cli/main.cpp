// bandforge command line: subcommands are set up in cmd_*.cpp; every error ends here.
#include <cstdio>
#include <exception>
#include <iostream>

#include "src/cli/commands.hpp"
#include "src/errors.hpp"
#include "src/version.hpp"

namespace bandforge::cli {
namespace {
char** g_argv = nullptr;
}  // namespace
void remember_argv(char** argv) { g_argv = argv; }
char** original_argv() { return g_argv; }
}  // namespace bandforge::cli

int main(int argc, char** argv) {
  using bandforge::Exit;
  bandforge::cli::remember_argv(argv);
  CLI::App app{
      "bandforge: band-brake design from one design file: mechanics, solids (STEP), drawing (PDF)\n"
      "and flat patterns (DXF). Results are a design aid: have them checked against the applicable\n"
      "codes and by a licensed engineer."};
  app.name("bandforge");
  app.set_version_flag("--version", std::string("bandforge ") + bandforge::version(),
                       "Print the version and exit");
  app.require_subcommand(1);
  bandforge::cli::setup_solve(app);
  bandforge::cli::setup_build(app);
  bandforge::cli::setup_propose(app);
  bandforge::cli::setup_new(app);
  bandforge::cli::setup_materials(app);
  try {
    app.parse(argc, argv);
  } catch (const CLI::ParseError& e) {
    const int code = app.exit(e);  // prints help or the usage error
    return code == 0 ? 0 : static_cast<int>(Exit::usage);
  } catch (const bandforge::Error& e) {
    std::fflush(stdout);
    std::cerr << "bandforge: error: " << e.what() << '\n';
    return static_cast<int>(e.code());
  } catch (const std::exception& e) {
    std::fflush(stdout);
    std::cerr << "bandforge: internal error: " << e.what() << "\n(please report this defect)\n";
    return static_cast<int>(Exit::internal);
  }
  return 0;
}
