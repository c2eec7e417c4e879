#pragma once
// Straight-ahead transport of the whole radiation field (DESIGN.md physics items 3 and 8): every
// nucleus Z = 1..28 and, with secondaries on, the neutron, deuteron, triton and helion, on one
// grid of energy per nucleon, marched through a layer path in depth steps. Projectile
// fragments keep the velocity (energy per nucleon) of the nucleus that made them; the light
// particles of nucleon reactions (nucleon_production.hpp) are spread over energy; each then
// slows down by its own range table (neutrons only attenuate).
#include "data_cache.hpp"
#include "dosimetry.hpp"
#include "material.hpp"
#include "table_library.hpp"

#include <array>
#include <map>
#include <memory>
#include <string>
#include <vector>

namespace crewdose::exposure {

/// Species of the march: index Z - 1 for the nuclei Z = 1..28 (the proton, the alpha, and each
/// heavier element's most abundant isotope, particles()), then the light particles the
/// secondaries add.
inline constexpr std::size_t kIonSpecies = 28;
inline constexpr std::size_t kNeutronSpecies = 28;
inline constexpr std::size_t kDeuteronSpecies = 29;
inline constexpr std::size_t kTritonSpecies = 30;
inline constexpr std::size_t kHelionSpecies = 31;
inline constexpr std::size_t kFieldSpecies = 32;
/// The particle of species j (the neutron has Z = 0).
[[nodiscard]] const Particle& field_species(std::size_t j);

/// The field at one depth: psi[j][m] = E phi(E) of species j (kFieldSpecies of them),
/// particles per cm2 per unit ln E, at the march's energy nodes (TableLibrary grid nodes from
/// the march's lowest energy up), plus two tallies that conservation checks read (they do not
/// move in energy): the charge that left the field through proton reactions without
/// secondaries, and the neutrons emitted by nucleus reactions without secondaries (with them,
/// the neutrons are species kNeutronSpecies).
struct IonField {
    std::vector<std::vector<double>> psi;
    std::vector<double> charge_lost;
    std::vector<double> neutrons;
};

/// The dose of a field at a point, by where it comes from.
struct FieldDose {
    /// Charged particles crossing the point, by species (the neutron's entry stays zero).
    std::array<DoseQuantities, kFieldSpecies> by_species{};
    /// Energy deposited at the point by reactions there (kerma): the recoiling residual nuclei
    /// (target fragments) and the charged light particles too slow to be transported
    /// (MarchOptions::local_below_MeV_per_n), from proton reactions and from neutron reactions.
    DoseQuantities local_from_protons;
    DoseQuantities local_from_neutrons;
    [[nodiscard]] DoseQuantities total() const;
};

/// Options of the march. The defaults come from the convergence study in
/// tests/unit/fragment_transport_test.cpp.
struct MarchOptions {
    /// Largest depth step, g/cm2; each layer is cut into equal steps no larger than this.
    double max_step_g_cm2 = 4.0;
    /// Lowest energy of the march, MeV/n: ions slowing below it have stopped (the dose they
    /// would still deposit is below 0.1 % of the total in the checks).
    double min_energy_MeV_per_n = 0.1;
    /// Off: no fragments are made, each nucleus is only removed (the primaries-only model,
    /// which the exact response code reproduces; tests compare the two).
    bool fragmentation = true;
    /// Off: no energy loss (a test mode, in which charge is conserved exactly).
    bool stopping = true;
    /// Off: no nuclear reactions at all, neither removal nor fragments (implies no
    /// fragmentation): every nucleus keeps its charge through any shield. The upper value of
    /// the GCR bracket while secondary nucleons, target fragments and neutrons are not
    /// modelled (behind thick shielding they carry most of the dose).
    bool removal = true;
    /// Keep the charge-lost and neutron tallies of IonField (for conservation checks; off
    /// saves a tenth of the time).
    bool tallies = false;
    /// On (with removal and fragmentation): nucleon reactions make neutrons, protons,
    /// deuterons, tritons, helions and alphas (nucleon_production.hpp) and deposit the energy of
    /// their target fragments where they happen; the light particles of nucleus breakups (the
    /// charge closure's protons and the neutrons) are transported; dose() adds the local
    /// deposits. Off: the march of primaries and projectile fragments only.
    bool secondaries = false;
    /// With secondaries: charged light particles made below this energy per nucleon deposit
    /// their energy where they are made (their range in water is at most 0.25 g/cm2, the
    /// deuteron's; kerma, both hemispheres); faster ones are transported when they go forward
    /// and leave when they go backward. Neutrons are transported from the march's lowest
    /// energy up (the backward ones leave).
    double local_below_MeV_per_n = 10.0;
};

/// The march. It prepares what it needs per material on first use (range tables from the
/// library, the partial production cross sections of fragmentation.hpp on every node), so one
/// instance serves many paths; not thread-safe (one per thread, with its own library). With a
/// DataCache, a material's cross sections and production matrices (everything but the range
/// tables) are read from it when it holds them for the same material, options and energy grid,
/// and stored in it when computed; the march is then bit for bit the one without.
class FragmentTransport {
  public:
    static constexpr int kMaxZ = 28;
    static constexpr std::size_t kSpecies = kFieldSpecies;
    /// The field is taken as extinct, and set to zero, once every node has fallen below this
    /// share of the largest value that entered the layer (checked every 16 steps).
    static constexpr double kExtinction = 1e-30;
    /// Thickest layer cross() takes, g/cm2 (the scenario's bounds give at most 2.5e7).
    static constexpr double kMaxCrossing_g_cm2 = 1e9;

    /// `cache` (may be null: none) must outlive the march.
    FragmentTransport(TableLibrary& tables, MarchOptions options = {},
                      const DataCache* cache = nullptr);
    ~FragmentTransport();
    FragmentTransport(FragmentTransport&&) noexcept;
    FragmentTransport(const FragmentTransport&) = delete;
    FragmentTransport& operator=(const FragmentTransport&) = delete;
    FragmentTransport& operator=(FragmentTransport&&) = delete;

    /// Energy nodes of the march, MeV/n.
    [[nodiscard]] const std::vector<double>& energies() const noexcept { return energies_; }
    [[nodiscard]] const MarchOptions& options() const noexcept { return options_; }

    /// A field of zeros.
    [[nodiscard]] IonField empty_field() const;

    /// Carries `field` through `areal_density_g_cm2` of `material` (0 to kMaxCrossing_g_cm2;
    /// std::invalid_argument otherwise).
    void cross(IonField& field, const Material& material, double areal_density_g_cm2);

    /// Dose quantities of `field` scored in `medium` (LET in water for Q(L)): the integral over
    /// ln E of psi times the dose per fluence, trapezoidal on the nodes, summed over species,
    /// plus (with secondaries) the energy deposited at the point by reactions there.
    [[nodiscard]] DoseQuantities dose(const IonField& field, const Material& medium,
                                      const Material& water, const RbeModel& rbe = {});
    /// dose() by charge: element Z - 1 is the dose of charge Z (primaries, fragments and
    /// secondaries alike: deuterons and tritons with the protons, helions with the alphas);
    /// the local deposits are not in it.
    [[nodiscard]] std::array<DoseQuantities, kMaxZ> dose_by_nucleus(const IonField& field,
                                                                    const Material& medium,
                                                                    const Material& water,
                                                                    const RbeModel& rbe = {});
    /// dose() by species and local deposit; total() is dose().
    [[nodiscard]] FieldDose dose_by_species(const IonField& field, const Material& medium,
                                            const Material& water, const RbeModel& rbe = {});

    /// Total charge per unit ln E at node m: sum over species of Z psi (a conservation check).
    [[nodiscard]] static double charge_at(const IonField& field, std::size_t m);

    /// The DataCache kind of a material's march data.
    static constexpr std::string_view kCacheKind = "march-data";
    /// The march data this march holds for `material` (computed, or read from the cache, on
    /// first use) as the cache stores them: every double as its bit pattern, so two encodings
    /// are equal exactly when the data are equal bit for bit.
    [[nodiscard]] std::string encoded_data(const Material& material);

  private:
    struct MaterialData;
    struct StepMap;
    [[nodiscard]] bool secondaries() const noexcept;
    [[nodiscard]] std::size_t active_species() const noexcept;
    const MaterialData& data(const Material& material);
    /// The material's data (no range tables), computed: data() takes a copy of the process's.
    [[nodiscard]] std::unique_ptr<MaterialData> compute_data(const Material& material) const;
    void build_nucleon_production(MaterialData& md) const;
    /// The cache's payload of `md`, and back: nullptr when `payload` does not decode into data
    /// of this march's shape (which are then computed instead).
    [[nodiscard]] std::string encode_data(const MaterialData& md) const;
    [[nodiscard]] std::unique_ptr<MaterialData> decode_data(std::string_view payload) const;
    void index_spread(MaterialData& md) const;
    void source_integral(const MaterialData& md, double h, std::size_t j, StepMap& map) const;
    /// The dose-weighted mean ICRP 60 Q of a particle of species j stopping in water from
    /// energy per nucleon E0.
    [[nodiscard]] double track_quality(std::size_t j, double E0_MeV_per_n) const;
    /// Q of the residual nuclei of reactions on element Z (see the definition).
    [[nodiscard]] double recoil_quality(int Z) const;
    [[nodiscard]] StepMap step_map(const MaterialData& md, double h) const;
    const StepMap& cached_step_map(const MaterialData& md, double h);

    TableLibrary& tables_;
    MarchOptions options_;
    const DataCache* cache_ = nullptr;
    std::size_t first_node_ = 0; ///< table node of march node 0
    std::vector<double> energies_;
    std::map<std::string, std::unique_ptr<MaterialData>> materials_;
    std::unique_ptr<StepMap> scratch_;          ///< the map of a step length met for the first time
    const MaterialData* scratch_for_ = nullptr; ///< the material and length scratch_ is for
    double scratch_h_ = 0.0;
};

} // namespace crewdose::exposure
