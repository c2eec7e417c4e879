// Projectile fragmentation: the EPAX 3.1 transcription, the conservation laws of the reaction
// channels, and the depth march against the exact primaries-only transport.
#include "exposure/fragment_transport.hpp"
#include "exposure/fragmentation.hpp"
#include "exposure/gcr.hpp"
#include "exposure/material_library.hpp"
#include "exposure/nuclear.hpp"
#include "exposure/response.hpp"
#include "exposure/table_library.hpp"
#include "habitats/direction_set.hpp"
#include "planner/study/location_response.hpp"
#include "planner/study/study.hpp"

#include "free_space_dose.hpp"

#include <catch2/catch.hpp>

#include <cmath>
#include <map>
#include <string>
#include <utility>
#include <vector>

using namespace crewdose::exposure;

namespace {

const Material& builtin(const char* id) {
    return *find_builtin_material(id);
}

using Path = std::vector<std::pair<const Material*, double>>;

// The march's dose per day of the phi = 400 MV field behind `path`, scored in `medium`.
DoseQuantities march_dose(FragmentTransport& march, const Path& path, const Material& medium,
                          double phi = 400.0) {
    IonField field = gcr_free_space_field(march, phi);
    for (const auto& [m, t] : path) {
        march.cross(field, *m, t);
    }
    return march.dose(field, medium, builtin("water"));
}

// The exact primaries-only transport (response fold per nucleus), with removal or without.
DoseQuantities exact_primaries(TableLibrary& tables, const Path& path, const Material& medium,
                               double phi = 400.0, bool removal = true) {
    DoseQuantities total;
    for (const auto& p : particles()) {
        if (!gcr_nucleus_included(p.Z)) {
            continue;
        }
        LayerPath lp;
        for (const auto& [m, t] : path) {
            lp.push_back({&tables.table(*m, p), t});
        }
        const DoseMedium dm{&tables.table(medium, p), &tables.table(builtin("water"), p)};
        const PathResponse r = path_response(lp, dm, p, RbeModel{});
        const BracketedDose d = fold(r, gcr_node_fluences(p, phi, r.node_energies_MeV_per_n));
        total += removal ? d.with_removal : d.without_removal;
    }
    return total;
}

// The quick body model's GCR doses at a location, as the study computes them: one table
// library, the march with nuclear reactions (`with_reactions` its options) and the march
// without any, built-in materials by id.
class QuickModelGcr {
  public:
    explicit QuickModelGcr(const MarchOptions& with_reactions)
        : tables_(crewdose::planner::gcr_grid()), with_(tables_, with_reactions),
          without_(tables_, no_reactions()) {}

    QuickModelGcr(const QuickModelGcr&) = delete; // the marches hold the library's address
    QuickModelGcr& operator=(const QuickModelGcr&) = delete;

    // gcr_quick_model_doses at `where` over `dirs` for each phi (MV) of `phis`.
    std::map<std::pair<std::string, double>, BracketedDose>
    doses(const crewdose::planner::LocationGeometry& where,
          const std::vector<crewdose::habitats::Vector3>& dirs, const std::vector<double>& phis) {
        const crewdose::planner::GcrMarches marches{with_, without_};
        const crewdose::planner::MaterialResolver materials =
            [](const std::string& id) -> const Material& {
            return builtin(id.c_str());
        };
        return crewdose::planner::gcr_quick_model_doses(marches, materials, where, dirs, phis);
    }

  private:
    static MarchOptions no_reactions() {
        MarchOptions none;
        none.removal = false;
        return none;
    }

    TableLibrary tables_;
    FragmentTransport with_;
    FragmentTransport without_;
};

} // namespace

TEST_CASE("EPAX 3.1 against the worked example of its authors' program",
          "[fragmentation][reference]") {
    // Reference: the EPAX 3.1 program (K. Suemmerer, 15 March 2012, "as in PRC with erratum";
    // C translation by H. Weick, 2013) prints for 58Ni on 9Be -> 48Ni: sigma = 1.4075E-14 b.
    // A fragment ten neutrons from its projectile tests every branch of the charge dispersion
    // (proton-rich side beyond z0), so a slip in any constant shows.
    CHECK(epax3_cross_section_b(58, 28, 9, 48, 28) == Approx(1.4075e-14).epsilon(1e-4));
    // Outside the formula's domain: nothing heavier than the projectile, nothing at A < 1.
    CHECK(epax3_cross_section_b(58, 28, 9, 58, 28) == 0.0);
    CHECK(epax3_cross_section_b(58, 28, 9, 0.5, 1) == 0.0);
}

TEST_CASE("reaction channels conserve charge and nucleons", "[fragmentation]") {
    // By construction (conservation laws): per reaction the remnant and the emitted protons
    // carry the projectile's charge, the remnant's mean mass, the protons and the neutrons its
    // nucleons; the channel fractions are probabilities that sum to one.
    for (const auto& p : particles()) {
        if (p.Z < 2) {
            continue;
        }
        for (const double At : {1.008, 12.011, 15.999, 26.98, 55.85}) {
            INFO(std::string(p.name) << " on A = " << At);
            const ReactionChannels ch = reaction_channels(p.Z, p.A, At);
            double fractions = ch.breakup_fraction;
            double charge = ch.protons_per_reaction;
            double nucleons = ch.protons_per_reaction + ch.neutrons_per_reaction;
            for (const auto& c : ch.remnants) {
                CHECK(c.fraction >= 0.0);
                CHECK(c.Z >= 3);
                CHECK(c.Z <= p.Z);
                CHECK(c.mean_A <= p.A - (p.Z - c.Z) + 1e-12);
                fractions += c.fraction;
                charge += c.fraction * c.Z;
                nucleons += c.fraction * c.mean_A;
            }
            CHECK(ch.breakup_fraction >= 0.0);
            CHECK(ch.neutrons_per_reaction >= 0.0);
            CHECK(fractions == Approx(1.0).epsilon(1e-12));
            CHECK(charge == Approx(p.Z).epsilon(1e-12));
            CHECK(nucleons == Approx(p.A).epsilon(1e-12));
        }
    }
    // Helium and lighter break up only; a proton makes nothing the march follows.
    CHECK(reaction_channels(2, 4, 12.011).remnants.empty());
    CHECK(reaction_channels(2, 4, 12.011).protons_per_reaction == Approx(2.0));
    CHECK(reaction_channels(1, 1, 12.011).protons_per_reaction == 0.0);
}

TEST_CASE("macroscopic production carries the removed charge", "[fragmentation]") {
    // By construction: sum over fragment charges Zf of Zf times the production per g/cm2 equals
    // Zp times the removal per g/cm2, material by material and energy by energy.
    for (const char* id : {"aluminium", "polyethylene", "water", "mare-regolith"}) {
        const Material& m = builtin(id);
        for (const int Z : {2, 6, 8, 14, 26, 28}) {
            const Particle p = *particle_by_Z(Z);
            for (const double E : {50.0, 400.0, 5000.0}) {
                const auto prod = partial_production_cm2_g(m, p, E);
                double charge = 0.0;
                for (std::size_t f = 0; f < prod.size(); ++f) {
                    charge += static_cast<double>(f + 1) * prod[f];
                }
                INFO(id << " Z = " << Z << " E = " << E);
                CHECK(charge == Approx(Z * removal_cm2_g(m, p, E)).epsilon(1e-12));
            }
        }
    }
}

TEST_CASE("the march conserves charge when nothing slows down", "[fragmentation]") {
    // By construction: with stopping off every nucleus keeps its energy per nucleon, so at each
    // energy the charge in the field plus the charge removed with reacting protons (target
    // fragments are not followed) stays what it was. The march's trapezoid in depth is second
    // order, not exactly conservative: at the default 4 g/cm2 step the worst node is off by
    // 3.4e-4 in polyethylene (measured; 9.4e-5 at 2 g/cm2, 5.9e-6 at 0.5: the step squared).
    TableLibrary tables(crewdose::planner::gcr_grid());
    MarchOptions o;
    o.stopping = false;
    o.tallies = true;
    FragmentTransport march(tables, o);
    const IonField start = gcr_free_space_field(march, 400.0);
    for (const char* id : {"aluminium", "polyethylene"}) {
        IonField field = start;
        march.cross(field, builtin(id), 30.0);
        for (std::size_t m = 0; m < march.energies().size(); m += 7) {
            const double before = FragmentTransport::charge_at(start, m);
            const double after = FragmentTransport::charge_at(field, m) + field.charge_lost[m];
            INFO(id << " at " << march.energies()[m] << " MeV/n");
            CHECK(after == Approx(before).epsilon(5e-4));
        }
        // Reactions really happened: heavy primaries are down, fragments and neutrons up.
        const std::size_t m = march.energies().size() / 2;
        CHECK(field.psi[25][m] < 0.8 * start.psi[25][m]); // iron
        CHECK(field.psi[2][m] > start.psi[2][m]);         // lithium, made by fragmentation
        CHECK(field.neutrons[m] > 0.0);
    }
}

TEST_CASE("without fragments the march equals the exact primaries-only transport",
          "[fragmentation]") {
    // The exact reference path (transport.hpp: backward CSDA transport per node with removal,
    // folded per nucleus) against the march with fragment production switched off: the same
    // physics, two numerical methods. Gate 0.5 % on absorbed dose and dose equivalent.
    TableLibrary tables(crewdose::planner::gcr_grid());
    MarchOptions o;
    o.fragmentation = false;
    FragmentTransport march(tables, o);
    const Material& al = builtin("aluminium");
    const Material& pe = builtin("polyethylene");
    const Material& tissue = builtin("soft-tissue");
    for (const Path& path :
         {Path{}, Path{{&al, 1.0}, {&tissue, 0.007}}, Path{{&al, 20.0}, {&tissue, 5.0}},
          Path{{&al, 5.0}, {&pe, 30.0}, {&tissue, 0.3}}, Path{{&al, 100.0}}}) {
        const DoseQuantities exact = exact_primaries(tables, path, tissue);
        const DoseQuantities marched = march_dose(march, path, tissue);
        INFO("layers: " << path.size());
        CHECK(marched.absorbed_Gy == Approx(exact.absorbed_Gy).epsilon(5e-3));
        CHECK(marched.dose_equivalent_Sv == Approx(exact.dose_equivalent_Sv).epsilon(5e-3));
        CHECK(marched.rbe_weighted_GyEq == Approx(exact.rbe_weighted_GyEq).epsilon(5e-3));
    }
    // And with no nuclear reactions at all (the upper value of the GCR bracket), to the same
    // 0.5 %, including 200 g/cm2 of regolith where the two values differ most.
    MarchOptions none;
    none.removal = false;
    FragmentTransport unreacted(tables, none);
    const Material& regolith = builtin("mare-regolith");
    for (const Path& path :
         {Path{}, Path{{&al, 20.0}, {&tissue, 5.0}}, Path{{&regolith, 200.0}, {&tissue, 0.3}}}) {
        const DoseQuantities exact = exact_primaries(tables, path, tissue, 400.0, false);
        const DoseQuantities marched = march_dose(unreacted, path, tissue);
        INFO("layers: " << path.size());
        CHECK(marched.absorbed_Gy == Approx(exact.absorbed_Gy).epsilon(5e-3));
        CHECK(marched.dose_equivalent_Sv == Approx(exact.dose_equivalent_Sv).epsilon(5e-3));
    }
}

TEST_CASE("fragments lie between the removal bracket and the step is converged",
          "[fragmentation]") {
    // By construction of the model: a fragment carries less charge squared than its parent, so
    // the absorbed dose with fragments lies between removal without replacement and no removal
    // at all. Convergence: the default step against one eight times finer, 0.5 %.
    TableLibrary tables(crewdose::planner::gcr_grid());
    FragmentTransport march(tables);
    MarchOptions fine_o;
    fine_o.max_step_g_cm2 = march.options().max_step_g_cm2 / 8.0;
    FragmentTransport fine(tables, fine_o);
    const Material& al = builtin("aluminium");
    const Material& pe = builtin("polyethylene");
    const Material& regolith = builtin("mare-regolith");
    const Material& tissue = builtin("soft-tissue");
    for (const Path& path : {Path{{&al, 20.0}, {&tissue, 5.0}}, Path{{&pe, 40.0}, {&tissue, 0.3}},
                             Path{{&regolith, 150.0}, {&tissue, 5.0}}}) {
        const DoseQuantities with = march_dose(march, path, tissue);
        const DoseQuantities finer = march_dose(fine, path, tissue);
        CHECK(with.absorbed_Gy == Approx(finer.absorbed_Gy).epsilon(5e-3));
        CHECK(with.dose_equivalent_Sv == Approx(finer.dose_equivalent_Sv).epsilon(5e-3));

        const DoseQuantities removed = exact_primaries(tables, path, tissue);
        const DoseQuantities kept = exact_primaries(tables, path, tissue, 400.0, false);
        CHECK(with.absorbed_Gy > removed.absorbed_Gy);
        CHECK(with.absorbed_Gy < kept.absorbed_Gy);
        CHECK(with.dose_equivalent_Sv < kept.dose_equivalent_Sv);
    }
}

TEST_CASE("the march behind nothing is the free-space dose", "[fragmentation]") {
    // By construction: no layers, no reactions: the march's quadrature of the free-space field
    // against the stopping power equals a direct Simpson integral (as in gcr_test) to 0.2 %.
    TableLibrary tables(crewdose::planner::gcr_grid());
    FragmentTransport march(tables);
    const Material& water = builtin("water");
    const DoseQuantities d = march_dose(march, {}, water);
    const double direct = crewdose::test::free_space_dose_Gy_per_day(tables, water, 400.0, 0.1);
    CHECK(d.absorbed_Gy == Approx(direct).epsilon(2e-3));
}

TEST_CASE("the march's energy grid is converged, and layers split anywhere", "[fragmentation]") {
    // Convergence: the study's nodes per decade (12) against four times as many, with
    // fragments, 0.5 % (measured 0.13-0.31 % behind 20 g/cm2 aluminium and 100 g/cm2 regolith,
    // plus 5 cm tissue; 16 per decade gave 0.12-0.26 %).
    const Material& al = builtin("aluminium");
    const Material& regolith = builtin("mare-regolith");
    const Material& tissue = builtin("soft-tissue");
    EnergyGridSpec fine_grid = crewdose::planner::gcr_grid();
    fine_grid.nodes_per_decade *= 4;
    TableLibrary coarse_tables(crewdose::planner::gcr_grid());
    TableLibrary fine_tables(fine_grid);
    FragmentTransport coarse(coarse_tables);
    FragmentTransport fine(fine_tables);
    for (const Path& path :
         {Path{{&al, 20.0}, {&tissue, 5.0}}, Path{{&regolith, 100.0}, {&tissue, 5.0}}}) {
        const DoseQuantities c = march_dose(coarse, path, tissue);
        const DoseQuantities f = march_dose(fine, path, tissue);
        CHECK(c.absorbed_Gy == Approx(f.absorbed_Gy).epsilon(5e-3));
        CHECK(c.dose_equivalent_Sv == Approx(f.dose_equivalent_Sv).epsilon(5e-3));
    }
    // One layer crossed in one call or in pieces: the same to 0.1 % (each call starts with its
    // own part-step, so the steps differ; measured 0.02 % for 3 + 7 against 10).
    const DoseQuantities whole = march_dose(coarse, {{&al, 10.0}, {&tissue, 5.0}}, tissue);
    const DoseQuantities split =
        march_dose(coarse, {{&al, 3.0}, {&al, 7.0}, {&tissue, 5.0}}, tissue);
    CHECK(split.dose_equivalent_Sv == Approx(whole.dose_equivalent_Sv).epsilon(1e-3));
    CHECK(split.absorbed_Gy == Approx(whole.absorbed_Gy).epsilon(1e-3));
    // A zero layer changes nothing; a negative or non-finite one is a caller error.
    IonField field = gcr_free_space_field(coarse, 400.0);
    const IonField before = field;
    coarse.cross(field, al, 0.0);
    CHECK(field.psi == before.psi);
    CHECK_THROWS_AS(coarse.cross(field, al, -5.0), std::invalid_argument);
    CHECK_THROWS_AS(coarse.cross(field, al, std::nan("")), std::invalid_argument);
    // A step so long that the implicit neutron-removal term would divide by zero is refused.
    MarchOptions too_long;
    too_long.max_step_g_cm2 = 150.0;
    FragmentTransport refused(coarse_tables, too_long);
    IonField f2 = gcr_free_space_field(refused, 400.0);
    CHECK_THROWS_AS(refused.cross(f2, builtin("polyethylene"), 1.0), std::invalid_argument);
}

TEST_CASE("GCR annual dose equivalent behind aluminium against a published calculation",
          "[fragmentation][reference]") {
    // Reference: Badhwar, Cucinotta & O'Neill 1993 (Radiat. Res. 134, 9; from the abstract):
    // with the 1976-77 solar-minimum spectra and ICRP 26 quality factors, 9 g/cm2 of aluminium
    // keeps the annual dose equivalent below 0.6 Sv and 17.5 g/cm2 below 0.5 Sv; ICRP 60
    // factors give about 15 % more, so about 0.69 and 0.58 Sv. The abstract does not state the
    // dose point; we take 5 cm of tissue (BFO) and phi = 400 MV (our estimate of that minimum
    // in the Burger-LIS convention). Gate: the march with nuclear reactions lies below the
    // published values (it lacks the secondary nucleons and target fragments the published
    // calculation carries, and falls too fast with thickness); the march without reactions,
    // the value limits use, lies within 20 % of them. As measured when this test was written:
    // 0.41 and 0.29 Sv with reactions, 0.61 and 0.53 Sv without (11 % and 9 % under).
    TableLibrary tables(crewdose::planner::gcr_grid());
    FragmentTransport with_reactions(tables);
    MarchOptions none;
    none.removal = false;
    FragmentTransport without_reactions(tables, none);
    const Material& al = builtin("aluminium");
    const Material& tissue = builtin("soft-tissue");
    for (const auto& [t, published_Sv] :
         {std::pair{9.0, 0.6 * 1.15}, std::pair{17.5, 0.5 * 1.15}}) {
        const Path path{{&al, t}, {&tissue, 5.0}};
        const double low = 365.25 * march_dose(with_reactions, path, tissue).dose_equivalent_Sv;
        const double high = 365.25 * march_dose(without_reactions, path, tissue).dose_equivalent_Sv;
        INFO(t << " g/cm2: " << low << " .. " << high << " Sv/yr");
        CHECK(low < published_Sv);
        CHECK(high == Approx(published_Sv).epsilon(0.20));
    }
}

TEST_CASE("GCR mean quality factor behind 1 g/cm2 aluminium at solar minimum",
          "[fragmentation][reference]") {
    // Common practice: the mean quality factor (ICRP 60 Q(L)) of the GCR behind thin shielding
    // at solar minimum is about 2.5 to 4.5 (no single source; measured on the lunar surface by
    // Chang'E-4's dosimeter: about 4.3, Zhang et al. 2020, from memory). Gate: at the blood-
    // forming organs (5 cm of tissue) behind 1 g/cm2 aluminium, phi = 400 MV, with nuclear
    // reactions, the range 2.5-4.5. As measured: 4.23 at 5 cm and 5.30 at the skin
    // (4.46 and 5.62 before helium was fitted to AMS-02). The skin lies above the range because the
    // model lacks the low-LET secondaries and because the heavy ions stopping near the surface
    // carry Q of 10-30: it is gated only to lie above the 5 cm value and below 7.
    TableLibrary tables(crewdose::planner::gcr_grid());
    FragmentTransport march(tables);
    const Material& al = builtin("aluminium");
    const Material& tissue = builtin("soft-tissue");
    const auto mean_q = [&](double tissue_g_cm2) {
        const DoseQuantities d = march_dose(march, {{&al, 1.0}, {&tissue, tissue_g_cm2}}, tissue);
        return d.dose_equivalent_Sv / d.absorbed_Gy;
    };
    const double bfo = mean_q(5.0);
    const double skin = mean_q(0.007);
    INFO("mean Q: " << bfo << " at 5 cm, " << skin << " at the skin");
    CHECK(bfo > 2.5);
    CHECK(bfo < 4.5);
    CHECK(skin > bfo);
    CHECK(skin < 7.0);
}

TEST_CASE("a phi given twice is counted once", "[fragmentation]") {
    // By construction: the organ doses for {400, 400} equal those for {400}.
    QuickModelGcr gcr{MarchOptions{}};
    crewdose::planner::LocationGeometry where;
    where.shell = {{"aluminium", 5.0}};
    const auto dirs = crewdose::habitats::fibonacci_directions(16);
    const auto a = gcr.doses(where, dirs, {400.0});
    const auto b = gcr.doses(where, dirs, {400.0, 400.0});
    REQUIRE(a.size() == b.size());
    for (const auto& [key, d] : a) {
        CHECK(b.at(key).with_removal.dose_equivalent_Sv == d.with_removal.dose_equivalent_Sv);
        CHECK(b.at(key).without_removal.absorbed_Gy == d.without_removal.absorbed_Gy);
    }
}

TEST_CASE("phi values marched together equal each marched alone bit for bit", "[fragmentation]") {
    // The fields cross each layer one after another and share its step map: every number
    // must be the one a march of that field alone gives.
    QuickModelGcr gcr{crewdose::planner::gcr_march_options()};
    crewdose::planner::LocationGeometry where;
    where.shell = {{"aluminium", 5.0}, {"polyethylene", 5.0}}; // one step length, two maps
    const auto dirs = crewdose::habitats::fibonacci_directions(12);
    const std::vector<double> both{400.0, 900.0};
    const auto together = gcr.doses(where, dirs, both);
    for (const double phi : both) {
        const auto alone = gcr.doses(where, dirs, {phi});
        REQUIRE(!alone.empty());
        for (const auto& [key, d] : alone) {
            const auto& t = together.at(key);
            CHECK(t.with_removal.absorbed_Gy == d.with_removal.absorbed_Gy);
            CHECK(t.with_removal.dose_equivalent_Sv == d.with_removal.dose_equivalent_Sv);
            CHECK(t.without_removal.absorbed_Gy == d.without_removal.absorbed_Gy);
            CHECK(t.without_removal.rbe_weighted_GyEq == d.without_removal.rbe_weighted_GyEq);
        }
    }
}

TEST_CASE("a material's march data shared between marches give the same field", "[fragmentation]") {
    // The data of a material are computed once per process and copied into every march that
    // needs them; the range tables stay each march's own. The first march and its library are
    // gone before the second crosses (a table of the first would be a dangling one).
    const Path path{{&builtin("aluminium"), 6.5}, {&builtin("soft-tissue"), 2.25}};
    MarchOptions o = crewdose::planner::gcr_march_options();
    IonField first_field;
    DoseQuantities first_dose;
    {
        TableLibrary tables(crewdose::planner::gcr_grid());
        FragmentTransport march(tables, o);
        first_field = gcr_free_space_field(march, 500.0);
        for (const auto& [m, t] : path) {
            march.cross(first_field, *m, t);
        }
        first_dose = march.dose(first_field, builtin("soft-tissue"), builtin("water"));
    }
    TableLibrary tables(crewdose::planner::gcr_grid());
    FragmentTransport march(tables, o);
    IonField field = gcr_free_space_field(march, 500.0);
    for (const auto& [m, t] : path) {
        march.cross(field, *m, t);
    }
    CHECK(field.psi == first_field.psi);
    CHECK(march.dose(field, builtin("soft-tissue"), builtin("water")).dose_equivalent_Sv ==
          first_dose.dose_equivalent_Sv);
    // Options that change the data get their own: a lower cut for local deposits transports
    // more of the slow secondaries, and the dose changes.
    MarchOptions lower = o;
    lower.local_below_MeV_per_n = 2.0;
    FragmentTransport other(tables, lower);
    IonField other_field = gcr_free_space_field(other, 500.0);
    for (const auto& [m, t] : path) {
        other.cross(other_field, *m, t);
    }
    const double other_H =
        other.dose(other_field, builtin("soft-tissue"), builtin("water")).dose_equivalent_Sv;
    CHECK(other_H != first_dose.dose_equivalent_Sv);
    CHECK(std::fabs(other_H / first_dose.dose_equivalent_Sv - 1.0) < 0.2);
}
