// Engine benchmarks (Google Benchmark). Figures are read as ratios against the baseline in the
// same run: BM_TerzaghiDegree is the baseline (one vertical degree evaluation).
#include <benchmark/benchmark.h>

#include "cell_fixture.hpp"
#include "wickgrid/search.hpp"
#include "wickgrid/studies.hpp"
#include "wickgrid/numerical.hpp"
#include "wickgrid/layered.hpp"
#include "wickgrid/stages.hpp"
#include "wickgrid/cell_model.hpp"
#include "scenario/scenario.hpp"
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

namespace {
// The Monte Carlo case of the speed work: (ch, smear ratios, qw) drawn per sample, a full
// largest-spacing search for each of two patterns.
MonteCarloSpec typical_monte_carlo(const Site& d, std::size_t samples, unsigned threads) {
    MonteCarloSpec spec;
    spec.samples = samples;
    spec.threads = threads;
    spec.inputs = {
        {StudyInput::ch, {DistributionKind::lognormal, *d.ground.ch_m2_per_s, 0.3 * *d.ground.ch_m2_per_s}},
        {StudyInput::smear_diameter_ratio, {DistributionKind::uniform, 1.5, 3.0}},
        {StudyInput::smear_permeability_ratio, {DistributionKind::triangular, 2.0, 3.0, 5.0}},
        {StudyInput::discharge_capacity_factor, {DistributionKind::lognormal, 1.0, 0.3}}};
    return spec;
}
}  // namespace

// 1,000,000 samples × 2 patterns on two threads. Wall time.
static void BM_MonteCarloMillion(benchmark::State& state) {
    const Site d = fixtures::typical_design(180.0);
    const DesignResult base = run_design(d);
    const MonteCarloSpec spec = typical_monte_carlo(d, 1000000, 2);
    for (auto _ : state) benchmark::DoNotOptimize(monte_carlo(d, base, spec));
}
BENCHMARK(BM_MonteCarloMillion)->Iterations(2)->Unit(benchmark::kSecond)->UseRealTime();

// Monte Carlo of `d` on one core, reported per sample × pattern (draws, search, statistics).
static void monte_carlo_per_sample(benchmark::State& state, const Site& d, std::size_t samples) {
    const DesignResult base = run_design(d);
    const MonteCarloSpec spec = typical_monte_carlo(d, samples, 1);
    for (auto _ : state) benchmark::DoNotOptimize(monte_carlo(d, base, spec));
    state.SetItemsProcessed(static_cast<std::int64_t>(state.iterations() * spec.samples * base.rows.size()));
}

// One instantaneous load: 100,000 samples × 2 patterns.
static void BM_MonteCarloSampleOneCore(benchmark::State& state) {
    monte_carlo_per_sample(state, fixtures::typical_design(180.0), 100000);
}
BENCHMARK(BM_MonteCarloSampleOneCore)->Unit(benchmark::kMillisecond)->UseRealTime();

// Three lifts (30-day ramps) and a surcharge removed before the 240-day deadline: 20,000 samples ×
// 2 patterns.
static void BM_MonteCarloStagedSample(benchmark::State& state) {
    Site d = fixtures::typical_design(240.0);
    const auto day = [](double x) { return units::days_to_seconds(x); };
    d.loading = LoadHistory{{{0.0, day(30.0), 25.0}, {day(45.0), day(75.0), 25.0}, {day(90.0), day(120.0), 25.0}},
                            Surcharge{day(125.0), day(140.0), day(200.0), 20.0}, std::nullopt};
    monte_carlo_per_sample(state, d, 20000);
}
BENCHMARK(BM_MonteCarloStagedSample)->Unit(benchmark::kMillisecond)->UseRealTime();

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

// Layered ground: the bundled five-strata scenario (staged, surcharge, two products × two
// patterns), by the layered series method.
namespace {
scenario::Scenario five_strata() {
    return scenario::load_scenario(std::string(WICKGRID_SOURCE_DIR) + "/configs/layered-five-staged.yaml");
}
}  // namespace

// One average degree of a built five-layer cell at one time (the target: at most 150
// Terzaghi evaluations, BM_TerzaghiDegree in the same run).
static void BM_LayeredDegree(benchmark::State& state) {
    const auto s = five_strata();
    const LayeredCell cell(numerical_cell_spec(s.site, s.site.products.front(), Pattern::triangular, 1.4),
                           s.site.installation.theory);
    double t = units::days_to_seconds(30.0);
    for (auto _ : state) {
        benchmark::DoNotOptimize(cell.degree(t));
        t = t < units::days_to_seconds(400.0) ? t * 1.01 : units::days_to_seconds(30.0);
    }
}
BENCHMARK(BM_LayeredDegree);

// Building the five-layer cell model (assembly, the eigenproblem, the load events).
static void BM_LayeredBuild(benchmark::State& state) {
    const auto s = five_strata();
    for (auto _ : state) benchmark::DoNotOptimize(make_cell_model(s.site, s.site.products.front(), Pattern::triangular, 1.4));
}
BENCHMARK(BM_LayeredBuild)->Unit(benchmark::kMicrosecond);

// The whole layered design: 2 products × 2 patterns, 5 layers, three lifts and a surcharge (the
// issue's target: under 0.2 s on one core).
static void BM_LayeredDesign(benchmark::State& state) {
    const auto s = five_strata();
    for (auto _ : state) benchmark::DoNotOptimize(run_design(s.site));
}
BENCHMARK(BM_LayeredDesign)->Unit(benchmark::kMillisecond);

// Monte Carlo of the layered design on 2 threads: samples of ch, cv (factors on every layer) and
// kh/ks, a full spacing search for each of the four rows. Run with state.range(0) samples; the
// issue's 10⁵ is extrapolated from the per-sample time (samples are independent).
static void BM_LayeredMonteCarlo(benchmark::State& state) {
    const auto s = five_strata();
    const DesignResult base = run_design(s.site);
    MonteCarloSpec spec;
    spec.samples = static_cast<std::size_t>(state.range(0));
    spec.threads = 2;
    spec.inputs = {{StudyInput::ch_factor, {DistributionKind::lognormal, 1.0, 0.3}},
                   {StudyInput::cv_factor, {DistributionKind::lognormal, 1.0, 0.3}},
                   {StudyInput::smear_permeability_ratio, {DistributionKind::triangular, 2.0, 3.0, 5.0}}};
    Site site = s.site;
    for (auto _ : state) benchmark::DoNotOptimize(monte_carlo(site, base, spec));
    state.counters["samples_per_s"] = benchmark::Counter(static_cast<double>(spec.samples) * state.iterations(),
                                                         benchmark::Counter::kIsRate);
}
BENCHMARK(BM_LayeredMonteCarlo)->Arg(2000)->Iterations(1)->Unit(benchmark::kSecond)->UseRealTime();

// Building the five-layer series alone, against the number of terms.
static void BM_LayeredCellTerms(benchmark::State& state) {
    const auto s = five_strata();
    const NumericalCellSpec spec = numerical_cell_spec(s.site, s.site.products.front(), Pattern::triangular, 1.4);
    for (auto _ : state) benchmark::DoNotOptimize(LayeredCell(spec, s.site.installation.theory, static_cast<int>(state.range(0))));
}
BENCHMARK(BM_LayeredCellTerms)->Arg(12)->Arg(24)->Arg(48)->Unit(benchmark::kMicrosecond);

// One stage check: the critical-circle search of the staged-embankment scenario's last stage at the
// end of its placement, strength gained by then (the target: under 50 ms on one core). The
// slope model (cell model and pore pressures over depth) is built once outside the loop; the
// search calls the strength at every slice.
static void BM_StageCircleSearch(benchmark::State& state) {
    const auto s = scenario::load_scenario(std::string(WICKGRID_SOURCE_DIR) + "/configs/staged-embankment-stability.yaml");
    const auto model = make_cell_model(s.site, s.site.products.front(), Pattern::triangular, 1.4);
    const double t = s.site.loading->end_of_construction_s();
    const SlopeModel slope = stage_slope_model(s.site, *model, t);
    for (auto _ : state) benchmark::DoNotOptimize(critical_circle(slope));
}
BENCHMARK(BM_StageCircleSearch)->Unit(benchmark::kMillisecond);

// The same stage with its model built: cell model, pore pressure over depth and the search.
static void BM_StageCheckWhole(benchmark::State& state) {
    const auto s = scenario::load_scenario(std::string(WICKGRID_SOURCE_DIR) + "/configs/staged-embankment-stability.yaml");
    const double t = s.site.loading->end_of_construction_s();
    for (auto _ : state) {
        const auto model = make_cell_model(s.site, s.site.products.front(), Pattern::triangular, 1.4);
        benchmark::DoNotOptimize(critical_circle(stage_slope_model(s.site, *model, t)));
    }
}
BENCHMARK(BM_StageCheckWhole)->Unit(benchmark::kMillisecond);

// The planned schedule of the staged-embankment scenario at one spacing: every lift and the top-up
// on its earliest safe day (the unit of work of `schedule`, one scheme).
static void BM_StagePlan(benchmark::State& state) {
    const auto s = scenario::load_scenario(std::string(WICKGRID_SOURCE_DIR) + "/configs/staged-embankment-stability.yaml");
    for (auto _ : state) benchmark::DoNotOptimize(plan_stages(s.site, s.site.products.front(), Pattern::triangular, 1.2));
}
BENCHMARK(BM_StagePlan)->Unit(benchmark::kMillisecond);
