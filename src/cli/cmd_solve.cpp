// `bandforge solve design.toml [--units si|us] [--json]`: the mechanics, as a table or as JSON.
#include <iostream>
#include <memory>
#include <string>

#include "src/cli/commands.hpp"
#include "src/design_reader.hpp"
#include "src/errors.hpp"
#include "src/mechanics.hpp"
#include "src/report.hpp"

namespace bandforge::cli {
namespace {

struct SolveOptions {
  std::string design_path;
  std::string units = "si";
  bool json = false;
  bool strict = false;
};

void run_solve(const SolveOptions& o) {
  const Design design = read_design_file(o.design_path);
  const Solution solution = solve(design);
  if (o.json) {
    std::cout << json_report(design, solution).dump(2) << '\n';
  } else {
    std::cout << text_report(design, solution, o.units == "us" ? UnitSystem::us : UnitSystem::si);
  }
  std::cout.flush();
  if (o.strict) {
    for (const Check& c : solution.checks) {
      if (!c.ok) throw Error(Exit::checks_failed, "check '" + c.id + "' fails (--strict)");
    }
  }
}

}  // namespace

void setup_solve(CLI::App& app) {
  auto opt = std::make_shared<SolveOptions>();
  auto* sub = app.add_subcommand("solve", "Solve the band mechanics and print results and checks");
  sub->add_option("design", opt->design_path, "Design file (TOML); - reads it from standard input")
      ->required();
  sub->add_option("--units", opt->units, "Display units for the table: si or us")
      ->check(CLI::IsMember({"si", "us"}));
  sub->add_flag("--json", opt->json, "Print one JSON object (SI units, unit in each key's suffix)");
  sub->add_flag("--strict", opt->strict, "Exit with status 6 when any check fails");
  sub->callback([opt] { run_solve(*opt); });
}

}  // namespace bandforge::cli
