// libFuzzer target: an area file (GeoJSON or CSV), a base-depth file, plate and piezometer readings
// through their readers (plate readings on through monitor's back-analysis and its JSON and CSV), and a valid area through the layout, alone and less a moved copy of itself,
// then through the set-out writers (CSV, GeoJSON and JSON, each parsed back: a file handed to a
// contractor holds only finite numbers). An input holding a line "%%" is an area above it and a
// borehole file below it, so the drain lengths come from the input too.
// Any exception other than the project's named errors is a finding, as is any sanitizer report.
// Harness limit: the spacing is chosen for about 2,000 drains so that each input runs quickly under
// the sanitizers.
#include <algorithm>
#include <cmath>
#include <cstddef>
#include <cstdint>
#include <string>

#include <nlohmann/json.hpp>

#include "report/layout_report.hpp"
#include "report/monitor_report.hpp"
#include "report/trace.hpp"
#include "results/layout_record.hpp"
#include "results/monitor_record.hpp"
#include "scenario/area_files.hpp"
#include "scenario/readings_file.hpp"
#include "wickgrid/errors.hpp"
#include "wickgrid/layout.hpp"

namespace {
// The area moved by a third of its width and a quarter of its height.
wickgrid::layout::Area moved_copy(wickgrid::layout::Area area) {
    double x0 = 1e300, x1 = -1e300, y0 = 1e300, y1 = -1e300;
    for (const auto& part : area.parts)
        for (const auto& p : part.outer) {
            x0 = std::min(x0, p.x_m);
            x1 = std::max(x1, p.x_m);
            y0 = std::min(y0, p.y_m);
            y1 = std::max(y1, p.y_m);
        }
    const double dx = (x1 - x0) / 3.0;
    const double dy = (y1 - y0) / 4.0;
    for (auto& part : area.parts) {
        for (auto& p : part.outer) p = {p.x_m + dx, p.y_m + dy};
        for (auto& hole : part.holes)
            for (auto& p : hole) p = {p.x_m + dx, p.y_m + dy};
    }
    return area;
}
// A small scenario for the writers' title block and trace (invented).
const wickgrid::scenario::Scenario& writer_scenario() {
    static const wickgrid::scenario::Scenario s = wickgrid::scenario::parse_scenario(
        "schema: 1\ntitle: fuzz\ntarget: {degree: 0.9, deadline_days: 180}\n"
        "clay: {thickness_m: 10.0, cv_m2_per_year: 1.0, ch_m2_per_year: 3.0, mv_m2_per_kN: 0.0005, vertical_drainage: both_faces}\n"
        "drains: [{name: d, equivalent_diameter_mm: 66, discharge_capacity_m3_per_year: 100}]\n"
        "installation: {mandrel_diameter_mm: 90, smear_diameter_ratio: 2.0, smear_permeability_ratio: 3.0}\n"
        "spacing: {min_m: 0.8, max_m: 3.0}\n",
        "fuzz.yaml");
    return s;
}

// The writers of a layout, each parsed back; any number that is not finite, or a file that is not
// what it says, is a finding.
void write_and_read_back(const wickgrid::layout::Layout& l, const wickgrid::scenario::AreaFile& area,
                         const std::vector<wickgrid::layout::BaseDepthPoint>& base, double spacing) {
    using namespace wickgrid;
    results::LayoutRecord r;
    r.scenario = &writer_scenario();
    r.request.drain = "d";
    r.request.spacing_m = spacing;
    r.request.area = area;
    r.request.base_points = base;
    r.drain_name = "d";
    r.design_length_m = 10.0;
    r.layout = l;
    const auto trace = report::trace_fields(*r.scenario);
    const std::string geojson = report::traced("layout.geojson", report::layout_geojson(r), trace);
    const auto doc = nlohmann::json::parse(geojson);  // throws (a finding) when it is not JSON
    if (doc["features"].size() != l.drains.size()) __builtin_trap();
    const std::string json_text = report::layout_json_text(r);
    if (nlohmann::json::parse(json_text)["drains"].size() != l.drains.size()) __builtin_trap();
    const std::string csv = report::traced("layout.csv", report::layout_csv(r), trace);
    for (const char* bad : {"nan", "inf"})
        if (csv.find(bad) != std::string::npos || geojson.find(bad) != std::string::npos) __builtin_trap();
    if (csv.find('\0') != std::string::npos || geojson.find('\0') != std::string::npos) __builtin_trap();
}
}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
    using namespace wickgrid;
    const std::string input(reinterpret_cast<const char*>(data), size);
    const auto split = input.find("\n%%\n");
    const std::string text = split == std::string::npos ? input : input.substr(0, split);
    std::vector<layout::BaseDepthPoint> base_points;
    if (split != std::string::npos) try {
            base_points = scenario::parse_base_depths(input.substr(split + 4), "fuzz-boreholes.csv");
        } catch (const scenario::ScenarioError&) {
        }
    try {
        const auto base = scenario::parse_base_depths(text, "fuzz.csv");
        if (base.empty()) __builtin_trap();
    } catch (const scenario::ScenarioError&) {
    }
    try {
        const auto r = scenario::parse_readings(text, "fuzz.csv");
        if (r.plates.empty()) __builtin_trap();
        // Readings through the back-analysis and its writers, with the default Asaoka interval and
        // with one from the input's own span (monitor --interval-days).
        double last_s = 0.0;
        for (const auto& p : r.plates) last_s = std::max(last_s, p.readings.back().time_s);
        for (const std::optional<double> interval : {std::optional<double>{}, std::optional<double>(last_s / 37.0)}) {
            if (interval && !(*interval > 0.0)) continue;
            const auto m = results::monitor_record(writer_scenario(), "d", Pattern::triangular, 1.5, r, interval);
            const auto doc = nlohmann::json::parse(report::monitor_json(m).dump());
            if (doc["plates"].size() != r.plates.size()) __builtin_trap();
            if (report::monitor_csv(m).find('\0') != std::string::npos) __builtin_trap();
        }
    } catch (const scenario::ScenarioError&) {
    } catch (const InputError&) {
    } catch (const EvaluationError&) {
    }
    try {
        const auto p = scenario::parse_piezometers(text, "fuzz.csv");
        if (p.empty()) __builtin_trap();
    } catch (const scenario::ScenarioError&) {
    }
    try {
        const scenario::AreaFile f = scenario::parse_area(text, "fuzz.geojson", true);
        const double a = layout::area_m2(f.area);
        if (!(a > 0.0) || !std::isfinite(a)) __builtin_trap();
        const double spacing = std::sqrt(a / 2000.0);
        if (!(spacing > 0.0) || !std::isfinite(spacing)) return 0;
        const auto l = layout::lay_out(f.area, {}, {Pattern::triangular, spacing, std::nullopt, std::nullopt, 0.0},
                                       {10.0, 10.0, base_points.empty() ? std::vector<layout::BaseDepthPoint>{{0.0, 0.0, 9.0}}
                                                                        : base_points},
                                       20000);
        if (l.drains.empty()) __builtin_trap();
        write_and_read_back(l, f, base_points, spacing);
        // Exclusion zones: the area less a copy of itself moved by a fraction of its extent, so that
        // the difference meets crossing, touching and collinear edges.
        const layout::Area moved = moved_copy(f.area);
        const auto lx = layout::lay_out(f.area, moved, {Pattern::square, spacing, std::nullopt, std::nullopt, 0.0},
                                        {10.0, 10.0, {}}, 20000);
        if (lx.drains.size() > 20000 || !(lx.area_m2 < a * (1.0 + 1e-9))) __builtin_trap();
    } catch (const scenario::ScenarioError&) {
    } catch (const InputError&) {
    } catch (const EvaluationError&) {
    }
    return 0;
}
