#include "report/atomic_file.hpp"

#include <fcntl.h>
#include <sys/file.h>
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
// Staging folders are named ".wickgrid-staging.<host>.<pid>.XXXXXX": output folder names never start
// with a dot (cli folder_names), so no scenario's folder can look like one.
const std::string staging_prefix = ".wickgrid-staging.";


// Runs into one folder take turns: an advisory lock on DIR/.wickgrid-lock, released when the process
// ends however it ends (so a killed run leaves no stale lock).
class FolderLock {
public:
    explicit FolderLock(const std::string& dir) {
        const std::string path = (fs::path(dir) / ".wickgrid-lock").string();
        fd_ = ::open(path.c_str(), O_RDWR | O_CREAT | O_CLOEXEC | O_NOFOLLOW, 0644);
        if (fd_ < 0) throw OutputError("cannot lock the output folder " + dir + " (" + path + "): " + std::strerror(errno));
        while (::flock(fd_, LOCK_EX) != 0)
            if (errno != EINTR) {
                const std::string why = std::strerror(errno);
                ::close(fd_);
                throw OutputError("cannot lock the output folder " + dir + ": " + why);
            }
    }
    ~FolderLock() { ::close(fd_); }
    FolderLock(const FolderLock&) = delete;
    FolderLock& operator=(const FolderLock&) = delete;

private:
    int fd_ = -1;
};

// Staging folders left by a run of this host that was killed (kill -9 cannot be cleaned up after):
// with the folder's lock held no other run of this host is writing here, so every one is stale.
// Another host's are left alone (its run may be live on a shared folder).
void remove_stale_staging(const std::string& dir) {
    std::error_code ec;
    const std::string mine = staging_prefix_of_this_host();
    for (const auto& entry : fs::directory_iterator(dir, ec)) {
        const std::string name = entry.path().filename().string();
        if (name.rfind(mine, 0) == 0 && entry.is_directory(ec) && !entry.is_symlink(ec)) fs::remove_all(entry.path(), ec);
    }
}

// Every target is checked before the first rename, so a name that cannot be replaced (a folder of
// that name) leaves the old set whole.
void check_targets(const std::string& dir, const std::vector<std::pair<std::string, std::string>>& files) {
    for (const auto& [name, content] : files) {
        std::error_code ec;
        const fs::path target = fs::path(dir) / name;
        const auto status = fs::symlink_status(target, ec);
        if (!ec && fs::is_directory(status))
            throw OutputError("cannot replace " + target.string() + ": a folder has that name (nothing was written)");
    }
}
}  // namespace

std::string staging_prefix_of_this_host() {
    char name[256] = {};
    std::string host = ::gethostname(name, sizeof name - 1) == 0 && name[0] != '\0' ? name : "host";
    for (char& c : host)
        if (c == '/' || c == '.') c = '_';
    return staging_prefix + host + ".";
}

void write_files_atomically(const std::string& dir, const std::vector<std::pair<std::string, std::string>>& files) {
    const FolderLock lock(dir);
    remove_stale_staging(dir);
    check_targets(dir, files);
    std::string pattern = (fs::path(dir) / (staging_prefix_of_this_host() + std::to_string(::getpid()) + ".XXXXXX")).string();
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
