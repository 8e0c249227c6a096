// The numerical cell model: the finite-volume unit cell (numerical_unit_cell.cpp) with the site's
// layers, partial drains and load history. Uv is the same cell without a drain; Ur follows from
// Carrillo's rule. Settlement is U × the final primary settlement of the settlement model.
#include <algorithm>
#include <boost/math/constants/constants.hpp>
#include <cmath>

#include "cell_model_methods.hpp"
#include "wickgrid/errors.hpp"
#include "wickgrid/units.hpp"

namespace wickgrid::detail {

namespace {
// Depth mean over the drain of μ(z) = μs + π·z(2l − z)·kh(z)/qw (Hansbo 1981), with z from the nearest
// outlet and kh of the layer at that depth (kh = ch·mv·γw, as the numerical cell uses).
double mu_depth_mean_layered(const NumericalCellSpec& spec, double mu_smear) {
    const double length = spec.drain_length_m;
    constexpr int points = 4000;  // midpoint rule on a smooth piecewise quadratic: error ~1e-7 relative
    double sum = 0.0;
    for (int i = 0; i < points; ++i) {
        const double depth = (i + 0.5) * length / points;
        double top = 0.0, kh = 0.0;
        for (const auto& layer : spec.layers) {
            kh = layer.ch_m2_per_s * layer.mv_m2_per_kN * units::gamma_w_kN_per_m3;
            if (depth < top + layer.thickness_m) break;
            top += layer.thickness_m;
        }
        sum += mu_at_depth(mu_smear, depth, length, spec.outlets, kh, spec.discharge_capacity_m3_per_s);
    }
    return sum / points;
}

CellFigures figures_of(const Site& site, const NumericalCellSpec& spec, double spacing_m) {
    CellFigures f = spec_geometry(spec);
    DrainInstallation drain;
    drain.equivalent_diameter_m = spec.drain_diameter_m;
    drain.smear_diameter_m = spec.smear_diameter_m;
    drain.smear_shape = spec.smear_shape;
    drain.smear_permeability_ratio = spec.smear_permeability_ratio;
    drain.theory = site.installation.theory;
    f.mu_smear = smear_mu(drain, f.n, spacing_m);
    f.mu_depth_mean = mu_depth_mean_layered(spec, f.mu_smear);
    return f;
}

// Degrees at ascending times from a march (linear between the march's states; after a jump at equal
// times, the state after it).
std::vector<double> at_times(const std::vector<NumericalPoint>& states, const std::vector<double>& times_s) {
    std::vector<double> out;
    out.reserve(times_s.size());
    std::size_t k = 0;
    for (const double t : times_s) {
        while (k + 1 < states.size() && states[k + 1].time_s <= t) ++k;
        if (states[k].time_s == t || k + 1 == states.size()) {
            out.push_back(states[k].degree_settlement);
            continue;
        }
        const auto& a = states[k];
        const auto& b = states[k + 1];
        const double w = (t - a.time_s) / (b.time_s - a.time_s);
        out.push_back(a.degree_settlement + w * (b.degree_settlement - a.degree_settlement));
    }
    return out;
}

void check_times(const std::vector<double>& times_s) {
    for (std::size_t i = 0; i < times_s.size(); ++i) {
        require_non_negative("time (s)", times_s[i]);
        if (i && times_s[i] < times_s[i - 1]) throw InputError("time (s)", times_s[i], "in ascending order");
    }
}

class NumericalModel final : public CellModel {
public:
    NumericalModel(const Site& site, const NumericalCellSpec& spec, double spacing_m,
                   std::optional<double> final_m)
        : CellModel(figures_of(site, spec, spacing_m), final_m, wickgrid::secondary_model(site)),
          cell_(spec, site.method.mesh),
          vertical_(without_drain(spec), site.method.mesh) {}

    // Every output comes from the cell's own march, interpolated: the same time gives the same
    // degree whichever other times are asked with it (design, curve, report and verify agree).
    std::vector<Degrees> degrees(const std::vector<double>& times_s) const override {
        const auto u = combined(times_s);
        check_times(times_s);
        const auto uv = at_times(vertical_.march(times_s.empty() ? 0.0 : times_s.back()), times_s);
        std::vector<Degrees> out;
        out.reserve(times_s.size());
        for (std::size_t i = 0; i < times_s.size(); ++i) out.push_back({uv[i], carrillo_radial(u[i], uv[i]), u[i]});
        return out;
    }

    std::vector<double> combined(const std::vector<double>& times_s) const override {
        check_times(times_s);
        return at_times(cell_.march(times_s.empty() ? 0.0 : times_s.back()), times_s);
    }

    // The crossing of the march's own states (the inverse of the interpolation above).
    std::optional<double> time_to_degree_s(double target) const override {
        require_open_unit("target degree of consolidation", target);
        const auto states = cell_.march(defaults::search_horizon_years * units::seconds_per_year);
        for (std::size_t k = 1; k < states.size(); ++k) {
            const auto& a = states[k - 1];
            const auto& b = states[k];
            if (b.degree_settlement < target) continue;
            if (a.degree_settlement >= target || b.time_s == a.time_s) return b.time_s;
            return a.time_s + (target - a.degree_settlement) / (b.degree_settlement - a.degree_settlement) * (b.time_s - a.time_s);
        }
        return std::nullopt;
    }

    CellMethod method() const noexcept override { return CellMethod::numerical; }
    double reference_load_kPa() const noexcept { return cell_.reference_load_kPa(); }

private:
    static NumericalCellSpec without_drain(NumericalCellSpec spec) {
        spec.has_drain = false;
        return spec;
    }

    NumericalCell cell_;
    NumericalCell vertical_;
};
}  // namespace

std::optional<MethodRefusal> numerical_refusal(const Site& site) {
    const Ground& g = site.ground;
    if (g.profile)
        for (std::size_t i = 0; i < g.profile->layers.size(); ++i) {
            const SoilLayer& layer = g.profile->layers[i];
            if ((!layer.cv_m2_per_s && !g.cv_m2_per_s) || (!layer.ch_m2_per_s && !g.ch_m2_per_s))
                return MethodRefusal{MethodRefusal::Part::layer_coefficients,
                                     "clay layer " + std::to_string(i + 1) + " cv/ch", std::nullopt,
                                     "given for the layer (cv_m2_per_year, ch_m2_per_year) or for the clay"};
        }
    else if (!g.cv_m2_per_s || !g.ch_m2_per_s)
        return MethodRefusal{MethodRefusal::Part::clay_coefficients, "clay cv and ch", std::nullopt, "given for the clay"};
    return std::nullopt;
}

std::unique_ptr<CellModel> make_numerical_model(const Site& site, const DrainProductSpec& product, Pattern pattern,
                                                double spacing_m) {
    const NumericalCellSpec spec = numerical_cell_spec(site, product, pattern, spacing_m);
    auto model = std::make_unique<NumericalModel>(site, spec, spacing_m, std::nullopt);
    if (!site.has_settlement()) return model;
    // The permanent fill's settlement; without fill, the settlement under the vacuum's mv-weighted
    // mean steady suction, on the same settlement model.
    const auto ultimate = ultimate_settlement_function(site);
    const double q = site.loading->permanent_kPa() > 0.0 ? site.loading->permanent_kPa() : model->reference_load_kPa();
    return std::make_unique<NumericalModel>(site, spec, spacing_m, ultimate(q) - ultimate(0.0));
}

}  // namespace wickgrid::detail
