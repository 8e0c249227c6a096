// libFuzzer target: an area file (GeoJSON or CSV), a base-depth file, plate and piezometer readings
// through their readers, and a valid area through the layout, alone and less a moved copy of itself.
// Any exception other than the project's named errors is a finding, as is any sanitizer report.
// Harness limit: the spacing is chosen for about 2,000 drains so that each input runs quickly under
// the sanitizers.
#include <algorithm>
#include <cmath>
#include <cstddef>
#include <cstdint>
#include <string>

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
}  // namespace

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
