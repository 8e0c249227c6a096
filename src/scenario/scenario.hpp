#pragma once
// A validated scenario: what a scenario file (YAML, schema 1) says, in SI units, with enough of
// the file's marks kept to point later physical errors back at the line that caused them.
#include <map>
#include <optional>
#include <stdexcept>
#include <string>
#include <vector>

#include "wickgrid/design.hpp"
#include "wickgrid/studies.hpp"

namespace wickgrid::scenario {

// Where a value sits in the file.
struct Mark {
    int line = 0;    // 1-based
    int column = 0;  // 1-based
};

// A bad scenario: file, line, column, key path and what is allowed.
class ScenarioError : public std::runtime_error {
public:
    ScenarioError(std::string file, Mark mark, std::string key_path, std::string message);
    const std::string& file() const noexcept { return file_; }
    const Mark& mark() const noexcept { return mark_; }
    const std::string& key_path() const noexcept { return key_path_; }
    const std::string& message() const noexcept { return message_; }

private:
    std::string file_;
    Mark mark_;
    std::string key_path_;
    std::string message_;
};

struct DrainEntry {
    std::string name;
    std::optional<double> width_m;
    std::optional<double> thickness_m;
    std::optional<EquivalentDiameterMethod> method;  // absent when a diameter is given
    double equivalent_diameter_m = 0.0;
    double discharge_capacity_m3_per_s = 0.0;
    std::optional<double> cost_per_m;
};

// Studies requested in the file (`studies:` and `uncertain:` blocks).
struct StudyRequests {
    std::vector<TornadoInput> tornado;
    GridAxis grid_x{StudyInput::smear_permeability_ratio, 1.0, 6.0, 11};
    GridAxis grid_y{StudyInput::smear_diameter_ratio, 1.5, 4.0, 11};
    bool grid_given = false;
    std::optional<MonteCarloSpec> monte_carlo;
};

struct Scenario {
    std::string file;
    std::string title;
    double target_degree = 0.0;
    double deadline_days = 0.0;
    Clay clay;
    std::optional<double> mv_m2_per_kN;
    bool kh_given = false;
    std::vector<DrainEntry> drains;
    double drain_length_m = 0.0;
    DrainOutlets outlets = DrainOutlets::top;
    std::optional<double> mandrel_width_m;
    std::optional<double> mandrel_depth_m;
    double mandrel_diameter_m = 0.0;
    double smear_diameter_ratio = 1.0;
    double smear_permeability_ratio = 1.0;
    SmearShape smear_shape = SmearShape::constant;
    RadialTheory radial_theory = RadialTheory::hansbo_1981;
    std::vector<Pattern> patterns;
    SpacingBounds spacing;
    double increment_m = 0.05;
    StudyRequests studies;
    // Staged loading and settlement (optional).
    std::optional<double> fill_unit_weight_kN_per_m3;
    std::optional<LoadHistory> loading;
    std::optional<double> surcharge_max_height_m;
    std::optional<SoilProfile> profile;
    std::optional<double> residual_limit_m;
    std::optional<double> service_days;
    // Method of the design search.
    bool numerical = false;
    NumericalMesh numerical_mesh{20, 40, 0.005, 0.0};
    std::vector<std::optional<double>> layer_cv_m2_per_s, layer_ch_m2_per_s;  // per clay layer, if given
    std::map<std::string, Mark> marks;  // key path → where its value is

    DesignInput design_input() const;
    const DrainEntry& drain(const std::string& name) const;  // throws ScenarioError if unknown
    Mark mark_of(const std::string& key_path) const;
};

// Reads and validates a scenario file: syntax, schema (unknown keys with suggestions, missing
// keys), value ranges, and the physical checks of the engine, all as ScenarioError.
Scenario load_scenario(const std::string& path);
Scenario parse_scenario(const std::string& text, const std::string& file_label);

std::string_view to_string(SmearShape shape);
std::string_view to_string(RadialTheory theory);
std::string_view to_string(VerticalDrainage drainage);
std::string_view to_string(DrainOutlets outlets);

}  // namespace wickgrid::scenario
