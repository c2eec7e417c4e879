// The whole field: secondary nucleons, light ions, target fragments and neutrons behind
// shielding (exposure/fragment_transport with MarchOptions::secondaries, exposure/
// nucleon_production), against the march without them, published calculations and in-situ
// measurements.
#include "exposure/fragment_transport.hpp"
#include "exposure/gcr.hpp"
#include "exposure/material_library.hpp"
#include "planner/study/study.hpp"

#include <catch2/catch.hpp>

#include <cmath>
#include <fstream>
#include <sstream>
#include <string>
#include <vector>

using namespace crewdose;
using namespace crewdose::exposure;

namespace {

const Material& builtin(const char* id) {
    return *find_builtin_material(id);
}

MarchOptions whole_field(double step = 4.0) {
    MarchOptions o;
    o.max_step_g_cm2 = step;
    o.secondaries = true;
    return o;
}

struct PathPart {
    const char* material;
    double g_cm2;
};

// GCR dose per day at the end of `path` (free-space field at phi), scored in `medium`.
DoseQuantities gcr_behind(FragmentTransport& march, double phi, const std::vector<PathPart>& path,
                          const char* medium) {
    IonField field = gcr_free_space_field(march, phi);
    for (const auto& l : path) {
        march.cross(field, builtin(l.material), l.g_cm2);
    }
    return march.dose(field, builtin(medium), builtin("water"));
}

} // namespace

TEST_CASE("secondaries: off, or without reactions, the march is the one without them",
          "[secondaries]") {
    // By construction: the secondaries need reactions and fragments.
    TableLibrary tables(planner::gcr_grid());
    MarchOptions plain;
    FragmentTransport a(tables, plain);
    MarchOptions none;
    none.removal = false;
    MarchOptions none_with = none;
    none_with.secondaries = true;
    FragmentTransport b(tables, none);
    FragmentTransport c(tables, none_with);
    const std::vector<PathPart> path{{"aluminium", 20.0}, {"soft-tissue", 5.0}};
    const auto x = gcr_behind(b, 400.0, path, "soft-tissue");
    const auto y = gcr_behind(c, 400.0, path, "soft-tissue");
    CHECK(x.absorbed_Gy == y.absorbed_Gy);
    CHECK(x.dose_equivalent_Sv == y.dose_equivalent_Sv);
    // With secondaries the field has more species; without, the extra ones stay empty.
    IonField f = gcr_free_space_field(a, 400.0);
    a.cross(f, builtin("aluminium"), 20.0);
    for (std::size_t j = kIonSpecies; j < kFieldSpecies; ++j) {
        for (const double v : f.psi[j]) {
            REQUIRE(v == 0.0);
        }
    }
}

TEST_CASE("secondaries: the absorbed dose builds up behind aluminium", "[secondaries]") {
    // Common practice (measurements behind shields; the reason secondaries are modelled):
    // the GCR absorbed dose rises over the first g/cm2 of aluminium as secondaries build up,
    // where the march of primaries and fragments alone falls. Scored in silicon, as the
    // detectors of the in-situ measurements.
    TableLibrary tables(planner::gcr_grid());
    FragmentTransport whole(tables, whole_field());
    FragmentTransport primaries(tables, MarchOptions{});
    std::vector<double> D;
    for (const double x : {0.0, 2.0, 5.0, 10.0, 20.0}) {
        const auto w = gcr_behind(whole, 690.0, {{"aluminium", x}}, "silicon");
        const auto p = gcr_behind(primaries, 690.0, {{"aluminium", x}}, "silicon");
        INFO(x << " g/cm2: whole " << w.absorbed_Gy << ", primaries " << p.absorbed_Gy);
        CHECK(w.absorbed_Gy > p.absorbed_Gy);
        D.push_back(w.absorbed_Gy);
    }
    CHECK(D[1] > D[0]);
    CHECK(D[2] > D[0]);
    CHECK(D[3] > D[0]);
    // Behind 20 g/cm2 the secondaries carry at least 40 % of the dose over the primaries' march
    // (measured here: +63 %).
    const auto w20 = gcr_behind(whole, 690.0, {{"aluminium", 20.0}}, "silicon");
    const auto p20 = gcr_behind(primaries, 690.0, {{"aluminium", 20.0}}, "silicon");
    CHECK(w20.absorbed_Gy > 1.4 * p20.absorbed_Gy);
}

TEST_CASE("secondaries: converged in march step and in the local-deposit cut", "[secondaries]") {
    // By construction (numerical convergence): behind 20 g/cm2 aluminium and 100 g/cm2
    // regolith, plus 5 cm of tissue. Step 4 g/cm2 against 1: measured within 0.25 %; gate
    // 0.5 %. Charged light particles deposited locally below 10 MeV/n against 3 and 30: the
    // kerma of slow particles against transporting them; measured within 1 % (D) and 2 % (H);
    // gate 3 %.
    TableLibrary tables(planner::gcr_grid());
    FragmentTransport coarse(tables, whole_field(4.0));
    FragmentTransport fine(tables, whole_field(1.0));
    for (const auto& path :
         {std::vector<PathPart>{{"aluminium", 20.0}, {"soft-tissue", 5.0}},
          std::vector<PathPart>{{"mare-regolith", 100.0}, {"soft-tissue", 5.0}}}) {
        const auto a = gcr_behind(coarse, 400.0, path, "soft-tissue");
        const auto b = gcr_behind(fine, 400.0, path, "soft-tissue");
        CHECK(a.absorbed_Gy == Approx(b.absorbed_Gy).epsilon(5e-3));
        CHECK(a.dose_equivalent_Sv == Approx(b.dose_equivalent_Sv).epsilon(5e-3));
        for (const double cut : {3.0, 30.0}) {
            MarchOptions o = whole_field(4.0);
            o.local_below_MeV_per_n = cut;
            FragmentTransport other(tables, o);
            const auto c = gcr_behind(other, 400.0, path, "soft-tissue");
            CHECK(c.absorbed_Gy == Approx(a.absorbed_Gy).epsilon(0.03));
            CHECK(c.dose_equivalent_Sv == Approx(a.dose_equivalent_Sv).epsilon(0.03));
        }
    }
}

TEST_CASE("secondaries: every species stays finite and non-negative, and the split adds up",
          "[secondaries]") {
    TableLibrary tables(planner::gcr_grid());
    FragmentTransport march(tables, whole_field());
    IonField f = gcr_free_space_field(march, 400.0);
    march.cross(f, builtin("polyethylene"), 30.0);
    march.cross(f, builtin("soft-tissue"), 5.0);
    for (const auto& psi : f.psi) {
        for (const double v : psi) {
            REQUIRE(std::isfinite(v));
            REQUIRE(v >= 0.0);
        }
    }
    // Neutrons and deuterons are made (the evaluated p + C files emit no tritons or helions;
    // the aluminium one emits tritons: checked below).
    IonField al = gcr_free_space_field(march, 400.0);
    march.cross(al, builtin("aluminium"), 30.0);
    double tritons = 0.0;
    for (const double v : al.psi[kTritonSpecies]) {
        tritons += v;
    }
    CHECK(tritons > 0.0);
    for (const std::size_t j : {kNeutronSpecies, kDeuteronSpecies}) {
        double sum = 0.0;
        for (const double v : f.psi[j]) {
            sum += v;
        }
        CHECK(sum > 0.0);
    }
    const FieldDose d = march.dose_by_species(f, builtin("soft-tissue"), builtin("water"));
    const DoseQuantities t = march.dose(f, builtin("soft-tissue"), builtin("water"));
    // By construction: dose() is the sum of the split.
    CHECK(d.total().absorbed_Gy == Approx(t.absorbed_Gy).epsilon(1e-12));
    CHECK(d.local_from_protons.absorbed_Gy > 0.0);
    CHECK(d.local_from_neutrons.absorbed_Gy > 0.0);
    CHECK(d.by_species[kNeutronSpecies].absorbed_Gy == 0.0); // neutral: its reactions' deposit
}

TEST_CASE("secondaries: Badhwar, Cucinotta & O'Neill 1993 behind 9 and 17.5 g/cm2 aluminium, "
          "within 25 %",
          "[secondaries][reference]") {
    // Source: Badhwar, Cucinotta & O'Neill 1993, Radiat. Res. 134, 9 (abstract): annual dose
    // equivalent at the 1977 solar minimum behind 9 and 17.5 g/cm2 aluminium, 0.60 and 0.50
    // Sv with ICRP 26 quality factors; ICRP 60 factors give about 15 % more, so about 0.69 and
    // 0.58 Sv (as in tests/unit/fragment_transport_test.cpp: 5 cm of tissue, phi = 400 MV,
    // our estimate of that minimum in this LIS's convention). Their calculation carries the
    // secondaries; measured here: 0.81 and 0.80 of it.
    TableLibrary tables(planner::gcr_grid());
    FragmentTransport march(tables, whole_field());
    for (const auto& [t, published_Sv] : {std::pair{9.0, 0.69}, std::pair{17.5, 0.58}}) {
        const double H = 365.25 * gcr_behind(march, 400.0, {{"aluminium", t}, {"soft-tissue", 5.0}},
                                             "soft-tissue")
                                      .dose_equivalent_Sv;
        INFO(t << " g/cm2: " << H << " Sv per year");
        CHECK(H == Approx(published_Sv).epsilon(0.25));
    }
}

TEST_CASE("secondaries: in-situ measurements, the record", "[secondaries][reference]") {
    // The comparisons of the README's in-situ table, recorded so that a change shows. The
    // model is far from these measurements (a known gap, named in the README and the reports):
    // the checks pin today's ratios, not agreement.
    TableLibrary tables(planner::gcr_grid());
    FragmentTransport march(tables, whole_field());
    // Source: Zeitlin et al. 2013, Science 340, 1080: MSL cruise, Dec 2011 - Jul 2012, RAD
    // inside the spacecraft: 0.481 mGy/day (silicon), 1.84 mSv/day, mean Q 3.82. Shield: a
    // uniform 10-16 g/cm2 aluminium shell stands in for the spacecraft (an approximation);
    // phi = 691 MV, our fit of this LIS to the AMS-02 2011-13 protons (environment test).
    for (const double t : {10.0, 16.0}) {
        const auto d = gcr_behind(march, 691.0, {{"aluminium", t}}, "silicon");
        const double D = 1e3 * d.absorbed_Gy;
        const double Q = d.dose_equivalent_Sv / d.absorbed_Gy;
        INFO(t << " g/cm2: " << D << " mGy/day, Q " << Q);
        CHECK(D / 0.481 > 0.40); // 0.48-0.49 measured: the model is about half the measurement
        CHECK(D / 0.481 < 0.60);
        CHECK(Q == Approx(3.82).epsilon(0.20)); // within the issue's +-20 %
    }
    // Source: Zhang et al. 2020, Sci. Adv. 6, eaaz1334: Chang'E-4 lander on the lunar far side,
    // early 2019, charged-particle dose in silicon 10.2 uGy/h behind about 1 g/cm2 aluminium;
    // mean Q 4.3. Half the sky blocked by the Moon, no lunar albedo (not modelled yet);
    // phi = 450 MV (the estimate for early 2019).
    const auto d = gcr_behind(march, 450.0, {{"aluminium", 1.0}}, "silicon");
    const double D_uGy_h = 0.5 * 1e6 * d.absorbed_Gy / 24.0;
    const double Q = d.dose_equivalent_Sv / d.absorbed_Gy;
    INFO(D_uGy_h << " uGy/h, Q " << Q);
    CHECK(D_uGy_h / 10.2 > 0.6); // 0.77 measured: without the albedo the model is low
    CHECK(D_uGy_h / 10.2 < 0.85);
    CHECK(Q > 4.3); // 5.4: the albedo's low-LET particles would lower it
}

TEST_CASE("secondaries: a lightly shielded dosimeter in deep space, ExoMars TGO in transit "
          "2016, within 25 %",
          "[secondaries][reference]") {
    // Source: Semkova et al. 2018, Icarus 303, 53 (doi 10.1016/j.icarus.2017.12.034),
    // highlights: Liulin-MO (a module of the FREND instrument on the ExoMars Trace Gas
    // Orbiter), GCR dose rate in silicon during the transit to Mars, 22 Apr - 15 Sep 2016:
    // 372 +- 37 and 390 +- 39 uGy/day in two perpendicular directions. The whole sky is open
    // (deep space). The dosimeter's own shielding inside the spacecraft is not stated in the
    // highlights: 1 and 5 g/cm2 of aluminium bracket a light one. phi = 453 MV: the mean of
    // Apr-Sep 2016 in the Usoskin et al. 2017 series (scripts/data/oulu/, the table crewdose
    // takes by date: 468, 464, 447, 464, 438, 436 MV). Measured here: 0.94-1.01 of the
    // measurement. (At phi 100 MV higher, the scale of our fits to AMS-02 spectra, the model
    // gives about 0.8: the README's phi-scale question.)
    TableLibrary tables(planner::gcr_grid());
    FragmentTransport march(tables, whole_field());
    for (const double t : {1.0, 5.0}) {
        const double D = 1e6 * gcr_behind(march, 453.0, {{"aluminium", t}}, "silicon").absorbed_Gy;
        INFO(t << " g/cm2: " << D << " uGy/day");
        CHECK(D == Approx(372.0).epsilon(0.25));
        CHECK(D == Approx(390.0).epsilon(0.25));
    }
}

TEST_CASE("secondaries: a shield far thicker than any habitat is crossed in bounded time",
          "[secondaries][robustness]") {
    // By construction: the march stops once every charged species and every neutron that can
    // still react is below 1e-30 of what entered; neutrons below the reaction threshold of
    // the cross sections neither react nor deposit dose (and never die out straight ahead).
    TableLibrary tables(planner::gcr_grid());
    FragmentTransport march(tables, whole_field(8.0));
    IonField f = gcr_free_space_field(march, 400.0);
    march.cross(f, builtin("lead"), 2.5e7);
    for (std::size_t j = 0; j < kFieldSpecies; ++j) {
        for (const double v : f.psi[j]) {
            CHECK(std::isfinite(v));
            if (j != kNeutronSpecies) {
                CHECK(v == 0.0);
            }
        }
    }
    const auto d = march.dose(f, builtin("soft-tissue"), builtin("water"));
    CHECK(d.absorbed_Gy == 0.0);
}
