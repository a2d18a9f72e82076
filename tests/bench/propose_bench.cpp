// The layout search's inner evaluation (issue 8 target: ≥ 1 million candidates per second on one
// core): one candidate = the layout from the pins, the forces in both rotations at f_min,
// f_nominal and f_max, every limit of the brief and of solve(), and the 2-D screen on the
// hardware's rules (lever holes, grip, keep-out regions). Run: build/tests/bench/propose_bench
#include <benchmark/benchmark.h>

#include <string>

#include "src/brief.hpp"
#include "src/propose.hpp"

namespace {

bandforge::Brief brief(const char* name) {
  return bandforge::read_brief_file(std::string(BANDFORGE_SOURCE_DIR) + "/examples/briefs/" + name);
}

// All candidates of the coarse pass in its order (most stop at the layout rules), and only those
// whose layout is solved in full (both rotations at three frictions, every limit, the screen).
void BM_InnerEvaluation(benchmark::State& state, const char* name, bool solved_only) {
  const bandforge::Brief b = brief(name);
  const bandforge::CandidateSample sample(b, 20000, solved_only);
  long long feasible = 0;
  for (auto _ : state) feasible += sample.evaluate();
  const double n = static_cast<double>(state.iterations() * sample.size());
  state.SetItemsProcessed(state.iterations() * sample.size());
  state.counters["feasible_share"] = static_cast<double>(feasible) / n;
}
BENCHMARK_CAPTURE(BM_InnerEvaluation, bin_hoist_all, "bin-hoist.toml", false);
BENCHMARK_CAPTURE(BM_InnerEvaluation, bin_hoist_solved, "bin-hoist.toml", true);
BENCHMARK_CAPTURE(BM_InnerEvaluation, trolley_keep_out_solved, "trolley.toml", true);

// The whole search (coarse pass, refinement, read-back), without writing files.
void BM_Propose(benchmark::State& state, const char* name) {
  const bandforge::Brief b = brief(name);
  for (auto _ : state) {
    const bandforge::ProposeResult r = bandforge::propose(b, static_cast<int>(state.range(0)));
    benchmark::DoNotOptimize(r.proposals.size());
    state.counters["layouts"] = static_cast<double>(r.stats.layouts);
  }
}
BENCHMARK_CAPTURE(BM_Propose, bin_hoist, "bin-hoist.toml")->Arg(1)->Arg(2)->Unit(benchmark::kMillisecond);
BENCHMARK_CAPTURE(BM_Propose, barge_capstan, "barge-capstan.toml")->Arg(2)->Unit(benchmark::kMillisecond);

}  // namespace
