#include "planner/cli/atomic_file.hpp"

#include "planner/scenario/input_error.hpp"

#include <fmt/format.h>

#include <cerrno>
#include <cstring>
#include <fcntl.h>
#include <filesystem>
#include <sys/stat.h>
#include <unistd.h>

namespace crewdose::planner {
namespace {

namespace fs = std::filesystem;

const SourceLocation kCommandLine{"command line", 0};

// Closes and removes the temporary file unless released.
class TempFile {
  public:
    TempFile(int fd, std::string path) : fd_(fd), path_(std::move(path)) {}
    ~TempFile() {
        if (fd_ >= 0) {
            ::close(fd_);
        }
        if (!path_.empty()) {
            ::unlink(path_.c_str());
        }
    }
    TempFile(const TempFile&) = delete;
    TempFile& operator=(const TempFile&) = delete;
    [[nodiscard]] int fd() const { return fd_; }
    [[nodiscard]] const std::string& path() const { return path_; }
    /// Closes the descriptor; false when close reports a write error.
    bool close() {
        const int fd = fd_;
        fd_ = -1;
        return ::close(fd) == 0;
    }
    void keep() { path_.clear(); }

  private:
    int fd_;
    std::string path_;
};

// The process's umask (read by setting and restoring it; the CLI is single-threaded here).
mode_t current_umask() {
    const mode_t mask = ::umask(0);
    ::umask(mask);
    return mask;
}

// The same file: one resolved path, or one device and inode.
bool same_file(const std::string& a, const std::string& b) {
    std::error_code ec;
    const auto ca = fs::weakly_canonical(a, ec);
    if (ec) {
        return false;
    }
    const auto cb = fs::weakly_canonical(b, ec);
    if (ec) {
        return false;
    }
    if (ca == cb) {
        return true;
    }
    return fs::exists(ca, ec) && fs::exists(cb, ec) && fs::equivalent(ca, cb, ec);
}

} // namespace

void write_file_atomically(const std::string& path, const std::string& contents,
                           const std::string& field) {
    const fs::path target(path);
    std::error_code ec;
    if (target.filename().empty() || fs::is_directory(target, ec)) {
        throw InputError(kCommandLine, field,
                         fmt::format("'{}' is a folder; give a file name", path));
    }
    const fs::path folder = target.parent_path().empty() ? fs::path(".") : target.parent_path();
    std::string temp = (folder / ("." + target.filename().string() + ".crewdose-XXXXXX")).string();
    // mkstemp opens with O_CREAT | O_EXCL and mode 0600: it never follows a link planted at
    // the name and never shares the file with another process.
    const int fd = ::mkstemp(temp.data());
    if (fd < 0) {
        throw InputError(kCommandLine, field,
                         fmt::format("cannot write in the folder of '{}' ({}); check that it "
                                     "exists and is writable",
                                     path, std::strerror(errno)));
    }
    TempFile tmp(fd, temp);
    struct stat existing {};
    const mode_t mode = ::lstat(path.c_str(), &existing) == 0 && S_ISREG(existing.st_mode)
                            ? (existing.st_mode & 07777)
                            : (0666 & ~current_umask());
    bool ok = ::fchmod(tmp.fd(), mode) == 0;
    std::size_t written = 0;
    while (ok && written < contents.size()) {
        const ssize_t n = ::write(tmp.fd(), contents.data() + written, contents.size() - written);
        if (n < 0 && errno == EINTR) {
            continue;
        }
        ok = n > 0;
        written += ok ? static_cast<std::size_t>(n) : 0;
    }
    ok = ok && ::fsync(tmp.fd()) == 0;
    ok = tmp.close() && ok;
    if (!ok) {
        throw InputError(kCommandLine, field,
                         fmt::format("writing '{}' failed ({}); '{}' is unchanged", tmp.path(),
                                     std::strerror(errno), path));
    }
    if (::rename(tmp.path().c_str(), path.c_str()) != 0) {
        throw InputError(kCommandLine, field,
                         fmt::format("cannot replace '{}': {}", path, std::strerror(errno)));
    }
    tmp.keep();
}

void refuse_unwritable_outputs(const std::vector<NamedFile>& outputs) {
    for (const auto& out : outputs) {
        if (out.path.empty()) {
            continue;
        }
        const fs::path target(out.path);
        std::error_code ec;
        if (target.filename().empty() || fs::is_directory(target, ec)) {
            throw InputError(kCommandLine, out.option,
                             fmt::format("'{}' is a folder; give a file name", out.path));
        }
        const fs::path folder = target.parent_path().empty() ? fs::path(".") : target.parent_path();
        if (!fs::is_directory(folder, ec)) {
            throw InputError(kCommandLine, out.option,
                             fmt::format("cannot write '{}': the folder '{}' does not exist",
                                         out.path, folder.string()));
        }
        if (::access(folder.c_str(), W_OK | X_OK) != 0) {
            throw InputError(kCommandLine, out.option,
                             fmt::format("cannot write '{}': the folder '{}' is not writable "
                                         "({})",
                                         out.path, folder.string(), std::strerror(errno)));
        }
    }
}

void refuse_clashing_outputs(const std::vector<NamedFile>& inputs,
                             const std::vector<NamedFile>& outputs) {
    for (std::size_t i = 0; i < outputs.size(); ++i) {
        const auto& out = outputs[i];
        if (out.path.empty()) {
            continue;
        }
        for (const auto& in : inputs) {
            if (same_file(out.path, in.path)) {
                throw InputError(kCommandLine, out.option,
                                 fmt::format("'{}' is the same file as the {} '{}', which would "
                                             "be overwritten; write the output elsewhere",
                                             out.path, in.option, in.path));
            }
        }
        for (std::size_t k = 0; k < i; ++k) {
            if (!outputs[k].path.empty() && same_file(out.path, outputs[k].path)) {
                throw InputError(kCommandLine, out.option,
                                 fmt::format("'{}' is the same file as {} '{}'; give each output "
                                             "its own file",
                                             out.path, outputs[k].option, outputs[k].path));
            }
        }
    }
}

} // namespace crewdose::planner
