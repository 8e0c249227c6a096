// The site: lookups, the joint checks of its parts, and the cell specifications each method needs.
#include "wickgrid/site.hpp"

#include <algorithm>
#include <cmath>

#include "wickgrid/errors.hpp"
#include "wickgrid/permeability.hpp"
#include "wickgrid/units.hpp"

namespace wickgrid {

Clay Ground::uniform_clay() const {
    if (!cv_m2_per_s) throw InputError("clay cv (m²/s)", "given for the clay as one layer (clay.cv_m2_per_year)");
    if (!ch_m2_per_s) throw InputError("clay ch (m²/s)", "given for the clay as one layer (clay.ch_m2_per_year)");
    Clay clay;
    clay.thickness_m = thickness_m;
    clay.cv_m2_per_s = *cv_m2_per_s;
    clay.ch_m2_per_s = *ch_m2_per_s;
    clay.drainage = drainage;
    if (kh_source == KhSource::from_ch_and_mv) {
        if (!mv_m2_per_kN) throw InputError("clay mv (m²/kN)", "given when kh is derived from ch·mv·γw");
        clay.kh_m_per_s = permeability_from_consolidation_m_per_s(*ch_m2_per_s, *mv_m2_per_kN);
    } else {
        if (!kh_m_per_s) throw InputError("clay kh (m/s)", "given for the clay as one layer (clay.kh_m_per_s)");
        clay.kh_m_per_s = *kh_m_per_s;
    }
    return clay;
}

bool Ground::layered_flow() const {
    if (!profile) return false;
    return std::any_of(profile->layers.begin(), profile->layers.end(),
                       [](const SoilLayer& l) { return l.cv_m2_per_s || l.ch_m2_per_s; });
}

const DrainProductSpec& Site::product(const std::string& name) const {
    const auto it = std::find_if(products.begin(), products.end(), [&](const DrainProductSpec& p) { return p.name == name; });
    if (it == products.end()) throw InputError("drain product '" + name + "'", "one of the design's products");
    return *it;
}

bool Site::has_settlement() const noexcept { return loading && (ground.profile || ground.mv_m2_per_kN); }

LoadHistory Site::load_history() const {
    if (loading) return *loading;
    LoadHistory h;
    h.stages.push_back({0.0, 0.0, 1.0});
    return h;
}

void validate_site(const Site& site) {
    require_positive("clay thickness (m)", site.ground.thickness_m);
    require_positive("deadline (s)", site.criterion.deadline_s);
    if (const auto* d = site.criterion.degree()) require_open_unit("target degree of consolidation", d->degree);
    if (const auto* r = site.criterion.residual()) {
        require_non_negative("residual settlement limit (m)", r->limit_m);
        if (r->service_s) require_positive("service period (s)", *r->service_s);
        if (!site.has_settlement())
            throw InputError("residual settlement limit (m)", r->limit_m,
                             "used with a loading and a settlement model (clay layers or mv)");
    }
    if (site.products.empty()) throw InputError("number of drain products", 0.0, "at least 1");
    if (site.range.patterns.empty()) throw InputError("number of patterns", 0.0, "at least 1");
    if (site.range.rank_by == RankingBasis::cost_per_hectare) {
        const auto without = std::count_if(site.products.begin(), site.products.end(),
                                           [](const DrainProductSpec& p) { return !p.cost_per_m; });
        if (without > 0)
            throw InputError("drain products without cost_per_m, ranked by cost", static_cast<double>(without),
                             "0 (rank_by: cost needs a cost on every product)");
    }
    require_positive("smallest spacing (m)", site.range.bounds.min_m);
    require_greater("largest spacing (m)", site.range.bounds.max_m, site.range.bounds.min_m, "greater than the smallest");
    require_positive("spacing increment (m)", site.range.increment_m);
    require_positive("drain length (m)", site.installation.drain_length_m);
    if (site.installation.drain_length_m > site.ground.thickness_m * (1 + 1e-12))
        throw InputError("drain length (m)", site.installation.drain_length_m,
                         "at most the clay thickness " + format_value(site.ground.thickness_m) + " m");
    if (site.loading) validate_load_history(*site.loading);
}

std::optional<double> final_fill_height_m(const Site& site) {
    if (!site.embankment) return std::nullopt;
    if (site.embankment->height_m) return site.embankment->height_m;
    if (!site.loading || !(site.loading->permanent_kPa() > 0.0)) return std::nullopt;
    return site.loading->permanent_kPa() / site.embankment->fill_unit_weight_kN_per_m3;
}

std::vector<double> load_at_depths_kPa(const Site& site, double q, const std::vector<double>& depths_m) {
    if (!site.embankment || q <= 0.0) return std::vector<double>(depths_m.size(), q);
    const double gamma = site.embankment->fill_unit_weight_kN_per_m3, height = q / gamma;
    const FillProfile profile =
        fill_profile(*site.embankment, std::max(height, final_fill_height_m(site).value_or(height)), height);
    std::vector<double> out;
    for (const double z : depths_m) out.push_back(centreline_stress_kPa(profile, gamma, z));
    return out;
}

std::vector<SettlementSlice> settlement_slices(const Site& site, double q) {
    std::vector<SettlementSlice> out;
    if (const auto& profile = site.ground.profile) {
        const auto all = slices(*profile);
        std::vector<double> depths;
        for (const auto& slice : all) depths.push_back(slice.depth_m);
        const auto loads = load_at_depths_kPa(site, q, depths);
        std::size_t k = 0;
        for (std::size_t l = 0; l < profile->layers.size(); ++l)
            for (int i = 0; i < profile->slices_per_layer; ++i, ++k)
                out.push_back({l, all[k].depth_m, all[k].thickness_m, all[k].sigma_v0_kPa, loads[k],
                               slice_settlement_m(profile->layers[l], all[k], loads[k])});
        return out;
    }
    if (!site.ground.mv_m2_per_kN) throw InputError("clay.mv_m2_per_kN", "given, or clay.layers (a settlement model)");
    const double mv = *site.ground.mv_m2_per_kN, h = site.ground.thickness_m / defaults::slices_per_layer;
    std::vector<double> depths;
    for (int i = 0; i < defaults::slices_per_layer; ++i) depths.push_back((i + 0.5) * h);
    const auto loads = load_at_depths_kPa(site, q, depths);
    for (int i = 0; i < defaults::slices_per_layer; ++i) out.push_back({0, depths[i], h, std::nullopt, loads[i], mv * loads[i] * h});
    return out;
}

std::optional<double> secondary_per_cycle_m(const Site& site) {
    if (!site.ground.profile) return std::nullopt;
    std::optional<double> total;
    for (const SoilLayer& l : site.ground.profile->layers)
        if (l.c_alpha && l.e0) total = total.value_or(0.0) + *l.c_alpha / (1.0 + *l.e0) * l.thickness_m;
    return total;
}

std::function<double(double)> ultimate_settlement_function(const Site& site) {
    if (site.loading && (site.ground.profile || site.ground.mv_m2_per_kN)) {
        if (!site.embankment && site.ground.profile) {
            const SoilProfile p = *site.ground.profile;
            return [p](double q) { return ultimate_settlement_m(p, q); };
        }
        if (!site.embankment) {
            const double mv = *site.ground.mv_m2_per_kN, h = site.ground.thickness_m;
            return [mv, h](double q) { return mv * q * h; };
        }
        return [site](double q) {
            double total = 0.0;
            for (const auto& s : settlement_slices(site, q)) total += s.final_m;
            return total;
        };
    }
    return [](double q) { return q; };
}

CellSpec closed_form_cell(const Site& site, const DrainProductSpec& product, Pattern pattern, double spacing_m) {
    CellSpec spec;
    spec.clay = site.ground.uniform_clay();
    const Installation& in = site.installation;
    spec.drain.equivalent_diameter_m = product.equivalent_diameter_m;
    spec.drain.discharge_capacity_m3_per_s = product.discharge_capacity_m3_per_s;
    spec.drain.smear_diameter_m = in.smear_diameter_m();
    spec.drain.smear_shape = in.smear_shape;
    spec.drain.smear_permeability_ratio = in.smear_permeability_ratio;
    spec.drain.length_m = in.drain_length_m;
    spec.drain.outlets = in.outlets;
    spec.drain.theory = in.theory;
    spec.pattern = pattern;
    spec.spacing_m = spacing_m;
    return spec;
}

NumericalCellSpec numerical_cell_spec(const Site& site, const DrainProductSpec& product, Pattern pattern,
                                      double spacing_m) {
    const Ground& g = site.ground;
    const Installation& in = site.installation;
    NumericalCellSpec n;
    if (g.profile) {
        // Storage mv of each layer: given, or the secant of the e–log curve under the final load (a
        // probe load without loading), so that each layer keeps its share of settlement.
        double q = site.loading ? site.loading->permanent_kPa() : defaults::secant_probe_kPa;
        if (site.loading && !(q > 0.0) && site.loading->vacuum) q = site.loading->vacuum->pressure_kPa;  // vacuum alone
        for (std::size_t i = 0; i < g.profile->layers.size(); ++i) {
            const SoilLayer& layer = g.profile->layers[i];
            const auto cv = layer.cv_m2_per_s ? layer.cv_m2_per_s : g.cv_m2_per_s;
            const auto ch = layer.ch_m2_per_s ? layer.ch_m2_per_s : g.ch_m2_per_s;
            const std::string which = "clay layer " + std::to_string(i + 1);
            if (!cv) throw InputError(which + " cv (m²/s)", "given for the layer or for the clay");
            if (!ch) throw InputError(which + " ch (m²/s)", "given for the layer or for the clay");
            n.layers.push_back({layer.thickness_m, *cv, *ch, secant_mv_m2_per_kN(*g.profile, i, q)});
        }
    } else {
        const Clay clay = g.uniform_clay();
        const double mv = clay.kh_m_per_s / (clay.ch_m2_per_s * units::gamma_w_kN_per_m3);
        n.layers = {{clay.thickness_m, clay.cv_m2_per_s, clay.ch_m2_per_s, mv}};
    }
    n.drainage = g.drainage;
    n.drain_diameter_m = product.equivalent_diameter_m;
    n.smear_diameter_m = in.smear_diameter_m();
    n.smear_shape = in.smear_shape;
    n.smear_permeability_ratio = in.smear_permeability_ratio;
    n.discharge_capacity_m3_per_s = product.discharge_capacity_m3_per_s;
    n.drain_length_m = in.drain_length_m;
    n.outlets = in.outlets;
    n.influence_diameter_m = influence_diameter_m(pattern, spacing_m);
    n.loading = site.loading;
    return n;
}

}  // namespace wickgrid
