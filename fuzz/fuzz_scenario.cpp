// libFuzzer target: a scenario file through the loader, the design and every writer, and, for a
// scenario with a small cross-section and stages, the stage checks (or, for an input of even length,
// the planned schedule) through their JSON, table and charts. Any exception other than the
// project's named errors is a finding (it would exit 4), as is any sanitizer report.
// Harness limits (so that each input runs in well under a second under the sanitizers, which the
// fuzzer's timeout needs): the numerical method with more than 64 cells, the layered series with
// more than its default number of terms and spacing scans of more than 200 candidates are skipped;
// stage checks only for at most 3 stages, 1 berm and 4 layers, with 4 chart points; the program
// itself accepts more (README: limits).
#include <cstddef>
#include <cstdint>
#include <string>

#include <nlohmann/json.hpp>

#include "report/atomic_file.hpp"
#include "report/design_report.hpp"
#include "report/html_report.hpp"
#include "report/stage_report.hpp"
#include "results/design_record.hpp"
#include "results/stage_record.hpp"
#include "scenario/scenario.hpp"
#include "wickgrid/errors.hpp"

namespace {
// The stage checks of a small section at the range's smallest spacing of the first drain.
void check_stages(const wickgrid::scenario::Scenario& s, bool plan) {
    using namespace wickgrid;
    if (results::stage_check_refusal(s)) return;
    const Site& site = s.site;
    if (!site.loading || site.loading->stages.size() > 3 || (site.ground.profile && site.ground.profile->layers.size() > 4)) return;
    if (site.embankment && site.embankment->berms.size() > 1) return;
    const auto record = results::stage_record(s, site.products.front().name, Pattern::triangular,
                                              site.range.bounds.min_m, plan, 4);
    const auto doc = nlohmann::json::parse(report::stages_json(s, record).dump());
    if (!doc.is_object() || report::stages_table(s, record).empty()) __builtin_trap();
    for (const auto& chart : report::stage_charts(record))
        if (chart.svg.find("nan") != std::string::npos || chart.svg.find('\0') != std::string::npos) __builtin_trap();
}
}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
    using namespace wickgrid;
    const std::string text(reinterpret_cast<const char*>(data), size);
    try {
        const scenario::Scenario s = scenario::parse_scenario(text, "fuzz.yaml");
        const Site& site = s.site;
        if (site.method.method == CellMethod::numerical &&
            site.method.mesh.radial_cells * site.method.mesh.vertical_cells > 64)
            return 0;
        if (site.method.method == CellMethod::layered && site.method.series_terms > defaults::layered_terms) return 0;
        if ((site.range.bounds.max_m - site.range.bounds.min_m) / site.range.increment_m > 200) return 0;
        const results::DesignRecord record = results::design_record(s);
        const auto json = report::design_json(record).dump();
        const auto csv = report::design_csv(record);
        const auto md = report::design_markdown(record);
        const auto table = report::design_table(record);
        if (json.empty() || csv.empty() || md.empty() || table.empty()) __builtin_trap();
        check_stages(s, size % 2 == 0);
    } catch (const scenario::ScenarioError&) {
    } catch (const InputError&) {
    } catch (const EvaluationError&) {
    }
    return 0;
}
