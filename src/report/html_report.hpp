#pragma once
// The design report: one self-contained HTML file (inline SVG charts, print stylesheet for A4) and
// each chart as a standalone SVG file.
#include <string>
#include <vector>

#include "results/design_record.hpp"

namespace wickgrid::report {

struct Chart {
    std::string file;     // e.g. "degree-time-triangular.svg"
    std::string caption;
    std::string svg;
};

struct ReportBundle {
    std::string html;
    std::string markdown;  // the same content as a Markdown note, the charts linked as the SVG files
    std::vector<Chart> charts;
};

// The title block as an HTML table, and the print rules that put the running header (project,
// scenario title, revision) and "page N of M" on every printed page.
std::string title_block_html(const scenario::Scenario& s);
std::string print_page_css(const scenario::Scenario& s);

// Draws the record's curves, series and studies and writes the HTML around them (formatting only:
// the record was computed with charts, see results::RecordOptions).
ReportBundle build_report(const results::DesignRecord& record);

}  // namespace wickgrid::report
