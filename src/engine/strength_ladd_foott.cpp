// Undrained strength before and after consolidation (Ladd & Foott 1974; the profile form with a
// gain ratio, common practice); see strength.hpp.
#include <algorithm>
#include <cmath>

#include "wickgrid/errors.hpp"
#include "wickgrid/strength.hpp"

namespace wickgrid {

void validate_strength(const UndrainedStrength& s) {
    const bool profile = s.su_top_kPa.has_value(), ratio = s.su_ratio.has_value();
    if (profile == ratio)
        throw InputError("su_top_kPa", profile ? *s.su_top_kPa : 0.0,
                         "given alone, or su_ratio alone (one strength form per layer)");
    if (profile) {
        require_positive("su_top_kPa", *s.su_top_kPa);
        if (s.su_gradient_kPa_per_m) require_finite("su_gradient_kPa_per_m", *s.su_gradient_kPa_per_m);
    } else {
        if (!(*s.su_ratio > 0.0 && *s.su_ratio < 2.0)) throw InputError("su_ratio", *s.su_ratio, "between 0 and 2, both excluded");
    }
    if (!(s.strength_exponent >= 0.0 && s.strength_exponent <= 1.0))
        throw InputError("strength_exponent", s.strength_exponent, "from 0 to 1");
    if (!(s.gain_ratio >= 0.0 && s.gain_ratio < 2.0)) throw InputError("su_gain_ratio", s.gain_ratio, "from 0 up to 2, 2 excluded");
}

double undrained_strength_kPa(const UndrainedStrength& s, double depth_in_layer_m, double sigma_v0_kPa,
                              double sigma_p_kPa, double delta_sigma_kPa) {
    const double gain = std::max(0.0, delta_sigma_kPa);
    double su = 0.0;
    if (s.su_top_kPa) {
        su = *s.su_top_kPa + s.su_gradient_kPa_per_m.value_or(0.0) * depth_in_layer_m + s.gain_ratio * gain;
    } else if (s.su_ratio) {
        const double sigma = sigma_v0_kPa + gain;
        const double sigma_p = std::max(sigma_p_kPa, sigma);
        su = *s.su_ratio * sigma * std::pow(sigma_p / sigma, s.strength_exponent);
    } else {
        throw InputError("su_top_kPa", "given, or su_ratio (no strength given for this layer)");
    }
    // Zero is allowed (the normalised form at zero effective stress); a negative value is a profile
    // whose gradient runs below zero within the layer.
    if (!(su >= 0.0) || !std::isfinite(su))
        throw InputError("undrained strength su (kPa)", su, "at least 0 at every depth of the layer");
    return su;
}

}  // namespace wickgrid
