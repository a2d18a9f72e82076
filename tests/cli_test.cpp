// The command line as a user meets it: exit statuses, messages that name the file, line and key,
// the JSON contract, and every example solved. Runs the real executable.
#include <gtest/gtest.h>

#include <cmath>
#include <filesystem>
#include <fstream>
#include <nlohmann/json.hpp>
#include <sstream>
#include <string>

#include "tests/support.hpp"

namespace fs = std::filesystem;

namespace {

using bandforge::test::scratch_root;
using bandforge::test::slurp;
using Result = bandforge::test::ShellWithErr;

// `bandforge <args>`, as a user would type it.
Result run(const std::string& args) {
  return bandforge::test::run_capturing_stderr(std::string(BANDFORGE_EXE) + " " + args);
}

const fs::path kExample = fs::path(BANDFORGE_SOURCE_DIR) / "examples" / "bin-hoist.toml";

// The bundled example with one piece of text replaced; the replaced text must exist.
fs::path example_with(const std::string& from, const std::string& to, const std::string& name) {
  std::string text = slurp(kExample);
  const auto at = text.find(from);
  EXPECT_NE(at, std::string::npos) << "example no longer contains: " << from;
  if (at != std::string::npos) text.replace(at, from.size(), to);
  const fs::path p = scratch_root() / (name + ".toml");
  std::ofstream(p, std::ios::binary) << text;
  return p;
}

int line_of(const fs::path& file, const std::string& needle) {
  std::istringstream in(slurp(file));
  std::string line;
  for (int n = 1; std::getline(in, line); ++n)
    if (line.find(needle) != std::string::npos) return n;
  return 0;
}

// A bad design exits 2 and the message names the file, the key and (when given) the line.
void expect_design_error(const fs::path& file, const std::string& key, int line,
                         const std::string& also = "") {
  const Result r = run("solve " + file.string());
  EXPECT_EQ(r.status, 2) << r.err;
  EXPECT_NE(r.err.find(file.string()), std::string::npos) << r.err;
  EXPECT_NE(r.err.find(key), std::string::npos) << "key '" << key << "' not named in: " << r.err;
  if (line > 0) {
    EXPECT_NE(r.err.find(":" + std::to_string(line) + ":"), std::string::npos)
        << "line " << line << " not named in: " << r.err;
  }
  if (!also.empty()) {
    EXPECT_NE(r.err.find(also), std::string::npos) << r.err;
  }
  EXPECT_TRUE(r.out.empty()) << "a failed solve printed results: " << r.out;
}

}  // namespace

TEST(Cli, ExampleSolvesAndPrintsTheCaution) {
  const Result r = run("solve " + kExample.string());
  ASSERT_EQ(r.status, 0) << r.err;
  EXPECT_NE(r.out.find("licensed engineer"), std::string::npos);
  EXPECT_NE(r.out.find("wrap angle"), std::string::npos);
}

TEST(Cli, UsUnitsShowInchesAndPoundForce) {
  const Result r = run("solve --units us " + kExample.string());
  ASSERT_EQ(r.status, 0) << r.err;
  EXPECT_NE(r.out.find(" in"), std::string::npos);
  EXPECT_NE(r.out.find("lbf"), std::string::npos);
  EXPECT_NE(r.out.find("psi"), std::string::npos);
}

TEST(Cli, JsonCarriesTheContractKeys) {
  const Result r = run("solve --json " + kExample.string());
  ASSERT_EQ(r.status, 0) << r.err;
  const auto j = nlohmann::json::parse(r.out);
  for (const char* k : {"kind", "wrap_angle_deg", "capstan_ratio", "band_length_m",
                        "self_lock_friction", "ends", "primary", "directions", "checks"})
    EXPECT_TRUE(j.contains(k)) << k;
  for (const char* e : {"a", "b"})
    for (const char* k : {"mount", "tangent_point_m", "free_length_m", "arm_m"})
      EXPECT_TRUE(j["ends"][e].contains(k)) << e << "." << k;
  for (const char* d : {"a_tight", "b_tight"})
    for (const char* k : {"tension_tight_N", "tension_slack_N", "torque_Nm", "lever_force_N",
                          "self_locking", "pressure_max_Pa", "band_stress_Pa"})
      EXPECT_TRUE(j["directions"][d].contains(k)) << d << "." << k;
  ASSERT_TRUE(j["checks"].is_array());
  ASSERT_FALSE(j["checks"].empty());
  for (const auto& c : j["checks"])
    for (const char* k : {"id", "value", "limit", "unit", "ok", "source"})
      EXPECT_TRUE(c.contains(k)) << k;
  // The bin hoist is a simple brake with end A on the frame, turning cw with a cw band: A is tight
  // (REFERENCE §1.8 step 6: ω_s = s).
  EXPECT_EQ(j["kind"], "simple");
  EXPECT_EQ(j["primary"], "a_tight");
  // Capstan relation holds in the output: P1/P2 = capstan_ratio (REFERENCE §1.1).
  const auto& p = j["directions"]["a_tight"];
  EXPECT_NEAR(p["tension_tight_N"].get<double>() / p["tension_slack_N"].get<double>(),
              j["capstan_ratio"].get<double>(), 1e-9);
}

TEST(Cli, EveryExampleSolves) {
  int n = 0;
  for (const auto& entry : fs::directory_iterator(fs::path(BANDFORGE_SOURCE_DIR) / "examples")) {
    if (entry.path().extension() != ".toml") continue;
    ++n;
    const Result r = run("solve --json " + entry.path().string());
    EXPECT_EQ(r.status, 0) << entry.path() << ": " << r.err;
    if (r.status != 0) continue;
    const auto j = nlohmann::json::parse(r.out);
    EXPECT_GT(j["wrap_angle_deg"].get<double>(), 0.0) << entry.path();
    for (const auto& c : j["checks"])
      EXPECT_TRUE(c["ok"].get<bool>()) << entry.path() << ": example fails check " << c["id"];
  }
  EXPECT_GE(n, 3);
}

TEST(Cli, StarterDesignSolves) {
  const Result made = run("new");
  ASSERT_EQ(made.status, 0) << made.err;
  const fs::path p = scratch_root() / "starter.toml";
  std::ofstream(p, std::ios::binary) << made.out;
  const Result r = run("solve " + p.string());
  EXPECT_EQ(r.status, 0) << r.err;
}

TEST(Cli, MaterialsListsSources) {
  const Result r = run("materials");
  ASSERT_EQ(r.status, 0) << r.err;
  EXPECT_NE(r.out.find("woven"), std::string::npos);
  EXPECT_NE(r.out.find("cast-iron"), std::string::npos);
  EXPECT_NE(r.out.find("Juvinall"), std::string::npos);
}

TEST(CliExit, UnreadableFileIsStatus4) {
  const Result r = run("solve /nonexistent/brake.toml");
  EXPECT_EQ(r.status, 4) << r.err;
  EXPECT_NE(r.err.find("/nonexistent/brake.toml"), std::string::npos);
}

TEST(CliExit, BadCommandLineIsStatus1) {
  EXPECT_EQ(run("solve --units metric " + kExample.string()).status, 1);
  EXPECT_EQ(run("frobnicate").status, 1);
}

TEST(CliExit, StrictMakesAFailedCheckStatus6) {
  // Band allowable stress 10 MPa. Hand computation for the bin hoist at f_min = 0.25, wrap
  // 4.2286 rad: e = e^(0.25·4.2286) = 2.878, P1 = T·e/(r·(e − 1)) = 500·2.878/(0.2·1.878) = 3831 N,
  // σ = P1/(b·t) = 3831/(80 × 3 mm²) = 15.96 MPa > 10 MPa, so the band_stress check fails.
  // Without --strict the results are printed and the status is 0; with it, 6.
  const auto p = example_with("allowable_stress = \"60 MPa\"", "allowable_stress = \"10 MPa\"", "strict");
  const auto plain = run("solve " + p.string());
  EXPECT_EQ(plain.status, 0) << plain.err;
  EXPECT_NE(plain.out.find("[FAIL] Band tensile stress"), std::string::npos) << plain.out;
  const auto strict = run("solve --strict " + p.string());
  EXPECT_EQ(strict.status, 6) << strict.err;
  EXPECT_NE(strict.err.find("band_stress"), std::string::npos) << strict.err;
  EXPECT_FALSE(strict.out.empty());  // the table is still printed before the failure status
}

TEST(Cli, VersionIsTheProjectVersion) {
  // The version comes from CMake's project() (top CMakeLists.txt), read here from that file.
  const std::string cmake = slurp(fs::path(BANDFORGE_SOURCE_DIR) / "CMakeLists.txt");
  const auto at = cmake.find("project(bandforge VERSION ");
  ASSERT_NE(at, std::string::npos);
  const std::string rest = cmake.substr(at + 26);
  const std::string version = rest.substr(0, rest.find_first_of(" )"));
  const Result r = run("--version");
  EXPECT_EQ(r.status, 0) << r.err;
  EXPECT_EQ(r.out, "bandforge " + version + "\n");
}

// `-` reads the design from standard input (the Unix convention): the same results as the file,
// and messages name <stdin> with the line and column.
TEST(Cli, DesignFromStandardInput) {
  const Result file = run("solve --json " + kExample.string());
  const Result piped = run("solve --json - < " + kExample.string());
  EXPECT_EQ(piped.status, 0) << piped.err;
  EXPECT_EQ(piped.out, file.out);
  const auto bad = example_with("thickness = \"3 mm\"", "thickness = \"3 N\"", "stdin-bad");
  const Result err = run("solve - < " + bad.string());
  EXPECT_EQ(err.status, 2) << err.err;
  const std::string where = "<stdin>:" + std::to_string(line_of(bad, "thickness = \"3 N\"")) + ":";
  EXPECT_NE(err.err.find(where), std::string::npos) << "expected " << where << " in: " << err.err;
  EXPECT_NE(err.err.find("band.thickness"), std::string::npos) << err.err;
}

// One test per mistake of the foundation issue, §5.
TEST(BadInput, MissingKey) {
  const auto p = example_with("thickness = \"3 mm\"\n", "", "missing");
  expect_design_error(p, "thickness", line_of(p, "[band]"), "band");
}

TEST(BadInput, UnknownKeySuggestsNearest) {
  const auto p = example_with("thickness = \"3 mm\"", "thicknes = \"3 mm\"", "unknown");
  expect_design_error(p, "thicknes", line_of(p, "thicknes ="), "thickness");
}

TEST(BadInput, LengthGivenInNewtons) {
  const auto p = example_with("thickness = \"3 mm\"", "thickness = \"3 N\"", "units");
  expect_design_error(p, "band.thickness", line_of(p, "\"3 N\""), "length");
}

TEST(BadInput, BareNumberForADimensionedValue) {
  const auto p = example_with("diameter = \"400 mm\"", "diameter = 400", "bare");
  expect_design_error(p, "drum.diameter", line_of(p, "diameter = 400"), "mm");
}

TEST(BadInput, NegativeSize) {
  const auto p = example_with("diameter = \"400 mm\"", "diameter = \"-400 mm\"", "negative");
  expect_design_error(p, "drum.diameter", line_of(p, "-400 mm"), "-400 mm");
}

TEST(BadInput, ZeroSize) {
  const auto p = example_with("width = \"80 mm\"", "width = \"0 mm\"", "zero");
  expect_design_error(p, "band.width", line_of(p, "\"0 mm\""));
}

TEST(BadInput, FrictionOutsideZeroToOne) {
  const auto p = example_with("material = \"molded\"", "material = \"molded\"\nfriction = 1.2", "friction");
  expect_design_error(p, "lining.friction", line_of(p, "friction = 1.2"), "1.2");
}

TEST(BadInput, PinInsideTheBandCircle) {
  const auto p = example_with("at = [\"60 mm\", \"-300 mm\"]", "at = [\"60 mm\", \"-150 mm\"]", "inside");
  expect_design_error(p, "band.end_b", line_of(p, "-150 mm"));
}

TEST(BadInput, PinTooCloseToTheBandCircle) {
  // r_b = 200 + 5 + 1.5 = 206.5 mm; a pin 210 mm from the centre leaves no room for a Ø16 loop.
  const auto p = example_with("at = [\"60 mm\", \"-300 mm\"]", "at = [\"0 mm\", \"-210 mm\"]", "close");
  expect_design_error(p, "band.end_b", line_of(p, "-210 mm"));
}

TEST(BadInput, BothEndsOnTheFrame) {
  const auto p = example_with("mount = \"lever\"", "mount = \"frame\"", "frame");
  expect_design_error(p, "band.end", 0, "lever");
}

TEST(BadInput, WrapAngleNearZero) {
  // Pins placed so that the tangent points (nearly) coincide: with s = -1 the wrap is
  // 360° - (ψ_A - ψ_B - α_A - α_B) ... here 1° (hand computation: α = acos(206.5/305.9) = 47.54°
  // for both pins, ψ_A = 0°, ψ_B = -96°).
  std::string a = "at = [\"305.9 mm\", \"0 mm\"]";
  std::string b = "at = [\"-31.98 mm\", \"-304.22 mm\"]";  // 305.9 mm at -96°
  auto p = example_with("at = [\"-60 mm\", \"-300 mm\"]", a, "wrap0a");
  std::string text = slurp(p);
  text.replace(text.find("at = [\"60 mm\", \"-300 mm\"]"), 25, b);
  std::ofstream(p, std::ios::binary) << text;
  const Result r = run("solve " + p.string());
  EXPECT_EQ(r.status, 2) << r.err;
  EXPECT_NE(r.err.find("wrap"), std::string::npos) << r.err;
  EXPECT_NE(r.err.find("band."), std::string::npos) << r.err;
}

TEST(BadInput, RunsThatCross) {
  // Sense reversed: end A (left) would run to a tangent point on the right and end B to the left.
  const auto p = example_with("sense = \"cw\"", "sense = \"ccw\"", "cross");
  expect_design_error(p, "band.", 0, "cross");
}

TEST(BadInput, BandEndsThatWouldOverlapRoundTheirPins) {
  // Pins 20 mm apart; two eyes of pin radius 8 + band thickness 3 and the 1.5 mm clearance need
  // 2·(8 + 3) + 1.5 = 23.5 mm: the band ends cannot pass through each other.
  const auto p = example_with("at = [\"60 mm\", \"-300 mm\"]", "at = [\"-40 mm\", \"-300 mm\"]", "eyes");
  expect_design_error(p, "band.end_b.at", line_of(p, "end_b ="), "at least 3.5 mm further from band.end_a.at");
}

TEST(BadInput, BandEndThatWouldCutTheOtherRun) {
  // Pin B at (−100, −220), beside end A's run. That run, by hand (REFERENCE §1.8 step 2):
  // A = (−60, −300), |A| = 305.94, r_b = 206.5, α = acos(r_b/|A|) = 47.55°, ψ = −101.31°,
  // sense cw (s = −1): β_A = ψ − α = −148.86°, T_A = r_b·(cos β, sin β) = (−176.70, −106.83).
  // Distance from B to the segment A–T_A: 7.137 mm; the eye (8 + 3), half the run's thickness
  // (1.5) and the clearance (1.5) need 14 mm.
  const double ax = -60, ay = -300, rb = 206.5, pi = 3.14159265358979323846;
  const double d = std::hypot(ax, ay), beta = std::atan2(ay, ax) - std::acos(rb / d);
  const double tx = rb * std::cos(beta), ty = rb * std::sin(beta), bx = -100, by = -220;
  const double ux = tx - ax, uy = ty - ay, len2 = ux * ux + uy * uy;
  const double k = ((bx - ax) * ux + (by - ay) * uy) / len2;
  const double gap = std::hypot(bx - ax - k * ux, by - ay - k * uy);
  ASSERT_NEAR(beta * 180 / pi, -148.86, 0.01);
  ASSERT_NEAR(gap, 7.137, 0.001);
  const auto p = example_with("at = [\"60 mm\", \"-300 mm\"]", "at = [\"-100 mm\", \"-220 mm\"]", "cut-run");
  expect_design_error(p, "band.end_b.at", line_of(p, "end_b ="), "would cut the other end's straight run: it is 7.13");
}

TEST(BadInput, LeverThatDoesNotTightenTheBand) {
  // Pivot on the line of end B's run: the band tension has no arm about the pivot.
  // Run B leaves B = (60, -300) toward its tangent point; the bin-hoist run direction is
  // u = (0.517155, 0.855892) (hand computation of REFERENCE §1.8 steps 2-4 for this layout).
  const auto p = example_with("pivot = [\"-110 mm\", \"-300 mm\"]",
                              "pivot = [\"8.2845 mm\", \"-385.5892 mm\"]", "zeroarm");
  expect_design_error(p, "lever.pivot", line_of(p, "8.2845 mm"));
}

TEST(BadInput, HandleAtThePivot) {
  const auto p = example_with("handle = [\"700 mm\", \"-300 mm\"]", "handle = [\"-110 mm\", \"-300 mm\"]", "handle");
  expect_design_error(p, "lever.handle", line_of(p, "handle ="));
}

TEST(BadInput, TomlSyntaxError) {
  const auto p = example_with("width = \"80 mm\"", "width = \"80 mm", "syntax");
  const Result r = run("solve " + p.string());
  EXPECT_EQ(r.status, 2) << r.err;
  EXPECT_NE(r.err.find(p.string() + ":" + std::to_string(line_of(p, "width = \"80 mm"))), std::string::npos) << r.err;
}

TEST(BadInput, TorqueAndLeverForceBothGiven) {
  const auto p = example_with("service_factor = 1.25", "service_factor = 1.25\nlever_force = \"200 N\"", "both");
  expect_design_error(p, "lever_force", 0, "torque");
}

TEST(BadInput, GarbageNeverCrashes) {
  const fs::path p = scratch_root() / "garbage.toml";
  std::string junk;
  for (int i = 0; i < 4096; ++i) junk.push_back(static_cast<char>((i * 7919) % 256));
  std::ofstream(p, std::ios::binary) << junk;
  const Result r = run("solve " + p.string());
  EXPECT_EQ(r.status, 2) << r.err;
  const fs::path empty = scratch_root() / "empty.toml";
  std::ofstream(empty, std::ios::binary) << "";
  EXPECT_EQ(run("solve " + empty.string()).status, 2);
}
