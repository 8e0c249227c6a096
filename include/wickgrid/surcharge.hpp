#pragma once
// Surcharge design by the classic preloading criterion: at removal, the settlement under the
// permanent load plus surcharge equals the final primary settlement under the permanent load
// alone (Johnson 1970, from memory as the usual reference). Rebound on removal is ignored. With
// offset_secondary_service_s, the surcharge also offsets secondary compression: the settlement at
// removal equals the final primary settlement plus the secondary compression under the permanent
// load from the end of primary to removal + service period (the extension of the same criterion
// that Johnson 1970 discusses; common practice), so that the settlement left after removal over
// the service life is compensated in advance.
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
    double secondary_offset_m = 0.0;       // secondary compression offset (0 unless asked)
};

// One drain product × pattern × spacing on a site; every settlement comes from the site's cell model
// with the surcharge placed in its load history.
struct SurchargeCell {
    const Site& site;
    const DrainProductSpec& product;
    Pattern pattern;
    double spacing_m;
    std::optional<double> offset_secondary_service_s = std::nullopt;  // service period after removal (s)
};

// The surcharge pressure for removal at timing.removal_s (timing.pressure_kPa is ignored). Throws
// InputError without a settlement model, EvaluationError when no surcharge below 5000 kPa does it.
SurchargeResult surcharge_for_removal(const SurchargeCell& cell, const Surcharge& timing);

// The removal time for the surcharge given in timing (timing.removal_s is ignored). Throws
// EvaluationError when the surcharge cannot reach the final settlement within the search horizon.
SurchargeResult removal_for_surcharge(const SurchargeCell& cell, const Surcharge& timing);

}  // namespace wickgrid
