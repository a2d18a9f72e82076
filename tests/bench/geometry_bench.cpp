// Build stages for the bundled example. Target (issue 3): solids + checks + STEP write under
// 100 ms; peak memory of `bandforge build` under 150 MB (measure with /usr/bin/time -v).
// Run: build/tests/bench/geometry_bench
#include <filesystem>
#include <string>

#include <benchmark/benchmark.h>

#include "geometry/assemble.hpp"
#include "geometry/brake_model.hpp"
#include "src/mechanics.hpp"
#include "tests/bench/example.hpp"

namespace {

using namespace bandforge;
using bench::example;
using bench::solution;

std::string scratch_step() {
  return (std::filesystem::temp_directory_path() / "bandforge-geometry-bench.step").string();
}

// Stage 1: every solid, placed; no checks.
void BM_Solids(benchmark::State& state) {
  geom::BuildOptions o;
  o.checks = false;
  for (auto _ : state) benchmark::DoNotOptimize(geom::build_brake(example(), solution(), o));
}
BENCHMARK(BM_Solids)->Unit(benchmark::kMillisecond);

// Stage 2: validity, mass properties, pairwise interference and clearance.
void BM_Checks(benchmark::State& state) {
  geom::BuildOptions o;
  o.checks = false;
  geom::BrakeModel model = geom::build_brake(example(), solution(), o);
  for (auto _ : state) {
    geom::run_checks(model.impl(), model.impl().intended, /*interference=*/true);
    benchmark::DoNotOptimize(model.contacts().size());
  }
}
BENCHMARK(BM_Checks)->Unit(benchmark::kMillisecond);

// Stage 3: XCAF document, AP214 transfer, write, canonical renumbering, rename.
void BM_StepWrite(benchmark::State& state) {
  const geom::BrakeModel model = geom::build_brake(example(), solution(), {});
  const std::string path = scratch_step();
  for (auto _ : state) geom::write_step(model, example(), path);
  std::filesystem::remove(path);
}
BENCHMARK(BM_StepWrite)->Unit(benchmark::kMillisecond);

// Everything the build command does after reading the file: solve, solids, checks, STEP.
void BM_SolveBuildCheckWrite(benchmark::State& state) {
  const std::string path = scratch_step();
  for (auto _ : state) {
    const Solution s = solve(example());
    const geom::BrakeModel model = geom::build_brake(example(), s, {});
    geom::write_step(model, example(), path);
  }
  std::filesystem::remove(path);
}
BENCHMARK(BM_SolveBuildCheckWrite)->Unit(benchmark::kMillisecond);

}  // namespace
