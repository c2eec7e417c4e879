#include "fragment_transport.hpp"

#include "byte_codec.hpp"
#include "element.hpp"
#include "fragmentation.hpp"
#include "material_library.hpp"
#include "np_elastic.hpp"
#include "nuclear.hpp"
#include "nucleon_production.hpp"
#include "quality_factor.hpp"
#include "units.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <mutex>
#include <set>
#include <stdexcept>

#if defined(__SSE2__)
#include <emmintrin.h>
#endif

namespace crewdose::exposure {

namespace {

const Particle& species(std::size_t j) {
    return field_species(j);
}

// The march species of a light particle of nucleon_production.hpp.
std::size_t species_of(LightParticle p) {
    switch (p) {
    case LightParticle::neutron:
        return kNeutronSpecies;
    case LightParticle::proton:
        return 0;
    case LightParticle::deuteron:
        return kDeuteronSpecies;
    case LightParticle::triton:
        return kTritonSpecies;
    case LightParticle::helion:
        return kHelionSpecies;
    case LightParticle::alpha:
        return 1;
    }
    throw std::logic_error("species_of: unknown light particle");
}

// sum of a[k] b[k] for k in [from, to): four accumulators, so that the sums of the light
// group's dense products pipeline (the order of additions is fixed: results do not depend on
// the machine). With SSE2 the accumulators are two pairs of lanes doing the same operations
// in the same order (no fused multiply-add), so the sum is bit for bit the scalar one.
double dot(const double* a, const double* b, std::size_t from, std::size_t to) {
    std::size_t k = from;
#if defined(__SSE2__)
    __m128d s01 = _mm_setzero_pd();
    __m128d s23 = _mm_setzero_pd();
    for (; k + 4 <= to; k += 4) {
        s01 = _mm_add_pd(s01, _mm_mul_pd(_mm_loadu_pd(a + k), _mm_loadu_pd(b + k)));
        s23 = _mm_add_pd(s23, _mm_mul_pd(_mm_loadu_pd(a + k + 2), _mm_loadu_pd(b + k + 2)));
    }
    alignas(16) double lanes[4];
    _mm_store_pd(lanes, s01);
    _mm_store_pd(lanes + 2, s23);
    double s0 = lanes[0];
    const double s1 = lanes[1];
    const double s2 = lanes[2];
    const double s3 = lanes[3];
#else
    double s0 = 0.0;
    double s1 = 0.0;
    double s2 = 0.0;
    double s3 = 0.0;
    for (; k + 4 <= to; k += 4) {
        s0 += a[k] * b[k];
        s1 += a[k + 1] * b[k + 1];
        s2 += a[k + 2] * b[k + 2];
        s3 += a[k + 3] * b[k + 3];
    }
#endif
    for (; k < to; ++k) {
        s0 += a[k] * b[k];
    }
    return (s0 + s1) + (s2 + s3);
}

// s[m] = sum over k < count of a[k][m] b[k][m], the terms added in the order of k from 0.0
// (the same operations as accumulating each product into s in turn), four nodes at a time.
void sum_of_products(const double* const* a, const double* const* b, std::size_t count,
                     std::size_t n, double* s) {
    std::size_t m = 0;
#if defined(__SSE2__)
    for (; m + 4 <= n; m += 4) {
        __m128d s01 = _mm_setzero_pd();
        __m128d s23 = _mm_setzero_pd();
        for (std::size_t k = 0; k < count; ++k) {
            const double* x = a[k] + m;
            const double* y = b[k] + m;
            s01 = _mm_add_pd(s01, _mm_mul_pd(_mm_loadu_pd(x), _mm_loadu_pd(y)));
            s23 = _mm_add_pd(s23, _mm_mul_pd(_mm_loadu_pd(x + 2), _mm_loadu_pd(y + 2)));
        }
        _mm_storeu_pd(s + m, s01);
        _mm_storeu_pd(s + m + 2, s23);
    }
#endif
    for (; m < n; ++m) {
        double v = 0.0;
        for (std::size_t k = 0; k < count; ++k) {
            v += a[k][m] * b[k][m];
        }
        s[m] = v;
    }
}

// Hydrogen atoms per gram of `material` times 1e-27 (cm2 per mb): times a cross section in mb,
// reactions per g/cm2.
double hydrogen_per_g_mb(const Material& material) {
    double per_g = 0.0;
    for (const auto& share : material.composition()) {
        if (share.Z == 1) {
            per_g += share.mass_fraction * kAvogadro_per_mol / element_by_Z(1)->atomic_mass_g_mol *
                     1e-27;
        }
    }
    return per_g;
}

// The light group, marched together with a predictor-corrector step: protons, alphas,
// neutrons, deuterons, tritons, helions.
constexpr std::array<std::size_t, 6> kLightGroup{
    0, 1, kNeutronSpecies, kDeuteronSpecies, kTritonSpecies, kHelionSpecies};

// Above the top node the field is taken as a power law psi ~ E^-1.7 (the GCR spectral index
// 2.7 of phi), for the few top nodes whose characteristic starts beyond it.
constexpr double kTopPsiIndex = -1.7;

} // namespace

struct FragmentTransport::StepMap {
    // Per species j and node m: the field at depth x + h, node m, is sum_k w[j][4m + k] times
    // the field at depth x, node base[j][m] + k (interpolation along the characteristic times
    // the Jacobian, the psi = E phi conversion and the survival).
    std::array<std::vector<std::size_t>, kFieldSpecies> base;
    std::array<std::vector<double>, kFieldSpecies> w;
    // With secondaries, for the light group: what a source constant over the step leaves at
    // x + h, integral over u from 0 to h of T(u) s, exact along the characteristics for a
    // source linear in ln E between nodes (see source_integral()). Row m holds columns m ..
    // upto[j][m], stored from u[j][start[j][m]] on.
    std::array<std::vector<double>, kFieldSpecies> u;
    std::array<std::vector<std::size_t>, kFieldSpecies> upto;
    std::array<std::vector<std::size_t>, kFieldSpecies> start;
};

struct FragmentTransport::MaterialData {
    const Material* material = nullptr;
    std::array<const RangeTable*, kFieldSpecies> table{};   ///< none for the neutron
    std::array<std::vector<double>, kFieldSpecies> removal; ///< cm2/g per node
    std::array<std::vector<double>, kFieldSpecies> self;    ///< neutron removal back to itself
    /// prod[p][f][m]: production of species f per g/cm2 by species p at the same energy per
    /// nucleon (fragments, breakup nucleons); empty where p makes no f.
    std::array<std::array<std::vector<double>, kFieldSpecies>, kFieldSpecies> prod;
    /// producers[f]: the species p whose production of f is not zero everywhere, ascending.
    std::array<std::vector<std::size_t>, kFieldSpecies> producers;
    std::array<std::vector<double>, kFieldSpecies> neutrons; ///< neutrons made per g/cm2 per node
    /// With secondaries: spread[q][l], q = 0 the proton, 1 the neutron, l a light particle:
    /// an n x n matrix (row: the product's node, column: the projectile's), per g/cm2, with
    /// the incident ln E quadrature weight folded in, so that the source of l is spread x psi.
    std::array<std::array<std::vector<double>, kLightParticles>, 2> spread;
    /// Per spread matrix and row: its non-zero columns, [from, to) (from == to: none).
    std::array<std::array<std::vector<std::size_t>, kLightParticles>, 2> spread_from;
    std::array<std::array<std::vector<std::size_t>, kLightParticles>, 2> spread_to;
    /// With secondaries: per projectile nucleon q and node, the energy deposited where the
    /// reaction happens per unit fluence and per g/cm2, MeV cm2/g; its Q-weighted form; and
    /// the part of it carried by nuclei (Z >= 2), which dose_by_species() weighs with the heavy-
    /// ion RBE (the rest with the proton's).
    std::array<std::vector<double>, 2> local_MeV;
    std::array<std::vector<double>, 2> local_Q_MeV;
    std::array<std::vector<double>, 2> local_heavy_MeV;
    std::map<double, StepMap> maps;     ///< by step length, reused ones
    std::map<double, std::size_t> uses; ///< per kept map, how often it was asked for
    std::set<double> seen;              ///< step lengths asked for once
    std::map<std::string, std::array<std::vector<DoseQuantities>, kFieldSpecies>> doses;
};

FragmentTransport::FragmentTransport(TableLibrary& tables, MarchOptions options,
                                     const DataCache* cache)
    : tables_(tables), options_(options), cache_(cache), scratch_(std::make_unique<StepMap>()) {
    if (!(options_.max_step_g_cm2 > 0.0)) {
        throw std::invalid_argument("FragmentTransport: max_step_g_cm2 must be > 0");
    }
    if (particles().size() < kIonSpecies) {
        throw std::logic_error("FragmentTransport: particle list shorter than Z = 28");
    }
    if (!(options_.local_below_MeV_per_n > 0.0)) {
        throw std::invalid_argument("FragmentTransport: local_below_MeV_per_n must be > 0");
    }
    for (std::size_t j = 0; j < kIonSpecies; ++j) {
        if (species(j).Z != static_cast<int>(j + 1)) {
            throw std::logic_error("FragmentTransport: particles() not ordered by Z");
        }
    }
    // The nodes are the tables' own (every table of the library shares one grid).
    const Material* water = find_builtin_material("water");
    if (!water) {
        throw std::logic_error("FragmentTransport: no built-in water");
    }
    const LogGrid& tg = tables_.table(*water, proton()).grid();
    while (first_node_ + 4 < tg.size() &&
           std::exp(tg.log_node(first_node_)) < options_.min_energy_MeV_per_n * (1 - 1e-9)) {
        ++first_node_;
    }
    for (std::size_t i = first_node_; i < tg.size(); ++i) {
        energies_.push_back(std::exp(tg.log_node(i)));
    }
}

FragmentTransport::~FragmentTransport() = default;
FragmentTransport::FragmentTransport(FragmentTransport&&) noexcept = default;

IonField FragmentTransport::empty_field() const {
    IonField f;
    f.psi.assign(kFieldSpecies, std::vector<double>(energies_.size(), 0.0));
    f.charge_lost.assign(energies_.size(), 0.0);
    f.neutrons.assign(energies_.size(), 0.0);
    return f;
}

std::size_t FragmentTransport::active_species() const noexcept {
    return secondaries() ? kFieldSpecies : kIonSpecies;
}

bool FragmentTransport::secondaries() const noexcept {
    return options_.secondaries && options_.fragmentation && options_.removal;
}

namespace {

// What a material's march data depend on, exactly (hexadecimal floating point): the
// composition, the options that shape them and the energy grid.
std::string material_data_key(const Material& material, const MarchOptions& o,
                              const EnergyGridSpec& grid, const std::vector<double>& energies) {
    std::string key;
    char buf[64];
    auto add = [&](double x) {
        std::snprintf(buf, sizeof buf, "%a|", x);
        key += buf;
    };
    for (const auto& share : material.composition()) {
        add(share.Z);
        add(share.mass_fraction);
    }
    key += o.removal ? "R" : "r";
    key += o.fragmentation ? "F" : "f";
    key += o.secondaries ? "S" : "s";
    add(o.local_below_MeV_per_n);
    add(grid.min_MeV_per_n);
    add(grid.max_MeV_per_n);
    add(static_cast<double>(grid.nodes_per_decade));
    for (const double e : energies) {
        add(e);
    }
    return key;
}

// The march data of every material met in the process, shared by the threads' marches: each
// is computed once (by the first march that needs it) and copied (a copy costs far less than
// the cross sections and production spectra it holds).
template <class Data> class SharedMaterialData {
  public:
    template <class Compute>
    std::unique_ptr<Data> copy_of(const std::string& key, const Compute& compute) {
        std::shared_ptr<Entry> entry;
        {
            const std::lock_guard<std::mutex> lock(mutex_);
            auto it = entries_.find(key);
            if (it != entries_.end()) {
                entry = it->second;
            } else if (entries_.size() < kMaxEntries) {
                entry = entries_.emplace(key, std::make_shared<Entry>()).first->second;
            }
        }
        if (!entry) {
            return compute(); // many materials: the rest are computed by each march
        }
        std::call_once(entry->once, [&] { entry->data = compute(); });
        return std::make_unique<Data>(*entry->data);
    }

  private:
    static constexpr std::size_t kMaxEntries = 256;
    struct Entry {
        std::once_flag once;
        std::unique_ptr<const Data> data;
    };
    std::mutex mutex_;
    std::map<std::string, std::shared_ptr<Entry>> entries_;
};

} // namespace

const FragmentTransport::MaterialData& FragmentTransport::data(const Material& material) {
    auto it = materials_.find(material.id());
    if (it != materials_.end()) {
        return *it->second;
    }
    static SharedMaterialData<MaterialData> shared;
    const std::string key = material_data_key(material, options_, tables_.grid(), energies_);
    // The cache first, then the process's share: each march that has a cache reads it (a
    // decoded entry is exactly the computed data, so which one a march holds does not matter).
    std::unique_ptr<MaterialData> md;
    if (cache_) {
        if (const auto payload = cache_->load(kCacheKind, key)) {
            md = decode_data(*payload);
        }
    }
    if (!md) {
        md = shared.copy_of(key, [&] { return compute_data(material); });
        if (cache_) {
            cache_->store(kCacheKind, key, encode_data(*md));
        }
    }
    md->material = &material;
    for (std::size_t j = 0; j < active_species(); ++j) {
        md->table[j] = j == kNeutronSpecies ? nullptr : &tables_.table(material, species(j));
    }
    // The implicit neutron-removal term divides by 1 - h/2 self: keep it well away from zero
    // (at the default 4 g/cm2 step h/2 self is at most 0.18, in liquid hydrogen).
    double self_max = 0.0;
    for (const auto& v : md->self) {
        for (const double x : v) {
            self_max = std::max(self_max, x);
        }
    }
    if (0.5 * options_.max_step_g_cm2 * self_max >= 0.5) {
        throw std::invalid_argument(
            "FragmentTransport: max_step_g_cm2 = " + std::to_string(options_.max_step_g_cm2) +
            " is too long for " + material.id() + " (at most " + std::to_string(1.0 / self_max) +
            ")");
    }
    return *materials_.emplace(material.id(), std::move(md)).first->second;
}

std::string FragmentTransport::encoded_data(const Material& material) {
    return encode_data(data(material));
}

// The layout (kFormat): the species count, the node count, then per species removal, self,
// neutrons, producers and the production of every species; per projectile nucleon the local
// deposits and per light particle the spread matrix and its row bounds. Fields the march
// fills later (range tables, step maps, dose tables) are not data of the material.
std::string FragmentTransport::encode_data(const MaterialData& md) const {
    ByteWriter w;
    w.u64(kFieldSpecies);
    w.u64(energies_.size());
    for (std::size_t j = 0; j < kFieldSpecies; ++j) {
        w.f64s(md.removal[j]);
        w.f64s(md.self[j]);
        w.f64s(md.neutrons[j]);
        w.u64s(md.producers[j]);
        for (std::size_t f = 0; f < kFieldSpecies; ++f) {
            w.f64s(md.prod[j][f]);
        }
    }
    for (std::size_t q = 0; q < 2; ++q) {
        w.f64s(md.local_MeV[q]);
        w.f64s(md.local_Q_MeV[q]);
        w.f64s(md.local_heavy_MeV[q]);
        for (std::size_t l = 0; l < kLightParticles; ++l) {
            w.f64s(md.spread[q][l]);
            w.u64s(md.spread_from[q][l]);
            w.u64s(md.spread_to[q][l]);
        }
    }
    return w.take();
}

std::unique_ptr<FragmentTransport::MaterialData>
FragmentTransport::decode_data(std::string_view payload) const {
    const std::size_t n = energies_.size();
    auto md = std::make_unique<MaterialData>();
    // Every size is checked against what the march indexes without checks: a vector is empty
    // or has one value per node (n x n for a spread matrix), row bounds lie within the row.
    auto sized = [](std::vector<double> v, std::size_t size) {
        if (!v.empty() && v.size() != size) {
            throw CodecError("array of the wrong size");
        }
        return v;
    };
    try {
        ByteReader r(payload);
        if (r.u64() != kFieldSpecies || r.u64() != n) {
            return nullptr;
        }
        for (std::size_t j = 0; j < kFieldSpecies; ++j) {
            md->removal[j] = sized(r.f64s(), n);
            md->self[j] = sized(r.f64s(), n);
            md->neutrons[j] = sized(r.f64s(), n);
            md->producers[j] = r.u64s();
            for (const std::size_t p : md->producers[j]) {
                if (p >= kFieldSpecies) {
                    throw CodecError("producer out of range");
                }
            }
            for (std::size_t f = 0; f < kFieldSpecies; ++f) {
                md->prod[j][f] = sized(r.f64s(), n);
            }
        }
        for (std::size_t j = 0; j < active_species(); ++j) {
            if (md->removal[j].size() != n || md->self[j].size() != n ||
                md->neutrons[j].size() != n) {
                throw CodecError("a species of the march without its data");
            }
            for (const std::size_t p : md->producers[j]) {
                if (md->prod[p][j].size() != n) {
                    throw CodecError("a producer without its production");
                }
            }
        }
        for (std::size_t q = 0; q < 2; ++q) {
            md->local_MeV[q] = sized(r.f64s(), n);
            md->local_Q_MeV[q] = sized(r.f64s(), n);
            md->local_heavy_MeV[q] = sized(r.f64s(), n);
            for (std::size_t l = 0; l < kLightParticles; ++l) {
                md->spread[q][l] = sized(r.f64s(), n * n);
                md->spread_from[q][l] = r.u64s();
                md->spread_to[q][l] = r.u64s();
                const auto& from = md->spread_from[q][l];
                const auto& to = md->spread_to[q][l];
                if (!from.empty() || !to.empty()) {
                    if (from.size() != n || to.size() != n || md->spread[q][l].size() != n * n) {
                        throw CodecError("spread bounds of the wrong size");
                    }
                    for (std::size_t row = 0; row < n; ++row) {
                        if (from[row] > to[row] || to[row] > n) {
                            throw CodecError("spread bounds out of the row");
                        }
                    }
                }
            }
            if (secondaries() && (md->local_MeV[q].size() != n || md->local_Q_MeV[q].size() != n ||
                                  md->local_heavy_MeV[q].size() != n)) {
                throw CodecError("secondaries without their local deposits");
            }
        }
        if (secondaries()) {
            for (std::size_t q = 0; q < 2; ++q) {
                for (std::size_t l = 0; l < kLightParticles; ++l) {
                    if (md->spread[q][l].size() != n * n || md->spread_from[q][l].size() != n) {
                        throw CodecError("secondaries without their spread matrices");
                    }
                }
            }
        }
        r.finish();
    } catch (const CodecError&) {
        return nullptr;
    }
    return md;
}

std::unique_ptr<FragmentTransport::MaterialData>
FragmentTransport::compute_data(const Material& material) const {
    auto md = std::make_unique<MaterialData>();
    md->material = &material;
    const std::size_t n = energies_.size();
    for (std::size_t j = 0; j < active_species(); ++j) {
        md->removal[j].resize(n);
        md->self[j].assign(n, 0.0);
        md->neutrons[j].assign(n, 0.0);
        for (std::size_t m = 0; m < n; ++m) {
            md->removal[j][m] = removal_cm2_g(material, species(j), energies_[m]);
        }
    }
    if (!options_.removal) {
        for (auto& r : md->removal) {
            std::fill(r.begin(), r.end(), 0.0);
        }
    }
    if (secondaries()) {
        // Elastic scattering on hydrogen takes a neutron out of its energy cell too; what it
        // makes (the recoil proton, the slower neutron) is in build_nucleon_production().
        const double per_g = hydrogen_per_g_mb(material);
        for (std::size_t m = 0; m < n && per_g > 0.0; ++m) {
            md->removal[kNeutronSpecies][m] += per_g * np_elastic_cross_section_mb(energies_[m]);
        }
    }
    auto production = [&](std::size_t p, std::size_t f) -> std::vector<double>& {
        auto& v = md->prod[p][f];
        if (v.empty()) {
            v.assign(n, 0.0);
        }
        return v;
    };
    if (options_.fragmentation && options_.removal) {
        // Channels are energy-independent: once per (projectile, element); the removal cross
        // section of that element carries the energy dependence.
        for (const auto& share : material.composition()) {
            const auto element = element_by_Z(share.Z);
            if (!element) {
                throw std::logic_error("FragmentTransport: unknown element in " + material.id());
            }
            const double At = element->atomic_mass_g_mol;
            const double per_g = share.mass_fraction * kAvogadro_per_mol / At * 1e-27;
            for (std::size_t j = 1; j < kIonSpecies; ++j) {
                const Particle& p = species(j);
                const ReactionChannels ch = reaction_channels(p.Z, p.A, At);
                for (std::size_t m = 0; m < n; ++m) {
                    const double removal = per_g * nucleus_reaction_cross_section_mb(
                                                       p.Z, p.A, share.Z, At, energies_[m]);
                    for (const auto& c : ch.remnants) {
                        const auto f = static_cast<std::size_t>(c.Z - 1);
                        if (f == j) {
                            md->self[j][m] += removal * c.fraction;
                        } else {
                            production(j, f)[m] += removal * c.fraction;
                        }
                    }
                    production(j, 0)[m] += removal * ch.protons_per_reaction;
                    md->neutrons[j][m] += removal * ch.neutrons_per_reaction;
                    if (secondaries()) {
                        production(j, kNeutronSpecies)[m] += removal * ch.neutrons_per_reaction;
                    }
                }
            }
            if (!secondaries()) {
                continue;
            }
            // Deuterons, tritons and helions break up into their nucleons at their velocity
            // (reaction_channels: Zp <= 2 has breakup only).
            for (const std::size_t j : {kDeuteronSpecies, kTritonSpecies, kHelionSpecies}) {
                const Particle& p = species(j);
                const ReactionChannels ch = reaction_channels(p.Z, p.A, At);
                for (std::size_t m = 0; m < n; ++m) {
                    const double removal = per_g * nucleus_reaction_cross_section_mb(
                                                       p.Z, p.A, share.Z, At, energies_[m]);
                    production(j, 0)[m] += removal * ch.protons_per_reaction;
                    production(j, kNeutronSpecies)[m] += removal * ch.neutrons_per_reaction;
                }
            }
        }
    }
    for (std::size_t f = 0; f < active_species(); ++f) {
        for (std::size_t p = 0; p < active_species(); ++p) {
            const auto& v = md->prod[p][f];
            if (p != f && std::any_of(v.begin(), v.end(), [](double x) { return x != 0.0; })) {
                md->producers[f].push_back(p);
            }
        }
    }
    if (secondaries()) {
        build_nucleon_production(*md);
        index_spread(*md);
    }
    return md;
}

void FragmentTransport::build_nucleon_production(MaterialData& md) const {
    const std::size_t n = energies_.size();
    const double step = n > 1 ? std::log(energies_[1] / energies_[0]) : 1.0;
    const auto edges = yield_edges_MeV();
    // Cell m of the march: ln E within half a step of node m.
    const double log_first = std::log(energies_.front());
    const double half_cell_down = std::exp(-0.5 * step);
    const double half_cell_up = std::exp(0.5 * step);
    // track_quality() of the (species, energy) pairs met: the yield edges give a few dozen,
    // met again at every node and element (each costs 32 exponentials).
    std::map<std::pair<std::size_t, double>, double> quality;
    auto quality_of = [&](std::size_t f, double E) {
        auto it = quality.find({f, E});
        if (it == quality.end()) {
            it = quality.emplace(std::make_pair(f, E), track_quality(f, E)).first;
        }
        return it->second;
    };
    for (std::size_t q = 0; q < 2; ++q) {
        for (auto& m : md.spread[q]) {
            m.assign(n * n, 0.0);
        }
        md.local_MeV[q].assign(n, 0.0);
        md.local_Q_MeV[q].assign(n, 0.0);
        md.local_heavy_MeV[q].assign(n, 0.0);
    }
    // Particles of light species l made by projectile nucleon q (0 proton, 1 neutron) at node
    // m, `rate` reactions per g/cm2 each making `all` of them (`fwd` forward) with energies per
    // nucleon uniform in [lo, hi]: charged ones below local_below_MeV_per_n deposit their
    // energy where they are made; faster forward ones are spread over the march's cells.
    auto emit = [&](std::size_t q, std::size_t m, std::size_t l, double lo, double hi, double fwd,
                    double all, double rate) {
        const std::size_t n_cells = n;
        const double w_in = (m == 0 || m + 1 == n_cells ? 0.5 : 1.0) * step;
        const auto lp = static_cast<LightParticle>(l);
        const double A_l = light_particle_A(lp);
        const bool charged = light_particle_Z(lp) > 0;
        const std::size_t f = species_of(lp);
        auto& mat = md.spread[q][l];
        const double mid = 0.5 * (lo + hi);
        if (charged && mid < options_.local_below_MeV_per_n) {
            // Deposited where it is made, both hemispheres (kerma).
            const double e = all * mid * A_l;
            md.local_MeV[q][m] += rate * e;
            md.local_Q_MeV[q][m] += rate * e * quality_of(f, mid);
            if (light_particle_Z(lp) > 1) {
                md.local_heavy_MeV[q][m] += rate * e;
            }
            return;
        }
        if (!(fwd > 0.0) || hi <= energies_.front() * half_cell_down) {
            return; // backward: leaves; neutrons below the lowest cell: lost
        }
        // Spread the forward particles (uniform in energy) over the cells [lo, hi] overlaps;
        // psi at node k = particles in cell k / step.
        const double log_lo = std::log(std::max(lo, 1e-300));
        const double log_hi = std::log(hi);
        auto k0 = static_cast<std::ptrdiff_t>(std::floor((log_lo - log_first) / step + 0.5));
        auto k1 = static_cast<std::ptrdiff_t>(std::floor((log_hi - log_first) / step + 0.5));
        k0 = std::max<std::ptrdiff_t>(k0, 0);
        k1 = std::min<std::ptrdiff_t>(k1, static_cast<std::ptrdiff_t>(n_cells) - 1);
        for (std::ptrdiff_t k = k0; k <= k1; ++k) {
            const auto ku = static_cast<std::size_t>(k);
            const double c_lo = energies_[ku] * half_cell_down;
            const double c_hi = energies_[ku] * half_cell_up;
            const double overlap = std::min(hi, c_hi) - std::max(lo, c_lo);
            if (overlap > 0.0) {
                mat[ku * n_cells + m] += rate * fwd * overlap / (hi - lo) / step * w_in;
            }
        }
    };
    for (const auto& share : md.material->composition()) {
        const auto element = element_by_Z(share.Z);
        const double A = element->atomic_mass_g_mol;
        const double per_g = share.mass_fraction * kAvogadro_per_mol / A * 1e-27;
        const double q_recoil = recoil_quality(share.Z);
        for (std::size_t q = 0; q < 2; ++q) {
            for (std::size_t m = 0; m < n; ++m) {
                const double E = energies_[m];
                const double rate = per_g * proton_reaction_cross_section_mb(share.Z, A, E);
                if (!(rate > 0.0)) {
                    continue;
                }
                const ReactionYield y = nucleon_reaction_yield(share.Z, q == 1, E);
                md.local_MeV[q][m] += rate * y.recoil_MeV;
                md.local_Q_MeV[q][m] += rate * y.recoil_MeV * q_recoil;
                md.local_heavy_MeV[q][m] += rate * y.recoil_MeV;
                for (std::size_t l = 0; l < kLightParticles; ++l) {
                    for (std::size_t i = 0; i + 1 < edges.size(); ++i) {
                        const double all = y.forward[l][i] + y.backward[l][i];
                        if (!(all > 0.0)) {
                            continue;
                        }
                        const double A_l = light_particle_A(static_cast<LightParticle>(l));
                        emit(q, m, l, edges[i] / A_l, edges[i + 1] / A_l, y.forward[l][i], all,
                             rate);
                    }
                }
            }
        }
    }
    // Elastic scattering of neutrons on hydrogen (np_elastic.hpp): per scattering one recoil
    // proton and one neutron, each uniform in kinetic energy from 0 to E (their energies add
    // up to E), both forward.
    const double per_g_H = hydrogen_per_g_mb(*md.material);
    if (!(per_g_H > 0.0)) {
        return;
    }
    for (std::size_t m = 0; m < n; ++m) {
        const double E = energies_[m];
        const double rate = per_g_H * np_elastic_cross_section_mb(E);
        if (!(rate > 0.0)) {
            continue;
        }
        for (std::size_t i = 0; i + 1 < edges.size() && edges[i] < E; ++i) {
            const double lo = edges[i];
            const double hi = std::min(edges[i + 1], E);
            const double share = (hi - lo) / E;
            for (const LightParticle lp : {LightParticle::proton, LightParticle::neutron}) {
                emit(1, m, static_cast<std::size_t>(lp), lo, hi, share, share, rate);
            }
        }
    }
}

void FragmentTransport::index_spread(MaterialData& md) const {
    const std::size_t n = energies_.size();
    for (std::size_t q = 0; q < 2; ++q) {
        for (std::size_t l = 0; l < kLightParticles; ++l) {
            const auto& mat = md.spread[q][l];
            auto& from = md.spread_from[q][l];
            auto& to = md.spread_to[q][l];
            from.assign(n, 0);
            to.assign(n, 0);
            for (std::size_t r = 0; r < n; ++r) {
                std::size_t a = n;
                std::size_t b = 0;
                for (std::size_t m = 0; m < n; ++m) {
                    if (mat[r * n + m] != 0.0) {
                        a = std::min(a, m);
                        b = m + 1;
                    }
                }
                from[r] = a < b ? a : 0;
                to[r] = a < b ? b : 0;
            }
        }
    }
}

double FragmentTransport::recoil_quality(int Z) const {
    // The residual nucleus of a reaction on element Z, taken as that element's (most abundant
    // isotope; Ni for the heavier targets) ion: its LET over the slowing down from a typical
    // recoil energy of 0.1 MeV per nucleon (evaporation residues recoil with a few MeV).
    if (Z < 2) {
        return 1.0;
    }
    const std::size_t j = static_cast<std::size_t>(std::min(Z, kMaxZ) - 1);
    return track_quality(j, 0.1);
}

double FragmentTransport::track_quality(std::size_t j, double E0_MeV_per_n) const {
    // The dose-weighted mean Q(L) of a particle of species j that stops in water from energy per
    // nucleon E0: (1 / E0) integral of Q(L(E)) dE, 32 steps in ln E from the tables' lowest
    // energy (below it, Q at that energy).
    const Material* water = find_builtin_material("water");
    const RangeTable& t = tables_.table(*water, species(j));
    const double E_min = t.grid().front();
    auto Q = [&](double E) {
        return quality_factor_icrp60(0.1 * t.stopping_MeV_cm2_g(std::max(E, E_min)));
    };
    if (E0_MeV_per_n <= E_min) {
        return Q(E_min);
    }
    const int steps = 32;
    const double h = std::log(E0_MeV_per_n / E_min) / steps;
    double sum = Q(E_min) * E_min; // the part below the grid
    for (int k = 0; k < steps; ++k) {
        const double a = E_min * std::exp(h * k);
        const double b = E_min * std::exp(h * (k + 1));
        sum += Q(std::sqrt(a * b)) * (b - a);
    }
    return sum / E0_MeV_per_n;
}

FragmentTransport::StepMap FragmentTransport::step_map(const MaterialData& md, double h) const {
    StepMap map;
    const std::size_t n = energies_.size();
    const double log_first = std::log(energies_.front());
    const double step = n > 1 ? std::log(energies_[1]) - log_first : 1.0;
    auto lagrange = [](double t, double* w) {
        w[0] = -(t - 1.0) * (t - 2.0) * (t - 3.0) / 6.0;
        w[1] = t * (t - 2.0) * (t - 3.0) / 2.0;
        w[2] = -t * (t - 1.0) * (t - 3.0) / 2.0;
        w[3] = t * (t - 1.0) * (t - 2.0) / 6.0;
    };
    for (std::size_t j = 0; j < active_species(); ++j) {
        map.base[j].resize(n);
        map.w[j].assign(4 * n, 0.0);
        if (j == kNeutronSpecies) {
            // Neutrons do not slow down here: each node only attenuates (Lagrange weights at
            // an integer position are exact: 1 at the node itself).
            for (std::size_t m = 0; m < n; ++m) {
                const double b =
                    std::clamp(static_cast<double>(m) - 1.0, 0.0, static_cast<double>(n - 4));
                map.base[j][m] = static_cast<std::size_t>(b);
                map.w[j][4 * m + (m - static_cast<std::size_t>(b))] =
                    std::exp(-md.removal[j][m] * h);
            }
            continue;
        }
        const RangeTable& table = *md.table[j];
        std::size_t hint = first_node_ == 0 ? 0 : first_node_ - 1;
        for (std::size_t m = 0; m < n; ++m) {
            const std::size_t i = first_node_ + m;
            double pos = static_cast<double>(m); // position of the foot of the characteristic
            double g = 1.0;                      // Jacobian x E ratio x survival
            double beyond = 1.0;                 // power-law factor above the top node
            if (!options_.stopping) {
                g = std::exp(-md.removal[j][m] * h);
            } else {
                const double R = table.range_at_node(i);
                const double x = h / R;
                // ln(R + h): a short series when the step is a small part of the range (the
                // high-energy nodes, most of them), the library log otherwise.
                const double log_R_foot =
                    x < 1e-2 ? table.log_range_nodes()[i] +
                                   x * (1.0 - x * (0.5 - x * (1.0 / 3.0 - 0.25 * x)))
                             : std::log(R + h);
                const bool reactions = options_.removal && table.has_optical_depth();
                const double lambda_i = reactions ? table.optical_depth_nodes()[i] : 0.0;
                if (log_R_foot >= table.log_max_range()) {
                    // Beyond the tables (the top nodes, where a step changes the energy by a
                    // few parts in 1e4): the foot from the local stopping power.
                    const double E = energies_[m];
                    const double E_foot =
                        E + table.stopping_at_node(i) * h / static_cast<double>(species(j).A);
                    pos = static_cast<double>(n - 1);
                    beyond = std::pow(E_foot / energies_.back(), kTopPsiIndex);
                    g = E / E_foot * std::exp(-md.removal[j][m] * h);
                } else {
                    const RangeTable::Cursor c = table.cursor_at_log_range(log_R_foot, hint);
                    // g = (E_i / E_foot) (S_foot / S_i) exp(-(Lambda_foot - Lambda_i)), one exp.
                    const double log_g =
                        table.grid().log_node(i) - c.log_E + table.log_stopping(c) -
                        table.log_stopping_nodes()[i] -
                        (reactions ? table.optical_depth(c, R + h) - lambda_i : 0.0);
                    g = std::fabs(log_g) < 1e-2
                            ? 1.0 +
                                  log_g * (1.0 + log_g * (0.5 + log_g * (1.0 / 6.0 + log_g / 24.0)))
                            : std::exp(log_g);
                    pos = (c.log_E - log_first) / step;
                    if (pos > static_cast<double>(n - 1)) {
                        pos = static_cast<double>(n - 1);
                    }
                }
            }
            const double b = std::clamp(std::floor(pos) - 1.0, 0.0, static_cast<double>(n - 4));
            map.base[j][m] = static_cast<std::size_t>(b);
            double* w = &map.w[j][4 * m];
            lagrange(pos - b, w);
            for (int k = 0; k < 4; ++k) {
                w[k] *= g * beyond;
            }
        }
    }
    if (secondaries()) {
        for (const std::size_t j : kLightGroup) {
            source_integral(md, h, j, map);
        }
    }
    return map;
}

void FragmentTransport::source_integral(const MaterialData& md, double h, std::size_t j,
                                        StepMap& map) const {
    // A source sigma (particles per g/cm2 per unit ln E) made uniformly over the step reaches
    // x + h as psi(E) = (A E / S(E)) integral from ln E to ln E_h of sigma(E') P(E' -> E)
    // d ln E', where R(E_h) = R(E) + h (continuous slowing down) and P the survival between
    // (particle balance at energy E: the flux times the stopping power equals what is made
    // above E within reach). sigma P is taken linear in ln E between nodes. Neutrons only
    // attenuate: (1 - exp(-Sigma h)) / Sigma.
    const std::size_t n = energies_.size();
    const double step = n > 1 ? std::log(energies_[1] / energies_[0]) : 1.0;
    std::vector<double> u(n * n, 0.0); // dense while built, banded when stored
    auto& upto = map.upto[j];
    upto.assign(n, 0);
    auto store = [&] {
        auto& band = map.u[j];
        auto& start = map.start[j];
        band.clear();
        start.assign(n, 0);
        for (std::size_t m = 0; m < n; ++m) {
            start[m] = band.size();
            band.insert(band.end(), u.begin() + static_cast<std::ptrdiff_t>(m * n + m),
                        u.begin() + static_cast<std::ptrdiff_t>(m * n + upto[m] + 1));
        }
    };
    if (j == kNeutronSpecies) {
        for (std::size_t m = 0; m < n; ++m) {
            const double sigma = md.removal[j][m];
            u[m * n + m] = sigma * h > 1e-12 ? -std::expm1(-sigma * h) / sigma : h;
            upto[m] = m;
        }
        store();
        return;
    }
    const RangeTable& table = *md.table[j];
    const bool reactions = options_.removal && table.has_optical_depth();
    const double A = species(j).A;
    // Survival from node k to node k - 1.
    std::vector<double> node_survival(n, 1.0);
    if (reactions) {
        const auto& tau = table.optical_depth_nodes();
        for (std::size_t k = 1; k < n; ++k) {
            node_survival[k] = std::exp(-(tau[first_node_ + k] - tau[first_node_ + k - 1]));
        }
    }
    std::vector<double> survive;
    std::size_t hint = first_node_ == 0 ? 0 : first_node_ - 1;
    for (std::size_t m = 0; m < n; ++m) {
        const std::size_t i = first_node_ + m;
        const double R = table.range_at_node(i);
        const double log_R_h = std::log(R + h);
        // ln E_h, in node units from node m (the top node at most).
        double pos = static_cast<double>(n - 1);
        if (log_R_h < table.log_max_range()) {
            const RangeTable::Cursor c = table.cursor_at_log_range(log_R_h, hint);
            pos = std::min(pos, (c.log_E - std::log(energies_.front())) / step);
        }
        const double pre = A * energies_[m] / table.stopping_at_node(i);
        const double span = pos - static_cast<double>(m);
        if (!(span > 0.0)) {
            upto[m] = m;
            continue;
        }
        const auto last = static_cast<std::size_t>(std::floor(pos));
        // Survival from node k down to node m, built up node by node along the row (one exp
        // per node of the material, not per matrix entry).
        survive.assign(std::min(last + 2, n) - m, 1.0);
        for (std::size_t k = m + 1; k < m + survive.size(); ++k) {
            survive[k - m] = survive[k - m - 1] * (reactions ? node_survival[k] : 1.0);
        }
        auto survival = [&](std::size_t k) {
            return survive[k - m];
        };
        // Whole intervals [k, k + 1] for k from m to last - 1: trapezoid.
        for (std::size_t k = m; k < last; ++k) {
            u[m * n + k] += 0.5 * step * survival(k);
            u[m * n + k + 1] += 0.5 * step * survival(k + 1);
        }
        // The partial interval [last, pos]: sigma P linear between the nodes.
        const double t = pos - static_cast<double>(last);
        if (t > 0.0 && last + 1 < n) {
            const double len = t * step;
            u[m * n + last] += 0.5 * len * (2.0 - t) * survival(last);
            u[m * n + last + 1] += 0.5 * len * t * survival(last + 1);
            upto[m] = last + 1;
        } else {
            upto[m] = last;
        }
        for (std::size_t k = m; k <= upto[m]; ++k) {
            u[m * n + k] *= pre;
        }
    }
    store();
}

const FragmentTransport::StepMap& FragmentTransport::cached_step_map(const MaterialData& md,
                                                                     double h) {
    auto& data = const_cast<MaterialData&>(md);
    auto it = data.maps.find(h);
    if (it != data.maps.end()) {
        ++data.uses[h];
        return it->second;
    }
    // The same length again right away (the next field through the same layer).
    if (scratch_for_ == &md && scratch_h_ == h) {
        return *scratch_;
    }
    // Most layers are crossed once at their own slant thickness: a map is kept only when its
    // step comes back (the full step, tissue depths, suit layers), so memory stays with the
    // maps that are reused (about 108 kB each).
    if (data.seen.insert(h).second) {
        if (data.seen.size() > 4096) {
            data.seen.clear();
        }
        *scratch_ = step_map(md, h);
        scratch_for_ = &md;
        scratch_h_ = h;
        return *scratch_;
    }
    if (data.maps.size() >= 64) {
        // Many repeated lengths: keep the full step and the half used most (the tissue depths
        // of the body model come back with every direction; a length two directions share
        // rarely comes back a third time).
        std::vector<std::pair<std::size_t, double>> by_use;
        for (const auto& [length, map] : data.maps) {
            if (length != options_.max_step_g_cm2) {
                by_use.emplace_back(data.uses[length], length);
            }
        }
        std::sort(by_use.begin(), by_use.end());
        for (std::size_t k = 0; k < by_use.size() - by_use.size() / 2; ++k) {
            data.maps.erase(by_use[k].second);
            data.uses.erase(by_use[k].second);
        }
    }
    data.uses[h] = 1;
    return data.maps.emplace(h, step_map(md, h)).first->second;
}

void FragmentTransport::cross(IonField& field, const Material& material, double t) {
    if (!std::isfinite(t) || t < 0.0 || t > kMaxCrossing_g_cm2) {
        throw std::invalid_argument("FragmentTransport::cross: thickness of " + material.id() +
                                    " must be finite, >= 0 and at most 1e9 g/cm2");
    }
    if (t == 0.0) {
        return;
    }
    const MaterialData& md = data(material);
    const std::size_t n = energies_.size();
    const double h_max = options_.max_step_g_cm2;
    const auto full = static_cast<std::size_t>(std::floor(t / h_max * (1.0 + 1e-12)));
    const double rest = t - static_cast<double>(full) * h_max;

    const std::size_t active = active_species();
    const bool light = secondaries();
    // The fields a source is made from: each species' psi (the current field, or for the
    // light group the predicted one).
    using Fields = std::array<const std::vector<double>*, kFieldSpecies>;
    Fields current{};
    for (std::size_t j = 0; j < active; ++j) {
        current[j] = &field.psi[j];
    }
    // The source of species j per g/cm2 (self channel apart): same-velocity production by its
    // producers and, with secondaries, what nucleon reactions spread over energy (the light
    // particle of nucleon_production.hpp that is species j: light_particle_of[j], if any).
    std::array<std::size_t, kFieldSpecies> light_particle_of{};
    light_particle_of.fill(kLightParticles);
    for (std::size_t l = 0; l < kLightParticles; ++l) {
        light_particle_of[species_of(static_cast<LightParticle>(l))] = l;
    }
    std::array<const double*, kFieldSpecies> prods{};
    std::array<const double*, kFieldSpecies> psis{};
    auto sources_into = [&](std::size_t j, std::vector<double>& s, const Fields& from) {
        s.resize(n);
        const auto& producers = md.producers[j];
        for (std::size_t k = 0; k < producers.size(); ++k) {
            prods[k] = md.prod[producers[k]][j].data();
            psis[k] = from[producers[k]]->data();
        }
        sum_of_products(prods.data(), psis.data(), producers.size(), n, s.data());
        if (!light) {
            return;
        }
        const std::size_t l = light_particle_of[j];
        if (l < kLightParticles) {
            for (std::size_t q = 0; q < 2; ++q) {
                const double* mat = md.spread[q][l].data();
                const double* psi = from[q == 0 ? 0 : kNeutronSpecies]->data();
                const std::size_t* lo = md.spread_from[q][l].data();
                const std::size_t* hi = md.spread_to[q][l].data();
                for (std::size_t r = 0; r < n; ++r) {
                    s[r] += dot(mat + r * n, psi, lo[r], hi[r]);
                }
            }
        }
    };
    std::array<std::vector<double>, kFieldSpecies> source;
    for (std::size_t j = 0; j < active; ++j) {
        sources_into(j, source[j], current);
    }
    // Species whose field and source are zero at every node (a solar event's protons make no
    // nuclei): while their producers stay zero too, a step leaves them zero exactly, so it is
    // skipped (the values are those the step would compute, bit for bit).
    auto all_zero = [](const std::vector<double>& v) {
        return std::all_of(v.begin(), v.end(), [](double x) { return x == 0.0; });
    };
    std::array<bool, kFieldSpecies> zero{};
    for (std::size_t j = 0; j < active; ++j) {
        zero[j] = all_zero(field.psi[j]) && all_zero(source[j]);
    }
    auto stays_zero = [&](std::size_t j) {
        return zero[j] && std::all_of(md.producers[j].begin(), md.producers[j].end(),
                                      [&](std::size_t p) { return zero[p]; });
    };
    std::vector<double> old_total(n), moved(n), fresh;
    auto apply = [&](const StepMap& map, std::size_t j, const std::vector<double>& f,
                     std::vector<double>& out) {
        const std::size_t* base = map.base[j].data();
        const double* w = map.w[j].data();
        for (std::size_t m = 0; m < n; ++m) {
            const double* x = &f[base[m]];
            out[m] =
                w[4 * m] * x[0] + w[4 * m + 1] * x[1] + w[4 * m + 2] * x[2] + w[4 * m + 3] * x[3];
        }
    };
    auto tally_rates = [&](std::vector<double>& lost, std::vector<double>& neut) {
        for (std::size_t m = 0; m < n; ++m) {
            lost[m] = md.removal[0][m] * field.psi[0][m]; // protons' charge leaves
            double s = 0.0;
            for (std::size_t p = 1; p < kIonSpecies; ++p) {
                s += md.neutrons[p][m] * field.psi[p][m];
            }
            neut[m] = s;
        }
    };
    std::vector<double> lost_old(n), neut_old(n), lost_new(n), neut_new(n);
    std::array<std::vector<double>, kFieldSpecies> predicted;
    std::array<std::vector<double>, kFieldSpecies> transported;
    std::array<std::vector<double>, kFieldSpecies> fresh_light;
    auto substep = [&](double h) {
        const StepMap& map = cached_step_map(md, h);
        if (options_.tallies) {
            tally_rates(lost_old, neut_old);
        }
        // Nuclei heaviest first (each sees its parents' new field); without secondaries the
        // light nuclei too, the same way.
        const std::size_t lowest = light ? 2 : 0;
        for (std::size_t jj = kIonSpecies; jj-- > lowest;) {
            if (stays_zero(jj)) {
                continue;
            }
            zero[jj] = false;
            auto& psi = field.psi[jj];
            const auto& self = md.self[jj];
            // T(psi) + h/2 T(source) = T(psi + h/2 source): the old field and what it emits
            // move along the same characteristics.
            for (std::size_t m = 0; m < n; ++m) {
                old_total[m] = psi[m] + 0.5 * h * (source[jj][m] + self[m] * psi[m]);
            }
            apply(map, jj, old_total, moved);
            sources_into(jj, fresh, current); // heavier nuclei are already at x + h
            for (std::size_t m = 0; m < n; ++m) {
                const double v = (moved[m] + 0.5 * h * fresh[m]) / (1.0 - 0.5 * h * self[m]);
                psi[m] = v > 0.0 ? v : 0.0;
            }
            source[jj].swap(fresh);
        }
        if (light) {
            // The light group makes itself (p and n make p, n, d, t, He-3, alpha; these break
            // up into p and n). Each species: psi(x + h) = T psi(x) + U s, U the exact
            // integral of a source constant over the step along the characteristics (slow
            // secondaries stop within a step: a trapezoid would keep them), s the mean of the
            // sources at x and at x + h; Heun's predictor-corrector for the latter.
            Fields next = current;
            for (const std::size_t j : kLightGroup) {
                zero[j] = false;
            }
            auto integrate = [&](std::size_t j, const std::vector<double>& src,
                                 std::vector<double>& out) {
                const double* u = map.u[j].data();
                for (std::size_t r = 0; r < n; ++r) {
                    // The band of row r starts at column r.
                    out[r] += dot(u + map.start[j][r], src.data() + r, 0, map.upto[j][r] + 1 - r);
                }
            };
            for (const std::size_t j : kLightGroup) {
                transported[j].resize(n);
                apply(map, j, field.psi[j], transported[j]);
                predicted[j] = transported[j];
                integrate(j, source[j], predicted[j]);
                for (double& v : predicted[j]) {
                    v = v > 0.0 ? v : 0.0;
                }
                next[j] = &predicted[j];
            }
            for (const std::size_t j : kLightGroup) {
                sources_into(j, fresh_light[j], next);
            }
            for (const std::size_t j : kLightGroup) {
                for (std::size_t m = 0; m < n; ++m) {
                    old_total[m] = 0.5 * (source[j][m] + fresh_light[j][m]);
                }
                auto& psi = field.psi[j];
                psi = transported[j];
                integrate(j, old_total, psi);
                for (double& v : psi) {
                    v = v > 0.0 ? v : 0.0;
                }
            }
            for (const std::size_t j : kLightGroup) {
                sources_into(j, source[j], current);
            }
        }
        if (options_.tallies) {
            tally_rates(lost_new, neut_new);
            for (std::size_t m = 0; m < n; ++m) {
                field.charge_lost[m] += 0.5 * h * (lost_old[m] + lost_new[m]);
                field.neutrons[m] += 0.5 * h * (neut_old[m] + neut_new[m]);
            }
        }
    };
    if (!(options_.fragmentation && options_.removal) && !options_.tallies) {
        // Nothing is made, so the characteristics are exact across the whole layer: one step.
        substep(t);
        return;
    }
    if (rest > 1e-9 * h_max) {
        substep(rest);
    }
    // A path far thicker than any shield (a hill, a planet) would take many steps for nothing:
    // once the whole field has fallen below kExtinction of what entered, it is zero (the dose
    // behind is below that share of the dose in front) and the march stops.
    // Neutrons that cannot react (below the reaction threshold of the cross sections) carry
    // no dose and never die out in a straight-ahead march: they do not count.
    auto largest = [&field, &md, n, active] {
        double m = 0.0;
        for (std::size_t j = 0; j < active; ++j) {
            const auto& psi = field.psi[j];
            const bool neutral = j == kNeutronSpecies;
            for (std::size_t k = 0; k < n; ++k) {
                if (!neutral || md.removal[j][k] > 0.0) {
                    m = std::max(m, psi[k]);
                }
            }
        }
        return m;
    };
    const double entered = largest();
    for (std::size_t k = 0; k < full; ++k) {
        substep(h_max);
        if (k % 16 == 15 && largest() < kExtinction * entered) {
            for (auto& psi : field.psi) {
                std::fill(psi.begin(), psi.end(), 0.0);
            }
            return;
        }
    }
}

DoseQuantities FieldDose::total() const {
    DoseQuantities t;
    for (const auto& d : by_species) {
        t += d;
    }
    t += local_from_protons;
    t += local_from_neutrons;
    return t;
}

DoseQuantities FragmentTransport::dose(const IonField& field, const Material& medium,
                                       const Material& water, const RbeModel& rbe) {
    if (!secondaries()) {
        // The sum over nuclei, in the order of dose_by_nucleus (bit for bit as before the
        // secondaries existed).
        DoseQuantities total;
        for (const auto& d : dose_by_nucleus(field, medium, water, rbe)) {
            total += d;
        }
        return total;
    }
    return dose_by_species(field, medium, water, rbe).total();
}

std::array<DoseQuantities, FragmentTransport::kMaxZ>
FragmentTransport::dose_by_nucleus(const IonField& field, const Material& medium,
                                   const Material& water, const RbeModel& rbe) {
    const FieldDose all = dose_by_species(field, medium, water, rbe);
    std::array<DoseQuantities, kMaxZ> out{};
    for (std::size_t j = 0; j < kIonSpecies; ++j) {
        out[j] = all.by_species[j];
    }
    if (secondaries()) {
        out[0] += all.by_species[kDeuteronSpecies];
        out[0] += all.by_species[kTritonSpecies];
        out[1] += all.by_species[kHelionSpecies];
    }
    return out;
}

FieldDose FragmentTransport::dose_by_species(const IonField& field, const Material& medium,
                                             const Material& water, const RbeModel& rbe) {
    const MaterialData& md = data(medium);
    auto& cache = const_cast<MaterialData&>(md).doses;
    // Exact values in the key (hexadecimal floating point): RBE models that differ anywhere
    // get their own entry.
    char exact[128];
    std::snprintf(exact, sizeof exact, "|%a|%a|%a", rbe.proton_above_2MeV, rbe.proton_below_2MeV,
                  rbe.heavy_ion);
    const std::string key = water.id() + exact;
    auto it = cache.find(key);
    const std::size_t active = active_species();
    if (it == cache.end()) {
        std::array<std::vector<DoseQuantities>, kFieldSpecies> per;
        for (std::size_t j = 0; j < active; ++j) {
            if (j == kNeutronSpecies) {
                continue; // neutral: its dose is the local deposit of its reactions
            }
            const Particle& p = species(j);
            const DoseMedium dm{&tables_.table(medium, p), &tables_.table(water, p)};
            per[j].resize(energies_.size());
            for (std::size_t m = 0; m < energies_.size(); ++m) {
                per[j][m] = dose_per_fluence_at_node(dm, p, first_node_ + m, rbe);
            }
        }
        it = cache.emplace(key, std::move(per)).first;
    }
    const std::size_t n = energies_.size();
    const double step = n > 1 ? std::log(energies_[1] / energies_[0]) : 0.0;
    FieldDose out;
    for (std::size_t j = 0; j < active; ++j) {
        if (it->second[j].empty()) {
            continue;
        }
        for (std::size_t m = 0; m < n; ++m) {
            const double w = (m == 0 || m + 1 == n ? 0.5 : 1.0) * step * field.psi[j][m];
            out.by_species[j] += it->second[j][m].scaled(w);
        }
    }
    if (secondaries()) {
        // The energy deposited where the reactions happen (kerma in the medium).
        for (std::size_t q = 0; q < 2; ++q) {
            const auto& psi = field.psi[q == 0 ? 0 : kNeutronSpecies];
            DoseQuantities d;
            for (std::size_t m = 0; m < n; ++m) {
                const double w =
                    (m == 0 || m + 1 == n ? 0.5 : 1.0) * step * psi[m] * kGy_per_MeV_per_g;
                const double heavy = md.local_heavy_MeV[q][m];
                const double light_part = md.local_MeV[q][m] - heavy;
                d += DoseQuantities{
                    w * md.local_MeV[q][m], w * md.local_Q_MeV[q][m],
                    w * (heavy * rbe.heavy_ion + light_part * rbe.proton_above_2MeV)};
            }
            (q == 0 ? out.local_from_protons : out.local_from_neutrons) = d;
        }
    }
    return out;
}

double FragmentTransport::charge_at(const IonField& field, std::size_t m) {
    double q = 0.0;
    for (std::size_t j = 0; j < field.psi.size(); ++j) {
        q += static_cast<double>(field_species(j).Z) * field.psi[j][m];
    }
    return q;
}

const Particle& field_species(std::size_t j) {
    if (j < kIonSpecies) {
        return particles()[j];
    }
    switch (j) {
    case kNeutronSpecies:
        return neutron();
    case kDeuteronSpecies:
        return deuteron();
    case kTritonSpecies:
        return triton();
    case kHelionSpecies:
        return helion();
    default:
        throw std::logic_error("field_species: no species " + std::to_string(j));
    }
}

} // namespace crewdose::exposure
