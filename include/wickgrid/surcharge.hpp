#pragma once
// Surcharge design by the classic preloading criterion: at removal, the settlement under the
// permanent load plus surcharge equals the final primary settlement under the permanent load
// alone (Johnson 1970, from memory as the usual reference). Rebound on removal is ignored. With
// offset_secondary, the surcharge is sized instead against the site's residual criterion by the
// very model `design` evaluates: the primary settlement still to come after the deadline plus the
// secondary compression over the service period, reduced by the over-consolidation the surcharge
// leaves (secondary.hpp, Bjerrum 1967), equals the limit; so a design of the sized surcharge meets
// the criterion it was sized for.
#include "wickgrid/cell_model.hpp"

namespace wickgrid {

struct SurchargeResult {
    double pressure_kPa = 0.0;
    double start_s = 0.0;
    double end_s = 0.0;
    double removal_s = 0.0;
    double final_m = 0.0;                  // final primary settlement under the permanent load
    double settlement_at_removal_m = 0.0;  // under permanent + surcharge, at removal
    bool needed = true;                    // false: the permanent load alone reaches final by removal
    // With offset_secondary: the secondary compression over the service period that the surcharge
    // removes (without it − with it), and the residual at the deadline with it, split.
    double secondary_offset_m = 0.0;
    std::optional<CellModel::Residual> residual;
};

// One drain product × pattern × spacing on a site; every settlement comes from the site's cell model
// with the surcharge placed in its load history.
struct SurchargeCell {
    const Site& site;
    const DrainProductSpec& product;
    Pattern pattern;
    double spacing_m;
    // Size against the site's residual criterion (deadline, service period, limit), secondary
    // compression included; the site must give one.
    bool offset_secondary = false;
};

// The surcharge pressure for removal at timing.removal_s (timing.pressure_kPa is ignored). Throws
// InputError without a settlement model (or, offsetting secondary compression, without a residual
// criterion with a service period), EvaluationError when no surcharge below 5000 kPa does it.
SurchargeResult surcharge_for_removal(const SurchargeCell& cell, const Surcharge& timing);

// The removal time for the surcharge given in timing (timing.removal_s is ignored). Throws
// EvaluationError when the surcharge cannot reach the final settlement within the search horizon.
SurchargeResult removal_for_surcharge(const SurchargeCell& cell, const Surcharge& timing);

}  // namespace wickgrid
