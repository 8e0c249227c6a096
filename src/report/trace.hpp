#pragma once
// Every file a run writes can be traced to what made it: the project, its revision, the scenario file
// and its SHA-256, the wickgrid version, and the short caution. JSON, Markdown and HTML carry the
// full title block and cautions already; this stamps the files that have no room for them.
#include <string>
#include <vector>

#include "scenario/scenario.hpp"

namespace wickgrid::report {

struct TraceField {
    std::string key;    // GeoJSON property name
    std::string label;  // CSV and SVG label
    std::string value;  // one line
};

// One scenario's trace: project name, number and revision when the file gives them, title, scenario
// file, SHA-256, version, caution.
std::vector<TraceField> trace_fields(const scenario::Scenario& s);
// The trace of a file that sums several scenarios (each row names its own scenario and SHA-256).
std::vector<TraceField> batch_trace_fields();

// The file's content with the trace added by the file's kind, chosen from its name: `.csv` a leading
// block of lines starting with '#' (readers skip it: pandas `comment='#'`, R `comment.char='#'`),
// `.svg` a <desc> element after the chart's <title>, `.geojson` the collection's "properties" (a
// text insertion after the opening brace: a set-out file may hold millions of points); other kinds
// are returned unchanged. Cost: at most one copy of the content (none for other kinds when moved in);
// thread-safe.
std::string traced(const std::string& file_name, std::string content, const std::vector<TraceField>& trace);

}  // namespace wickgrid::report
