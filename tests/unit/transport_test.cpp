// Transport along layer paths: manufactured solutions, conservation, layer properties.
#include "exposure/material_library.hpp"
#include "exposure/nuclear.hpp"
#include "exposure/transport.hpp"

#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>
#include <vector>

using namespace crewdose::exposure;

namespace {

// A power-law range R = a E^p (g/cm2, E in MeV): S = dE/dR = 1 / (a p E^(p-1)).
constexpr double kA = 2.2e-3;
constexpr double kP = 1.77;

RangeTable power_law_table() {
    return RangeTable::from_stopping_law(
        "power-law", proton(), [](double E) { return 1.0 / (kA * kP * std::pow(E, kP - 1.0)); },
        kA * std::pow(0.01, kP));
}

// A curved law: R = a1 E^p1 + a2 E^p2.
constexpr double kA1 = 3.0e-3, kP1 = 1.6, kA2 = 4.0e-4, kP2 = 2.0;
double curved_range(double E) {
    return kA1 * std::pow(E, kP1) + kA2 * std::pow(E, kP2);
}
double curved_stopping(double E) {
    return 1.0 / (kA1 * kP1 * std::pow(E, kP1 - 1.0) + kA2 * kP2 * std::pow(E, kP2 - 1.0));
}
// The reference inverse: bisection on the closed-form R to 1e-14 relative.
double curved_energy(double R) {
    double lo = 0.0;
    double hi = 2.0e5;
    for (int i = 0; i < 200; ++i) {
        const double mid = 0.5 * (lo + hi);
        (curved_range(mid) < R ? lo : hi) = mid;
    }
    return 0.5 * (lo + hi);
}

} // namespace

TEST_CASE("power-law range: transmitted spectrum matches the closed form", "[transport]") {
    // Source: by construction. E0 = ((a E^p + t) / a)^(1/p) and
    // phi(E, t) = phi0(E0) S(E0) / S(E); with a power-law spectrum phi0 = E^-2.5.
    const RangeTable t = power_law_table();
    const double thickness = 7.5;
    const LayerPath path{{&t, thickness}};
    for (double E : {0.05, 1.0, 10.0, 100.0, 1000.0}) {
        const double E0 = std::pow((kA * std::pow(E, kP) + thickness) / kA, 1.0 / kP);
        const BackwardResult b = transport_backward(path, E, Removal::without);
        REQUIRE(b.reachable);
        CHECK(b.incident_MeV_per_n == Approx(E0).epsilon(1e-6));
        const double S = [](double x) {
            return 1.0 / (kA * kP * std::pow(x, kP - 1.0));
        }(E);
        const double S0 = 1.0 / (kA * kP * std::pow(E0, kP - 1.0));
        const double phi_expected = std::pow(E0, -2.5) * S0 / S;
        CHECK(std::pow(b.incident_MeV_per_n, -2.5) * b.jacobian ==
              Approx(phi_expected).epsilon(1e-6));
        // Forward from E0 lands back on E. The residual range R(E0) - t loses the table's
        // relative precision (1e-8 of R(E0)) to cancellation, so compare ranges with that margin.
        const ForwardResult f = transport_forward(path, E0, Removal::without);
        CHECK_FALSE(f.stopped);
        CHECK(t.range_g_cm2(f.exit_energy_MeV_per_n) ==
              Approx(kA * std::pow(E, kP)).margin(1e-8 * (thickness + kA * std::pow(E, kP))));
    }
}

TEST_CASE("curved range law: transport matches a high-precision root finder", "[transport]") {
    // Source: by construction; log-log interpolation is not exact for a sum of two power laws,
    // so this measures the table's interpolation error (tolerance 1e-4).
    const RangeTable t =
        RangeTable::from_stopping_law("curved", proton(), curved_stopping, curved_range(0.01));
    for (double thickness : {0.3, 4.0, 60.0}) {
        const LayerPath path{{&t, thickness}, {&t, 0.5 * thickness}};
        for (double E : {0.2, 3.0, 40.0, 500.0}) {
            const double E0 = curved_energy(curved_range(E) + 1.5 * thickness);
            const BackwardResult b = transport_backward(path, E, Removal::without);
            REQUIRE(b.reachable);
            CHECK(b.incident_MeV_per_n == Approx(E0).epsilon(1e-4));
            CHECK(b.jacobian == Approx(curved_stopping(E0) / curved_stopping(E)).epsilon(1e-4));
        }
    }
}

TEST_CASE("layer properties: zero thickness, splitting, order", "[transport]") {
    const Material& al = *find_builtin_material("aluminium");
    const Material& pe = *find_builtin_material("polyethylene");
    const RangeTable tal = with_proton_removal(RangeTable(al, proton()), al);
    const RangeTable tpe = with_proton_removal(RangeTable(pe, proton()), pe);
    for (double E0 : {20.0, 150.0, 900.0}) {
        // Zero thickness returns the input (by construction).
        const ForwardResult zero = transport_forward(LayerPath{{&tal, 0.0}}, E0, Removal::with);
        CHECK(zero.exit_energy_MeV_per_n == E0);
        CHECK(zero.survival == 1.0);
        // Two layers of one material equal one of the summed thickness (1e-9).
        const ForwardResult one = transport_forward(LayerPath{{&tal, 5.0}}, E0, Removal::with);
        const ForwardResult two =
            transport_forward(LayerPath{{&tal, 2.0}, {&tal, 3.0}}, E0, Removal::with);
        REQUIRE(one.stopped == two.stopped);
        if (!one.stopped) {
            CHECK(two.exit_energy_MeV_per_n == Approx(one.exit_energy_MeV_per_n).epsilon(1e-9));
            CHECK(two.survival == Approx(one.survival).epsilon(1e-9));
        }
    }
    // Order matters for mixed materials: the exit energies of Al then PE and PE then Al differ,
    // and the code follows the order given.
    const double E0 = 150.0;
    const ForwardResult ap =
        transport_forward(LayerPath{{&tal, 5.0}, {&tpe, 5.0}}, E0, Removal::without);
    const ForwardResult pa =
        transport_forward(LayerPath{{&tpe, 5.0}, {&tal, 5.0}}, E0, Removal::without);
    REQUIRE_FALSE(ap.stopped);
    REQUIRE_FALSE(pa.stopped);
    CHECK(std::abs(ap.exit_energy_MeV_per_n / pa.exit_energy_MeV_per_n - 1.0) > 1e-3);
    // By hand: first layer first.
    const double E1 = tal.energy_MeV_per_n(tal.range_g_cm2(E0) - 5.0);
    const double E2 = tpe.energy_MeV_per_n(tpe.range_g_cm2(E1) - 5.0);
    CHECK(ap.exit_energy_MeV_per_n == Approx(E2).epsilon(1e-12));
}

TEST_CASE("conservation of particles forwards and backwards", "[transport]") {
    // By construction: the particles that reach the dose point, counted forwards over incident
    // energies (survival-weighted), equal the integral of the transmitted spectrum over exit
    // energies counted backwards; the rest stopped or were removed.
    const Material& al = *find_builtin_material("aluminium");
    const RangeTable t = with_proton_removal(RangeTable(al, proton()), al);
    const LayerPath path{{&t, 12.0}};
    auto phi_in = [](double E0) {
        return std::pow(E0, -2.0);
    }; // per MeV, 1 to 1e4 MeV
    for (Removal removal : {Removal::without, Removal::with}) {
        const int n = 20000;
        // Forward in incident energy, Simpson in ln E0 from 1 to 1e4 MeV.
        const double lo = std::log(1.0);
        const double hi = std::log(1.0e4);
        double transmitted_fwd = 0.0;
        double removed = 0.0;
        double stopped = 0.0;
        double incident = 0.0;
        for (int i = 0; i <= n; ++i) {
            const double E0 = std::exp(lo + (hi - lo) * i / n);
            const double w = (i == 0 || i == n ? 1.0 : (i % 2 ? 4.0 : 2.0)) * (hi - lo) / n / 3.0;
            const double dN = w * E0 * phi_in(E0);
            const ForwardResult f = transport_forward(path, E0, removal);
            incident += dN;
            if (f.stopped) {
                stopped += dN;
            } else {
                transmitted_fwd += dN * f.survival;
                removed += dN * (1.0 - f.survival);
            }
        }
        // Backward over exit energies up to the exit energy of 1e4 MeV.
        const double top = transport_forward(path, 1.0e4, Removal::without).exit_energy_MeV_per_n;
        const double elo = std::log(t.min_energy_MeV_per_n());
        const double ehi = std::log(top);
        double transmitted_bwd = 0.0;
        for (int i = 0; i <= n; ++i) {
            const double E = std::exp(elo + (ehi - elo) * i / n);
            const double w = (i == 0 || i == n ? 1.0 : (i % 2 ? 4.0 : 2.0)) * (ehi - elo) / n / 3.0;
            const BackwardResult b = transport_backward(path, E, removal);
            if (b.reachable) {
                transmitted_bwd += w * E * phi_in(b.incident_MeV_per_n) * b.jacobian * b.survival;
            }
        }
        CHECK(transmitted_bwd == Approx(transmitted_fwd).epsilon(2e-4));
        CHECK(transmitted_fwd + stopped + removed == Approx(incident).epsilon(1e-12));
        CHECK((removal == Removal::with ? removed > 0.0 : removed == 0.0));
    }
}

TEST_CASE("energy balance in a thin layer", "[transport]") {
    // By construction: for a thin layer the energy lost, integral phi_in (E0 - E_exit) dE0,
    // equals t times integral phi S dE to first order in t (t = 0.001 g/cm2, spectrum 10 MeV
    // up; the second-order term, t S |dS/dE| / 2 relative, is below 0.1 % here).
    const Material& w = *find_builtin_material("water");
    const RangeTable t(w, proton());
    const double thickness = 0.001;
    const LayerPath path{{&t, thickness}};
    const int n = 4000;
    const double lo = std::log(10.0);
    const double hi = std::log(1.0e4);
    double lost = 0.0;
    double expected = 0.0;
    for (int i = 0; i <= n; ++i) {
        const double E0 = std::exp(lo + (hi - lo) * i / n);
        const double wgt = (i == 0 || i == n ? 1.0 : (i % 2 ? 4.0 : 2.0)) * (hi - lo) / n / 3.0;
        const double phi = std::pow(E0, -2.0);
        const ForwardResult f = transport_forward(path, E0, Removal::without);
        lost += wgt * E0 * phi * (E0 - f.exit_energy_MeV_per_n);
        expected += wgt * E0 * phi * thickness * t.stopping_MeV_cm2_g(E0);
    }
    CHECK(lost == Approx(expected).epsilon(2e-3));
}

TEST_CASE("the fast backward paths equal the one-energy reference", "[transport]") {
    // By construction: the hinted look-ups and the layer-by-layer sweep are reorderings of the
    // same arithmetic as transport_backward_log() without hints, so the results agree to
    // rounding (1e-13 relative) at every grid node, including where the sweep stops.
    const Material& al = *find_builtin_material("aluminium");
    const Material& pe = *find_builtin_material("polyethylene");
    const RangeTable tal = with_proton_removal(RangeTable(al, proton()), al);
    const RangeTable tpe = with_proton_removal(RangeTable(pe, proton()), pe);
    for (const double thick : {0.0, 0.3, 7.0, 400.0}) {
        const LayerPath path{{&tal, thick}, {&tpe, 2.0}, {&tal, 0.5 * thick}};
        const LogGrid& g = tal.grid();
        std::vector<double> log_exits;
        for (std::size_t j = 0; j < g.size(); ++j) {
            log_exits.push_back(g.log_node(j));
        }
        const auto sweep = transport_backward_sweep(path, log_exits, Removal::with);
        std::vector<std::size_t> hints(path.size(), 0);
        std::size_t reachable = 0;
        for (std::size_t j = 0; j < g.size(); ++j) {
            const BackwardResult ref = transport_backward_log(path, log_exits[j], Removal::with);
            const BackwardResult hinted =
                transport_backward_log(path, log_exits[j], Removal::with, hints);
            REQUIRE(hinted.reachable == ref.reachable);
            if (!ref.reachable) {
                continue;
            }
            ++reachable;
            CHECK(hinted.incident_MeV_per_n == Approx(ref.incident_MeV_per_n).epsilon(1e-13));
            REQUIRE(j < sweep.size());
            CHECK(sweep[j].incident_MeV_per_n == Approx(ref.incident_MeV_per_n).epsilon(1e-13));
            CHECK(sweep[j].jacobian == Approx(ref.jacobian).epsilon(1e-13));
            CHECK(sweep[j].survival == Approx(ref.survival).epsilon(1e-13));
        }
        CHECK(sweep.size() == reachable);
        CHECK(reachable > 0);
        if (thick == 400.0) {
            CHECK(reachable < g.size()); // the sweep's early stop is exercised
        }
    }
}

TEST_CASE("hinted range look-ups from any hint equal the search", "[range]") {
    const RangeTable t(*find_builtin_material("water"), proton());
    const auto& lr = t.log_range_nodes();
    for (const std::size_t start : {std::size_t{0}, std::size_t{3}, lr.size() / 2, lr.size()}) {
        for (std::size_t i = 0; i < lr.size(); i += 7) {
            for (const double y : {lr[i], lr[std::min(i + 1, lr.size() - 1)] - 1e-9}) {
                std::size_t hint = start;
                const auto a = t.cursor_at_log_range(y, hint);
                const auto b = t.cursor_at_log_range(y);
                CHECK(a.interval == b.interval);
                CHECK(a.log_E == b.log_E);
                CHECK(hint == a.interval);
            }
        }
    }
}
