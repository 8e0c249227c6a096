// libFuzzer target: an area file (GeoJSON or CSV), a base-depth file, plate and piezometer readings
// through their readers, and a valid area through the layout. Any exception other than the project's named errors is a
// finding, as is any sanitizer report. Harness limit: the spacing is chosen for about 2,000 drains
// so that each input runs quickly under the sanitizers.
#include <cmath>
#include <cstddef>
#include <cstdint>
#include <string>

#include "scenario/area_files.hpp"
#include "scenario/readings_file.hpp"
#include "wickgrid/errors.hpp"
#include "wickgrid/layout.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
    using namespace wickgrid;
    const std::string text(reinterpret_cast<const char*>(data), size);
    try {
        const auto base = scenario::parse_base_depths(text, "fuzz.csv");
        if (base.empty()) __builtin_trap();
    } catch (const scenario::ScenarioError&) {
    }
    try {
        const auto r = scenario::parse_readings(text, "fuzz.csv");
        if (r.plates.empty()) __builtin_trap();
    } catch (const scenario::ScenarioError&) {
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
                                       {10.0, 10.0, {{0.0, 0.0, 9.0}}}, 20000);
        if (l.drains.empty()) __builtin_trap();
    } catch (const scenario::ScenarioError&) {
    } catch (const InputError&) {
    } catch (const EvaluationError&) {
    }
    return 0;
}
