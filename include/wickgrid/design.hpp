#pragma once
// The design study: for every drain product and pattern, the largest spacing that reaches the
// target degree by the deadline, rounded down to a practical increment, with the figures a design
// note needs, and a ranking. Pure computation: the scenario layer fills DesignInput.
#include <optional>
#include <string>
#include <vector>

#include "wickgrid/cell.hpp"
#include "wickgrid/numerical.hpp"
#include "wickgrid/settlement.hpp"
#include "wickgrid/search.hpp"

namespace wickgrid {

struct DrainProductSpec {
    std::string name;
    double equivalent_diameter_m = 0.0;
    double discharge_capacity_m3_per_s = 0.0;
    std::optional<double> cost_per_m;
};

struct DesignInput {
    Clay clay;
    std::optional<double> mv_m2_per_kN;  // set when kh is derived from ch (kh = ch·mv·γw)
    DrainInstallation installation;  // everything but dw and qw, which each product sets
    double mandrel_diameter_m = 0.0;
    double smear_diameter_ratio = 1.0;  // ds/dm
    std::vector<DrainProductSpec> products;
    std::vector<Pattern> patterns;
    double target_degree = 0.9;
    double deadline_s = 0.0;
    SpacingBounds bounds;
    double increment_m = 0.05;
    // Staged loading and settlement (all optional). Without loading the load is instantaneous at
    // day 0. The settlement model is the e–log profile, else mv·q·H with the clay's mv, else none
    // (degrees only, load-weighted).
    std::optional<LoadHistory> loading;
    std::optional<SoilProfile> profile;
    std::optional<double> clay_mv_m2_per_kN;
    // Residual-settlement criterion instead of the degree: settlement after the deadline (until
    // deadline + service, or to the end) must not exceed the limit.
    std::optional<double> residual_limit_m;
    std::optional<double> service_s;

    // The numerical unit cell instead of the closed form (layered clay, partially penetrating
    // drains). numerical_layers empty: one layer from `clay`.
    bool numerical = false;
    NumericalMesh numerical_mesh{20, 40, 0.005, 0.0};
    std::vector<NumericalLayer> numerical_layers;

    // The product of that name (InputError naming it if there is none).
    const DrainProductSpec& product(const std::string& name) const;

    bool has_settlement() const { return loading && (profile || clay_mv_m2_per_kN); }
    bool staged() const { return loading.has_value() || residual_limit_m.has_value(); }
    std::function<double(double)> ultimate_settlement() const;  // q (kPa) → m, or identity
};

// The load history of a design: its loading, or 1 kPa at day 0 for degree-only designs.
LoadHistory load_history_of(const DesignInput& input);

// The numerical unit cell of one product at one spacing (layers, partial drains, loading).
NumericalCellSpec numerical_cell(const DesignInput& input, const DrainProductSpec& product, Pattern pattern,
                                 double spacing_m);

// Settlement (or load-weighted degree) history of one unit cell under the design's loading.
SettlementHistory history_of(const DesignInput& input, const UnitCell& cell);

enum class RankingBasis { cost_per_hectare, drain_length_per_hectare };

struct DesignRow {
    std::string drain;
    Pattern pattern = Pattern::triangular;
    bool feasible = false;
    bool limited_by_maximum = false;  // the target is met even at the largest spacing allowed
    double spacing_limit_m = 0.0;     // exact limit (feasible rows)
    double spacing_m = 0.0;           // chosen spacing; the minimum spacing when infeasible
    double equivalent_diameter_m = 0.0;
    double smear_diameter_m = 0.0;
    double influence_diameter_m = 0.0;
    double n = 0.0;
    double s = 0.0;
    double mu_smear = 0.0;
    double mu = 0.0;  // depth mean of μ(z)
    Degrees at_deadline;
    double time_to_target_s = 0.0;
    double drains_per_hectare = 0.0;
    double drain_length_per_hectare_m = 0.0;
    std::optional<double> cost_per_hectare;
    std::optional<int> rank;  // 1 = best among feasible rows
    // With a settlement model: under the permanent load, at the chosen spacing.
    std::optional<double> ultimate_settlement_m;
    std::optional<double> settlement_at_deadline_m;
    std::optional<double> residual_settlement_m;
    std::optional<double> time_to_target_s_opt;  // staged designs: when the criterion is first met
};

struct DesignResult {
    std::vector<DesignRow> rows;
    RankingBasis ranking = RankingBasis::drain_length_per_hectare;
    bool any_feasible() const;
};

// The unit cell of one product: installation with its dw, qw and ds = ratio × dm.
CellSpec product_cell(const DesignInput& input, const DrainProductSpec& product, Pattern pattern,
                      double spacing_m);

// The chosen spacing: the limit rounded down to the increment, never below the minimum.
double round_down_spacing(double limit_m, double increment_m, double minimum_m);

DesignResult run_design(const DesignInput& input);

}  // namespace wickgrid

namespace wickgrid {

struct CurvePoint {
    double time_s = 0.0;
    Degrees degrees;
    std::optional<double> settlement_m;
};

// Degree–time table of one unit cell at the given times (s, each >= 0): the step response, or
// under the design's load history (degrees relative to the final load) with settlement.
std::vector<CurvePoint> degree_curve(const UnitCell& cell, const std::vector<double>& times_s);
std::vector<CurvePoint> degree_curve(const DesignInput& input, const UnitCell& cell, const std::vector<double>& times_s);

// Evenly spaced times from 0 to span_s inclusive (points >= 2).
std::vector<double> even_times_s(double span_s, int points);

}  // namespace wickgrid
