#include "planner/cli/run_cache.hpp"

#include <fmt/format.h>

#include <cstdio>
#include <cstdlib>
#include <cstring>
#include <elf.h>
#include <link.h>

namespace crewdose::cli {

std::optional<std::filesystem::path> user_cache_folder() {
    auto absolute = [](const char* name) -> std::optional<std::filesystem::path> {
        const char* v = std::getenv(name);
        if (v == nullptr || *v == '\0' || *v != '/') {
            return std::nullopt;
        }
        return std::filesystem::path(v);
    };
    if (auto xdg = absolute("XDG_CACHE_HOME")) {
        return *xdg / "crewdose";
    }
    if (auto home = absolute("HOME")) {
        return *home / ".cache" / "crewdose";
    }
    return std::nullopt;
}

namespace {

// The NT_GNU_BUILD_ID note of the main program (the first object dl_iterate_phdr visits).
int find_build_id(dl_phdr_info* info, std::size_t /*size*/, void* data) {
    auto* out = static_cast<std::string*>(data);
    for (ElfW(Half) i = 0; i < info->dlpi_phnum; ++i) {
        const ElfW(Phdr)& ph = info->dlpi_phdr[i];
        if (ph.p_type != PT_NOTE) {
            continue;
        }
        const char* at = reinterpret_cast<const char*>(info->dlpi_addr + ph.p_vaddr);
        const char* end = at + ph.p_memsz;
        while (at + sizeof(ElfW(Nhdr)) <= end) {
            ElfW(Nhdr) note{};
            std::memcpy(&note, at, sizeof note);
            const char* name = at + sizeof note;
            const char* desc = name + ((note.n_namesz + 3U) & ~3U);
            const char* next = desc + ((note.n_descsz + 3U) & ~3U);
            if (next > end) {
                break;
            }
            if (note.n_type == NT_GNU_BUILD_ID && note.n_namesz == 4 &&
                std::memcmp(name, "GNU", 4) == 0) {
                for (ElfW(Word) k = 0; k < note.n_descsz; ++k) {
                    *out += fmt::format("{:02x}", static_cast<unsigned char>(desc[k]));
                }
                return 1;
            }
            at = next;
        }
    }
    return 1; // only the main program
}

} // namespace

std::string executable_build_id() {
    std::string id;
    dl_iterate_phdr(find_build_id, &id);
    if (id.empty()) {
        return "";
    }
    return fmt::format("crewdose {} build-id {}", CREWDOSE_VERSION, id);
}

void add_no_cache_flag(CLI::App* command, bool& no_cache) {
    command->add_flag(
        "--no-cache", no_cache,
        "compute everything afresh and neither read nor write the cache across runs (by "
        "default the data that depend on no scenario, each material's nuclear data and the "
        "phantom's tissue depths, are kept in $XDG_CACHE_HOME/crewdose or ~/.cache/crewdose: "
        "about 6 MB for the lunar demo, deleted at any time; the results are the same bit for "
        "bit)");
}

std::unique_ptr<planner::DiskCache> open_run_cache(bool no_cache) {
    if (no_cache) {
        return nullptr;
    }
    const auto folder = user_cache_folder();
    if (!folder) {
        return nullptr; // no home: nowhere to keep it, and nothing to say
    }
    std::string why;
    auto cache = planner::DiskCache::open(*folder, executable_build_id(), &why);
    if (!cache) {
        std::fprintf(stderr, "note: no cache across runs (%s)\n", why.c_str());
    }
    return cache;
}

} // namespace crewdose::cli
