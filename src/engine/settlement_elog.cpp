// Primary consolidation settlement by the one-dimensional e–log σ' relation (Terzaghi 1925;
// compression and recompression indices) or a constant mv, summed over slices.
#include <cmath>

#include "wickgrid/errors.hpp"
#include "wickgrid/settlement.hpp"
#include "wickgrid/units.hpp"

namespace wickgrid {

namespace {
bool uses_mv(const SoilLayer& l) { return l.mv_m2_per_kN.has_value(); }
}  // namespace

void validate_profile(const SoilProfile& profile) {
    if (profile.layers.empty()) throw InputError("number of clay layers", 0.0, "at least 1");
    require_non_negative("groundwater depth (m)", profile.groundwater_depth_m);
    if (profile.slices_per_layer < 1 || profile.slices_per_layer > 1000)
        throw InputError("slices per layer", profile.slices_per_layer, "a whole number from 1 to 1000");
    for (const auto& l : profile.layers) {
        require_positive("layer thickness (m)", l.thickness_m);
        require_positive("layer unit weight (kN/m³)", l.unit_weight_kN_per_m3);
        if (uses_mv(l)) {
            require_positive("layer mv (m²/kN)", *l.mv_m2_per_kN);
            continue;
        }
        if (!l.e0 || !l.cc || !l.cr)
            throw InputError("layer compressibility", "e0, cc and cr (with preconsolidation_kPa or ocr), or mv_m2_per_kN");
        require_positive("layer e0", *l.e0);
        require_positive("layer cc", *l.cc);
        require_non_negative("layer cr", *l.cr);
        const int given = static_cast<int>(l.preconsolidation_kPa.has_value()) + static_cast<int>(l.ocr.has_value()) +
                          static_cast<int>(l.pop_kPa.has_value());
        if (given != 1)
            throw InputError("layer preconsolidation", static_cast<double>(given),
                             "given once, as preconsolidation_kPa, as ocr or as pop_kPa");
        if (l.preconsolidation_kPa) require_positive("layer preconsolidation pressure (kPa)", *l.preconsolidation_kPa);
        if (l.ocr) require_at_least("layer ocr", *l.ocr, 1.0, "at least 1");
        if (l.pop_kPa) require_non_negative("layer pre-overburden pressure POP (kPa)", *l.pop_kPa);
    }
    for (const auto& s : slices(profile))
        if (!(s.sigma_v0_kPa > 0.0))
            throw InputError("initial effective stress (kPa)", s.sigma_v0_kPa,
                             "greater than 0 at every slice (unit weight below groundwater must exceed γw)");
}

double profile_thickness_m(const SoilProfile& profile) {
    double h = 0.0;
    for (const auto& l : profile.layers) h += l.thickness_m;
    return h;
}

SliceState initial_state(const SoilProfile& profile, double z) {
    double top = 0.0, total = 0.0;  // total vertical stress at the top of the layer
    for (const auto& l : profile.layers) {
        if (z <= top + l.thickness_m || &l == &profile.layers.back()) {
            total += l.unit_weight_kN_per_m3 * (z - top);
            const double pore = units::gamma_w_kN_per_m3 * std::max(0.0, z - profile.groundwater_depth_m);
            const double sigma0 = total - pore;
            double sigma_p = sigma0;
            if (l.preconsolidation_kPa) sigma_p = *l.preconsolidation_kPa;
            if (l.ocr) sigma_p = *l.ocr * sigma0;
            if (l.pop_kPa) sigma_p = sigma0 + *l.pop_kPa;
            return {z, 0.0, sigma0, sigma_p};
        }
        top += l.thickness_m;
        total += l.unit_weight_kN_per_m3 * l.thickness_m;
    }
    return {z, 0.0, 0.0, 0.0};
}

std::vector<SliceState> slices(const SoilProfile& profile) {
    std::vector<SliceState> out;
    double top = 0.0;
    for (const auto& l : profile.layers) {
        const double h = l.thickness_m / profile.slices_per_layer;
        for (int i = 0; i < profile.slices_per_layer; ++i) {
            SliceState s = initial_state(profile, top + (i + 0.5) * h);
            s.thickness_m = h;
            out.push_back(s);
        }
        top += l.thickness_m;
    }
    return out;
}

double slice_settlement_m(const SoilLayer& layer, const SliceState& slice, double load_kPa) {
    if (layer.mv_m2_per_kN) return *layer.mv_m2_per_kN * load_kPa * slice.thickness_m;
    const double s0 = slice.sigma_v0_kPa, sf = s0 + load_kPa;
    // A preconsolidation pressure below the in-situ stress means the slice is normally consolidated.
    const double sp = std::max(slice.sigma_p_kPa, s0);
    double de;
    if (sf <= sp) de = *layer.cr * std::log10(sf / s0);
    else de = *layer.cr * std::log10(sp / s0) + *layer.cc * std::log10(sf / sp);
    return de / (1.0 + *layer.e0) * slice.thickness_m;
}

double ultimate_settlement_m(const SoilProfile& profile, double load_kPa) {
    require_non_negative("load (kPa)", load_kPa);
    const auto all = slices(profile);
    double total = 0.0;
    std::size_t k = 0;
    for (const auto& layer : profile.layers)
        for (int i = 0; i < profile.slices_per_layer; ++i) total += slice_settlement_m(layer, all[k++], load_kPa);
    return total;
}

}  // namespace wickgrid

namespace wickgrid {

double secant_mv_m2_per_kN(const SoilProfile& profile, std::size_t layer, double load_kPa) {
    if (layer >= profile.layers.size())
        throw InputError("layer index", static_cast<double>(layer),
                         "below the number of layers, " + std::to_string(profile.layers.size()));
    require_positive("load for a secant mv (kPa)", load_kPa);
    const SoilLayer& l = profile.layers[layer];
    if (l.mv_m2_per_kN) return *l.mv_m2_per_kN;
    const auto all = slices(profile);
    double settle = 0.0;
    const std::size_t first = layer * static_cast<std::size_t>(profile.slices_per_layer);
    for (int j = 0; j < profile.slices_per_layer; ++j) settle += slice_settlement_m(l, all[first + j], load_kPa);
    return settle / (load_kPa * l.thickness_m);
}

}  // namespace wickgrid
