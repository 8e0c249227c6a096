// The bibliography file: every (author, year) that a source comment cites has its full reference,
// every reference a note prints belongs to a method the note describes, and the note prints it.
#include <gtest/gtest.h>

#include <filesystem>
#include <regex>
#include <set>

#include "cli_helpers.hpp"
#include "report/design_report.hpp"
#include "results/bibliography.hpp"
#include "results/design_record.hpp"
#include "scenario/scenario.hpp"

namespace wickgrid::results {
namespace {
using namespace wickgrid::cli_testing;

TEST(Bibliography, EntriesAreWhole) {
    std::set<std::string> keys;
    for (const auto& r : bibliography()) {
        EXPECT_TRUE(keys.insert(r.key).second) << r.key;
        const std::smatch year = [&] {
            std::smatch m;
            std::regex_search(r.cite, m, std::regex("\\((1[89]|20)\\d\\d\\)"));
            return m;
        }();
        ASSERT_FALSE(year.empty()) << r.key << ": no year in '" << r.cite << "'";
        EXPECT_NE(r.text.find(year.str()), std::string::npos) << r.key << ": the text has another year";
    }
    EXPECT_GE(keys.size(), 15u);
    EXPECT_THROW(reference("no-such-key"), std::logic_error);
}

// "Hansbo (1981)", "Walker & Indraratna 2006", "Chai, Shen, Miura & Bergado 2001)" … in any source
// or header comment: the first author and the year must name an entry of BIBLIOGRAPHY.yaml.
TEST(Bibliography, EveryCitationInTheSourcesHasAnEntry) {
    const std::regex citation("([A-Z][a-z]+)(?: et al\\.| & [A-Z][a-z]+|(?:, [A-Z][a-z]+)+ & [A-Z][a-z]+)? \\(?((?:19|20)\\d\\d)\\b");
    std::size_t seen = 0;
    for (const char* dir : {"src", "include"})
        for (const auto& f : fs::recursive_directory_iterator(source(dir))) {
            if (!f.is_regular_file()) continue;
            const std::string text = slurp(f.path());
            for (std::sregex_iterator it(text.begin(), text.end(), citation), end; it != end; ++it) {
                const std::string author = (*it)[1], year = "(" + (*it)[2].str() + ")";
                const bool known = std::any_of(bibliography().begin(), bibliography().end(), [&](const Reference& r) {
                    return r.text.find(author) != std::string::npos && r.text.find(year) != std::string::npos;
                });
                EXPECT_TRUE(known) << f.path() << ": '" << it->str() << "' has no entry in BIBLIOGRAPHY.yaml";
                ++seen;
            }
        }
    EXPECT_GE(seen, 30u);
}

TEST(Bibliography, NotesPrintTheReferencesOfTheirMethods) {
    for (const char* file : {"demo/scenario.yaml", "configs/staged-surcharge.yaml", "configs/product-catalogue.yaml",
                             "configs/layered-partial-numerical.yaml"}) {
        const auto s = scenario::load_scenario(source(file));
        const DesignRecord record = design_record(s);
        std::string notes;
        for (const auto& n : record.method_notes) notes += n + "\n";
        const std::string md = report::design_markdown(record);
        for (const auto& key : reference_keys(record)) {
            const Reference& r = reference(key);
            const std::string first_author = r.cite.substr(0, r.cite.find_first_of(" ,"));
            const std::string year = r.cite.substr(r.cite.find('(') + 1, 4);
            EXPECT_NE(notes.find(first_author), std::string::npos) << file << ": " << key << " not among the methods";
            EXPECT_NE(notes.find(year), std::string::npos) << file << ": " << key;
            EXPECT_NE(md.find(r.text.substr(0, 20)), std::string::npos) << file << ": " << key << " not printed";
        }
    }
}

}  // namespace
}  // namespace wickgrid::results
