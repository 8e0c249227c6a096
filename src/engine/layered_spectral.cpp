// The spectral method for stratified ground with vertical and radial drainage (Walker & Indraratna
// 2009), with vacuum through the drains (Indraratna, Sathananthan, Rujikiatkamjorn & Balasubramaniam
// 2005). The equations and the departures from the paper are stated in layered.hpp.
#include <Eigen/Dense>
#include <algorithm>
#include <boost/math/constants/constants.hpp>
#include <boost/math/quadrature/gauss.hpp>
#include <cmath>
#include <limits>

#include "wickgrid/errors.hpp"
#include "wickgrid/geometry.hpp"
#include "wickgrid/layered.hpp"
#include "wickgrid/units.hpp"

namespace wickgrid {

namespace {
constexpr double pi = boost::math::double_constants::pi;
using Mat = Eigen::MatrixXd;
using Vec = Eigen::VectorXd;

// What a load event adds to the modal coordinates: a jump (undrained at its instant) or a constant
// forcing over [start, end] (a ramp of load, or the vacuum while it acts).
struct Event {
    enum class Kind { jump, forcing } kind;
    double start_s, end_s;
    double load_kPa;  // load added by the event (jump size, or ramp total); 0 for the vacuum
    double rate;      // forcing per second (ramp: Δq/duration; vacuum: pressure)
    Vec amplitude;    // modal amplitude per unit (jump: Vᵀb; ramp: Vᵀb; vacuum: Vᵀg)
    int group;        // 0 permanent, 1 surcharge, 2 vacuum
};

// The time response of one mode (rate λ, 1/s) to a unit event at t: a jump decays as e^{−λτ}; a
// unit forcing over [start, end] gives (e^{−λ·max(0, t − end)} − e^{−λ(t − start)})/λ.
double unit_response(const Event& e, double lambda, double t) {
    if (t <= e.start_s) return 0.0;
    if (e.kind == Event::Kind::jump) return std::exp(-lambda * (t - e.start_s));
    return (std::exp(-lambda * std::max(0.0, t - e.end_s)) - std::exp(-lambda * (t - e.start_s))) / lambda;
}

// Σ_k a_k·(response of mode k).
double modal_response(const Event& e, const Vec& lambda, const Vec& a, double t) {
    if (t <= e.start_s) return 0.0;
    double sum = 0.0;
    for (long k = 0; k < a.size(); ++k) sum += a[k] * unit_response(e, lambda[k], t);
    return sum;
}

// How much of the event's size is in place at t (1 for a jump, the ramp's fraction so far × duration
// for a forcing, in the units that multiply `rate`).
double in_place(const Event& e, double t) {
    if (t <= e.start_s) return 0.0;
    return e.kind == Event::Kind::jump ? 1.0 : std::min(t - e.start_s, e.end_s - e.start_s);
}

// Basis φi(z) = sin or cos(mi·z/H) of uniform Terzaghi consolidation with these drainage faces.
struct Basis {
    VerticalDrainage drainage;
    double height_m;
    Vec m;
    Basis(VerticalDrainage d, double h, int terms) : drainage(d), height_m(h), m(terms) {
        for (int i = 0; i < terms; ++i) m[i] = d == VerticalDrainage::both_faces ? (i + 1) * pi : (2 * i + 1) * pi / 2;
    }
    bool cosine() const { return drainage == VerticalDrainage::bottom_only; }
    // φ and φ′ at z. The numbers m are evenly spaced by π, so sin and cos of m·z/H follow by the
    // angle-addition recurrence from two of each (rounding grows like terms × 1e-16).
    void values(double z, Vec& phi, Vec& dphi) const {
        const double x = z / height_m, step_s = std::sin(pi * x), step_c = std::cos(pi * x);
        double s = std::sin(m[0] * x), c = std::cos(m[0] * x);
        for (long i = 0; i < m.size(); ++i) {
            const double k = m[i] / height_m;
            phi[i] = cosine() ? c : s;
            dphi[i] = cosine() ? -k * s : k * c;
            const double next_s = s * step_c + c * step_s;
            c = c * step_c - s * step_s;
            s = next_s;
        }
    }
};
// sin(n·π·x) for n = 0..count (angle addition from one sin and cos).
std::vector<double> sines(double x, int count) {
    std::vector<double> out(static_cast<std::size_t>(count) + 1);
    const double s1 = std::sin(pi * x), c1 = std::cos(pi * x);
    double s = 0.0, c = 1.0;
    for (auto& v : out) {
        v = s;
        const double next = s * c1 + c * s1;
        c = c * c1 - s * s1;
        s = next;
    }
    return out;
}

// Adds, exactly, one layer's storage and vertical-flow integrals over [a, b]:
// Γ += mv·∫φiφj, Ψ += kv/γw·∫φi′φj′, b += mv·∫φi, ∫φi. With k = m/H every sum and difference of
// two numbers is a multiple of π/H, so each integral is a difference of sines at a and b.
void add_layer_exactly(const Basis& basis, double a, double b, double mv, double kv_over_gw, Mat& gamma, Mat& psi,
                       Vec& load, Vec& phi_integral) {
    const long n = basis.m.size();
    const double h = basis.height_m;
    const int top = static_cast<int>(2 * n + 2);
    const auto sa = sines(a / h, top), sb = sines(b / h, top);
    // ∫_a^b cos(j·π·z/H)dz.
    auto cos_integral = [&](long j) {
        if (j == 0) return b - a;
        return (sb[static_cast<std::size_t>(j)] - sa[static_cast<std::size_t>(j)]) * h / (j * pi);
    };
    const bool both = basis.drainage == VerticalDrainage::both_faces;
    const double sign = basis.cosine() ? 1.0 : -1.0;  // φφ = ½[cos(d) ∓ cos(s)]: − for sin, + for cos
    for (long i = 0; i < n; ++i) {
        const double ki = basis.m[i] / h;
        for (long j = 0; j <= i; ++j) {
            const double kj = basis.m[j] / h;
            const double cd = cos_integral(i - j), cs = cos_integral(i + j + (both ? 2 : 1));
            const double values = 0.5 * (cd + sign * cs), slopes = 0.5 * (cd - sign * cs);
            gamma(i, j) += mv * values;
            psi(i, j) += kv_over_gw * ki * kj * slopes;
        }
        // ∫φi: sin → (cos(ka) − cos(kb))/k; cos → (sin(kb) − sin(ka))/k.
        const double ka = ki * a, kb = ki * b;
        const double integral = basis.cosine() ? (std::sin(kb) - std::sin(ka)) / ki : (std::cos(ka) - std::cos(kb)) / ki;
        load[i] += mv * integral;
        phi_integral[i] += integral;
    }
}
}  // namespace

struct LayeredCell::Model {
    int terms = 0;
    double height_m = 0.0;
    Basis basis{VerticalDrainage::both_faces, 1.0, 1};
    std::vector<NumericalLayer> layers;
    Vec lambda;             // eigenvalues (1/s), ascending
    Mat vectors;            // V: columns are modes, VᵀΓV = I
    Vec beta;               // Vᵀb, b = ∫mv·φ dz (m²/kN·m)
    Vec beta_squared;
    double mv_integral = 0;  // M = ∫mv dz (m³/kN)
    double tail = 0.0;      // M − Σβ²: the strain of the modes beyond the last kept (≥ 0)
    // The modes beyond the last kept one, as in uniform ground: numbers M spaced by π from
    // tail_first, rates shift + slope·M², weights ∝ 1/M² (the Rayleigh quotients of the last basis
    // function give shift and slope; exact for uniform ground).
    double tail_first = 0.0, tail_shift = 0.0, tail_slope = 0.0;

    // Fraction of the tail's strain deficit still to come τ after a unit jump:
    // Σ e^{−λ(M)τ}/M² ÷ Σ 1/M² ≈ x·∫_x^∞ e^{−(shift + slope·M²)τ}/M² dM with x the first tail number.
    double tail_left(double tau) const {
        if (tau <= 0.0) return 1.0;
        const double a = tail_slope * tau, x = tail_first, r = std::sqrt(a) * x;
        const double integral = std::exp(-r * r) - std::sqrt(pi * a) * x * std::erfc(r);
        return std::exp(-tail_shift * tau) * std::max(0.0, integral);
    }
    // The tail's time response to the event at t (the same units as unit_response).
    double tail_response(const Event& e, double t) const {
        if (t <= e.start_s) return 0.0;
        if (e.kind == Event::Kind::jump) return tail_left(t - e.start_s);
        // ∫ over the ramp of tail_left(τ)dτ, τ from max(0, t − end) to t − start; τ = y² removes the
        // square-root start.
        using GL = boost::math::quadrature::gauss<double, 10>;
        const double y0 = std::sqrt(std::max(0.0, t - e.end_s)), y1 = std::sqrt(t - e.start_s);
        return GL::integrate([&](double y) { return tail_left(y * y) * 2.0 * y; }, y0, y1);
    }
    Vec phi_integral;       // ∫φ dz per basis function (m)
    std::vector<Event> events;
    std::vector<std::pair<double, int>> removals;  // (time, group) of temporary loads, by time
    double permanent_kPa = 0.0;
    double reference_m = 0.0;  // reference strain integral
    Vec steady_vacuum;         // modal coordinates at steady state under unit vacuum (per kPa)
    double mu_smear = 0.0, mu_mean = 0.0;
    double vacuum_kPa = 0.0;
    static constexpr int vacuum_group = 2;

    const NumericalLayer& layer_at(double z) const {
        double top = 0.0;
        for (const auto& l : layers) {
            if (z < top + l.thickness_m) return l;
            top += l.thickness_m;
        }
        return layers.back();
    }

    // Strain integral ∫mv(σ − ū)dz (m) of one event at t, the modes beyond the last kept by the tail
    // model above.
    double strain(const Event& e, double t) const {
        if (t <= e.start_s) return 0.0;
        if (e.group == vacuum_group) return -e.rate * modal_response(e, lambda, e.amplitude.cwiseProduct(beta), t);
        // A load: Δq·(M·in place − Σβ²·response − tail·its response).
        const double size = e.kind == Event::Kind::jump ? e.load_kPa : e.rate;
        const double modes = modal_response(e, lambda, beta_squared, t) + tail * tail_response(e, t);
        return size * (mv_integral * in_place(e, t) - modes);
    }

    double strain_of_groups(double t, const bool active[3]) const {
        double s = 0.0;
        for (const auto& e : events)
            if (active[e.group]) s += strain(e, t);
        return s;
    }

    // Settlement strain integral with the hold rule after each removal of a temporary load.
    double held_strain(double t) const {
        bool active[3] = {true, true, true};
        double held = -std::numeric_limits<double>::infinity();
        for (const auto& [removal_s, group] : removals) {
            if (t <= removal_s) return std::max(held, strain_of_groups(t, active));
            held = std::max(held, strain_of_groups(removal_s, active));
            active[group] = false;
        }
        return std::max(held, strain_of_groups(t, active));
    }

    // Modal coordinates c(t) of the linear model (every event, no hold rule).
    Vec modal(double t) const {
        Vec c = Vec::Zero(terms);
        for (const auto& e : events) {
            if (t <= e.start_s) continue;
            const double size = e.kind == Event::Kind::jump ? e.load_kPa : e.rate;
            for (long k = 0; k < c.size(); ++k) c[k] += size * e.amplitude[k] * unit_response(e, lambda[k], t);
        }
        return c;
    }

    // Applied fill load (kPa) at t.
    double applied_kPa(double t) const {
        double q = 0.0;
        for (const auto& e : events)
            if (e.group != vacuum_group) q += (e.kind == Event::Kind::jump ? e.load_kPa : e.rate) * in_place(e, t);
        return q;
    }
};

namespace {
void check_spec(const NumericalCellSpec& spec, int terms) {
    if (terms < 2 || terms > defaults::max_layered_terms)
        throw InputError("layered series terms", terms, "from 2 to " + std::to_string(defaults::max_layered_terms));
    if (spec.layers.empty()) throw InputError("number of clay layers", 0.0, "at least 1");
    for (const auto& l : spec.layers) {
        require_positive("layer thickness (m)", l.thickness_m);
        require_non_negative("layer cv (m²/s)", l.cv_m2_per_s);
        require_positive("layer ch (m²/s)", l.ch_m2_per_s);
        require_positive("layer mv (m²/kN)", l.mv_m2_per_kN);
    }
    require_positive("drain diameter (m)", spec.drain_diameter_m);
    require_at_least("smear diameter (m)", spec.smear_diameter_m, spec.drain_diameter_m, "at least the drain diameter");
    require_positive("smear permeability ratio kh/ks", spec.smear_permeability_ratio);
    if (!(spec.discharge_capacity_m3_per_s > 0.0))
        throw InputError("discharge capacity qw (m³/s)", spec.discharge_capacity_m3_per_s, "greater than 0");
    if (spec.loading) validate_load_history(*spec.loading);
}

// Marks where the integrands change form: layer interfaces, the drain tip and the midpoint of a drain
// drained at both ends (where μ's distance to the nearest outlet turns).
std::vector<double> marks_of(const NumericalCellSpec& spec, double height, double length, bool drain) {
    std::vector<double> marks{0.0, height};
    double z = 0.0;
    for (const auto& l : spec.layers) marks.push_back(z += l.thickness_m);
    if (drain) {
        marks.push_back(length);
        if (spec.outlets == DrainOutlets::top_and_bottom) marks.push_back(0.5 * length);
    }
    std::sort(marks.begin(), marks.end());
    marks.erase(std::unique(marks.begin(), marks.end(), [&](double a, double b) { return b - a < 1e-12 * height; }),
                marks.end());
    while (marks.back() > height) marks.pop_back();
    return marks;
}
}  // namespace

LayeredCell::LayeredCell(const NumericalCellSpec& spec, RadialTheory theory, int terms) {
    check_spec(spec, terms);
    auto model = std::make_shared<Model>();
    Model& m = *model;
    m.terms = terms;
    m.layers = spec.layers;
    for (const auto& l : spec.layers) m.height_m += l.thickness_m;
    const double height = m.height_m;
    const bool drain = spec.has_drain;
    const double length = drain ? spec.drain_length_m : 0.0;
    if (drain && !(length > 0.0 && length <= height * (1 + 1e-12)))
        throw InputError("drain length (m)", length, "greater than 0 and at most the clay thickness " + format_value(height) + " m");
    m.basis = Basis(spec.drainage, height, terms);

    // Radial term: η(z) = 2kh/(γw·re²·μ(z)).
    const double gw = units::gamma_w_kN_per_m3, re = 0.5 * spec.influence_diameter_m;
    if (drain) {
        DrainInstallation d;
        d.equivalent_diameter_m = spec.drain_diameter_m;
        d.smear_diameter_m = spec.smear_diameter_m;
        d.smear_shape = spec.smear_shape;
        d.smear_permeability_ratio = spec.smear_permeability_ratio;
        d.theory = theory;
        const double n = spec.influence_diameter_m / spec.drain_diameter_m;
        if (!(spec.influence_diameter_m > spec.smear_diameter_m))
            throw InputError("influence diameter (m)", spec.influence_diameter_m,
                             "greater than the smear diameter " + format_value(spec.smear_diameter_m) + " m");
        m.mu_smear = smear_mu(d, n, spec.influence_diameter_m);
    }
    auto mu_at = [&](double z, double kh) {
        return mu_at_depth(m.mu_smear, z, length, spec.outlets, kh, spec.discharge_capacity_m3_per_s);
    };
    auto eta_at = [&](double z, const NumericalLayer& L) {
        if (!drain || z >= length) return 0.0;
        const double kh = L.ch_m2_per_s * L.mv_m2_per_kN * gw;
        return 2.0 * kh / (gw * re * re * mu_at(z, kh));
    };
    auto vacuum_shape = [&](double z) {  // −w/p: 1 at the drain head, k1 at the tip
        if (!drain || z >= length || !spec.loading || !spec.loading->vacuum) return 0.0;
        return 1.0 - (1.0 - spec.loading->vacuum->tip_ratio) * z / length;
    };

    // Storage and vertical flow exactly, layer by layer (constant properties); the radial term, whose
    // μ(z) varies along the drain, by Gauss–Legendre (10 points) on pieces no longer than H/terms.
    Mat gamma = Mat::Zero(terms, terms), psi = Mat::Zero(terms, terms);
    Vec b = Vec::Zero(terms), g = Vec::Zero(terms), phi(terms), dphi(terms);
    m.phi_integral = Vec::Zero(terms);
    for (double top = 0.0; const auto& L : spec.layers) {
        add_layer_exactly(m.basis, top, top + L.thickness_m, L.mv_m2_per_kN, L.cv_m2_per_s * L.mv_m2_per_kN, gamma, psi, b,
                          m.phi_integral);
        m.mv_integral += L.mv_m2_per_kN * L.thickness_m;
        top += L.thickness_m;
    }
    const double vertical_diag = psi(terms - 1, terms - 1);
    using GL = boost::math::quadrature::gauss<double, 10>;
    const auto& x = GL::abscissa();
    const auto& w = GL::weights();
    double mu_sum = 0.0, radial_diag = 0.0;
    const auto marks = marks_of(spec, height, length, drain);
    auto add_point = [&](double z, double weight) {
        const NumericalLayer& L = m.layer_at(z);
        m.basis.values(z, phi, dphi);
        const double eta = eta_at(z, L);
        psi.selfadjointView<Eigen::Lower>().rankUpdate(phi, weight * eta);
        radial_diag += weight * eta * phi[terms - 1] * phi[terms - 1];
        g -= weight * eta * vacuum_shape(z) * phi;
        mu_sum += weight * mu_at(z, L.ch_m2_per_s * L.mv_m2_per_kN * gw);
    };
    for (std::size_t s = 0; s + 1 < marks.size(); ++s) {
        if (!drain || marks[s] >= length * (1 - 1e-12)) break;  // below the tip: no radial term
        const double a = marks[s], span = marks[s + 1] - marks[s];
        const int pieces = std::max(1, static_cast<int>(std::ceil(span * terms / height)));
        for (int p = 0; p < pieces; ++p) {
            const double lo = a + span * p / pieces, half = 0.5 * span / pieces, mid = lo + half;
            for (std::size_t q = 0; q < x.size(); ++q) {
                if (x[q] == 0.0) {
                    add_point(mid, half * w[q]);
                    continue;
                }
                add_point(mid - half * x[q], half * w[q]);
                add_point(mid + half * x[q], half * w[q]);
            }
        }
    }
    m.mu_mean = drain ? mu_sum / length : 0.0;
    gamma = gamma.selfadjointView<Eigen::Lower>();
    psi = psi.selfadjointView<Eigen::Lower>();

    Eigen::GeneralizedSelfAdjointEigenSolver<Mat> solver(psi, gamma);
    if (solver.info() != Eigen::Success || !(solver.eigenvalues().minCoeff() > 0.0))
        throw EvaluationError("layered series", "the eigenproblem of the layered cell did not solve; check the layer mv, cv and ch");
    m.lambda = solver.eigenvalues();
    m.vectors = solver.eigenvectors();
    m.beta = m.vectors.transpose() * b;
    m.beta_squared = m.beta.cwiseProduct(m.beta);
    m.tail = std::max(0.0, m.mv_integral - m.beta.squaredNorm());
    {
        const int last = terms - 1;
        m.tail_first = m.basis.m[last] + 0.5 * pi;
        m.tail_slope = vertical_diag / gamma(last, last) / (m.basis.m[last] * m.basis.m[last]);
        m.tail_shift = radial_diag / gamma(last, last);
    }
    const Vec vac = m.vectors.transpose() * g;

    // Load events.
    LoadHistory loads;
    if (spec.loading) loads = *spec.loading;
    else loads.stages = {{0.0, 0.0, 1.0}};
    auto add_load = [&](double start, double end, double dq, int group) {
        if (end > start) m.events.push_back({Event::Kind::forcing, start, end, dq, dq / (end - start), m.beta, group});
        else m.events.push_back({Event::Kind::jump, start, start, dq, 0.0, m.beta, group});
    };
    for (const auto& s : loads.stages) add_load(s.start_s, s.end_s, s.pressure_kPa, 0);
    if (loads.surcharge) {
        const auto& s = *loads.surcharge;
        add_load(s.start_s, s.end_s, s.pressure_kPa, 1);
        add_load(s.removal_s, s.removal_s, -s.pressure_kPa, 1);
        m.removals.emplace_back(s.removal_s, 1);
    }
    m.steady_vacuum = Vec::Zero(terms);
    if (loads.vacuum && drain) {
        const auto& v = *loads.vacuum;
        m.events.push_back({Event::Kind::forcing, v.start_s, v.end_s, 0.0, v.pressure_kPa, vac, Model::vacuum_group});
        m.vacuum_kPa = v.pressure_kPa;
        m.removals.emplace_back(v.end_s, 2);
        m.steady_vacuum = vac.cwiseQuotient(m.lambda);
    }
    std::sort(m.removals.begin(), m.removals.end());
    m.permanent_kPa = loads.permanent_kPa();
    if (m.permanent_kPa > 0.0) m.reference_m = m.mv_integral * m.permanent_kPa;
    else if (loads.vacuum) m.reference_m = -loads.vacuum->pressure_kPa * m.steady_vacuum.dot(m.beta);
    model_ = model;
}

double LayeredCell::degree(double time_s) const {
    require_non_negative("time (s)", time_s);
    const Model& m = *model_;
    if (!(m.reference_m > 0.0)) return 0.0;
    return m.held_strain(time_s) / m.reference_m;
}

double LayeredCell::eventual_degree() const {
    const Model& m = *model_;
    if (!(m.reference_m > 0.0) || m.removals.empty()) return 1.0;
    const double final_permanent = m.mv_integral * m.permanent_kPa;
    return std::max(final_permanent, m.held_strain(m.removals.back().first)) / m.reference_m;
}

double LayeredCell::degree_pore_pressure(double time_s) const {
    require_non_negative("time (s)", time_s);
    const Model& m = *model_;
    const double q = m.applied_kPa(time_s);
    if (!(q > 0.0)) return 0.0;
    const double mean_u = (m.vectors * m.modal(time_s)).dot(m.phi_integral) / m.height_m;
    return 1.0 - mean_u / q;
}

double LayeredCell::pore_pressure_kPa(double depth_m, double time_s) const {
    require_non_negative("time (s)", time_s);
    const Model& m = *model_;
    if (!(depth_m >= 0.0 && depth_m <= m.height_m * (1 + 1e-12)))
        throw InputError("depth (m)", depth_m, "from 0 to the clay thickness " + format_value(m.height_m) + " m");
    Vec phi(m.terms), dphi(m.terms);
    m.basis.values(depth_m, phi, dphi);
    return phi.dot(m.vectors * m.modal(time_s));
}

double LayeredCell::local_degree(double depth_m, double time_s) const {
    const Model& m = *model_;
    const double u = pore_pressure_kPa(depth_m, time_s);
    const double strain = m.applied_kPa(time_s) - u;  // σ − ū (vacuum: ū < 0)
    if (m.permanent_kPa > 0.0) return strain / m.permanent_kPa;
    Vec phi(m.terms), dphi(m.terms);
    m.basis.values(depth_m, phi, dphi);
    const double steady = -m.vacuum_kPa * phi.dot(m.vectors * m.steady_vacuum);
    return steady > 0.0 ? strain / steady : 0.0;
}

double LayeredCell::reference_strain_integral_m() const noexcept { return model_->reference_m; }
double LayeredCell::reference_load_kPa() const noexcept { return model_->reference_m / model_->mv_integral; }
int LayeredCell::terms() const noexcept { return model_->terms; }
double LayeredCell::mu_smear() const noexcept { return model_->mu_smear; }
double LayeredCell::mu_depth_mean() const noexcept { return model_->mu_mean; }

}  // namespace wickgrid
