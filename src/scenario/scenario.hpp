#pragma once
// A validated scenario: what a scenario file (YAML, schema 1) says, in SI units, with enough of
// the file's marks kept to point later physical errors back at the line that caused them.
#include <map>
#include <optional>
#include <stdexcept>
#include <string>
#include <vector>

#include "wickgrid/design.hpp"
#include "wickgrid/names.hpp"
#include "wickgrid/schedule.hpp"
#include "wickgrid/stages.hpp"
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

// A drain product as the file gives it (the site keeps what the physics needs; this keeps the rest
// for the inputs a report echoes).
struct DrainEntry {
    std::string name;
    std::optional<double> width_m;
    std::optional<double> thickness_m;
    std::optional<EquivalentDiameterMethod> method;  // absent when a diameter is given
};

// Studies requested in the file (`studies:` and `uncertain:` blocks).
struct StudyRequests {
    std::vector<TornadoInput> tornado;
    GridAxis grid_x{StudyInput::smear_permeability_ratio, 1.0, 6.0, defaults::grid_steps};
    GridAxis grid_y{StudyInput::smear_diameter_ratio, 1.5, 4.0, defaults::grid_steps};
    bool grid_given = false;
    std::optional<MonteCarloSpec> monte_carlo;
};

// The optional `project:` block: what a title block of a printed note shows.
struct ProjectInfo {
    std::optional<std::string> name;
    std::optional<std::string> number;
    std::optional<std::string> revision;
    std::optional<std::string> prepared_by;
    std::optional<std::string> checked_by;
    std::optional<std::string> date;
};

// The finished-level top-up as planned (embankment.finished_height_m): resolved once when the file is
// read and placed in site.loading.stages as a lift of its own, so that every command consolidates,
// settles and checks the fill that is placed.
struct TopUpPlan {
    TopUpRule rule = TopUpRule::with_last_lift;
    FillToFinish finish;             // fill placed in all, final settlement, load
    double scheduled_height_m = 0.0; // the file's permanent stages (their load / γ)
    double height_m = 0.0;           // the top-up lift's thickness: placed − scheduled (0: none needed)
    double load_kPa = 0.0;           // its load (γ·height less the buoyancy of fill settled under water)
    std::optional<std::size_t> stage;  // its index in site.loading.stages; none when none is needed
};

// The optional `calibration:` block: factors from a monitoring back-analysis (`monitor`'s fit.ch_factor)
// applied to every layer's ch (and cv) when the file is read, so every command re-plans the rest of
// the works on the back-analysed ground. The factors are those `sweep` varies (StudyInput::ch_factor).
struct Calibration {
    double ch_factor = 1.0;
    double cv_factor = 1.0;
    std::optional<std::string> source;  // where the factors came from (readings, date, plates)
};

struct Scenario {
    std::string file;
    std::string title;
    ProjectInfo project;
    std::string sha256;  // of the file's bytes, so a printed result can be traced to its input
    std::string text;    // the file's text as read (a scheme's scenario is written from it)
    Site site;  // everything the physics needs, in SI units
    std::vector<DrainEntry> drains;  // as given, in the order of site.products
    std::optional<double> fill_unit_weight_kN_per_m3;
    std::optional<double> surcharge_max_height_m;
    std::optional<TopUpPlan> top_up;
    std::optional<Calibration> calibration;  // applied to site.ground already
    std::optional<ScheduleSpec> schedule;    // the `schedule:` block (surcharge heights, costs)
    std::optional<double> mandrel_width_m;  // as given (the site keeps the equivalent diameter)
    StudyRequests studies;
    // Values allowed but outside the usual ranges (plausibility.hpp), located; every command shows them.
    std::vector<std::string> input_warnings;
    std::map<std::string, Mark> marks;  // key path → where its value is

    const DrainEntry& drain(const std::string& name) const;  // throws ScenarioError if unknown
    // Where a key's value is; nullopt for a key the file does not give.
    std::optional<Mark> mark_of(const std::string& key_path) const;
    // A ScenarioError at a key of this file (at the top of the file when the file does not give it).
    [[noreturn]] void fail_at(const std::string& key_path, const std::string& message) const;
};

// Reads and validates a scenario file: syntax, schema (unknown keys with suggestions, missing
// keys), value ranges, and the physical checks of the engine, all as ScenarioError.
Scenario load_scenario(const std::string& path);
Scenario parse_scenario(const std::string& text, const std::string& file_label);


}  // namespace wickgrid::scenario
