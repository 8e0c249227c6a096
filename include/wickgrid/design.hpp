#pragma once
// The design study: for every drain product and pattern, the largest spacing that reaches the
// target degree by the deadline, rounded down to a practical increment, with the figures a design
// note needs, and a ranking. Pure computation: the scenario layer fills DesignInput.
#include <optional>
#include <string>
#include <vector>

#include "wickgrid/cell.hpp"
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
};

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
};

// Degree–time table of one unit cell at the given times (s, each >= 0).
std::vector<CurvePoint> degree_curve(const UnitCell& cell, const std::vector<double>& times_s);

// Evenly spaced times from 0 to span_s inclusive (points >= 2).
std::vector<double> even_times_s(double span_s, int points);

}  // namespace wickgrid
