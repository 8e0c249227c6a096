#pragma once
// Field monitoring: settlement plate records back-analysed by the observational methods and by a
// direct fit of the site model, and the forecast they imply. Times are from the start of loading
// (the scenario's day 0), settlements since the plate was installed at day 0.
#include <array>
#include <optional>
#include <string>
#include <vector>

#include "wickgrid/cell_model.hpp"
#include "wickgrid/site.hpp"

namespace wickgrid::monitoring {

struct Reading {
    double time_s = 0.0;
    double settlement_m = 0.0;
};

// Asaoka (1978): the record resampled at a constant interval Δt from `start_s` (linear
// interpolation between readings), s_i = β0 + β1·s_(i−1) fitted by least squares, s∞ = β0/(1 − β1).
struct AsaokaFit {
    double start_s = 0.0;
    double interval_s = 0.0;
    std::vector<double> resampled_m;  // s_0, s_1, … at start + i·Δt
    double beta0_m = 0.0;
    double beta1 = 0.0;
    double beta0_se_m = 0.0;  // standard errors of the least-squares estimates
    double beta1_se = 0.0;
    double final_settlement_m = 0.0;
    double final_settlement_se_m = 0.0;  // by the delta method from the estimates' covariance
    std::vector<double> residuals_m;     // s_i − (β0 + β1·s_(i−1))
};

// The least number of resampled points Asaoka's fit takes (four pairs, two degrees of freedom left).
inline constexpr std::size_t asaoka_min_points = 5;
inline constexpr std::size_t asaoka_max_points = 10000;  // of the resampled record (an --interval-days bound)

// Readings must be in ascending time. interval_s absent: the span after start_s divided into at
// most 12 steps and at least the readings' own mean interval. Throws EvaluationError when fewer than
// asaoka_min_points fit in the span or β1 is not within (0, 1) (the record does not settle towards
// a limit yet); InputError for a non-positive interval or one that gives more than
// asaoka_max_points. Cost O(readings + points). Thread-safe.
AsaokaFit asaoka(const std::vector<Reading>& readings, double start_s, std::optional<double> interval_s);

// The ch implied by β1 with radial and vertical drainage together (Magnan & Deroy 1980):
// −ln β1 / Δt = 8·ch/(De²·μ) + π²·cv/(4·d²), d the vertical drainage path. Nothing when the
// vertical term alone already exceeds the observed rate (the record cannot give ch).
std::optional<double> asaoka_ch_m2_per_s(double beta1, double interval_s, double influence_diameter_m, double mu,
                                         double cv_m2_per_s, double drainage_path_m);

// Hyperbolic method (Tan, Inoue & Lee 1991, the plain form without their slope correction):
// (t − t0)/(s − s0) = α + β·(t − t0) fitted by least squares over the readings after start_s,
// s∞ = s0 + 1/β. Throws EvaluationError with fewer than 4 readings after the start or β ≤ 0.
struct HyperbolicFit {
    double start_s = 0.0;
    double start_settlement_m = 0.0;
    double alpha_s_per_m = 0.0;
    double beta_per_m = 0.0;
    double final_settlement_m = 0.0;
    std::size_t points = 0;
};
HyperbolicFit hyperbolic(const std::vector<Reading>& readings, double start_s);

// Direct fit of the site model to the whole record: s(t) = S·U(t; f·ch) under the site's load
// history, through the site's own cell model (closed form, layered series or numerical cell, vacuum
// included), least squares over ln f — f a factor on the clay's ch and on every layer's own ch —
// (Brent's minimiser from Boost.Math, f within a factor 100 of 1) with S solved exactly for each f.
// The 95 % interval of f from the Jacobian (Student's t with n − 2 degrees of freedom). Throws
// EvaluationError with fewer than 4 readings. Cost: about 60 model builds and evaluations of every
// reading time.
struct DirectFit {
    double ch_factor = 1.0;                                      // f: hand it back to a re-design
    std::optional<std::array<double, 2>> ch_factor_interval_95;  // absent when the record cannot bound it
    std::optional<double> ch_m2_per_s;                           // f × the clay-wide ch, when the site has one
    double final_settlement_m = 0.0;  // S
    std::optional<std::array<double, 2>> ch_interval_95;  // f's interval × the clay-wide ch
    double rms_m = 0.0;
    std::size_t points = 0;
    bool at_search_bound = false;  // the optimum sits at a bound of the search: ch is not determined
};
DirectFit fit_ch_and_settlement(const Site& site, const DrainProductSpec& product, Pattern pattern, double spacing_m,
                                const std::vector<Reading>& readings);

// What a model with a final settlement S says from the day of the last reading on.
struct Forecast {
    double degree_now = 0.0;
    double settlement_now_m = 0.0;
    std::optional<double> criterion_met_s;       // first time the criterion holds (absent: not in 100 years)
    // Still to come after the deadline: S × (degree to come) plus, over a service period, the site's
    // secondary compression by the same model as `design` (secondary.hpp); and its two parts.
    std::optional<double> residual_at_deadline_m;
    std::optional<double> residual_primary_at_deadline_m;
    std::optional<double> residual_secondary_at_deadline_m;
    std::optional<double> surcharge_removal_s;   // first time U ≥ 1 before the planned removal
};
Forecast forecast(const CellModel& model, double final_settlement_m, const Site& site, double now_s);

}  // namespace wickgrid::monitoring
