#include "report/atomic_file.hpp"

#include <fcntl.h>
#include <signal.h>
#include <sys/stat.h>
#include <unistd.h>

#include <cerrno>
#include <cstdlib>
#include <cstring>
#include <filesystem>
#include <system_error>

namespace wickgrid::report {

namespace fs = std::filesystem;

namespace {
// Writes all of content to a file descriptor and closes it; false on any error.
bool write_all(int fd, const std::string& content) {
    std::size_t done = 0;
    while (done < content.size()) {
        const ssize_t n = ::write(fd, content.data() + done, content.size() - done);
        if (n < 0) {
            if (errno == EINTR) continue;
            ::close(fd);
            return false;
        }
        done += static_cast<std::size_t>(n);
    }
    return ::close(fd) == 0;
}

// A new file created exclusively in dir (O_EXCL through mkstemp), world-readable like a plain file.
std::pair<int, fs::path> exclusive_file(const fs::path& dir, const std::string& stem) {
    std::string pattern = (dir / ("." + stem + ".tmp-XXXXXX")).string();
    const int fd = ::mkstemp(pattern.data());
    if (fd < 0) throw OutputError("cannot create a temporary file in " + dir.string() + ": " + std::strerror(errno));
    ::fchmod(fd, 0644);
    return {fd, fs::path(pattern)};
}

void rename_into_place(const fs::path& from, const fs::path& to) {
    std::error_code ec;
    fs::rename(from, to, ec);
    if (ec) throw OutputError("cannot replace " + to.string() + ": " + ec.message());
}
}  // namespace

void write_file_atomically(const std::string& path, const std::string& content) {
    const fs::path target(path);
    const fs::path dir = target.parent_path().empty() ? fs::path(".") : target.parent_path();
    auto [fd, temp] = exclusive_file(dir, target.filename().string());
    std::error_code ignored;
    if (!write_all(fd, content)) {
        fs::remove(temp, ignored);
        throw OutputError("cannot write " + target.string() + " (disk full?)");
    }
    try {
        rename_into_place(temp, target);
    } catch (...) {
        fs::remove(temp, ignored);
        throw;
    }
}

namespace {
// Staging folders left by a run that was killed (kill -9 cannot be cleaned up after): their names
// carry the process id, and a folder whose process is gone is removed by the next run.
void remove_stale_staging(const std::string& dir) {
    std::error_code ec;
    for (const auto& entry : fs::directory_iterator(dir, ec)) {
        const std::string name = entry.path().filename().string();
        const std::string prefix = ".wickgrid-out-";
        if (name.rfind(prefix, 0) != 0 || !entry.is_directory(ec)) continue;
        const auto dash = name.find('-', prefix.size());
        if (dash == std::string::npos) continue;
        char* end = nullptr;
        const long pid = std::strtol(name.c_str() + prefix.size(), &end, 10);
        if (end != name.c_str() + dash || pid <= 0) continue;
        if (::kill(static_cast<pid_t>(pid), 0) != 0 && errno == ESRCH) fs::remove_all(entry.path(), ec);
    }
}
}  // namespace

void write_files_atomically(const std::string& dir, const std::vector<std::pair<std::string, std::string>>& files) {
    remove_stale_staging(dir);
    std::string pattern = (fs::path(dir) / (".wickgrid-out-" + std::to_string(::getpid()) + "-XXXXXX")).string();
    if (!::mkdtemp(pattern.data()))
        throw OutputError("cannot create a temporary folder in " + dir + ": " + std::strerror(errno));
    const fs::path staging(pattern);
    std::error_code ignored;
    try {
        for (const auto& [name, content] : files) {
            const fs::path path = staging / name;
            const int fd = ::open(path.c_str(), O_WRONLY | O_CREAT | O_EXCL | O_CLOEXEC, 0644);
            if (fd < 0 || !write_all(fd, content))
                throw OutputError("cannot write " + (fs::path(dir) / name).string() + " (disk full?)");
        }
        for (const auto& [name, content] : files) rename_into_place(staging / name, fs::path(dir) / name);
    } catch (...) {
        fs::remove_all(staging, ignored);
        throw;
    }
    fs::remove_all(staging, ignored);
}

void ensure_directory(const std::string& path) {
    std::error_code ec;
    fs::create_directories(path, ec);
    if (ec || !fs::is_directory(path))
        throw OutputError("cannot create the output folder " + path + (ec ? ": " + ec.message() : ""));
}

}  // namespace wickgrid::report
