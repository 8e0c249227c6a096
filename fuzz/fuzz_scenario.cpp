// libFuzzer target: a scenario file through the loader, the design and every writer. Any exception
// other than the project's named errors is a finding (it would exit 4), as is any sanitizer report.
// Harness limits (so that each input runs in well under a second under the sanitizers, which the
// fuzzer's timeout needs): the numerical method with more than 64 cells, the layered series with
// more than its default number of terms and spacing scans of more than 200 candidates are skipped;
// the program itself accepts more (README: limits).
#include <cstddef>
#include <cstdint>
#include <string>

#include "report/atomic_file.hpp"
#include "report/design_report.hpp"
#include "report/html_report.hpp"
#include "results/design_record.hpp"
#include "scenario/scenario.hpp"
#include "wickgrid/errors.hpp"

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
    } catch (const scenario::ScenarioError&) {
    } catch (const InputError&) {
    } catch (const EvaluationError&) {
    }
    return 0;
}
