// Stage checks and the earliest schedule; see stages.hpp for the model of the strength gained.
#include <algorithm>
#include <cmath>
#include <functional>

#include <boost/math/constants/constants.hpp>

#include "parallel_for.hpp"
#include "wickgrid/errors.hpp"
#include "wickgrid/stages.hpp"
#include "wickgrid/units.hpp"

namespace wickgrid {

namespace {
constexpr int gain_depths = 41;               // depths at which the consolidated share is sampled
constexpr int grid_offsets = 97, grid_depths = 49;  // the tabulated gain: offsets 0..toe × depths 0..H
constexpr double start_tolerance_s = 43200.0;  // earliest starts are found to half a day

// One stage of the schedule as placed: a permanent stage or the surcharge.
struct Placement {
    double start_s, end_s, pressure_kPa;
    bool surcharge;
    double removal_gap_s;  // surcharge: removal − end
};

// The stages in order of placing: the permanent stages by start, the surcharge after those that
// start before its removal, and a stage that starts once it is off (a top-up after removal) after it.
std::vector<Placement> placements(const LoadHistory& h) {
    std::vector<Placement> out;
    for (const LoadStage& s : h.stages) out.push_back({s.start_s, s.end_s, s.pressure_kPa, false, 0.0});
    std::stable_sort(out.begin(), out.end(), [](const Placement& a, const Placement& b) { return a.start_s < b.start_s; });
    if (h.surcharge) {
        const auto after = std::find_if(out.begin(), out.end(), [&](const Placement& p) { return p.start_s >= h.surcharge->removal_s; });
        out.insert(after, {h.surcharge->start_s, h.surcharge->end_s, h.surcharge->pressure_kPa, true,
                           h.surcharge->removal_s - h.surcharge->end_s});
    }
    return out;
}

// When the next stage may start at the earliest: after this one is placed, or, after the
// surcharge, once it is removed.
double next_from_s(const Placement& p) { return p.surcharge ? p.end_s + p.removal_gap_s : p.end_s; }

LoadHistory history_of(const std::vector<Placement>& placed) {
    LoadHistory h;
    for (const Placement& p : placed) {
        if (p.surcharge) h.surcharge = Surcharge{p.start_s, p.end_s, p.end_s + p.removal_gap_s, p.pressure_kPa};
        else h.stages.push_back({p.start_s, p.end_s, p.pressure_kPa});
    }
    return h;
}

void require_stage_inputs(const Site& site) {
    if (!site.embankment) throw InputError("embankment", "a cross-section block for stage checks");
    validate_section(*site.embankment);
    if (!site.loading || site.loading->stages.empty())
        throw InputError("loading.stages", "at least one stage for stage checks");
    if (site.loading->vacuum)
        throw InputError("loading.vacuum.pressure_kPa", site.loading->vacuum->pressure_kPa,
                         "absent for stage checks (strength gain under vacuum is not modelled)");
    if (!site.ground.profile) throw InputError("clay.layers", "given, each layer with su_top_kPa or su_ratio");
    for (std::size_t i = 0; i < site.ground.profile->layers.size(); ++i) {
        const auto& strength = site.ground.profile->layers[i].strength;
        if (!strength) throw InputError("clay.layers[" + std::to_string(i) + "].su_top_kPa", "given (or su_ratio)");
        validate_strength(*strength);
    }
}

struct StageState {
    double factor_of_safety;
    CircleResult critical;
    std::optional<double> settlement_m;
    std::optional<CircleResult> effective;  // asked for: the effective-stress check
};

StageState state_at(const Site& base, const DrainProductSpec& product, Pattern pattern, double spacing_m,
                    const LoadHistory& history, double time_s, bool effective = false) {
    Site site = base;
    site.loading = history;
    site.embankment->height_m = final_fill_height_m(base);  // the section being built, whatever is placed so far
    const auto model = make_cell_model(site, product, pattern, spacing_m);
    const CircleResult c = critical_circle(stage_slope_model(site, *model, time_s));
    StageState st{c.factor_of_safety, c, model->settlement_m(time_s), std::nullopt};
    if (effective)
        st.effective = critical_circle(stage_slope_model(site, *model, time_s, StrengthField::tabulated, StressBasis::effective));
    return st;
}

// The earliest start (>= from_s) at which `next`, placed after `before` with its own duration, meets
// the target at the end of its placement; nullopt when no wait within the search horizon does.
std::optional<double> earliest_start(const Site& site, const DrainProductSpec& product, Pattern pattern,
                                     double spacing_m, std::vector<Placement> placed, Placement next, double from_s,
                                     double target) {
    const double duration = next.end_s - next.start_s;
    const auto fs_if_started = [&](double s) {
        next.start_s = s;
        next.end_s = s + duration;
        placed.push_back(next);
        const double fs = state_at(site, product, pattern, spacing_m, history_of(placed), s + duration).factor_of_safety;
        placed.pop_back();
        return fs;
    };
    if (fs_if_started(from_s) >= target) return from_s;
    const double horizon = from_s + defaults::search_horizon_years * units::seconds_per_year;
    double lo = from_s, hi = from_s + units::seconds_per_day;
    while (fs_if_started(hi) < target) {
        if (hi >= horizon) return std::nullopt;
        lo = hi;
        hi = std::min(horizon, from_s + 2.0 * (hi - from_s));
    }
    while (hi - lo > start_tolerance_s) {
        const double mid = 0.5 * (lo + hi);
        (fs_if_started(mid) >= target ? hi : lo) = mid;
    }
    return hi;
}

// The check of the last of `placed` (numbered `number`) and, when another placement follows, the
// earliest day it may start.
StageCheck check_placement(const Site& site, const DrainProductSpec& product, Pattern pattern, double spacing_m,
                           const std::vector<Placement>& placed, int number, const Placement* following, bool effective) {
    const EmbankmentSection& section = *site.embankment;
    const Placement& p = placed.back();
    // The fill standing once it is placed (a surcharge removed before it no longer counts).
    const double height = history_of(placed).applied_at_kPa(p.end_s) / section.fill_unit_weight_kN_per_m3;
    const StageState st = state_at(site, product, pattern, spacing_m, history_of(placed), p.end_s, effective);
    StageCheck check{number, p.surcharge, p.start_s, p.end_s, height, st.factor_of_safety, st.critical,
                     st.effective ? std::optional<double>(st.effective->factor_of_safety) : std::nullopt,
                     st.effective, st.settlement_m, std::nullopt, true};
    if (following) {
        check.earliest_next_start_s = earliest_start(site, product, pattern, spacing_m, placed, *following,
                                                     next_from_s(p), section.target_factor_of_safety);
        check.next_reachable = check.earliest_next_start_s.has_value();
    }
    return check;
}

StagePlan run(const Site& site, const DrainProductSpec& product, Pattern pattern, double spacing_m, bool plan) {
    require_stage_inputs(site);
    const std::vector<Placement> all = placements(*site.loading);
    StagePlan out;
    out.target_factor_of_safety = site.embankment->target_factor_of_safety;
    out.planned = plan;
    const bool effective = has_effective_strength(site);
    // Stages are numbered as the scenario's load stages (the surcharge apart: the next number).
    std::vector<int> numbers;
    int permanent = 0;
    for (const Placement& p : all) numbers.push_back(p.surcharge ? permanent + 1 : ++permanent);
    const auto following = [&](std::size_t i) { return i + 1 < all.size() ? &all[i + 1] : nullptr; };
    if (!plan) {
        // As scheduled, each check stands alone: spread over the hardware threads.
        out.stages.resize(all.size());
        detail::parallel_for(all.size(), 0, [&](std::size_t i) {
            const std::vector<Placement> placed(all.begin(), all.begin() + static_cast<std::ptrdiff_t>(i) + 1);
            out.stages[i] = check_placement(site, product, pattern, spacing_m, placed, numbers[i], following(i), effective);
        });
        out.schedule = history_of(all);
        return out;
    }
    // Planned: each placement starts on the earliest day its predecessor's check allows.
    std::vector<Placement> placed;
    for (std::size_t i = 0; i < all.size(); ++i) {
        Placement p = all[i];
        if (i > 0) {
            const StageCheck& before = out.stages.back();
            if (!before.earliest_next_start_s) break;  // the plan cannot go on: its check says why
            const double duration = p.end_s - p.start_s;
            p.start_s = *before.earliest_next_start_s;
            p.end_s = p.start_s + duration;
        }
        placed.push_back(p);
        out.stages.push_back(check_placement(site, product, pattern, spacing_m, placed, numbers[i], following(i), effective));
    }
    out.schedule = history_of(placed);
    return out;
}


// The effective-stress field of a stage (stages.hpp, StressBasis::effective): c′, tanφ′ of the
// layer, and the pore pressure: hydrostatic below the groundwater table plus the excess, the
// section's stress Δσv times the unconsolidated share 1 − share(z) within the toes (1 beyond).
// Δσv is tabulated on offsets 0 .. toe + 3·(height + clay) and depths 0 .. clay (0 beyond).
std::function<SlopeModel::ClayEffective(double, double)> effective_field(const Site& site, const SlopeModel& m,
                                                                         const std::vector<double>& share, double dz) {
    const SoilProfile& profile = *site.ground.profile;
    for (std::size_t i = 0; i < profile.layers.size(); ++i)
        if (!profile.layers[i].effective_strength)
            throw InputError("clay.layers[" + std::to_string(i) + "].phi_prime_deg", "given with c_prime_kPa in every layer for the effective-stress check");
    const double gamma = site.embankment->fill_unit_weight_kN_per_m3, toe = m.profile.toe_m();
    const double reach = toe + 3.0 * (m.profile.height_m() + m.clay_thickness_m);
    const double hx = reach / (grid_offsets - 1), hz = m.clay_thickness_m / (grid_depths - 1);
    std::vector<double> stress(static_cast<std::size_t>(grid_offsets * grid_depths));
    for (int i = 0; i < grid_offsets; ++i)
        for (int j = 0; j < grid_depths; ++j)
            stress[static_cast<std::size_t>(i * grid_depths + j)] = embankment_stress_kPa(m.profile, gamma, i * hx, j * hz);
    std::vector<std::pair<double, SlopeModel::ClayEffective>> layers;  // bottom depth, strength
    double bottom = 0.0;
    for (const SoilLayer& l : profile.layers)
        layers.push_back({bottom += l.thickness_m,
                          {l.effective_strength->c_prime_kPa,
                           std::tan(l.effective_strength->phi_prime_deg * boost::math::double_constants::degree), 0.0}});
    return [stress = std::move(stress), layers, share, dz, hx, hz, reach, toe, dw = profile.groundwater_depth_m](double x, double z) {
        std::size_t k = 0;
        while (k + 1 < layers.size() && z > layers[k].first) ++k;
        SlopeModel::ClayEffective e = layers[k].second;
        double added = 0.0;
        if (std::fabs(x) < reach) {
            const double px = std::fabs(x) / hx, pz = std::clamp(z / hz, 0.0, grid_depths - 1.0);
            const int i = std::min(static_cast<int>(px), grid_offsets - 2), j = std::min(static_cast<int>(pz), grid_depths - 2);
            const double tx = px - i, tz = pz - j;
            const auto g = [&](int a, int b) { return stress[static_cast<std::size_t>(a * grid_depths + b)]; };
            added = (1 - tx) * ((1 - tz) * g(i, j) + tz * g(i, j + 1)) + tx * ((1 - tz) * g(i + 1, j) + tz * g(i + 1, j + 1));
        }
        double unconsolidated = 1.0;
        if (std::fabs(x) <= toe) {
            const double pos = std::clamp(z / dz, 0.0, static_cast<double>(share.size() - 1));
            const std::size_t s = std::min(static_cast<std::size_t>(pos), share.size() - 2);
            unconsolidated = 1.0 - (share[s] + (share[s + 1] - share[s]) * (pos - static_cast<double>(s)));
        }
        e.pore_pressure_kPa = units::gamma_w_kN_per_m3 * std::max(0.0, z - dw) + added * std::max(0.0, unconsolidated);
        return e;
    };
}
}  // namespace

Site with_planned_schedule(const Site& site, const StagePlan& plan) {
    Site planned = site;
    planned.loading = plan.schedule;
    planned.embankment->height_m = final_fill_height_m(site);
    return planned;
}

bool plan_is_complete(const Site& site, const StagePlan& plan) {
    return plan.stages.size() == placements(*site.loading).size();
}

bool has_effective_strength(const Site& site) {
    if (!site.ground.profile) return false;
    for (const SoilLayer& l : site.ground.profile->layers)
        if (!l.effective_strength) return false;
    return true;
}

SlopeModel stage_slope_model(const Site& site, const CellModel& model, double time_s, StrengthField field,
                             StressBasis basis) {
    require_stage_inputs(site);
    const SoilProfile& profile = *site.ground.profile;
    const EmbankmentSection& section = *site.embankment;
    const double q = site.loading->applied_at_kPa(time_s);
    const double height = q / section.fill_unit_weight_kN_per_m3;
    if (!(height > 0.0)) throw InputError("fill height at the time checked (m)", height, "greater than 0 (fill placed)");
    SlopeModel m;
    m.section = section;
    m.profile = fill_profile(section, std::max(height, final_fill_height_m(site).value_or(height)), height);
    m.clay_thickness_m = site.ground.thickness_m;
    double top = 0.0;
    for (const SoilLayer& l : profile.layers) {
        m.bands.push_back({top, top + l.thickness_m, l.unit_weight_kN_per_m3});
        top += l.thickness_m;
    }
    m.bands.back().bottom_m = m.clay_thickness_m;
    // The consolidated share (q − u)/q of the cell's load, sampled over depth.
    std::vector<double> depths(gain_depths), share(gain_depths, 0.0);
    for (int i = 0; i < gain_depths; ++i) depths[i] = m.clay_thickness_m * i / (gain_depths - 1);
    if (q > 0.0) {
        const auto states = model.over_depth(depths, time_s);
        if (!states)
            throw InputError("method", "the closed form or the layered series for stage checks (the numerical cell "
                                            "reports depth averages only)");
        for (int i = 0; i < gain_depths; ++i) share[i] = (q - (*states)[i].excess_pore_pressure_kPa) / q;
    }
    const double toe = m.profile.toe_m(), dz = depths[1], gamma = section.fill_unit_weight_kN_per_m3;
    // The gained effective stress at (x, z) within the toes: the share at z times the section's stress.
    const auto gained = [share, dz, gamma, fill = m.profile](double x, double z) {
        const double pos = std::clamp(z / dz, 0.0, static_cast<double>(share.size() - 1));
        const std::size_t k = std::min(static_cast<std::size_t>(pos), share.size() - 2);
        const double f = share[k] + (share[k + 1] - share[k]) * (pos - static_cast<double>(k));
        return f * embankment_stress_kPa(fill, gamma, x, z);
    };
    if (basis == StressBasis::effective) m.effective = effective_field(site, m, share, dz);
    // su at a point of a layer: its initial state, its preconsolidation and the gain at (x, z).
    const auto su_in_layer = [profile, toe, bands = m.bands](std::size_t layer, double x, double z, double gain) {
        // Inside the layer (a boundary point belongs to the layer above in initial_state).
        const double inside = std::clamp(z, bands[layer].top_m + 1e-9, bands[layer].bottom_m);
        const SliceState before = initial_state(profile, inside);
        const double sigma0 = std::max(0.0, before.sigma_v0_kPa), sigma_p = std::max(before.sigma_p_kPa, sigma0);
        return undrained_strength_kPa(*profile.layers[layer].strength, z - bands[layer].top_m, sigma0, sigma_p,
                                      std::fabs(x) <= toe ? gain : 0.0);
    };
    const auto layer_of = [bands = m.bands](double z) {
        std::size_t layer = 0;
        while (layer + 1 < bands.size() && z > bands[layer].bottom_m) ++layer;
        return layer;
    };
    if (field == StrengthField::exact) {
        m.su_kPa = [su_in_layer, layer_of, gained](double x, double z) {
            return su_in_layer(layer_of(z), x, z, gained(x, z));
        };
        return m;
    }
    // Tabulated: su itself on a grid per layer (offsets 0..toe × depths with nodes on the layer's top
    // and base, so no interpolation crosses a change of layer), bilinear between; beyond the toes,
    // where nothing is gained, a column per layer. The gain at each node is exact.
    struct LayerTable {
        double top_m, hz;
        int nz;
        std::vector<double> within, beyond;  // within: grid_offsets × nz; beyond: nz
    };
    const double hx = toe / (grid_offsets - 1), target_hz = m.clay_thickness_m / (grid_depths - 1);
    std::vector<LayerTable> tables;
    for (std::size_t k = 0; k < m.bands.size(); ++k) {
        const ClayBand& b = m.bands[k];
        LayerTable t{b.top_m, 0.0, std::max(2, static_cast<int>(std::ceil((b.bottom_m - b.top_m) / target_hz)) + 1), {}, {}};
        t.hz = (b.bottom_m - b.top_m) / (t.nz - 1);
        t.within.resize(static_cast<std::size_t>(grid_offsets * t.nz));
        t.beyond.resize(static_cast<std::size_t>(t.nz));
        for (int j = 0; j < t.nz; ++j) {
            const double z = b.top_m + j * t.hz;
            t.beyond[static_cast<std::size_t>(j)] = su_in_layer(k, 2.0 * toe + 1.0, z, 0.0);
            for (int i = 0; i < grid_offsets; ++i)
                t.within[static_cast<std::size_t>(i * t.nz + j)] = su_in_layer(k, i * hx, z, gained(i * hx, z));
        }
        tables.push_back(std::move(t));
    }
    m.su_kPa = [tables = std::move(tables), layer_of, hx, toe](double x, double z) {
        const LayerTable& t = tables[layer_of(z)];
        const double pz = std::clamp((z - t.top_m) / t.hz, 0.0, t.nz - 1.0);
        const int j = std::min(static_cast<int>(pz), t.nz - 2);
        const double tz = pz - j;
        const auto column = [&](const double* c) { return (1 - tz) * c[j] + tz * c[j + 1]; };
        if (std::fabs(x) > toe) return column(t.beyond.data());
        const double px = std::clamp(std::fabs(x) / hx, 0.0, grid_offsets - 1.0);
        const int i = std::min(static_cast<int>(px), grid_offsets - 2);
        const double tx = px - i;
        return (1 - tx) * column(&t.within[static_cast<std::size_t>(i * t.nz)]) +
               tx * column(&t.within[static_cast<std::size_t>((i + 1) * t.nz)]);
    };
    return m;
}

StagePlan check_stages(const Site& site, const DrainProductSpec& product, Pattern pattern, double spacing_m) {
    return run(site, product, pattern, spacing_m, false);
}

StagePlan plan_stages(const Site& site, const DrainProductSpec& product, Pattern pattern, double spacing_m) {
    return run(site, product, pattern, spacing_m, true);
}

std::vector<SafetyPoint> safety_history(const Site& site, const DrainProductSpec& product, Pattern pattern,
                                        double spacing_m, const std::vector<double>& times_s) {
    require_stage_inputs(site);
    // The times are independent: spread over the hardware threads, each with a cell model of its own.
    std::vector<std::optional<SafetyPoint>> at(times_s.size());
    detail::parallel_for(times_s.size(), 0, [&](std::size_t i) {
        const double t = times_s[i];
        const double q = site.loading->applied_at_kPa(t);
        if (q <= 0.0) return;
        const auto model = make_cell_model(site, product, pattern, spacing_m);
        const CircleResult c = critical_circle(stage_slope_model(site, *model, t));
        at[i] = SafetyPoint{t, q / site.embankment->fill_unit_weight_kN_per_m3, c.factor_of_safety, model->settlement_m(t)};
    });
    std::vector<SafetyPoint> out;
    for (auto& p : at)
        if (p) out.push_back(*p);
    return out;
}

}  // namespace wickgrid
