#pragma once
// Elastic scattering of neutrons on hydrogen (DESIGN.md physics item 3): in hydrogen-rich
// matter (tissue, water, polyethylene) the largest share of a fast neutron's dose comes from the
// protons it knocks on. The cross section is the ENDF/B-VIII.1 evaluation to 20 MeV and the
// measured n-p total cross section of Abfalterer et al. 2001 to 500 MeV (np_elastic_data.cpp,
// made by scripts/data/np_elastic.py). Stated approximations:
//  - the centre-of-mass angular distribution is isotropic, so the recoil proton's kinetic energy
//    is uniform from 0 to the neutron's E (exact kinematics for equal masses, relativistic as
//    well) and the scattered neutron keeps the rest; the evaluation's largest Legendre a1 up
//    to 20 MeV (np_elastic_largest_a1()) bounds what this moves the mean recoil energy there;
//  - above the pion threshold (about 280 MeV) pion production in the measured total counts as
//    elastic; above the measurement's top (np_elastic_top_MeV()) scattering is not modelled;
//  - both particles go forward in the laboratory (they do for equal masses): the straight-ahead
//    march carries them on along the neutron's path.
#include <cstddef>

namespace crewdose::exposure {

/// The n + 1H elastic cross section, mb, at neutron kinetic energy E, MeV: linear between the
/// table's points, the first point's value below it (the cross section is flat towards thermal
/// energies), zero above np_elastic_top_MeV(). std::invalid_argument for E not finite or < 0.
[[nodiscard]] double np_elastic_cross_section_mb(double energy_MeV);

/// Highest energy of the table, MeV.
[[nodiscard]] double np_elastic_top_MeV();

/// Largest |a1| of the evaluation's centre-of-mass Legendre expansion up to 20 MeV.
[[nodiscard]] double np_elastic_largest_a1();

namespace detail {
struct NpElasticPoint {
    double energy_MeV;
    double sigma_mb;
};
extern const NpElasticPoint kNpElasticTable[];
extern const std::size_t kNpElasticTableSize;
extern const double kNpElasticLargestA1;
} // namespace detail

} // namespace crewdose::exposure
