#pragma once
// The design report: one self-contained HTML file (inline SVG charts, print stylesheet for A4) and
// each chart as a standalone SVG file.
#include <string>
#include <vector>

#include "report/study_report.hpp"
#include "scenario/scenario.hpp"
#include "wickgrid/design.hpp"

namespace wickgrid::report {

struct ReportOptions {
    bool log_time = false;  // degree–time charts on a logarithmic time axis
};

struct Chart {
    std::string file;     // e.g. "degree-time-triangular.svg"
    std::string caption;
    std::string svg;
};

struct ReportBundle {
    std::string html;
    std::vector<Chart> charts;
};

// Assembles the charts from engine results (curves and design charts come from engine calls) and
// writes the HTML around them.
ReportBundle build_report(const scenario::Scenario& s, const DesignResult& result, const SweepResults& studies,
                          const ReportOptions& options);

}  // namespace wickgrid::report
