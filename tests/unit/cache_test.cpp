// The cache across runs: the exact encoding of doubles, the march data and the phantom's depths
// read back bit for bit, and entries on disk that cannot be trusted (a flipped byte, a short
// file, another key, another build) rebuilt instead of used.
#include "exposure/byte_codec.hpp"
#include "exposure/data_cache.hpp"
#include "exposure/fragment_transport.hpp"
#include "exposure/gcr.hpp"
#include "exposure/material_library.hpp"
#include "exposure/table_library.hpp"
#include "habitats/direction_set.hpp"
#include "planner/study/body_model.hpp"
#include "planner/study/disk_cache.hpp"
#include "planner/study/study.hpp"

#include "fixture.hpp"

#include <catch2/catch.hpp>

#include <bit>
#include <cmath>
#include <cstdint>
#include <filesystem>
#include <fstream>
#include <limits>
#include <map>
#include <mutex>
#include <string>
#include <unistd.h>
#include <vector>

using namespace crewdose;
namespace fs = std::filesystem;

namespace {

// A DataCache in memory, counting what it is asked.
class MemoryCache final : public exposure::DataCache {
  public:
    [[nodiscard]] std::optional<std::string> load(std::string_view kind,
                                                  std::string_view key) const override {
        const std::lock_guard<std::mutex> lock(mutex_);
        const auto it = entries_.find(std::string(kind) + "\n" + std::string(key));
        if (it == entries_.end()) {
            return std::nullopt;
        }
        ++hits;
        return it->second;
    }
    void store(std::string_view kind, std::string_view key,
               std::string_view payload) const noexcept override {
        const std::lock_guard<std::mutex> lock(mutex_);
        entries_[std::string(kind) + "\n" + std::string(key)] = std::string(payload);
        ++stores;
    }
    // Every entry of `kind`, to damage.
    std::vector<std::string*> of_kind(std::string_view kind) {
        std::vector<std::string*> out;
        for (auto& [k, v] : entries_) {
            if (k.starts_with(std::string(kind) + "\n")) {
                out.push_back(&v);
            }
        }
        return out;
    }
    mutable std::size_t hits = 0;
    mutable std::size_t stores = 0;

  private:
    mutable std::mutex mutex_;
    mutable std::map<std::string, std::string> entries_;
};

bool same_bits(double a, double b) {
    return std::bit_cast<std::uint64_t>(a) == std::bit_cast<std::uint64_t>(b);
}

bool same_bits(const std::vector<double>& a, const std::vector<double>& b) {
    if (a.size() != b.size()) {
        return false;
    }
    for (std::size_t i = 0; i < a.size(); ++i) {
        if (!same_bits(a[i], b[i])) {
            return false;
        }
    }
    return true;
}

bool same_bits(const exposure::DoseQuantities& a, const exposure::DoseQuantities& b) {
    return same_bits(a.absorbed_Gy, b.absorbed_Gy) &&
           same_bits(a.dose_equivalent_Sv, b.dose_equivalent_Sv) &&
           same_bits(a.rbe_weighted_GyEq, b.rbe_weighted_GyEq);
}

bool same_bits(const planner::BodyDepths& a, const planner::BodyDepths& b) {
    return a.model == b.model && a.organs == b.organs && a.directions == b.directions &&
           same_bits(a.grid_g_cm2, b.grid_g_cm2) && same_bits(a.weights, b.weights);
}

// The field of phi = 500 MV through 30 g/cm2 of `shield` (one material only, so that the march
// asks the cache for nothing else): every species' psi and the dose scored in the shield.
struct Marched {
    exposure::IonField field;
    exposure::DoseQuantities dose;
};
Marched march(exposure::FragmentTransport& t, const exposure::Material& shield) {
    Marched m{exposure::gcr_free_space_field(t, 500.0), {}};
    t.cross(m.field, shield, 30.0);
    m.dose = t.dose(m.field, shield, *exposure::find_builtin_material("water"));
    return m;
}

bool same_bits(const Marched& a, const Marched& b) {
    if (a.field.psi.size() != b.field.psi.size() || !same_bits(a.dose, b.dose)) {
        return false;
    }
    for (std::size_t j = 0; j < a.field.psi.size(); ++j) {
        if (!same_bits(a.field.psi[j], b.field.psi[j])) {
            return false;
        }
    }
    return true;
}

// A folder of its own under the tests' cache home (never the user's), removed afterwards.
struct ScratchFolder {
    explicit ScratchFolder(const std::string& name)
        : path(fs::path(CREWDOSE_TEST_CACHE_HOME) /
               ("unit-" + name + "-" + std::to_string(::getpid()))) {
        fs::remove_all(path);
    }
    ~ScratchFolder() {
        std::error_code ec;
        fs::remove_all(path, ec);
    }
    ScratchFolder(const ScratchFolder&) = delete;
    ScratchFolder& operator=(const ScratchFolder&) = delete;
    ScratchFolder(ScratchFolder&&) = delete;
    ScratchFolder& operator=(ScratchFolder&&) = delete;
    fs::path path;
};

std::unique_ptr<planner::DiskCache> open_cache(const fs::path& folder,
                                               const std::string& build = "build-1") {
    std::string why;
    auto cache = planner::DiskCache::open(folder, build, &why);
    INFO(why);
    REQUIRE(cache);
    return cache;
}

std::string read_bytes(const fs::path& p) {
    std::ifstream in(p, std::ios::binary);
    return {std::istreambuf_iterator<char>(in), std::istreambuf_iterator<char>()};
}

void write_bytes(const fs::path& p, const std::string& bytes) {
    std::ofstream out(p, std::ios::binary | std::ios::trunc);
    out << bytes;
}

} // namespace

TEST_CASE("cache: doubles are encoded bit for bit", "[cache]") {
    // By construction: each value comes back with the same bit pattern, the signed zero, a NaN
    // with a payload, the smallest subnormal and the infinities included; runs of +0.0 are
    // left out of the bytes.
    const std::vector<double> values{0.0,
                                     -0.0,
                                     1.0 / 3.0,
                                     std::bit_cast<double>(std::uint64_t{0x7ff8000000000123}),
                                     std::numeric_limits<double>::denorm_min(),
                                     std::numeric_limits<double>::infinity(),
                                     -std::numeric_limits<double>::infinity(),
                                     0.0,
                                     0.0,
                                     0.0,
                                     6.02214076e23};
    exposure::ByteWriter w;
    w.f64s(values);
    w.text("key");
    const std::string bytes = w.take();
    exposure::ByteReader r(bytes);
    const auto back = r.f64s();
    CHECK(same_bits(back, values));
    CHECK(r.text() == "key");
    CHECK_NOTHROW(r.finish());

    // By construction: a thousand zeros and a value cost the count, one run's two counts and
    // the value.
    std::vector<double> sparse(1000, 0.0);
    sparse.push_back(2.5);
    exposure::ByteWriter ws;
    ws.f64s(sparse);
    CHECK(ws.bytes().size() == 8 + 16 + 8);

    // Every prefix of the bytes is refused, never half read.
    for (std::size_t cut = 0; cut < bytes.size(); ++cut) {
        exposure::ByteReader short_reader(std::string_view(bytes).substr(0, cut));
        CHECK_THROWS_AS(
            [&] {
                (void)short_reader.f64s();
                (void)short_reader.text();
                short_reader.finish();
            }(),
            exposure::CodecError);
    }
    // A count past what may be held is refused before anything is allocated.
    exposure::ByteWriter huge;
    huge.u64(std::uint64_t{1} << 60);
    exposure::ByteReader huge_reader(huge.bytes());
    CHECK_THROWS_AS(huge_reader.f64s(), exposure::CodecError);
}

TEST_CASE("cache: march data read back are bit for bit the computed ones", "[cache][march]") {
    // By construction: a march whose material data come from the cache holds the same doubles
    // as one that computed them (their encodings, every double's bit pattern, are equal) and
    // marches a field to the same bits. The GCR march options of check (secondaries on) fill
    // every field of the data; the march without reactions leaves most empty.
    exposure::TableLibrary tables(planner::gcr_grid());
    for (const auto& options : {planner::gcr_march_options(), [] {
                                    exposure::MarchOptions none;
                                    none.removal = false;
                                    return none;
                                }()}) {
        MemoryCache cache;
        exposure::FragmentTransport fresh(tables, options);
        exposure::FragmentTransport writer(tables, options, &cache);
        exposure::FragmentTransport reader(tables, options, &cache);
        for (const char* id : {"aluminium", "polyethylene", "highland-regolith"}) {
            INFO(id);
            const auto& material = *exposure::find_builtin_material(id);
            const std::string computed = fresh.encoded_data(material);
            const std::size_t stores = cache.stores;
            CHECK(writer.encoded_data(material) == computed);
            CHECK(cache.stores == stores + 1); // a miss: computed and stored
            const std::size_t hits = cache.hits;
            CHECK(reader.encoded_data(material) == computed);
            CHECK(cache.hits == hits + 1); // read back, not computed
            CHECK(same_bits(march(reader, material), march(fresh, material)));
        }
    }
}

TEST_CASE("cache: march data that do not decode are computed again", "[cache][march]") {
    // By construction: a payload cut short, or one of another energy grid, is not used; the
    // march computes the data, stores them again and marches exactly as without a cache.
    exposure::TableLibrary tables(planner::gcr_grid());
    const auto options = planner::gcr_march_options();
    const auto& material = *exposure::find_builtin_material("aluminium");
    exposure::FragmentTransport fresh(tables, options);
    const Marched expected = march(fresh, material);

    MemoryCache cache;
    exposure::FragmentTransport writer(tables, options, &cache);
    (void)writer.encoded_data(material);
    auto entries = cache.of_kind(exposure::FragmentTransport::kCacheKind);
    REQUIRE(entries.size() == 1);
    std::string& payload = *entries.front();
    const std::string good = payload;
    for (const std::string& bad : {good.substr(0, good.size() / 2), good + "x", std::string()}) {
        payload = bad;
        const std::size_t stores = cache.stores;
        exposure::FragmentTransport reader(tables, options, &cache);
        CHECK(same_bits(march(reader, material), expected));
        CHECK(cache.stores == stores + 1);
        CHECK(payload == good); // rewritten
    }
    // The data of a coarser grid under this grid's key: the node count differs.
    exposure::TableLibrary coarse(exposure::EnergyGridSpec{0.01, 1e5, 6});
    exposure::FragmentTransport other(coarse, options);
    payload = other.encoded_data(material);
    exposure::FragmentTransport reader(tables, options, &cache);
    CHECK(same_bits(march(reader, material), expected));
    CHECK(payload == good);
}

TEST_CASE("cache: the phantom's depths read back are bit for bit the computed ones",
          "[cache][phantom]") {
    // By construction: the depths of a phantom placement from the cache equal the computed ones
    // in every weight's bits; another heading is another key.
    const planner::BodyModel& phantom = planner::body_model("phantom");
    const auto spe = habitats::fibonacci_directions(24);
    const auto gcr = habitats::fibonacci_directions(12);
    const planner::BodyPlacement placement{habitats::Posture::lying, 30.0};
    const planner::SourceBodyDepths computed = phantom.depths(placement, spe, gcr, 1);
    MemoryCache cache;
    const auto first = planner::cached_depths(phantom, placement, spe, gcr, 2, &cache);
    CHECK(cache.stores == 1);
    const auto second = planner::cached_depths(phantom, placement, spe, gcr, 1, &cache);
    CHECK(cache.hits == 1);
    for (const auto* d : {&first, &second}) {
        CHECK(same_bits(d->spe, computed.spe));
        CHECK(same_bits(d->gcr, computed.gcr));
    }
    (void)planner::cached_depths(phantom, {habitats::Posture::lying, 31.0}, spe, gcr, 1, &cache);
    CHECK(cache.stores == 2);
    CHECK(cache.hits == 1);
    // The quick model's depths cost nothing: not kept.
    (void)planner::cached_depths(planner::body_model("quick"), placement, spe, gcr, 1, &cache);
    CHECK(cache.stores == 2);
    // Depths cut short are computed again and stored again.
    for (std::string* p : cache.of_kind(planner::kBodyDepthsCacheKind)) {
        p->resize(p->size() - 8);
    }
    const auto again = planner::cached_depths(phantom, placement, spe, gcr, 1, &cache);
    CHECK(same_bits(again.spe, computed.spe));
    CHECK(cache.stores == 3);
}

TEST_CASE("cache: entries on disk that cannot be trusted are rebuilt", "[cache][disk]") {
    // By construction: an entry comes back only when its magic, format, build, key, size and
    // payload digest all match; a damaged one is a miss that the next store overwrites. Each
    // run opens its own DiskCache, which reads an entry from disk once and then keeps it.
    const ScratchFolder scratch("disk");
    const fs::path folder = scratch.path / "crewdose";
    auto cache = open_cache(folder);
    CHECK(fs::is_directory(folder));
    CHECK((fs::status(folder).permissions() & fs::perms::all) == fs::perms::owner_all);
    const std::string payload = "payload bytes \x01\x02 end" + std::string(1000, 'x');
    CHECK_FALSE(cache->load("kind", "key A"));
    CHECK(cache->counts().misses == 1);
    cache->store("kind", "key A", payload);
    CHECK(cache->counts().stored == 1);
    const fs::path entry = cache->entry_path("kind", "key A");
    const std::string good = read_bytes(entry);
    // No temporary left behind.
    CHECK(std::distance(fs::directory_iterator(folder), fs::directory_iterator()) == 1);
    {
        auto next_run = open_cache(folder);
        REQUIRE(next_run->load("kind", "key A") == payload);
        CHECK(next_run->counts().hits == 1);
        fs::remove(entry);
        CHECK(next_run->load("kind", "key A") == payload); // kept from the first read
        write_bytes(entry, good);
    }

    auto refused = [&](const std::string& bytes, const char* what) {
        INFO(what);
        write_bytes(entry, bytes);
        auto run = open_cache(folder);
        CHECK_FALSE(run->load("kind", "key A"));
        CHECK(run->counts().rejected == 1);
        run->store("kind", "key A", payload); // what the caller does after computing
        CHECK(open_cache(folder)->load("kind", "key A") == payload);
    };
    for (const std::size_t at : {std::size_t{0}, std::size_t{9}, std::size_t{20},
                                 good.size() - payload.size() - 1, good.size() - 1}) {
        std::string flipped = good;
        flipped[at] = static_cast<char>(flipped[at] ^ 0x10);
        refused(flipped, "a flipped byte");
    }
    refused(good.substr(0, good.size() - 1), "truncated by a byte");
    refused(good.substr(0, 12), "truncated in the header");
    refused("", "empty");
    refused(good + "extra", "longer than its size");
    // Another key's entry under this key's name (a foreign entry).
    cache->store("kind", "key B", payload);
    refused(read_bytes(cache->entry_path("kind", "key B")), "another key");

    // Another build reads none of this build's entries and replaces them.
    auto other = open_cache(folder, "build-2");
    CHECK_FALSE(other->load("kind", "key A"));
    CHECK(other->counts().rejected == 1);
    other->store("kind", "key A", "new");
    CHECK(open_cache(folder, "build-2")->load("kind", "key A") == "new");
    CHECK_FALSE(open_cache(folder, "build-1")->load("kind", "key A"));
}

TEST_CASE("cache: a folder that cannot be written means no cache", "[cache][disk]") {
    // By construction: a folder below a regular file cannot be made (whoever runs the test),
    // and a relative path is refused as the XDG specification asks.
    const ScratchFolder scratch("unwritable");
    fs::create_directories(scratch.path);
    write_bytes(scratch.path / "file", "x");
    std::string why;
    CHECK_FALSE(planner::DiskCache::open(scratch.path / "file" / "crewdose", "b", &why));
    CHECK(why.find("cannot be created") != std::string::npos);
    CHECK_FALSE(planner::DiskCache::open("relative/crewdose", "b", &why));
    CHECK_FALSE(planner::DiskCache::open(scratch.path / "crewdose", "", &why));
}

TEST_CASE("cache: a study with a cache is bit for bit the study without", "[cache][study]") {
    // By construction: tests/fixtures/scenarios/phantom-mixed.toml (a phantom and a quick
    // location, deep space) computed without a cache, with an empty one, with the entries it
    // wrote, and with every entry damaged gives the same GCR rates and depths, bit for bit.
    const std::string text = read_fixture("phantom-mixed.toml");
    const ScratchFolder scratch("study");
    auto cache = open_cache(scratch.path / "crewdose");
    auto same_study = [](const planner::Study& a, const planner::Study& b) {
        const double phi = a.scenario().mission.gcr_phi_MV;
        bool same = true;
        for (const char* loc : {"cabin", "other"}) {
            same = same && same_bits(a.body(loc), b.body(loc));
            for (const auto& organ : a.body(loc).organs) {
                const auto x = a.gcr_daily_dose(loc, organ, phi);
                const auto y = b.gcr_daily_dose(loc, organ, phi);
                same = same && same_bits(x.with_removal, y.with_removal) &&
                       same_bits(x.without_removal, y.without_removal);
            }
        }
        return same;
    };
    // One DiskCache per study, as one per run.
    const planner::Study fresh(planner::parse_scenario(text, "mixed.toml"));
    const planner::Study cold(planner::parse_scenario(text, "mixed.toml"), {}, {}, cache.get());
    CHECK(same_study(cold, fresh));
    const auto after_cold = cache->counts();
    CHECK(after_cold.stored > 0); // (a second thread may already read what the first stored)
    CHECK(after_cold.failed == 0);

    cache = open_cache(scratch.path / "crewdose");
    const planner::Study warm(planner::parse_scenario(text, "mixed.toml"), {}, {}, cache.get());
    CHECK(same_study(warm, fresh));
    const auto after_warm = cache->counts();
    CHECK(after_warm.hits > 0);
    CHECK(after_warm.stored == 0); // nothing computed again
    CHECK(after_warm.misses == 0);
    CHECK(after_warm.rejected == 0);

    // Flip one byte in the middle of every entry.
    std::size_t entries = 0;
    for (const auto& f : fs::directory_iterator(scratch.path / "crewdose")) {
        std::string bytes = read_bytes(f.path());
        bytes[bytes.size() / 2] = static_cast<char>(bytes[bytes.size() / 2] ^ 0x01);
        write_bytes(f.path(), bytes);
        ++entries;
    }
    REQUIRE(entries > 0);
    cache = open_cache(scratch.path / "crewdose");
    const planner::Study damaged(planner::parse_scenario(text, "mixed.toml"), {}, {}, cache.get());
    CHECK(same_study(damaged, fresh));
    const auto after_damage = cache->counts();
    CHECK(after_damage.rejected >= entries); // (two threads may both read one before it is rebuilt)
    CHECK(after_damage.stored >= entries);   // rebuilt and overwritten
    cache = open_cache(scratch.path / "crewdose");
    const planner::Study repaired(planner::parse_scenario(text, "mixed.toml"), {}, {}, cache.get());
    CHECK(same_study(repaired, fresh));
    CHECK(cache->counts().rejected == 0);
    CHECK(cache->counts().stored == 0);
}
