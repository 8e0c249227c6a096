// Secondary compression with the equivalent age a removed surcharge leaves (Bjerrum 1967); see
// secondary.hpp.
#include <algorithm>
#include <cmath>

#include "wickgrid/errors.hpp"
#include "wickgrid/secondary.hpp"

namespace wickgrid {

double SecondaryModel::per_cycle_m() const {
    double total = 0.0;
    for (const auto& l : layers) total += l.per_cycle_m;
    return total;
}

std::optional<SecondaryModel> secondary_model(const Site& site) {
    if (!site.ground.profile) return std::nullopt;
    const SoilProfile& profile = *site.ground.profile;
    SecondaryModel out;
    const double permanent = site.loading ? site.loading->permanent_kPa() : 0.0;
    double top = 0.0;
    for (std::size_t i = 0; i < profile.layers.size(); ++i) {
        const SoilLayer& l = profile.layers[i];
        const double mid = top + 0.5 * l.thickness_m;
        top += l.thickness_m;
        if (!l.c_alpha || !l.e0) continue;
        SecondaryLayer s;
        s.layer = i;
        s.c_alpha = *l.c_alpha;
        s.per_cycle_m = *l.c_alpha / (1.0 + *l.e0) * l.thickness_m;
        if (l.cc && l.cr && *l.c_alpha > 0.0) s.age_exponent = std::max(0.0, *l.cc - *l.cr) / *l.c_alpha;
        s.sigma_v0_kPa = initial_state(profile, mid).sigma_v0_kPa;
        s.permanent_kPa = permanent > 0.0 ? load_at_depths_kPa(site, permanent, {mid}).front() : 0.0;
        out.layers.push_back(s);
    }
    if (out.layers.empty()) return std::nullopt;
    if (site.loading && site.loading->surcharge) out.removal_s = site.loading->surcharge->removal_s;
    return out;
}

double surcharge_ocr(const SecondaryLayer& layer, double degree_at_removal) {
    const double final_kPa = layer.sigma_v0_kPa + layer.permanent_kPa;
    if (!(final_kPa > 0.0)) return 1.0;
    return (layer.sigma_v0_kPa + degree_at_removal * layer.permanent_kPa) / final_kPa;
}

double equivalent_age_s(double removal_s, double ocr, double age_exponent) {
    require_positive("surcharge removal (s)", removal_s);
    require_non_negative("ageing exponent (Cc − Cr)/Cα", age_exponent);
    require_finite("over-consolidation ratio", ocr);
    if (ocr <= 1.0) return removal_s;
    // In logarithms: a large exponent and OCR only push the age far out, where creep is nil.
    const double log_age = std::log(removal_s) + age_exponent * std::log(ocr);
    return std::exp(std::min(log_age, 700.0));
}

namespace {
// log10(t/tp) for t > tp, else 0: the plain law from the end of primary.
double cycles_from(double t, std::optional<double> tp) { return tp && t > *tp ? std::log10(t / *tp) : 0.0; }

// One layer's creep, in log cycles, from the end of primary to time t.
double layer_cycles(const SecondaryLayer& l, const SecondaryModel& m, double t, std::optional<double> tp, double u_removal) {
    if (!m.removal_s || t <= *m.removal_s || !l.age_exponent) return cycles_from(t, tp);
    const double tr = *m.removal_s, ocr = surcharge_ocr(l, u_removal);
    if (ocr <= 1.0) return cycles_from(t, tp);
    const double te = equivalent_age_s(tr, ocr, *l.age_exponent);
    return cycles_from(tr, tp) + std::log10((te + (t - tr)) / te);
}
}  // namespace

double secondary_between_m(const SecondaryModel& model, double from_s, double to_s, std::optional<double> tp_s,
                           double degree_at_removal) {
    double total = 0.0;
    for (const auto& l : model.layers)
        total += l.per_cycle_m * (layer_cycles(l, model, to_s, tp_s, degree_at_removal) -
                                  layer_cycles(l, model, from_s, tp_s, degree_at_removal));
    return total;
}

}  // namespace wickgrid
