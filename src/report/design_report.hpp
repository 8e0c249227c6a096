#pragma once
// Writers for the design study and degree–time curves: JSON, CSV, Markdown design note, and the
// terminal table. They format; they never compute physics.
#include <nlohmann/json.hpp>
#include <string>

#include "scenario/scenario.hpp"
#include "wickgrid/design.hpp"

namespace wickgrid::report {

nlohmann::json design_json(const scenario::Scenario& s, const DesignResult& result);
std::string design_csv(const DesignResult& result);
std::string design_markdown(const scenario::Scenario& s, const DesignResult& result);
std::string design_table(const scenario::Scenario& s, const DesignResult& result);

struct CurveReport {
    std::string drain;
    Pattern pattern = Pattern::triangular;
    double spacing_m = 0.0;
    std::vector<CurvePoint> points;
};

nlohmann::json curve_json(const CurveReport& curve);
std::string curve_csv(const CurveReport& curve);
std::string curve_table(const CurveReport& curve);

// Shared text of the design notes (Markdown and HTML).
std::vector<std::string> method_notes(const scenario::Scenario& s);
std::string assumptions(const scenario::Scenario& s);
std::string criterion_text(const scenario::Scenario& s);
std::string recommendation(const scenario::Scenario& s, const DesignResult& result);
const DesignRow* best_row(const DesignResult& result);

// The cautions every report carries.
extern const char* const cautions[4];

// Fixed-point text with the given decimals ("-" for NaN is never needed: values are checked).
std::string fixed(double value, int decimals);

}  // namespace wickgrid::report
