#pragma once
// Light-particle production in nucleon-nucleus reactions below 150 MeV, from evaluated data:
// the ENDF/B-VIII.1 proton and neutron sublibraries (the LA150 evaluations, Chadwick & Young;
// Brown et al. 2018, Nucl. Data Sheets 148, 1, and the VIII.1 release), processed by
// scripts/data/process_endf.py into the compiled-in tables of endf_production_data.cpp (their
// provenance: file, MAT, MF/MT, processing date, is written there). The tables hold what the
// files say, per natural element: modelling choices (mirror reactions for missing neutron
// files, neighbours for missing elements, energy closure) belong to nucleon_production.hpp.
#include <array>
#include <cstddef>
#include <optional>
#include <span>
#include <string_view>

namespace crewdose::exposure {

/// The light particles whose emission the tables give, in this order.
enum class LightParticle : std::size_t { neutron, proton, deuteron, triton, helion, alpha };
inline constexpr std::size_t kLightParticles = 6;
/// Short names: n, p, d, t, he3, alpha.
[[nodiscard]] std::string_view light_particle_name(LightParticle p);

/// Outgoing (laboratory) kinetic-energy bins of every table, MeV: bin 0 is [0, 0.1), then
/// kEndfBinsPerDecade bins per decade from 0.1 MeV up to the last edge (at least 150 MeV).
inline constexpr std::size_t kEndfBinsPerDecade = 10;
[[nodiscard]] std::span<const double> endf_outgoing_edges_MeV();

/// One incident energy of one table.
struct EndfIncident {
    double energy_MeV = 0.0;    ///< incident kinetic energy
    double nonelastic_mb = 0.0; ///< non-elastic (reaction) cross section
    double q_mass_MeV = 0.0;    ///< mean mass-balance Q of the reactions (negative: endothermic)
    double recoil_mb_MeV = 0.0; ///< kinetic energy of products heavier than He-4 (residual nuclei,
                                ///< Li, ...), sigma-weighted
    double gamma_mb_MeV = 0.0;  ///< photon energy, sigma-weighted
    double covered_share = 1.0; ///< share of the natural element whose files cover this energy
    /// Per light particle: d sigma / dE' per outgoing bin (mb/MeV), and the share of each bin
    /// emitted into the forward hemisphere (cos theta_lab > 0). Spans of the bins' size.
    std::array<std::span<const float>, kLightParticles> dsigma_dE_mb_per_MeV;
    std::array<std::span<const float>, kLightParticles> forward_share;
};

/// One natural element (isotopes weighted by abundance) with one projectile.
struct EndfTable {
    int Z = 0;
    bool neutron_projectile = false;
    std::string_view source;                ///< files and MATs, for reports
    std::span<const EndfIncident> incident; ///< ascending in energy, up to 150 MeV at most
};

/// The table of element Z for incident protons (or neutrons), when the library had one.
[[nodiscard]] std::optional<EndfTable> endf_table(int Z, bool neutron_projectile);

} // namespace crewdose::exposure
