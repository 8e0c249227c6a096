#pragma once
// Undrained shear strength of a clay layer and its gain with consolidation.
//
// Two forms per layer:
// - profile: su = su_top + gradient·(depth below the layer top), the strength before loading; it
//   grows by gain_ratio·Δσ'v as the clay consolidates (the usual Δsu = (su/σ'v)·Δσ'v, common
//   practice; gain_ratio defaults to 0.22, Mesri's (1975) su/σ'p for soft clays, from memory);
// - normalised (Ladd & Foott 1974, SHANSEP): su = S·σ'v·(σ'p/σ'v)^m with S = su_ratio, σ'p the
//   preconsolidation pressure (OCR·σ'v0, raised to σ'v once the clay is loaded past it), m the
//   strength exponent (default 0.8, Ladd & Foott 1974, from memory). The gain follows from σ'v.
// Only the undrained (φ = 0) strength is modelled; the drained strength of the clay is not used.
#include <optional>

#include "wickgrid/defaults.hpp"

namespace wickgrid {

struct UndrainedStrength {
    // Profile form (both given) ...
    std::optional<double> su_top_kPa;
    std::optional<double> su_gradient_kPa_per_m;  // absent with su_top: 0
    // ... or the normalised form.
    std::optional<double> su_ratio;
    double strength_exponent = defaults::strength_exponent;  // m of the normalised form
    double gain_ratio = defaults::su_gain_ratio;     // Δsu/Δσ'v of the profile form (the su_ratio when one is given)
};

// Drained (effective-stress) strength of a clay layer, for the effective-stress stage check
// (stability.hpp): c′ (kPa, >= 0) and φ′ (degrees, 0 <= φ′ < 90).
struct EffectiveStrength {
    double c_prime_kPa = 0.0;
    double phi_prime_deg = 0.0;
};

// su (kPa) at a point: depth_in_layer_m below the layer's top, with initial effective stress
// sigma_v0_kPa, preconsolidation pressure sigma_p_kPa (>= σ'v0) and consolidated effective-stress
// increase delta_sigma_kPa (>= 0; a negative value is treated as no gain, the clay keeps its
// strength on unloading). Throws InputError for a negative strength or a form not given. Cost: one pow; thread-safe.
double undrained_strength_kPa(const UndrainedStrength& strength, double depth_in_layer_m, double sigma_v0_kPa,
                              double sigma_p_kPa, double delta_sigma_kPa);

// Checks one layer's strength: exactly one form, su_top > 0, su_ratio in (0, 2), m in [0, 1],
// gain ratio in [0, 2); throws InputError naming the key.
void validate_strength(const UndrainedStrength& strength);

}  // namespace wickgrid
