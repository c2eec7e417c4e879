#pragma once
// Straight-ahead transport of the whole GCR ion field with projectile fragmentation
// (DESIGN.md physics item 8): every nucleus Z = 1..28 on one grid of energy per nucleon,
// marched through a layer path in depth steps. Fragments keep the velocity (energy per
// nucleon) of the nucleus that made them and then slow down by their own range tables.
#include "dosimetry.hpp"
#include "material.hpp"
#include "table_library.hpp"

#include <array>
#include <map>
#include <memory>
#include <string>
#include <vector>

namespace crewdose::exposure {

/// The ion field at one depth: psi[Z - 1][m] = E phi(E), particles per cm2 per unit ln E, at
/// the march's energy nodes (TableLibrary grid nodes from the march's lowest energy up), plus
/// two tallies that conservation checks read (they do not move in energy): the charge that
/// left the field through proton reactions (target fragments are not modelled), and the
/// neutrons emitted (not transported).
struct IonField {
    std::vector<std::vector<double>> psi;
    std::vector<double> charge_lost;
    std::vector<double> neutrons;
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
};

/// The march. It prepares what it needs per material on first use (range tables from the
/// library, the partial production cross sections of fragmentation.hpp on every node), so one
/// instance serves many paths; not thread-safe (one per thread, with its own library).
class FragmentTransport {
  public:
    static constexpr int kMaxZ = 28;
    /// The field is taken as extinct, and set to zero, once every node has fallen below this
    /// share of the largest value that entered the layer (checked every 16 steps).
    static constexpr double kExtinction = 1e-30;
    /// Thickest layer cross() takes, g/cm2 (the scenario's bounds give at most 2.5e7).
    static constexpr double kMaxCrossing_g_cm2 = 1e9;

    FragmentTransport(TableLibrary& tables, MarchOptions options = {});
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
    /// ln E of psi times the dose per fluence, trapezoidal on the nodes, summed over nuclei.
    [[nodiscard]] DoseQuantities dose(const IonField& field, const Material& medium,
                                      const Material& water, const RbeModel& rbe = {});
    /// dose() nucleus by nucleus: element Z - 1 is the dose of charge Z (primaries and
    /// fragments alike); their sum is dose().
    [[nodiscard]] std::array<DoseQuantities, kMaxZ> dose_by_nucleus(const IonField& field,
                                                                    const Material& medium,
                                                                    const Material& water,
                                                                    const RbeModel& rbe = {});

    /// Total charge per unit ln E at node m: sum_Z Z psi_Z(m) (a conservation check).
    [[nodiscard]] static double charge_at(const IonField& field, std::size_t m);

  private:
    struct MaterialData;
    struct StepMap;
    const MaterialData& data(const Material& material);
    [[nodiscard]] StepMap step_map(const MaterialData& md, double h) const;
    const StepMap& cached_step_map(const MaterialData& md, double h);

    TableLibrary& tables_;
    MarchOptions options_;
    std::size_t first_node_ = 0; ///< table node of march node 0
    std::vector<double> energies_;
    std::map<std::string, std::unique_ptr<MaterialData>> materials_;
    std::unique_ptr<StepMap> scratch_; ///< the map of a step length met for the first time
};

} // namespace crewdose::exposure
