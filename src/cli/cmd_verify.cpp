// wickgrid verify FILE: the model every design row used beside wickgrid's reference numerical unit
// cell at the same inputs (layers, partial drains, loading), and equivalent parameters for
// plane-strain and one-dimensional models.
#include <spdlog/spdlog.h>

#include <cmath>
#include <nlohmann/json.hpp>
#include <sstream>

#include "commands.hpp"
#include "report/design_report.hpp"
#include "wickgrid/names.hpp"
#include "wickgrid/numerical.hpp"
#include "wickgrid/plane_strain.hpp"
#include "wickgrid/units.hpp"

namespace wickgrid::cli {

namespace {
struct VerifyOptions {
    std::vector<std::string> files;
    double threshold = defaults::verify_threshold;
    int points = defaults::verify_points;
    int radial_cells = defaults::verify_radial_cells;
    int vertical_cells = defaults::verify_vertical_cells;
    bool json = false;
};

struct Equivalents {
    double plane_strain_kh_m_per_s;
    double equivalent_kv_m_per_s;
};

// Equivalent parameters where the clay is one uniform layer with full drains (nullopt otherwise).
std::optional<Equivalents> equivalents(const Site& site, const CellFigures& f) {
    if (site.ground.layered_flow() || site.method.method != CellMethod::closed_form) return std::nullopt;
    const Clay clay = site.ground.uniform_clay();
    const double l = site.installation.outlets == DrainOutlets::top ? f.drain_length_m : 0.5 * f.drain_length_m;
    const double kv = clay.cv_m2_per_s * clay.kh_m_per_s / clay.ch_m2_per_s;
    return Equivalents{plane_strain_permeability_m_per_s(clay.kh_m_per_s, f.mu_depth_mean),
                       equivalent_vertical_permeability_m_per_s(kv, clay.kh_m_per_s, f.mu_depth_mean, l,
                                                                f.influence_diameter_m)};
}
std::string with_unit(double v, const char* unit) {
    char text[64];
    std::snprintf(text, sizeof text, "%.3e %s", v, unit);
    return text;
}

// The plane-strain parameters of each layer for one design row, as JSON and as lines of the table.
nlohmann::json plane_strain_json(const std::vector<PlaneStrainLayer>& layers, std::ostringstream& table) {
    using nlohmann::json;
    auto optional = [](const std::optional<double>& v) { return v ? json(*v) : json(nullptr); };
    json out = json::array();
    char line[512];
    for (std::size_t i = 0; i < layers.size(); ++i) {
        const PlaneStrainLayer& p = layers[i];
        json entry{{"layer", i + 1}, {"top_m", p.top_m}, {"bottom_m", p.bottom_m}, {"kh_m_per_s", p.kh_m_per_s}};
        if (!p.has_drain) {
            for (const char* key : {"mu_mean", "hird_khp_m_per_s", "khp_m_per_s", "smear_khp_m_per_s", "qz_m2_per_s"})
                entry[key] = nullptr;
            std::snprintf(line, sizeof line, "      layer %zu (%.2f–%.2f m): below the drain tip, no drain\n", i + 1,
                          p.top_m, p.bottom_m);
        } else {
            entry["mu_mean"] = p.mu_mean;
            entry["hird_khp_m_per_s"] = p.hird_khp_m_per_s;
            entry["khp_m_per_s"] = p.khp_m_per_s;
            entry["smear_khp_m_per_s"] = optional(p.smear_khp_m_per_s);
            entry["qz_m2_per_s"] = optional(p.qz_m2_per_s);
            std::snprintf(line, sizeof line,
                          "      layer %zu (%.2f–%.2f m): kh %.3e; Hird et al. (1992) khp %.3e; Indraratna & Redana "
                          "(2000) khp %.3e, smear k'hp %s, qz %s\n",
                          i + 1, p.top_m, p.bottom_m, p.kh_m_per_s, p.hird_khp_m_per_s, p.khp_m_per_s,
                          p.smear_khp_m_per_s ? with_unit(*p.smear_khp_m_per_s, "m/s").c_str() : "none",
                          p.qz_m2_per_s ? with_unit(*p.qz_m2_per_s, "m²/s").c_str() : "none (ideal drain)");
        }
        table << line;
        out.push_back(entry);
    }
    return out;
}
}  // namespace

Runner add_verify(CLI::App& app) {
    auto* cmd = app.add_subcommand("verify", "Check every design row against the reference numerical unit cell");
    auto o = std::make_shared<VerifyOptions>();
    cmd->add_option("FILE", o->files, "Scenario file (YAML); several files, or - for standard input")->required();
    cmd->add_option("--threshold", o->threshold, "Warn when |U reference − U design| exceeds this (default 0.02)")
        ->check(number_between(0.0, 1.0));
    cmd->add_option("--points", o->points, "Times compared, evenly from 0 to 1.5 × deadline (default 25)")->check(whole_between(2, 1000));
    cmd->add_option("--radial-cells", o->radial_cells, "Reference mesh, radial cells (default 40)")->check(whole_between(4, 2000));
    cmd->add_option("--vertical-cells", o->vertical_cells, "Reference mesh, vertical cells (default 80)")->check(whole_between(2, 4000));
    cmd->add_flag("--json", o->json, "JSON on stdout");
    cmd->footer("Exit 0 whether or not a warning was raised; warnings go to stderr and into the output.");
    return [o] {
        return run_each(o->files, {o->json, false}, [&](const BatchItem& item) {
            const std::string& file = item.file;
            if (static_cast<long>(o->radial_cells) * o->vertical_cells > defaults::max_reference_mesh_cells)
                throw UsageError("--radial-cells × --vertical-cells",
                                 std::to_string(o->radial_cells) + " × " + std::to_string(o->vertical_cells) +
                                     " cells is more than the limit of " + std::to_string(defaults::max_reference_mesh_cells));
            const auto s = load_scenario_warned(file);
            const Site& site = s.site;
            const results::DesignRecord record = results::design_record(s);
            const std::vector<double> times =
                even_times_s(defaults::curve_span_of_deadline * site.criterion.deadline_s, o->points);
            Site reference = site;
            reference.method.method = CellMethod::numerical;
            reference.method.mesh = {o->radial_cells, o->vertical_cells, defaults::verify_max_degree_step, 0.0};
            const std::string design_method(to_string(site.method.method));
            using nlohmann::json;
            json rows = json::array();
            std::ostringstream table;
            table << s.title << "\nreference numerical unit cell (" << o->radial_cells << " × " << o->vertical_cells
                  << " cells) beside the design's " << design_method << " model, at the chosen spacings\n\n";
            bool any_warning = false;
            // The first unloading (surcharge removal, vacuum release), after which the design's hold rule
            // and the reference's swelling part ways: differences are compared on both sides of it.
            std::optional<double> unloading_s;
            if (site.loading && site.loading->surcharge) unloading_s = site.loading->surcharge->removal_s;
            if (site.loading && site.loading->vacuum)
                unloading_s = std::min(unloading_s.value_or(site.loading->vacuum->end_s), site.loading->vacuum->end_s);
            std::vector<std::string> causes;
            for (const auto& row : record.result.rows) {
                const DrainProductSpec& product = site.product(row.drain);
                const auto design = make_cell_model(site, product, row.pattern, row.spacing_m);
                const auto numeric = make_cell_model(reference, product, row.pattern, row.spacing_m);
                const auto a = design->combined(times), b = numeric->combined(times);
                double worst = 0.0, worst_t = 0.0, worst_loading = 0.0;
                json pts = json::array();
                for (std::size_t i = 0; i < times.size(); ++i) {
                    const double d = std::fabs(b[i] - a[i]);
                    if (d > worst) worst = d, worst_t = times[i];
                    if ((!unloading_s || times[i] <= *unloading_s) && d > worst_loading) worst_loading = d;
                    pts.push_back({{"time_days", units::seconds_to_days(times[i])},
                                   {"degree_design", a[i]},
                                   {"degree_reference", b[i]}});
                }
                const bool warn = worst > o->threshold;
                any_warning |= warn;
                if (warn)
                    spdlog::warn("{} / {}: the design's model and the reference cell differ by {:.4f} in U at day {:.0f}",
                                 row.drain, to_string(row.pattern), worst, units::seconds_to_days(worst_t));
                const auto eq = equivalents(site, design->figures());
                const bool after_unloading = unloading_s && worst_t > *unloading_s;
                const std::string cause =
                    after_unloading
                        ? "after the unloading on day " + report::fixed(units::seconds_to_days(*unloading_s), 0) +
                              ": the design holds settlement, the reference lets the clay swell back"
                        : "while loading: the models' flow (equal against free strain, the drain as a conduit, coupled "
                          "vertical flow)";
                if (worst > o->threshold) causes.push_back(row.drain + " / " + std::string(to_string(row.pattern)) + ": " + cause);
                rows.push_back({{"drain", row.drain}, {"pattern", std::string(to_string(row.pattern))},
                                {"spacing_m", row.spacing_m}, {"max_difference", worst},
                                {"max_difference_while_loading", worst_loading},
                                {"unloading_day", unloading_s ? json(units::seconds_to_days(*unloading_s)) : json(nullptr)},
                                {"cause", cause},
                                {"at_day", units::seconds_to_days(worst_t)}, {"warning", warn},
                                {"plane_strain_kh_m_per_s", eq ? json(eq->plane_strain_kh_m_per_s) : json(nullptr)},
                                {"equivalent_kv_m_per_s", eq ? json(eq->equivalent_kv_m_per_s) : json(nullptr)},
                                {"points", pts}});
                char line[512];
                std::snprintf(line, sizeof line, "  %-20s %-10s %5.2f m  max |ΔU| = %.4f at day %5.0f%s\n", row.drain.c_str(),
                              std::string(to_string(row.pattern)).c_str(), row.spacing_m, worst,
                              units::seconds_to_days(worst_t), warn ? "  WARNING: above the threshold" : "");
                table << line;
                if (unloading_s) {
                    std::snprintf(line, sizeof line, "      up to the unloading on day %.0f: max |ΔU| = %.4f\n",
                                  units::seconds_to_days(*unloading_s), worst_loading);
                    table << line;
                }
                if (eq) {
                    std::snprintf(line, sizeof line,
                                  "      plane-strain kh (Hird et al. 1992) %.3e m/s; equivalent kv (Chai et al. 2001) %.3e m/s\n",
                                  eq->plane_strain_kh_m_per_s, eq->equivalent_kv_m_per_s);
                    table << line;
                }
                rows.back()["plane_strain_layers"] = plane_strain_json(
                    plane_strain_layers(numerical_cell_spec(site, product, row.pattern, row.spacing_m), design->figures().mu_smear),
                    table);
            }
            if (o->json) {
                item.print(json{{"schema", 1}, {"design_method", design_method}, {"threshold", o->threshold},
                                  {"reference_mesh", {{"radial_cells", o->radial_cells}, {"vertical_cells", o->vertical_cells}}},
                                  {"any_warning", any_warning}, {"rows", rows}, {"cautions", results::cautions()}}
                                 .dump(2) +
                             "\n");
            } else {
                if (site.method.method == CellMethod::closed_form)
                    table << "\nThe closed form is equal strain (Hansbo 1981) combined by Carrillo (1942); the reference is "
                             "free strain with coupled radial and vertical flow and the drain as a conduit. Differences of "
                             "about 0.01 in U are expected between the two"
                          << (site.loading && site.loading->surcharge
                                  ? "; after the surcharge is removed, also the closed form's rule of holding settlement"
                                  : "")
                          << ".\n";
                else if (site.method.method == CellMethod::layered)
                    table << "\nThe layered series is equal strain layer by layer (Walker & Indraratna 2009); the reference "
                             "is free strain with coupled radial and vertical flow and the drain as a conduit. Differences of "
                             "about 0.01 in U are expected between the two"
                          << (site.loading && (site.loading->surcharge || site.loading->vacuum)
                                  ? "; after a surcharge or vacuum is removed, also the series' rule of holding settlement "
                                    "(the reference lets the clay swell back)"
                                  : "")
                          << ".\n";
                else
                    table << "\nThe design used the numerical cell on its own mesh; the reference repeats it on a finer mesh "
                             "and smaller time steps, so the difference measures the design mesh's discretisation error.\n";
                for (const auto& c : causes) table << "Largest difference, " << c << ".\n";
                table << "Plane-strain parameters per layer: khp = (khp/kh)·kh with khp/kh = (2/3)/(ln n − 0.75), the "
                         "smear zone's k'hp and the drain's qz matching smear and well resistance (Indraratna & Redana "
                         "2000); Hird et al. (1992) khp = 2kh/(3μ) with the layer's depth-mean μ. Equivalent 1-D kv "
                         "(Chai et al. 2001) for a uniform clay with the closed form only.\n";
                table << "\n" << results::caution_block();
                item.print(table.str());
            }
            return static_cast<int>(ok);
        });
    };
}

}  // namespace wickgrid::cli
