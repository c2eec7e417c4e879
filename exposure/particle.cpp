#include "particle.hpp"

#include "units.hpp"

#include <algorithm>
#include <array>
#include <cctype>
#include <string>

namespace crewdose::exposure {
namespace {

// Nuclear rest energy from the atomic mass (u) of the isotope, less its electrons; electron
// binding energies (below 0.1 % of the mass even for Ni) are neglected.
constexpr double nucleus_MeV(double atomic_mass_u, int Z) {
    return atomic_mass_u * kAtomicMassUnit_MeV - Z * kElectronMass_MeV;
}

// Isotope: the most abundant stable isotope of each element. Atomic masses in u from the Atomic
// Mass Evaluation AME2016 (Wang et al., Chinese Physics C 41, 030003), from memory to the
// digits given; the proton uses the CODATA 2018 proton mass directly.
const std::array kParticles{
    Particle{"proton", "H", 1, 1, kProtonMass_MeV},
    Particle{"alpha", "He", 2, 4, nucleus_MeV(4.00260325413, 2)},
    Particle{"lithium", "Li", 3, 7, nucleus_MeV(7.0160034, 3)},
    Particle{"beryllium", "Be", 4, 9, nucleus_MeV(9.0121831, 4)},
    Particle{"boron", "B", 5, 11, nucleus_MeV(11.0093054, 5)},
    Particle{"carbon", "C", 6, 12, nucleus_MeV(12.0, 6)},
    Particle{"nitrogen", "N", 7, 14, nucleus_MeV(14.0030740, 7)},
    Particle{"oxygen", "O", 8, 16, nucleus_MeV(15.9949146, 8)},
    Particle{"fluorine", "F", 9, 19, nucleus_MeV(18.9984032, 9)},
    Particle{"neon", "Ne", 10, 20, nucleus_MeV(19.9924402, 10)},
    Particle{"sodium", "Na", 11, 23, nucleus_MeV(22.9897693, 11)},
    Particle{"magnesium", "Mg", 12, 24, nucleus_MeV(23.9850417, 12)},
    Particle{"aluminium", "Al", 13, 27, nucleus_MeV(26.9815385, 13)},
    Particle{"silicon", "Si", 14, 28, nucleus_MeV(27.9769265, 14)},
    Particle{"phosphorus", "P", 15, 31, nucleus_MeV(30.9737620, 15)},
    Particle{"sulfur", "S", 16, 32, nucleus_MeV(31.9720712, 16)},
    Particle{"chlorine", "Cl", 17, 35, nucleus_MeV(34.9688527, 17)},
    Particle{"argon", "Ar", 18, 40, nucleus_MeV(39.9623831, 18)},
    Particle{"potassium", "K", 19, 39, nucleus_MeV(38.9637065, 19)},
    Particle{"calcium", "Ca", 20, 40, nucleus_MeV(39.9625909, 20)},
    Particle{"scandium", "Sc", 21, 45, nucleus_MeV(44.9559083, 21)},
    Particle{"titanium", "Ti", 22, 48, nucleus_MeV(47.9479420, 22)},
    Particle{"vanadium", "V", 23, 51, nucleus_MeV(50.9439570, 23)},
    Particle{"chromium", "Cr", 24, 52, nucleus_MeV(51.9405062, 24)},
    Particle{"manganese", "Mn", 25, 55, nucleus_MeV(54.9380439, 25)},
    Particle{"iron", "Fe", 26, 56, nucleus_MeV(55.9349363, 26)},
    Particle{"cobalt", "Co", 27, 59, nucleus_MeV(58.9331943, 27)},
    Particle{"nickel", "Ni", 28, 58, nucleus_MeV(57.9353424, 28)},
};

std::string lower(std::string_view s) {
    std::string out(s);
    std::transform(out.begin(), out.end(), out.begin(),
                   [](unsigned char c) { return static_cast<char>(std::tolower(c)); });
    return out;
}

} // namespace

double Particle::beta2(double energy_MeV_per_n) const noexcept {
    const double g = gamma(energy_MeV_per_n);
    // 1 - 1/g^2 written to keep precision at low energy: (g-1)(g+1)/g^2.
    return (g - 1.0) * (g + 1.0) / (g * g);
}

std::span<const Particle> particles() {
    return kParticles;
}

std::optional<Particle> particle_by_Z(int Z) {
    if (Z < 1 || Z > static_cast<int>(kParticles.size())) {
        return std::nullopt;
    }
    return kParticles[static_cast<std::size_t>(Z - 1)];
}

std::optional<Particle> particle_by_name(std::string_view name) {
    const std::string key = lower(name);
    if (key == "p" || key == "proton") {
        return kParticles[0];
    }
    if (key == "alpha" || key == "he" || key == "helium") {
        return kParticles[1];
    }
    if (key == "n") { // ambiguous with the neutron, which is not a transported particle here
        return std::nullopt;
    }
    for (const auto& p : kParticles) {
        if (p.name == key || lower(p.symbol) == key) {
            return p;
        }
    }
    return std::nullopt;
}

const Particle& proton() {
    return kParticles[0];
}

// The light particles that nuclear reactions add (CODATA 2018 nuclear masses, from memory).
const Particle& neutron() {
    static const Particle p{"neutron", "n", 0, 1, 939.56542052};
    return p;
}
const Particle& deuteron() {
    static const Particle p{"deuteron", "H", 1, 2, 1875.61294257};
    return p;
}
const Particle& triton() {
    static const Particle p{"triton", "H", 1, 3, 2808.92113298};
    return p;
}
const Particle& helion() {
    static const Particle p{"helion", "He", 2, 3, 2808.39160743};
    return p;
}
const Particle& alpha() {
    return kParticles[1];
}

} // namespace crewdose::exposure
