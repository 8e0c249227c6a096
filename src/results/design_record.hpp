#pragma once
// The result model: everything a writer shows, already computed — the design rows, the curves and
// series the charts draw, the studies, warnings, the assumptions (derived from what was computed),
// the method notes and the cautions. Writers format a DesignRecord; they never call the engine.
#include <optional>
#include <string>
#include <vector>

#include "results/stage_record.hpp"
#include "wickgrid/schedule.hpp"
#include "scenario/scenario.hpp"
#include "wickgrid/design.hpp"
#include "wickgrid/studies.hpp"

namespace wickgrid::results {

// A degree–time (and settlement) curve of one cell.
struct Curve {
    std::string drain;
    Pattern pattern = Pattern::triangular;
    double spacing_m = 0.0;
    CellMethod method = CellMethod::closed_form;
    std::vector<CurvePoint> points;
    // Optional degree over depth: the depths asked, and for each point the state at each of them.
    std::vector<double> depths_m;
    std::vector<std::vector<DepthPoint>> over_depth;
};

// The largest spacing meeting the criterion against the time available (design chart).
struct SpacingSeries {
    Pattern pattern = Pattern::triangular;
    std::vector<double> deadline_s;
    std::vector<double> spacing_limit_m;
};

struct Studies {
    std::optional<std::vector<TornadoRow>> tornado;
    std::optional<std::vector<GridCell>> grid;
    GridAxis grid_x, grid_y;
    std::optional<MonteCarloResult> monte_carlo;
    std::optional<MonteCarloSpec> monte_carlo_spec;
};

// One slice of the settlement computation for the recommended design (the first row when none is
// feasible): depth, initial effective stress, stress increase under the final permanent load, its
// final settlement and its settlement at the deadline (the design's average degree of settlement).
struct SubLayerRow {
    std::size_t layer = 0;  // 1-based
    double depth_m = 0.0;
    double thickness_m = 0.0;
    std::optional<double> sigma_v0_kPa;  // absent for a uniform clay given by mv alone (no unit weight)
    double delta_sigma_kPa = 0.0;
    double final_m = 0.0;
    double at_deadline_m = 0.0;
    // At the slice centre at the deadline, where the method resolves depth (closed form, layered
    // series): the cell-averaged excess pore pressure and the local degree.
    std::optional<double> excess_pore_pressure_kPa;
    std::optional<double> local_degree;
};

struct DesignRecord {
    const scenario::Scenario* scenario = nullptr;  // the inputs, echoed (title, file, drains as given)
    DesignResult result;
    std::vector<Curve> chart_curves;  // the recommended product (or the first) in every pattern
    std::vector<SpacingSeries> spacing_vs_time;
    Studies studies;
    // Stage stability of the recommended design (report only; `stages` computes the same record).
    std::optional<StageRecord> stages;
    // The scheme search, when the scenario has a `schedule:` block (report only; `schedule` computes the same).
    std::optional<ScheduleResult> schedule;
    std::vector<SubLayerRow> sublayers;  // empty without clay layers and a load history
    // The layer properties the numerical cell and the layered series take (mv, secant for e–log layers;
    // kv and kh = c·mv·γw), as the inputs table shows them; empty for the closed form.
    struct CellLayer {
        double mv_m2_per_kN = 0.0;
        double kv_m_per_s = 0.0;
        double kh_m_per_s = 0.0;
    };
    std::vector<CellLayer> cell_layers;
    // The applied load (kPa) at the chart times (empty without a load history or charts), and the
    // vacuum at the drain head (kPa) at the same times (empty without a vacuum).
    std::vector<double> load_kPa;
    std::vector<double> vacuum_kPa;
    // For a residual criterion: the residual settlement of the first chart curve's design if the
    // deadline fell at each time, split into primary and secondary (CellModel::residual_parts).
    struct ResidualPoint {
        double time_s = 0.0;
        double primary_m = 0.0;
        double secondary_m = 0.0;
    };
    std::vector<ResidualPoint> residual_vs_time;
    std::vector<std::string> warnings;
    std::vector<std::string> assumptions;
    std::vector<std::string> method_notes;
    bool log_time = false;  // chart curves spaced logarithmically in time

    const Site& site() const { return scenario->site; }
};

struct RecordOptions {
    bool charts = false;    // curves and the spacing–time series for the report
    bool log_time = false;  // chart times spaced logarithmically
};

// Runs the design of a scenario and assembles its record.
DesignRecord design_record(const scenario::Scenario& s, const RecordOptions& options = {});

// The curve of one product × pattern × spacing on the site, at the given times.
Curve curve_of(const Site& site, const DrainProductSpec& product, Pattern pattern, double spacing_m,
               const std::vector<double>& times_s);

// Text derived from the site and what was computed.
std::vector<std::string> assumptions(const Site& site);
std::vector<std::string> method_notes(const Site& site);
std::string criterion_text(const Site& site);   // "U = 90.0 % by day 180", "residual settlement at most …"
std::string criterion_label(const Site& site);  // short: "U ≥ 90 %", "residual ≤ 60 mm"
// The loading in a few words ("staged loading", "vacuum with staged loading", "vacuum alone"; empty
// for a load at once) and what the degrees are relative to.
std::string loading_label(const Site& site);
std::string degree_reference_text(const Site& site);
std::string recommendation(const DesignRecord& record);
// The title block of a printed output: the `project:` fields the scenario gives, then the scenario
// file, its SHA-256 and the wickgrid version (key is the JSON key, label what a page shows).
struct TitleField {
    std::string key;
    std::string label;
    std::string value;
    bool project = false;  // one of the `project:` fields (JSON puts those under "project")
};
std::vector<TitleField> title_block(const scenario::Scenario& s);
// The line printed at the top of every page: project name and number, scenario title, revision.
std::string running_header(const scenario::Scenario& s);

// The bibliography keys of the methods this record used (results/bibliography.hpp).
std::vector<std::string> reference_keys(const DesignRecord& record);

// The cautions every output carries.
const std::vector<std::string>& cautions();
// The cautions as the block that ends every terminal output ("Cautions:" and one line each).
std::string caution_block();

}  // namespace wickgrid::results
