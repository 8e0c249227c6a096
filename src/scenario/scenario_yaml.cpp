// Scenario files (YAML, schema 1) → Scenario, with every error located in the file.
#include <yaml-cpp/yaml.h>

#include <cmath>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <set>
#include <sstream>

#include "scenario.hpp"
#include "file_digest.hpp"
#include "plausibility.hpp"
#include "suggest.hpp"
#include "text_encoding.hpp"
#include "wickgrid/errors.hpp"
#include "wickgrid/permeability.hpp"
#include "wickgrid/cell_model.hpp"
#include "wickgrid/units.hpp"

namespace wickgrid::scenario {

ScenarioError::ScenarioError(std::string file, Mark mark, std::string key_path, std::string message)
    : std::runtime_error(file + ":" + std::to_string(mark.line) + ":" + std::to_string(mark.column) + ": " +
                         (key_path.empty() ? std::string() : key_path + ": ") + message),
      file_(std::move(file)),
      mark_(mark),
      key_path_(std::move(key_path)),
      message_(std::move(message)) {}

namespace {

// Allowed range of a number, written out for the error message.
struct Range {
    double low;
    bool low_inclusive;
    double high;
    bool high_inclusive;
    const char* unit;

    bool contains(double v) const {
        const bool above = low_inclusive ? v >= low : v > low;
        const bool below = high_inclusive ? v <= high : v < high;
        return std::isfinite(v) && above && below;
    }
    std::string describe() const {
        std::string text;
        const bool bounded_above = std::isfinite(high);
        if (bounded_above)
            text = "between " + format_value(low) + " and " + format_value(high) +
                   (low_inclusive == high_inclusive
                        ? (low_inclusive ? ", both included" : ", both excluded")
                        : (low_inclusive ? " (" + format_value(high) + " excluded)"
                                         : " (" + format_value(low) + " excluded)"));
        else
            text = (low_inclusive ? "at least " : "greater than ") + format_value(low);
        if (*unit) text += std::string(" ") + unit;
        return text;
    }
};

constexpr double inf = std::numeric_limits<double>::infinity();
constexpr Range positive(const char* unit) { return {0.0, false, inf, false, unit}; }
constexpr Range non_negative(const char* unit) { return {0.0, true, inf, false, unit}; }
// A derived quantity in a message, to three significant digits (a difference of days read from the
// file carries rounding noise in its last digits).
std::string three_digits(double value) {
    char buffer[32];
    std::snprintf(buffer, sizeof buffer, "%.3g", value);
    return buffer;
}

// Every day of the plan lies within the record the engine computes (defaults::search_horizon_years):
// a day beyond it is refused at its key, in days, before it can become an infinite time in seconds.
constexpr double horizon_days = defaults::search_horizon_years * units::days_per_year;
constexpr Range day_within_horizon(double lo, bool lo_inclusive, const char* unit) {
    return {lo, lo_inclusive, horizon_days, true, unit};
}
// mv above 0.1 m²/kN is softer than any clay (a value in the wrong unit); above it the numerical
// cell's time scales part by many orders of magnitude.
constexpr Range compressibility{0.0, false, 0.1, true, "m²/kN (greater than 0; above 0.1 check the unit)"};

Mark mark_of(const YAML::Node& node) {
    const YAML::Mark m = node.Mark();
    if (m.is_null()) return {0, 0};
    return {m.line + 1, m.column + 1};
}

class Reader {
public:
    Reader(std::string file, std::map<std::string, Mark>& marks) : file_(std::move(file)), marks_(marks) {}

    [[noreturn]] void fail(const YAML::Node& node, const std::string& path, const std::string& message) const {
        throw ScenarioError(file_, mark_of(node), path, message);
    }
    [[noreturn]] void fail_at(Mark mark, const std::string& path, const std::string& message) const {
        throw ScenarioError(file_, mark, path, message);
    }

    void expect_map(const YAML::Node& node, const std::string& path) const {
        if (!node.IsMap()) fail(node, path, "must be a mapping of keys to values");
    }

    // Unknown and repeated keys are errors; the message suggests the nearest known key.
    void allow_keys(const YAML::Node& map, const std::string& path, const std::vector<std::string>& keys) const {
        std::set<std::string> seen;
        for (auto it = map.begin(); it != map.end(); ++it) {
            const std::string key = it->first.as<std::string>();
            const std::string where = join(path, key);
            if (!seen.insert(key).second) fail(it->first, where, "key given twice");
            if (std::find(keys.begin(), keys.end(), key) != keys.end()) continue;
            std::string message = "unknown key '" + key + "'";
            if (auto best = closest(key, keys)) message += "; did you mean '" + *best + "'?";
            else message += "; allowed here: " + list(keys);
            fail(it->first, where, message);
        }
    }

    YAML::Node required(const YAML::Node& map, const std::string& path, const std::string& key) const {
        const YAML::Node node = map[key];
        if (!node) fail(map, join(path, key), "missing key '" + key + "'" + (path.empty() ? "" : " in '" + path + "'"));
        remember(join(path, key), node);
        return node;
    }

    double number(const YAML::Node& node, const std::string& path, const Range& range) const {
        remember(path, node);
        if (!node.IsScalar()) fail(node, path, "must be a number, " + range.describe());
        double value = 0.0;
        try {
            value = node.as<double>();
        } catch (const YAML::BadConversion&) {
            fail(node, path, "'" + node.Scalar() + "' is not a number; it must be " + range.describe());
        }
        if (!range.contains(value))
            fail(node, path, format_value(value) + " is not allowed: it must be " + range.describe());
        return value;
    }

    double number(const YAML::Node& map, const std::string& path, const std::string& key, const Range& range) const {
        return number(required(map, path, key), join(path, key), range);
    }

    std::optional<double> optional_number(const YAML::Node& map, const std::string& path, const std::string& key,
                                          const Range& range) const {
        if (!map[key]) return std::nullopt;
        return number(map[key], join(path, key), range);
    }

    std::string text(const YAML::Node& node, const std::string& path) const {
        remember(path, node);
        if (!node.IsScalar() || node.Scalar().empty()) fail(node, path, "must be a non-empty text");
        // Names reach terminals, tables, JSON, HTML and SVG: control characters have no place there.
        for (const char c : node.Scalar())
            if (static_cast<unsigned char>(c) < 0x20 || c == 0x7F)
                fail(node, path, "must not contain control characters (line breaks, tabs, escape codes)");
        return node.Scalar();
    }

    // true or false (YAML's other spellings of a yes/no are refused: one way to write it).
    bool flag(const YAML::Node& node, const std::string& path) const {
        remember(path, node);
        if (!node.IsScalar() || (node.Scalar() != "true" && node.Scalar() != "false"))
            fail(node, path, "must be true or false");
        return node.Scalar() == "true";
    }

    // One of the names of a choice table; returns its value.
    template <class E, std::size_t N>
    E choice(const YAML::Node& node, const std::string& path, const std::array<Named<E>, N>& table) const {
        const std::vector<std::string> names = names_of(table);
        remember(path, node);
        if (!node.IsScalar()) fail(node, path, "must be one of " + list(names));
        const std::string value = node.Scalar();
        if (const auto found = value_of(table, value)) return *found;
        std::string message = "'" + value + "' is not allowed: it must be one of " + list(names);
        if (auto best = closest(value, names)) message += "; did you mean '" + *best + "'?";
        fail(node, path, message);
    }

    void remember(const std::string& path, const YAML::Node& node) const { marks_[path] = mark_of(node); }

    static std::string join(const std::string& path, const std::string& key) {
        return path.empty() ? key : path + "." + key;
    }
    static std::string list(const std::vector<std::string>& names) {
        std::string out;
        for (std::size_t i = 0; i < names.size(); ++i) out += (i ? ", " : "") + names[i];
        return out;
    }
    const std::string& file() const { return file_; }

private:
    std::string file_;
    std::map<std::string, Mark>& marks_;
};

const std::vector<std::string> top_keys{"schema", "title", "target", "clay", "drains", "drain_length_m",
                                        "drain_outlets", "installation", "patterns", "spacing", "studies",
                                        "uncertain", "fill_unit_weight_kN_per_m3", "loading", "method",
                                        "numerical_mesh", "project", "series_terms", "embankment", "calibration", "rank_by",
                                        "schedule"};

void read_target(const Reader& r, const YAML::Node& root, Scenario& s) {
    const YAML::Node node = r.required(root, "", "target");
    r.expect_map(node, "target");
    r.allow_keys(node, "target", {"degree", "deadline_days", "residual_settlement_mm", "service_days"});
    if (node["degree"] && node["residual_settlement_mm"])
        r.fail(node["residual_settlement_mm"], "target.residual_settlement_mm",
               "give either 'degree' or 'residual_settlement_mm' as the design criterion, not both");
    Criterion& c = s.site.criterion;
    if (node["residual_settlement_mm"]) {
        ResidualSettlementLimit limit;
        limit.limit_m = units::mm_to_m(r.number(node, "target", "residual_settlement_mm", non_negative("mm")));
        if (const auto days = r.optional_number(node, "target", "service_days", day_within_horizon(0.0, false, "days (within 100 years)")))
            limit.service_s = units::days_to_seconds(*days);
        c.rule = limit;
    } else {
        if (node["service_days"])
            r.fail(node["service_days"], "target.service_days", "goes with 'residual_settlement_mm' only");
        c.rule = DegreeTarget{r.number(node, "target", "degree", {0.0, false, 1.0, false, ""})};
    }
    c.deadline_s = units::days_to_seconds(r.number(node, "target", "deadline_days", day_within_horizon(0.0, false, "days (within 100 years)")));
}

// The undrained strength of one layer (stage checks): the profile form or the normalised form.
std::optional<UndrainedStrength> read_strength(const Reader& r, const YAML::Node& l, const std::string& path,
                                               double thickness_m) {
    if (l["su_top_kPa"] && l["su_ratio"])
        r.fail(l["su_ratio"], path + ".su_ratio", "give either 'su_top_kPa' (with a gradient) or 'su_ratio', not both");
    const auto only_with = [&](const char* key, const char* form) {
        if (l[key]) r.fail(l[key], path + "." + key, std::string("goes with '") + form + "' only");
    };
    UndrainedStrength st;
    if (l["su_top_kPa"]) {
        only_with("strength_exponent", "su_ratio");
        st.su_top_kPa = r.number(l, path, "su_top_kPa", positive("kPa"));
        st.su_gradient_kPa_per_m = r.optional_number(l, path, "su_gradient_kPa_per_m", {-inf, false, inf, false, "kPa/m"});
        st.gain_ratio = r.optional_number(l, path, "su_gain_ratio", {0.0, true, 2.0, false, ""}).value_or(defaults::su_gain_ratio);
        const double at_base = *st.su_top_kPa + st.su_gradient_kPa_per_m.value_or(0.0) * thickness_m;
        if (!(at_base > 0.0))
            r.fail(l["su_gradient_kPa_per_m"], path + ".su_gradient_kPa_per_m",
                   format_value(*st.su_gradient_kPa_per_m) + " kPa/m takes su to " + format_value(at_base) +
                       " kPa at the base of the layer; su must stay greater than 0");
        return st;
    }
    if (l["su_ratio"]) {
        only_with("su_gradient_kPa_per_m", "su_top_kPa");
        only_with("su_gain_ratio", "su_top_kPa");
        st.su_ratio = r.number(l, path, "su_ratio", {0.0, false, 2.0, false, ""});
        st.strength_exponent = r.optional_number(l, path, "strength_exponent", {0.0, true, 1.0, true, ""})
                                   .value_or(defaults::strength_exponent);
        st.gain_ratio = *st.su_ratio;
        return st;
    }
    for (const char* key : {"su_gradient_kPa_per_m", "su_gain_ratio", "strength_exponent"})
        if (l[key]) r.fail(l[key], path + "." + key, "needs 'su_top_kPa' or 'su_ratio' in the same layer");
    return std::nullopt;
}

void read_layers(const Reader& r, const YAML::Node& clay, Scenario& s) {
    const YAML::Node node = clay["layers"];
    r.remember("clay.layers", node);
    if (!node.IsSequence() || node.size() == 0) r.fail(node, "clay.layers", "must be a list of at least one layer");
    if (node.size() > defaults::max_layers)
        r.fail(node, "clay.layers", "lists " + std::to_string(node.size()) + " layers; at most " +
                                        std::to_string(defaults::max_layers) + " (merge thin layers of like properties)");
    SoilProfile profile;
    profile.groundwater_depth_m = r.optional_number(clay, "clay", "groundwater_depth_m", non_negative("m")).value_or(0.0);
    const double per_layer = r.optional_number(clay, "clay", "slices_per_layer", {1.0, true, 1000.0, true, "(whole number)"}).value_or(10.0);
    if (std::floor(per_layer) != per_layer) r.fail(clay["slices_per_layer"], "clay.slices_per_layer", "must be a whole number");
    profile.slices_per_layer = static_cast<int>(per_layer);
    for (std::size_t i = 0; i < node.size(); ++i) {
        const std::string path = "clay.layers[" + std::to_string(i) + "]";
        const YAML::Node l = node[i];
        r.remember(path, l);
        r.expect_map(l, path);
        r.allow_keys(l, path, {"thickness_m", "unit_weight_kN_per_m3", "e0", "cc", "cr", "preconsolidation_kPa", "ocr", "pop_kPa",
                               "mv_m2_per_kN", "cv_m2_per_year", "ch_m2_per_year", "su_top_kPa",
                               "su_gradient_kPa_per_m", "su_ratio", "strength_exponent", "su_gain_ratio", "c_alpha",
                               "c_alpha_over_cc", "c_prime_kPa", "phi_prime_deg"});
        SoilLayer layer;
        if (const auto cv = r.optional_number(l, path, "cv_m2_per_year", positive("m²/year")))
            layer.cv_m2_per_s = units::per_year_to_per_second(*cv);
        if (const auto ch = r.optional_number(l, path, "ch_m2_per_year", positive("m²/year")))
            layer.ch_m2_per_s = units::per_year_to_per_second(*ch);
        layer.thickness_m = r.number(l, path, "thickness_m", positive("m"));
        layer.unit_weight_kN_per_m3 = r.number(l, path, "unit_weight_kN_per_m3", positive("kN/m³"));
        layer.mv_m2_per_kN = r.optional_number(l, path, "mv_m2_per_kN", compressibility);
        if (layer.mv_m2_per_kN) {
            for (const char* key : {"e0", "cc", "cr", "preconsolidation_kPa", "ocr", "pop_kPa"})
                if (l[key]) r.fail(l[key], path + "." + key, "a layer takes either mv_m2_per_kN or e0/cc/cr, not both");
        } else {
            layer.e0 = r.number(l, path, "e0", positive(""));
            layer.cc = r.number(l, path, "cc", positive(""));
            layer.cr = r.number(l, path, "cr", non_negative(""));
            if (*layer.cr > *layer.cc) r.fail(l["cr"], path + ".cr", "must not exceed cc (recompression is stiffer than virgin compression)");
            // Exactly one description of the preconsolidation: σ'p itself, OCR = σ'p/σ'v0, or POP = σ'p − σ'v0.
            const char* forms[] = {"preconsolidation_kPa", "ocr", "pop_kPa"};
            const char* first = nullptr;
            for (const char* key : forms)
                if (l[key]) {
                    if (first)
                        r.fail(l[key], path + "." + key,
                               std::string("give one of 'preconsolidation_kPa', 'ocr' or 'pop_kPa', not both '") + first +
                                   "' and '" + key + "'");
                    first = key;
                }
            if (!first) r.fail(l, path, "missing key 'preconsolidation_kPa', 'ocr' or 'pop_kPa' in '" + path + "'");
            layer.preconsolidation_kPa = r.optional_number(l, path, "preconsolidation_kPa", positive("kPa"));
            layer.ocr = r.optional_number(l, path, "ocr", {1.0, true, inf, false, ""});
            layer.pop_kPa = r.optional_number(l, path, "pop_kPa", {0.0, true, 1000.0, true, "kPa (σ'p − σ'v0; 0 to 1000)"});
        }
        layer.strength = read_strength(r, l, path, layer.thickness_m);
        // Drained strength (the effective-stress stage check): both keys or neither.
        if (l["c_prime_kPa"] || l["phi_prime_deg"]) {
            if (!l["phi_prime_deg"]) r.fail(l["c_prime_kPa"], path + ".c_prime_kPa", "goes with 'phi_prime_deg' (give both)");
            if (!l["c_prime_kPa"]) r.fail(l["phi_prime_deg"], path + ".phi_prime_deg", "goes with 'c_prime_kPa' (give both)");
            layer.effective_strength = EffectiveStrength{r.number(l, path, "c_prime_kPa", non_negative("kPa")),
                                                         r.number(l, path, "phi_prime_deg", {0.0, true, 60.0, false, "degrees (below 60)"})};
        }
        if (l["c_alpha"] && l["c_alpha_over_cc"])
            r.fail(l["c_alpha_over_cc"], path + ".c_alpha_over_cc", "give either 'c_alpha' or 'c_alpha_over_cc', not both");
        for (const char* key : {"c_alpha", "c_alpha_over_cc"})
            if (l[key] && layer.mv_m2_per_kN)
                r.fail(l[key], path + "." + key, "needs an e–log layer (e0, cc, cr): secondary strain is Cα/(1 + e0)");
        if (const auto ca = r.optional_number(l, path, "c_alpha", {0.0, true, 1.0, false, "(Δe per log cycle of time; 0 to 1)"}))
            layer.c_alpha = *ca;
        if (const auto ratio = r.optional_number(l, path, "c_alpha_over_cc", {0.0, true, 0.2, true, "(Cα/Cc, 0 to 0.2)"}))
            layer.c_alpha = *ratio * *layer.cc;
        profile.layers.push_back(layer);
    }
    try {
        validate_profile(profile);
    } catch (const InputError& e) {
        r.fail(node, "clay.layers", e.what());
    }
    // A preconsolidation pressure below the in-situ stress would be under-consolidated clay.
    const auto all = slices(profile);
    for (std::size_t i = 0, k = 0; i < profile.layers.size(); ++i)
        for (int j = 0; j < profile.slices_per_layer; ++j, ++k)
            if (profile.layers[i].preconsolidation_kPa && *profile.layers[i].preconsolidation_kPa < all[k].sigma_v0_kPa - 1e-9) {
                const std::string path = "clay.layers[" + std::to_string(i) + "].preconsolidation_kPa";
                r.fail(node[i]["preconsolidation_kPa"], path,
                       format_value(*profile.layers[i].preconsolidation_kPa) +
                           " kPa is below the in-situ effective stress " + format_value(all[k].sigma_v0_kPa) +
                           " kPa at " + format_value(all[k].depth_m) + " m; under-consolidated clay is not supported");
            }
    s.site.ground.profile = profile;
    // The effective-stress check takes every layer or none.
    std::size_t given = 0;
    for (const SoilLayer& l : profile.layers) given += l.effective_strength ? 1 : 0;
    if (given > 0 && given < profile.layers.size())
        for (std::size_t i = 0; i < profile.layers.size(); ++i)
            if (!profile.layers[i].effective_strength)
                r.fail(node[i], "clay.layers[" + std::to_string(i) + "]",
                       "has no 'c_prime_kPa' and 'phi_prime_deg' while other layers do: the effective-stress stage check "
                       "needs them in every layer (or in none)");
}

void read_clay(const Reader& r, const YAML::Node& root, Scenario& s) {
    const YAML::Node node = r.required(root, "", "clay");
    r.expect_map(node, "clay");
    r.allow_keys(node, "clay", {"thickness_m", "cv_m2_per_year", "ch_m2_per_year", "mv_m2_per_kN", "kh_m_per_s",
                                "vertical_drainage", "layers", "groundwater_depth_m", "slices_per_layer"});
    if (node["layers"]) read_layers(r, node, s);
    Ground& g = s.site.ground;
    const auto& profile = g.profile;
    if (profile && !node["thickness_m"]) {
        g.thickness_m = profile_thickness_m(*profile);
        s.marks["clay.thickness_m"] = s.marks["clay.layers"];
    } else {
        g.thickness_m = r.number(node, "clay", "thickness_m", positive("m"));
    }
    if (profile && std::fabs(profile_thickness_m(*profile) - g.thickness_m) > 1e-9 * g.thickness_m)
        r.fail(node["thickness_m"], "clay.thickness_m",
               format_value(g.thickness_m) + " is not allowed: it must equal the sum of the layer thicknesses, " +
                   format_value(profile_thickness_m(*profile)) + " m");
    // With layers that all give their own cv and ch, the clay's are optional (a default for none).
    const auto every_layer = [&](auto member) {
        return profile && std::all_of(profile->layers.begin(), profile->layers.end(),
                                      [&](const SoilLayer& l) { return (l.*member).has_value(); });
    };
    const bool layers_cv = every_layer(&SoilLayer::cv_m2_per_s), layers_ch = every_layer(&SoilLayer::ch_m2_per_s);
    const auto coefficient = [&](const char* key, bool optional) -> std::optional<double> {
        const auto v = optional ? r.optional_number(node, "clay", key, positive("m²/year"))
                                : std::optional<double>(r.number(node, "clay", key, positive("m²/year")));
        return v ? std::optional<double>(units::per_year_to_per_second(*v)) : std::nullopt;
    };
    g.cv_m2_per_s = coefficient("cv_m2_per_year", layers_cv);
    g.ch_m2_per_s = coefficient("ch_m2_per_year", layers_ch);
    g.mv_m2_per_kN = r.optional_number(node, "clay", "mv_m2_per_kN", compressibility);
    g.kh_m_per_s = r.optional_number(node, "clay", "kh_m_per_s", positive("m/s"));
    g.kh_source = g.kh_m_per_s ? KhSource::given : KhSource::from_ch_and_mv;
    // kh is needed unless every layer gives its own ch and storage (the numerical cell then takes
    // kh = ch·mv·γw layer by layer).
    if (!g.kh_m_per_s && !g.mv_m2_per_kN && !(layers_ch && profile))
        r.fail(node, "clay", "missing key 'mv_m2_per_kN' or 'kh_m_per_s' in 'clay' (one is needed for kh)");
    if (!g.kh_m_per_s && !g.mv_m2_per_kN) g.kh_source = KhSource::given;
    g.drainage = r.choice(r.required(node, "clay", "vertical_drainage"), "clay.vertical_drainage", drainage_names);
}

std::pair<DrainEntry, DrainProductSpec> read_drain(const Reader& r, const YAML::Node& node, const std::string& path) {
    r.expect_map(node, path);
    r.allow_keys(node, path, {"name", "width_mm", "thickness_mm", "equivalent_diameter", "equivalent_diameter_mm",
                              "discharge_capacity_m3_per_year", "cost_per_m"});
    DrainEntry d;
    DrainProductSpec product;
    d.name = product.name = r.text(r.required(node, path, "name"), path + ".name");
    const auto width = r.optional_number(node, path, "width_mm", positive("mm"));
    const auto thickness = r.optional_number(node, path, "thickness_mm", positive("mm"));
    const auto diameter = r.optional_number(node, path, "equivalent_diameter_mm", positive("mm"));
    if (width) d.width_m = units::mm_to_m(*width);
    if (thickness) d.thickness_m = units::mm_to_m(*thickness);
    if (diameter && node["equivalent_diameter"])
        r.fail(node["equivalent_diameter"], path + ".equivalent_diameter",
               "give either 'equivalent_diameter' (a method) or 'equivalent_diameter_mm' (a value), not both");
    if (diameter) {
        product.equivalent_diameter_m = units::mm_to_m(*diameter);
    } else {
        if (!width) r.required(node, path, "width_mm");
        if (!thickness) r.required(node, path, "thickness_mm");
        d.method = node["equivalent_diameter"]
                       ? r.choice(node["equivalent_diameter"], path + ".equivalent_diameter", equivalent_diameter_names)
                       : EquivalentDiameterMethod::hansbo_1979;
        product.equivalent_diameter_m = band_drain_equivalent_diameter_m(*d.method, *d.width_m, *d.thickness_m);
    }
    product.discharge_capacity_m3_per_s = units::per_year_to_per_second(
        r.number(node, path, "discharge_capacity_m3_per_year", positive("m³/year")));
    product.cost_per_m = r.optional_number(node, path, "cost_per_m", non_negative("per metre"));
    return {d, product};
}

void read_drains(const Reader& r, const YAML::Node& root, Scenario& s) {
    const YAML::Node node = r.required(root, "", "drains");
    if (!node.IsSequence() || node.size() == 0)
        r.fail(node, "drains", "must be a list of at least one drain product");
    if (node.size() > defaults::max_drain_products)
        r.fail(node, "drains", "lists " + std::to_string(node.size()) + " products; at most " +
                                   std::to_string(defaults::max_drain_products) + " (split the catalogue into several scenarios)");
    std::set<std::string> names;
    for (std::size_t i = 0; i < node.size(); ++i) {
        const std::string path = "drains[" + std::to_string(i) + "]";
        auto [d, product] = read_drain(r, node[i], path);
        if (!names.insert(d.name).second) r.fail(node[i]["name"], path + ".name", "drain name '" + d.name + "' is used twice");
        s.drains.push_back(std::move(d));
        s.site.products.push_back(std::move(product));
    }
}

void read_project(const Reader& r, const YAML::Node& root, Scenario& s) {
    if (!root["project"]) return;
    const YAML::Node node = root["project"];
    r.expect_map(node, "project");
    r.allow_keys(node, "project", {"name", "number", "revision", "prepared_by", "checked_by", "date"});
    auto field = [&](const char* key, std::optional<std::string>& out) {
        if (node[key]) out = r.text(node[key], std::string("project.") + key);
    };
    field("name", s.project.name);
    field("number", s.project.number);
    field("revision", s.project.revision);
    field("prepared_by", s.project.prepared_by);
    field("checked_by", s.project.checked_by);
    field("date", s.project.date);
}

// Factors from a monitoring back-analysis, applied to the clay as `sweep` applies its ch and cv factors.
void read_calibration(const Reader& r, const YAML::Node& root, Scenario& s) {
    if (!root["calibration"]) return;
    const YAML::Node node = root["calibration"];
    r.expect_map(node, "calibration");
    r.allow_keys(node, "calibration", {"ch_factor", "cv_factor", "source"});
    if (!node["ch_factor"] && !node["cv_factor"])
        r.fail(node, "calibration", "give 'ch_factor' (monitor's fit.ch_factor) and/or 'cv_factor'");
    constexpr Range factor{0.02, true, 50.0, true, "(a factor on every layer's coefficient; 0.02 to 50)"};
    Calibration c;
    c.ch_factor = r.optional_number(node, "calibration", "ch_factor", factor).value_or(1.0);
    c.cv_factor = r.optional_number(node, "calibration", "cv_factor", factor).value_or(1.0);
    if (node["source"]) c.source = r.text(node["source"], "calibration.source");
    s.site = with_input(s.site, StudyInput::ch_factor, c.ch_factor);
    s.site = with_input(s.site, StudyInput::cv_factor, c.cv_factor);
    s.calibration = c;
}

void read_installation(const Reader& r, const YAML::Node& root, Scenario& s) {
    const YAML::Node node = r.required(root, "", "installation");
    const std::string p = "installation";
    r.expect_map(node, p);
    r.allow_keys(node, p, {"mandrel_width_mm", "mandrel_depth_mm", "mandrel_diameter_mm", "smear_diameter_ratio",
                           "smear_permeability_ratio", "smear_shape", "radial_theory"});
    Installation& in = s.site.installation;
    const auto diameter = r.optional_number(node, p, "mandrel_diameter_mm", positive("mm"));
    if (diameter) {
        if (node["mandrel_width_mm"])
            r.fail(node["mandrel_width_mm"], p + ".mandrel_width_mm",
                   "give either 'mandrel_diameter_mm' or 'mandrel_width_mm' with 'mandrel_depth_mm', not both");
        in.mandrel_diameter_m = units::mm_to_m(*diameter);
    } else {
        const double width = units::mm_to_m(r.number(node, p, "mandrel_width_mm", positive("mm")));
        const double depth = units::mm_to_m(r.number(node, p, "mandrel_depth_mm", positive("mm")));
        s.mandrel_width_m = std::max(width, depth);
        in.mandrel_diameter_m = mandrel_equivalent_diameter_m(width, depth);
    }
    in.smear_diameter_ratio = r.number(node, p, "smear_diameter_ratio", positive("(ds/dm)"));
    in.smear_permeability_ratio =
        r.number(node, p, "smear_permeability_ratio", {1.0, true, inf, false, "(kh/ks; 1 means no disturbance)"});
    if (node["smear_shape"]) in.smear_shape = r.choice(node["smear_shape"], p + ".smear_shape", smear_shape_names);
    in.theory = in.smear_shape == SmearShape::constant ? RadialTheory::hansbo_1981 : RadialTheory::equal_strain_integral;
    if (node["radial_theory"]) {
        in.theory = r.choice(node["radial_theory"], p + ".radial_theory", radial_theory_names);
        if (in.theory == RadialTheory::hansbo_1981 && in.smear_shape != SmearShape::constant)
            r.fail(node["radial_theory"], p + ".radial_theory",
                   "hansbo_1981 is the closed form for a constant smear zone; with smear_shape '" +
                       std::string(to_string(in.smear_shape)) + "' use equal_strain_integral");
    }
}

void read_patterns(const Reader& r, const YAML::Node& root, Scenario& s) {
    auto& patterns = s.site.range.patterns;
    if (!root["patterns"]) return;  // both, the default
    patterns.clear();
    const YAML::Node node = root["patterns"];
    r.remember("patterns", node);
    if (!node.IsSequence() || node.size() == 0) r.fail(node, "patterns", "must be a list of triangular and/or square");
    for (std::size_t i = 0; i < node.size(); ++i) {
        const std::string path = "patterns[" + std::to_string(i) + "]";
        const Pattern p = r.choice(node[i], path, pattern_names);
        if (std::find(patterns.begin(), patterns.end(), p) != patterns.end())
            r.fail(node[i], path, "pattern '" + std::string(to_string(p)) + "' is listed twice");
        patterns.push_back(p);
    }
}

void read_spacing(const Reader& r, const YAML::Node& root, Scenario& s) {
    const YAML::Node node = r.required(root, "", "spacing");
    r.expect_map(node, "spacing");
    r.allow_keys(node, "spacing", {"min_m", "max_m", "increment_m"});
    SearchRange& range = s.site.range;
    range.bounds.min_m = r.number(node, "spacing", "min_m", positive("m"));
    range.bounds.max_m = r.number(node, "spacing", "max_m", {range.bounds.min_m, false, inf, false, "m (above min_m)"});
    range.increment_m = r.optional_number(node, "spacing", "increment_m", positive("m")).value_or(defaults::spacing_increment_m);
    const double candidates = (range.bounds.max_m - range.bounds.min_m) / range.increment_m;
    if (candidates > defaults::max_spacing_candidates)
        r.fail(node["increment_m"], "spacing.increment_m",
               format_value(range.increment_m) + " is not allowed: it gives " + format_value(std::floor(candidates)) +
                   " spacings between min_m and max_m; it must be at least " +
                   format_value((range.bounds.max_m - range.bounds.min_m) / defaults::max_spacing_candidates) + " m");
    // A hair of tolerance: 1.0 − 0.8 is 0.19999999999999996 in binary, and an increment of 0.2 fits.
    if (range.increment_m > (range.bounds.max_m - range.bounds.min_m) * (1.0 + 1e-9))
        r.fail(node["increment_m"], "spacing.increment_m",
               format_value(range.increment_m) + " is not allowed: it must be at most max_m − min_m = " +
                   format_value(range.bounds.max_m - range.bounds.min_m) + " m");
}

// The key a user would change when the method cannot take the site.
std::string refusal_key(const Scenario& s, const MethodRefusal& why) {
    switch (why.part) {
        case MethodRefusal::Part::drain_length: return "drain_length_m";
        case MethodRefusal::Part::clay_coefficients: return "clay";
        case MethodRefusal::Part::vacuum: return "loading.vacuum";
        case MethodRefusal::Part::layer_coefficients: break;
    }
    const auto& layers = s.site.ground.profile->layers;
    for (std::size_t i = 0; i < layers.size(); ++i)
        if (layers[i].cv_m2_per_s.has_value() == (s.site.method.method == CellMethod::closed_form) ||
            layers[i].ch_m2_per_s.has_value() == (s.site.method.method == CellMethod::closed_form))
            return "clay.layers[" + std::to_string(i) + "]";
    return "clay.layers";
}

// Physical checks that join several keys, reported at the key a user would change.
void check_physics(const Reader& r, Scenario& s) {
    const Site& site = s.site;
    const double thickness = site.ground.thickness_m, length = site.installation.drain_length_m;
    if (!(length <= thickness * (1 + 1e-12)))
        s.fail_at("drain_length_m", format_value(length) + " is not allowed: it must be at most clay.thickness_m = " +
                                        format_value(thickness) + " m");
    if (const auto why = method_refusal(site)) {
        const std::string key = refusal_key(s, *why);
        if (why->part == MethodRefusal::Part::layer_coefficients && site.method.method == CellMethod::closed_form)
            s.fail_at(key, "layer cv/ch values need 'method: layered_series' or 'method: numerical' (the closed form "
                           "takes one cv and ch for the clay)");
        if (why->part == MethodRefusal::Part::drain_length)
            s.fail_at(key, format_value(length) + " is not allowed: it must equal clay.thickness_m = " +
                               format_value(thickness) + " m (drains that stop short of the clay base need 'method: layered_series' "
                                                                 "or 'method: numerical')");
        s.fail_at(key, why->quantity + " must be " + why->allowed);
    }
    const double ds = site.installation.smear_diameter_m(), dm = site.installation.mandrel_diameter_m;
    for (const auto& d : site.products) {
        if (ds < d.equivalent_diameter_m)
            s.fail_at("installation.smear_diameter_ratio",
                      format_value(site.installation.smear_diameter_ratio) + " gives a smear zone of " +
                          format_value(ds * 1000.0) + " mm, smaller than the equivalent diameter of drain '" + d.name +
                          "' (" + format_value(d.equivalent_diameter_m * 1000.0) + " mm); it must be at least " +
                          format_value(d.equivalent_diameter_m / dm));
        for (const Pattern p : site.range.patterns) {
            const double lowest = spacing_from_influence_diameter_m(p, ds);
            if (site.range.bounds.min_m <= lowest)
                s.fail_at("spacing.min_m", format_value(site.range.bounds.min_m) + " is not allowed: it must be greater than " +
                                               format_value(lowest) + " m so that the smear zone (" +
                                               format_value(ds * 1000.0) + " mm) lies inside the unit cell of a " +
                                               std::string(to_string(p)) + " pattern");
        }
    }
    try {
        validate_site(site);
    } catch (const InputError& e) {
        r.fail_at({0, 0}, "", e.what());
    }
    // Every cell the search may build must be valid: the engine's own checks, located.
    for (std::size_t i = 0; i < site.products.size(); ++i)
        for (const Pattern p : site.range.patterns)
            for (const double spacing : {site.range.bounds.min_m, site.range.bounds.max_m}) {
                const auto& product = site.products[i];
                try {
                    make_cell_model(site, product, p, spacing);
                } catch (const InputError& e) {
                    std::string key = spacing == site.range.bounds.min_m ? "spacing.min_m" : "spacing.max_m";
                    // Well resistance out of all proportion: a tiny qw (below 1 m³/year) or else kh.
                    if (e.quantity().rfind("well resistance", 0) == 0)
                        key = units::per_second_to_per_year(product.discharge_capacity_m3_per_s) < 1.0
                                  ? "drains[" + std::to_string(i) + "].discharge_capacity_m3_per_year"
                              : site.ground.kh_source == KhSource::given ? "clay.kh_m_per_s"
                                                                         : "clay.ch_m2_per_year";
                    s.fail_at(key, std::string(e.what()) + " (drain '" + product.name + "', " + std::string(to_string(p)) +
                                       " pattern)");
                }
            }
}

// A study value must lie in the physical range of its input (ratios above 1, smear inside the
// smallest cell...); checked here so the error points at the value.
double study_value(const Reader& r, const YAML::Node& node, const std::string& path, StudyInput input,
                   const Site& design) {
    const double value = r.number(node, path, {-inf, false, inf, false, ""});
    const InputRange range = physical_range(design, input);
    const double si = study_value_to_si(input, value);
    if (!(si >= range.low && si < range.high)) {
        const double low = study_value_from_si(input, range.low), high = study_value_from_si(input, range.high);
        r.fail(node, path,
               format_value(value) + " is not allowed: it must be " +
                   (range.low <= std::numeric_limits<double>::min() ? "greater than 0" : "at least " + format_value(low)) +
                   (std::isfinite(high) ? " and below " + format_value(high) : std::string()) + " for this design");
    }
    return si;
}

// A study input named at `node`; the absolute discharge capacity only where there is one product
// (one value would override every product's own qw).
StudyInput study_input(const Reader& r, const YAML::Node& node, const std::string& path, const Site& site) {
    const StudyInput input = r.choice(node, path, study_input_names);
    if (input == StudyInput::discharge_capacity && site.products.size() != 1)
        r.fail(node, path,
               "discharge_capacity_m3_per_year sets one qw for every product, and this scenario lists " +
                   std::to_string(site.products.size()) +
                   "; vary 'discharge_capacity_factor' instead (a factor on each product's own qw)");
    return input;
}

void read_studies(const Reader& r, const YAML::Node& root, Scenario& s) {
    if (!root["studies"]) return;
    const YAML::Node node = root["studies"];
    r.expect_map(node, "studies");
    r.allow_keys(node, "studies", {"tornado", "grid"});
    const Site& design = s.site;
    if (const YAML::Node t = node["tornado"]) {
        r.expect_map(t, "studies.tornado");
        r.allow_keys(t, "studies.tornado", names_of(study_input_names));
        for (auto it = t.begin(); it != t.end(); ++it) {
            const std::string name = it->first.as<std::string>();
            const std::string path = "studies.tornado." + name;
            const StudyInput input = study_input(r, it->first, path, design);
            const YAML::Node pair = it->second;
            if (!pair.IsSequence() || pair.size() != 2) r.fail(pair, path, "must be [low, high]");
            const double low = study_value(r, pair[0], path + "[0]", input, design);
            const double high = study_value(r, pair[1], path + "[1]", input, design);
            if (high < low) r.fail(pair[1], path + "[1]", "the high value must be at least the low value");
            s.studies.tornado.push_back({input, low, high});
        }
    }
    if (const YAML::Node g = node["grid"]) {
        r.expect_map(g, "studies.grid");
        r.allow_keys(g, "studies.grid", {"x", "y"});
        auto axis = [&](const std::string& key) {
            const std::string path = "studies.grid." + key;
            const YAML::Node a = r.required(g, "studies.grid", key);
            r.expect_map(a, path);
            r.allow_keys(a, path, {"input", "from", "to", "steps"});
            GridAxis out;
            out.input = study_input(r, r.required(a, path, "input"), path + ".input", design);
            out.from_si = study_value(r, r.required(a, path, "from"), path + ".from", out.input, design);
            out.to_si = study_value(r, r.required(a, path, "to"), path + ".to", out.input, design);
            if (!(out.to_si > out.from_si)) r.fail(a["to"], path + ".to", "must be greater than 'from'");
            out.steps = static_cast<int>(
                r.optional_number(a, path, "steps", {2.0, true, 1001.0, true, "(whole number)"}).value_or(defaults::grid_steps));
            if (a["steps"] && std::floor(a["steps"].as<double>()) != a["steps"].as<double>())
                r.fail(a["steps"], path + ".steps", "must be a whole number from 2 to 1001");
            return out;
        };
        // An axis not given keeps its default (StudyRequests: kh/ks 1–6 across, ds/dm 1.5–4 up).
        if (g["x"]) s.studies.grid_x = axis("x");
        if (g["y"]) s.studies.grid_y = axis("y");
        if (s.studies.grid_x.input == s.studies.grid_y.input)
            r.fail(g["y"] ? g["y"]["input"] : g["x"]["input"], g["y"] ? "studies.grid.y.input" : "studies.grid.x.input",
                   "must differ from the other axis's input (" + std::string(to_string(s.studies.grid_y.input)) + ")");
        const double searches = static_cast<double>(s.studies.grid_x.steps) * s.studies.grid_y.steps *
                                static_cast<double>(s.site.products.size() * s.site.range.patterns.size());
        if (searches > max_spacing_searches(s.site))
            r.fail(g, "studies.grid",
                   format_value(s.studies.grid_x.steps) + " × " + format_value(s.studies.grid_y.steps) +
                       " steps for every product and pattern need " + format_value(searches) +
                       " spacing searches; at most " + format_value(max_spacing_searches(s.site)) +
                       " are allowed with this method and loading: use fewer steps");
        s.studies.grid_given = true;
    }
}

Distribution read_distribution(const Reader& r, const YAML::Node& node, const std::string& path, StudyInput input) {
    r.expect_map(node, path);
    const DistributionKind kind = r.choice(r.required(node, path, "distribution"), path + ".distribution", distribution_names);
    Distribution d;
    d.kind = kind;
    const Range any{-inf, false, inf, false, ""};
    auto value = [&](const char* key) {
        return study_value_to_si(input, r.number(node, path, key, any));
    };
    switch (kind) {
        case DistributionKind::normal:
        case DistributionKind::lognormal:
            r.allow_keys(node, path, {"distribution", "mean", "sd"});
            d.a = value("mean");
            d.b = study_value_to_si(input, r.number(node, path, "sd", {0.0, true, inf, false, "(0 = a constant)"}));
            if (kind == DistributionKind::lognormal && !(d.a > 0.0))
                r.fail(node["mean"], path + ".mean", "must be greater than 0 for a lognormal distribution");
            break;
        case DistributionKind::uniform:
            r.allow_keys(node, path, {"distribution", "low", "high"});
            d.a = value("low");
            d.b = value("high");
            if (d.b < d.a) r.fail(node["high"], path + ".high", "must be at least 'low'");
            break;
        case DistributionKind::triangular:
            r.allow_keys(node, path, {"distribution", "low", "mode", "high"});
            d.a = value("low");
            d.b = value("mode");
            d.c = value("high");
            if (d.b < d.a) r.fail(node["mode"], path + ".mode", "must be at least 'low'");
            if (d.c < d.b) r.fail(node["high"], path + ".high", "must be at least 'mode'");
            break;
    }
    return d;
}

void read_uncertain(const Reader& r, const YAML::Node& root, Scenario& s) {
    if (!root["uncertain"]) return;
    const YAML::Node node = root["uncertain"];
    const std::string p = "uncertain";
    r.expect_map(node, p);
    std::vector<std::string> keys{"samples", "seed", "reliability", "confidence", "spacing_m", "ch_cv_correlation"};
    for (const auto& name : names_of(study_input_names)) keys.push_back(name);
    r.allow_keys(node, p, keys);
    MonteCarloSpec mc;
    const auto whole = [&](const char* key, double low, double high, double fallback) {
        const auto v = r.optional_number(node, p, key, {low, true, high, true, "(whole number)"});
        if (v && std::floor(*v) != *v) r.fail(node[key], p + "." + key, "must be a whole number");
        return v.value_or(fallback);
    };
    mc.samples = static_cast<std::size_t>(whole("samples", 1.0, 1e9, 10000.0));
    const double rows = static_cast<double>(s.site.products.size() * s.site.range.patterns.size());
    // The search budget of a staged or numerical site is checked when the study runs (`sweep`): a
    // design of the same file does not depend on it.
    if (static_cast<double>(mc.samples) * rows > defaults::max_monte_carlo_values)
        r.fail(node["samples"], p + ".samples",
               format_value(static_cast<double>(mc.samples)) + " samples × " + format_value(rows) +
                   " designs is not allowed: at most " + format_value(defaults::max_monte_carlo_values) +
                   " values in all, so at most " + format_value(std::floor(defaults::max_monte_carlo_values / rows)) +
                   " samples here");
    mc.seed = static_cast<std::uint64_t>(whole("seed", 0.0, 9007199254740992.0, 1.0));
    mc.reliability = r.optional_number(node, p, "reliability", {0.0, false, 1.0, false, ""}).value_or(defaults::monte_carlo_reliability);
    mc.confidence = r.optional_number(node, p, "confidence", {0.0, false, 1.0, false, ""}).value_or(defaults::monte_carlo_confidence);
    const SpacingBounds& b = s.site.range.bounds;
    mc.spacing_m = r.optional_number(node, p, "spacing_m", {b.min_m, true, b.max_m, true, "m"});
    mc.ch_cv_correlation = r.optional_number(node, p, "ch_cv_correlation", {-1.0, false, 1.0, false, ""}).value_or(0.0);
    const Site& design = s.site;
    for (const auto& name : names_of(study_input_names)) {
        if (!node[name]) continue;
        const std::string path = p + "." + name;
        YAML::Node key;
        for (auto it = node.begin(); it != node.end(); ++it)
            if (it->first.Scalar() == name) key = it->first;
        const StudyInput input = study_input(r, key, path, design);
        const Distribution d = read_distribution(r, node[name], path, input);
        try {
            TruncatedDistribution(d, physical_range(design, input), name);
        } catch (const InputError& e) {
            r.fail(node[name], path, e.what());
        }
        mc.inputs.push_back({input, d});
    }
    if (mc.inputs.empty()) r.fail(node, p, "needs at least one uncertain input: " + Reader::list(names_of(study_input_names)));
    s.studies.monte_carlo = mc;
}

// A pressure from `pressure_kPa` or from `height_m` of fill.
double stage_pressure(const Reader& r, const YAML::Node& node, const std::string& path, const Scenario& s) {
    if (node["height_m"] && node["pressure_kPa"])
        r.fail(node["pressure_kPa"], path + ".pressure_kPa", "give either 'height_m' or 'pressure_kPa', not both");
    if (node["height_m"]) {
        // A lift below a millimetre (or a load below 0.01 kPa) changes nothing the theory can resolve
        // and, far smaller, underflows the secant storage: refused at its key.
        const double h = r.number(node, path, "height_m", {0.001, true, inf, false, "m (1 mm at least)"});
        if (!s.fill_unit_weight_kN_per_m3)
            r.fail(node["height_m"], path + ".height_m", "a fill height needs 'fill_unit_weight_kN_per_m3' at the top level");
        return h * *s.fill_unit_weight_kN_per_m3;
    }
    if (!node["pressure_kPa"]) r.fail(node, path, "missing key 'height_m' or 'pressure_kPa' in '" + path + "'");
    return r.number(node, path, "pressure_kPa", {0.01, true, inf, false, "kPa (0.01 kPa at least)"});
}

void read_embankment(const Reader& r, const YAML::Node& root, Scenario& s) {
    if (!root["embankment"]) return;
    const std::string path = "embankment";
    const YAML::Node node = root[path];
    r.remember(path, node);
    r.expect_map(node, path);
    r.allow_keys(node, path, {"crest_width_m", "side_slope_h_per_v", "fill_unit_weight_kN_per_m3", "fill_friction_angle_deg",
                              "fill_cohesion_kPa", "target_factor_of_safety", "finished_height_m", "berms", "height_m",
                              "top_up", "top_up_start_day", "reinforcement", "tension_crack"});
    EmbankmentSection e;
    e.crest_width_m = r.number(node, path, "crest_width_m", non_negative("m"));
    e.side_slope_h_per_v = r.number(node, path, "side_slope_h_per_v",
                                    {0.0, true, inf, false, "(horizontal per vertical; 0 is vertical, below 0 steeper than vertical)"});
    if (e.crest_width_m == 0.0 && e.side_slope_h_per_v == 0.0)
        r.fail(node["crest_width_m"], path + ".crest_width_m",
               "0 is not allowed with vertical sides (side_slope_h_per_v: 0): the section does not close");
    e.fill_unit_weight_kN_per_m3 = r.number(node, path, "fill_unit_weight_kN_per_m3", positive("kN/m³"));
    e.fill_friction_angle_deg = r.number(node, path, "fill_friction_angle_deg", {0.0, true, 90.0, false, "degrees"});
    e.fill_cohesion_kPa = r.optional_number(node, path, "fill_cohesion_kPa", non_negative("kPa")).value_or(0.0);
    e.target_factor_of_safety = r.optional_number(node, path, "target_factor_of_safety", {1.0, true, inf, false, ""})
                                    .value_or(defaults::target_factor_of_safety);
    e.finished_height_m = r.optional_number(node, path, "finished_height_m", positive("m"));
    e.height_m = r.optional_number(node, path, "height_m", positive("m"));
    if (node["top_up"]) {
        r.remember(path + ".top_up", node["top_up"]);
        e.top_up = r.choice(node["top_up"], path + ".top_up", top_up_names);
    }
    if (const auto day = r.optional_number(node, path, "top_up_start_day", day_within_horizon(0.0, true, "days (within 100 years)"))) {
        if (!e.finished_height_m)
            r.fail(node["top_up_start_day"], path + ".top_up_start_day", "needs 'finished_height_m' (the top-up it starts)");
        e.top_up_start_s = units::days_to_seconds(*day);
    }
    if (const YAML::Node g = node["reinforcement"]) {
        const std::string at = path + ".reinforcement";
        r.remember(at, g);
        r.expect_map(g, at);
        r.allow_keys(g, at, {"tensile_force_kN_per_m"});
        e.reinforcement = BasalReinforcement{
            r.number(r.required(g, at, "tensile_force_kN_per_m"), at + ".tensile_force_kN_per_m",
                     {0.0, false, defaults::max_reinforcement_kN_per_m, true,
                      "kN/m (the design force per metre run, after every reduction factor)"})};
    }
    if (const YAML::Node t = node["tension_crack"]) {
        const std::string at = path + ".tension_crack";
        r.remember(at, t);
        r.expect_map(t, at);
        r.allow_keys(t, at, {"depth_m", "water_filled"});
        TensionCrack crack;
        crack.depth_m = r.number(r.required(t, at, "depth_m"), at + ".depth_m", positive("m"));
        if (t["water_filled"]) crack.water_filled = r.flag(t["water_filled"], at + ".water_filled");
        e.tension_crack = crack;
    }
    if (const YAML::Node berms = node["berms"]) {
        r.remember(path + ".berms", berms);
        if (!berms.IsSequence()) r.fail(berms, path + ".berms", "must be a list of berms ({width_m, height_m}), outwards from the crest");
        if (berms.size() > defaults::max_berms)
            r.fail(berms, path + ".berms", "lists " + std::to_string(berms.size()) + " berms; at most " +
                                               std::to_string(defaults::max_berms));
        for (std::size_t i = 0; i < berms.size(); ++i) {
            const std::string at = path + ".berms[" + std::to_string(i) + "]";
            r.remember(at, berms[i]);
            r.expect_map(berms[i], at);
            r.allow_keys(berms[i], at, {"width_m", "height_m"});
            Berm b;
            b.width_m = r.number(berms[i], at, "width_m", positive("m"));
            b.height_m = r.number(berms[i], at, "height_m", positive("m"));
            if (!e.berms.empty() && !(b.height_m < e.berms.back().height_m))
                r.fail(berms[i]["height_m"], at + ".height_m",
                       format_value(b.height_m) + " m is not allowed: berms go outwards and down, so it must be below the "
                       "berm before it (" + format_value(e.berms.back().height_m) + " m)");
            e.berms.push_back(b);
        }
    }
    if (e.finished_height_m && e.fill_unit_weight_kN_per_m3 <= units::gamma_w_kN_per_m3)
        r.fail(node["fill_unit_weight_kN_per_m3"], path + ".fill_unit_weight_kN_per_m3",
               "must exceed the unit weight of water (9.81 kN/m³) for fill to a finished level");
    if (const auto top = r.optional_number(root, "", "fill_unit_weight_kN_per_m3", positive("kN/m³"));
        top && *top != e.fill_unit_weight_kN_per_m3)
        r.fail(node["fill_unit_weight_kN_per_m3"], path + ".fill_unit_weight_kN_per_m3",
               format_value(e.fill_unit_weight_kN_per_m3) + " differs from the top-level 'fill_unit_weight_kN_per_m3' " +
                   format_value(*top) + "; give one fill unit weight");
    s.site.embankment = e;
}

void read_loading(const Reader& r, const YAML::Node& root, Scenario& s) {
    s.fill_unit_weight_kN_per_m3 = r.optional_number(root, "", "fill_unit_weight_kN_per_m3", positive("kN/m³"));
    if (!s.fill_unit_weight_kN_per_m3 && s.site.embankment)
        s.fill_unit_weight_kN_per_m3 = s.site.embankment->fill_unit_weight_kN_per_m3;
    if (!root["loading"]) return;
    const YAML::Node node = root["loading"];
    r.expect_map(node, "loading");
    r.allow_keys(node, "loading", {"stages", "surcharge", "vacuum"});
    // Stages may be left out when a vacuum is the load.
    const YAML::Node stages = node["vacuum"] && !node["stages"] ? YAML::Node(YAML::NodeType::Sequence)
                                                                 : r.required(node, "loading", "stages");
    if (!stages.IsSequence() || (stages.size() == 0 && !node["vacuum"]))
        r.fail(stages, "loading.stages", "must be a list of at least one stage");
    if (stages.size() > defaults::max_load_stages)
        r.fail(stages, "loading.stages", "lists " + std::to_string(stages.size()) + " stages; at most " +
                                             std::to_string(defaults::max_load_stages) + " (merge lifts placed back to back)");
    LoadHistory h;
    for (std::size_t i = 0; i < stages.size(); ++i) {
        const std::string path = "loading.stages[" + std::to_string(i) + "]";
        const YAML::Node st = stages[i];
        r.expect_map(st, path);
        r.allow_keys(st, path, {"start_day", "end_day", "height_m", "pressure_kPa"});
        LoadStage stage;
        const double start = r.number(st, path, "start_day", day_within_horizon(0.0, true, "days (within 100 years)"));
        double end = r.optional_number(st, path, "end_day", {start, true, horizon_days, true, "days (not before start_day, within 100 years)"}).value_or(start);
        if (end > start && end - start < defaults::shortest_placing_days) {
            // Shorter than the time integration resolves: placed at once, and said so.
            const auto mark = s.mark_of(path + ".end_day");
            s.input_warnings.push_back(s.file + (mark ? ":" + std::to_string(mark->line) + ":" + std::to_string(mark->column) : "") +
                                       ": " + path + ": placed over " + three_digits(end - start) + " days, less than " +
                                       format_value(defaults::shortest_placing_days) + " day: taken as placed at once on day " +
                                       format_value(start));
            end = start;
        }
        stage.start_s = units::days_to_seconds(start);
        stage.end_s = units::days_to_seconds(end);
        stage.pressure_kPa = stage_pressure(r, st, path, s);
        h.stages.push_back(stage);
    }
    if (const YAML::Node sc = node["surcharge"]) {
        const std::string path = "loading.surcharge";
        r.expect_map(sc, path);
        r.allow_keys(sc, path, {"start_day", "end_day", "removal_day", "height_m", "pressure_kPa", "max_height_m"});
        Surcharge sur;
        const double start = r.number(sc, path, "start_day", day_within_horizon(0.0, true, "days (within 100 years)"));
        const double end = r.optional_number(sc, path, "end_day", {start, true, horizon_days, true, "days (not before start_day, within 100 years)"}).value_or(start);
        const double removal = r.number(sc, path, "removal_day", {end, false, horizon_days, true, "days (after end_day, within 100 years)"});
        sur.start_s = units::days_to_seconds(start);
        sur.end_s = units::days_to_seconds(end);
        sur.removal_s = units::days_to_seconds(removal);
        sur.pressure_kPa = stage_pressure(r, sc, path, s);
        s.surcharge_max_height_m = r.optional_number(sc, path, "max_height_m", positive("m"));
        h.surcharge = sur;
    }
    if (const YAML::Node vac = node["vacuum"]) {
        const std::string path = "loading.vacuum";
        r.remember(path, vac);
        r.expect_map(vac, path);
        r.allow_keys(vac, path, {"pressure_kPa", "start_day", "end_day", "tip_ratio"});
        VacuumLoad v;
        v.pressure_kPa = r.number(vac, path, "pressure_kPa",
                                  {1.0, true, defaults::max_vacuum_kPa, true, "kPa (1 kPa at least, one atmosphere at most)"});
        const double start = r.number(vac, path, "start_day", {0.0, true, horizon_days, false, "days"});
        const double end = r.number(vac, path, "end_day",
                                    {start, false, horizon_days, true, "days (after start_day, within the 100-year record)"});
        v.start_s = units::days_to_seconds(start);
        v.end_s = units::days_to_seconds(end);
        v.tip_ratio = r.optional_number(vac, path, "tip_ratio", {0.0, true, 1.0, true, "(vacuum at the drain tip / at its head)"})
                          .value_or(defaults::vacuum_tip_ratio);
        h.vacuum = v;
    }
    s.site.loading = h;
}

// The optional `schedule:` block: surcharge heights to search and the costs beyond the drains'.
void read_schedule(const Reader& r, const YAML::Node& root, Scenario& s) {
    if (!root["schedule"]) return;
    const std::string path = "schedule";
    const YAML::Node node = root[path];
    r.remember(path, node);
    r.expect_map(node, path);
    r.allow_keys(node, path, {"surcharge_heights_m", "fill_cost_per_m3", "surcharge_cost_per_m3",
                              "surcharge_removal_cost_per_m3", "cost_per_hectare_per_day"});
    ScheduleSpec spec;
    if (const YAML::Node heights = node["surcharge_heights_m"]) {
        const std::string at = path + ".surcharge_heights_m";
        r.remember(at, heights);
        if (!heights.IsSequence() || heights.size() == 0)
            r.fail(heights, at, "must be a list of at least one surcharge height (m; 0 for none)");
        if (heights.size() > defaults::max_surcharge_heights)
            r.fail(heights, at, "lists " + std::to_string(heights.size()) + " heights; at most " +
                                    std::to_string(defaults::max_surcharge_heights));
        if (!s.site.embankment)
            r.fail(heights, at, "needs an 'embankment' block (the surcharge is fill on its crest, at its unit weight)");
        for (std::size_t i = 0; i < heights.size(); ++i) {
            const double h = r.number(heights[i], at + "[" + std::to_string(i) + "]",
                                      {0.0, true, defaults::max_surcharge_height_m, true, "m (0 for no surcharge)"});
            if (std::find(spec.surcharge_heights_m.begin(), spec.surcharge_heights_m.end(), h) != spec.surcharge_heights_m.end())
                r.fail(heights[i], at + "[" + std::to_string(i) + "]", format_value(h) + " m is listed twice");
            spec.surcharge_heights_m.push_back(h);
        }
    }
    ScheduleCosts& c = spec.costs;
    c.fill_per_m3 = r.optional_number(node, path, "fill_cost_per_m3", non_negative("per m³"));
    c.surcharge_per_m3 = r.optional_number(node, path, "surcharge_cost_per_m3", non_negative("per m³"));
    c.surcharge_removal_per_m3 = r.optional_number(node, path, "surcharge_removal_cost_per_m3", non_negative("per m³"));
    c.per_hectare_per_day = r.optional_number(node, path, "cost_per_hectare_per_day", non_negative("per hectare per day"));
    s.schedule = spec;
}

void read_method(const Reader& r, const YAML::Node& root, Scenario& s) {
    MethodChoice& m = s.site.method;
    if (root["method"]) m.method = r.choice(root["method"], "method", cell_method_names);
    if (root["series_terms"]) {
        const double terms = r.number(root, "", "series_terms",
                                      {2.0, true, static_cast<double>(defaults::max_layered_terms), true, "(whole number)"});
        if (std::floor(terms) != terms) r.fail(root["series_terms"], "series_terms", "must be a whole number");
        m.series_terms = static_cast<int>(terms);
    }
    if (const YAML::Node mesh = root["numerical_mesh"]) {
        r.expect_map(mesh, "numerical_mesh");
        r.allow_keys(mesh, "numerical_mesh", {"radial_cells", "vertical_cells", "max_degree_step"});
        const auto whole = [&](const char* key, double low, double high, int fallback) {
            const auto v = r.optional_number(mesh, "numerical_mesh", key, {low, true, high, true, "(whole number)"});
            if (v && std::floor(*v) != *v) r.fail(mesh[key], std::string("numerical_mesh.") + key, "must be a whole number");
            return v ? static_cast<int>(*v) : fallback;
        };
        m.mesh.radial_cells = whole("radial_cells", 4, 2000, defaults::design_radial_cells);
        m.mesh.vertical_cells = whole("vertical_cells", 2, 4000, defaults::design_vertical_cells);
        m.mesh.max_degree_step =
            r.optional_number(mesh, "numerical_mesh", "max_degree_step", {defaults::min_max_degree_step, true, 0.1, true, ""})
                .value_or(defaults::design_max_degree_step);
        const int cells = m.mesh.radial_cells * m.mesh.vertical_cells;
        if (cells > defaults::max_design_mesh_cells)
            r.fail(mesh, "numerical_mesh",
                   std::to_string(m.mesh.radial_cells) + " × " + std::to_string(m.mesh.vertical_cells) + " = " +
                       std::to_string(cells) + " cells is not allowed: a design solves hundreds of cells, so at most " +
                       std::to_string(defaults::max_design_mesh_cells) + " (use `verify` for a finer reference mesh)");
    }
}

// Without a `method:` key: the closed form for one uniform clay with full drains and no vacuum, the
// layered series otherwise (layers with their own cv/ch, drains stopping short, vacuum).
CellMethod default_method(const Site& site) {
    const bool partial = std::fabs(site.installation.drain_length_m - site.ground.thickness_m) > 1e-9 * site.ground.thickness_m;
    const bool vacuum = site.loading && site.loading->vacuum;
    return site.ground.layered_flow() || partial || vacuum ? CellMethod::layered : CellMethod::closed_form;
}

// The section against the load history: every berm below the highest fill the schedule places.
void check_embankment(const Scenario& s) {
    const auto height = final_fill_height_m(s.site);
    if (!height) return;
    if (const auto& crack = s.site.embankment->tension_crack; crack && !(crack->depth_m <= *height))
        s.fail_at("embankment.tension_crack.depth_m",
                  format_value(crack->depth_m) + " m is not allowed: a crack in the fill is no deeper than the fill, " +
                      format_value(*height) + " m (embankment.height_m, else the permanent stages' total)");
    const auto& berms = s.site.embankment->berms;
    for (std::size_t i = 0; i < berms.size(); ++i)
        if (!(berms[i].height_m < *height))
            s.fail_at("embankment.berms[" + std::to_string(i) + "].height_m",
                      format_value(berms[i].height_m) + " m is not allowed: a berm must stand below the embankment's full "
                      "height, " + format_value(*height) + " m (embankment.height_m, else the permanent stages' total)");
}

// The finished-level top-up, planned once: the fill that finishes at embankment.finished_height_m
// after primary settlement (fill_to_finish), less what the stages place, goes on as a lift of its
// own by the section's top_up rule, at the last lift's rate. Every command then loads, settles and
// checks the fill that is placed. A schedule that already places more is kept, with a warning.
std::vector<std::string> plan_top_up(Scenario& s) {
    Site& site = s.site;
    if (!site.embankment || !site.embankment->finished_height_m || !site.loading || site.loading->stages.empty()) return {};
    const EmbankmentSection& e = *site.embankment;
    const double gamma = e.fill_unit_weight_kN_per_m3;
    TopUpPlan plan;
    plan.rule = e.top_up;
    try {
        plan.finish = fill_to_finish(site, gamma, *e.finished_height_m);
    } catch (const InputError& err) {
        s.fail_at("embankment.finished_height_m", "fill to a finished level: " + err.quantity() + " must be " + err.allowed());
    } catch (const EvaluationError& err) {
        s.fail_at("embankment.finished_height_m", err.what());
    }
    LoadHistory& h = *site.loading;
    const double scheduled_kPa = h.permanent_kPa();
    plan.scheduled_height_m = scheduled_kPa / gamma;
    const double top_kPa = plan.finish.load_kPa - scheduled_kPa;
    std::vector<std::string> warnings;
    if (!(top_kPa > 1e-9 * plan.finish.load_kPa)) {
        if (-top_kPa > 0.01 * plan.finish.load_kPa)
            warnings.push_back(s.file + ": embankment.finished_height_m: the stages place " +
                               format_value(std::round(plan.scheduled_height_m * 100.0) / 100.0) + " m of fill, more than the " +
                               format_value(std::round(plan.finish.load_kPa / gamma * 100.0) / 100.0) +
                               " m (as load) that finishes at " + format_value(*e.finished_height_m) +
                               " m after primary settlement; no top-up is planned and the surface ends higher");
        s.top_up = plan;
        return warnings;
    }
    // The thickness placed; its load is less where the settled fill stands below the groundwater table.
    plan.height_m = plan.finish.placed_height_m - plan.scheduled_height_m;
    plan.load_kPa = top_kPa;
    const auto last = std::max_element(h.stages.begin(), h.stages.end(),
                                       [](const LoadStage& a, const LoadStage& b) { return a.end_s < b.end_s; });
    const double rate_s_per_kPa = (last->end_s - last->start_s) / last->pressure_kPa;
    double start = last->end_s;
    if (e.top_up == TopUpRule::after_surcharge_removal) {
        if (!h.surcharge)
            s.fail_at("embankment.top_up", "'after_surcharge_removal' needs 'loading.surcharge' (the surcharge whose removal "
                                           "the top-up follows); use 'with_last_lift'");
        start = std::max(start, h.surcharge->removal_s);
    }
    if (e.top_up_start_s) {
        // A planned day (schedule --out writes it): not before the day the rule gives.
        if (*e.top_up_start_s < start * (1.0 - 1e-12))
            s.fail_at("embankment.top_up_start_day",
                      format_value(units::seconds_to_days(*e.top_up_start_s)) + " is not allowed: the top-up cannot start before day " +
                          format_value(units::seconds_to_days(start)) + " (" +
                          (e.top_up == TopUpRule::after_surcharge_removal ? "the surcharge's removal" : "the last lift's end") + ")");
        start = *e.top_up_start_s;
    }
    h.stages.push_back({start, start + rate_s_per_kPa * top_kPa, top_kPa});
    plan.stage = h.stages.size() - 1;
    s.top_up = plan;
    return warnings;
}

void check_settlement_criterion(const Scenario& s) {
    const Site& site = s.site;
    if (!site.criterion.residual()) return;
    if (!site.loading)
        s.fail_at("target.residual_settlement_mm",
                  "a residual settlement criterion needs a 'loading' block (the load that causes settlement)");
    if (!site.ground.profile && !site.ground.mv_m2_per_kN)
        s.fail_at("target.residual_settlement_mm",
                  "a residual settlement criterion needs 'clay.layers' or 'clay.mv_m2_per_kN' for the settlement");
    if (secondary_per_cycle_m(site) && !site.criterion.residual()->service_s)
        s.fail_at("target.residual_settlement_mm",
                  "with secondary compression (c_alpha) the residual settlement needs 'service_days': secondary "
                  "compression does not end");
}

Scenario read(const YAML::Node& root, const std::string& file) {
    Scenario s;
    s.file = file;
    Reader r(file, s.marks);
    if (!root || root.IsNull())
        r.fail_at({0, 0}, "", "the file holds no keys (it is empty, or only comments or punctuation); a scenario needs at "
                              "least 'schema: 1'");
    r.expect_map(root, "");
    r.allow_keys(root, "", top_keys);
    const double schema = r.number(root, "", "schema", {1.0, true, 1.0, true, ""});
    (void)schema;
    s.title = root["title"] ? r.text(root["title"], "title") : file;
    read_project(r, root, s);
    read_target(r, root, s);
    read_method(r, root, s);
    read_clay(r, root, s);
    read_calibration(r, root, s);
    read_embankment(r, root, s);
    read_loading(r, root, s);
    check_embankment(s);
    check_settlement_criterion(s);
    read_drains(r, root, s);
    Installation& in = s.site.installation;
    in.drain_length_m = r.optional_number(root, "", "drain_length_m", positive("m")).value_or(s.site.ground.thickness_m);
    if (!root["drain_length_m"]) s.marks["drain_length_m"] = s.marks["clay.thickness_m"];
    if (root["drain_outlets"]) in.outlets = r.choice(root["drain_outlets"], "drain_outlets", outlet_names);
    if (!root["method"]) s.site.method.method = default_method(s.site);
    read_installation(r, root, s);
    read_patterns(r, root, s);
    read_spacing(r, root, s);
    if (root["rank_by"]) {
        s.site.range.rank_by = r.choice(root["rank_by"], "rank_by", rank_by_names);
        if (*s.site.range.rank_by == RankingBasis::cost_per_hectare)
            for (std::size_t i = 0; i < s.site.products.size(); ++i)
                if (!s.site.products[i].cost_per_m)
                    r.fail(root["rank_by"], "rank_by",
                           "'cost' needs a cost_per_m on every drain product; drains[" + std::to_string(i) + "] ('" +
                               s.site.products[i].name + "') has none");
    }
    check_physics(r, s);
    auto top_up_warnings = plan_top_up(s);
    read_studies(r, root, s);
    read_uncertain(r, root, s);
    read_schedule(r, root, s);
    for (auto& w : plausibility_warnings(s)) s.input_warnings.push_back(std::move(w));
    for (auto& w : top_up_warnings) s.input_warnings.push_back(std::move(w));
    return s;
}

}  // namespace

std::optional<Mark> Scenario::mark_of(const std::string& key_path) const {
    const auto it = marks.find(key_path);
    if (it == marks.end()) return std::nullopt;
    return it->second;
}

void Scenario::fail_at(const std::string& key_path, const std::string& message) const {
    // A key the file does not give is reported against the file as a whole, never an invented line.
    throw ScenarioError(file, mark_of(key_path).value_or(Mark{0, 0}), key_path, message);
}

const DrainEntry& Scenario::drain(const std::string& name) const {
    for (const auto& d : drains)
        if (d.name == name) return d;
    std::vector<std::string> names;
    for (const auto& d : drains) names.push_back(d.name);
    std::string message = "no drain named '" + name + "'; the scenario lists " + Reader::list(names);
    if (auto best = closest(name, names)) message += "; did you mean '" + *best + "'?";
    throw ScenarioError(file, mark_of("drains").value_or(Mark{0, 0}), "drains", message);
}

namespace {
// The line where a second YAML document starts, if any: a '---' line after content, or content
// after a '...' line (comments and blank lines are not content).
std::optional<int> second_document_line(const std::string& text) {
    std::istringstream lines(text);
    std::string line;
    bool content = false, ended = false;
    for (int number = 1; std::getline(lines, line); ++number) {
        if (!line.empty() && line.back() == '\r') line.pop_back();
        const auto marker = [&](const char* m) {
            return line.rfind(m, 0) == 0 && (line.size() == 3 || line[3] == ' ' || line[3] == '\t');
        };
        if (marker("---")) {
            if (content || ended) return number;
            content = true;  // the explicit start of the first document
            continue;
        }
        if (marker("...")) {
            ended = true;
            continue;
        }
        const auto first = line.find_first_not_of(" \t");
        if (first == std::string::npos || line[first] == '#') continue;
        if (ended) return number;
        content = true;
    }
    return std::nullopt;
}

}  // namespace

Scenario parse_scenario(const std::string& text, const std::string& file_label) {
    // Text must be UTF-8: names and titles reach JSON, HTML, SVG and the terminal.
    require_utf8(text, file_label, "file");
    // A second document would be silently ignored by YAML::Load. (yaml-cpp's LoadAll is not used:
    // it loops for ever on some inputs, "," among them.) At column 1 a '---' or '...' can only be a
    // document marker, so a line scan finds the second document exactly.
    if (const auto second = second_document_line(text))
        throw ScenarioError(file_label, {*second, 1}, "",
                            "a second YAML document; a scenario file holds one (remove the '---' and what follows, or "
                            "split the file)");
    YAML::Node root;
    try {
        root = YAML::Load(text);
    } catch (const YAML::ParserException& e) {
        throw ScenarioError(file_label, {e.mark.line + 1, e.mark.column + 1}, "", "YAML syntax: " + e.msg);
    }
    try {
        Scenario s = read(root, file_label);
        s.sha256 = sha256_hex(text);
        s.text = text;
        return s;
    } catch (const YAML::Exception& e) {  // structure yaml-cpp could not convert
        throw ScenarioError(file_label, {e.mark.line + 1, e.mark.column + 1}, "", e.msg);
    }
}

Scenario load_scenario(const std::string& path) {
    // The path is shown (messages, JSON, headings) with any byte that is not UTF-8 escaped.
    const std::string label = display_path(path);
    std::error_code ec;
    if (std::filesystem::is_directory(path, ec))
        throw ScenarioError(label, {0, 0}, "", "is a folder, not a scenario file");
    std::ifstream in(path, std::ios::binary);
    if (!in) throw ScenarioError(label, {0, 0}, "", "cannot open the scenario file");
    std::ostringstream text;
    text << in.rdbuf();
    return parse_scenario(text.str(), label);
}

}  // namespace wickgrid::scenario
