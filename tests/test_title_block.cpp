// The title block: the `project:` keys, the wickgrid version and the scenario file's SHA-256 on every
// printed and JSON output, so that a printed result can be traced to its input.
#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <cstdio>

#include "cli_helpers.hpp"
#include "report/html_report.hpp"
#include "scenario/file_digest.hpp"
#include "scenario/scenario.hpp"

namespace wickgrid::scenario {
namespace {
using namespace wickgrid::cli_testing;

// FIPS 180-2, Appendix B.1 ("abc"); the empty message's digest as printed by sha256sum.
TEST(TitleBlock, Sha256KnownAnswers) {
    EXPECT_EQ(sha256_hex("abc"), "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
    EXPECT_EQ(sha256_hex(""), "e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855");
}

// The digest in the outputs is the one coreutils' sha256sum computes from the file.
TEST(TitleBlock, OutputsCarryTheFilesDigestAndProject) {
    const std::string demo = source("demo/scenario.yaml");
    std::string sum;
    if (FILE* p = ::popen(("sha256sum " + demo).c_str(), "r")) {
        char buffer[128] = {};
        if (std::fgets(buffer, sizeof buffer, p)) sum = std::string(buffer).substr(0, 64);
        ::pclose(p);
    }
    ASSERT_EQ(sum.size(), 64u) << "sha256sum (coreutils) is needed for this check";
    const auto design = nlohmann::json::parse(run("design " + demo + " --json").out);
    EXPECT_EQ(design["scenario_sha256"], sum);
    EXPECT_EQ(design["project"]["number"], "HR-2041");
    EXPECT_EQ(design["project"]["revision"], "A");
    const auto layout = nlohmann::json::parse(run("layout " + demo + " --area " + source("demo/zone-c-area.geojson") +
                                                  " --drain band-100x4 --pattern square --spacing 1.5 --json").out);
    EXPECT_EQ(layout["scenario_sha256"], sum);
    EXPECT_EQ(layout["project"]["checked_by"], "B. Checker");
    const fs::path out = scratch();
    ASSERT_EQ(run("design " + demo + " --out " + out.string()).exit_code, 0);
    EXPECT_NE(slurp(out / "design.md").find("| scenario SHA-256 | " + sum + " |"), std::string::npos);
}

TEST(TitleBlock, ProjectKeysAreCheckedAndPrintedSafely) {
    const auto bad = run("check " + write_case(edited_copy("demo/scenario.yaml", "  checked_by:", "  checker:")).string());
    EXPECT_EQ(bad.exit_code, 2);
    EXPECT_NE(bad.err.find("project"), std::string::npos) << bad.err;
    // A title that tries to close the style element or the CSS string stays text.
    const Scenario s = parse_scenario(
        edited_copy("demo/scenario.yaml", "  revision: A", "  revision: \"A\\\" } </style><script>x</script>\""), "t.yaml");
    const std::string css = report::print_page_css(s);
    EXPECT_EQ(css.find("</style"), std::string::npos) << css;
    EXPECT_NE(css.find("\\\" } \\3C /style>"), std::string::npos) << css;
    EXPECT_NE(css.find("counter(pages)"), std::string::npos);
    const std::string table = report::title_block_html(s);
    EXPECT_EQ(table.find("<script>"), std::string::npos) << table;
}

}  // namespace
}  // namespace wickgrid::scenario
