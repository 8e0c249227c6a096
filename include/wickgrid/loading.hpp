#pragma once
// Time-dependent loading by linear superposition: each load increment starts the step response of
// the unit cell at its own time; a ramp spreads the increment evenly over its duration.
#include <functional>
#include <optional>
#include <vector>

namespace wickgrid {

// One increment of load: applied from start_s to end_s (end_s == start_s: instantaneous).
struct LoadStage {
    double start_s = 0.0;
    double end_s = 0.0;
    double pressure_kPa = 0.0;
};

// A temporary surcharge, placed like a stage and removed at removal_s.
struct Surcharge {
    double start_s = 0.0;
    double end_s = 0.0;
    double removal_s = 0.0;
    double pressure_kPa = 0.0;
};

// Vacuum applied through the drains from start_s and released at end_s: pressure_kPa below
// atmospheric at the drain head, falling linearly along the drain to tip_ratio × pressure at its tip
// (the linear distribution of Indraratna, Sathananthan, Rujikiatkamjorn & Balasubramaniam 2005).
struct VacuumLoad {
    double start_s = 0.0;
    double end_s = 0.0;
    double pressure_kPa = 0.0;  // 0 < p <= 100 (at most one atmosphere)
    double tip_ratio = 1.0;     // 0 <= k1 <= 1
    // The vacuum at time t (kPa, >= 0): on for start < t <= end.
    double pressure_at_kPa(double time_s) const noexcept {
        return time_s > start_s && time_s <= end_s ? pressure_kPa : 0.0;
    }
};

struct LoadHistory {
    std::vector<LoadStage> stages;  // the permanent load (may be empty when a vacuum is given)
    std::optional<Surcharge> surcharge;
    std::optional<VacuumLoad> vacuum;

    double permanent_kPa() const;
    double permanent_at_kPa(double time_s) const;  // applied so far (ramps pro rata)
    double applied_at_kPa(double time_s) const;    // the permanent load so far plus the surcharge while it is on
    double end_of_construction_s() const;          // when the last permanent stage is complete
};

void validate_load_history(const LoadHistory& history);

// One increment of the response: weight·(mean of U(t − τ) over the ramp [start, end]).
struct ResponseIncrement {
    double start_s = 0.0;
    double end_s = 0.0;
    double weight = 0.0;
};

// The step response U(t) for t >= 0 (0 at t = 0, rising to 1).
using StepResponse = std::function<double(double time_s)>;

// Σ weight·(ramp-averaged response) at time t. Ramps are integrated by adaptive Gauss–Kronrod in
// √(t − τ), which removes the square-root start of vertical consolidation (Olson 1977 shows the
// closed form for Terzaghi's case; the tests compare against it).
double superpose(const StepResponse& response, const std::vector<ResponseIncrement>& increments, double time_s);

// The ramp-averaged response alone: (1/(b − a))∫_a^b U(t − τ)dτ with U = 0 for negative times.
double ramp_response(const StepResponse& response, double start_s, double end_s, double time_s);

}  // namespace wickgrid
