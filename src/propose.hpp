// `bandforge propose`: from a brief (src/brief.hpp) to ranked designs that pass every check and
// whose generated hardware can be built. Core only (no OpenCASCADE, no libharu): the search, the
// figures of each proposal and the reasons; the CLI writes the files, drawing/ the review sheet.
//
// Method (README "Briefs and proposals"): for each drum diameter, a coarse exhaustive pass over
// the three kinds, both band senses, the pin, pivot and handle samples of the space regions, and
// the stock (the lightest that passes, chosen per layout); the feasible layouts go into a
// shortlist kept diverse (no two alike); each is then refined by a compass (pattern) search
// (Kolda, Lewis & Torczon, "Optimization by direct search", SIAM Review 45(3), 2003, §3) on the
// continuous positions; finally each is read back through solve() and plan_hardware() exactly as
// `solve` and `build` do, and only those that pass everything become proposals. Deterministic: no
// random numbers, fixed iteration orders, threads joined in a fixed order.
#pragma once

#include <functional>
#include <limits>
#include <memory>
#include <string>
#include <vector>

#include "src/brief.hpp"
#include "src/design.hpp"

namespace bandforge {

struct Solution;  // src/mechanics.hpp

/// Figures of one candidate or proposal (SI).
struct Figures {
  double force = 0;         ///< operator force at f_min, design rotation (both if asked) [N]
  double band_mass = 0;     ///< steel band [kg]
  double travel = 0;        ///< handle travel to take up the clearance [m]
  double size = 0;          ///< lever length: pivot to the farthest lever point [m]
  double pressure = 0;      ///< largest lining pressure [Pa]
  double band_stress = 0;   ///< largest band stress, gross section [Pa]
  double pin_shear = 0;     ///< largest pin shear [Pa]
  double lever_stress = 0;  ///< largest lever bending stress [Pa]
  double self_lock_friction = std::numeric_limits<double>::infinity();  ///< lowest f that locks
  double wrap = 0;          ///< [rad]
};

struct Proposal {
  Design design;            ///< complete: written as <number>-Pn.toml
  BrakeKind kind = BrakeKind::simple;
  Figures figures;
  std::string reason;       ///< why it was chosen (one line)
  std::vector<std::string> margins;  ///< "operator force 182 N of 250 N (27 % margin)", …
};

/// One feasible layout seen by the search, for the review sheet's scatter plot.
struct CloudPoint {
  double force = 0;      ///< [N]
  double band_mass = 0;  ///< [kg]
};

struct SearchStats {
  long long layouts = 0;     ///< candidate layouts evaluated (both directions × three frictions)
  long long handles = 0;     ///< handle positions screened
  long long feasible = 0;    ///< layouts that passed every inner check
  int shortlisted = 0;       ///< refined
  int validated = 0;         ///< read back through solve() and plan_hardware()
  int rejected = 0;          ///< of those, refused by the full checks, the hardware plan or the build
  int built = 0;             ///< solids built and checked (with a build check)
  std::vector<std::string> rejections;  ///< why (first few), for the infeasible message
};

struct ProposeResult {
  std::vector<Proposal> proposals;
  std::vector<CloudPoint> cloud;  ///< feasible layouts (a deterministic subsample)
  SearchStats stats;
  /// Empty when there are proposals; else what binds for the best candidate and by how much,
  /// and what would relax it.
  std::string infeasible;
};

/// Called now and then with the fraction done (0…1) and what is being done.
using ProgressFn = std::function<void(double fraction, const std::string& stage)>;

/// Builds the solids of a design that passed solve() and the hardware plan; returns "" when they
/// build and pass their checks, else why not. Supplied by the command (geometry/), so that the
/// core stays free of OpenCASCADE.
using BuildCheckFn = std::function<std::string(const Design&, const Solution&)>;

/// The search. `threads` ≥ 1 (the result does not depend on it). With `builds`, only designs
/// whose solids build become proposals.
ProposeResult propose(const Brief& brief, int threads = 2, const ProgressFn& progress = {},
                      const BuildCheckFn& builds = {});

/// A design file's text for a proposal, with a comment header (why, margins, caution).
std::string proposal_toml(const Brief& brief, const Proposal& p, int rank);

/// proposals.csv: header and one row per proposal.
std::string proposals_csv(const std::vector<Proposal>& proposals);

/// The inner evaluation alone, for the benchmark (tests/bench/propose_bench.cpp): `count`
/// candidates of the brief's coarse pass (repeated if the pass has fewer), all of them, or only
/// those whose layout exists and passes the 2-D screen (every direction and limit evaluated).
class CandidateSample {
 public:
  CandidateSample(const Brief& brief, long long count, bool solved_only);
  ~CandidateSample();
  CandidateSample(const CandidateSample&) = delete;
  CandidateSample& operator=(const CandidateSample&) = delete;
  long long size() const;
  /// Evaluates every candidate once; returns how many meet every limit.
  long long evaluate() const;

 private:
  struct Impl;
  std::unique_ptr<Impl> impl_;
};

}  // namespace bandforge
