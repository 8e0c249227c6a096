// Scenario files (YAML, schema 1) → Scenario, with every error located in the file.
#include <yaml-cpp/yaml.h>

#include <cmath>
#include <fstream>
#include <set>
#include <sstream>

#include "scenario.hpp"
#include "suggest.hpp"
#include "wickgrid/errors.hpp"
#include "wickgrid/permeability.hpp"
#include "wickgrid/units.hpp"

namespace wickgrid::scenario {

ScenarioError::ScenarioError(std::string file, Mark mark, std::string key_path, std::string message)
    : std::runtime_error(file + ":" + std::to_string(mark.line) + ":" + std::to_string(mark.column) + ": " +
                         (key_path.empty() ? std::string() : key_path + ": ") + message),
      file_(std::move(file)),
      mark_(mark),
      key_path_(std::move(key_path)),
      message_(std::move(message)) {}

std::string_view to_string(SmearShape shape) {
    switch (shape) {
        case SmearShape::constant: return "constant";
        case SmearShape::linear: return "linear";
        case SmearShape::parabolic: return "parabolic";
    }
    return "constant";
}
std::string_view to_string(RadialTheory theory) {
    return theory == RadialTheory::hansbo_1981 ? "hansbo_1981" : "equal_strain_integral";
}
std::string_view to_string(VerticalDrainage drainage) {
    switch (drainage) {
        case VerticalDrainage::both_faces: return "both_faces";
        case VerticalDrainage::top_only: return "top_only";
        case VerticalDrainage::bottom_only: return "bottom_only";
    }
    return "both_faces";
}
std::string_view to_string(DrainOutlets outlets) {
    return outlets == DrainOutlets::top ? "top" : "top_and_bottom";
}

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
        return node.Scalar();
    }

    // One of a fixed set of names; returns its index.
    std::size_t choice(const YAML::Node& node, const std::string& path, const std::vector<std::string>& names) const {
        remember(path, node);
        if (!node.IsScalar()) fail(node, path, "must be one of " + list(names));
        const std::string value = node.Scalar();
        for (std::size_t i = 0; i < names.size(); ++i)
            if (names[i] == value) return i;
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
                                        "numerical_mesh"};
const std::vector<std::string> study_input_names{"ch_m2_per_year", "cv_m2_per_year", "kh_m_per_s",
                                                 "smear_diameter_ratio", "smear_permeability_ratio",
                                                 "discharge_capacity_m3_per_year"};
const std::vector<std::string> distribution_names{"normal", "lognormal", "uniform", "triangular"};
const std::vector<std::string> drainage_names{"both_faces", "top_only", "bottom_only"};
const std::vector<std::string> outlet_names{"top", "top_and_bottom"};
const std::vector<std::string> method_names{"hansbo_1979", "rixner_1986", "long_covo_1994"};
const std::vector<std::string> pattern_names{"triangular", "square"};
const std::vector<std::string> shape_names{"constant", "linear", "parabolic"};
const std::vector<std::string> theory_names{"hansbo_1981", "equal_strain_integral"};

void read_target(const Reader& r, const YAML::Node& root, Scenario& s) {
    const YAML::Node node = r.required(root, "", "target");
    r.expect_map(node, "target");
    r.allow_keys(node, "target", {"degree", "deadline_days", "residual_settlement_mm", "service_days"});
    if (node["degree"] && node["residual_settlement_mm"])
        r.fail(node["residual_settlement_mm"], "target.residual_settlement_mm",
               "give either 'degree' or 'residual_settlement_mm' as the design criterion, not both");
    if (node["residual_settlement_mm"]) {
        s.residual_limit_m = units::mm_to_m(r.number(node, "target", "residual_settlement_mm", non_negative("mm")));
        s.service_days = r.optional_number(node, "target", "service_days", positive("days"));
        s.target_degree = 0.9;  // not the criterion; kept for reports of the degree reached
    } else {
        if (node["service_days"])
            r.fail(node["service_days"], "target.service_days", "goes with 'residual_settlement_mm' only");
        s.target_degree = r.number(node, "target", "degree", {0.0, false, 1.0, false, ""});
    }
    s.deadline_days = r.number(node, "target", "deadline_days", positive("days"));
}

void read_layers(const Reader& r, const YAML::Node& clay, Scenario& s) {
    const YAML::Node node = clay["layers"];
    r.remember("clay.layers", node);
    if (!node.IsSequence() || node.size() == 0) r.fail(node, "clay.layers", "must be a list of at least one layer");
    SoilProfile profile;
    profile.groundwater_depth_m = r.optional_number(clay, "clay", "groundwater_depth_m", non_negative("m")).value_or(0.0);
    const double per_layer = r.optional_number(clay, "clay", "slices_per_layer", {1.0, true, 1000.0, true, "(whole number)"}).value_or(10.0);
    if (std::floor(per_layer) != per_layer) r.fail(clay["slices_per_layer"], "clay.slices_per_layer", "must be a whole number");
    profile.slices_per_layer = static_cast<int>(per_layer);
    for (std::size_t i = 0; i < node.size(); ++i) {
        const std::string path = "clay.layers[" + std::to_string(i) + "]";
        const YAML::Node l = node[i];
        r.expect_map(l, path);
        r.allow_keys(l, path, {"thickness_m", "unit_weight_kN_per_m3", "e0", "cc", "cr", "preconsolidation_kPa", "ocr",
                               "mv_m2_per_kN", "cv_m2_per_year", "ch_m2_per_year"});
        const auto cv = r.optional_number(l, path, "cv_m2_per_year", positive("m²/year"));
        const auto ch = r.optional_number(l, path, "ch_m2_per_year", positive("m²/year"));
        s.layer_cv_m2_per_s.push_back(cv ? std::optional<double>(units::per_year_to_per_second(*cv)) : std::nullopt);
        s.layer_ch_m2_per_s.push_back(ch ? std::optional<double>(units::per_year_to_per_second(*ch)) : std::nullopt);
        SoilLayer layer;
        layer.thickness_m = r.number(l, path, "thickness_m", positive("m"));
        layer.unit_weight_kN_per_m3 = r.number(l, path, "unit_weight_kN_per_m3", positive("kN/m³"));
        layer.mv_m2_per_kN = r.optional_number(l, path, "mv_m2_per_kN", positive("m²/kN"));
        if (layer.mv_m2_per_kN) {
            for (const char* key : {"e0", "cc", "cr", "preconsolidation_kPa", "ocr"})
                if (l[key]) r.fail(l[key], path + "." + key, "a layer takes either mv_m2_per_kN or e0/cc/cr, not both");
        } else {
            layer.e0 = r.number(l, path, "e0", positive(""));
            layer.cc = r.number(l, path, "cc", positive(""));
            layer.cr = r.number(l, path, "cr", non_negative(""));
            if (*layer.cr > *layer.cc) r.fail(l["cr"], path + ".cr", "must not exceed cc (recompression is stiffer than virgin compression)");
            if (l["preconsolidation_kPa"] && l["ocr"])
                r.fail(l["ocr"], path + ".ocr", "give either 'preconsolidation_kPa' or 'ocr', not both");
            if (!l["preconsolidation_kPa"] && !l["ocr"])
                r.fail(l, path, "missing key 'preconsolidation_kPa' or 'ocr' in '" + path + "'");
            layer.preconsolidation_kPa = r.optional_number(l, path, "preconsolidation_kPa", positive("kPa"));
            layer.ocr = r.optional_number(l, path, "ocr", {1.0, true, inf, false, ""});
        }
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
    s.profile = profile;
}

void read_clay(const Reader& r, const YAML::Node& root, Scenario& s) {
    const YAML::Node node = r.required(root, "", "clay");
    r.expect_map(node, "clay");
    r.allow_keys(node, "clay", {"thickness_m", "cv_m2_per_year", "ch_m2_per_year", "mv_m2_per_kN", "kh_m_per_s",
                                "vertical_drainage", "layers", "groundwater_depth_m", "slices_per_layer"});
    if (node["layers"]) read_layers(r, node, s);
    if (s.profile && !node["thickness_m"]) {
        s.clay.thickness_m = profile_thickness_m(*s.profile);
        s.marks["clay.thickness_m"] = s.mark_of("clay.layers");
    } else {
        s.clay.thickness_m = r.number(node, "clay", "thickness_m", positive("m"));
    }
    if (s.profile && std::fabs(profile_thickness_m(*s.profile) - s.clay.thickness_m) > 1e-9 * s.clay.thickness_m)
        r.fail(node["thickness_m"], "clay.thickness_m",
               format_value(s.clay.thickness_m) + " is not allowed: it must equal the sum of the layer thicknesses, " +
                   format_value(profile_thickness_m(*s.profile)) + " m");
    s.clay.cv_m2_per_s = units::per_year_to_per_second(r.number(node, "clay", "cv_m2_per_year", positive("m²/year")));
    s.clay.ch_m2_per_s = units::per_year_to_per_second(r.number(node, "clay", "ch_m2_per_year", positive("m²/year")));
    s.mv_m2_per_kN = r.optional_number(node, "clay", "mv_m2_per_kN", positive("m²/kN"));
    const auto kh = r.optional_number(node, "clay", "kh_m_per_s", positive("m/s"));
    if (!kh && !s.mv_m2_per_kN)
        r.fail(node, "clay", "missing key 'mv_m2_per_kN' or 'kh_m_per_s' in 'clay' (one is needed for kh)");
    s.kh_given = kh.has_value();
    s.clay.kh_m_per_s = kh ? *kh : permeability_from_consolidation_m_per_s(s.clay.ch_m2_per_s, *s.mv_m2_per_kN);
    s.clay.drainage = static_cast<VerticalDrainage>(
        r.choice(r.required(node, "clay", "vertical_drainage"), "clay.vertical_drainage", drainage_names));
}

DrainEntry read_drain(const Reader& r, const YAML::Node& node, const std::string& path) {
    r.expect_map(node, path);
    r.allow_keys(node, path, {"name", "width_mm", "thickness_mm", "equivalent_diameter", "equivalent_diameter_mm",
                              "discharge_capacity_m3_per_year", "cost_per_m"});
    DrainEntry d;
    d.name = r.text(r.required(node, path, "name"), path + ".name");
    const auto width = r.optional_number(node, path, "width_mm", positive("mm"));
    const auto thickness = r.optional_number(node, path, "thickness_mm", positive("mm"));
    const auto diameter = r.optional_number(node, path, "equivalent_diameter_mm", positive("mm"));
    if (width) d.width_m = units::mm_to_m(*width);
    if (thickness) d.thickness_m = units::mm_to_m(*thickness);
    if (diameter && node["equivalent_diameter"])
        r.fail(node["equivalent_diameter"], path + ".equivalent_diameter",
               "give either 'equivalent_diameter' (a method) or 'equivalent_diameter_mm' (a value), not both");
    if (diameter) {
        d.equivalent_diameter_m = units::mm_to_m(*diameter);
    } else {
        if (!width) r.required(node, path, "width_mm");
        if (!thickness) r.required(node, path, "thickness_mm");
        d.method = node["equivalent_diameter"]
                       ? static_cast<EquivalentDiameterMethod>(
                             r.choice(node["equivalent_diameter"], path + ".equivalent_diameter", method_names))
                       : EquivalentDiameterMethod::hansbo_1979;
        d.equivalent_diameter_m = band_drain_equivalent_diameter_m(*d.method, *d.width_m, *d.thickness_m);
    }
    d.discharge_capacity_m3_per_s = units::per_year_to_per_second(
        r.number(node, path, "discharge_capacity_m3_per_year", positive("m³/year")));
    d.cost_per_m = r.optional_number(node, path, "cost_per_m", non_negative("per metre"));
    return d;
}

void read_drains(const Reader& r, const YAML::Node& root, Scenario& s) {
    const YAML::Node node = r.required(root, "", "drains");
    if (!node.IsSequence() || node.size() == 0)
        r.fail(node, "drains", "must be a list of at least one drain product");
    std::set<std::string> names;
    for (std::size_t i = 0; i < node.size(); ++i) {
        const std::string path = "drains[" + std::to_string(i) + "]";
        DrainEntry d = read_drain(r, node[i], path);
        if (!names.insert(d.name).second) r.fail(node[i]["name"], path + ".name", "drain name '" + d.name + "' is used twice");
        s.drains.push_back(std::move(d));
    }
}

void read_installation(const Reader& r, const YAML::Node& root, Scenario& s) {
    const YAML::Node node = r.required(root, "", "installation");
    const std::string p = "installation";
    r.expect_map(node, p);
    r.allow_keys(node, p, {"mandrel_width_mm", "mandrel_depth_mm", "mandrel_diameter_mm", "smear_diameter_ratio",
                           "smear_permeability_ratio", "smear_shape", "radial_theory"});
    const auto diameter = r.optional_number(node, p, "mandrel_diameter_mm", positive("mm"));
    if (diameter) {
        if (node["mandrel_width_mm"])
            r.fail(node["mandrel_width_mm"], p + ".mandrel_width_mm",
                   "give either 'mandrel_diameter_mm' or 'mandrel_width_mm' with 'mandrel_depth_mm', not both");
        s.mandrel_diameter_m = units::mm_to_m(*diameter);
    } else {
        s.mandrel_width_m = units::mm_to_m(r.number(node, p, "mandrel_width_mm", positive("mm")));
        s.mandrel_depth_m = units::mm_to_m(r.number(node, p, "mandrel_depth_mm", positive("mm")));
        s.mandrel_diameter_m = mandrel_equivalent_diameter_m(*s.mandrel_width_m, *s.mandrel_depth_m);
    }
    s.smear_diameter_ratio = r.number(node, p, "smear_diameter_ratio", positive("(ds/dm)"));
    s.smear_permeability_ratio =
        r.number(node, p, "smear_permeability_ratio", {1.0, true, inf, false, "(kh/ks; 1 means no disturbance)"});
    if (node["smear_shape"])
        s.smear_shape = static_cast<SmearShape>(r.choice(node["smear_shape"], p + ".smear_shape", shape_names));
    s.radial_theory = s.smear_shape == SmearShape::constant ? RadialTheory::hansbo_1981
                                                            : RadialTheory::equal_strain_integral;
    if (node["radial_theory"]) {
        s.radial_theory = static_cast<RadialTheory>(r.choice(node["radial_theory"], p + ".radial_theory", theory_names));
        if (s.radial_theory == RadialTheory::hansbo_1981 && s.smear_shape != SmearShape::constant)
            r.fail(node["radial_theory"], p + ".radial_theory",
                   "hansbo_1981 is the closed form for a constant smear zone; with smear_shape '" +
                       std::string(to_string(s.smear_shape)) + "' use equal_strain_integral");
    }
}

void read_patterns(const Reader& r, const YAML::Node& root, Scenario& s) {
    if (!root["patterns"]) {
        s.patterns = {Pattern::triangular, Pattern::square};
        return;
    }
    const YAML::Node node = root["patterns"];
    r.remember("patterns", node);
    if (!node.IsSequence() || node.size() == 0) r.fail(node, "patterns", "must be a list of triangular and/or square");
    for (std::size_t i = 0; i < node.size(); ++i) {
        const std::string path = "patterns[" + std::to_string(i) + "]";
        const auto p = static_cast<Pattern>(r.choice(node[i], path, pattern_names));
        if (std::find(s.patterns.begin(), s.patterns.end(), p) != s.patterns.end())
            r.fail(node[i], path, "pattern '" + std::string(to_string(p)) + "' is listed twice");
        s.patterns.push_back(p);
    }
}

void read_spacing(const Reader& r, const YAML::Node& root, Scenario& s) {
    const YAML::Node node = r.required(root, "", "spacing");
    r.expect_map(node, "spacing");
    r.allow_keys(node, "spacing", {"min_m", "max_m", "increment_m"});
    s.spacing.min_m = r.number(node, "spacing", "min_m", positive("m"));
    s.spacing.max_m = r.number(node, "spacing", "max_m", {s.spacing.min_m, false, inf, false, "m (above min_m)"});
    s.increment_m = r.optional_number(node, "spacing", "increment_m", positive("m")).value_or(0.05);
    if (s.increment_m > s.spacing.max_m - s.spacing.min_m)
        r.fail(node["increment_m"], "spacing.increment_m",
               format_value(s.increment_m) + " is not allowed: it must be at most max_m − min_m = " +
                   format_value(s.spacing.max_m - s.spacing.min_m) + " m");
}

// Physical checks that join several keys, reported at the key a user would change.
void check_physics(const Reader& r, Scenario& s) {
    if (s.numerical && !(s.drain_length_m <= s.clay.thickness_m * (1 + 1e-12)))
        r.fail_at(s.mark_of("drain_length_m"), "drain_length_m",
                  format_value(s.drain_length_m) + " is not allowed: it must be at most clay.thickness_m = " +
                      format_value(s.clay.thickness_m) + " m");
    if (!s.numerical && std::fabs(s.drain_length_m - s.clay.thickness_m) > 1e-9 * s.clay.thickness_m)
        r.fail_at(s.mark_of("drain_length_m"), "drain_length_m",
                  format_value(s.drain_length_m) + " is not allowed: it must equal clay.thickness_m = " +
                      format_value(s.clay.thickness_m) +
                      " m (drains that stop short of the clay base need 'method: numerical')");
    const double ds = s.smear_diameter_ratio * s.mandrel_diameter_m;
    for (std::size_t i = 0; i < s.drains.size(); ++i) {
        const auto& d = s.drains[i];
        if (ds < d.equivalent_diameter_m)
            r.fail_at(s.mark_of("installation.smear_diameter_ratio"), "installation.smear_diameter_ratio",
                      format_value(s.smear_diameter_ratio) + " gives a smear zone of " + format_value(ds * 1000.0) +
                          " mm, smaller than the equivalent diameter of drain '" + d.name + "' (" +
                          format_value(d.equivalent_diameter_m * 1000.0) +
                          " mm); it must be at least " + format_value(d.equivalent_diameter_m / s.mandrel_diameter_m));
        for (const Pattern p : s.patterns) {
            const double lowest = spacing_from_influence_diameter_m(p, ds);
            if (s.spacing.min_m <= lowest)
                r.fail_at(s.mark_of("spacing.min_m"), "spacing.min_m",
                          format_value(s.spacing.min_m) + " is not allowed: it must be greater than " +
                              format_value(lowest) + " m so that the smear zone (" + format_value(ds * 1000.0) +
                              " mm) lies inside the unit cell of a " + std::string(to_string(p)) + " pattern");
        }
    }
    // Every cell the search may build must be valid; the engine's own checks, located.
    const DesignInput input = s.design_input();
    for (std::size_t i = 0; i < input.products.size(); ++i)
        for (const Pattern p : s.patterns)
            for (const double spacing : {s.spacing.min_m, s.spacing.max_m}) {
                try {
                    if (s.numerical) NumericalCell cell(numerical_cell(input, input.products[i], p, spacing), input.numerical_mesh);
                    else UnitCell cell(product_cell(input, input.products[i], p, spacing));
                } catch (const InputError& e) {
                    const std::string key = spacing == s.spacing.min_m ? "spacing.min_m" : "spacing.max_m";
                    r.fail_at(s.mark_of(key), key,
                              std::string(e.what()) + " (drain '" + s.drains[i].name + "', " +
                                  std::string(to_string(p)) + " pattern)");
                }
            }
}

// A study value must lie in the physical range of its input (ratios above 1, smear inside the
// smallest cell...); checked here so the error points at the value.
double study_value(const Reader& r, const YAML::Node& node, const std::string& path, StudyInput input,
                   const DesignInput& design) {
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

StudyInput study_input(const Reader& r, const YAML::Node& node, const std::string& path) {
    return static_cast<StudyInput>(r.choice(node, path, study_input_names));
}

void read_studies(const Reader& r, const YAML::Node& root, Scenario& s) {
    if (!root["studies"]) return;
    const YAML::Node node = root["studies"];
    r.expect_map(node, "studies");
    r.allow_keys(node, "studies", {"tornado", "grid"});
    const DesignInput design = s.design_input();
    if (const YAML::Node t = node["tornado"]) {
        r.expect_map(t, "studies.tornado");
        r.allow_keys(t, "studies.tornado", study_input_names);
        for (auto it = t.begin(); it != t.end(); ++it) {
            const std::string name = it->first.as<std::string>();
            const std::string path = "studies.tornado." + name;
            const StudyInput input = study_input(r, it->first, path);
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
            out.input = study_input(r, r.required(a, path, "input"), path + ".input");
            out.from_si = study_value(r, r.required(a, path, "from"), path + ".from", out.input, design);
            out.to_si = study_value(r, r.required(a, path, "to"), path + ".to", out.input, design);
            if (!(out.to_si > out.from_si)) r.fail(a["to"], path + ".to", "must be greater than 'from'");
            out.steps = static_cast<int>(
                r.optional_number(a, path, "steps", {2.0, true, 1001.0, true, "(whole number)"}).value_or(11.0));
            if (a["steps"] && std::floor(a["steps"].as<double>()) != a["steps"].as<double>())
                r.fail(a["steps"], path + ".steps", "must be a whole number from 2 to 1001");
            return out;
        };
        s.studies.grid_x = axis("x");
        s.studies.grid_y = axis("y");
        if (s.studies.grid_x.input == s.studies.grid_y.input)
            r.fail(g["y"]["input"], "studies.grid.y.input", "must differ from studies.grid.x.input");
        s.studies.grid_given = true;
    }
}

Distribution read_distribution(const Reader& r, const YAML::Node& node, const std::string& path, StudyInput input) {
    r.expect_map(node, path);
    const auto kind = static_cast<DistributionKind>(
        r.choice(r.required(node, path, "distribution"), path + ".distribution", distribution_names));
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
    keys.insert(keys.end(), study_input_names.begin(), study_input_names.end());
    r.allow_keys(node, p, keys);
    MonteCarloSpec mc;
    const auto whole = [&](const char* key, double low, double high, double fallback) {
        const auto v = r.optional_number(node, p, key, {low, true, high, true, "(whole number)"});
        if (v && std::floor(*v) != *v) r.fail(node[key], p + "." + key, "must be a whole number");
        return v.value_or(fallback);
    };
    mc.samples = static_cast<std::size_t>(whole("samples", 1.0, 1e9, 10000.0));
    mc.seed = static_cast<std::uint64_t>(whole("seed", 0.0, 9007199254740992.0, 1.0));
    mc.reliability = r.optional_number(node, p, "reliability", {0.0, false, 1.0, false, ""}).value_or(0.9);
    mc.confidence = r.optional_number(node, p, "confidence", {0.0, false, 1.0, false, ""}).value_or(0.95);
    mc.spacing_m = r.optional_number(node, p, "spacing_m", {s.spacing.min_m, true, s.spacing.max_m, true, "m"});
    mc.ch_cv_correlation = r.optional_number(node, p, "ch_cv_correlation", {-1.0, false, 1.0, false, ""}).value_or(0.0);
    const DesignInput design = s.design_input();
    for (const auto& name : study_input_names) {
        if (!node[name]) continue;
        const std::string path = p + "." + name;
        const StudyInput input = study_input(r, YAML::Node(name), path);
        const Distribution d = read_distribution(r, node[name], path, input);
        try {
            TruncatedDistribution(d, physical_range(design, input), name);
        } catch (const InputError& e) {
            r.fail(node[name], path, e.what());
        }
        mc.inputs.push_back({input, d});
    }
    if (mc.inputs.empty()) r.fail(node, p, "needs at least one uncertain input: " + Reader::list(study_input_names));
    s.studies.monte_carlo = mc;
}

// A pressure from `pressure_kPa` or from `height_m` of fill.
double stage_pressure(const Reader& r, const YAML::Node& node, const std::string& path, const Scenario& s) {
    if (node["height_m"] && node["pressure_kPa"])
        r.fail(node["pressure_kPa"], path + ".pressure_kPa", "give either 'height_m' or 'pressure_kPa', not both");
    if (node["height_m"]) {
        const double h = r.number(node, path, "height_m", positive("m"));
        if (!s.fill_unit_weight_kN_per_m3)
            r.fail(node["height_m"], path + ".height_m", "a fill height needs 'fill_unit_weight_kN_per_m3' at the top level");
        return h * *s.fill_unit_weight_kN_per_m3;
    }
    if (!node["pressure_kPa"]) r.fail(node, path, "missing key 'height_m' or 'pressure_kPa' in '" + path + "'");
    return r.number(node, path, "pressure_kPa", positive("kPa"));
}

void read_loading(const Reader& r, const YAML::Node& root, Scenario& s) {
    s.fill_unit_weight_kN_per_m3 = r.optional_number(root, "", "fill_unit_weight_kN_per_m3", positive("kN/m³"));
    if (!root["loading"]) return;
    const YAML::Node node = root["loading"];
    r.expect_map(node, "loading");
    r.allow_keys(node, "loading", {"stages", "surcharge"});
    const YAML::Node stages = r.required(node, "loading", "stages");
    if (!stages.IsSequence() || stages.size() == 0) r.fail(stages, "loading.stages", "must be a list of at least one stage");
    LoadHistory h;
    for (std::size_t i = 0; i < stages.size(); ++i) {
        const std::string path = "loading.stages[" + std::to_string(i) + "]";
        const YAML::Node st = stages[i];
        r.expect_map(st, path);
        r.allow_keys(st, path, {"start_day", "end_day", "height_m", "pressure_kPa"});
        LoadStage stage;
        const double start = r.number(st, path, "start_day", non_negative("days"));
        const double end = r.optional_number(st, path, "end_day", {start, true, inf, false, "days (not before start_day)"}).value_or(start);
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
        const double start = r.number(sc, path, "start_day", non_negative("days"));
        const double end = r.optional_number(sc, path, "end_day", {start, true, inf, false, "days (not before start_day)"}).value_or(start);
        const double removal = r.number(sc, path, "removal_day", {end, false, inf, false, "days (after end_day)"});
        sur.start_s = units::days_to_seconds(start);
        sur.end_s = units::days_to_seconds(end);
        sur.removal_s = units::days_to_seconds(removal);
        sur.pressure_kPa = stage_pressure(r, sc, path, s);
        s.surcharge_max_height_m = r.optional_number(sc, path, "max_height_m", positive("m"));
        h.surcharge = sur;
    }
    s.loading = h;
}

void read_method(const Reader& r, const YAML::Node& root, Scenario& s) {
    if (root["method"]) s.numerical = r.choice(root["method"], "method", {"analytical", "numerical"}) == 1;
    if (const YAML::Node m = root["numerical_mesh"]) {
        r.expect_map(m, "numerical_mesh");
        r.allow_keys(m, "numerical_mesh", {"radial_cells", "vertical_cells", "max_degree_step"});
        const auto whole = [&](const char* key, double low, double high, int fallback) {
            const auto v = r.optional_number(m, "numerical_mesh", key, {low, true, high, true, "(whole number)"});
            if (v && std::floor(*v) != *v) r.fail(m[key], std::string("numerical_mesh.") + key, "must be a whole number");
            return v ? static_cast<int>(*v) : fallback;
        };
        s.numerical_mesh.radial_cells = whole("radial_cells", 4, 2000, 20);
        s.numerical_mesh.vertical_cells = whole("vertical_cells", 2, 4000, 40);
        s.numerical_mesh.max_degree_step =
            r.optional_number(m, "numerical_mesh", "max_degree_step", {0.0, false, 0.1, true, ""}).value_or(0.005);
    }
    if (s.numerical && s.residual_limit_m)
        r.fail_at(s.mark_of("target.residual_settlement_mm"), "target.residual_settlement_mm",
                  "'method: numerical' designs for a degree; use 'degree' or the analytical method");
    for (std::size_t i = 0; i < s.layer_cv_m2_per_s.size(); ++i)
        if ((s.layer_cv_m2_per_s[i] || s.layer_ch_m2_per_s[i]) && !s.numerical)
            r.fail_at(s.mark_of("clay.layers"), "clay.layers[" + std::to_string(i) + "]",
                      "layer cv/ch values need 'method: numerical' (the closed form takes one cv and ch for the clay)");
}

void check_settlement_criterion(const Reader& r, const Scenario& s) {
    if (!s.residual_limit_m) return;
    if (!s.loading)
        r.fail_at(s.mark_of("target.residual_settlement_mm"), "target.residual_settlement_mm",
                  "a residual settlement criterion needs a 'loading' block (the load that causes settlement)");
    if (!s.profile && !s.mv_m2_per_kN)
        r.fail_at(s.mark_of("target.residual_settlement_mm"), "target.residual_settlement_mm",
                  "a residual settlement criterion needs 'clay.layers' or 'clay.mv_m2_per_kN' for the settlement");
}

Scenario read(const YAML::Node& root, const std::string& file) {
    Scenario s;
    s.file = file;
    Reader r(file, s.marks);
    if (!root || root.IsNull()) r.fail_at({1, 1}, "", "the file is empty; a scenario needs at least 'schema: 1'");
    r.expect_map(root, "");
    r.allow_keys(root, "", top_keys);
    const double schema = r.number(root, "", "schema", {1.0, true, 1.0, true, ""});
    (void)schema;
    s.title = root["title"] ? r.text(root["title"], "title") : file;
    read_target(r, root, s);
    read_clay(r, root, s);
    read_loading(r, root, s);
    check_settlement_criterion(r, s);
    read_method(r, root, s);
    read_drains(r, root, s);
    s.drain_length_m = r.optional_number(root, "", "drain_length_m", positive("m")).value_or(s.clay.thickness_m);
    if (!root["drain_length_m"]) s.marks["drain_length_m"] = s.mark_of("clay.thickness_m");
    if (root["drain_outlets"])
        s.outlets = static_cast<DrainOutlets>(r.choice(root["drain_outlets"], "drain_outlets", outlet_names));
    read_installation(r, root, s);
    read_patterns(r, root, s);
    read_spacing(r, root, s);
    check_physics(r, s);
    read_studies(r, root, s);
    read_uncertain(r, root, s);
    return s;
}

}  // namespace

Mark Scenario::mark_of(const std::string& key_path) const {
    const auto it = marks.find(key_path);
    return it == marks.end() ? Mark{1, 1} : it->second;
}

const DrainEntry& Scenario::drain(const std::string& name) const {
    for (const auto& d : drains)
        if (d.name == name) return d;
    std::vector<std::string> names;
    for (const auto& d : drains) names.push_back(d.name);
    std::string message = "no drain named '" + name + "'; the scenario lists " + Reader::list(names);
    if (auto best = closest(name, names)) message += "; did you mean '" + *best + "'?";
    throw ScenarioError(file, mark_of("drains"), "drains", message);
}

DesignInput Scenario::design_input() const {
    DesignInput in;
    in.clay = clay;
    if (!kh_given) in.mv_m2_per_kN = mv_m2_per_kN;
    in.installation.smear_shape = smear_shape;
    in.installation.smear_permeability_ratio = smear_permeability_ratio;
    in.installation.length_m = drain_length_m;
    in.installation.outlets = outlets;
    in.installation.theory = radial_theory;
    in.mandrel_diameter_m = mandrel_diameter_m;
    in.smear_diameter_ratio = smear_diameter_ratio;
    for (const auto& d : drains)
        in.products.push_back({d.name, d.equivalent_diameter_m, d.discharge_capacity_m3_per_s, d.cost_per_m});
    in.patterns = patterns;
    in.target_degree = target_degree;
    in.deadline_s = units::days_to_seconds(deadline_days);
    in.bounds = spacing;
    in.increment_m = increment_m;
    in.loading = loading;
    in.profile = profile;
    if (!profile) in.clay_mv_m2_per_kN = mv_m2_per_kN;
    in.residual_limit_m = residual_limit_m;
    if (service_days) in.service_s = units::days_to_seconds(*service_days);
    in.numerical = numerical;
    in.numerical_mesh = numerical_mesh;
    if (numerical && profile) {
        // Layer mv for storage: given, or the secant of the e–log curve under the final load
        // (a 50 kPa probe without loading), so that each layer keeps its share of settlement.
        const double q = loading ? loading->permanent_kPa() : 50.0;
        const auto all = slices(*profile);
        std::size_t k = 0;
        for (std::size_t i = 0; i < profile->layers.size(); ++i) {
            const SoilLayer& layer = profile->layers[i];
            double settle = 0.0;
            for (int j = 0; j < profile->slices_per_layer; ++j) settle += slice_settlement_m(layer, all[k++], q);
            NumericalLayer n;
            n.thickness_m = layer.thickness_m;
            n.mv_m2_per_kN = layer.mv_m2_per_kN ? *layer.mv_m2_per_kN : settle / (q * layer.thickness_m);
            n.cv_m2_per_s = layer_cv_m2_per_s[i].value_or(clay.cv_m2_per_s);
            n.ch_m2_per_s = layer_ch_m2_per_s[i].value_or(clay.ch_m2_per_s);
            in.numerical_layers.push_back(n);
        }
    }
    return in;
}

Scenario parse_scenario(const std::string& text, const std::string& file_label) {
    YAML::Node root;
    try {
        root = YAML::Load(text);
    } catch (const YAML::ParserException& e) {
        throw ScenarioError(file_label, {e.mark.line + 1, e.mark.column + 1}, "", "YAML syntax: " + e.msg);
    }
    try {
        return read(root, file_label);
    } catch (const YAML::Exception& e) {  // structure yaml-cpp could not convert
        throw ScenarioError(file_label, {e.mark.line + 1, e.mark.column + 1}, "", e.msg);
    }
}

Scenario load_scenario(const std::string& path) {
    std::ifstream in(path, std::ios::binary);
    if (!in) throw ScenarioError(path, {0, 0}, "", "cannot open the scenario file");
    std::ostringstream text;
    text << in.rdbuf();
    return parse_scenario(text.str(), path);
}

}  // namespace wickgrid::scenario
