#include "atomic_file.hpp"

#include <filesystem>
#include <fstream>
#include <system_error>
#include <unistd.h>

namespace wickgrid::report {

void write_file_atomically(const std::string& path, const std::string& content) {
    namespace fs = std::filesystem;
    const fs::path target(path);
    const fs::path temp = target.parent_path() /
                          ("." + target.filename().string() + ".tmp-" + std::to_string(::getpid()));
    {
        std::ofstream out(temp, std::ios::binary | std::ios::trunc);
        if (!out) throw OutputError("cannot write " + temp.string());
        out << content;
        out.flush();
        if (!out) {
            std::error_code ignored;
            fs::remove(temp, ignored);
            throw OutputError("cannot write " + temp.string() + " (disk full?)");
        }
    }
    std::error_code ec;
    fs::rename(temp, target, ec);
    if (ec) {
        std::error_code ignored;
        fs::remove(temp, ignored);
        throw OutputError("cannot replace " + target.string() + ": " + ec.message());
    }
}

void ensure_directory(const std::string& path) {
    std::error_code ec;
    std::filesystem::create_directories(path, ec);
    if (ec || !std::filesystem::is_directory(path))
        throw OutputError("cannot create the output folder " + path + (ec ? ": " + ec.message() : ""));
}

}  // namespace wickgrid::report
