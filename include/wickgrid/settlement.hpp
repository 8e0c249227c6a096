#pragma once
// Primary consolidation settlement: one-dimensional e–log σ' (normally and over-consolidated
// branches) or a constant mv per sublayer, summed over slices; and the settlement–time history
// under a load history with an optional surcharge.
#include <optional>
#include <vector>

#include "wickgrid/defaults.hpp"
#include "wickgrid/loading.hpp"
#include "wickgrid/strength.hpp"

namespace wickgrid {

struct SoilLayer {
    double thickness_m = 0.0;
    double unit_weight_kN_per_m3 = 0.0;  // bulk unit weight
    // e–log σ' parameters (all four, with exactly one of: the preconsolidation pressure, an OCR, or a
    // pre-overburden pressure POP, σ'p = σ'v0 + POP, the usual way to describe a crust) ...
    std::optional<double> e0, cc, cr, preconsolidation_kPa, ocr, pop_kPa;
    // ... or a constant coefficient of volume compressibility.
    std::optional<double> mv_m2_per_kN;
    // Consolidation coefficients of this layer (numerical method); absent: the clay's.
    std::optional<double> cv_m2_per_s, ch_m2_per_s;
    // Secondary compression index Cα (Δe per log cycle of time; e–log layers), given or as Cα/Cc
    // (Mesri & Godlewski 1977) times cc; absent: no secondary compression counted.
    std::optional<double> c_alpha;
    // Undrained strength (stage stability); absent: the layer's strength is not given.
    std::optional<UndrainedStrength> strength;
    // Drained strength (the effective-stress stage check); absent: that check is not made.
    std::optional<EffectiveStrength> effective_strength;
};

struct SoilProfile {
    std::vector<SoilLayer> layers;
    double groundwater_depth_m = 0.0;  // below the top of the clay
    int slices_per_layer = defaults::slices_per_layer;
};

void validate_profile(const SoilProfile& profile);

double profile_thickness_m(const SoilProfile& profile);

struct SliceState {
    double depth_m;          // slice centre below the top of the clay
    double thickness_m;
    double sigma_v0_kPa;     // initial vertical effective stress
    double sigma_p_kPa;      // preconsolidation pressure (σ'v0 for mv layers)
};

std::vector<SliceState> slices(const SoilProfile& profile);

// The state before loading at a depth z (m below the top of the clay, within the profile; below its
// base the last layer continues): σ'v0 from the unit weights and the groundwater depth, and σ'p from
// the layer's preconsolidation pressure or OCR (σ'v0 for mv layers). slices() takes it at each
// slice centre. Cost: O(layers).
SliceState initial_state(const SoilProfile& profile, double depth_m);

// Primary settlement (m) of the whole profile under a uniform increase of vertical stress.
double ultimate_settlement_m(const SoilProfile& profile, double load_kPa);

// One slice by e–log σ': Δe = Cr·log(σ'p/σ'0) + Cc·log(σ'f/σ'p) (each branch where it applies),
// settlement Δe/(1 + e0)·H; or mv·Δσ·H.
double slice_settlement_m(const SoilLayer& layer, const SliceState& slice, double load_kPa);

// Secant coefficient of volume compressibility of one layer under a uniform load increase (m²/kN):
// the layer's settlement by its slices divided by load × thickness; a given mv is returned as is.
// Throws InputError for a layer index out of range or a load that is not positive.
double secant_mv_m2_per_kN(const SoilProfile& profile, std::size_t layer, double load_kPa);

// Settlement against time under a load history: increments of ultimate settlement from the
// cumulative load, each with the unit cell's step response (linear superposition). After the
// surcharge is removed the settlement is held at its value at removal until the permanent-load
// history catches up (rebound and secondary compression are ignored).
// The superposed increments of a load history: each stage (and the surcharge) weighted by the
// ultimate settlement it adds, ultimate(q) the ultimate settlement (m) under a total load q (kPa).
// Throws InputError for an invalid history or a final settlement <= 0.
struct LoadIncrements {
    std::vector<ResponseIncrement> permanent;  // the permanent stages, by start
    std::vector<ResponseIncrement> all;        // with the surcharge
    std::optional<double> removal_s;           // surcharge removal
    double final_m = 0.0;                      // ultimate settlement under the permanent load
};
LoadIncrements load_increments(const std::function<double(double load_kPa)>& ultimate, const LoadHistory& history);

// Settlement at time t: Σ over `all` until removal, then max(all at removal, permanent at t).
class SettlementHistory {
public:
    // ultimate(q) gives the ultimate settlement for a total load q (kPa); for degree-only use pass
    // the identity, so that settlement is proportional to load.
    SettlementHistory(std::function<double(double load_kPa)> ultimate, const LoadHistory& history,
                      StepResponse response);

    double settlement_m(double time_s) const;
    double final_m() const noexcept { return final_m_; }  // ultimate under the permanent load
    double degree(double time_s) const { return settlement_m(time_s) / final_m_; }
    // Settlement still to come after time t under the permanent load: until t + period, or to the
    // end (period absent). Negative values (a surcharge that over-compressed) are reported as is.
    double residual_m(double time_s, std::optional<double> period_s) const;

private:
    double permanent_m(double time_s) const;
    double loaded_m(double time_s) const;

    StepResponse response_;
    std::vector<ResponseIncrement> permanent_;  // permanent stages alone
    std::vector<ResponseIncrement> all_;        // permanent stages and the surcharge
    std::optional<double> removal_s_;
    double final_m_ = 0.0;
};

}  // namespace wickgrid
