// wickgrid layout FILE --area AREA --drain NAME --pattern P --spacing S: drain positions over the
// treatment area, counts and lengths, for setting out and the bill of quantities.
#include <spdlog/spdlog.h>

#include <cmath>

#include "commands.hpp"
#include "report/layout_report.hpp"
#include "results/layout_record.hpp"
#include "scenario/area_files.hpp"
#include "wickgrid/defaults.hpp"

namespace wickgrid::cli {

namespace {
struct LayoutOptions {
    std::vector<std::string> files;
    std::string area;
    std::string drain;
    std::string pattern;
    double spacing_m = 0.0;
    double angle_deg = 0.0;
    std::vector<double> origin;
    double edge_offset_m = defaults::layout_edge_offset_m;
    std::string exclude;
    std::string base_depths;
    bool projected = false;
    bool json = false;
    bool csv = false;
    bool geojson = false;
    std::string out_dir;
};
}  // namespace

Runner add_layout(CLI::App& app) {
    auto* cmd = app.add_subcommand("layout", "Drain positions over a treatment area: counts, lengths, set-out files");
    auto o = std::make_shared<LayoutOptions>();
    cmd->add_option("FILE", o->files, "Scenario file (YAML); several files, or - for standard input")->required();
    cmd->add_option("--area", o->area,
                    "Treatment area: GeoJSON Polygon/MultiPolygon (holes allowed) or CSV with x_m,y_m[,part,ring]; "
                    "metres of a projected coordinate system")
        ->required();
    cmd->add_option("--drain", o->drain, "Drain product name from the scenario")->required();
    cmd->add_option("--pattern", o->pattern, "triangular or square")->required()->check(pattern_check());
    cmd->add_option("--spacing", o->spacing_m, "Drain spacing (m)")->required()->check(positive_number());
    auto* angle = cmd->add_option("--angle-deg", o->angle_deg,
                                  "Row direction, degrees anticlockwise from the x axis (default: along the longest edge)")
                      ->check(number_between(-360.0, 360.0));
    auto* origin = cmd->add_option("--origin", o->origin, "A lattice point X,Y in metres (default: a corner of the longest edge)")
                       ->delimiter(',')
                       ->expected(2)
                       ->allow_extra_args(false);
    cmd->add_option("--edge-offset-m", o->edge_offset_m, "Least distance from a drain to the area's edges, holes and exclusions (m, default 0)")
        ->check(number_between(0.0, 1e6));
    cmd->add_option("--exclude", o->exclude, "Exclusion zones: a second area file (GeoJSON or CSV)");
    cmd->add_option("--base-depths", o->base_depths,
                    "CSV of boreholes x_m,y_m,base_depth_m: depth from the top of the clay to its base");
    cmd->add_flag("--projected", o->projected,
                  "Confirm that coordinates near the origin are metres of a local grid, not longitude/latitude");
    auto* json = cmd->add_flag("--json", o->json, "JSON on stdout (summary and every drain)");
    auto* csv = cmd->add_flag("--csv", o->csv, "CSV of drains on stdout (id,x_m,y_m,length_m)")->excludes(json);
    cmd->add_flag("--geojson", o->geojson, "GeoJSON points on stdout")->excludes(json)->excludes(csv);
    cmd->add_option("--out", o->out_dir,
                    "Also write layout.json, layout.csv, layout.geojson, layout-plan.svg and layout.html into this folder");
    cmd->footer("Exit codes: 0 ok, 2 bad input (located in the file), 3 an output could not be written, "
                "5 no drain fits (the offset or exclusions leave no room, or too many drains).");
    return [o, angle, origin] {
        return run_each(o->files, {o->json, o->csv || o->geojson}, [&](const BatchItem& item) {
            const std::string& file = item.file;
            const auto s = load_scenario_warned(file);
            results::LayoutRequest q;
            q.drain = s.drain(o->drain).name;
            q.pattern = pattern_option(o->pattern);
            q.spacing_m = o->spacing_m;
            if (angle->count() > 0) q.angle_deg = o->angle_deg;
            if (origin->count() > 0) {
                for (const double v : o->origin)
                    if (!std::isfinite(v)) throw UsageError("--origin", "give two finite coordinates X,Y in metres");
                q.origin = layout::Point{o->origin.at(0), o->origin.at(1)};
            }
            q.edge_offset_m = o->edge_offset_m;
            q.area = scenario::read_area_file(o->area, o->projected);
            std::vector<std::string> inputs{file, o->area};
            if (!o->exclude.empty()) {
                q.exclusions = scenario::read_area_file(o->exclude, o->projected, layout::PartOverlap::merged);
                inputs.push_back(o->exclude);
            }
            if (!o->base_depths.empty()) {
                q.base_points = scenario::read_base_depth_file(o->base_depths);
                q.base_file = o->base_depths;
                inputs.push_back(o->base_depths);
            }
            const results::LayoutRecord record = results::layout_record(s, std::move(q));
            for (std::size_t i = s.input_warnings.size(); i < record.warnings.size(); ++i) spdlog::warn("{}", record.warnings[i]);
            spdlog::info("laid {} drains in {} rows", record.layout.drains.size(), record.layout.rows);
            // Only the outputs asked for are built: a layout of millions of drains costs its text.
            if (!o->out_dir.empty()) {
                std::vector<std::pair<std::string, std::string>> files;  // moved, never copied (no initializer list)
                files.emplace_back("layout.json", report::layout_json_text(record));
                files.emplace_back("layout.csv", report::layout_csv(record));
                files.emplace_back("layout.geojson", report::layout_geojson(record));
                files.emplace_back("layout-plan.svg", report::layout_svg(record));
                files.emplace_back("layout.html", report::layout_html(record));
                write_outputs(item.out_dir(o->out_dir), inputs, std::move(files), report::trace_fields(s));
                spdlog::info("wrote layout.json, layout.csv, layout.geojson, layout-plan.svg and layout.html to {}", item.out_dir(o->out_dir));
            }
            if (o->json) item.print(report::layout_json_text(record));
            else if (o->csv) item.print(report::layout_csv(record));
            else if (o->geojson) item.print(report::layout_geojson(record));
            else item.print(report::layout_table(record));
            return static_cast<int>(ok);
        });
    };
}

}  // namespace wickgrid::cli
