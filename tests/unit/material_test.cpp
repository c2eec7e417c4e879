#include "exposure/density_effect.hpp"
#include "exposure/material.hpp"
#include "exposure/material_library.hpp"
#include "exposure/parameter_error.hpp"

#include <catch2/catch.hpp>

#include <cmath>
#include <string>

using namespace crewdose::exposure;

namespace {
MaterialSpec spec_of(std::vector<ElementShare> comp, double density = 1.0) {
    MaterialSpec s;
    s.id = "test";
    s.name = "test";
    s.density_g_cm3 = density;
    s.composition = std::move(comp);
    return s;
}

std::string field_of_error(const MaterialSpec& s) {
    try {
        const Material m(s);
    } catch (const ParameterError& e) {
        return e.field();
    }
    return "no error";
}
} // namespace

TEST_CASE("every built-in material is valid and has a source", "[material]") {
    REQUIRE(builtin_materials().size() == 18);
    for (const auto& m : builtin_materials()) {
        INFO(m.id());
        CHECK(!m.source().empty());
        double sum = 0.0;
        for (const auto& s : m.composition()) {
            sum += s.mass_fraction;
        }
        CHECK(sum == Approx(1.0).margin(1e-3));
        CHECK(m.mean_excitation_eV() > 10.0);
        CHECK(m.z_over_a_mol_g() > 0.39);
        CHECK(m.z_over_a_mol_g() < 0.6);
    }
    CHECK(find_builtin_material("water") != nullptr);
    CHECK(find_builtin_material("unobtainium") == nullptr);
}

TEST_CASE("water's <Z/A> and plasma energy match the published values", "[material]") {
    const Material& w = *find_builtin_material("water");
    // Source: NIST ESTAR/PSTAR material table, liquid water <Z/A> = 0.55508.
    CHECK(w.z_over_a_mol_g() == Approx(0.55508).epsilon(2e-5));
    // Source: Sternheimer, Berger & Seltzer 1984 Table 1, liquid water h-bar omega_p = 21.469 eV.
    CHECK(w.plasma_energy_eV() == Approx(21.469).epsilon(1e-4));
}

TEST_CASE("the Sternheimer-Peierls recipe reproduces the tabulated C-bar", "[material]") {
    // C-bar = 2 ln(I / h-bar omega_p) + 1 is the same in both; Source: Sternheimer, Berger &
    // Seltzer 1984: water -C = 3.5017 (I 75 eV), aluminium -C = 4.2395 (I 166 eV).
    const Material& w = *find_builtin_material("water");
    const auto sp = sternheimer_peierls(75.0, w.plasma_energy_eV(), false);
    CHECK(sp.c_bar == Approx(3.5017).epsilon(1e-4));
    CHECK(sp.x1 == 2.0); // I < 100 eV branch, by the recipe
    CHECK(sp.x0 == 0.2); // C-bar < 3.681, by the recipe
    const Material& al = *find_builtin_material("aluminium");
    CHECK(sternheimer_peierls(166.0, al.plasma_energy_eV(), false).c_bar ==
          Approx(4.2395).epsilon(1e-4));
    // By construction the middle branch meets the upper one at x1 and the lower at x0.
    CHECK(sp.delta(sp.x1) == Approx(4.605170185988091 * sp.x1 - sp.c_bar).epsilon(1e-12));
    CHECK(sp.delta(sp.x0) == Approx(0.0).margin(1e-12));
}

TEST_CASE("Bragg additivity of I: electron-weighted mean of ln I", "[material]") {
    // By construction: a 50/50 mix by mass of H (I 19.2) and O (I 95) gives
    // ln I = (w_H Z/A_H ln 19.2 + w_O Z/A_O ln 95) / <Z/A>.
    const Material m(spec_of({{1, 0.5}, {8, 0.5}}));
    const double za_h = 0.5 * 1.0 / 1.00794;
    const double za_o = 0.5 * 8.0 / 15.9994;
    const double expected =
        std::exp((za_h * std::log(19.2) + za_o * std::log(95.0)) / (za_h + za_o));
    CHECK(m.mean_excitation_eV() == Approx(expected).epsilon(1e-12));
    CHECK_FALSE(m.has_own_mean_excitation());
}

TEST_CASE("bad material definitions name the field at fault", "[material]") {
    CHECK(field_of_error(spec_of({{1, 0.5}, {8, 0.4}})) == "composition"); // sums to 0.9
    CHECK(field_of_error(spec_of({{1, 0.5}, {1, 0.5}})) == "composition"); // listed twice
    CHECK(field_of_error(spec_of({{99, 1.0}})) == "composition");          // unknown element
    CHECK(field_of_error(spec_of({{1, -0.1}, {8, 1.1}})) == "mass_fraction");
    CHECK(field_of_error(spec_of({{13, 1.0}}, 0.0)) == "density_g_cm3");
    CHECK(field_of_error(spec_of({{13, 1.0}}, std::nan(""))) == "density_g_cm3");
    CHECK(field_of_error(spec_of({})) == "composition");
    CHECK(field_of_error(spec_of({{1, 0.1119}, {8, 0.8886}})) == "no error"); // within 1e-3
}
