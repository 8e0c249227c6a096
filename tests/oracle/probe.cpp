// Oracle probe: reads one request per line from stdin and prints the engine's answer, so the
// SciPy oracle can compare. Requests:
//   uv TV | tv UV | F N | hansbo N S KAPPA | esmu SHAPE N S KAPPA | free N TH
//   depth TH MUS W L | spacing PATTERN TARGET DEADLINE_S DW DS KAPPA QW KH CH CV H DRAINAGE OUTLETS
//   layered TERMS DRAINAGE L DW DS KAPPA QW DE T LAYERS (H CV CH MV)×LAYERS
#include <cstdio>
#include <iostream>
#include <sstream>
#include <string>

#include "wickgrid/cell.hpp"
#include "wickgrid/combine.hpp"
#include "wickgrid/errors.hpp"
#include "wickgrid/layered.hpp"
#include "wickgrid/radial.hpp"
#include "wickgrid/search.hpp"
#include "wickgrid/vertical.hpp"

using namespace wickgrid;

namespace {
SmearShape shape_from(const std::string& name) {
    if (name == "linear") return SmearShape::linear;
    if (name == "parabolic") return SmearShape::parabolic;
    return SmearShape::constant;
}

double answer(std::istringstream& in) {
    std::string kind;
    in >> kind;
    if (kind == "uv") { double tv; in >> tv; return degree_vertical(tv); }
    if (kind == "tv") { double u; in >> u; return time_factor_vertical(u); }
    if (kind == "F") { double n; in >> n; return barron_F(n); }
    if (kind == "hansbo") { double n, s, k; in >> n >> s >> k; return hansbo_mu_smear(n, s, k); }
    if (kind == "esmu") {
        std::string shape; double n, s, k;
        in >> shape >> n >> s >> k;
        return equal_strain_mu(n, SmearZone{shape_from(shape), s, k});
    }
    if (kind == "free") { double n, th; in >> n >> th; return BarronFreeStrain(n).degree(th); }
    if (kind == "depth") {
        double th, mus, w, l; in >> th >> mus >> w >> l;
        return degree_radial_depth_averaged(th, mus, w, l);
    }
    if (kind == "spacing") {
        std::string pattern, drainage, outlets;
        double target, deadline, dw, ds, kappa, qw, kh, ch, cv, h;
        in >> pattern >> target >> deadline >> dw >> ds >> kappa >> qw >> kh >> ch >> cv >> h >> drainage >> outlets;
        CellSpec spec;
        spec.clay = Clay{h, cv, ch, kh, drainage == "both" ? VerticalDrainage::both_faces : VerticalDrainage::top_only};
        spec.drain.equivalent_diameter_m = dw;
        spec.drain.smear_diameter_m = ds;
        spec.drain.smear_permeability_ratio = kappa;
        spec.drain.discharge_capacity_m3_per_s = qw;
        spec.drain.length_m = h;
        spec.drain.outlets = outlets == "both" ? DrainOutlets::top_and_bottom : DrainOutlets::top;
        spec.pattern = pattern == "square" ? Pattern::square : Pattern::triangular;
        const auto limit = largest_spacing(spec, target, deadline, {0.5, 6.0});
        return limit.feasible && !limit.at_maximum ? limit.spacing_m : -1.0;
    }
    if (kind == "layered") {
        int terms = 0, layers = 0;
        std::string drainage;
        NumericalCellSpec spec;
        double t = 0.0;
        in >> terms >> drainage >> spec.drain_length_m >> spec.drain_diameter_m >> spec.smear_diameter_m >>
            spec.smear_permeability_ratio >> spec.discharge_capacity_m3_per_s >> spec.influence_diameter_m >> t >> layers;
        spec.drainage = drainage == "both" ? VerticalDrainage::both_faces : VerticalDrainage::top_only;
        for (int i = 0; i < layers; ++i) {
            NumericalLayer l;
            in >> l.thickness_m >> l.cv_m2_per_s >> l.ch_m2_per_s >> l.mv_m2_per_kN;
            spec.layers.push_back(l);
        }
        return LayeredCell(spec, RadialTheory::hansbo_1981, terms).degree(t);
    }
    throw InputError("probe request", 0.0, "one of uv tv F hansbo esmu free depth spacing layered");
}
}  // namespace

int main() {
    std::string line;
    while (std::getline(std::cin, line)) {
        std::istringstream in(line);
        try {
            std::printf("%.17g\n", answer(in));
        } catch (const std::exception& e) {
            std::printf("error %s\n", e.what());
        }
    }
    return 0;
}
