// PDF drawing stages for the bundled example. Target (issue 4): the whole `bandforge build`
// (solve, solids, checks, STEP, PDF) under 250 ms wall, peak memory under 200 MB (measure the
// command with /usr/bin/time -v). Run: build/tests/bench/drawing_bench
#include <filesystem>
#include <string>
#include <vector>

#include <benchmark/benchmark.h>

#include "drawing/drawing.hpp"
#include "geometry/brake_model.hpp"
#include "geometry/flat_patterns.hpp"
#include "geometry/projection.hpp"
#include "src/mechanics.hpp"
#include "tests/bench/example.hpp"

namespace {

using namespace bandforge;
using bench::example;
using bench::solution;

const geom::BrakeModel& applied() {
  static const geom::BrakeModel m = geom::build_brake(example(), solution(), {});
  return m;
}

// The released state is only drawn (the lever's phantom position): no checks needed.
geom::BuildOptions released_options() {
  geom::BuildOptions o;
  o.released = true;
  o.checks = false;
  o.lever_only = true;  // as `build` draws the phantom (src/cli/cmd_build.cpp)
  return o;
}

const geom::BrakeModel& released() {
  static const geom::BrakeModel m = geom::build_brake(example(), solution(), released_options());
  return m;
}

// The cut-list rows of the calculation sheet's table, as `build` takes them on the drawing thread.
const std::vector<geom::CutListRow>& cut() {
  static const std::vector<geom::CutListRow> rows = geom::cut_list(example(), solution(), applied());
  return rows;
}

// Exact hidden-line removal, one view each.
void BM_HlrFront(benchmark::State& state) {
  for (auto _ : state) benchmark::DoNotOptimize(geom::project(applied(), geom::front_view()));
}
BENCHMARK(BM_HlrFront)->Unit(benchmark::kMillisecond);

void BM_HlrSide(benchmark::State& state) {
  for (auto _ : state) benchmark::DoNotOptimize(geom::project(applied(), geom::left_view()));
}
BENCHMARK(BM_HlrSide)->Unit(benchmark::kMillisecond);

void BM_HlrReleasedLever(benchmark::State& state) {
  geom::ProjectOptions o;
  o.hidden = false;
  o.smooth = false;
  o.kinds = {"lever", "grip"};
  for (auto _ : state) benchmark::DoNotOptimize(geom::project(released(), geom::front_view(), o));
}
BENCHMARK(BM_HlrReleasedLever)->Unit(benchmark::kMillisecond);

// The released model the drawing needs in addition to the applied one.
void BM_ReleasedModel(benchmark::State& state) {
  for (auto _ : state) benchmark::DoNotOptimize(geom::build_brake(example(), solution(), released_options()));
}
BENCHMARK(BM_ReleasedModel)->Unit(benchmark::kMillisecond);

// The cut list the drawing thread computes from its own model (flat patterns of every part).
void BM_CutList(benchmark::State& state) {
  for (auto _ : state) benchmark::DoNotOptimize(geom::cut_list(example(), solution(), applied()));
}
BENCHMARK(BM_CutList)->Unit(benchmark::kMillisecond);

// The whole PDF in memory: HLR of all views, layout, both sheets, libharu output.
void BM_RenderPdf(benchmark::State& state) {
  for (auto _ : state) {
    benchmark::DoNotOptimize(
        drawing::render_drawing(example(), solution(), &applied(), &released(), cut(), UnitSystem::si));
  }
}
BENCHMARK(BM_RenderPdf)->Unit(benchmark::kMillisecond);

// The calculation sheet alone (a concept design's whole PDF): layout and libharu, no views.
void BM_RenderCalculationOnly(benchmark::State& state) {
  for (auto _ : state) {
    benchmark::DoNotOptimize(drawing::render_drawing(example(), solution(), nullptr, nullptr, {}, UnitSystem::si));
  }
}
BENCHMARK(BM_RenderCalculationOnly)->Unit(benchmark::kMillisecond);

// To the file: render, temporary file, rename.
void BM_WritePdf(benchmark::State& state) {
  const std::string path = (std::filesystem::temp_directory_path() / "bandforge-drawing-bench.pdf").string();
  for (auto _ : state) {
    benchmark::DoNotOptimize(
        drawing::write_drawing(example(), solution(), &applied(), &released(), cut(), UnitSystem::si, path));
  }
  std::filesystem::remove(path);
}
BENCHMARK(BM_WritePdf)->Unit(benchmark::kMillisecond);

}  // namespace
