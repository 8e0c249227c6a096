// Rows that expect a named failure: each call must throw InputError naming the quantity.
#include <gtest/gtest.h>

#include <cmath>
#include <functional>
#include <limits>
#include <vector>

#include "cell_fixture.hpp"
#include "wickgrid/combine.hpp"
#include "wickgrid/errors.hpp"
#include "wickgrid/radial.hpp"
#include "wickgrid/search.hpp"
#include "wickgrid/stages.hpp"
#include "wickgrid/vertical.hpp"

using namespace wickgrid;
using wickgrid::fixtures::typical_cell;

namespace {
struct FailureRow {
    const char* what;
    std::function<void()> call;
    const char* quantity;  // expected start of InputError::quantity()
};

const double not_a_number = std::numeric_limits<double>::quiet_NaN();

CellSpec with(std::function<void(CellSpec&)> change) {
    CellSpec spec = typical_cell();
    change(spec);
    return spec;
}
}  // namespace

TEST(NamedFailures, EveryBadInputIsNamed) {
    const std::vector<FailureRow> rows{
        {"n = 1", [] { barron_F(1.0); }, "drain spacing ratio n"},
        {"n < 1", [] { barron_F(0.5); }, "drain spacing ratio n"},
        {"n nan", [] { barron_F(not_a_number); }, "drain spacing ratio n"},
        {"s < 1", [] { hansbo_mu_smear(20.0, 0.9, 2.0); }, "smear diameter ratio"},
        {"s >= n", [] { hansbo_mu_smear(5.0, 5.0, 2.0); }, "smear diameter ratio"},
        {"kh/ks <= 0", [] { hansbo_mu_smear(20.0, 2.0, 0.0); }, "smear permeability ratio"},
        {"qw <= 0", [] { hansbo_mu_well(1.0, 10.0, 1e-9, 0.0); }, "discharge capacity"},
        {"qw < 0", [] { hansbo_mu_well(1.0, 10.0, 1e-9, -1.0); }, "discharge capacity"},
        {"z > l", [] { hansbo_mu_well(11.0, 10.0, 1e-9, 1e-6); }, "depth below the outlet"},
        {"kh <= 0", [] { hansbo_mu_well(1.0, 10.0, 0.0, 1e-6); }, "horizontal permeability"},
        {"Uv = 0", [] { time_factor_vertical(0.0); }, "degree of vertical"},
        {"Uv = 1", [] { time_factor_vertical(1.0); }, "degree of vertical"},
        {"Uv nan", [] { time_factor_vertical(not_a_number); }, "degree of vertical"},
        {"Tv < 0", [] { degree_vertical(-1e-3); }, "time factor Tv"},
        {"Tv inf", [] { degree_vertical(INFINITY); }, "time factor Tv"},
        {"Ur = 1", [] { time_factor_radial_equal_strain(1.0, 3.0); }, "degree of radial"},
        {"mu <= 0", [] { degree_radial_equal_strain(0.1, 0.0); }, "radial flow factor"},
        {"thickness <= 0", [] { drainage_path_m(0.0, VerticalDrainage::top_only); }, "clay thickness"},
        {"carrillo > 1", [] { carrillo(1.2, 0.1); }, "degree of vertical"},
        {"free strain n", [] { BarronFreeStrain cell(1.0); }, "drain spacing ratio n"},
        {"band width", [] { band_drain_equivalent_diameter_m(EquivalentDiameterMethod::hansbo_1979, 0.0, 0.004); },
         "drain width"},
        {"band thickness", [] { band_drain_equivalent_diameter_m(EquivalentDiameterMethod::rixner_1986, 0.1, -1.0); },
         "drain thickness"},
        {"mandrel", [] { mandrel_equivalent_diameter_m(0.12, 0.0); }, "mandrel depth"},
        {"spacing", [] { influence_diameter_m(Pattern::square, 0.0); }, "drain spacing"},
        {"cell cv", [] { UnitCell cell(with([](CellSpec& s) { s.clay.cv_m2_per_s = 0.0; })); },
         "vertical coefficient"},
        {"cell ch", [] { UnitCell cell(with([](CellSpec& s) { s.clay.ch_m2_per_s = -1.0; })); },
         "horizontal coefficient"},
        {"cell smear smaller than drain",
         [] { UnitCell cell(with([](CellSpec& s) { s.drain.smear_diameter_m = 0.01; })); }, "smear zone diameter"},
        {"cell smear reaches boundary", [] { UnitCell cell(with([](CellSpec& s) { s.spacing_m = 0.25; })); },
         "drain spacing"},
        {"cell qw", [] { UnitCell cell(with([](CellSpec& s) { s.drain.discharge_capacity_m3_per_s = 0.0; })); },
         "discharge capacity"},
        {"cell partial drain", [] { UnitCell cell(with([](CellSpec& s) { s.drain.length_m = 10.0; })); },
         "drain length"},
        {"cell shape with closed form",
         [] { UnitCell cell(with([](CellSpec& s) { s.drain.smear_shape = SmearShape::linear; })); }, "smear shape"},
        {"time < 0", [] { UnitCell(typical_cell()).at(-1.0); }, "time"},
        {"target >= 1", [] { time_to_degree_s(UnitCell(typical_cell()), 1.0); }, "target degree"},
        {"deadline <= 0", [] { largest_spacing(typical_cell(), 0.9, 0.0, {0.8, 4.0}); }, "deadline"},
        {"unknown product", [] { fixtures::typical_design().product("band-200x9"); }, "drain product 'band-200x9'"},
        {"bounds reversed", [] { largest_spacing(typical_cell(), 0.9, 1e7, {2.0, 1.0}); }, "maximum spacing"},
    };
    for (const auto& row : rows) {
        try {
            row.call();
            ADD_FAILURE() << row.what << ": no error";
        } catch (const InputError& e) {
            EXPECT_EQ(std::string(e.quantity()).rfind(row.quantity, 0), 0u)
                << row.what << ": quantity was '" << e.quantity() << "'";
            EXPECT_NE(std::string(e.what()).find("must be"), std::string::npos) << row.what;
            EXPECT_FALSE(e.allowed().empty()) << row.what;
        }
    }
}

TEST(NamedFailures, MessageShowsValueAndRange) {
    try {
        hansbo_mu_smear(5.0, 6.0, 2.0);
        FAIL();
    } catch (const InputError& e) {
        const std::string text = e.what();
        EXPECT_NE(text.find("= 6 "), std::string::npos) << text;
        EXPECT_NE(text.find("smaller than n = De/dw = 5"), std::string::npos) << text;
        EXPECT_EQ(e.value(), 6.0);
    }
}

// A missing input names no value (none was given): "embankment is not given", never "= 0".
TEST(NamedFailures, MissingInputsShowNoInventedValue) {
    const Site site = fixtures::typical_design();
    const auto product = site.products.front();
    for (const std::function<void()>& call : std::vector<std::function<void()>>{
             [&] { (void)check_stages(site, product, Pattern::triangular, 1.5); },
             [&] { (void)site.product("no-such-drain"); }}) {
        try {
            call();
            ADD_FAILURE() << "accepted";
        } catch (const InputError& e) {
            const std::string text = e.what();
            EXPECT_FALSE(e.has_value()) << text;
            EXPECT_NE(text.find("is not given: it must be"), std::string::npos) << text;
            EXPECT_EQ(text.find("= 0"), std::string::npos) << text;
        }
    }
}
