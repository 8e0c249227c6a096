// Numerical unit cell: axisymmetric finite volumes (log-graded in r, layered in z), the drain as a
// one-dimensional conduit coupled to the soil, backward Euler in time with a step that doubles or
// halves to keep the change of U per step near a target; sparse LDLᵀ (Eigen SimplicialLDLT).
#include <Eigen/SparseCholesky>
#include <Eigen/SparseCore>
#include <algorithm>
#include <boost/math/constants/constants.hpp>
#include <cmath>
#include <map>

#include "wickgrid/errors.hpp"
#include "wickgrid/numerical.hpp"
#include "wickgrid/units.hpp"

namespace wickgrid {

namespace {
constexpr double pi = boost::math::double_constants::pi;
using Matrix = Eigen::SparseMatrix<double>;
using Vector = Eigen::VectorXd;

// Faces of n cells between a and b, evenly spaced in ln r.
void log_faces(double a, double b, int n, std::vector<double>& faces) {
    for (int i = 1; i <= n; ++i) faces.push_back(a * std::pow(b / a, static_cast<double>(i) / n));
}

struct Jump {
    double time_s;
    double delta_kPa;
};
}  // namespace

struct NumericalCell::Impl {
    int nr = 0, nz = 0;
    std::size_t n = 0;
    Matrix stiffness;        // K: conductances, Dirichlet boundaries on the diagonal
    Vector storage;          // M diagonal: mv·V (0 at drain nodes)
    Vector volume;           // V (0 at drain nodes)
    double mv_volume = 0.0;  // Σ mv·V
    Vector vacuum_source;    // right-hand side per kPa of vacuum at the drain head (drain-wall flux of w)
    double reference = 1.0;  // Σ mv·V·(final effective stress increase): the permanent load's, or the steady vacuum's
    double total_volume = 0.0;
    double final_kPa = 1.0;
    double first_step_s = 0.0;
    double max_degree_step = 0.005;
    LoadHistory loads;
    std::vector<Jump> jumps;
    std::vector<double> breaks;  // times where the continuous load changes slope

    // Continuous part of the applied load at t (ramps), kPa.
    double ramp_load(double t) const {
        double q = 0.0;
        for (const auto& s : loads.stages)
            if (s.end_s > s.start_s) q += s.pressure_kPa * std::clamp((t - s.start_s) / (s.end_s - s.start_s), 0.0, 1.0);
        if (loads.surcharge && loads.surcharge->end_s > loads.surcharge->start_s) {  // removal is a jump
            const auto& s = *loads.surcharge;
            q += s.pressure_kPa * std::clamp((t - s.start_s) / (s.end_s - s.start_s), 0.0, 1.0);
        }
        return q;
    }
    // Applied load at t (right-continuous).
    double load(double t) const {
        double q = ramp_load(t);
        for (const auto& j : jumps)
            if (j.time_s <= t) q += j.delta_kPa;
        return q;
    }

    double degree_settlement(const Vector& u, double t) const {
        const double q = load(t);
        double strain = 0.0;
        for (std::size_t k = 0; k < n; ++k) strain += storage[k] * (q - u[k]);
        return strain / reference;
    }
    double degree_pore_pressure(const Vector& u, double t) const {
        const double q = load(t);
        if (!(q > 0.0)) return 0.0;
        double sum = 0.0;
        for (std::size_t k = 0; k < n; ++k) sum += volume[k] * u[k];
        return 1.0 - sum / (total_volume * q);
    }
};

NumericalCellSpec numerical_spec(const CellSpec& spec, std::optional<LoadHistory> loading) {
    validate_clay(spec.clay);
    NumericalCellSpec n;
    const double mv = spec.clay.kh_m_per_s / (spec.clay.ch_m2_per_s * units::gamma_w_kN_per_m3);
    n.layers = {{spec.clay.thickness_m, spec.clay.cv_m2_per_s, spec.clay.ch_m2_per_s, mv}};
    n.drainage = spec.clay.drainage;
    n.drain_diameter_m = spec.drain.equivalent_diameter_m;
    n.smear_diameter_m = spec.drain.smear_diameter_m;
    n.smear_shape = spec.drain.smear_shape;
    n.smear_permeability_ratio = spec.drain.smear_permeability_ratio;
    n.discharge_capacity_m3_per_s = spec.drain.discharge_capacity_m3_per_s;
    n.drain_length_m = spec.drain.length_m;
    n.outlets = spec.drain.outlets;
    n.influence_diameter_m = influence_diameter_m(spec.pattern, spec.spacing_m);
    n.loading = std::move(loading);
    return n;
}

NumericalCell::NumericalCell(const NumericalCellSpec& spec, const NumericalMesh& mesh) {
    if (spec.layers.empty()) throw InputError("number of numerical layers", 0.0, "at least 1");
    double height = 0.0;
    for (const auto& l : spec.layers) {
        require_positive("layer thickness (m)", l.thickness_m);
        require_non_negative("layer cv (m²/s)", l.cv_m2_per_s);
        require_positive("layer ch (m²/s)", l.ch_m2_per_s);
        require_positive("layer mv (m²/kN)", l.mv_m2_per_kN);
        height += l.thickness_m;
    }
    if (mesh.radial_cells < 4 || mesh.radial_cells > 2000)
        throw InputError("radial cells", mesh.radial_cells, "from 4 to 2000");
    if (mesh.vertical_cells < 2 || mesh.vertical_cells > 4000)
        throw InputError("vertical cells", mesh.vertical_cells, "from 2 to 4000");
    require_open_unit("largest degree step", mesh.max_degree_step);
    const double rw = 0.5 * spec.drain_diameter_m, rs = 0.5 * spec.smear_diameter_m, re = 0.5 * spec.influence_diameter_m;
    require_positive("drain diameter (m)", spec.drain_diameter_m);
    require_at_least("smear diameter (m)", spec.smear_diameter_m, spec.drain_diameter_m, "at least the drain diameter");
    require_greater("influence diameter (m)", spec.influence_diameter_m, spec.smear_diameter_m, "greater than the smear diameter");
    require_positive("smear permeability ratio kh/ks", spec.smear_permeability_ratio);
    if (!(spec.discharge_capacity_m3_per_s > 0.0))
        throw InputError("discharge capacity qw (m³/s)", spec.discharge_capacity_m3_per_s, "greater than 0");
    const double length = spec.has_drain ? spec.drain_length_m : 0.0;
    if (spec.has_drain && !(length > 0.0 && length <= height * (1 + 1e-12)))
        throw InputError("drain length (m)", length, "greater than 0 and at most the clay thickness " + format_value(height) + " m");
    if (spec.loading) validate_load_history(*spec.loading);

    auto impl = std::make_shared<Impl>();
    Impl& m = *impl;
    m.max_degree_step = mesh.max_degree_step;

    // Radial faces: log-graded, with a face at the smear boundary.
    std::vector<double> rf{rw};
    const int nr = mesh.radial_cells;
    if (rs > rw * (1 + 1e-9)) {
        int ns = static_cast<int>(std::lround(nr * std::log(rs / rw) / std::log(re / rw)));
        ns = std::clamp(ns, 2, nr - 2);
        log_faces(rw, rs, ns, rf);
        log_faces(rs, re, nr - ns, rf);
    } else {
        log_faces(rw, re, nr, rf);
    }
    // Vertical faces: layer interfaces and the drain tip are faces; cells shared by length.
    std::vector<double> marks{0.0};
    for (double z = 0.0; const auto& l : spec.layers) marks.push_back(z += l.thickness_m);
    if (spec.has_drain && length < height * (1 - 1e-9)) marks.push_back(length);
    std::sort(marks.begin(), marks.end());
    marks.erase(std::unique(marks.begin(), marks.end(), [](double a, double b) { return std::fabs(a - b) < 1e-12; }), marks.end());
    std::vector<double> zf{0.0};
    for (std::size_t k = 0; k + 1 < marks.size(); ++k) {
        const int cells = std::max(1, static_cast<int>(std::lround(mesh.vertical_cells * (marks[k + 1] - marks[k]) / height)));
        for (int c = 1; c <= cells; ++c) zf.push_back(marks[k] + (marks[k + 1] - marks[k]) * c / cells);
    }
    const int nz = static_cast<int>(zf.size()) - 1;
    m.nr = nr;
    m.nz = nz;

    auto layer_at = [&](double z) -> const NumericalLayer& {
        double top = 0.0;
        for (const auto& l : spec.layers) {
            if (z < top + l.thickness_m) return l;
            top += l.thickness_m;
        }
        return spec.layers.back();
    };
    const double gw = units::gamma_w_kN_per_m3;
    const bool ideal = std::isinf(spec.discharge_capacity_m3_per_s);
    std::vector<int> drain_node(nz, -1);
    const bool vacuum = spec.has_drain && spec.loading && spec.loading->vacuum;
    // −w/p at depth z: 1 at the drain head falling linearly to the tip ratio (Indraratna et al. 2005).
    auto vacuum_shape = [&](double z) { return 1.0 - (1.0 - spec.loading->vacuum->tip_ratio) * z / length; };
    std::vector<std::pair<std::size_t, double>> vacuum_terms;  // (unknown, right-hand side per kPa)
    std::size_t n = static_cast<std::size_t>(nr) * nz;
    if (spec.has_drain && !ideal)
        for (int j = 0; j < nz; ++j)
            if (0.5 * (zf[j] + zf[j + 1]) < length) drain_node[j] = static_cast<int>(n++);
    m.n = n;
    m.storage = Vector::Zero(static_cast<long>(n));
    m.volume = Vector::Zero(static_cast<long>(n));
    std::vector<Eigen::Triplet<double>> t;
    std::vector<double> diagonal(n, 0.0);
    auto connect = [&](std::size_t a, std::size_t b, double g) {
        diagonal[a] += g;
        diagonal[b] += g;
        t.emplace_back(static_cast<int>(a), static_cast<int>(b), -g);
        t.emplace_back(static_cast<int>(b), static_cast<int>(a), -g);
    };
    auto index = [nr](int i, int j) { return static_cast<std::size_t>(j) * nr + i; };
    const SmearZone smear{spec.smear_shape, spec.smear_diameter_m / spec.drain_diameter_m, spec.smear_permeability_ratio};
    std::vector<double> rc(nr);
    for (int i = 0; i < nr; ++i) rc[i] = std::sqrt(rf[i] * rf[i + 1]);
    for (int j = 0; j < nz; ++j) {
        const double dz = zf[j + 1] - zf[j], zc = 0.5 * (zf[j] + zf[j + 1]);
        const NumericalLayer& L = layer_at(zc);
        const double kh = L.ch_m2_per_s * L.mv_m2_per_kN * gw;
        std::vector<double> k(nr);
        for (int i = 0; i < nr; ++i) k[i] = kh * smear_permeability_fraction(smear, rc[i] / rw);
        for (int i = 0; i < nr; ++i) {
            const double v = pi * (rf[i + 1] * rf[i + 1] - rf[i] * rf[i]) * dz;
            m.volume[static_cast<long>(index(i, j))] = v;
            m.storage[static_cast<long>(index(i, j))] = L.mv_m2_per_kN * v;
            if (i + 1 < nr) {
                const double r = std::log(rf[i + 1] / rc[i]) / (2 * pi * dz * k[i]) +
                                 std::log(rc[i + 1] / rf[i + 1]) / (2 * pi * dz * k[i + 1]);
                connect(index(i, j), index(i + 1, j), 1.0 / (gw * r));
            }
        }
        // Drain wall: into the drain node, or to zero pore pressure for an ideal drain.
        if (spec.has_drain && zc < length) {
            const double g = 1.0 / (gw * std::log(rc[0] / rw) / (2 * pi * dz * k[0]));
            if (ideal) diagonal[index(0, j)] += g;
            else connect(index(0, j), static_cast<std::size_t>(drain_node[j]), g);
            // Vacuum: the drain's pressure is w(z) plus the well-resistance excess, so the wall flux
            // g(u − d − w) adds g·w to the soil node and −g·w to the drain node (w = −p·shape).
            if (vacuum) {
                vacuum_terms.emplace_back(index(0, j), -g * vacuum_shape(zc));
                if (!ideal) vacuum_terms.emplace_back(static_cast<std::size_t>(drain_node[j]), g * vacuum_shape(zc));
            }
        }
        // Vertical flow.
        if (!spec.radial_flow_only) {
            const double kv = L.cv_m2_per_s * L.mv_m2_per_kN * gw;
            for (int i = 0; i < nr; ++i) {
                const double area = pi * (rf[i + 1] * rf[i + 1] - rf[i] * rf[i]);
                if (j + 1 < nz) {
                    const double dz2 = zf[j + 2] - zf[j + 1];
                    const NumericalLayer& B = layer_at(0.5 * (zf[j + 1] + zf[j + 2]));
                    const double kv2 = B.cv_m2_per_s * B.mv_m2_per_kN * gw;
                    if (kv > 0 && kv2 > 0)
                        connect(index(i, j), index(i, j + 1), 1.0 / (gw * (0.5 * dz / (area * kv) + 0.5 * dz2 / (area * kv2))));
                }
                const bool top = j == 0 && spec.drainage != VerticalDrainage::bottom_only;
                const bool bottom = j == nz - 1 && spec.drainage != VerticalDrainage::top_only;
                if ((top || bottom) && kv > 0) diagonal[index(i, j)] += area * kv / (gw * 0.5 * dz);
            }
        }
        // The drain as a conduit: qw/γw·∂²u/∂z², outlets at zero pore pressure.
        if (drain_node[j] >= 0) {
            const double q = spec.discharge_capacity_m3_per_s / gw;
            if (j + 1 < nz && drain_node[j + 1] >= 0)
                connect(static_cast<std::size_t>(drain_node[j]), static_cast<std::size_t>(drain_node[j + 1]),
                        q / (0.5 * dz + 0.5 * (zf[j + 2] - zf[j + 1])));
            if (j == 0) diagonal[static_cast<std::size_t>(drain_node[j])] += q / (0.5 * dz);
            const bool last = j + 1 == nz || drain_node[j + 1] < 0;
            if (last && spec.outlets == DrainOutlets::top_and_bottom)
                diagonal[static_cast<std::size_t>(drain_node[j])] += q / (0.5 * dz);
        }
    }
    for (std::size_t a = 0; a < n; ++a) t.emplace_back(static_cast<int>(a), static_cast<int>(a), diagonal[a]);
    m.stiffness.resize(static_cast<long>(n), static_cast<long>(n));
    m.stiffness.setFromTriplets(t.begin(), t.end());
    m.mv_volume = m.storage.sum();
    m.total_volume = m.volume.sum();
    m.vacuum_source = Vector::Zero(static_cast<long>(n));
    for (const auto& [k, v] : vacuum_terms) m.vacuum_source[static_cast<long>(k)] += v;

    // Loads: instantaneous parts as jumps, ramps as a continuous source.
    if (spec.loading) {
        m.loads = *spec.loading;
    } else {
        m.loads.stages = {{0.0, 0.0, 1.0}};
    }
    m.final_kPa = m.loads.permanent_kPa();
    m.reference = m.mv_volume * m.final_kPa;
    if (vacuum) {
        const auto& v = *m.loads.vacuum;
        m.breaks.push_back(v.start_s);
        m.breaks.push_back(v.end_s);
        if (!(m.final_kPa > 0.0)) {
            // Vacuum alone: the degree is relative to the steady state under the vacuum held.
            Eigen::SimplicialLDLT<Matrix> steady(m.stiffness);
            if (steady.info() != Eigen::Success)
                throw EvaluationError("numerical unit cell", "the steady state under the vacuum could not be solved");
            const Vector u = steady.solve(Vector(v.pressure_kPa * m.vacuum_source));
            m.reference = -m.storage.dot(u);
        }
    }
    for (const auto& s : m.loads.stages) {
        if (s.end_s == s.start_s) m.jumps.push_back({s.start_s, s.pressure_kPa});
        m.breaks.push_back(s.start_s);
        m.breaks.push_back(s.end_s);
    }
    if (m.loads.surcharge) {
        const auto& s = *m.loads.surcharge;
        if (s.end_s == s.start_s) m.jumps.push_back({s.start_s, s.pressure_kPa});
        m.jumps.push_back({s.removal_s, -s.pressure_kPa});
        for (double b : {s.start_s, s.end_s, s.removal_s}) m.breaks.push_back(b);
    }
    // The first step: a small fraction of the fastest time scale of the cell.
    double scale = (re * re) / spec.layers.front().ch_m2_per_s;
    for (const auto& l : spec.layers) {
        scale = std::min(scale, re * re / l.ch_m2_per_s);
        if (l.cv_m2_per_s > 0) scale = std::min(scale, height * height / l.cv_m2_per_s);
    }
    m.first_step_s = mesh.first_step_s > 0.0 ? mesh.first_step_s : 1e-7 * scale;
    unknowns_ = n;
    impl_ = impl;
}

namespace {
// One backward-Euler step of length h from (u, t): (M/h + K) u' = M/h·(u + Δq_ramp).
class Stepper {
public:
    explicit Stepper(const NumericalCell::Impl& m) : m_(m) {}

    Vector step(const Vector& u, double t, double h) {
        auto& solver = factor(h);
        const double dq = m_.ramp_load(t + h) - m_.ramp_load(t);
        Vector rhs = (m_.storage.array() / h * (u.array() + dq)).matrix();
        // Drain nodes carry no storage and no load.
        for (long k = 0; k < rhs.size(); ++k)
            if (m_.storage[k] == 0.0) rhs[k] = 0.0;
        // The vacuum over (t, t + h], read at the midpoint: steps stop where it starts and ends.
        if (m_.loads.vacuum) rhs += m_.loads.vacuum->pressure_at_kPa(t + 0.5 * h) * m_.vacuum_source;
        return solver.solve(rhs);
    }

private:
    Eigen::SimplicialLDLT<Matrix>& factor(double h) {
        auto it = cache_.find(h);
        if (it != cache_.end()) return *it->second;
        if (cache_.size() > 48) cache_.clear();
        Matrix a = m_.stiffness;
        for (long k = 0; k < a.rows(); ++k) a.coeffRef(k, k) += m_.storage[k] / h;
        auto solver = std::make_unique<Eigen::SimplicialLDLT<Matrix>>(a);
        if (solver->info() != Eigen::Success)
            throw InputError("numerical time step (s)", h, "one for which the unit-cell system can be factorised");
        return *cache_.emplace(h, std::move(solver)).first->second;
    }

    const NumericalCell::Impl& m_;
    std::map<double, std::unique_ptr<Eigen::SimplicialLDLT<Matrix>>> cache_;
};

void apply_jumps(const NumericalCell::Impl& m, Vector& u, double from, double to) {
    // Jumps in (from, to]: undrained change of pore pressure in the soil.
    for (const auto& j : m.jumps)
        if (j.time_s > from && j.time_s <= to && j.delta_kPa != 0.0)
            for (long k = 0; k < u.size(); ++k)
                if (m.storage[k] > 0.0) u[k] += j.delta_kPa;
}
}  // namespace

namespace {
// Counts the steps of one march; an input that would need more than the limit gets a named error
// instead of a run that never ends.
struct StepBudget {
    unsigned long taken = 0;
    void count() {
        if (++taken > defaults::max_time_steps)
            throw EvaluationError("numerical unit cell",
                                  "more than " + format_value(static_cast<double>(defaults::max_time_steps)) +
                                      " time steps; raise numerical_mesh.max_degree_step or check the layer mv, cv and ch");
    }
};

}  // namespace

std::vector<NumericalPoint> NumericalCell::solve(const std::vector<double>& times_s) const {
    const Impl& m = *impl_;
    for (std::size_t i = 0; i < times_s.size(); ++i) {
        require_non_negative("time (s)", times_s[i]);
        if (i && times_s[i] < times_s[i - 1]) throw InputError("time (s)", times_s[i], "in ascending order");
    }
    std::vector<double> stops(times_s);
    for (double b : m.breaks) stops.push_back(b);
    for (const auto& j : m.jumps) stops.push_back(j.time_s);
    std::sort(stops.begin(), stops.end());
    stops.erase(std::unique(stops.begin(), stops.end()), stops.end());

    Stepper stepper(m);
    StepBudget budget;
    Vector u = Vector::Zero(static_cast<long>(m.n));
    apply_jumps(m, u, -1.0, 0.0);
    double t = 0.0, h = m.first_step_s, applied = 0.0;  // jumps applied up to `applied`
    std::vector<NumericalPoint> out;
    std::size_t next = 0;
    auto record = [&] {
        while (next < times_s.size() && times_s[next] <= t) {
            out.push_back({times_s[next], m.degree_settlement(u, t), m.degree_pore_pressure(u, t)});
            ++next;
        }
    };
    record();
    for (const double stop : stops) {
        while (t < stop) {
            const double step = std::min(h, stop - t);
            const double before = m.degree_settlement(u, t);
            u = stepper.step(u, t, step);
            t = step == stop - t ? stop : t + step;
            ++steps_;
            budget.count();
            if (step == h) {
                const double change = std::fabs(m.degree_settlement(u, t) - before);
                if (change < 0.5 * m.max_degree_step) h *= 2.0;
                else if (change > m.max_degree_step) h *= 0.5;
            }
        }
        apply_jumps(m, u, applied, t);  // jumps at exactly this stop
        applied = t;
        record();
        if (next == times_s.size()) break;
    }
    return out;
}

namespace {
// The load events a march must stop at (ramp ends and jumps), then infinity.
std::vector<double> event_stops(const NumericalCell::Impl& m) {
    std::vector<double> stops(m.breaks);
    for (const auto& j : m.jumps) stops.push_back(j.time_s);
    stops.push_back(std::numeric_limits<double>::infinity());
    std::sort(stops.begin(), stops.end());
    stops.erase(std::unique(stops.begin(), stops.end()), stops.end());
    return stops;
}
}  // namespace

std::vector<NumericalPoint> NumericalCell::march(double until_s) const {
    require_non_negative("time (s)", until_s);
    const Impl& m = *impl_;
    const std::vector<double> stops = event_stops(m);
    Stepper stepper(m);
    StepBudget budget;
    Vector u = Vector::Zero(static_cast<long>(m.n));
    apply_jumps(m, u, -1.0, 0.0);
    double t = 0.0, h = m.first_step_s, applied = 0.0;
    std::vector<NumericalPoint> out{{0.0, m.degree_settlement(u, 0.0), m.degree_pore_pressure(u, 0.0)}};
    for (const double stop : stops) {
        while (t < stop && t <= until_s) {
            const double step = std::min(h, stop - t);
            const double before = out.back().degree_settlement;
            u = stepper.step(u, t, step);
            t = step == stop - t ? stop : t + step;
            ++steps_;
            budget.count();
            out.push_back({t, m.degree_settlement(u, t), m.degree_pore_pressure(u, t)});
            if (step == h) {
                const double change = std::fabs(out.back().degree_settlement - before);
                if (change < 0.5 * m.max_degree_step) h *= 2.0;
                else if (change > m.max_degree_step) h *= 0.5;
            }
        }
        if (t > until_s) break;
        apply_jumps(m, u, applied, t);  // jumps at exactly this stop: the state after them is listed too
        applied = t;
        out.push_back({t, m.degree_settlement(u, t), m.degree_pore_pressure(u, t)});
    }
    return out;
}

double NumericalCell::time_to_degree_s(double target) const {
    require_open_unit("target degree of consolidation", target);
    const Impl& m = *impl_;
    const std::vector<double> stops = event_stops(m);
    Stepper stepper(m);
    StepBudget budget;
    Vector u = Vector::Zero(static_cast<long>(m.n));
    apply_jumps(m, u, -1.0, 0.0);
    double t = 0.0, h = m.first_step_s, applied = 0.0;
    const double cap = 1000.0 * units::seconds_per_year;
    for (const double stop : stops) {
        while (t < stop) {
            if (t > cap) throw InputError("target degree of consolidation", target, "reachable within 1000 years");
            const double step = std::min(h, stop - t);
            const double before = m.degree_settlement(u, t);
            Vector trial = stepper.step(u, t, step);
            const double after = m.degree_settlement(trial, t + step);
            if (after >= target) {
                // Bisect the step length from this state.
                double lo = 0.0, hi = step;
                for (int k = 0; k < 40; ++k) {
                    const double mid = 0.5 * (lo + hi);
                    (m.degree_settlement(stepper.step(u, t, mid), t + mid) >= target ? hi : lo) = mid;
                }
                return t + hi;
            }
            u = std::move(trial);
            t = step == stop - t ? stop : t + step;
            ++steps_;
            budget.count();
            if (step == h) {
                const double change = std::fabs(after - before);
                if (change < 0.5 * m.max_degree_step) h *= 2.0;
                else if (change > m.max_degree_step) h *= 0.5;
            }
        }
        apply_jumps(m, u, applied, t);
        applied = t;
    }
    throw InputError("target degree of consolidation", target, "reachable under the load history");
}

double NumericalCell::reference_load_kPa() const noexcept { return impl_->reference / impl_->mv_volume; }

double plane_strain_permeability_m_per_s(double kh_m_per_s, double mu) {
    require_positive("horizontal permeability kh (m/s)", kh_m_per_s);
    require_positive("radial flow factor mu", mu);
    return 2.0 * kh_m_per_s / (3.0 * mu);
}

double equivalent_vertical_permeability_m_per_s(double kv_m_per_s, double kh_m_per_s, double mu, double l_m,
                                                double de_m) {
    require_positive("vertical permeability kv (m/s)", kv_m_per_s);
    require_positive("horizontal permeability kh (m/s)", kh_m_per_s);
    require_positive("radial flow factor mu", mu);
    require_positive("drainage length l (m)", l_m);
    require_positive("influence diameter De (m)", de_m);
    return (1.0 + 2.5 * l_m * l_m * kh_m_per_s / (mu * de_m * de_m * kv_m_per_s)) * kv_m_per_s;
}

}  // namespace wickgrid
