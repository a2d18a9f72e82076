// `propose` (issue 8): the brief reader, and the search checked against values computed outside
// the search: a hand optimum from the capstan relation and the arms (REFERENCE §1.1, §1.8), an
// exhaustive grid through solve(), read-back of every proposal, determinism and the infeasible
// report. The examples' briefs are invented demonstration data.
#include <gtest/gtest.h>

#include <cmath>
#include <cstdint>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <numbers>
#include <sstream>
#include <string>
#include <vector>

#include "src/brief.hpp"
#include "src/design_reader.hpp"
#include "src/errors.hpp"
#include "src/mechanics.hpp"
#include "src/propose.hpp"

namespace bf = bandforge;
namespace fs = std::filesystem;

namespace {

const std::string kBriefs = std::string(BANDFORGE_SOURCE_DIR) + "/examples/briefs";

std::vector<std::string> example_briefs() {
  std::vector<std::string> out;
  for (const auto& e : fs::directory_iterator(kBriefs))
    if (e.path().extension() == ".toml") out.push_back(e.path().string());
  std::sort(out.begin(), out.end());
  return out;
}

std::string error_of(const std::string& text) {
  try {
    bf::read_brief_text(text, "brief.toml");
  } catch (const bf::DesignError& e) {
    return e.what();
  }
  return "";
}

// A small valid brief; tests replace one line to make it wrong.
const char* kSmall = R"([project]
title = "Test brief"
number = "T-1"

[drum]
diameter = "400 mm"
bore = "60 mm"
rotation = "cw"

[lining]
friction = 0.35
friction_range = [0.30, 0.40]
pressure_limit = "1 MPa"
thickness = "5 mm"

[load]
torque = "300 N*m"

[operator]
max_force = "300 N"

[space]
pins = [["-300 mm", "-400 mm"], ["300 mm", "-400 mm"], ["300 mm", "-250 mm"], ["-300 mm", "-250 mm"]]
handle = [["300 mm", "-300 mm"], ["700 mm", "-300 mm"]]
)";

std::string replaced(std::string text, const std::string& from, const std::string& to) {
  const auto at = text.find(from);
  EXPECT_NE(at, std::string::npos) << from;
  return text.replace(at, from.size(), to);
}

// ---- REFERENCE §1.8 done again here, independently of src/mechanics.cpp ----

struct V {
  double x, y;
};

struct HandLayout {
  double wrap;      // φ [rad]
  double arm_b;     // perpendicular arm of the lever end B about the pivot [m]
};

/// Tangent construction for pins A, B outside the band line r_b, band sense s (+1 ccw from A).
HandLayout hand_layout(V a, V b, V o, double r_b, int s) {
  const double pi = std::numbers::pi;
  const auto polar = [](V p) { return std::atan2(p.y, p.x); };
  const double beta_a = polar(a) + s * std::acos(r_b / std::hypot(a.x, a.y));
  const double beta_b = polar(b) - s * std::acos(r_b / std::hypot(b.x, b.y));
  double phi = std::fmod(s * (beta_b - beta_a), 2 * pi);
  if (phi < 0) phi += 2 * pi;
  const V t{r_b * std::cos(beta_b), r_b * std::sin(beta_b)};
  const double len = std::hypot(t.x - b.x, t.y - b.y);
  const V u{(t.x - b.x) / len, (t.y - b.y) / len};
  return {phi, std::abs((b.x - o.x) * u.y - (b.y - o.y) * u.x)};
}

}  // namespace

// ---- the brief reader -----------------------------------------------------------------------

TEST(BriefReader, EveryExampleBriefReads) {
  const auto briefs = example_briefs();
  ASSERT_GE(briefs.size(), 4u);
  for (const std::string& path : briefs) {
    EXPECT_NO_THROW(bf::read_brief_file(path)) << path;
  }
}

TEST(BriefReader, ValuesWithUnitsAndLists) {
  const bf::Brief b = bf::read_brief_text(
      replaced(kSmall, "diameter = \"400 mm\"", "diameter = [\"16 in\", \"350 mm\"]"), "brief.toml");
  ASSERT_EQ(b.drum_diameters.size(), 2u);
  EXPECT_DOUBLE_EQ(b.drum_diameters[0], 0.350);           // sorted ascending
  EXPECT_NEAR(b.drum_diameters[1], 16 * 0.0254, 1e-12);    // 1 in = 25.4 mm exactly (NIST SP 811, B.8)
  EXPECT_DOUBLE_EQ(b.max_force, 300.0);
  EXPECT_EQ(b.handle.corners.size(), 2u);                  // a line segment
  EXPECT_EQ(b.goal, bf::Goal::force);
  EXPECT_EQ(b.proposals, 5);
  EXPECT_EQ(b.kinds.size(), 3u);
  EXPECT_FALSE(b.stock.pin_diameter.empty());              // the built-in series
}

TEST(BriefReader, MistakesNameFileLineColumnKeyAndWhatIsValid) {
  // A misspelt key gets the design reader's did-you-mean (the shared machinery).
  std::string e = error_of(replaced(kSmall, "max_force = \"300 N\"", "max_forse = \"300 N\""));
  EXPECT_NE(e.find("brief.toml:20:1"), std::string::npos) << e;
  EXPECT_NE(e.find("did you mean 'max_force'"), std::string::npos) << e;
  // A bare number where a force is expected.
  e = error_of(replaced(kSmall, "max_force = \"300 N\"", "max_force = 300"));
  EXPECT_NE(e.find("operator.max_force"), std::string::npos) << e;
  EXPECT_NE(e.find("give the unit"), std::string::npos) << e;
  // A region whose corners are on one line.
  e = error_of(replaced(kSmall, "[\"300 mm\", \"-250 mm\"], [\"-300 mm\", \"-250 mm\"]]",
                        "[\"0 mm\", \"-400 mm\"]]"));
  EXPECT_NE(e.find("space.pins"), std::string::npos) << e;
  EXPECT_NE(e.find("enclose no area"), std::string::npos) << e;
  // Corners not in order round the region: a bow-tie.
  e = error_of(replaced(kSmall, "[\"300 mm\", \"-400 mm\"], [\"300 mm\", \"-250 mm\"]",
                        "[\"300 mm\", \"-250 mm\"], [\"300 mm\", \"-400 mm\"]"));
  EXPECT_NE(e.find("edges cross each other"), std::string::npos) << e;
  // An unknown goal.
  e = error_of(std::string(kSmall) + "\n[goal]\nminimise = \"cost\"\n");
  EXPECT_NE(e.find("goal.minimise"), std::string::npos) << e;
  EXPECT_NE(e.find("\"force\""), std::string::npos) << e;
  // An unknown section.
  e = error_of(std::string(kSmall) + "\n[limit]\nclearance = \"1 mm\"\n");
  EXPECT_NE(e.find("did you mean [limits]"), std::string::npos) << e;
  // Missing [space] handle.
  e = error_of(replaced(kSmall, "handle = [[\"300 mm\", \"-300 mm\"], [\"700 mm\", \"-300 mm\"]]", ""));
  EXPECT_NE(e.find("missing key 'handle'"), std::string::npos) << e;
}

TEST(Regions, ContainAndClosest) {
  bf::Region square{{{0, 0}, {1, 0}, {1, 1}, {0, 1}}};
  EXPECT_TRUE(bf::region_contains(square, {0.5, 0.5}));
  EXPECT_TRUE(bf::region_contains(square, {1.0, 0.5}));   // on the boundary
  EXPECT_FALSE(bf::region_contains(square, {1.1, 0.5}));
  EXPECT_NEAR(bf::region_distance(square, {2, 0.5}), 1.0, 1e-12);
  bf::Region segment{{{0, 0}, {2, 0}}};
  EXPECT_NEAR(bf::region_closest(segment, {1, 3}).x, 1.0, 1e-12);
  EXPECT_NEAR(bf::region_closest(segment, {1, 3}).y, 0.0, 1e-12);
  bf::Region point{{{0.3, -0.2}}};
  EXPECT_TRUE(bf::region_contains(point, {0.3, -0.2}));
  EXPECT_FALSE(bf::region_contains(point, {0.3, -0.21}));
}

// ---- the search against outside values ------------------------------------------------------

namespace {

/// kSmall narrowed to a simple brake: the frame pin and the pivot fixed, the lever pin in
/// `lever_pins`, one size of each stock, one proposal.
std::string simple_brief(const std::string& lever_pins) {
  return std::string(kSmall) + "frame_pin = [[\"-60 mm\", \"-300 mm\"]]\nlever_pins = " + lever_pins +
         "\npivot = [[\"-110 mm\", \"-300 mm\"]]\n" + R"(
[stock]
band_width = ["80 mm"]
band_thickness = ["3 mm"]
pin_diameter = ["16 mm"]
lever_width = ["50 mm"]
lever_thickness = ["16 mm"]

[goal]
kinds = ["simple"]
proposals = 1
)";
}

}  // namespace

// Every position fixed but the handle, which may be anywhere on a segment along the lever line:
// the lowest force is the capstan relation's slack tension times the lever end's arm over the
// longest handle arm, for the better band sense (REFERENCE §1.1 P1/P2 = e^(fφ), T = (P1 − P2)·r;
// §1.6 simple brake F = P·m/L; §1.8 tangent construction for φ and m).
TEST(ProposeSearch, FindsTheHandOptimumOfASimpleBrake) {
  const std::string text = simple_brief(R"([["60 mm", "-300 mm"]])");
  const bf::Brief brief = bf::read_brief_text(text, "hand.toml");
  const bf::ProposeResult r = bf::propose(brief, 2);
  ASSERT_EQ(r.proposals.size(), 1u) << r.infeasible;

  const double radius = 0.200, r_b = 0.200 + 0.005 + 0.003 / 2, f_min = 0.30, torque = 300.0;
  const V a{-0.060, -0.300}, b{0.060, -0.300}, o{-0.110, -0.300};
  const double arm = 0.700 - (-0.110);  // the far end of the handle segment
  double best = 1e300;
  int best_sense = 0;
  for (int s : {+1, -1}) {
    const HandLayout h = hand_layout(a, b, o, r_b, s);
    const double e = std::exp(f_min * h.wrap);
    const double slack = torque / (radius * (e - 1.0));
    // Drum cw: end A is tight when the band runs cw from A (s = −1, REFERENCE §1.5).
    const bool a_tight = s == -1;
    const double on_lever = a_tight ? slack : e * slack;
    const double force = on_lever * h.arm_b / arm;
    if (force < best) {
      best = force;
      best_sense = s;
    }
  }
  const bf::Proposal& p = r.proposals[0];
  EXPECT_EQ(p.design.band.sense, best_sense > 0 ? bf::Turn::ccw : bf::Turn::cw);
  EXPECT_NEAR(p.figures.force, best, 0.005 * best) << "hand optimum " << best << " N";
  EXPECT_NEAR(p.design.lever.handle.x, 0.700, 1e-9);
}

namespace {

/// Whether a design meets everything a proposal must (the brief's limits and every check).
bool feasible(const bf::Design& d, double max_force, double max_travel, double* force) {
  bf::Solution s;
  try {
    s = bf::solve(d);
  } catch (const bf::DesignError&) {
    return false;
  }
  for (const bf::Check& c : s.checks)
    if (!c.ok) return false;
  if (!s.hardware.refusal.empty() || !s.hardware.release_ok) return false;
  const double f = s.results[s.primary_a_tight ? 0 : 1][0].lever_force;
  if (f > max_force || s.layout.handle_travel > max_travel) return false;
  *force = f;
  return true;
}

}  // namespace

// An exhaustive grid written here (lever pin over a square at 2 mm, handle along a slanted
// segment at 1/40 of its length, both band senses), each point through solve() and the hardware
// plan: none may beat the proposal by more than the grid's resolution.
TEST(ProposeSearch, NoGridPointBeatsTheProposal) {
  const std::string text =
      simple_brief(R"([["20 mm", "-330 mm"], ["100 mm", "-330 mm"], ["100 mm", "-270 mm"], ["20 mm", "-270 mm"]])");
  std::string brief_text = replaced(text, "max_force = \"300 N\"", "max_force = \"300 N\"\nmax_travel = \"40 mm\"");
  brief_text = replaced(brief_text, "handle = [[\"300 mm\", \"-300 mm\"], [\"700 mm\", \"-300 mm\"]]",
                        "handle = [[\"350 mm\", \"-450 mm\"], [\"750 mm\", \"-150 mm\"]]");
  const bf::Brief brief = bf::read_brief_text(brief_text, "grid.toml");
  const bf::ProposeResult r = bf::propose(brief, 2);
  ASSERT_EQ(r.proposals.size(), 1u) << r.infeasible;
  const double found = r.proposals[0].figures.force;

  bf::Design d = r.proposals[0].design;  // everything else as the proposal has it
  double grid_best = 1e300;
  int feasible_points = 0;
  for (int sense = 0; sense < 2; ++sense) {
    d.band.sense = sense == 0 ? bf::Turn::cw : bf::Turn::ccw;
    for (int i = 0; i <= 40; ++i) {
      for (int j = 0; j <= 30; ++j) {
        d.band.end_b.at = {0.020 + 0.002 * i, -0.330 + 0.002 * j};
        for (int k = 0; k <= 40; ++k) {
          const double u = k / 40.0;
          d.lever.handle = {0.350 + 0.400 * u, -0.450 + 0.300 * u};
          double force = 0;
          if (feasible(d, 300.0, 0.040, &force)) {
            ++feasible_points;
            grid_best = std::min(grid_best, force);
          }
        }
      }
    }
  }
  ASSERT_GT(feasible_points, 100);
  EXPECT_LE(found, grid_best * 1.001) << "grid best " << grid_best << " N, proposal " << found << " N";
}

// Every proposal of every example brief, written as a design file and read back, solves with
// every check passing, and its figures are those propose reports.
TEST(ProposeSearch, EveryProposalReadsBackAndPasses) {
  for (const std::string& path : example_briefs()) {
    const bf::Brief brief = bf::read_brief_file(path);
    const bf::ProposeResult r = bf::propose(brief, 2);
    ASSERT_FALSE(r.proposals.empty()) << path << ": " << r.infeasible;
    EXPECT_LE(static_cast<int>(r.proposals.size()), brief.proposals);
    for (std::size_t i = 0; i < r.proposals.size(); ++i) {
      const bf::Proposal& p = r.proposals[i];
      const std::string text = bf::proposal_toml(brief, p, static_cast<int>(i + 1));
      const bf::Design d = bf::read_design_text(text, p.design.project.number + ".toml");
      const bf::Solution s = bf::solve(d);
      for (const bf::Check& c : s.checks) EXPECT_TRUE(c.ok) << path << " P" << i + 1 << ": " << c.id;
      EXPECT_TRUE(s.hardware.refusal.empty()) << s.hardware.refusal;
      EXPECT_TRUE(s.hardware.release_ok) << s.hardware.release_problem;
      const int primary = s.primary_a_tight ? 0 : 1;
      double force = s.results[primary][0].lever_force;
      if (brief.both_directions) force = std::max(force, s.results[1 - primary][0].lever_force);
      EXPECT_NEAR(force, p.figures.force, 1e-6 * p.figures.force + 1e-9) << path;
      EXPECT_LE(force, brief.max_force * (1 + 1e-9)) << path;
      double pressure = 0, stress = 0;
      for (int dir = 0; dir < (brief.both_directions ? 2 : 1); ++dir) {
        const int k = dir == 0 ? primary : 1 - primary;
        for (const auto& x : s.results[k]) {
          pressure = std::max(pressure, x.pressure_max);
          stress = std::max(stress, x.band_stress);
        }
      }
      EXPECT_NEAR(pressure, p.figures.pressure, 1e-6 * pressure) << path;
      EXPECT_NEAR(stress, p.figures.band_stress, 1e-6 * stress) << path;
      if (brief.max_travel > 0) {
        EXPECT_LE(s.layout.handle_travel, brief.max_travel * (1 + 1e-9));
      }
      // Inside the regions.
      EXPECT_TRUE(bf::region_contains(brief.handle, d.lever.handle, 1e-9)) << path;
      EXPECT_TRUE(bf::region_contains(brief.pivot.corners.empty() ? brief.pins : brief.pivot, d.lever.pivot, 1e-9));
      // Never a self-locking brake unless the brief allows it, with its margin.
      if (!brief.allow_self_locking && s.self_lock_friction) {
        EXPECT_GE(*s.self_lock_friction, brief.self_lock_margin * d.lining.friction_max * (1 - 1e-9)) << path;
      }
    }
  }
}

TEST(ProposeSearch, SameBriefSameProposalsWhateverTheThreads) {
  const std::string path = kBriefs + "/bin-hoist.toml";
  const bf::Brief brief = bf::read_brief_file(path);
  const bf::ProposeResult one = bf::propose(brief, 1);
  const bf::ProposeResult two = bf::propose(brief, 2);
  ASSERT_FALSE(one.proposals.empty());
  EXPECT_EQ(bf::proposals_csv(one.proposals), bf::proposals_csv(two.proposals));
  ASSERT_EQ(one.proposals.size(), two.proposals.size());
  for (std::size_t i = 0; i < one.proposals.size(); ++i) {
    EXPECT_EQ(bf::proposal_toml(brief, one.proposals[i], static_cast<int>(i + 1)),
              bf::proposal_toml(brief, two.proposals[i], static_cast<int>(i + 1)));
  }
}

TEST(ProposeSearch, ProposalsDifferMeaningfully) {
  const bf::Brief brief = bf::read_brief_file(kBriefs + "/bin-hoist.toml");
  const bf::ProposeResult r = bf::propose(brief, 2);
  for (std::size_t i = 0; i < r.proposals.size(); ++i) {
    for (std::size_t k = i + 1; k < r.proposals.size(); ++k) {
      const bf::Design& x = r.proposals[i].design;
      const bf::Design& y = r.proposals[k].design;
      const auto d = [](bf::Vec2 p, bf::Vec2 q) { return std::hypot(p.x - q.x, p.y - q.y); };
      const bool same_arrangement = r.proposals[i].kind == r.proposals[k].kind &&
                                    x.band.sense == y.band.sense && x.drum.diameter == y.drum.diameter;
      const double moved = d(x.band.end_a.at, y.band.end_a.at) + d(x.band.end_b.at, y.band.end_b.at) +
                           d(x.lever.pivot, y.lever.pivot);
      EXPECT_TRUE(!same_arrangement || moved >= 0.4 * x.drum.diameter) << "P" << i + 1 << " and P" << k + 1;
    }
  }
}

// Nothing feasible: the report names the binding limit and what the best candidate needs.
TEST(ProposeSearch, InfeasibleBriefNamesTheBindingLimit) {
  const bf::Brief brief = bf::read_brief_text(replaced(kSmall, "max_force = \"300 N\"", "max_force = \"15 N\""),
                                              "weak.toml");
  const bf::ProposeResult r = bf::propose(brief, 2);
  EXPECT_TRUE(r.proposals.empty());
  EXPECT_NE(r.infeasible.find("operator force binds"), std::string::npos) << r.infeasible;
  // "the best needs N N against 15 N"
  const auto at = r.infeasible.find("the best needs ");
  ASSERT_NE(at, std::string::npos) << r.infeasible;
  const double needs = std::stod(r.infeasible.substr(at + 15));
  EXPECT_GT(needs, 15.0);
  EXPECT_NE(r.infeasible.find("handle region reaching"), std::string::npos) << r.infeasible;
}

// Generated briefs (drum, torque, force limit, regions, an occasional keep-out), fixed seed: the
// search never crashes; it either proposes designs that read back passing every check, or says
// what binds.
TEST(ProposeSearch, GeneratedBriefsProposeOrExplain) {
  std::uint64_t state = 20261202;
  auto uniform = [&](double lo, double hi) {
    state = state * 6364136223846793005ull + 1442695040888963407ull;  // Knuth's MMIX LCG
    return lo + (hi - lo) * static_cast<double>(state >> 11) / 9007199254740992.0;
  };
  int proposed = 0, explained = 0;
  for (int i = 0; i < 16; ++i) {
    const double D = uniform(250, 600), R = D / 2;
    const double top = -(R + uniform(20, 80)), depth = uniform(80, 220), half = uniform(0.5, 1.2) * R;
    const double hx0 = half + uniform(30, 150), hx1 = hx0 + uniform(150, 700);
    char text[2048];
    std::snprintf(text, sizeof text, R"([project]
title = "Generated %d"
number = "GEN-%d"
[drum]
diameter = "%.1f mm"
bore = "%.1f mm"
rotation = "%s"
[lining]
material = "%s"
thickness = "%.1f mm"
[load]
torque = "%.0f N*m"
service_factor = 1.25
[operator]
max_force = "%.0f N"
[space]
pins = [["%.1f mm", "%.1f mm"], ["%.1f mm", "%.1f mm"], ["%.1f mm", "%.1f mm"], ["%.1f mm", "%.1f mm"]]
handle = [["%.1f mm", "%.1f mm"], ["%.1f mm", "%.1f mm"], ["%.1f mm", "%.1f mm"], ["%.1f mm", "%.1f mm"]]
%s
[goal]
proposals = 3
)",
                  i, i, D, 0.15 * D, uniform(0, 1) < 0.5 ? "cw" : "ccw", uniform(0, 1) < 0.5 ? "woven" : "molded",
                  uniform(0, 1) < 0.2 ? 0.0 : uniform(3, 6), uniform(80, 1200), uniform(120, 350),
                  -half, top - depth, half, top - depth, half, top, -half, top,
                  hx0, top - depth - 60, hx1, top - depth - 60, hx1, top + 60, hx0, top + 60,
                  uniform(0, 1) < 0.3 ? "keep_out = [[[\"-30 mm\", \"-2000 mm\"], [\"30 mm\", \"-2000 mm\"], [\"30 mm\", \"-600 mm\"], [\"-30 mm\", \"-600 mm\"]]]" : "");
    const bf::Brief brief = bf::read_brief_text(text, "generated.toml");
    const bf::ProposeResult r = bf::propose(brief, 2);
    if (r.proposals.empty()) {
      ++explained;
      EXPECT_NE(r.infeasible.find("no layout in the space holds"), std::string::npos) << text;
      continue;
    }
    ++proposed;
    for (const bf::Proposal& p : r.proposals) {
      const bf::Solution s = bf::solve(bf::read_design_text(bf::proposal_toml(brief, p, 1), "p.toml"));
      for (const bf::Check& c : s.checks) EXPECT_TRUE(c.ok) << text << "\n" << c.id;
      EXPECT_TRUE(s.hardware.refusal.empty()) << s.hardware.refusal;
    }
  }
  EXPECT_GE(proposed, 6) << explained << " explained";
}
