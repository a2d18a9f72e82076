// `bandforge propose BRIEF.toml -o DIR [--build] [--json] [--quiet] [--threads N]`: searches
// layouts and stock for the brief (src/propose.hpp) and writes the ranked designs, proposals.csv
// and the review sheet proposals.pdf, all together or none (src/staging.hpp). Exit status 7 when
// nothing feasible is found. The review sheet needs libharu, so `bandforge` hands the command to
// bandforge-cad, as it does `build`.
#include <unistd.h>

#include <chrono>
#include <cmath>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <iostream>
#include <memory>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "src/brief.hpp"
#include "src/cli/commands.hpp"
#include "src/errors.hpp"
#include "src/propose.hpp"
#include "src/staging.hpp"

#ifdef BANDFORGE_HAVE_GEOMETRY
#include "geometry/brake_model.hpp"
#include "src/mechanics.hpp"
#endif
#ifdef BANDFORGE_HAVE_DRAWING
#include "drawing/proposal_sheet.hpp"
#endif

namespace bandforge::cli {
namespace {

namespace fs = std::filesystem;

struct ProposeCommand {
  std::string brief;
  std::string out_dir;
  bool build = false;
  bool json = false;
  bool quiet = false;
  int threads = 2;
};

#ifdef BANDFORGE_HAVE_GEOMETRY

void write_text(const std::string& path, const std::string& text) {
  std::ofstream out(path, std::ios::binary);
  out << text;
  out.close();
  if (!out) throw IoError("cannot write " + path);
}

nlohmann::json figures_json(const Figures& f) {
  return {{"operator_force_N", f.force},
          {"lining_pressure_Pa", f.pressure},
          {"band_stress_Pa", f.band_stress},
          {"pin_shear_Pa", f.pin_shear},
          {"lever_stress_Pa", f.lever_stress},
          {"self_lock_friction", std::isfinite(f.self_lock_friction) ? nlohmann::json(f.self_lock_friction)
                                                                    : nlohmann::json(nullptr)},
          {"band_mass_kg", f.band_mass},
          {"handle_travel_m", f.travel},
          {"lever_length_m", f.size},
          {"wrap_rad", f.wrap}};
}

void run_propose(const ProposeCommand& cmd) {
  const Brief brief = read_brief_file(cmd.brief);
  // Progress on stderr only when a person watches it, and only after the first second.
  const bool show = !cmd.quiet && ::isatty(STDERR_FILENO) == 1;
  const auto start = std::chrono::steady_clock::now();
  bool shown = false;
  ProgressFn progress;
  if (show) {
    progress = [&](double fraction, const std::string& stage) {
      if (std::chrono::steady_clock::now() - start < std::chrono::seconds(1)) return;
      shown = true;
      std::fprintf(stderr, "\rbandforge propose: %-28s %3.0f %%", stage.c_str(), 100.0 * fraction);
      std::fflush(stderr);
    };
  }
  // Every proposal's solids are built and checked (validity, interference) as `build` does,
  // in the applied state and, when the released state is planned to build, in that one too.
  const geom::QuietOcct quiet;
  const BuildCheckFn builds = [](const Design& d, const Solution& s) -> std::string {
    try {
      geom::BuildOptions applied;
      (void)geom::build_brake(d, s, applied);
      if (s.hardware.release_ok) {
        geom::BuildOptions released;
        released.released = true;
        released.interference = false;
        (void)geom::build_brake(d, s, released);
      }
    } catch (const Error& e) {
      return e.what();
    }
    return "";
  };
  const ProposeResult result = propose(brief, std::max(1, cmd.threads), progress, builds);
  if (shown) std::fprintf(stderr, "\n");
  if (result.proposals.empty()) {
    throw Error(Exit::no_proposal, (cmd.brief == "-" ? std::string("<stdin>") : cmd.brief) + ": " +
                                       result.infeasible);
  }

  StagedOutputs staging(cmd.out_dir, brief.project.number + "-proposals");
  std::vector<std::string> toml_names;
  for (std::size_t i = 0; i < result.proposals.size(); ++i) {
    const Proposal& p = result.proposals[i];
    const std::string name = p.design.project.number + ".toml";
    write_text(staging.path(name), proposal_toml(brief, p, static_cast<int>(i + 1)));
    toml_names.push_back(name);
  }
  write_text(staging.path("proposals.csv"), proposals_csv(result.proposals));
#ifdef BANDFORGE_HAVE_DRAWING
  drawing::write_proposal_sheet(brief, result, staging.path("proposals.pdf"));
#endif
  std::vector<std::string> files = staging.commit();

  std::vector<std::string> built;
  if (cmd.build) {
    for (std::size_t i = 0; i < result.proposals.size(); ++i) {
      const std::string number = result.proposals[i].design.project.number;
      const std::string dir = (fs::path(cmd.out_dir) / number).string();
      build_design((fs::path(cmd.out_dir) / toml_names[i]).string(), dir, false);
      built.push_back(dir);
    }
  }

  if (cmd.json) {
    nlohmann::json props = nlohmann::json::array();
    for (std::size_t i = 0; i < result.proposals.size(); ++i) {
      const Proposal& p = result.proposals[i];
      const Design& d = p.design;
      props.push_back({{"rank", i + 1},
                       {"number", d.project.number},
                       {"file", (fs::path(cmd.out_dir) / toml_names[i]).string()},
                       {"kind", to_string(p.kind)},
                       {"reason", p.reason},
                       {"margins", p.margins},
                       {"drum_diameter_m", d.drum.diameter},
                       {"band", {{"width_m", d.band.width}, {"thickness_m", d.band.thickness},
                                 {"sense", to_string(d.band.sense)}}},
                       {"end_a", {{"mount", to_string(d.band.end_a.mount)}, {"at_m", {d.band.end_a.at.x, d.band.end_a.at.y}}}},
                       {"end_b", {{"mount", to_string(d.band.end_b.mount)}, {"at_m", {d.band.end_b.at.x, d.band.end_b.at.y}}}},
                       {"pin_diameter_m", d.band.pin_diameter},
                       {"lever", {{"pivot_m", {d.lever.pivot.x, d.lever.pivot.y}},
                                  {"handle_m", {d.lever.handle.x, d.lever.handle.y}},
                                  {"width_m", d.lever.width}, {"thickness_m", d.lever.thickness}}},
                       {"figures", figures_json(p.figures)},
                       {"built", cmd.build ? nlohmann::json(built[i]) : nlohmann::json(nullptr)}});
    }
    const nlohmann::json j{
        {"brief", {{"number", brief.project.number}, {"title", brief.project.title}, {"goal", to_string(brief.goal)}}},
        {"proposals", props},
        {"search", {{"layouts_evaluated", result.stats.layouts},
                    {"handles_screened", result.stats.handles},
                    {"feasible_layouts", result.stats.feasible},
                    {"shortlisted", result.stats.shortlisted},
                    {"validated", result.stats.validated},
                    {"solids_built", result.stats.built},
                    {"rejected_on_read_back", result.stats.rejected},
                    {"first_rejections", result.stats.rejections}}},
        {"files", files}};
    std::cout << j.dump(2) << '\n';
    return;
  }
  std::cout << "bandforge propose: " << brief.project.number << "  " << brief.project.title << "\n";
  std::cout << "searched " << result.stats.layouts << " layouts (" << result.stats.feasible
            << " feasible), refined " << result.stats.shortlisted << ", checked "
            << result.stats.validated << " in full, built and checked the solids of "
            << result.stats.built << " (" << result.stats.rejected << " refused on read-back)\n\n";
  std::cout << "rank  number                kind          force [N]  band [kg]  travel [mm]  lever [mm]\n";
  for (std::size_t i = 0; i < result.proposals.size(); ++i) {
    const Proposal& p = result.proposals[i];
    char line[200];
    std::snprintf(line, sizeof line, "%4zu  %-20s  %-12s  %9.1f  %9.2f  %11.1f  %10.0f\n", i + 1,
                  p.design.project.number.c_str(), to_string(p.kind), p.figures.force, p.figures.band_mass,
                  p.figures.travel * 1000, p.figures.size * 1000);
    std::cout << line;
  }
  std::cout << "\nCAUTION: proposals are a design aid; check them against the applicable codes and have "
               "them approved by a licensed engineer.\n\n";
  for (const std::string& f : files) std::cout << "wrote " << f << '\n';
  for (const std::string& b : built) std::cout << "built " << b << '\n';
}

#else

void run_propose(const ProposeCommand&) { hand_over("propose"); }

#endif

}  // namespace

void setup_propose(CLI::App& app) {
  auto cmd = std::make_shared<ProposeCommand>();
  auto* sub = app.add_subcommand(
      "propose", "Search layouts and stock for a brief; write ranked design files "
                 "OUTDIR/<number>-P1.toml …, OUTDIR/proposals.csv and OUTDIR/proposals.pdf");
  sub->add_option("brief", cmd->brief, "brief (TOML); - reads it from standard input")->required();
  sub->add_option("-o,--out", cmd->out_dir, "output directory (created if missing)")->required();
  sub->add_flag("--build", cmd->build, "also build each proposal into OUTDIR/<number>-Pn/ as `build` does");
  sub->add_flag("--json", cmd->json, "print one JSON object (proposals, figures, files) on stdout");
  sub->add_flag("--quiet", cmd->quiet, "no progress on stderr");
  sub->add_option("--threads", cmd->threads, "worker threads for the search (default 2; the result does not depend on it)")
      ->check(CLI::Range(1, 64));
  sub->callback([cmd] { run_propose(*cmd); });
}

}  // namespace bandforge::cli
