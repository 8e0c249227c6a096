#pragma once
#include <cstddef>
#include <vector>
// Combining vertical and radial flow, and averaging the radial degree over the drain length.

namespace wickgrid {

// Carrillo (1942): 1 − U = (1 − Uv)(1 − Ur), for degrees in [0, 1]; throws InputError naming a
// degree outside it. Cost O(1); thread-safe.
double carrillo(double uv, double ur);
// The same rule unchecked, for the fast paths whose degrees lie in [0, 1] by construction: the one
// place the rule is written.
constexpr double carrillo_combined(double uv, double ur) noexcept { return 1.0 - (1.0 - uv) * (1.0 - ur); }

// Largest ratio of the well-resistance term π·kh·l²/qw to the smear term μs taken as a design input
// (realistic drains stay below about 100; far beyond it an input is wrong). Above it the depth
// average throws InputError naming both.
inline constexpr double max_well_resistance_ratio = 1e4;

// Equal-strain radial degree averaged over the drain length: the mean over z in [0, l] of
// 1 − exp(−8·Th/μ(z)), μ(z) = μs + w·z·(2l − z), w = π·kh/qw (Hansbo 1981), by Gauss–Legendre in z.
// l is the length from the nearest outlet (the drain length with one outlet, half of it with two).
double degree_radial_depth_averaged(double th, double mu_smear, double well_per_m2, double l_m);

// The same average as a rule built once for a drain (μs, w, l fixed) and evaluated at many Th:
// nodes graded towards the outlet, where μ(z) has a complex pole close to z = 0 when well
// resistance dominates smear (w·l² ≫ μs). The design rule picks 7 to 15 Gauss–Legendre nodes
// per panel from the pole distance; the reference rule takes 20 per panel.
class DepthAverageRule {
public:
    enum class Accuracy { design, reference };
    DepthAverageRule(double mu_smear, double well_per_m2, double l_m, Accuracy accuracy = Accuracy::design);
    double degree(double th) const;  // no validation or allocation: Th >= 0 is the caller's duty
    std::size_t nodes() const noexcept { return weight_.size(); }
    const std::vector<double>& weights() const noexcept { return weight_; }
    const std::vector<double>& well_terms() const noexcept { return well_term_; }  // w·l²·ζ(2 − ζ)

private:
    std::vector<double> eight_over_mu_;
    std::vector<double> weight_;
    std::vector<double> well_term_;
};

// The node layout behind DepthAverageRule, written into caller-owned vectors (cleared first, so
// their capacity is reused by repeated searches): weights summing to 1, and w·l²·ζ(2 − ζ) at each node.
void depth_average_nodes(double mu_smear, double well_per_m2, double l_m, DepthAverageRule::Accuracy accuracy,
                         std::vector<double>& weights, std::vector<double>& well_terms);

// Mean of μ(z) over [0, l]: μs + w·2l²/3 (reported beside the degree; the degree itself averages
// Ur(z), not μ).
double mu_depth_mean(double mu_smear, double well_per_m2, double l_m);

}  // namespace wickgrid
