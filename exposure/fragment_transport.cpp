#include "fragment_transport.hpp"

#include "element.hpp"
#include "fragmentation.hpp"
#include "material_library.hpp"
#include "nuclear.hpp"
#include "units.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <set>
#include <stdexcept>

namespace crewdose::exposure {

namespace {

constexpr std::size_t kSpecies = FragmentTransport::kMaxZ;

const Particle& species(std::size_t j) {
    return particles()[j];
}

// Above the top node the field is taken as a power law psi ~ E^-1.7 (the GCR spectral index
// 2.7 of phi), for the few top nodes whose characteristic starts beyond it.
constexpr double kTopPsiIndex = -1.7;

} // namespace

struct FragmentTransport::StepMap {
    // Per species j and node m: the field at depth x + h, node m, is sum_k w[j][4m + k] times
    // the field at depth x, node base[j][m] + k (interpolation along the characteristic times
    // the Jacobian, the psi = E phi conversion and the survival).
    std::array<std::vector<std::size_t>, kSpecies> base;
    std::array<std::vector<double>, kSpecies> w;
};

struct FragmentTransport::MaterialData {
    const Material* material = nullptr;
    std::array<const RangeTable*, kSpecies> table{};
    std::array<std::vector<double>, kSpecies> removal; ///< cm2/g per node
    std::array<std::vector<double>, kSpecies> self;    ///< neutron removal back to itself
    /// prod[p][f][m]: production of element f + 1 per g/cm2 by projectile p + 1, f < p.
    std::array<std::vector<std::vector<double>>, kSpecies> prod;
    /// producers[f]: the projectiles p > f whose production of f is not zero everywhere.
    std::array<std::vector<std::size_t>, kSpecies> producers;
    std::array<std::vector<double>, kSpecies> neutrons; ///< neutrons made per g/cm2 per node
    std::map<double, StepMap> maps;                     ///< by step length, reused ones
    std::set<double> seen;                              ///< step lengths asked for once
    std::map<std::string, std::array<std::vector<DoseQuantities>, kSpecies>> doses;
};

FragmentTransport::FragmentTransport(TableLibrary& tables, MarchOptions options)
    : tables_(tables), options_(options), scratch_(std::make_unique<StepMap>()) {
    if (!(options_.max_step_g_cm2 > 0.0)) {
        throw std::invalid_argument("FragmentTransport: max_step_g_cm2 must be > 0");
    }
    if (particles().size() < kSpecies) {
        throw std::logic_error("FragmentTransport: particle list shorter than Z = 28");
    }
    for (std::size_t j = 0; j < kSpecies; ++j) {
        if (species(j).Z != static_cast<int>(j + 1)) {
            throw std::logic_error("FragmentTransport: particles() not ordered by Z");
        }
    }
    // The nodes are the tables' own (every table of the library shares one grid).
    const Material* water = find_builtin_material("water");
    if (!water) {
        throw std::logic_error("FragmentTransport: no built-in water");
    }
    const LogGrid& tg = tables_.table(*water, proton()).grid();
    while (first_node_ + 4 < tg.size() &&
           std::exp(tg.log_node(first_node_)) < options_.min_energy_MeV_per_n * (1 - 1e-9)) {
        ++first_node_;
    }
    for (std::size_t i = first_node_; i < tg.size(); ++i) {
        energies_.push_back(std::exp(tg.log_node(i)));
    }
}

FragmentTransport::~FragmentTransport() = default;
FragmentTransport::FragmentTransport(FragmentTransport&&) noexcept = default;

IonField FragmentTransport::empty_field() const {
    IonField f;
    f.psi.assign(kSpecies, std::vector<double>(energies_.size(), 0.0));
    f.charge_lost.assign(energies_.size(), 0.0);
    f.neutrons.assign(energies_.size(), 0.0);
    return f;
}

const FragmentTransport::MaterialData& FragmentTransport::data(const Material& material) {
    auto it = materials_.find(material.id());
    if (it != materials_.end()) {
        return *it->second;
    }
    auto md = std::make_unique<MaterialData>();
    md->material = &material;
    const std::size_t n = energies_.size();
    for (std::size_t j = 0; j < kSpecies; ++j) {
        md->table[j] = &tables_.table(material, species(j));
        md->removal[j].resize(n);
        md->self[j].assign(n, 0.0);
        md->neutrons[j].assign(n, 0.0);
        md->prod[j].assign(j, std::vector<double>(n, 0.0));
        for (std::size_t m = 0; m < n; ++m) {
            md->removal[j][m] = removal_cm2_g(material, species(j), energies_[m]);
        }
    }
    if (!options_.removal) {
        for (auto& r : md->removal) {
            std::fill(r.begin(), r.end(), 0.0);
        }
    }
    if (options_.fragmentation && options_.removal) {
        // Channels are energy-independent: once per (projectile, element); the removal cross
        // section of that element carries the energy dependence.
        for (const auto& share : material.composition()) {
            const auto element = element_by_Z(share.Z);
            if (!element) {
                throw std::logic_error("FragmentTransport: unknown element in " + material.id());
            }
            const double At = element->atomic_mass_g_mol;
            const double per_g = share.mass_fraction * kAvogadro_per_mol / At * 1e-27;
            for (std::size_t j = 1; j < kSpecies; ++j) {
                const Particle& p = species(j);
                const ReactionChannels ch = reaction_channels(p.Z, p.A, At);
                for (std::size_t m = 0; m < n; ++m) {
                    const double removal = per_g * nucleus_reaction_cross_section_mb(
                                                       p.Z, p.A, share.Z, At, energies_[m]);
                    for (const auto& c : ch.remnants) {
                        const auto f = static_cast<std::size_t>(c.Z - 1);
                        if (f == j) {
                            md->self[j][m] += removal * c.fraction;
                        } else {
                            md->prod[j][f][m] += removal * c.fraction;
                        }
                    }
                    md->prod[j][0][m] += removal * ch.protons_per_reaction;
                    md->neutrons[j][m] += removal * ch.neutrons_per_reaction;
                }
            }
        }
    }
    for (std::size_t f = 0; f < kSpecies; ++f) {
        for (std::size_t p = f + 1; p < kSpecies; ++p) {
            const auto& v = md->prod[p][f];
            if (std::any_of(v.begin(), v.end(), [](double x) { return x != 0.0; })) {
                md->producers[f].push_back(p);
            }
        }
    }
    // The implicit neutron-removal term divides by 1 - h/2 self: keep it well away from zero
    // (at the default 4 g/cm2 step h/2 self is at most 0.18, in liquid hydrogen).
    double self_max = 0.0;
    for (const auto& v : md->self) {
        for (const double x : v) {
            self_max = std::max(self_max, x);
        }
    }
    if (0.5 * options_.max_step_g_cm2 * self_max >= 0.5) {
        throw std::invalid_argument(
            "FragmentTransport: max_step_g_cm2 = " + std::to_string(options_.max_step_g_cm2) +
            " is too long for " + material.id() + " (at most " + std::to_string(1.0 / self_max) +
            ")");
    }
    return *materials_.emplace(material.id(), std::move(md)).first->second;
}

FragmentTransport::StepMap FragmentTransport::step_map(const MaterialData& md, double h) const {
    StepMap map;
    const std::size_t n = energies_.size();
    const double log_first = std::log(energies_.front());
    const double step = n > 1 ? std::log(energies_[1]) - log_first : 1.0;
    auto lagrange = [](double t, double* w) {
        w[0] = -(t - 1.0) * (t - 2.0) * (t - 3.0) / 6.0;
        w[1] = t * (t - 2.0) * (t - 3.0) / 2.0;
        w[2] = -t * (t - 1.0) * (t - 3.0) / 2.0;
        w[3] = t * (t - 1.0) * (t - 2.0) / 6.0;
    };
    for (std::size_t j = 0; j < kSpecies; ++j) {
        const RangeTable& table = *md.table[j];
        map.base[j].resize(n);
        map.w[j].assign(4 * n, 0.0);
        std::size_t hint = first_node_ == 0 ? 0 : first_node_ - 1;
        for (std::size_t m = 0; m < n; ++m) {
            const std::size_t i = first_node_ + m;
            double pos = static_cast<double>(m); // position of the foot of the characteristic
            double g = 1.0;                      // Jacobian x E ratio x survival
            double beyond = 1.0;                 // power-law factor above the top node
            if (!options_.stopping) {
                g = std::exp(-md.removal[j][m] * h);
            } else {
                const double R = table.range_at_node(i);
                const double x = h / R;
                // ln(R + h): a short series when the step is a small part of the range (the
                // high-energy nodes, most of them), the library log otherwise.
                const double log_R_foot =
                    x < 1e-2 ? table.log_range_nodes()[i] +
                                   x * (1.0 - x * (0.5 - x * (1.0 / 3.0 - 0.25 * x)))
                             : std::log(R + h);
                const bool reactions = options_.removal && table.has_optical_depth();
                const double lambda_i = reactions ? table.optical_depth_nodes()[i] : 0.0;
                if (log_R_foot >= table.log_max_range()) {
                    // Beyond the tables (the top nodes, where a step changes the energy by a
                    // few parts in 1e4): the foot from the local stopping power.
                    const double E = energies_[m];
                    const double E_foot =
                        E + table.stopping_at_node(i) * h / static_cast<double>(species(j).A);
                    pos = static_cast<double>(n - 1);
                    beyond = std::pow(E_foot / energies_.back(), kTopPsiIndex);
                    g = E / E_foot * std::exp(-md.removal[j][m] * h);
                } else {
                    const RangeTable::Cursor c = table.cursor_at_log_range(log_R_foot, hint);
                    // g = (E_i / E_foot) (S_foot / S_i) exp(-(Lambda_foot - Lambda_i)), one exp.
                    const double log_g =
                        table.grid().log_node(i) - c.log_E + table.log_stopping(c) -
                        table.log_stopping_nodes()[i] -
                        (reactions ? table.optical_depth(c, R + h) - lambda_i : 0.0);
                    g = std::fabs(log_g) < 1e-2
                            ? 1.0 +
                                  log_g * (1.0 + log_g * (0.5 + log_g * (1.0 / 6.0 + log_g / 24.0)))
                            : std::exp(log_g);
                    pos = (c.log_E - log_first) / step;
                    if (pos > static_cast<double>(n - 1)) {
                        pos = static_cast<double>(n - 1);
                    }
                }
            }
            const double b = std::clamp(std::floor(pos) - 1.0, 0.0, static_cast<double>(n - 4));
            map.base[j][m] = static_cast<std::size_t>(b);
            double* w = &map.w[j][4 * m];
            lagrange(pos - b, w);
            for (int k = 0; k < 4; ++k) {
                w[k] *= g * beyond;
            }
        }
    }
    return map;
}

const FragmentTransport::StepMap& FragmentTransport::cached_step_map(const MaterialData& md,
                                                                     double h) {
    auto& data = const_cast<MaterialData&>(md);
    auto it = data.maps.find(h);
    if (it != data.maps.end()) {
        return it->second;
    }
    // Most layers are crossed once at their own slant thickness: a map is kept only when its
    // step comes back (the full step, tissue depths, suit layers), so memory stays with the
    // maps that are reused (about 108 kB each).
    if (data.seen.insert(h).second) {
        if (data.seen.size() > 4096) {
            data.seen.clear();
        }
        *scratch_ = step_map(md, h);
        return *scratch_;
    }
    if (data.maps.size() >= 64) { // many repeated lengths: keep the full step only
        for (auto m = data.maps.begin(); m != data.maps.end();) {
            m = m->first == options_.max_step_g_cm2 ? std::next(m) : data.maps.erase(m);
        }
    }
    return data.maps.emplace(h, step_map(md, h)).first->second;
}

void FragmentTransport::cross(IonField& field, const Material& material, double t) {
    if (!std::isfinite(t) || t < 0.0 || t > kMaxCrossing_g_cm2) {
        throw std::invalid_argument("FragmentTransport::cross: thickness of " + material.id() +
                                    " must be finite, >= 0 and at most 1e9 g/cm2");
    }
    if (t == 0.0) {
        return;
    }
    const MaterialData& md = data(material);
    const std::size_t n = energies_.size();
    const double h_max = options_.max_step_g_cm2;
    const auto full = static_cast<std::size_t>(std::floor(t / h_max * (1.0 + 1e-12)));
    const double rest = t - static_cast<double>(full) * h_max;

    // Sources from heavier nuclei, per species, at the current depth (self channel apart).
    std::array<std::vector<double>, kSpecies> source;
    auto sources_into = [&](std::size_t j, std::vector<double>& s) {
        s.assign(n, 0.0);
        for (const std::size_t p : md.producers[j]) {
            const double* prod = md.prod[p][j].data();
            const double* psi = field.psi[p].data();
            for (std::size_t m = 0; m < n; ++m) {
                s[m] += prod[m] * psi[m];
            }
        }
    };
    for (std::size_t j = 0; j < kSpecies; ++j) {
        sources_into(j, source[j]);
    }
    std::vector<double> old_total(n), moved(n), fresh;
    auto apply = [&](const StepMap& map, std::size_t j, const std::vector<double>& f,
                     std::vector<double>& out) {
        const std::size_t* base = map.base[j].data();
        const double* w = map.w[j].data();
        for (std::size_t m = 0; m < n; ++m) {
            const double* x = &f[base[m]];
            out[m] =
                w[4 * m] * x[0] + w[4 * m + 1] * x[1] + w[4 * m + 2] * x[2] + w[4 * m + 3] * x[3];
        }
    };
    auto tally_rates = [&](std::vector<double>& lost, std::vector<double>& neut) {
        for (std::size_t m = 0; m < n; ++m) {
            lost[m] = md.removal[0][m] * field.psi[0][m]; // protons' charge leaves
            double s = 0.0;
            for (std::size_t p = 1; p < kSpecies; ++p) {
                s += md.neutrons[p][m] * field.psi[p][m];
            }
            neut[m] = s;
        }
    };
    std::vector<double> lost_old(n), neut_old(n), lost_new(n), neut_new(n);
    auto substep = [&](double h) {
        const StepMap& map = cached_step_map(md, h);
        if (options_.tallies) {
            tally_rates(lost_old, neut_old);
        }
        for (std::size_t jj = kSpecies; jj-- > 0;) {
            auto& psi = field.psi[jj];
            const auto& self = md.self[jj];
            // T(psi) + h/2 T(source) = T(psi + h/2 source): the old field and what it emits
            // move along the same characteristics.
            for (std::size_t m = 0; m < n; ++m) {
                old_total[m] = psi[m] + 0.5 * h * (source[jj][m] + self[m] * psi[m]);
            }
            apply(map, jj, old_total, moved);
            sources_into(jj, fresh); // heavier nuclei are already at x + h
            for (std::size_t m = 0; m < n; ++m) {
                const double v = (moved[m] + 0.5 * h * fresh[m]) / (1.0 - 0.5 * h * self[m]);
                psi[m] = v > 0.0 ? v : 0.0;
            }
            source[jj].swap(fresh);
        }
        if (options_.tallies) {
            tally_rates(lost_new, neut_new);
            for (std::size_t m = 0; m < n; ++m) {
                field.charge_lost[m] += 0.5 * h * (lost_old[m] + lost_new[m]);
                field.neutrons[m] += 0.5 * h * (neut_old[m] + neut_new[m]);
            }
        }
    };
    if (!(options_.fragmentation && options_.removal) && !options_.tallies) {
        // Nothing is made, so the characteristics are exact across the whole layer: one step.
        substep(t);
        return;
    }
    if (rest > 1e-9 * h_max) {
        substep(rest);
    }
    // A path far thicker than any shield (a hill, a planet) would take many steps for nothing:
    // once the whole field has fallen below kExtinction of what entered, it is zero (the dose
    // behind is below that share of the dose in front) and the march stops.
    auto largest = [&field] {
        double m = 0.0;
        for (const auto& psi : field.psi) {
            for (const double v : psi) {
                m = std::max(m, v);
            }
        }
        return m;
    };
    const double entered = largest();
    for (std::size_t k = 0; k < full; ++k) {
        substep(h_max);
        if (k % 16 == 15 && largest() < kExtinction * entered) {
            for (auto& psi : field.psi) {
                std::fill(psi.begin(), psi.end(), 0.0);
            }
            return;
        }
    }
}

DoseQuantities FragmentTransport::dose(const IonField& field, const Material& medium,
                                       const Material& water, const RbeModel& rbe) {
    DoseQuantities total;
    for (const auto& d : dose_by_nucleus(field, medium, water, rbe)) {
        total += d;
    }
    return total;
}

std::array<DoseQuantities, FragmentTransport::kMaxZ>
FragmentTransport::dose_by_nucleus(const IonField& field, const Material& medium,
                                   const Material& water, const RbeModel& rbe) {
    const MaterialData& md = data(medium);
    auto& cache = const_cast<MaterialData&>(md).doses;
    // Exact values in the key (hexadecimal floating point): RBE models that differ anywhere
    // get their own entry.
    char exact[128];
    std::snprintf(exact, sizeof exact, "|%a|%a|%a", rbe.proton_above_2MeV, rbe.proton_below_2MeV,
                  rbe.heavy_ion);
    const std::string key = water.id() + exact;
    auto it = cache.find(key);
    if (it == cache.end()) {
        std::array<std::vector<DoseQuantities>, kSpecies> per;
        for (std::size_t j = 0; j < kSpecies; ++j) {
            const Particle& p = species(j);
            const DoseMedium dm{&tables_.table(medium, p), &tables_.table(water, p)};
            per[j].resize(energies_.size());
            for (std::size_t m = 0; m < energies_.size(); ++m) {
                per[j][m] = dose_per_fluence_at_node(dm, p, first_node_ + m, rbe);
            }
        }
        it = cache.emplace(key, std::move(per)).first;
    }
    const std::size_t n = energies_.size();
    const double step = n > 1 ? std::log(energies_[1] / energies_[0]) : 0.0;
    std::array<DoseQuantities, kSpecies> out{};
    for (std::size_t j = 0; j < kSpecies; ++j) {
        for (std::size_t m = 0; m < n; ++m) {
            const double w = (m == 0 || m + 1 == n ? 0.5 : 1.0) * step * field.psi[j][m];
            out[j] += it->second[j][m].scaled(w);
        }
    }
    return out;
}

double FragmentTransport::charge_at(const IonField& field, std::size_t m) {
    double q = 0.0;
    for (std::size_t j = 0; j < field.psi.size(); ++j) {
        q += static_cast<double>(j + 1) * field.psi[j][m];
    }
    return q;
}

} // namespace crewdose::exposure
