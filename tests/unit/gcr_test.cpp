// The galactic cosmic ray environment: force-field modulation, nucleus-nucleus removal, and
// GCR doses against an independent integral and a published lunar-surface measurement.
#include "exposure/fragment_transport.hpp"
#include "exposure/gcr.hpp"
#include "exposure/material_library.hpp"
#include "exposure/nuclear.hpp"
#include "exposure/response.hpp"
#include "exposure/table_library.hpp"
#include "exposure/units.hpp"
#include "planner/study/study.hpp"

#include "free_space_dose.hpp"

#include <catch2/catch.hpp>

#include <cmath>
#include <fstream>
#include <sstream>
#include <string>
#include <utility>
#include <vector>

using namespace crewdose::exposure;

TEST_CASE("force field: phi = 0 is the LIS, and the flux falls with phi", "[gcr]") {
    for (const int Z : {1, 2, 6, 8, 14, 26}) {
        const Particle p = *particle_by_Z(Z);
        for (const double T : {10.0, 100.0, 1000.0, 1e4, 1e5}) {
            CHECK(gcr_modulated(p, T, 0.0) == Approx(gcr_lis(p, T)).epsilon(1e-14));
            double previous = gcr_modulated(p, T, 0.0);
            for (const double phi : {200.0, 400.0, 700.0, 1000.0, 1500.0}) {
                const double j = gcr_modulated(p, T, phi);
                CHECK(j < previous);
                CHECK(j > 0.0);
                previous = j;
            }
        }
    }
    CHECK(gcr_nucleus_included(1));
    CHECK(gcr_nucleus_included(26));
    CHECK(gcr_nucleus_included(3)); // lithium: its abundance from the ISO 15390 table
    CHECK(gcr_lis(*particle_by_Z(3), 1000.0) > 0.0);
}

TEST_CASE("proton flux against the published formula evaluated by hand", "[gcr][reference]") {
    // Burger et al. 2000 LIS as written by Usoskin et al. 2005 (eq. 2),
    // J = 1.9e4 P^-2.78 / (1 + 0.4866 P^-2.51) per (m2 s sr GeV), with the force field of
    // Gleeson & Axford 1968, evaluated by hand (Python, T_r = 0.938272 GeV):
    //   T = 1 GeV,   phi = 500 MV:  1064.0688769753956
    //   T = 0.1 GeV, phi = 400 MV:  1786.526623322542
    //   T = 10 GeV,  phi = 1000 MV: 16.280701121421103
    // gcr_modulated() is per MeV: x 1e3 to compare.
    const Particle& p = proton();
    CHECK(1e3 * gcr_modulated(p, 1000.0, 500.0) == Approx(1064.0688769753956).epsilon(1e-6));
    CHECK(1e3 * gcr_modulated(p, 100.0, 400.0) == Approx(1786.526623322542).epsilon(1e-6));
    CHECK(1e3 * gcr_modulated(p, 10000.0, 1000.0) == Approx(16.280701121421103).epsilon(1e-6));
    // Omnidirectional per cm2 per day: 4 pi sr x 1e-4 m2/cm2 x 86400 s (by construction).
    CHECK(gcr_omnidirectional_per_cm2_day_MeV_n(p, 1000.0, 500.0) ==
          Approx(1.0640688769753956 * 4.0 * 3.14159265358979 * 1e-4 * 86400.0).epsilon(1e-6));
}

TEST_CASE("composition at 10.6 GeV/n against the published relative abundances",
          "[gcr][reference]") {
    // At phi = 1000 MV (the value the HEAO-3 intensities were taken back with) the model
    // returns the HEAO-3-C2 oxygen intensity at 10.6 GeV/n, 0.0329 per (m2 sr s GeV/n)
    // (Engelmann et al. 1990, A&A 233, 96) by construction, and Fe/O = 110/1000 there.
    const double O = 1e3 * gcr_modulated(*particle_by_Z(8), 10600.0, 1000.0);
    CHECK(O == Approx(0.0329).epsilon(1e-9));
    CHECK(1e3 * gcr_modulated(*particle_by_Z(26), 10600.0, 1000.0) / O ==
          Approx(0.110).epsilon(1e-9));
    // Independent of that table: the Review of Particle Physics (Particle Data Group, cosmic-ray
    // chapter, relative abundances at 10.6 GeV/n normalised to oxygen; from memory) gives about
    // 540 for H and 26 for He. The proton LIS and the p/He = 7 rule give H/O and He/O within
    // 25 % of those.
    const double H = 1e3 * gcr_modulated(proton(), 10600.0, 1000.0);
    const double He = 1e3 * gcr_modulated(*particle_by_Z(2), 10600.0, 1000.0);
    CHECK(H / O == Approx(540.0).epsilon(0.25));
    CHECK(He / O == Approx(26.0).epsilon(0.25));
    // Lithium is not in the HEAO-3-C2 table; its interstellar abundance is the ratio of the ISO
    // 15390 table's lithium and oxygen spectra at 10.6 GeV/n, C (A/Z) beta^(alpha-1) R^-gamma
    // with C = 0.0195 and 0.0874, gamma = 2.82 and 2.70, alpha = 3.41 and 3.11, evaluated by
    // hand (Python, 7Li and 16O nuclear masses): 115.51 per 1000 oxygen (by construction).
    const Particle li = *particle_by_Z(3);
    const Particle ox = *particle_by_Z(8);
    CHECK(1000.0 * gcr_lis(li, 10600.0) / gcr_lis(ox, 10600.0) == Approx(115.51).epsilon(1e-4));
    // Independent of that table: the same PDG table gives Li-B together about 0.40 of oxygen
    // near the Earth (from memory); less HEAO-3's Be and B (87.3 + 192.5) that leaves about
    // 120 for Li. The model at 1 AU (phi = 1000 MV): 118.
    const double Li = 1e3 * gcr_modulated(li, 10600.0, 1000.0);
    CHECK(1000.0 * Li / O == Approx(120.0).epsilon(0.25));
}

namespace {

// Sum over included nuclei Z_min..Z_max of the modulated intensity, per (m2 sr s MeV/n):
// averaged over [a, b] MeV/n (mean = true) or integrated above a (per m2 sr s).
double heavy_intensity(int z_min, int z_max, double a, double b, double phi, bool mean) {
    const int n = 2000;
    const double la = std::log(a);
    const double lb = std::log(b);
    const double h = (lb - la) / n;
    double sum = 0.0;
    for (int i = 0; i <= n; ++i) {
        const double E = std::exp(la + i * h);
        const double w = (i == 0 || i == n) ? 0.5 : 1.0;
        for (const auto& p : particles()) {
            if (p.Z >= z_min && p.Z <= z_max && gcr_nucleus_included(p.Z)) {
                sum += w * h * E * gcr_modulated(p, E, phi);
            }
        }
    }
    return mean ? sum / (b - a) : sum;
}

} // namespace

TEST_CASE("heavy-nucleus intensities against emulsion measurements of the 1960s minimum",
          "[gcr][reference]") {
    // References (abstracts; the stored abstracts do not name the authors):
    //  - "Charge and Energy Spectrum of Heavy Nuclei during the Solar Minimum, 1965": emulsion
    //    stack at 2.7 g/cm2 over Fort Churchill, 30 June 1965: Z >= 10 nuclei 0.0045 +- 0.0010
    //    at 300-500 MeV/n and 0.0049 +- 0.0008 at 500-800 MeV/n; Z >= 20: 0.0013 +- 0.0006 and
    //    0.0011 +- 0.0004, per (m2 sr s MeV/n).
    //  - "Very Heavy Nuclei in the Primary Cosmic Radiation. I. Observations on the Energy
    //    Spectrum": stacks over Fort Churchill, Texas and India (1964-66): Z >= 20 integral
    //    intensities above 0.225, 1.58 and 7.1 GeV/n of 1.50 +- 0.06, 0.403 +- 0.023 and
    //    0.090 +- 0.006 per (m2 sr s).
    // Model at phi = 400 MV (our estimate of that minimum for this LIS). As measured when this
    // test was written: 0.81-1.27 times the measurements (the statistical errors of these are
    // 4-46 %). Before the heavy nuclei took the ISO 15390 spectral shapes (they had the proton
    // LIS's shape in their rigidity) the model was 1.3-2.2 times the measurements from 0.3 to
    // 2 GeV/n, where the heavy ions carry most of their dose equivalent. Gate: within 35 %.
    struct Case {
        int z_min;
        double a, b;
        bool mean;
        double measured;
    };
    for (const Case& c : {Case{10, 300, 500, true, 0.0045}, Case{10, 500, 800, true, 0.0049},
                          Case{20, 300, 500, true, 0.0013}, Case{20, 500, 800, true, 0.0011},
                          Case{20, 225, 1e5, false, 1.50}, Case{20, 1580, 1e5, false, 0.403},
                          Case{20, 7100, 1e5, false, 0.090}}) {
        const double model = heavy_intensity(c.z_min, 28, c.a, c.b, 400.0, c.mean);
        INFO("Z >= " << c.z_min << ", " << c.a << " MeV/n: model " << model << ", measured "
                     << c.measured);
        CHECK(model == Approx(c.measured).epsilon(0.35));
    }
    // Above 7.1 GeV/n the HEAO-3 normalisation holds the model: within 15 % there (measured
    // when written: 12 % under).
    CHECK(heavy_intensity(20, 28, 7100, 1e5, 400.0, false) == Approx(0.090).epsilon(0.15));
}

TEST_CASE("nucleus-nucleus reaction cross sections against measurements", "[gcr][reference]") {
    // Sihver et al. 1993 is energy independent, meant for high energies. Reference: measured
    // 12C + 12C total reaction / interaction cross sections near 850-870 mb between 200 MeV/n
    // and 1 GeV/n (Kox et al. 1987 and Ozawa et al. 2001 compilations; from memory), within
    // 10 %.
    const double cc = nucleus_reaction_cross_section_mb(6, 12.0, 6, 12.011, 400.0);
    CHECK(cc == Approx(860.0).epsilon(0.10));
    // By construction: symmetric in projectile and target, growing with either mass.
    CHECK(nucleus_reaction_cross_section_mb(26, 56.0, 13, 27.0, 400.0) ==
          Approx(nucleus_reaction_cross_section_mb(13, 27.0, 26, 56.0, 400.0)).epsilon(1e-12));
    CHECK(nucleus_reaction_cross_section_mb(26, 56.0, 6, 12.0, 400.0) > cc);
    // Hydrogen target: the proton-nucleus cross section on the projectile (inverse kinematics).
    CHECK(nucleus_reaction_cross_section_mb(6, 12.0, 1, 1.008, 400.0) ==
          Approx(proton_reaction_cross_section_mb(6, 12.0, 400.0)).epsilon(1e-12));
}

namespace {

BracketedDose gcr_dose_per_day(TableLibrary& tables,
                               const std::vector<std::pair<const Material*, double>>& layers,
                               const Material& medium, double phi) {
    BracketedDose total;
    const RbeModel rbe{};
    for (const auto& p : particles()) {
        if (!gcr_nucleus_included(p.Z)) {
            continue;
        }
        LayerPath path;
        for (const auto& [m, t] : layers) {
            path.push_back({&tables.table(*m, p), t});
        }
        const RangeTable& tm = tables.table(medium, p);
        const RangeTable& tw = tables.table(*find_builtin_material("water"), p);
        const PathResponse r = path_response(path, DoseMedium{&tm, &tw}, p, rbe);
        const BracketedDose d = fold(r, gcr_node_fluences(p, phi, r.node_energies_MeV_per_n));
        total.with_removal += d.with_removal;
        total.without_removal += d.without_removal;
    }
    return total;
}

} // namespace

TEST_CASE("GCR dose behind 0 g/cm2 equals the free-space integral", "[gcr]") {
    // By construction: with nothing in the way the response fold must reproduce the direct
    // integral of the modulated spectra against the stopping power.
    TableLibrary tables;
    const Material& water = *find_builtin_material("water");
    const BracketedDose folded = gcr_dose_per_day(tables, {}, water, 400.0);
    const double direct = crewdose::test::free_space_dose_Gy_per_day(tables, water, 400.0, 1.0);
    CHECK(folded.with_removal.absorbed_Gy == Approx(direct).epsilon(2e-3));
    CHECK(folded.without_removal.absorbed_Gy == Approx(direct).epsilon(2e-3));
}

TEST_CASE("lunar surface GCR dose in silicon against Chang'E-4", "[gcr][reference]") {
    // Reference: Zhang et al. 2020 (Science Advances 6, eaaz1334), Lunar Lander Neutrons and
    // Dosimetry experiment on the far side, early 2019, near solar minimum: 13.2 +/- 1 uGy/h
    // absorbed in silicon, of which about 3.1 uGy/h from neutral particles, so about
    // 10.1 uGy/h from charged particles. The model: the ground blocks the lower half-sky (half
    // the free-space fluence), thin shielding (1 g/cm2 aluminium, our assumption: the
    // instrument's housing is not modelled in detail), phi = 400 MV (our solar-minimum example
    // for this LIS; lunar albedo protons and neutrons are not modelled). Gate: within +/- 30 %.
    // The model gated is the one the check uses: the fragmentation march (8.22 uGy/h as
    // measured, 19 % under; 7.59 before helium was fitted to AMS-02).
    TableLibrary tables(crewdose::planner::gcr_grid());
    FragmentTransport march(tables);
    const Material& al = *find_builtin_material("aluminium");
    const Material& si = *find_builtin_material("silicon");
    IonField field = gcr_free_space_field(march, 400.0);
    march.cross(field, al, 1.0);
    const DoseQuantities d = march.dose(field, si, *find_builtin_material("water"));
    const double uGy_per_h = 0.5 * d.absorbed_Gy * 1e6 / 24.0;
    CHECK(uGy_per_h == Approx(10.1).epsilon(0.30));
    // Across 1 g/cm2 nuclear reactions change little: the primaries-only bracket is narrow and
    // the march lies inside it to within its 0.5 % accuracy.
    TableLibrary fine;
    const BracketedDose primaries = gcr_dose_per_day(fine, {{&al, 1.0}}, si, 400.0);
    CHECK(primaries.with_removal.absorbed_Gy > 0.95 * primaries.without_removal.absorbed_Gy);
    CHECK(d.absorbed_Gy > 0.995 * primaries.with_removal.absorbed_Gy);
    CHECK(d.absorbed_Gy < 1.005 * primaries.without_removal.absorbed_Gy);
}

TEST_CASE("the GCR energy grid is converged to 0.2 %", "[gcr]") {
    // The study's GCR grid (planner::kGcrNodesPerDecade) against four times denser, all
    // nuclei at phi = 400 MV behind 1, 10 and 40 g/cm2 aluminium plus 5 cm water (measured
    // at 12 per decade: 0.11 %).
    auto dose = [](std::size_t nodes_per_decade, double aluminium_g_cm2) {
        EnergyGridSpec g;
        g.nodes_per_decade = nodes_per_decade;
        TableLibrary tables(g);
        const Material& al = *find_builtin_material("aluminium");
        const Material& water = *find_builtin_material("water");
        BracketedDose total;
        for (const auto& p : particles()) {
            if (!gcr_nucleus_included(p.Z)) {
                continue;
            }
            const LayerPath path{{&tables.table(al, p), aluminium_g_cm2},
                                 {&tables.table(water, p), 5.0}};
            const RangeTable& tw = tables.table(water, p);
            const PathResponse r = path_response(path, DoseMedium{&tw, &tw}, p, RbeModel{});
            const BracketedDose d = fold(r, gcr_node_fluences(p, 400.0, r.node_energies_MeV_per_n));
            total.with_removal += d.with_removal;
            total.without_removal += d.without_removal;
        }
        return total;
    };
    for (const double t : {1.0, 10.0, 40.0}) {
        const BracketedDose coarse = dose(crewdose::planner::kGcrNodesPerDecade, t);
        const BracketedDose fine = dose(4 * crewdose::planner::kGcrNodesPerDecade, t);
        for (const auto& [c, f] : {std::pair{coarse.with_removal, fine.with_removal},
                                   std::pair{coarse.without_removal, fine.without_removal}}) {
            CHECK(c.absorbed_Gy == Approx(f.absorbed_Gy).epsilon(2e-3));
            CHECK(c.dose_equivalent_Sv == Approx(f.dose_equivalent_Sv).epsilon(2e-3));
        }
    }
}

namespace {

// The first two columns of a CSV in tests/data/crdb: T (GeV/n) or R (GV), and the flux (per
// m2 s sr GeV/n or per m2 s sr GV).
std::vector<std::pair<double, double>> crdb_protons(const std::string& name) {
    std::ifstream in(std::string(CREWDOSE_SOURCE_DIR) + "/tests/data/crdb/" + name);
    REQUIRE(in);
    std::vector<std::pair<double, double>> out;
    std::string line;
    bool header = true;
    while (std::getline(in, line)) {
        if (line.empty() || line[0] == '#') {
            continue;
        }
        if (header) {
            header = false;
            continue;
        }
        std::stringstream s(line);
        std::string T, J;
        std::getline(s, T, ',');
        std::getline(s, J, ',');
        out.emplace_back(std::stod(T), std::stod(J));
    }
    return out;
}

// The model's helium flux per (m2 s sr GV) at rigidity R (GV) at 1 AU.
double helium_per_GV(double R, double phi_MV) {
    const Particle he = *particle_by_Z(2);
    const double M = he.mass_MeV * 1e-3; // GeV
    const double Z = he.Z;
    const double A = he.A;
    const double Tn = (std::sqrt(Z * R * Z * R + M * M) - M) / A; // GeV/n
    const double beta = Z * R / std::sqrt(Z * R * Z * R + M * M);
    // per MeV/n -> per GeV/n, times dT_n/dR = (Z/A) beta.
    return 1e3 * gcr_modulated(he, 1e3 * Tn, phi_MV) * Z / A * beta;
}

} // namespace

TEST_CASE("GCR helium against AMS-02 (fitted) and PAMELA 2006-08 (held out)", "[gcr][reference]") {
    // Sources: Aguilar et al. 2021, Physics Reports 894, 1 (AMS-02, proton and helium fluxes
    // per rigidity, SSDC export) and Adriani et al. 2011, Science 332, 69 (PAMELA helium,
    // 2006/07-2008/12), from the public repository carmeloevoli/crams; tests/data/crdb names
    // the commits and files, scripts/data/helium_lis.py extracted them and fitted the helium
    // LIS (p/He = r0 (R / 10 GV)^-delta) to the AMS-02 helium from 2 to 100 GV at 629 MV, the
    // phi this LIS fits to the same report's protons (1-20 GV, within 5.9 %).
    const auto ams = crdb_protons("ams02_2011_2018_helium_rigidity.csv");
    REQUIRE(ams.size() > 60);
    for (const auto& [R, J] : ams) {
        if (R > 1000.0) {
            continue; // above 1 TV the measured spectrum hardens; no dose comes from there
        }
        INFO("AMS-02 helium at " << R << " GV: model " << helium_per_GV(R, 629.0) << ", measured "
                                 << J);
        CHECK(helium_per_GV(R, 629.0) == Approx(J).epsilon(0.10)); // the fit left 8.0 %
    }
    // Held out: PAMELA's helium at the phi PAMELA's protons give (501 MV, the test below),
    // from 1.6 GV (below, the force field at this phi overshoots the measured turnover: 2.2
    // times the flux at 1.0 GV) to 200 GV. The model before this fit (p/He = 7) was 0.73-0.84
    // of these points.
    const auto pamela = crdb_protons("pamela_2006_2008_helium_rigidity.csv");
    REQUIRE(pamela.size() > 60);
    std::size_t tested = 0;
    for (const auto& [R, J] : pamela) {
        if (R < 1.6 || R > 200.0) {
            continue;
        }
        ++tested;
        INFO("PAMELA helium at " << R << " GV: model " << helium_per_GV(R, 501.0) << ", measured "
                                 << J);
        CHECK(helium_per_GV(R, 501.0) == Approx(J).epsilon(0.15)); // worst 14 % (1.6-1.9 GV)
    }
    CHECK(tested > 60);
}

TEST_CASE("GCR protons against PAMELA 2006-08 and AMS-02 2011-13 at the fitted phi, within 15 %",
          "[gcr][reference]") {
    // Sources: Adriani et al. 2011, Science 332, 69 (PAMELA, 2006/07-2008/12) and Aguilar et
    // al. 2015, PRL 114, 171103 (AMS-02, 2011/05-2013/11), as exported by the Cosmic-Ray
    // DataBase (CRDB) into the public repository carmeloevoli/The_CR_Spectrum (commit
    // fa788cd, data/protons; tests/data/crdb names the files). phi fitted to these points
    // (least squares in log flux, 0.4-20 GeV): 501 MV (PAMELA) and 691 MV (AMS-02); the fit
    // left at most 6.8 % and 12.1 % (the Burger LIS's shape: the ratio drifts with energy).
    for (const auto& [file, phi] : {std::pair{"pamela_2006_2008_protons.csv", 501.0},
                                    std::pair{"ams02_2011_2013_protons.csv", 691.0}}) {
        const auto data = crdb_protons(file);
        REQUIRE(data.size() > 20);
        for (const auto& [T_GeV, J] : data) {
            // Model per (m2 s sr MeV/n) -> per GeV/n.
            const double model = 1e3 * gcr_modulated(proton(), 1e3 * T_GeV, phi);
            INFO(file << " at " << T_GeV << " GeV: model " << model << ", measured " << J);
            CHECK(model == Approx(J).epsilon(0.15));
        }
    }
}
