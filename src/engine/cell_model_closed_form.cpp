// The closed-form cell model: Terzaghi (1925) vertical flow, Hansbo (1981) / the equal-strain
// integral radial flow with depth-averaged well resistance, Carrillo (1942); under a load history
// by superposition of the step response (settlement_history.cpp). Uniform clay, full drains.
#include <algorithm>
#include <boost/math/constants/constants.hpp>
#include <cmath>

#include "cell_model_methods.hpp"
#include "wickgrid/errors.hpp"
#include "wickgrid/search.hpp"

namespace wickgrid::detail {

namespace {
CellFigures figures_of(const UnitCell& cell) {
    CellFigures f;
    f.equivalent_diameter_m = cell.spec().drain.equivalent_diameter_m;
    f.smear_diameter_m = cell.spec().drain.smear_diameter_m;
    f.influence_diameter_m = cell.influence_diameter_m();
    f.n = cell.n();
    f.s = cell.s();
    f.mu_smear = cell.mu_smear();
    f.mu_depth_mean = cell.mu_depth_mean();
    f.drain_length_m = cell.spec().drain.length_m;
    return f;
}

class ClosedFormModel final : public CellModel {
public:
    explicit ClosedFormModel(UnitCell cell)
        : CellModel(figures_of(cell), std::nullopt), cell_(std::move(cell)) {}

    ClosedFormModel(const Site& site, UnitCell cell, std::optional<double> final_m)
        : CellModel(figures_of(cell), final_m, wickgrid::secondary_model(site)), cell_(std::move(cell)) {
        const auto ultimate = ultimate_settlement_function(site);
        const LoadHistory loads = site.load_history();
        const UnitCell* c = &cell_;
        combined_.emplace(ultimate, loads, [c](double t) { return c->at(t).combined; });
        vertical_.emplace(ultimate, loads, [c](double t) { return c->at(t).vertical; });
        if (loads.surcharge) eventual_ = std::max(1.0, combined_->degree(loads.surcharge->removal_s));
        loads_ = loads;
    }

    std::vector<Degrees> degrees(const std::vector<double>& times_s) const override {
        std::vector<Degrees> out;
        out.reserve(times_s.size());
        for (const double t : times_s) {
            require_non_negative("time (s)", t);
            if (!combined_) {
                out.push_back(cell_.at(t));
                continue;
            }
            const double u = combined_->degree(t), uv = vertical_->degree(t);
            out.push_back({uv, carrillo_radial(u, uv), u});
        }
        return out;
    }

    std::vector<double> combined(const std::vector<double>& times_s) const override {
        std::vector<double> out;
        out.reserve(times_s.size());
        for (const double t : times_s) {
            require_non_negative("time (s)", t);
            out.push_back(combined_ ? combined_->degree(t) : cell_.at(t).combined);
        }
        return out;
    }

    double eventual_degree() const override { return eventual_; }

    std::optional<double> time_to_degree_s(double target) const override {
        if (combined_) return CellModel::time_to_degree_s(target);
        require_open_unit("target degree of consolidation", target);
        try {
            return wickgrid::time_to_degree_s(cell_, target);
        } catch (const InputError&) {
            return std::nullopt;  // not reachable within the solver's horizon
        }
    }

    CellMethod method() const noexcept override { return CellMethod::closed_form; }

    // Terzaghi's (1925) isochrone combined with Hansbo's (1981) radial degree at μ(z) by Carrillo's
    // (1942) rule at each depth, superposed over the load history like the averages.
    std::optional<std::vector<DepthPoint>> over_depth(const std::vector<double>& depths_m, double time_s) const override {
        require_non_negative("time (s)", time_s);
        const LoadHistory loads = loads_.value_or(LoadHistory{{{0.0, 0.0, 1.0}}, std::nullopt, std::nullopt});
        std::vector<ResponseIncrement> events;
        for (const auto& s : loads.stages) events.push_back({s.start_s, s.end_s, s.pressure_kPa});
        if (const auto& s = loads.surcharge) {
            events.push_back({s->start_s, s->end_s, s->pressure_kPa});
            events.push_back({s->removal_s, s->removal_s, -s->pressure_kPa});
        }
        const double q = loads.permanent_kPa(), applied = loads.applied_at_kPa(time_s);
        std::vector<DepthPoint> out;
        for (const double z : depths_m) {
            const double local = superpose(local_step(z), events, time_s) / q;
            out.push_back({z, applied - q * local, local});
        }
        return out;
    }

private:
    // The local degree at depth z (m) after a unit step load, as a function of time.
    StepResponse local_step(double z) const {
        const CellSpec& spec = cell_.spec();
        const double h = spec.clay.thickness_m;
        if (!(z >= 0.0 && z <= h * (1 + 1e-12))) throw InputError("depth (m)", z, "from 0 to the clay thickness " + format_value(h) + " m");
        double ratio = 0.0;  // z/d from the nearest drained face
        switch (spec.clay.drainage) {
            case VerticalDrainage::both_faces: ratio = std::min(2.0, z / (0.5 * h)); break;
            case VerticalDrainage::top_only: ratio = std::min(1.0, z / h); break;
            case VerticalDrainage::bottom_only: ratio = std::max(0.0, (h - z) / h); break;
        }
        const double mu = mu_at_depth(cell_.mu_smear(), z, spec.drain.length_m, spec.drain.outlets, spec.clay.kh_m_per_s,
                                      spec.drain.discharge_capacity_m3_per_s);
        const double d = cell_.drainage_path_m(), de = cell_.influence_diameter_m();
        const double cv = spec.clay.cv_m2_per_s, ch = spec.clay.ch_m2_per_s;
        return [=](double t) {
            if (t <= 0.0) return 0.0;
            return 1.0 - excess_fraction_vertical(ratio, cv * t / (d * d)) * std::exp(-8.0 * ch * t / (de * de * mu));
        };
    }

    UnitCell cell_;
    std::optional<SettlementHistory> combined_;  // under a load history (absent: one step at day 0)
    std::optional<SettlementHistory> vertical_;
    double eventual_ = 1.0;
    std::optional<LoadHistory> loads_;  // the site's load history (absent: one unit step at day 0)
};
}  // namespace

std::optional<MethodRefusal> closed_form_refusal(const Site& site) {
    using Part = MethodRefusal::Part;
    if (site.ground.layered_flow())
        return MethodRefusal{Part::layer_coefficients, "layer cv/ch", std::nullopt,
                             "given with 'method: layered_series' or 'method: numerical' only (the closed form takes one "
                             "cv and ch for the clay)"};
    if (site.loading && site.loading->vacuum)
        return MethodRefusal{Part::vacuum, "vacuum pressure (kPa)", site.loading->vacuum->pressure_kPa,
                             "used with 'method: layered_series' or 'method: numerical' (the closed form takes no vacuum)"};
    if (!site.ground.cv_m2_per_s || !site.ground.ch_m2_per_s)
        return MethodRefusal{Part::clay_coefficients, "clay cv and ch", std::nullopt,
                             "given for the clay as one layer with the closed form"};
    const double h = site.ground.thickness_m, l = site.installation.drain_length_m;
    if (std::fabs(l - h) > 1e-9 * h)
        return MethodRefusal{Part::drain_length, "drain length (m)", l,
                             "equal to the clay thickness " + format_value(h) +
                                 " m with the closed form (drains that stop short of the clay base need "
                                 "'method: layered_series' or 'method: numerical')"};
    return std::nullopt;
}

std::unique_ptr<CellModel> make_closed_form_model(const Site& site, const DrainProductSpec& product, Pattern pattern,
                                                  double spacing_m) {
    UnitCell cell(closed_form_cell(site, product, pattern, spacing_m));
    if (!site.loading) return std::make_unique<ClosedFormModel>(std::move(cell));
    std::optional<double> final_m;
    if (site.has_settlement()) {
        const auto ultimate = ultimate_settlement_function(site);
        final_m = ultimate(site.loading->permanent_kPa()) - ultimate(0.0);
    }
    return std::make_unique<ClosedFormModel>(site, std::move(cell), final_m);
}

std::optional<SpacingLimit> closed_form_fast_limit(const Site& site, const DrainProductSpec& product, Pattern pattern) {
    if (!has_fast_search(site)) return std::nullopt;
    const double target = site.criterion.degree()->degree;
    const CellSpec cell = closed_form_cell(site, product, pattern, site.range.bounds.min_m);
    if (!site.loading) return largest_spacing(cell, target, site.criterion.deadline_s, site.range.bounds);
    StagedSpacingSolver solver;
    solver.reset(cell, site.range.bounds, load_increments(ultimate_settlement_function(site), site.load_history()),
                 site.criterion.deadline_s);
    return solver.solve(target);
}

}  // namespace wickgrid::detail
