#include "nucleon_production.hpp"

#include "element.hpp"
#include "nucleon_fit_data.hpp"

#include <algorithm>
#include <cmath>
#include <optional>
#include <stdexcept>

namespace crewdose::exposure {
namespace {

constexpr std::size_t kBins = 61;       // [0, 0.1 MeV) and 60 bins of 10 per decade to 100 GeV
constexpr std::size_t kCascadeBin = 24; // first bin at or above kCascadeFrom_MeV
constexpr std::size_t kN = static_cast<std::size_t>(LightParticle::neutron);
constexpr std::size_t kP = static_cast<std::size_t>(LightParticle::proton);
constexpr std::size_t kT = static_cast<std::size_t>(LightParticle::triton);
constexpr std::size_t kH = static_cast<std::size_t>(LightParticle::helion);
// A table is used for its element only if it reaches this far (He-4, Li and B files stop at
// 34 MeV or below; Be's at 113 MeV).
constexpr double kUsableTableTop_MeV = 100.0;

const std::vector<double>& edges() {
    static const std::vector<double> e = [] {
        std::vector<double> v{0.0};
        for (std::size_t k = 0; k < kBins; ++k) {
            v.push_back(0.1 * std::pow(10.0, static_cast<double>(k) / 10.0));
        }
        return v;
    }();
    return e;
}

double mid(std::size_t i) {
    return 0.5 * (edges()[i] + edges()[i + 1]);
}

using Spectrum = std::array<std::vector<double>, kLightParticles>;

Spectrum zeros() {
    Spectrum s;
    for (auto& v : s) {
        v.assign(kBins, 0.0);
    }
    return s;
}

// A yield before its energy and charge are closed.
struct Raw {
    Spectrum fwd = zeros();
    Spectrum bwd = zeros();
    double recoil_MeV = 0.0;
    double q_MeV = 0.0;

    void add(const Raw& o, double w) {
        for (std::size_t j = 0; j < kLightParticles; ++j) {
            for (std::size_t i = 0; i < kBins; ++i) {
                fwd[j][i] += w * o.fwd[j][i];
                bwd[j][i] += w * o.bwd[j][i];
            }
        }
        recoil_MeV += w * o.recoil_MeV;
        q_MeV += w * o.q_MeV;
    }
    [[nodiscard]] double total(std::size_t j, std::size_t from, std::size_t to) const {
        double s = 0.0;
        for (std::size_t i = from; i < to; ++i) {
            s += fwd[j][i] + bwd[j][i];
        }
        return s;
    }
    [[nodiscard]] double nucleons() const {
        double s = 0.0;
        for (std::size_t j = 0; j < kLightParticles; ++j) {
            s += light_particle_A(static_cast<LightParticle>(j)) * total(j, 0, kBins);
        }
        return s;
    }
};

// Charge symmetry: the reaction of the mirror projectile, neutrons and protons (and tritons
// and helions) exchanged.
void mirror(Raw& r) {
    std::swap(r.fwd[kN], r.fwd[kP]);
    std::swap(r.bwd[kN], r.bwd[kP]);
    std::swap(r.fwd[kT], r.fwd[kH]);
    std::swap(r.bwd[kT], r.bwd[kH]);
}

double table_top(const EndfTable& t) {
    return t.incident.empty() ? 0.0 : t.incident.back().energy_MeV;
}

// The proton table used for element Z: its own if it reaches kUsableTableTop_MeV, else the
// nearest element's by Z that does (ties: the one reaching higher, then the lower Z).
std::optional<EndfTable> proton_table(int Z) {
    std::optional<EndfTable> best;
    int best_distance = 1000;
    for (int other = 1; other <= 100; ++other) {
        const auto t = endf_table(other, false);
        if (!t || table_top(*t) < kUsableTableTop_MeV) {
            continue;
        }
        const int d = std::abs(other - Z);
        if (d < best_distance || (d == best_distance && table_top(*t) > table_top(*best))) {
            best = t;
            best_distance = d;
        }
    }
    return best;
}

// One incident energy of a table, per reaction on our bins.
Raw at_incident(const EndfTable& t, std::size_t k) {
    Raw r;
    const EndfIncident& in = t.incident[k];
    if (!(in.nonelastic_mb > 0.0)) {
        return r;
    }
    const auto table_edges = endf_outgoing_edges_MeV();
    for (std::size_t j = 0; j < kLightParticles; ++j) {
        const auto& ds = in.dsigma_dE_mb_per_MeV[j];
        const auto& share = in.forward_share[j];
        for (std::size_t i = 0; i < ds.size() && i < kBins; ++i) {
            const double width = table_edges[i + 1] - table_edges[i];
            const double y = static_cast<double>(ds[i]) * width / in.nonelastic_mb;
            const double f = i < share.size() ? static_cast<double>(share[i]) : 0.5;
            r.fwd[j][i] = y * f;
            r.bwd[j][i] = y * (1.0 - f);
        }
    }
    r.recoil_MeV = in.recoil_mb_MeV / in.nonelastic_mb;
    r.q_MeV = in.q_mass_MeV;
    return r;
}

// The table at energy E (inside its range), linear in E between its incident energies.
Raw evaluated(const EndfTable& t, double E) {
    const auto& in = t.incident;
    if (in.empty() || E < in.front().energy_MeV) {
        return {};
    }
    std::size_t k = 0;
    while (k + 2 < in.size() && E > in[k + 1].energy_MeV) {
        ++k;
    }
    if (in.size() == 1) {
        return at_incident(t, 0);
    }
    const double w =
        std::clamp((E - in[k].energy_MeV) / (in[k + 1].energy_MeV - in[k].energy_MeV), 0.0, 1.0);
    Raw r;
    r.add(at_incident(t, k), 1.0 - w);
    r.add(at_incident(t, k + 1), w);
    return r;
}

// Integral of E'/T^2 exp(-E'/T) from a to b.
double evaporation_integral(double T, double a, double b) {
    auto F = [T](double x) {
        return -(1.0 + x / T) * std::exp(-x / T);
    };
    return F(b) - F(a);
}

// The fitted neutron yield per reaction in each bin (nucleon_fit_data.hpp).
std::vector<double> fitted_neutrons(double A, double E) {
    using namespace nucleon_fit;
    const double r = E / 1000.0;
    const double T1 = t1 * std::pow(A, t1b);
    const double T3 = t3 * std::pow(r, g3);
    const double M1 = c1 * std::pow(A, a1) * std::pow(r, b1);
    const double M2 = c2 * std::pow(A, a2) * std::pow(r, b2);
    const double M3 = c3 * std::pow(A, a3) * std::pow(r, b3);
    std::vector<double> y(kBins, 0.0);
    for (std::size_t i = 0; i < kBins; ++i) {
        const double a = edges()[i];
        const double b = edges()[i + 1];
        y[i] = M1 * evaporation_integral(T1, a, b) + M2 * evaporation_integral(t2, a, b);
        if (a < E) {
            y[i] +=
                M3 * (std::exp(-a / T3) - std::exp(-std::min(b, E) / T3)) / -std::expm1(-E / T3);
        }
    }
    return y;
}

// Forward share of cascade particles at outgoing energy E' (the fit's table, linear in ln E',
// held at its ends).
double cascade_forward_share(double Eout) {
    using namespace nucleon_fit;
    constexpr std::size_t n = std::size(kForwardShare);
    if (Eout <= kForwardEnergy_MeV[0]) {
        return kForwardShare[0];
    }
    for (std::size_t k = 0; k + 1 < n; ++k) {
        if (Eout <= kForwardEnergy_MeV[k + 1]) {
            const double u = std::log(Eout / kForwardEnergy_MeV[k]) /
                             std::log(kForwardEnergy_MeV[k + 1] / kForwardEnergy_MeV[k]);
            return kForwardShare[k] + u * (kForwardShare[k + 1] - kForwardShare[k]);
        }
    }
    return kForwardShare[n - 1];
}

// The proton-induced high-energy model at E (>= kFitFrom_MeV) on mass number A, with `ref`,
// the proton-induced evaluation at its top energy, for the other particles' ratios.
Raw fitted(double A, double E, const Raw& ref, double ref_E) {
    Raw r;
    const auto n_E = fitted_neutrons(A, E);
    const auto n_ref = fitted_neutrons(A, ref_E);
    double slow_E = 0.0;
    double slow_ref = 0.0;
    for (std::size_t i = 0; i < kCascadeBin; ++i) {
        slow_E += n_E[i];
        slow_ref += n_ref[i];
    }
    // Evaporation grows with the residual's excitation: the fit's neutrons say by how much.
    const double growth = slow_ref > 0.0 ? slow_E / slow_ref : 1.0;
    const double fast_n_ref = ref.total(kN, kCascadeBin, kBins);
    for (std::size_t j = 0; j < kLightParticles; ++j) {
        const double ratio =
            j == kN ? 1.0
                    : (fast_n_ref > 0.0 ? ref.total(j, kCascadeBin, kBins) / fast_n_ref : 0.0);
        for (std::size_t i = 0; i < kBins; ++i) {
            double y = 0.0;
            double f = 0.5;
            const double ref_bin = ref.fwd[j][i] + ref.bwd[j][i];
            if (i < kCascadeBin) {
                y = j == kN ? n_E[i] : growth * ref_bin;
                if (ref_bin > 0.0) {
                    f = ref.fwd[j][i] / ref_bin;
                }
            } else {
                y = ratio * n_E[i];
                f = cascade_forward_share(mid(i));
            }
            r.fwd[j][i] = y * f;
            r.bwd[j][i] = y * (1.0 - f);
        }
    }
    r.recoil_MeV = growth * ref.recoil_MeV;
    const double ref_nucleons = ref.nucleons();
    r.q_MeV = ref_nucleons > 0.0 ? ref.q_MeV * r.nucleons() / ref_nucleons : ref.q_MeV;
    return r;
}

// Charge and energy closure (see the header).
ReactionYield close(Raw raw, double E, double charge_in) {
    ReactionYield y;
    y.charge_in = charge_in;
    y.q_MeV = raw.q_MeV;
    y.forward = std::move(raw.fwd);
    y.backward = std::move(raw.bwd);
    y.recoil_MeV = std::max(0.0, raw.recoil_MeV);
    auto scale_where = [&](auto keep, double f) {
        for (std::size_t j = 0; j < kLightParticles; ++j) {
            if (!keep(j)) {
                continue;
            }
            for (std::size_t i = 0; i < kBins; ++i) {
                y.forward[j][i] *= f;
                y.backward[j][i] *= f;
            }
        }
    };
    const double charge = y.light_charge();
    if (charge > charge_in && charge > 0.0) {
        scale_where(
            [](std::size_t j) { return light_particle_Z(static_cast<LightParticle>(j)) > 0; },
            charge_in / charge);
    }
    y.residual_charge = std::max(0.0, charge_in - y.light_charge());
    y.available_MeV = std::max(0.0, E + y.q_MeV);
    const double carried = y.light_MeV() + y.recoil_MeV;
    if (carried > y.available_MeV && carried > 0.0) {
        const double f = y.available_MeV / carried;
        scale_where([](std::size_t) { return true; }, f);
        y.recoil_MeV *= f;
        y.residual_charge = std::max(0.0, charge_in - y.light_charge());
        y.other_MeV = std::max(0.0, y.available_MeV - y.light_MeV() - y.recoil_MeV);
    } else {
        y.other_MeV = y.available_MeV - carried;
    }
    return y;
}

} // namespace

std::span<const double> yield_edges_MeV() {
    return edges();
}

int light_particle_A(LightParticle p) {
    constexpr std::array<int, kLightParticles> A{1, 1, 2, 3, 3, 4};
    return A[static_cast<std::size_t>(p)];
}

int light_particle_Z(LightParticle p) {
    constexpr std::array<int, kLightParticles> Z{0, 1, 1, 1, 2, 2};
    return Z[static_cast<std::size_t>(p)];
}

double ReactionYield::light_MeV() const {
    double s = 0.0;
    for (std::size_t j = 0; j < kLightParticles; ++j) {
        for (std::size_t i = 0; i < forward[j].size(); ++i) {
            s += (forward[j][i] + backward[j][i]) * mid(i);
        }
    }
    return s;
}

double ReactionYield::light_charge() const {
    double s = 0.0;
    for (std::size_t j = 0; j < kLightParticles; ++j) {
        const int z = light_particle_Z(static_cast<LightParticle>(j));
        for (std::size_t i = 0; i < forward[j].size(); ++i) {
            s += z * (forward[j][i] + backward[j][i]);
        }
    }
    return s;
}

double fitted_neutron_spectrum_per_MeV(double A, double E, double Eout) {
    using namespace nucleon_fit;
    const double r = E / 1000.0;
    const double T1 = t1 * std::pow(A, t1b);
    const double T3 = t3 * std::pow(r, g3);
    double v = c1 * std::pow(A, a1) * std::pow(r, b1) * Eout / (T1 * T1) * std::exp(-Eout / T1) +
               c2 * std::pow(A, a2) * std::pow(r, b2) * Eout / (t2 * t2) * std::exp(-Eout / t2);
    if (Eout < E) {
        v += c3 * std::pow(A, a3) * std::pow(r, b3) * std::exp(-Eout / T3) /
             (T3 * -std::expm1(-E / T3));
    }
    return v;
}

ReactionYield nucleon_reaction_yield(int Z, bool neutron, double E) {
    if (!std::isfinite(E) || E < 0.0) {
        throw std::invalid_argument("nucleon_reaction_yield: energy must be finite and >= 0");
    }
    const auto element = element_by_Z(Z);
    if (!element) {
        throw std::invalid_argument("nucleon_reaction_yield: no element Z = " + std::to_string(Z));
    }
    const double charge_in = Z + (neutron ? 0.0 : 1.0);
    if (Z == 1) {
        return close(Raw{}, E, charge_in); // hydrogen: nothing transported
    }
    const auto proton = proton_table(Z);
    if (!proton) {
        throw std::logic_error("nucleon_reaction_yield: no evaluated proton table at all");
    }
    const auto own_neutron = neutron ? endf_table(Z, true) : std::nullopt;
    const bool use_own_neutron = own_neutron && !own_neutron->incident.empty() &&
                                 E >= own_neutron->incident.front().energy_MeV;
    const EndfTable& table = use_own_neutron ? *own_neutron : *proton;
    const bool mirrored = neutron && !use_own_neutron;
    const double top = std::min(table_top(table), kEvaluatedUpTo_MeV);
    const double A = element->atomic_mass_g_mol;

    // The proton-induced model at E, as the projectile sees it.
    auto model = [&](double energy) {
        const double ref_E = std::min(table_top(*proton), kEvaluatedUpTo_MeV);
        Raw r = fitted(A, energy, evaluated(*proton, ref_E), ref_E);
        if (neutron) {
            mirror(r);
        }
        return r;
    };
    auto table_at = [&](double energy) {
        Raw r = evaluated(table, energy);
        if (mirrored) {
            mirror(r);
        }
        return r;
    };
    Raw raw;
    if (E <= top) {
        raw = table_at(E);
    } else if (E >= kFitFrom_MeV) {
        raw = model(E);
    } else {
        const double w = (E - top) / (kFitFrom_MeV - top);
        raw.add(table_at(top), 1.0 - w);
        raw.add(model(kFitFrom_MeV), w);
    }
    return close(std::move(raw), E, charge_in);
}

} // namespace crewdose::exposure
