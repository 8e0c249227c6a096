// The layout's input files (GeoJSON and CSV areas, borehole base depths) with every error located,
// and the layout command end to end: its outputs agree with each other and carry the cautions.
#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include "cli_helpers.hpp"
#include "scenario/area_files.hpp"
#include "scenario/csv_table.hpp"

namespace wickgrid::scenario {
namespace {
using namespace wickgrid::cli_testing;

// Runs a parse that must fail and returns the error.
template <typename F>
ScenarioError failure(F&& parse) {
    try {
        parse();
    } catch (const ScenarioError& e) {
        return e;
    }
    ADD_FAILURE() << "no ScenarioError";
    return ScenarioError("", {}, "", "");
}

const char* square_geojson = R"({"type": "Polygon",
 "coordinates": [
  [[500000, 4000000], [500100, 4000000], [500100, 4000100], [500000, 4000100], [500000, 4000000]],
  [[500040, 4000040], [500060, 4000040], [500060, 4000060], [500040, 4000060], [500040, 4000040]]
 ]})";

TEST(AreaFiles, GeoJsonPolygonWithAHole) {
    const AreaFile f = parse_area(square_geojson, "a.geojson", false);
    ASSERT_EQ(f.area.parts.size(), 1u);
    EXPECT_EQ(f.area.parts[0].outer.size(), 4u);  // the repeated closing position dropped
    ASSERT_EQ(f.area.parts[0].holes.size(), 1u);
    EXPECT_DOUBLE_EQ(layout::area_m2(f.area), 100.0 * 100.0 - 20.0 * 20.0);
    EXPECT_FALSE(f.crs_name.has_value());
}

TEST(AreaFiles, FeatureCollectionAndCrs) {
    const std::string text = R"({"type": "FeatureCollection",
 "crs": {"type": "name", "properties": {"name": "urn:ogc:def:crs:EPSG::32631"}},
 "features": [
  {"type": "Feature", "properties": {}, "geometry": {"type": "Polygon", "coordinates": [[[0,0],[100,0],[100,100],[0,0]]]}},
  {"type": "Feature", "properties": {}, "geometry": {"type": "MultiPolygon", "coordinates": [[[[200,0],[300,0],[300,100],[200,0]]]]}}
 ]})";
    const AreaFile f = parse_area(text, "a.geojson", true);
    EXPECT_EQ(f.area.parts.size(), 2u);
    EXPECT_EQ(f.crs_name.value_or(""), "urn:ogc:def:crs:EPSG::32631");
}

struct LocatedRow {
    const char* name;
    std::string text;
    bool projected;
    int line;          // expected line of the error (0: no line)
    const char* path;  // expected key path ("" when none)
    const char* says;  // part of the message
};

TEST(AreaFiles, ErrorsAreLocated) {
    const std::vector<LocatedRow> rows{
        {"open ring (RFC 7946 §3.1.6)",
         "{\"type\": \"Polygon\",\n \"coordinates\": [\n  [[500000, 4000000], [500100, 4000000], [500100, 4000100], [500000, 4000100]]\n ]}",
         false, 3, "coordinates[0]", "not closed"},
        {"figure of eight",
         "{\"type\": \"Polygon\",\n \"coordinates\": [\n  [[500000, 4000000], [500100, 4000100], [500100, 4000000], [500000, 4000100], [500000, 4000000]]\n ]}",
         false, 3, "coordinates[0]", "crosses itself"},
        {"too few positions", "{\"type\": \"Polygon\",\n \"coordinates\": [[[500000, 4000000], [500100, 4000000], [500000, 4000000]]]}",
         false, 2, "coordinates[0]", "at least 3"},
        {"zero area", "{\"type\": \"Polygon\",\n \"coordinates\": [[[500000, 4000000], [500050, 4000050], [500100, 4000100], [500000, 4000000]]]}",
         false, 2, "coordinates[0]", "zero area"},
        {"a point is not an area", "{\"type\": \"Feature\", \"geometry\":\n {\"type\": \"Point\", \"coordinates\": [1, 2]}}", false, 2,
         "geometry.type", "not an area"},
        {"a position that is not [x, y]",
         "{\"type\": \"Polygon\",\n \"coordinates\": [[[500000, 4000000],\n [500100, \"east\"], [500100, 4000100], [500000, 4000000]]]}",
         false, 3, "coordinates[0][1]", "[x, y]"},
        {"overlapping features",
         "{\"type\": \"FeatureCollection\", \"features\": [\n"
         "{\"type\": \"Feature\", \"geometry\": {\"type\": \"Polygon\", \"coordinates\": [[[500000,4000000],[500100,4000000],[500100,4000100],[500000,4000000]]]}},\n"
         "{\"type\": \"Feature\", \"geometry\": {\"type\": \"Polygon\", \"coordinates\": [[[500050,4000000],[500150,4000000],[500150,4000100],[500050,4000000]]]}}]}",
         false, 2, "features[0].geometry.coordinates", "overlap"},
        {"longitude and latitude", "{\"type\": \"Polygon\",\n \"coordinates\": [[[2.35, 48.85], [2.36, 48.85], [2.36, 48.86], [2.35, 48.85]]]}",
         false, 1, "", "longitude/latitude"},
        {"a geographic crs even when confirmed projected",
         "{\"type\": \"Polygon\",\n \"crs\": {\"type\": \"name\", \"properties\": {\"name\": \"urn:ogc:def:crs:OGC:1.3:CRS84\"}},\n"
         " \"coordinates\": [[[500000, 4000000], [500100, 4000000], [500100, 4000100], [500000, 4000000]]]}",
         true, 2, "crs", "longitude and latitude"},
        {"a number beyond double range (fuzz finding)", "{\"type\": \"Polygon\",\n \"coordinates\": [[[5e2040, 0], [1, 0], [1, 1], [0, 0]]]}",
         false, 2, "", "number overflow"},
        {"JSON syntax", "{\"type\": \"Polygon\",\n \"coordinates\": [[[0, 0], [1, 0],, [1, 1], [0, 0]]]}", false, 2, "", "JSON syntax"},
    };
    for (const auto& row : rows) {
        const ScenarioError e = failure([&] { parse_area(row.text, "area.geojson", row.projected); });
        EXPECT_EQ(e.file(), "area.geojson") << row.name;
        EXPECT_EQ(e.mark().line, row.line) << row.name << ": " << e.what();
        EXPECT_EQ(e.key_path(), row.path) << row.name << ": " << e.what();
        EXPECT_NE(std::string(e.what()).find(row.says), std::string::npos) << row.name << ": " << e.what();
    }
}

TEST(AreaFiles, LocalGridNearTheOriginNeedsConfirmation) {
    const std::string text = "{\"type\": \"Polygon\", \"coordinates\": [[[0, 0], [60, 0], [60, 40], [0, 40], [0, 0]]]}";
    EXPECT_THROW(parse_area(text, "a.geojson", false), ScenarioError);
    EXPECT_EQ(parse_area(text, "a.geojson", true).area.parts.size(), 1u);
}

TEST(AreaFiles, CsvVerticesWithPartsAndHoles) {
    const std::string text =
        "part,ring,x_m,y_m\n"
        "1,0,500000,4000000\n1,0,500100,4000000\n1,0,500100,4000100\n1,0,500000,4000100\n"
        "1,1,500040,4000040\n1,1,500060,4000040\n1,1,500060,4000060\n1,1,500040,4000060\n1,1,500040,4000040\n"
        "2,0,500200,4000000\n2,0,500300,4000000\n2,0,500300,4000100\n";
    const AreaFile f = parse_area(text, "a.csv", false);
    ASSERT_EQ(f.area.parts.size(), 2u);
    EXPECT_EQ(f.area.parts[0].holes.size(), 1u);
    EXPECT_EQ(f.area.parts[0].holes[0].size(), 4u);
    EXPECT_DOUBLE_EQ(layout::area_m2(f.area), 100.0 * 100.0 - 400.0 + 5000.0);
}

// What spreadsheets and GIS exports do to files: a byte-order mark before a GeoJSON object (RFC 7946
// §4 lets a reader ignore it), line ends of CR alone, an empty file named .geojson.
TEST(AreaFiles, ExportQuirksAreReadOrNamed) {
    const AreaFile bom = parse_area("\xEF\xBB\xBF" + std::string(square_geojson), "a.geojson", false);
    EXPECT_DOUBLE_EQ(layout::area_m2(bom.area), 100.0 * 100.0 - 20.0 * 20.0);
    const AreaFile cr = parse_area("x_m,y_m\r500000,4000000\r500100,4000000\r500100,4000100\r", "a.csv", false);
    EXPECT_DOUBLE_EQ(layout::area_m2(cr.area), 0.5 * 100.0 * 100.0);
    const ScenarioError cr_error = failure([] { parse_area("x_m,y_m\r500000,4000000\r500100,north\r", "a.csv", false); });
    EXPECT_EQ(cr_error.mark().line, 3) << cr_error.what();
    const ScenarioError empty = failure([] { parse_area(" \n", "zone.geojson", false); });
    EXPECT_NE(std::string(empty.what()).find("is empty; a GeoJSON Polygon"), std::string::npos) << empty.what();
    const ScenarioError empty_csv = failure([] { parse_area("", "zone.csv", false); });
    EXPECT_NE(std::string(empty_csv.what()).find("is empty; a header row"), std::string::npos) << empty_csv.what();
}

// A parcel export of 20,000 lots reads in one pass (a lot is located only when it is at fault), and
// the fault in the last lot is still found at its line; nesting beyond 32 levels is refused.
TEST(AreaFiles, LargeExportsReadInOnePassAndNestingIsBounded) {
    auto lot = [](int i, bool bad) {
        const double x = 500000.0 + 20.0 * (i % 200), y = 4000000.0 + 20.0 * (i / 200);
        char text[400];
        if (bad)  // a figure of eight
            std::snprintf(text, sizeof text,
                          "{\"type\":\"Feature\",\"properties\":{},\"geometry\":{\"type\":\"Polygon\",\"coordinates\":"
                          "[[[%.1f,%.1f],[%.1f,%.1f],[%.1f,%.1f],[%.1f,%.1f],[%.1f,%.1f]]]}}",
                          x, y, x + 10, y + 10, x + 10, y, x, y + 10, x, y);
        else
            std::snprintf(text, sizeof text,
                          "{\"type\":\"Feature\",\"properties\":{},\"geometry\":{\"type\":\"Polygon\",\"coordinates\":"
                          "[[[%.1f,%.1f],[%.1f,%.1f],[%.1f,%.1f],[%.1f,%.1f],[%.1f,%.1f]]]}}",
                          x, y, x + 10, y, x + 10, y + 10, x, y + 10, x, y);
        return std::string(text);
    };
    constexpr int lots = 20000;
    std::string good = "{\"type\":\"FeatureCollection\",\"features\":[\n", bad = good;
    for (int i = 0; i < lots; ++i) {
        good += lot(i, false) + (i + 1 < lots ? ",\n" : "\n");
        bad += lot(i, i + 1 == lots) + (i + 1 < lots ? ",\n" : "\n");
    }
    good += "]}";
    bad += "]}";
    const AreaFile f = parse_area(good, "lots.geojson", false);
    EXPECT_EQ(f.area.parts.size(), static_cast<std::size_t>(lots));
    EXPECT_DOUBLE_EQ(layout::area_m2(f.area), lots * 100.0);
    const ScenarioError e = failure([&] { parse_area(bad, "lots.geojson", false); });
    EXPECT_EQ(e.mark().line, lots + 1) << e.what();
    EXPECT_NE(std::string(e.what()).find("crosses itself"), std::string::npos) << e.what();
    std::string nested = "{\"type\":\"Polygon\",\"coordinates\":[[[0,0],[100,0],[100,100],[0,0]]]}";
    for (int i = 0; i < 40; ++i) nested = "{\"type\":\"Feature\",\"properties\":{},\"geometry\":" + nested + "}";
    const ScenarioError deep = failure([&] { parse_area(nested, "deep.geojson", true); });
    EXPECT_NE(std::string(deep.what()).find("nested more than 32 levels"), std::string::npos) << deep.what();
}

TEST(AreaFiles, CsvErrorsAreLocated) {
    const std::vector<LocatedRow> rows{
        {"not a number", "x_m,y_m\n500000,4000000\n500100,north\n500100,4000100\n", false, 3, "y_m", "not a number"},
        {"missing column", "x,y\n1,2\n", false, 1, "", "no column 'x_m'"},
        {"ring listed twice", "ring,x_m,y_m\n0,500000,4000000\n0,500100,4000000\n0,500100,4000100\n1,500040,4000040\n0,500000,4000100\n",
         false, 6, "", "starts again"},
        {"hole before its outline", "part,ring,x_m,y_m\n1,1,500040,4000040\n", false, 2, "", "before that part's outline"},
        {"two vertices", "x_m,y_m\n500000,4000000\n500100,4000000\n", false, 2, "part 0 ring 0", "fewer than 3"},
        {"a row too short", "x_m,y_m\n500000,4000000\n500100\n", false, 3, "", "has 1 fields"},
        {"unclosed quote", "x_m,y_m\n\"500000,4000000\n", false, 2, "", "not closed"},
    };
    for (const auto& row : rows) {
        const ScenarioError e = failure([&] { parse_area(row.text, "area.csv", row.projected); });
        EXPECT_EQ(e.mark().line, row.line) << row.name << ": " << e.what();
        EXPECT_EQ(e.key_path(), row.path) << row.name << ": " << e.what();
        EXPECT_NE(std::string(e.what()).find(row.says), std::string::npos) << row.name << ": " << e.what();
    }
}

TEST(BaseDepthFiles, ReadAndRefuse) {
    const auto points = parse_base_depths("name,x_m,y_m,base_depth_m\n\"BH 1, north\",0,0,12.5\nBH2,10,0,14\n", "b.csv");
    ASSERT_EQ(points.size(), 2u);
    EXPECT_DOUBLE_EQ(points[0].depth_m, 12.5);
    const auto negative = failure([] { parse_base_depths("x_m,y_m,base_depth_m\n0,0,12\n5,5,-3\n", "b.csv"); });
    EXPECT_EQ(negative.mark().line, 3);
    EXPECT_EQ(negative.mark().column, 5);
    EXPECT_EQ(negative.key_path(), "base_depth_m");
    const auto twice = failure([] { parse_base_depths("x_m,y_m,base_depth_m\n0,0,12\n0,0,13\n", "b.csv"); });
    EXPECT_EQ(twice.mark().line, 3);
    EXPECT_NE(std::string(twice.what()).find("line 2"), std::string::npos);
    EXPECT_THROW(parse_base_depths("x_m,y_m,base_depth_m\n", "b.csv"), ScenarioError);
}

// The command end to end on the bundled demo files.
const std::string demo_args = source("demo/scenario.yaml") + " --area " + source("demo/zone-c-area.geojson") +
                              " --drain band-100x4 --pattern triangular --spacing 1.5 --base-depths " +
                              source("demo/zone-c-boreholes.csv") + " --edge-offset-m 0.75";

TEST(LayoutCommand, OutputsAgreeWithEachOther) {
    const fs::path out = scratch();
    const auto r = run("layout " + demo_args + " --json --out " + out.string());
    ASSERT_EQ(r.exit_code, 0) << r.err;
    const auto j = nlohmann::json::parse(r.out);
    for (const char* key : {"count", "total_length_m", "area_m2", "idealised_count", "drains", "cautions", "warnings"})
        EXPECT_TRUE(j.contains(key)) << key;
    const auto count = j["count"].get<std::size_t>();
    ASSERT_EQ(j["drains"].size(), count);
    for (const char* key : {"id", "x", "y", "length_m"}) EXPECT_TRUE(j["drains"][0].contains(key)) << key;
    double total = 0.0;
    for (const auto& d : j["drains"]) total += d["length_m"].get<double>();
    EXPECT_NEAR(total, j["total_length_m"].get<double>(), 0.005 * static_cast<double>(count));
    EXPECT_EQ(j["cautions"].size(), 4u);
    // The demo's area: 27,925 m² (hand: shoelace on the outline less the 20 × 15 m hole).
    EXPECT_NEAR(j["area_m2"].get<double>(), 27925.0, 0.01);

    const std::string csv = csv_body(slurp(out / "layout.csv"));
    EXPECT_EQ(static_cast<std::size_t>(std::count(csv.begin(), csv.end(), '\n')), count + 1);
    const auto geo = nlohmann::json::parse(slurp(out / "layout.geojson"));
    // Each file handed on carries its trace: the scenario's SHA-256, the version and the caution.
    const std::string sha = j["scenario_sha256"].get<std::string>();
    ASSERT_EQ(sha.size(), 64u);
    EXPECT_EQ(geo["properties"]["scenario_sha256"], sha);
    EXPECT_EQ(geo["properties"]["wickgrid_version"], j["wickgrid_version"]);
    EXPECT_NE(geo["properties"]["caution"].get<std::string>().find("licensed practice govern"), std::string::npos);
    const std::string raw_csv = slurp(out / "layout.csv");
    EXPECT_NE(raw_csv.find("# scenario SHA-256: " + sha + "\n"), std::string::npos);
    EXPECT_LT(raw_csv.find("# caution: "), raw_csv.find("id,x_m,y_m"));
    EXPECT_EQ(geo["features"].size(), count);
    EXPECT_EQ(geo["features"][0]["properties"]["id"], 1);
    EXPECT_EQ(geo["crs"]["properties"]["name"], "urn:ogc:def:crs:EPSG::32650");
    EXPECT_EQ(nlohmann::json::parse(slurp(out / "layout.json"))["count"], count);
    const std::string svg = slurp(out / "layout-plan.svg");
    EXPECT_NE(svg.find(">N</text>"), std::string::npos);  // the file names its system: a north arrow
    EXPECT_NE(svg.find("<desc>"), std::string::npos);
    EXPECT_NE(svg.find("scenario SHA-256: " + sha), std::string::npos);
    EXPECT_NE(slurp(out / "layout.html").find("Shepard, D. (1968)"), std::string::npos);
}

// Above 100,000 drains the plan draws one dot per half pixel (dots that would merge anyway), the
// set-out files still list every drain, and the JSON is the same document built as text.
TEST(LayoutCommand, LargeLayoutsStayLightInThePlanAndWholeInTheLists) {
    const fs::path dir = scratch();
    std::ofstream(dir / "site.csv") << "x_m,y_m\n0,0\n8000,0\n8000,100\n0,100\n";  // 8 km of road, 100 m wide
    const auto r = run("layout " + source("demo/scenario.yaml") + " --area " + (dir / "site.csv").string() +
                       " --projected --drain band-100x4 --pattern square --spacing 2.0 --origin 0,0 --angle-deg 0 --out " +
                       (dir / "out").string() + " --json");
    ASSERT_EQ(r.exit_code, 0) << r.err;
    constexpr std::size_t count = 4001 * 51;
    const auto j = nlohmann::json::parse(r.out);
    ASSERT_EQ(j["count"].get<std::size_t>(), count);
    ASSERT_EQ(j["drains"].size(), count);
    EXPECT_DOUBLE_EQ(j["drains"][count - 1]["y"].get<double>(), 100.0);
    const std::string csv = csv_body(slurp(dir / "out" / "layout.csv"));
    EXPECT_EQ(static_cast<std::size_t>(std::count(csv.begin(), csv.end(), '\n')), count + 1);
    const std::string svg = slurp(dir / "out" / "layout-plan.svg");
    const auto dots = static_cast<std::size_t>(std::count(svg.begin(), svg.end(), 'M'));
    EXPECT_LT(dots, count / 2);
    EXPECT_GT(dots, 10000u);
    EXPECT_NE(svg.find(std::to_string(count) + " drains"), std::string::npos);
    fs::remove_all(dir);
}

TEST(LayoutCommand, TerminalEndsWithTheCautions) {
    const auto r = run("layout " + demo_args);
    ASSERT_EQ(r.exit_code, 0) << r.err;
    EXPECT_NE(r.out.find("idealised count"), std::string::npos);
    EXPECT_NE(r.out.rfind("Local codes, standards and the judgement of a licensed engineer govern"), std::string::npos);
    EXPECT_GT(r.out.rfind("licensed engineer"), r.out.rfind("Assumptions"));
}

TEST(LayoutCommand, BadInputsExitWithTheirCodes) {
    const fs::path dir = scratch();
    std::ofstream(dir / "open.geojson") << "{\"type\": \"Polygon\",\n \"coordinates\": [[[500000, 4000000], [500100, 4000000], "
                                           "[500100, 4000100]]]}";
    auto r = run("layout " + source("demo/scenario.yaml") + " --area " + (dir / "open.geojson").string() +
                 " --drain band-100x4 --pattern square --spacing 1.5");
    EXPECT_EQ(r.exit_code, 2);
    EXPECT_NE(r.err.find("open.geojson:2:"), std::string::npos) << r.err;
    r = run("layout " + demo_args + " --origin 512000");
    EXPECT_EQ(r.exit_code, 2) << r.err;
    const std::string area = source("demo/scenario.yaml") + " --area " + source("demo/zone-c-area.geojson");
    r = run("layout " + area + " --drain band-100x4 --pattern square --spacing 1.5 --edge-offset-m 500");
    EXPECT_EQ(r.exit_code, 5) << r.err;
    EXPECT_NE(r.err.find("at least 500 m from its edge"), std::string::npos) << r.err;
    r = run("layout " + area + " --drain no-such-drain --pattern square --spacing 1.5");
    EXPECT_EQ(r.exit_code, 2) << r.err;
    EXPECT_NE(r.err.find("no-such-drain"), std::string::npos) << r.err;
    // An input file in the output folder under an output's name is never overwritten.
    fs::copy_file(source("demo/zone-c-boreholes.csv"), dir / "layout.csv");
    r = run("layout " + source("demo/scenario.yaml") + " --area " + source("demo/zone-c-area.geojson") +
            " --drain band-100x4 --pattern square --spacing 1.5 --base-depths " + (dir / "layout.csv").string() +
            " --out " + dir.string());
    EXPECT_EQ(r.exit_code, 3) << r.err;
    EXPECT_EQ(slurp(dir / "layout.csv"), slurp(source("demo/zone-c-boreholes.csv")));
}


// `layout` checks the spacing laid against the design of the same scenario, product and pattern
// (the row `design` shows) and states U at the deadline for the spacing laid.
TEST(LayoutCommand, ChecksTheSpacingAgainstTheDesign) {
    const std::string demo = source("demo/scenario.yaml");
    const auto design = run("design " + demo + " --json");
    ASSERT_EQ(design.exit_code, 0) << design.err;
    const auto d = nlohmann::json::parse(design.out);
    nlohmann::json row;
    for (const auto& r : d.at("designs"))
        if (r.at("drain") == "band-100x4" && r.at("pattern") == "triangular") row = r;
    ASSERT_FALSE(row.is_null());
    const std::string area = " --area " + source("demo/zone-c-area.geojson") + " --drain band-100x4 --pattern triangular";
    const auto within = run("layout " + demo + area + " --spacing " + row.at("spacing_m").dump() + " --json");
    ASSERT_EQ(within.exit_code, 0) << within.err;
    const auto w = nlohmann::json::parse(within.out).at("design_check");
    EXPECT_TRUE(w.at("within_limit").get<bool>());
    EXPECT_DOUBLE_EQ(w.at("spacing_limit_m").get<double>(), row.at("spacing_limit_m").get<double>());
    EXPECT_DOUBLE_EQ(w.at("degree_at_deadline").get<double>(), row.at("degree").get<double>());
    EXPECT_TRUE(w.at("deepest_borehole_base_m").is_null());
    // Wider than the limit, over boreholes deeper than the designed clay: both named.
    const auto wide = run("layout " + demo + area + " --spacing 2.5 --base-depths " + source("demo/zone-c-boreholes.csv") +
                          " --json");
    ASSERT_EQ(wide.exit_code, 0) << wide.err;
    const auto doc = nlohmann::json::parse(wide.out);
    EXPECT_FALSE(doc.at("design_check").at("within_limit").get<bool>());
    EXPECT_LT(doc.at("design_check").at("degree_at_deadline").get<double>(), 0.9);
    EXPECT_DOUBLE_EQ(doc.at("design_check").at("deepest_borehole_base_m").get<double>(), 15.1);  // BH-C2
    std::string warnings;
    for (const auto& x : doc.at("warnings")) warnings += x.get<std::string>() + "\n";
    EXPECT_NE(warnings.find("exceeds the design's limit"), std::string::npos) << warnings;
    EXPECT_NE(warnings.find("1.10 m deeper than the 14.00 m designed"), std::string::npos) << warnings;
    EXPECT_NE(wide.err.find("exceeds the design's limit"), std::string::npos) << wide.err;
}

}  // namespace
}  // namespace wickgrid::scenario
