#include "material_library.hpp"

#include <vector>

namespace crewdose::exposure {
namespace {

// Sources used below, named once:
//  [NIST]  NIST STAR material compositions (ICRU Report 37/49 materials; NIST SRD 124).
//  [SBS84] Sternheimer, Berger & Seltzer 1984, Atomic Data and Nuclear Data Tables 30, 261:
//          density-effect parameters -C, X0, X1, a, m, delta0.
//  [ICRU49] ICRU Report 49 (1993) low-energy fits for compounds (Andersen-Ziegler form).
//  [PNNL]  PNNL-15870 Rev. 1, Compendium of Material Composition Data for Radiation Transport
//          Modeling (2011).
//  [LSB]   Heiken, Vaniman & French, Lunar Sourcebook (1991), Table 7.15 (average soils).
// Elements without a compound value use Bragg additivity (ICRU Report 37 eq. 4.5 for I; the
// elements' ICRU 49 fits for the low-energy stopping) and the Sternheimer-Peierls recipe for the
// density effect: those materials meet the accuracy of that method, not of ICRU 49 itself.

enum : int {
    H = 1,
    Li = 3,
    B = 5,
    C = 6,
    N = 7,
    O = 8,
    Na = 11,
    Mg = 12,
    Al = 13,
    Si = 14,
    P = 15,
    S = 16,
    Cl = 17,
    Ar = 18,
    K = 19,
    Ca = 20,
    Ti = 22,
    Cr = 24,
    Mn = 25,
    Fe = 26,
    Cu = 29,
    Pb = 82
};

std::vector<Material> make_library() {
    std::vector<Material> m;
    auto add = [&m](MaterialSpec spec) {
        m.emplace_back(std::move(spec));
    };

    add({"water",
         "liquid water",
         1.0,
         {{H, 0.111894}, {O, 0.888106}},
         Phase::condensed,
         75.0,
         SternheimerParameters{3.5017, 0.2400, 2.8004, 0.09116, 3.4773, 0.0},
         CompoundLowEnergyFit{ProtonFit{4.015, 4.542, 3955.0, 484.7, 0.007904},
                              HeliumFit{2.959, 0.53255, 34.247, 60.655, 15.153}, 18.0153},
         "[NIST] composition; I = 75 eV as in ICRU 49; [SBS84]; [ICRU49] liquid-water fits"});
    add({"soft-tissue",
         "ICRU four-component soft tissue",
         1.0,
         {{H, 0.101172}, {C, 0.111000}, {N, 0.026000}, {O, 0.761828}},
         Phase::condensed,
         74.9,
         SternheimerParameters{3.5087, 0.2377, 2.7908, 0.09629, 3.4371, 0.0},
         std::nullopt,
         "[NIST] 'tissue, soft (ICRU four-component)', I = 74.9 eV; [SBS84]"});
    // [NIST] lists Zn 0.000100; crewdose carries no low-energy fit for Zn, so that share is
    // counted as Ca (a change below 0.01 % in any stopping power).
    add({"cortical-bone",
         "ICRP cortical bone",
         1.85,
         {{H, 0.047234},
          {C, 0.144330},
          {N, 0.041990},
          {O, 0.446096},
          {Mg, 0.002200},
          {P, 0.104970},
          {S, 0.003150},
          {Ca, 0.210030}},
         Phase::condensed,
         106.4,
         SternheimerParameters{3.6488, 0.1161, 3.0919, 0.06198, 3.5919, 0.0},
         std::nullopt,
         "[NIST] 'bone, cortical (ICRP)', I = 106.4 eV, Zn share counted as Ca; [SBS84]"});
    add({"aluminium",
         "aluminium",
         2.699,
         {{Al, 1.0}},
         Phase::condensed,
         166.0,
         SternheimerParameters{4.2395, 0.1708, 3.0127, 0.08024, 3.6345, 0.12},
         std::nullopt,
         "[NIST] density and I = 166 eV; [SBS84]"});
    // [PNNL] lists Zn 0.001460; counted as Cu (no Zn low-energy fit; Z 30 against 29).
    add({"al-6061",
         "aluminium alloy 6061 (aerospace structure)",
         2.70,
         {{Mg, 0.010000},
          {Al, 0.972000},
          {Si, 0.006000},
          {Ti, 0.000880},
          {Cr, 0.001950},
          {Mn, 0.000880},
          {Fe, 0.004090},
          {Cu, 0.004210}},
         Phase::condensed,
         std::nullopt,
         std::nullopt,
         std::nullopt,
         "[PNNL] 'Aluminum, alloy 6061-O', Zn share counted as Cu; I and density effect by Bragg "
         "additivity and Sternheimer-Peierls"});
    add({"polyethylene",
         "polyethylene (C2H4)n",
         0.94,
         {{H, 0.143711}, {C, 0.856289}},
         Phase::condensed,
         57.4,
         SternheimerParameters{3.0016, 0.1370, 2.5177, 0.12108, 3.4292, 0.0},
         CompoundLowEnergyFit{ProtonFit{8.646, 9.800, 7066.0, 458.1, 0.009383}, std::nullopt,
                              28.0532},
         "[NIST] composition, I = 57.4 eV; [SBS84]; [ICRU49] polyethylene proton fit"});
    add({"borated-polyethylene",
         "polyethylene with 10 % boron by mass",
         1.00,
         {{H, 0.125355}, {B, 0.100000}, {C, 0.774645}},
         Phase::condensed,
         std::nullopt,
         std::nullopt,
         std::nullopt,
         "[PNNL] 'Polyethylene, borated'; Bragg additivity"});
    add({"aramid",
         "aramid fabric, poly-p-phenylene terephthalamide C14H10N2O2",
         1.44,
         {{H, 0.042308}, {C, 0.705796}, {N, 0.117584}, {O, 0.134312}},
         Phase::condensed,
         std::nullopt,
         std::nullopt,
         std::nullopt,
         "mass fractions from the formula C14H10N2O2; density 1.44 g/cm3 (fibre, common "
         "practice); Bragg additivity"});
    add({"ceramic-fabric",
         "alumina-boria-silica ceramic fibre (62 Al2O3, 24 SiO2, 14 B2O3 wt%)",
         2.70,
         {{B, 0.043481}, {O, 0.516200}, {Al, 0.328135}, {Si, 0.112184}},
         Phase::condensed,
         std::nullopt,
         std::nullopt,
         std::nullopt,
         "manufacturer's typical-properties sheet for a 3M Nextel 312-type fibre (oxide wt% and "
         "fibre density 2.7 g/cm3); Bragg additivity"});
    add({"lithium-hydride",
         "lithium hydride",
         0.82,
         {{H, 0.126797}, {Li, 0.873203}},
         Phase::condensed,
         36.5,
         SternheimerParameters{2.358, -0.0988, 1.4515, 0.90567, 2.5849, 0.0},
         std::nullopt,
         "[NIST]/[PNNL] composition and density, I = 36.5 eV; [SBS84]"});
    add({"lead",
         "lead",
         11.35,
         {{Pb, 1.0}},
         Phase::condensed,
         823.0,
         SternheimerParameters{6.2018, 0.3776, 3.8073, 0.09359, 3.1608, 0.14},
         std::nullopt,
         "[NIST] density and I = 823 eV; [SBS84]"});
    // Regolith bulk density 1.5 g/cm3 is the commonly quoted surface value (from memory); areal
    // densities in g/cm2 do not depend on it, only thicknesses in cm do.
    add({"mare-regolith",
         "lunar mare regolith (Apollo 11 soil 10002)",
         1.5,
         {{O, 0.422591},
          {Si, 0.197455},
          {Fe, 0.119047},
          {Ca, 0.085133},
          {Al, 0.072050},
          {Mg, 0.047084},
          {Ti, 0.046796},
          {Na, 0.003490},
          {Cr, 0.002055},
          {Mn, 0.001550},
          {K, 0.001330},
          {S, 0.001201},
          {P, 0.000218}},
         Phase::condensed,
         std::nullopt,
         std::nullopt,
         std::nullopt,
         "[LSB] Apollo 11 soil oxides converted to element mass fractions; bulk density 1.5 "
         "g/cm3 (from memory); Bragg additivity"});
    add({"highland-regolith",
         "lunar highland regolith (Apollo 16 site average)",
         1.5,
         {{O, 0.449331},
          {Si, 0.208676},
          {Al, 0.143339},
          {Ca, 0.111316},
          {Fe, 0.039328},
          {Mg, 0.034100},
          {Na, 0.003385},
          {Ti, 0.003211},
          {Mn, 0.002305},
          {Cr, 0.002240},
          {K, 0.001400},
          {S, 0.000893},
          {P, 0.000476}},
         Phase::condensed,
         std::nullopt,
         std::nullopt,
         std::nullopt,
         "[LSB] Apollo 16 average soil oxides converted to element mass fractions; bulk density "
         "1.5 g/cm3 (from memory); Bragg additivity"});
    add({"mars-regolith",
         "Martian soil (Mars Pathfinder APXS soil A-4)",
         1.5,
         {{O, 0.439},
          {Si, 0.202},
          {Fe, 0.112},
          {Mg, 0.055},
          {Al, 0.055},
          {Na, 0.038},
          {Ca, 0.034},
          {S, 0.025},
          {P, 0.015},
          {Ti, 0.007},
          {Cl, 0.006},
          {K, 0.005},
          {Mn, 0.004},
          {Cr, 0.003}},
         Phase::condensed,
         std::nullopt,
         std::nullopt,
         std::nullopt,
         "Mars Pathfinder APXS preliminary element wt% for soil A-4 (JPL release, 1997; "
         "superseded by Rieder et al. 1997, Science 278, 1771); bulk density 1.5 g/cm3 (from "
         "memory); Bragg additivity"});
    // Surface density at about 640 Pa and 210 K: rho = P M / (R T) = 1.6e-5 g/cm3. Column areal
    // densities come from pressure and gravity, so this value only sets thickness in cm.
    add({"mars-atmosphere",
         "Martian atmosphere gas (CO2 95.1 %, N2 2.59 %, Ar 1.94 % by volume)",
         1.6e-5,
         {{C, 0.263466}, {N, 0.016736}, {O, 0.701922}, {Ar, 0.017876}},
         Phase::gas,
         std::nullopt,
         std::nullopt,
         std::nullopt,
         "volume mixing ratios from Trainer et al. 2019, JGR Planets 124, 3000 (Curiosity SAM); "
         "Bragg additivity"});
    add({"air",
         "dry air near sea level",
         1.20479e-3,
         {{C, 0.000124}, {N, 0.755267}, {O, 0.231781}, {Ar, 0.012827}},
         Phase::gas,
         85.7,
         SternheimerParameters{10.5961, 1.7418, 4.2759, 0.10914, 3.3994, 0.0},
         std::nullopt,
         "[NIST] 'air, dry (near sea level)', I = 85.7 eV; [SBS84]"});
    add({"silicon",
         "silicon (detector material)",
         2.33,
         {{Si, 1.0}},
         Phase::condensed,
         173.0,
         SternheimerParameters{4.4351, 0.2014, 2.8715, 0.14921, 3.2546, 0.14},
         std::nullopt,
         "[NIST] density and I = 173 eV; [SBS84]"});
    add({"carbon-composite",
         "carbon-fibre epoxy laminate (60 vol% fibre)",
         1.544,
         {{H, 0.021356}, {C, 0.922147}, {O, 0.056497}},
         Phase::condensed,
         std::nullopt,
         std::nullopt,
         std::nullopt,
         "engineering assumption, not a measured material: 60 vol% carbon fibre (1.80 g/cm3) in "
         "a bisphenol-A diglycidyl ether resin C21H24O4 (1.16 g/cm3); Bragg additivity"});
    return m;
}

} // namespace

std::span<const Material> builtin_materials() {
    static const std::vector<Material> library = make_library();
    return library;
}

const Material* find_builtin_material(std::string_view id) {
    for (const auto& m : builtin_materials()) {
        if (m.id() == id) {
            return &m;
        }
    }
    return nullptr;
}

} // namespace crewdose::exposure
