#pragma once
// One interface for the unit cell of a site, whatever method computes it. A CellModel is one drain
// product × pattern × spacing on a site, built once by make_cell_model and asked many times:
// degrees at given times under the site's load history, settlement, the residual settlement, how
// far the criterion is met and when, and the figures a report shows. The closed form and the
// numerical cell are two implementations; a method is added by one implementation and one row in
// the method table (cell_model.cpp), with nothing to change in the commands.
#include <memory>
#include <optional>
#include <string_view>
#include <vector>

#include "wickgrid/errors.hpp"
#include "wickgrid/secondary.hpp"
#include "wickgrid/site.hpp"

namespace wickgrid {

// Geometry and radial-flow figures of a unit cell, as a report shows them.
struct CellFigures {
    double equivalent_diameter_m = 0.0;  // dw
    double smear_diameter_m = 0.0;       // ds
    double influence_diameter_m = 0.0;   // De
    double n = 0.0;                      // De/dw
    double s = 0.0;                      // ds/dw
    double mu_smear = 0.0;               // μ of smear alone (no well resistance)
    double mu_depth_mean = 0.0;          // depth mean of μ(z) over the drain, well resistance included
    double drain_length_m = 0.0;
};

// The state at one depth (m below the top of the clay) at one time: the cell-averaged excess pore
// pressure (kPa) and the local degree (the strain there relative to its final value under the
// permanent load; for a vacuum alone, under the steady vacuum).
struct DepthPoint {
    double depth_m = 0.0;
    double excess_pore_pressure_kPa = 0.0;
    double local_degree = 0.0;
};

class CellModel {
public:
    virtual ~CellModel() = default;
    CellModel(const CellModel&) = delete;
    CellModel& operator=(const CellModel&) = delete;

    // Degrees at each time (s, ascending, each >= 0), relative to the final permanent load, under the
    // site's load history. Uv is the degree of vertical flow alone; Ur is the radial degree that
    // Carrillo's rule needs to give U, so that 1 − U = (1 − Uv)(1 − Ur) holds at every time (under a
    // single instantaneous load it is the cell's own radial degree). Cost: method-dependent (closed
    // form: microseconds a time; numerical: one march to the last time).
    virtual std::vector<Degrees> degrees(const std::vector<double>& times_s) const = 0;
    // U alone at each time (cheaper where the method can skip Uv).
    virtual std::vector<double> combined(const std::vector<double>& times_s) const;
    // The degree the settlement tends to in the long run (above 1 when a surcharge over-compressed
    // and rebound is ignored).
    virtual double eventual_degree() const { return 1.0; }
    // First time (s) at which U reaches target (0 < target < 1); nullopt when not within the search
    // horizon (defaults::search_horizon_years).
    virtual std::optional<double> time_to_degree_s(double target) const;
    virtual CellMethod method() const noexcept = 0;
    // The degree over depth at one time (depths from 0 to the clay thickness, any order), by the
    // linear model (pore pressure follows loading and unloading; no hold rule). nullopt where the
    // method reports depth averages only (the numerical cell). Throws InputError for a depth outside
    // the clay or a negative time. Cost: closed form, one local step response per load event and
    // depth; layered series, O(terms²) per depth.
    virtual std::optional<std::vector<DepthPoint>> over_depth(const std::vector<double>& depths_m, double time_s) const;

    const CellFigures& figures() const noexcept { return figures_; }
    // Final primary settlement under the permanent load (m); nullopt without a settlement model.
    std::optional<double> final_settlement_m() const noexcept { return final_m_; }

    double degree(double time_s) const { return combined({time_s}).front(); }
    // Settlement (m) at a time: U × final settlement; nullopt without a settlement model.
    std::optional<double> settlement_m(double time_s) const;
    // Settlement still to come after time_s: until time_s + period, or to the end (period absent):
    // primary, plus secondary compression over the period where the site gives Cα (secondary.hpp:
    // reduced after a surcharge is removed). Throws InputError without a settlement model, or with
    // secondary compression and no period (it does not end).
    struct Residual {
        double primary_m = 0.0;
        double secondary_m = 0.0;
        double total_m() const { return primary_m + secondary_m; }
    };
    Residual residual_parts(double time_s, std::optional<double> period_s) const;
    // The same with the primary part scaled to a final settlement S (m, > 0; a back-analysed one, as
    // `monitor` forecasts with): one computation for the design and the forecast.
    Residual residual_parts(double time_s, std::optional<double> period_s, double final_settlement_m) const;
    double residual_m(double time_s, std::optional<double> period_s) const { return residual_parts(time_s, period_s).total_m(); }
    // Secondary compression (m) from the end of primary (the time U reaches
    // defaults::end_of_primary_degree) to time_s, by the site's creep model (secondary.hpp); 0
    // before tp, without Cα, or when tp is beyond the search horizon. Cost: one time-to-degree root
    // (and one degree at the surcharge removal).
    double secondary_m(double time_s) const;
    // Secondary compression (m) between two times (from ≤ to), same model.
    double secondary_between_m(double from_s, double to_s) const;
    // The creep model (nullopt without Cα).
    const std::optional<SecondaryModel>& secondary_model() const noexcept { return secondary_; }
    // The end of primary consolidation (s); nullopt when not reached within the search horizon.
    std::optional<double> end_of_primary_s() const { return time_to_degree_s(defaults::end_of_primary_degree); }
    // How far the criterion is met at the deadline: >= 0 when met (degree − target, or limit − residual).
    double margin(const Criterion& criterion) const;
    // First time the criterion holds; nullopt when not within the search horizon.
    std::optional<double> time_criterion_met_s(const Criterion& criterion) const;

protected:
    CellModel(const CellFigures& figures, std::optional<double> final_m,
              std::optional<SecondaryModel> secondary = std::nullopt)
        : figures_(figures), final_m_(final_m), secondary_(std::move(secondary)) {}

private:
    // Secondary compression between two times given the end of primary tp (0 without tp or Cα) and
    // the degree at the surcharge removal.
    double secondary_between(double from_s, double to_s, std::optional<double> tp, double u_removal) const;
    // The degree at the surcharge removal (1 without a removal): sets the over-consolidation left.
    double degree_at_removal() const;

    CellFigures figures_;
    std::optional<double> final_m_;
    std::optional<SecondaryModel> secondary_;
};

// The cell model of the site's method for one product × pattern × spacing. Throws InputError for
// inputs outside what the method can take (naming the method and the reason: e.g. the closed form
// with drains that stop short of the clay base), including spacings too small for the smear zone.
std::unique_ptr<CellModel> make_cell_model(const Site& site, const DrainProductSpec& product, Pattern pattern,
                                           double spacing_m);

// Why the site's method cannot take this site: the part of the site at fault, and the InputError
// terms (quantity, value, what is allowed). Checked once per site, so that a scenario is refused at
// the key that causes it before any search starts.
struct MethodRefusal {
    enum class Part { drain_length, layer_coefficients, clay_coefficients, vacuum };
    Part part;
    std::string quantity;
    std::optional<double> value;  // none: the input is missing, not a wrong number
    std::string allowed;
    InputError error() const { return value ? InputError(quantity, *value, allowed) : InputError(quantity, allowed); }
};
std::optional<MethodRefusal> method_refusal(const Site& site);

// The largest spacing within the site's range at which the criterion is met, for one product and
// pattern. A method may supply a fast path (the closed form with a degree criterion: SpacingSolver
// under one instantaneous load, StagedSpacingSolver under a load history with Hansbo's theory);
// otherwise the criterion margin is solved on cell models: TOMS 748 for the degree (monotone in
// spacing), a scan of the increment grid refined by bisection for the residual settlement (which
// need not be monotone over a service period). Throws EvaluationError when a root finder hits its cap.
SpacingLimit spacing_limit(const Site& site, const DrainProductSpec& product, Pattern pattern);

// The same search on cell models only, never a method's fast path: the reference the fast paths
// are tested against (to defaults::spacing_tolerance_m). Milliseconds per search.
SpacingLimit spacing_limit_reference(const Site& site, const DrainProductSpec& product, Pattern pattern);

// Whether the site's spacing searches take a fast path (the closed form with a degree criterion,
// under a load history with Hansbo's theory): SpacingSolver / StagedSpacingSolver, microseconds
// per search instead of milliseconds.
bool has_fast_search(const Site& site);

// How many spacing searches one study may run on this site (defaults.hpp: the fast path, the generic
// closed-form search, the numerical cell; the layered series' generic budget scaled by
// (default terms / terms)³), so that no accepted input runs for hours.
double max_spacing_searches(const Site& site);

}  // namespace wickgrid
