// Solver throughput. Target (issue 2): a pin-layout solve of both directions at three friction
// values, ≥ 1 million per second on one core. Run: build/tests/bench/solve_bench
#include <benchmark/benchmark.h>

#include "src/mechanics.hpp"

namespace {

using bandforge::Design;
using bandforge::Mount;

/// An invented differential hoist brake: drum Ø400, lining 6 mm, band 80 × 3 mm, both ends on a
/// lever below the drum (every layout rule passes).
Design bench_design() {
  Design d;
  d.file = "bench.toml";
  d.project.title = "bench";
  d.drum.diameter = 0.400;
  d.drum.width = 0.090;
  d.drum.rotation = bandforge::Turn::ccw;
  d.drum.density = 7200;
  d.drum.specific_heat = 460;
  d.lining.friction = 0.35;
  d.lining.friction_min = 0.30;
  d.lining.friction_max = 0.40;
  d.lining.pressure_limit = 0.7e6;
  d.lining.thickness = 0.006;
  d.band.width = 0.080;
  d.band.thickness = 0.003;
  d.band.allowable_stress = 60e6;
  d.band.sense = bandforge::Turn::ccw;
  d.band.end_a = {Mount::lever, {0.12, -0.30}};
  d.band.end_b = {Mount::lever, {-0.14, -0.29}};
  d.band.pin_diameter = 0.016;
  d.band.clearance = 0.002;
  d.lever.pivot = {0.06, -0.36};
  d.lever.handle = {-0.80, -0.40};
  d.lever.width = 0.05;
  d.lever.thickness = 0.016;
  d.lever.allowable_stress = 160e6;
  d.load.torque = 400;
  d.load.service_factor = 1.5;
  d.duty.present = true;
  d.duty.speed = 100.0;
  d.duty.inertia = 1.2;
  d.duty.stops_per_hour = 20;
  return d;
}

// One "solve" = layout + A tight and B tight at f_min, f_nominal, f_max.
void BM_LayoutAndSixDirections(benchmark::State& state) {
  const Design d = bench_design();
  const double f[3] = {d.lining.friction_min, d.lining.friction, d.lining.friction_max};
  for (auto _ : state) {
    const bandforge::Layout layout = bandforge::solve_layout(d);
    for (int dir = 0; dir < 2; ++dir) {
      for (double fk : f) {
        auto r = bandforge::solve_direction(d, layout, dir == 0, fk);
        benchmark::DoNotOptimize(r);
      }
    }
  }
  state.SetItemsProcessed(state.iterations());
}
BENCHMARK(BM_LayoutAndSixDirections);

void BM_SolveDirection(benchmark::State& state) {
  const Design d = bench_design();
  const bandforge::Layout layout = bandforge::solve_layout(d);
  for (auto _ : state) {
    auto r = bandforge::solve_direction(d, layout, true, 0.35);
    benchmark::DoNotOptimize(r);
  }
  state.SetItemsProcessed(state.iterations());
}
BENCHMARK(BM_SolveDirection);

// The full solution: the above plus capacity, thermal, checks and warnings (strings).
void BM_FullSolve(benchmark::State& state) {
  const Design d = bench_design();
  for (auto _ : state) {
    auto s = bandforge::solve(d);
    benchmark::DoNotOptimize(s);
  }
  state.SetItemsProcessed(state.iterations());
}
BENCHMARK(BM_FullSolve);

}  // namespace
