#pragma once
// A small SVG chart writer of our own: line charts (linear or logarithmic time axis), horizontal
// range bars (one-at-a-time studies) and a shaded grid (two-input studies). Self-contained SVG,
// no scripts, no external fonts.
#include <optional>
#include <string>
#include <vector>

namespace wickgrid::report {

struct Series {
    std::string name;
    std::vector<double> x, y;
    int style = 0;  // colour and dash from the house palette
    bool points = false;  // observations: a dot at each point, no line
};

struct LineChart {
    std::string title;
    std::string x_label;
    std::string y_label;
    std::vector<Series> series;
    bool log_x = false;
    std::optional<double> y_min, y_max;  // fixed range (e.g. 0–100 %), else from the data
    std::optional<double> marker_x;      // a vertical reference line (e.g. the deadline)
    std::string marker_label;
};

struct RangeBar {
    std::string label;
    // Bar ends (e.g. spacing at the low and high input); an end without a value (no feasible
    // spacing) draws no bar: a marker at the other end and the words "no feasible spacing".
    std::optional<double> low_value, high_value;
    std::string low_text, high_text;
};

struct RangeChart {
    std::string title;
    std::string x_label;
    double base = 0.0;  // the base case, drawn as a line
    std::vector<RangeBar> bars;
};

struct ShadedGrid {
    std::string title;
    std::string x_label, y_label, value_label;
    std::vector<double> xs, ys;
    std::vector<std::optional<double>> values;  // row-major, ys outer; empty = not feasible
};

// "Nice" tick positions covering [lo, hi] (Heckbert 1990 labelling), about `count` of them.
std::vector<double> nice_ticks(double lo, double hi, int count);
// Decade ticks (1, 2, 5 × 10^k) for a logarithmic axis.
std::vector<double> log_ticks(double lo, double hi);
std::string tick_text(double value);
std::string escape_xml(const std::string& text);

std::string render(const LineChart& chart);
std::string render(const RangeChart& chart);
std::string render(const ShadedGrid& chart);

}  // namespace wickgrid::report
