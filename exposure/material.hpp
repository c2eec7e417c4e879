#pragma once
#include "density_effect.hpp"
#include "low_energy_stopping.hpp"

#include <optional>
#include <string>
#include <vector>

namespace crewdose::exposure {

/// One element's share of a material, by mass.
struct ElementShare {
    int Z;                ///< atomic number (must be an element crewdose carries)
    double mass_fraction; ///< in (0, 1]
};

enum class Phase { condensed, gas };

/// What defines a material: the built-in library and scenario files both fill one of these.
struct MaterialSpec {
    std::string id;                        ///< short id ("water", "aluminium")
    std::string name;                      ///< descriptive name
    double density_g_cm3 = 0.0;            ///< density, g/cm3, > 0
    std::vector<ElementShare> composition; ///< mass fractions, summing to 1 within 1e-3
    Phase phase = Phase::condensed;
    /// The compound's own mean excitation energy, eV, where a standard gives one; otherwise the
    /// Bragg-additivity value ln I = sum w_i (Z/A)_i ln I_i / sum w_i (Z/A)_i is used.
    std::optional<double> mean_excitation_eV;
    /// Tabulated density-effect parameters; otherwise the Sternheimer-Peierls recipe is used.
    std::optional<SternheimerParameters> density_effect;
    /// A low-energy stopping fit for the compound as a whole (ICRU 49 gives some); otherwise the
    /// elements' fits are combined by Bragg additivity.
    std::optional<CompoundLowEnergyFit> low_energy_fit;
    /// Where the numbers come from, one line.
    std::string source;
};

/// A validated material: immutable, with the quantities stopping-power theory needs derived once.
class Material {
  public:
    /// Validates `spec` and throws ParameterError naming the field ("density_g_cm3",
    /// "composition", "mass_fraction", "mean_excitation_eV") when it is not allowed.
    explicit Material(MaterialSpec spec);

    [[nodiscard]] const std::string& id() const noexcept { return spec_.id; }
    [[nodiscard]] const std::string& name() const noexcept { return spec_.name; }
    [[nodiscard]] const std::string& source() const noexcept { return spec_.source; }
    [[nodiscard]] double density_g_cm3() const noexcept { return spec_.density_g_cm3; }
    [[nodiscard]] Phase phase() const noexcept { return spec_.phase; }
    [[nodiscard]] const std::vector<ElementShare>& composition() const noexcept {
        return spec_.composition;
    }
    /// <Z/A> = sum w_i Z_i / A_i, mol/g (electrons per gram / N_A).
    [[nodiscard]] double z_over_a_mol_g() const noexcept { return z_over_a_; }
    /// Mean excitation energy used in the Bethe formula, eV.
    [[nodiscard]] double mean_excitation_eV() const noexcept { return mean_excitation_eV_; }
    /// True when the mean excitation energy is the compound's own published value.
    [[nodiscard]] bool has_own_mean_excitation() const noexcept {
        return spec_.mean_excitation_eV.has_value();
    }
    /// Density-effect parameters in use (tabulated or Sternheimer-Peierls).
    [[nodiscard]] const SternheimerParameters& density_effect() const noexcept {
        return density_effect_;
    }
    /// True when the density-effect parameters are tabulated for this material.
    [[nodiscard]] bool has_tabulated_density_effect() const noexcept {
        return spec_.density_effect.has_value();
    }
    /// The compound's own low-energy fit, if it has one.
    [[nodiscard]] const std::optional<CompoundLowEnergyFit>& low_energy_fit() const noexcept {
        return spec_.low_energy_fit;
    }
    /// Plasma energy h-bar omega_p, eV (Sternheimer, Berger & Seltzer 1984, eq. 4).
    [[nodiscard]] double plasma_energy_eV() const noexcept;

  private:
    MaterialSpec spec_;
    double z_over_a_ = 0.0;
    double mean_excitation_eV_ = 0.0;
    SternheimerParameters density_effect_{};
};

} // namespace crewdose::exposure
