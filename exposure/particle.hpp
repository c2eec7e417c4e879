#pragma once
#include <optional>
#include <span>
#include <string_view>

namespace crewdose::exposure {

/// A fully ionised nucleus moving through matter. Energies are kinetic energy per nucleon
/// (MeV/n); for the proton that is simply its kinetic energy.
struct Particle {
    std::string_view name; ///< lower-case name used on the command line ("proton", "alpha", "iron")
    std::string_view symbol; ///< chemical symbol of the element ("H", "He", "Fe")
    int Z;                   ///< charge number of the bare nucleus
    int A;                   ///< mass number (nucleons)
    double mass_MeV;         ///< rest energy of the bare nucleus, MeV

    /// Rest energy per nucleon, MeV: the scale of kinetic energy per nucleon.
    [[nodiscard]] double mass_per_nucleon_MeV() const noexcept {
        return mass_MeV / static_cast<double>(A);
    }
    /// Lorentz factor gamma at kinetic energy per nucleon `energy_MeV_per_n`.
    [[nodiscard]] double gamma(double energy_MeV_per_n) const noexcept {
        return 1.0 + energy_MeV_per_n / mass_per_nucleon_MeV();
    }
    /// beta^2 at kinetic energy per nucleon `energy_MeV_per_n`.
    [[nodiscard]] double beta2(double energy_MeV_per_n) const noexcept;
};

/// The proton, alpha particle and the most abundant isotope of each element Z = 3..28 (the GCR
/// nuclei), ordered by Z.
[[nodiscard]] std::span<const Particle> particles();
/// Particle by charge number Z (1..28).
[[nodiscard]] std::optional<Particle> particle_by_Z(int Z);
/// Particle by name, case-insensitive: "proton" (or "p"), "alpha" (or "He"), or the element name
/// or symbol of a bare nucleus ("carbon", "C", "Fe"). "N" is refused as ambiguous with the
/// neutron; ask for "nitrogen".
[[nodiscard]] std::optional<Particle> particle_by_name(std::string_view name);

[[nodiscard]] const Particle& proton();
[[nodiscard]] const Particle& alpha();
/// The light particles nuclear reactions add to the field: the neutron (Z = 0: no stopping, no
/// range table), the deuteron, the triton and the helion (He-3).
[[nodiscard]] const Particle& neutron();
[[nodiscard]] const Particle& deuteron();
[[nodiscard]] const Particle& triton();
[[nodiscard]] const Particle& helion();

} // namespace crewdose::exposure
