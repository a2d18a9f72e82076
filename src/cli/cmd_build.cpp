// `bandforge build design.toml -o OUTDIR [--released] [--json] [--units] [--dxf-version]`: solids,
// checks and the STEP assembly, the PDF drawing and calculation sheet, and the fab/ flat patterns.
// Outputs are written into a staging directory inside OUTDIR and moved into place only when
// every step has succeeded, so a failed build leaves no partial files behind.
#include <sys/resource.h>
#include <unistd.h>

#include <algorithm>
#include <cerrno>
#include <cstdio>
#include <cstdlib>
#include <fstream>
#include <cstring>
#include <filesystem>
#include <iostream>
#include <memory>
#include <optional>
#include <sstream>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "src/cli/child_job.hpp"
#include "src/cli/commands.hpp"
#include "src/design_reader.hpp"
#include "src/errors.hpp"
#include "src/mechanics.hpp"
#include "src/report.hpp"
#include "src/staging.hpp"
#include "src/units.hpp"

#ifdef BANDFORGE_HAVE_GEOMETRY
#include "geometry/brake_model.hpp"
#include "geometry/flat_patterns.hpp"
#endif
#ifdef BANDFORGE_HAVE_DRAWING
#include "drawing/drawing.hpp"
#endif

namespace bandforge::cli {
namespace {

namespace fs = std::filesystem;

struct BuildCommand {
  std::string design;
  std::string out_dir;
  bool released = false;
  bool json = false;
  std::string dxf_version = "r2000";  ///< flat patterns: "r2000" (AC1015) or "r12" (AC1009)
  std::string units = "si";           ///< units on the PDF drawing: "si" or "us"
  std::string sheets = "one";         ///< "one" PDF, or also "separate" PDFs, one per sheet
  /// The `build` command itself, whose process ends with the build: after forking the drawing
  /// it lowers its own priority (see build_outputs). Off for the builds `propose` runs one after
  /// another in its process, whose priority could not be raised back.
  bool last_in_process = false;
};

#ifdef BANDFORGE_HAVE_GEOMETRY


// Writes `bytes` to a staged path (the staging makes the set atomic). Throws IoError.
void write_bytes(const std::string& path, const std::string& bytes) {
  std::ofstream out(path, std::ios::binary | std::ios::trunc);
  if (!out) throw IoError("cannot write " + path + ": " + std::strerror(errno));
  out.write(bytes.data(), static_cast<std::streamsize>(bytes.size()));
  out.close();
  if (!out) throw IoError("cannot write " + path + " (disk full?)");
}

// The file of sheet i (from 0) with --sheets separate: "<number>-01.pdf", …
std::string sheet_file(const std::string& stem, std::size_t i) {
  char n[32];
  std::snprintf(n, sizeof n, "-%02zu.pdf", i + 1);
  return stem + n;
}

std::string fixed(double v, int decimals) {
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.*f", decimals, v);
  return buf;
}

// Pads to `width` characters on screen (UTF-8: continuation bytes take no column).
std::string pad(std::string s, std::size_t width) {
  std::size_t shown = 0;
  for (unsigned char c : s) shown += (c & 0xc0) != 0x80;
  if (shown < width) s.append(width - shown, ' ');
  else s += ' ';
  return s;
}

void print_text(const Design& design, const Solution& solution, const geom::BrakeModel& model,
                bool released, const std::vector<std::string>& files) {
  std::cout << "bandforge build: " << design.project.number << "  " << design.project.title
            << " (" << (released ? "released" : "applied") << " state)\n\n";
  std::cout << "Parts                 instances  volume [cm³]  mass [kg]  material\n";
  double total = 0;
  for (const geom::PartInfo& p : model.parts()) {
    const std::size_t n = p.instance_names.size();
    total += p.mass * static_cast<double>(n);
    std::cout << "  " << pad(p.name, 20) << pad(std::to_string(n), 11)
              << pad(fixed(p.volume / 1000.0, 1), 14) << pad(fixed(p.mass, 3), 11) << p.material
              << '\n';
  }
  std::cout << "  " << pad("total", 45) << fixed(total, 3) << "\n\nGenerated hardware\n";
  for (const std::string& l : hardware_summary(solution.hardware, UnitSystem::si)) {
    std::cout << "  " << l << '\n';
  }
  std::cout << "\nChecks\n";
  std::cout << "  " << pad("every solid valid (BRepCheck_Analyzer)", 52)
            << (model.all_valid() ? "pass" : "FAIL") << '\n';
  for (const geom::ContactCheck& c : model.contacts()) {
    std::string what = c.part_a + " / " + c.part_b + ": ";
    if (c.intended) {
      what += "contact, overlap " + fixed(c.common_volume, 4) + " mm³";
    } else {
      what += "clearance " + fixed(c.distance, 2) + " mm";
    }
    std::cout << "  " << pad(what, 52) << (c.ok ? "pass" : "FAIL") << '\n';
  }
  std::cout << '\n';
  for (const std::string& f : files) std::cout << "wrote " << f << '\n';
}

nlohmann::json to_json(const Design& design, const Solution& solution, const geom::BrakeModel& model,
                       bool released, const std::vector<std::string>& files) {
  using nlohmann::json;
  json parts = json::array();
  for (const geom::PartInfo& p : model.parts()) {
    json instances = json::array();
    for (std::size_t i = 0; i < p.instance_names.size(); ++i) {
      const geom::Vec3 o = p.instance_origins[i];
      instances.push_back({{"name", p.instance_names[i]}, {"origin_mm", {o.x, o.y, o.z}}});
    }
    parts.push_back({{"name", p.name},
                     {"material", p.material},
                     {"density_kg_m3", p.density},
                     {"volume_mm3", p.volume},
                     {"mass_kg", p.mass},
                     {"centroid_mm", {p.centroid.x, p.centroid.y, p.centroid.z}},
                     {"colour_srgb", {p.colour.r, p.colour.g, p.colour.b}},
                     {"instances", instances}});
  }
  json contacts = json::array();
  bool all_ok = model.all_valid();
  for (const geom::ContactCheck& c : model.contacts()) {
    all_ok = all_ok && c.ok;
    contacts.push_back({{"part_a", c.part_a},
                        {"part_b", c.part_b},
                        {"intended", c.intended},
                        {"common_volume_mm3", c.common_volume},
                        {"tolerance_mm3", c.tolerance},
                        {"distance_mm", c.distance < 0 ? json(nullptr) : json(c.distance)},
                        {"min_distance_mm", c.intended ? json(nullptr) : json(c.min_distance)},
                        {"ok", c.ok}});
  }
  return {{"project", {{"number", design.project.number}, {"title", design.project.title}}},
          {"state", released ? "released" : "applied"},
          {"valid", model.all_valid()},
          {"ok", all_ok},
          {"parts", parts},
          {"contacts", contacts},
          {"hardware", hardware_json(solution.hardware)},
          {"files", files}};
}

void build_outputs(const BuildCommand& cmd) {
  const Design design = read_design_file(cmd.design);
  const Solution solution = solve(design);
  if (design.concept_arms.present) {
    // No pin coordinates, so no solids, STEP or flat patterns: the calculation sheet only.
#ifdef BANDFORGE_HAVE_DRAWING
    const std::string stem = design.project.number;
    StagedOutputs staging(cmd.out_dir, stem);
    // No solids, nothing to cut: an empty cut list, no table.
    drawing::write_drawing(design, solution, nullptr, nullptr, {},
                           cmd.units == "us" ? UnitSystem::us : UnitSystem::si,
                           staging.path(stem + ".pdf"));
    const std::vector<std::string> files = staging.commit();
    if (cmd.json) {
      const nlohmann::json j{
          {"project", {{"number", design.project.number}, {"title", design.project.title}}},
          {"state", "concept"},
          {"files", files}};
      std::cout << j.dump(2) << '\n';
    } else {
      std::cout << "bandforge build: " << design.project.number << "  " << design.project.title
                << " ([concept] design: calculation sheet only, no solids)\n";
      for (const auto& f : files) std::cout << "wrote " << f << '\n';
    }
    return;
#else
    design_fail(design, "concept", "",
                "a [concept] design has no pin coordinates; this bandforge has no drawing "
                "library to write its calculation sheet");
#endif
  }
  // The reader accepts only a safe file stem for [project] number (letters, digits, - _ .).
  const std::string stem = design.project.number;
  StagedOutputs staging(cmd.out_dir, stem);
  // OCCT's messenger is process-wide: one guard for the whole section (see QuietOcct); the
  // child processes inherit it.
  const geom::QuietOcct quiet;
  // Staged names are taken here, in the parent, in the order the files are listed.
  const std::string step_path = staging.path(stem + ".step");
#ifdef BANDFORGE_HAVE_DRAWING
  const std::string pdf_path = staging.path(stem + ".pdf");
  // The drawing is made by a child process on the second core while this process builds,
  // checks and exports the model (src/cli/child_job.hpp: OCCT on two threads of one process
  // slowed both by a third). It builds its own copy of the solids as the views show them
  // (BuildOptions::for_views) and shows the applied state with the released lever as a phantom
  // line; its copies skip the interference checks, which the checked model below runs. The
  // calculation sheet's cut list is taken from its applied copy by the same cut_list() that
  // gives the rows of fab/cutlist.csv below: the flat patterns do not depend on the state (the
  // band is developed from the solved layout, plates and bars are read in part coordinates).
  // With --sheets separate it also writes one PDF per sheet into the staging folder's sheets/
  // and reports how many; their names are taken below.
  ChildJob drawing_job([&]() -> std::string {
    geom::BuildOptions applied;
    applied.interference = false;
    applied.validity = false;  // the model below is validated; this copy gives masses and views
    applied.for_views = true;  // pins without split-pin holes, the spring as its cylinder
    geom::BuildOptions released = applied;
    released.released = true;
    // The phantom shows the lever and grip only: no validity or mass properties needed (the
    // applied copy and the checked model below have them; `build --released` checks this state).
    released.checks = false;
    released.lever_only = true;
    const geom::BrakeModel shown = geom::build_brake(design, solution, applied);
    // A layout whose released state fails its check is drawn without the phantom lever.
    std::optional<geom::BrakeModel> phantom;
    if (solution.hardware.release_ok) phantom = geom::build_brake(design, solution, released);
    const std::vector<geom::CutListRow> cut = geom::cut_list(design, solution, shown);
    const UnitSystem units = cmd.units == "us" ? UnitSystem::us : UnitSystem::si;
    if (cmd.sheets != "separate") {
      drawing::write_drawing(design, solution, &shown, phantom ? &*phantom : nullptr, cut, units, pdf_path);
      return "0";
    }
    std::vector<std::string> sheet_pdfs;
    write_bytes(pdf_path, drawing::render_drawing(design, solution, &shown, phantom ? &*phantom : nullptr, cut,
                                                  units, nullptr, &sheet_pdfs));
    const fs::path sheets = fs::path(pdf_path).parent_path() / "sheets";
    fs::create_directories(sheets);
    for (std::size_t i = 0; i < sheet_pdfs.size(); ++i) {
      write_bytes((sheets / sheet_file(stem, i)).string(), sheet_pdfs[i]);
    }
    return std::to_string(sheet_pdfs.size());
  });
  // The drawing's process has the most to do (~270 ms of CPU against the checks' ~200 and the
  // export's ~110, README "Performance"), and with three processes on two cores a fair share
  // let it finish last, alone, after the others. This process and the export's (forked below,
  // inheriting it) step back by 5 nice levels, so the scheduler gives the drawing a core of its
  // own and the other two share the second: 362 against 401 ms and 372 against 392 ms median
  // in alternated runs. A hint only: if the system refuses it, nothing else changes.
  if (cmd.last_in_process) {
    errno = 0;
    const int nice_now = ::getpriority(PRIO_PROCESS, 0);
    if (errno == 0) ::setpriority(PRIO_PROCESS, 0, std::min(19, nice_now + 5));
  }
#endif
  geom::BuildOptions options;
  options.released = cmd.released;
  // The solids first; then the STEP export in a child process, on its copy of them, while this
  // one checks the model (the export needs the shapes and their names only). A failed check
  // throws here: the children are stopped (~ChildJob) before the staged files go.
  options.checks = false;
  geom::BrakeModel model = geom::build_brake(design, solution, options);
  ChildJob step_job([&]() -> std::string {
    geom::write_step(model, design, step_path);
    return "";
  });
  options.checks = true;
  geom::check_model(model, options);
  // Flattened before anything is written: a part that cannot be flattened leaves no files.
  const geom::FabPack fab = geom::make_fab_pack(design, solution, model);
  step_job.wait();  // throws the export's error, if any
#ifdef BANDFORGE_HAVE_DRAWING
  const std::size_t sheet_count = std::stoul(drawing_job.wait());  // throws the drawing's error
  // One file per sheet: OUT/sheets/<number>-01.pdf … in the order of the set (written above).
  for (std::size_t i = 0; i < sheet_count; ++i) staging.path("sheets/" + sheet_file(stem, i));
#endif
  const geom::DxfVersion dxf =
      cmd.dxf_version == "r12" ? geom::DxfVersion::r12 : geom::DxfVersion::r2000;
  geom::write_fab_files(fab, dxf, [&](const std::string& f) { return staging.path("fab/" + f); });
  const std::vector<std::string> files = staging.commit();
  geom::remove_stale_fab_files((fs::path(cmd.out_dir) / "fab").string(), fab);

  if (cmd.json) {
    std::cout << to_json(design, solution, model, cmd.released, files).dump(2) << '\n';
  } else {
    print_text(design, solution, model, cmd.released, files);
  }
}

// A part that cannot be built has no single key to point at (an interference names two parts):
// the message names the design file so that a batch of builds says which design failed.
void run_build(const BuildCommand& cmd) {
  try {
    build_outputs(cmd);
  } catch (const BuildError& e) {
    const std::string what = e.what();
    const std::string name = design_display_name(cmd.design);
    throw BuildError(what.rfind(name, 0) == 0 ? what : name + ": " + what);
  }
}

}  // namespace

void build_design(const std::string& design, const std::string& out_dir, bool print) {
  BuildCommand cmd;
  cmd.design = design;
  cmd.out_dir = out_dir;
  if (print) {
    run_build(cmd);
    return;
  }
  // Quiet: the report goes nowhere, errors still throw.
  std::ostringstream sink;
  std::streambuf* old = std::cout.rdbuf(sink.rdbuf());
  try {
    run_build(cmd);
  } catch (...) {
    std::cout.rdbuf(old);
    throw;
  }
  std::cout.rdbuf(old);
}

void hand_over(const std::string& command) {
  throw Error(Exit::internal, command + ": bandforge-cad does not hand over");
}

namespace {

#elif defined(BANDFORGE_CAD_EXECUTABLE)

// OpenCASCADE's ~60 shared libraries take about 40 ms to load, three times a whole `solve`.
// So the `bandforge` that users run links only the core, and hands `build` (its arguments already
// checked by the parse above) to its sibling executable, which links geometry/ and drawing/.
// Where bandforge-cad is: beside bandforge in the build tree (build/bin/), or in
// <prefix>/libexec/bandforge/ after `cmake --install` or the Debian package (the path relative
// to bin/ comes from GNUInstallDirs, so a relocated prefix or a DESTDIR tree works too).
fs::path cad_executable() {
  std::error_code ec;
  const fs::path self = fs::read_symlink("/proc/self/exe", ec);
  const fs::path dir = ec ? fs::path(".") : self.parent_path();
  const fs::path candidates[] = {dir / BANDFORGE_CAD_EXECUTABLE,
                                 dir / BANDFORGE_CAD_RELATIVE_DIR / BANDFORGE_CAD_EXECUTABLE};
  for (const fs::path& p : candidates) {
    if (::access(p.c_str(), X_OK) == 0) return p;
  }
  throw Error(Exit::internal, "cannot find " + candidates[0].string() + " or " +
                                  candidates[1].lexically_normal().string() +
                                  " (bandforge-cad is built beside bandforge and installed in "
                                  "libexec/bandforge/)");
}

}  // namespace

void hand_over(const std::string& command) {
  const fs::path cad = cad_executable();
  // glibc's malloc on transparent huge pages where the kernel offers them (madvise): 40 % fewer
  // page faults and ~5 % less CPU per `build` (README "Performance"); read by glibc at start, so
  // set for the program started here. A setting of the user's own is kept.
  const char* tunables = std::getenv("GLIBC_TUNABLES");
  if (tunables == nullptr || std::strstr(tunables, "glibc.malloc.hugetlb") == nullptr) {
    const std::string t = std::string(tunables ? tunables : "") + (tunables && *tunables ? ":" : "") +
                          "glibc.malloc.hugetlb=1";
    ::setenv("GLIBC_TUNABLES", t.c_str(), 1);
  }
  std::fflush(nullptr);
  ::execv(cad.c_str(), original_argv());
  throw Error(Exit::internal, command + ": cannot start " + cad.string() + ": " + std::strerror(errno));
}

namespace {

void run_build(const BuildCommand&) { hand_over("build"); }

#else

}  // namespace

void hand_over(const std::string& command) {
  throw Error(Exit::cannot_build,
              command + ": this bandforge was compiled without OpenCASCADE (BANDFORGE_GEOMETRY=OFF)");
}

namespace {

void run_build(const BuildCommand&) { hand_over("build"); }

#endif

}  // namespace

void setup_build(CLI::App& app) {
  auto cmd = std::make_shared<BuildCommand>();
  auto* sub = app.add_subcommand(
      "build", "Build and check the solids; write OUTDIR/<number>.step, OUTDIR/<number>.pdf "
               "and the flat patterns in OUTDIR/fab/");
  sub->add_option("design", cmd->design, "design file (TOML); - reads it from standard input")->required();
  sub->add_option("-o,--out", cmd->out_dir, "output directory (created if missing)")->required();
  sub->add_flag("--released", cmd->released,
                "build the released state: band lifted by the clearance, lever turned back");
  sub->add_flag("--json", cmd->json, "print one JSON object (parts, checks, files) on stdout");
  sub->add_option("--dxf-version", cmd->dxf_version,
                  "DXF of the flat patterns in OUTDIR/fab/: r2000 (AC1015, default) or r12 (AC1009, "
                  "no $INSUNITS)")
      ->check(CLI::IsMember({"r2000", "r12"}));
  sub->add_option("--sheets", cmd->sheets,
                  "one: the drawing set as one PDF; separate: also each sheet as its own PDF in "
                  "OUTDIR/sheets/")
      ->check(CLI::IsMember({"one", "separate"}));
  sub->add_option("--units", cmd->units, "units on the PDF drawing: si (mm, N, MPa) or us (in, lbf, psi)")
      ->check(CLI::IsMember({"si", "us"}));
  sub->callback([cmd] {
    BuildCommand whole = *cmd;
    whole.last_in_process = true;
    run_build(whole);
  });
}

}  // namespace bandforge::cli
