// Engine benchmarks (Google Benchmark). Figures are read as ratios against the baseline in the
// same run: BM_TerzaghiDegree is the baseline (one vertical degree evaluation).
#include <benchmark/benchmark.h>

#include "cell_fixture.hpp"
#include "wickgrid/search.hpp"

using namespace wickgrid;

static void BM_TerzaghiDegree(benchmark::State& state) {
    double tv = 0.05;
    for (auto _ : state) {
        benchmark::DoNotOptimize(degree_vertical(tv));
        tv = tv < 2.0 ? tv * 1.01 : 0.05;
    }
}
BENCHMARK(BM_TerzaghiDegree);

static void BM_CombinedDegree(benchmark::State& state) {
    const UnitCell cell(fixtures::typical_cell());
    double t = 1e6;
    for (auto _ : state) {
        benchmark::DoNotOptimize(cell.at(t).combined);
        t = t < 3e7 ? t * 1.01 : 1e6;
    }
}
BENCHMARK(BM_CombinedDegree);

static void BM_LargestSpacing(benchmark::State& state) {
    const CellSpec spec = fixtures::typical_cell();
    for (auto _ : state)
        benchmark::DoNotOptimize(largest_spacing(spec, 0.9, units::days_to_seconds(180.0), {0.8, 4.0}));
}
BENCHMARK(BM_LargestSpacing);

static void BM_FreeStrainBuild(benchmark::State& state) {
    for (auto _ : state) benchmark::DoNotOptimize(BarronFreeStrain(static_cast<double>(state.range(0))));
}
BENCHMARK(BM_FreeStrainBuild)->Arg(10)->Arg(100)->Unit(benchmark::kMillisecond);
