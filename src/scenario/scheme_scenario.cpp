#include "scenario/scheme_scenario.hpp"

#include <charconv>
#include <stdexcept>

#include <yaml-cpp/yaml.h>

#include "wickgrid/names.hpp"
#include "wickgrid/units.hpp"

namespace wickgrid::scenario {

namespace {
// The shortest text that reads back as the same double (so a planned day survives the round trip).
std::string exact(double value) {
    char buffer[64];
    const auto [end, ec] = std::to_chars(buffer, buffer + sizeof buffer, value);
    if (ec != std::errc{}) throw std::invalid_argument("scheme_scenario_yaml: a value that cannot be written");
    return std::string(buffer, end);
}
std::string day(double seconds) { return exact(units::seconds_to_days(seconds)); }
}  // namespace

std::string scheme_scenario_yaml(const Scenario& s, const Scheme& scheme) {
    YAML::Node root = YAML::Load(s.text);
    // The drain and the pattern of the scheme only.
    YAML::Node drains(YAML::NodeType::Sequence);
    for (const auto& d : root["drains"])
        if (d["name"].as<std::string>() == scheme.drain) drains.push_back(d);
    root["drains"] = drains;
    YAML::Node patterns(YAML::NodeType::Sequence);
    patterns.SetStyle(YAML::EmitterStyle::Flow);
    patterns.push_back(std::string(to_string(scheme.pattern)));
    root["patterns"] = patterns;
    // The scheme's spacing as the largest of the range, so the design recommends it (it meets the
    // criterion, and the design takes the largest spacing that does, rounded to the increment).
    const SearchRange& range = s.site.range;
    double min_m = range.bounds.min_m, increment_m = range.increment_m;
    if (scheme.spacing_m - increment_m > 0.0) min_m = std::min(min_m, scheme.spacing_m - increment_m);
    else min_m = increment_m = scheme.spacing_m / 2.0;
    root["spacing"]["min_m"] = exact(min_m);
    root["spacing"]["max_m"] = exact(scheme.spacing_m);
    root["spacing"]["increment_m"] = exact(increment_m);
    // The planned days: the file's stages, then the top-up (a stage of the site after them), then the
    // surcharge.
    const std::size_t file_stages = root["loading"]["stages"].size();
    const std::size_t site_stages = s.site.loading->stages.size();
    if (scheme.stage_start_s.size() != site_stages + (scheme.schedule.surcharge ? 1 : 0) ||
        scheme.schedule.stages.size() != site_stages)
        throw std::invalid_argument("scheme_scenario_yaml: the scheme's placements do not match the scenario's stages");
    for (std::size_t i = 0; i < file_stages; ++i) {
        YAML::Node st = root["loading"]["stages"][i];
        st["start_day"] = day(scheme.schedule.stages[i].start_s);
        if (st["end_day"]) st["end_day"] = day(scheme.schedule.stages[i].end_s);
    }
    if (s.top_up && s.top_up->stage) {
        root["embankment"]["top_up_start_day"] = day(scheme.schedule.stages[*s.top_up->stage].start_s);
        // Without a surcharge the top-up cannot follow its removal; its planned day is given instead.
        if (!scheme.schedule.surcharge && s.site.embankment->top_up == TopUpRule::after_surcharge_removal)
            root["embankment"]["top_up"] = std::string(name_of(top_up_names, TopUpRule::with_last_lift));
    }
    if (const auto& sur = scheme.schedule.surcharge) {
        YAML::Node node = root["loading"]["surcharge"] ? YAML::Clone(root["loading"]["surcharge"]) : YAML::Node(YAML::NodeType::Map);
        node.remove("pressure_kPa");
        node.SetStyle(YAML::EmitterStyle::Flow);
        node["start_day"] = day(sur->start_s);
        node["end_day"] = day(sur->end_s);
        node["removal_day"] = day(sur->removal_s);
        node["height_m"] = exact(scheme.surcharge_height_m);
        root["loading"]["surcharge"] = node;
    } else {
        root["loading"].remove("surcharge");
    }
    root.remove("schedule");  // the scheme is chosen: the search's own block is not part of it
    YAML::Emitter out;
    out << root;
    return "# The scheme chosen by `wickgrid schedule` from " + s.file + " (SHA-256 " + s.sha256 + "):\n# drain " +
           scheme.drain + ", " + std::string(to_string(scheme.pattern)) + " pattern at " + exact(scheme.spacing_m) +
           " m, surcharge " + exact(scheme.surcharge_height_m) +
           " m, every lift on its planned day. Comments of the source are not kept.\n" + out.c_str() + "\n";
}

}  // namespace wickgrid::scenario
