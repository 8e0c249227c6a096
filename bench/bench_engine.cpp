// Engine benchmarks (Google Benchmark). Figures are read as ratios against the baseline in the
// same run: BM_TerzaghiDegree is the baseline (one vertical degree evaluation).
#include <benchmark/benchmark.h>

#include "cell_fixture.hpp"
#include "wickgrid/search.hpp"
#include "wickgrid/studies.hpp"
#include "wickgrid/numerical.hpp"
#include "report/layout_report.hpp"
#include "results/layout_record.hpp"

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

static void BM_SpacingSolverReused(benchmark::State& state) {
    const CellSpec spec = fixtures::typical_cell();
    SpacingSolver solver;
    for (auto _ : state) {
        solver.reset(spec, {0.8, 4.0});
        benchmark::DoNotOptimize(solver.solve(0.9, units::days_to_seconds(180.0)));
    }
}
BENCHMARK(BM_SpacingSolverReused);

// The Monte Carlo case: 1,000,000 samples of (ch, smear ratios, qw), a full largest-spacing
// search for each of two patterns, on all cores. Wall time.
static void BM_MonteCarloMillion(benchmark::State& state) {
    const Site d = fixtures::typical_design(180.0);
    const DesignResult base = run_design(d);
    MonteCarloSpec spec;
    spec.samples = 1000000;
    spec.inputs = {
        {StudyInput::ch, {DistributionKind::lognormal, *d.ground.ch_m2_per_s, 0.3 * *d.ground.ch_m2_per_s}},
        {StudyInput::smear_diameter_ratio, {DistributionKind::uniform, 1.5, 3.0}},
        {StudyInput::smear_permeability_ratio, {DistributionKind::triangular, 2.0, 3.0, 5.0}},
        {StudyInput::discharge_capacity_factor, {DistributionKind::lognormal, 1.0, 0.3}}};
    for (auto _ : state) benchmark::DoNotOptimize(monte_carlo(d, base, spec));
}
BENCHMARK(BM_MonteCarloMillion)->Iterations(2)->Unit(benchmark::kSecond)->UseRealTime();

// The numerical unit cell: 40 × 80 cells (plus the drain conduit) marched to U = 0.99.
static void BM_NumericalTo99(benchmark::State& state) {
    const NumericalCellSpec spec = numerical_spec(fixtures::typical_cell());
    for (auto _ : state) benchmark::DoNotOptimize(NumericalCell(spec, {}).time_to_degree_s(0.99));
}
BENCHMARK(BM_NumericalTo99)->Unit(benchmark::kMillisecond);

// A design through the cell-model interface: one product, two patterns, closed form under one
// instantaneous load (fast path) and under a staged load (generic search on cell models).
static void BM_DesignInstantaneous(benchmark::State& state) {
    const Site d = fixtures::typical_design(180.0);
    for (auto _ : state) benchmark::DoNotOptimize(run_design(d));
}
BENCHMARK(BM_DesignInstantaneous)->Unit(benchmark::kMicrosecond);

static void BM_DesignStaged(benchmark::State& state) {
    Site d = fixtures::typical_design(180.0);
    d.loading = LoadHistory{{{0.0, units::days_to_seconds(30.0), 40.0}, {units::days_to_seconds(60.0), units::days_to_seconds(90.0), 40.0}}, std::nullopt, std::nullopt};
    for (auto _ : state) benchmark::DoNotOptimize(run_design(d));
}
BENCHMARK(BM_DesignStaged)->Unit(benchmark::kMillisecond);

// A drain layout of about 100,000 drains (a 316 m square at 1 m, square pattern, drain lengths
// from four boreholes), laid out and written as CSV and GeoJSON.
static void BM_Layout100k(benchmark::State& state) {
    const auto s = scenario::load_scenario(std::string(WICKGRID_SOURCE_DIR) + "/demo/scenario.yaml");
    results::LayoutRequest q;
    q.drain = s.site.products.front().name;
    q.pattern = Pattern::square;
    q.spacing_m = 1.0;
    q.area.area = {{{{{0, 0}, {316, 0}, {316, 316}, {0, 316}}, {}}}};
    q.base_points = {{0, 0, 12.0}, {316, 0, 14.0}, {316, 316, 15.0}, {0, 316, 13.0}};
    std::size_t drains = 0;
    for (auto _ : state) {
        const auto record = results::layout_record(s, q);
        drains = record.layout.drains.size();
        benchmark::DoNotOptimize(report::layout_csv(record));
        benchmark::DoNotOptimize(report::layout_geojson(record));
    }
    state.counters["drains"] = static_cast<double>(drains);
}
BENCHMARK(BM_Layout100k)->Unit(benchmark::kMillisecond);
