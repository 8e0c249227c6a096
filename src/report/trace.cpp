#include "report/trace.hpp"

#include <nlohmann/json.hpp>

#include "report/svg_chart.hpp"
#include "results/design_record.hpp"
#include "wickgrid/version.hpp"

namespace wickgrid::report {
namespace {

// One line per field: a value never breaks the block it sits in.
std::string one_line(std::string text) {
    for (char& c : text)
        if (c == '\n' || c == '\r') c = ' ';
    return text;
}

TraceField caution_field() {
    return {"caution", "caution",
            "estimates from idealised theory; parameters from site investigation; monitoring required; local codes "
            "and licensed practice govern"};
}

bool ends_with(const std::string& s, const std::string& suffix) {
    return s.size() >= suffix.size() && s.compare(s.size() - suffix.size(), suffix.size(), suffix) == 0;
}

}  // namespace

std::vector<TraceField> trace_fields(const scenario::Scenario& s) {
    std::vector<TraceField> out;
    const auto block = results::title_block(s);
    for (const auto& f : block)
        if (f.key == "name" || f.key == "number" || f.key == "revision")
            out.push_back({f.key == "name" ? "project" : "project_" + f.key, f.label, one_line(f.value)});
    out.push_back({"title", "title", one_line(s.title)});
    for (const auto& f : block)
        if (!f.project) out.push_back({f.key, f.label, one_line(f.value)});
    out.push_back(caution_field());
    return out;
}

std::vector<TraceField> batch_trace_fields() {
    return {{"scenarios", "scenarios", "one per row, each with its file and SHA-256"},
            {"wickgrid_version", "wickgrid version", version},
            caution_field()};
}

std::string traced(const std::string& file_name, std::string content, const std::vector<TraceField>& trace) {
    if (ends_with(file_name, ".csv")) {
        std::string block;
        for (const auto& f : trace) block += "# " + f.label + ": " + f.value + "\n";
        content.insert(0, block);
        return content;
    }
    if (ends_with(file_name, ".svg")) {
        std::string desc = "<desc>";
        for (std::size_t i = 0; i < trace.size(); ++i)
            desc += (i ? "; " : "") + escape_xml(trace[i].label + ": " + trace[i].value);
        desc += "</desc>";
        const auto title_end = content.find("</title>");
        const auto at = title_end != std::string::npos ? title_end + 8 : content.find('>', content.find("<svg")) + 1;
        content.insert(at, "\n" + desc);
        return content;
    }
    if (ends_with(file_name, ".geojson")) {
        const auto brace = content.find('{');
        if (brace == std::string::npos) return content;
        nlohmann::json properties = nlohmann::json::object();
        for (const auto& f : trace) properties[f.key] = f.value;
        content.insert(brace + 1, "\"properties\":" + properties.dump() + ",");
        return content;
    }
    return content;
}

}  // namespace wickgrid::report
