#pragma once
// Helpers for tests that run the wickgrid binary.
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <stdexcept>
#include <string>
#include <sys/wait.h>
#include <unistd.h>

namespace wickgrid::cli_testing {
namespace fs = std::filesystem;

struct CommandRun {
    int exit_code;
    std::string out;
    std::string err;
};

inline std::string slurp(const fs::path& p) {
    std::ifstream in(p, std::ios::binary);
    std::ostringstream text;
    text << in.rdbuf();
    return text.str();
}

// A written CSV file less its leading '#' trace block (report/trace.hpp); throws if the block is missing.
inline std::string csv_body(const std::string& text) {
    if (text.rfind("# ", 0) != 0) throw std::runtime_error("a written CSV file without its trace block");
    std::size_t at = 0;
    while (text.compare(at, 2, "# ") == 0) at = text.find('\n', at) + 1;
    return text.substr(at);
}

inline fs::path scratch() {
    static int counter = 0;
    const fs::path dir = fs::temp_directory_path() /
                         ("wickgrid-cli-" + std::to_string(::getpid()) + "-" + std::to_string(counter++));
    fs::create_directories(dir);
    return dir;
}

inline CommandRun run(const std::string& args) {
    const fs::path dir = scratch();
    const std::string command = std::string(WICKGRID_BINARY) + " " + args + " >" + (dir / "out").string() + " 2>" +
                                (dir / "err").string();
    const int status = std::system(command.c_str());
    CommandRun r{WEXITSTATUS(status), slurp(dir / "out"), slurp(dir / "err")};
    fs::remove_all(dir);
    return r;
}

inline std::string source(const std::string& relative) { return std::string(WICKGRID_SOURCE_DIR) + "/" + relative; }

inline fs::path write_case(const std::string& text) {
    const fs::path file = scratch() / "case.yaml";
    std::ofstream(file) << text;
    return file;
}

// A bundled file's text with one edit; throws if the text to replace is not there.
inline std::string edited_copy(const std::string& relative, const std::string& from, const std::string& to) {
    std::string text = slurp(source(relative));
    const auto at = text.find(from);
    if (at == std::string::npos) throw std::logic_error("edit not found: " + from);
    return text.replace(at, from.size(), to);
}

inline std::string demo_with(const std::string& from, const std::string& to) {
    std::string text = slurp(source("demo/scenario.yaml"));
    text.replace(text.find(from), from.size(), to);
    return text;
}

}  // namespace wickgrid::cli_testing
