#pragma once
// Secondary compression (creep) of a layered profile under the plan's load history, one model for
// every command: Σ Cα/(1 + e0)·H·log10 of time from the end of primary consolidation, and, after a
// surcharge is removed, from the equivalent age the over-consolidation it left gives each layer.
//
// The equivalent age follows Bjerrum's (1967) time lines in e–log σ′: lines of equal age are
// parallel (slope Cc) and Cα apart per log cycle of age, so a layer unloaded along Cr from the
// greatest effective stress σ′max to the final σ′f lies on the line of age
//     te = tr·OCR^((Cc − Cr)/Cα),   OCR = σ′max/σ′f,
// tr the removal time (the layer crept on the line of age tr under the surcharge). Creep then goes on
// from te: Δe = Cα·log10((te + t − tr)/te) at time t after removal (the derivation from the time lines
// is standard; from memory, as presented by Bjerrum 1967). With OCR ≤ 1 (the surcharge came off
// before the clay passed its final state) nothing changes; as OCR → 1 the two laws meet.
#include <optional>
#include <vector>

#include "wickgrid/site.hpp"

namespace wickgrid {

// One layer that gives Cα.
struct SecondaryLayer {
    std::size_t layer = 0;          // 0-based index in the profile
    double per_cycle_m = 0.0;       // Cα/(1 + e0)·H, metres per log cycle of time
    double c_alpha = 0.0;           // Cα
    // (Cc − Cr)/Cα: the ageing exponent; absent for a layer without Cc and Cr (no reduction).
    std::optional<double> age_exponent;
    double sigma_v0_kPa = 0.0;      // initial effective stress at mid-layer
    double permanent_kPa = 0.0;     // the permanent load's stress increase at mid-layer
};

// The creep of a site: its layers with Cα, and the surcharge removal, if the plan removes one.
struct SecondaryModel {
    std::vector<SecondaryLayer> layers;
    std::optional<double> removal_s;
    double per_cycle_m() const;  // Σ Cα/(1 + e0)·H
};

// The site's creep model; nullopt when no layer gives Cα. Cost O(layers × slopes of the section).
std::optional<SecondaryModel> secondary_model(const Site& site);

// The over-consolidation ratio a removed surcharge leaves in a layer: σ′max/σ′f with
// σ′max = σ′v0 + U(tr)·Δσ_permanent (U the unit cell's degree at removal relative to the permanent
// load, above 1 when the surcharge over-compressed) and σ′f = σ′v0 + Δσ_permanent. Thread-safe.
double surcharge_ocr(const SecondaryLayer& layer, double degree_at_removal);

// Bjerrum's (1967) equivalent age after removal: tr·OCR^exponent (tr when OCR ≤ 1). Throws
// InputError for a removal time that is not positive or an exponent below 0.
double equivalent_age_s(double removal_s, double ocr, double age_exponent);

// Secondary compression (m) from from_s to to_s (from ≤ to): tp the end of primary (none: 0),
// degree_at_removal the unit cell's degree at the removal (used only when the model has one).
double secondary_between_m(const SecondaryModel& model, double from_s, double to_s, std::optional<double> tp_s,
                           double degree_at_removal);

}  // namespace wickgrid
