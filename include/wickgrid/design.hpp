#pragma once
// The design study: for every drain product and pattern, the largest spacing that meets the site's
// criterion, rounded down to a practical increment, with the figures a design note needs, and a
// ranking. Every figure comes from the site's cell model (cell_model.hpp); nothing here knows which
// method computed it.
#include <optional>
#include <string>
#include <vector>

#include "wickgrid/cell_model.hpp"

namespace wickgrid {

struct DesignRow {
    std::string drain;
    Pattern pattern = Pattern::triangular;
    bool feasible = false;
    bool limited_by_maximum = false;  // the criterion is met even at the largest spacing allowed
    double spacing_limit_m = 0.0;     // exact limit (feasible rows)
    double spacing_m = 0.0;           // chosen spacing; the minimum spacing when infeasible
    CellFigures figures;              // of the cell at the chosen spacing
    Degrees at_deadline;
    std::optional<double> time_to_target_s;  // when the criterion is first met; none within the horizon
    double drains_per_hectare = 0.0;
    double drain_length_per_hectare_m = 0.0;
    std::optional<double> cost_per_hectare;
    std::optional<int> rank;  // 1 = best among feasible rows
    // With a settlement model: under the permanent load, at the chosen spacing.
    std::optional<double> ultimate_settlement_m;
    std::optional<double> settlement_at_deadline_m;
    std::optional<double> residual_settlement_m;  // after the deadline, over the service period if any
    std::optional<double> residual_primary_m;     // its primary part
    std::optional<double> residual_secondary_m;   // its secondary part (secondary.hpp)
    // Primary settlement still to come after the service period (residual criterion with a period).
    std::optional<double> settlement_after_service_m;
    std::vector<std::string> warnings;
};

struct DesignResult {
    std::vector<DesignRow> rows;
    RankingBasis ranking = RankingBasis::drain_length_per_hectare;
    bool any_feasible() const;
    const DesignRow* best() const;  // rank 1, or nullptr
};

// The chosen spacing: the limit rounded down to the increment, never below the minimum.
double round_down_spacing(double limit_m, double increment_m, double minimum_m);

// The row of one product and pattern (search, chosen spacing, figures, settlement, warnings).
DesignRow design_row(const Site& site, const DrainProductSpec& product, Pattern pattern);

// Every product × pattern of the site, ranked. Throws InputError for a site that fails
// validate_site or its method's validity, EvaluationError when a root finder does not converge.
DesignResult run_design(const Site& site);

struct CurvePoint {
    double time_s = 0.0;
    Degrees degrees;
    std::optional<double> settlement_m;
};

// Degrees (and settlement where the site has a settlement model) at the given times (s, ascending).
std::vector<CurvePoint> degree_curve(const CellModel& model, const std::vector<double>& times_s);

// Evenly spaced times from 0 to span_s inclusive (points >= 2).
std::vector<double> even_times_s(double span_s, int points);

}  // namespace wickgrid
