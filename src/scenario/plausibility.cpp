#include "plausibility.hpp"

#include "wickgrid/errors.hpp"
#include "wickgrid/units.hpp"

namespace wickgrid::scenario {

namespace {
// The usual ranges. Sources: "common practice" where no single published table holds the range;
// the smear ranges widen those reported by Hansbo (1987) and Holtz et al. (1991) (ds ≈ 2–3 dm,
// kh/ks ≈ 2–5) to what a designer would still accept without comment.
struct UsualRange {
    double low;
    double high;
    const char* unit;
    const char* source;
    const char* likely_cause;
};
constexpr UsualRange coefficient_range{0.1, 100.0, "m²/year", "common practice", "a value in m²/s or m²/day?"};
constexpr UsualRange smear_permeability_range{1.0, 10.0, "", "Hansbo 1987; Holtz et al. 1991; widened by common practice",
                                              "kh/ks is the ratio of undisturbed to smeared permeability"};
constexpr UsualRange smear_diameter_range{1.0, 6.0, "", "Hansbo 1987; Holtz et al. 1991; widened by common practice",
                                          "ds/dm is the smear zone's diameter over the mandrel's"};
constexpr double least_usual_discharge_m3_per_year = 10.0;  // common practice
constexpr UsualRange fill_height_range{0.0, 20.0, "m", "common practice (fills and preloads on soft clay rarely exceed 10–15 m)",
                                       "a height in feet, or a load given as a height?"};
constexpr UsualRange spacing_range{0.5, 5.0, "m", "common practice (band drains are usually 1–3 m apart)",
                                   "a spacing in feet or centimetres?"};

std::string place(const Scenario& s, const std::string& key) {
    const auto mark = s.mark_of(key);
    return s.file + (mark ? ":" + std::to_string(mark->line) + ":" + std::to_string(mark->column) : "") + ": " + key;
}

void check(std::vector<std::string>& out, const Scenario& s, const std::string& key, double value, const UsualRange& r) {
    if (value >= r.low && value <= r.high) return;
    const std::string unit = *r.unit ? std::string(" ") + r.unit : "";
    out.push_back(place(s, key) + " = " + format_value(value) + unit + " is outside the usual " + format_value(r.low) + "–" +
                  format_value(r.high) + unit + " (" + r.source + "): " + r.likely_cause);
}

void check_coefficients(std::vector<std::string>& out, const Scenario& s) {
    const Ground& g = s.site.ground;
    auto year = [](double per_second) { return units::per_second_to_per_year(per_second); };
    if (g.cv_m2_per_s && s.mark_of("clay.cv_m2_per_year")) check(out, s, "clay.cv_m2_per_year", year(*g.cv_m2_per_s), coefficient_range);
    if (g.ch_m2_per_s && s.mark_of("clay.ch_m2_per_year")) check(out, s, "clay.ch_m2_per_year", year(*g.ch_m2_per_s), coefficient_range);
    if (!g.profile) return;
    for (std::size_t i = 0; i < g.profile->layers.size(); ++i) {
        const auto& layer = g.profile->layers[i];
        const std::string path = "clay.layers[" + std::to_string(i) + "].";
        if (layer.cv_m2_per_s) check(out, s, path + "cv_m2_per_year", year(*layer.cv_m2_per_s), coefficient_range);
        if (layer.ch_m2_per_s) check(out, s, path + "ch_m2_per_year", year(*layer.ch_m2_per_s), coefficient_range);
    }
}

void check_drains(std::vector<std::string>& out, const Scenario& s) {
    const Installation& in = s.site.installation;
    for (std::size_t i = 0; i < s.site.products.size(); ++i) {
        const std::string path = "drains[" + std::to_string(i) + "]";
        const double qw = units::per_second_to_per_year(s.site.products[i].discharge_capacity_m3_per_s);
        if (qw < least_usual_discharge_m3_per_year)
            out.push_back(place(s, path + ".discharge_capacity_m3_per_year") + " = " + format_value(qw) +
                          " m³/year is below the usual least of " + format_value(least_usual_discharge_m3_per_year) +
                          " m³/year (common practice): a value in m³/s or m³/day, or a drain that has lost its core?");
        const auto& width = s.drains[i].width_m;
        const double mandrel = s.mandrel_width_m.value_or(in.mandrel_diameter_m);
        if (width && *width > mandrel)
            out.push_back(place(s, path + ".width_mm") + " = " + format_value(*width * 1000.0) + " mm is wider than the mandrel (" +
                          (s.mandrel_width_m ? "installation.mandrel_width_mm" : "installation.mandrel_diameter_mm") + " = " +
                          format_value(mandrel * 1000.0) + " mm): a drain is driven inside its mandrel; check the product and "
                          "the mandrel");
    }
}
}  // namespace

std::vector<std::string> plausibility_warnings(const Scenario& s) {
    std::vector<std::string> out;
    check_coefficients(out, s);
    check(out, s, "installation.smear_permeability_ratio", s.site.installation.smear_permeability_ratio, smear_permeability_range);
    check(out, s, "installation.smear_diameter_ratio", s.site.installation.smear_diameter_ratio, smear_diameter_range);
    check_drains(out, s);
    if (const auto h = final_fill_height_m(s.site))
        check(out, s, s.site.embankment && s.site.embankment->height_m ? "embankment.height_m" : "loading.stages", *h,
              fill_height_range);
    check(out, s, "spacing.min_m", s.site.range.bounds.min_m, spacing_range);
    check(out, s, "spacing.max_m", s.site.range.bounds.max_m, spacing_range);
    return out;
}

}  // namespace wickgrid::scenario
