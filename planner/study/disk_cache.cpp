#include "planner/study/disk_cache.hpp"

#include "planner/scenario/sha256.hpp"

#include "exposure/byte_codec.hpp"

#include <cerrno>
#include <cstdio>
#include <fcntl.h>
#include <stdexcept>
#include <sys/stat.h>
#include <unistd.h>

namespace crewdose::planner {
namespace {

constexpr std::string_view kMagic = "crewdose";

// A file descriptor closed when it goes out of scope.
class Fd {
  public:
    explicit Fd(int fd) : fd_(fd) {}
    ~Fd() {
        if (fd_ >= 0) {
            ::close(fd_);
        }
    }
    Fd(const Fd&) = delete;
    Fd& operator=(const Fd&) = delete;
    Fd(Fd&&) = delete;
    Fd& operator=(Fd&&) = delete;
    [[nodiscard]] int get() const noexcept { return fd_; }
    bool close() noexcept {
        const int fd = fd_;
        fd_ = -1;
        return ::close(fd) == 0;
    }

  private:
    int fd_;
};

// The whole of a regular file of at most `most` bytes, or nullopt.
std::optional<std::string> read_small_file(const std::filesystem::path& path, std::size_t most) {
    Fd fd(::open(path.c_str(), O_RDONLY | O_CLOEXEC | O_NOFOLLOW));
    if (fd.get() < 0) {
        return std::nullopt;
    }
    struct stat st {};
    if (::fstat(fd.get(), &st) != 0 || !S_ISREG(st.st_mode) || st.st_size < 0 ||
        static_cast<std::size_t>(st.st_size) > most) {
        return std::string(); // there, but not a file to read: rejected by the caller
    }
    std::string bytes(static_cast<std::size_t>(st.st_size), '\0');
    std::size_t got = 0;
    while (got < bytes.size()) {
        const ssize_t n = ::read(fd.get(), bytes.data() + got, bytes.size() - got);
        if (n < 0 && errno == EINTR) {
            continue;
        }
        if (n <= 0) {
            bytes.resize(got);
            break;
        }
        got += static_cast<std::size_t>(n);
    }
    return bytes;
}

bool write_all(int fd, std::string_view bytes) {
    while (!bytes.empty()) {
        const ssize_t n = ::write(fd, bytes.data(), bytes.size());
        if (n < 0 && errno == EINTR) {
            continue;
        }
        if (n <= 0) {
            return false;
        }
        bytes.remove_prefix(static_cast<std::size_t>(n));
    }
    return true;
}

} // namespace

DiskCache::DiskCache(std::filesystem::path folder, std::string build_id)
    : folder_(std::move(folder)), build_id_(std::move(build_id)) {}

std::unique_ptr<DiskCache> DiskCache::open(const std::filesystem::path& folder,
                                           std::string build_id, std::string* why_not) {
    auto fail = [&](const std::string& why) {
        if (why_not) {
            *why_not = why;
        }
        return nullptr;
    };
    if (build_id.empty()) {
        return fail("no build id");
    }
    if (folder.empty() || !folder.is_absolute()) {
        return fail("the cache folder must be an absolute path");
    }
    std::error_code ec;
    if (!std::filesystem::is_directory(folder, ec)) {
        // The parents as the user's umask has them; the folder itself private (XDG: 0700).
        std::filesystem::create_directories(folder.parent_path(), ec);
        if (::mkdir(folder.c_str(), 0700) != 0 && errno != EEXIST) {
            return fail(folder.string() + ": cannot be created");
        }
        if (!std::filesystem::is_directory(folder, ec)) {
            return fail(folder.string() + ": not a folder");
        }
    }
    if (::access(folder.c_str(), W_OK | X_OK) != 0) {
        return fail(folder.string() + ": cannot be written");
    }
    return std::unique_ptr<DiskCache>(new DiskCache(folder, std::move(build_id)));
}

std::string DiskCache::identity(std::string_view kind, std::string_view key) const {
    std::string id;
    id.reserve(kind.size() + build_id_.size() + key.size() + 3);
    id.append(kind).append("\n").append(build_id_).append("\n").append(key).append("\n");
    return id;
}

std::filesystem::path DiskCache::entry_path(std::string_view kind, std::string_view key) const {
    std::string named(kind);
    named.append("\n").append(key);
    return folder_ / (std::string(kind) + "-" + sha256_hex(named).substr(0, 32) + ".bin");
}

std::optional<std::string> DiskCache::remembered(const std::string& name) const {
    const std::lock_guard<std::mutex> lock(memory_mutex_);
    const auto it = memory_.find(name);
    if (it == memory_.end()) {
        return std::nullopt;
    }
    return it->second;
}

void DiskCache::remember(const std::string& name, std::string_view payload) const {
    const std::lock_guard<std::mutex> lock(memory_mutex_);
    memory_.insert_or_assign(name, std::string(payload));
}

std::optional<std::string> DiskCache::load(std::string_view kind, std::string_view key) const {
    std::string name(kind);
    name.append("\n").append(key);
    if (auto payload = remembered(name)) {
        ++hits_;
        return payload;
    }
    const auto bytes = read_small_file(entry_path(kind, key), kMaxEntryBytes);
    if (!bytes) {
        ++misses_;
        return std::nullopt;
    }
    try {
        if (bytes->size() < kMagic.size() || std::string_view(*bytes).substr(0, 8) != kMagic) {
            throw exposure::CodecError("not an entry");
        }
        exposure::ByteReader r(std::string_view(*bytes).substr(kMagic.size()));
        if (r.u64() != kFormatVersion || r.text() != identity(kind, key)) {
            throw exposure::CodecError("another format, build or key");
        }
        const std::uint64_t size = r.u64();
        const std::string digest = r.text();
        const std::size_t header = bytes->size() - r.remaining();
        if (size != r.remaining()) {
            throw exposure::CodecError("short or long");
        }
        std::string payload = bytes->substr(header);
        if (sha256_hex(payload) != digest) {
            throw exposure::CodecError("payload digest differs");
        }
        remember(name, payload);
        ++hits_;
        return payload;
    } catch (const exposure::CodecError&) {
        ++rejected_;
        return std::nullopt;
    }
}

void DiskCache::store(std::string_view kind, std::string_view key,
                      std::string_view payload) const noexcept {
    try {
        std::string name(kind);
        name.append("\n").append(key);
        remember(name, payload);
        exposure::ByteWriter w;
        w.u64(kFormatVersion);
        w.text(identity(kind, key));
        w.u64(payload.size());
        w.text(sha256_hex(payload));
        const std::filesystem::path path = entry_path(kind, key);
        // A hidden temporary beside the entry: rename() within one folder is atomic.
        std::string temp = (folder_ / ("." + path.filename().string() + ".XXXXXX")).string();
        Fd fd(::mkstemp(temp.data()));
        if (fd.get() < 0) {
            ++failed_;
            return;
        }
        const bool ok = write_all(fd.get(), kMagic) && write_all(fd.get(), w.bytes()) &&
                        write_all(fd.get(), payload) && fd.close();
        if (!ok || ::rename(temp.c_str(), path.c_str()) != 0) {
            ::unlink(temp.c_str());
            ++failed_;
            return;
        }
        ++stored_;
    } catch (...) {
        ++failed_; // out of memory while encoding: no entry
    }
}

DiskCacheCounts DiskCache::counts() const noexcept {
    return {hits_.load(), misses_.load(), rejected_.load(), stored_.load(), failed_.load()};
}

} // namespace crewdose::planner
