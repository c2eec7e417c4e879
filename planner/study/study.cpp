#include "planner/study/study.hpp"

#include <atomic>
#include <exception>
#include <mutex>
#include <optional>
#include <span>
#include <system_error>
#include <thread>
#include <tuple>

#include "habitats/direction_set.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <cstdlib>
#include <filesystem>
#include <stdexcept>

namespace crewdose::planner {

exposure::EnergyGridSpec gcr_grid() {
    exposure::EnergyGridSpec g;
    g.nodes_per_decade = kGcrNodesPerDecade;
    return g;
}

exposure::MarchOptions gcr_march_options() {
    exposure::MarchOptions o;
    o.max_step_g_cm2 = kGcrMarchStep_g_cm2;
    o.secondaries = true;
    return o;
}

Study::Study(Scenario scenario, const std::optional<std::string>& only_location,
             const std::function<void(double)>& progress, const exposure::DataCache* cache)
    : sc_(std::move(scenario)), directions_(sc_.mission.directions), cache_(cache) {
    if (only_location) {
        const LocationSpec one = sc_.location_named(*only_location, "--location");
        sc_.locations = {one};
        partial_ = true;
    }
    const MaterialResolver materials = [this](const std::string& id) -> const exposure::Material& {
        const auto* m = sc_.material(id);
        if (!m) {
            throw std::logic_error("unvalidated material id " + id);
        }
        return *m;
    };
    const auto gcr_dirs = habitats::fibonacci_directions(sc_.mission.gcr_directions);
    // Locations that place the same body model alike share its depths.
    std::map<std::tuple<std::string, int, double>, SourceBodyDepths> depths_cache;
    std::vector<double> phis{sc_.mission.gcr_phi_MV};
    for (const auto& phase : sc_.mission.gcr_phases) {
        phis.push_back(phase.phi_MV);
    }
    if (!sc_.mission.gcr_phi_series.empty()) {
        // phi by month from a recorded series: the GCR is computed on the kPhiNode_MV grid
        // around each value and interpolated (gcr_daily_dose), so a long mission costs a few
        // nodes, not one computation per month.
        std::vector<double> nodes;
        for (const double phi : phis) {
            nodes.push_back(std::floor(phi / kPhiNode_MV) * kPhiNode_MV);
            nodes.push_back(std::ceil(phi / kPhiNode_MV) * kPhiNode_MV);
        }
        phis = std::move(nodes);
    }
    // CREWDOSE_THREADS overrides the thread count (tests check the results do not change).
    std::size_t wanted = std::thread::hardware_concurrency();
    if (const char* env = std::getenv("CREWDOSE_THREADS")) {
        wanted = static_cast<std::size_t>(std::max(1L, std::strtol(env, nullptr, 10)));
    }
    wanted = std::max<std::size_t>(wanted, 1);
    threads_ = wanted;
    for (const auto& loc : sc_.locations) {
        LocationGeometry where;
        where.point = loc.point_m;
        where.suit = loc.suit;
        where.heading_deg = loc.heading_deg;
        where.posture = loc.posture;
        if (!loc.deep_space && sc_.mission.site != SiteKind::deep_space) {
            where.surroundings.ground = true;
            where.surroundings.mask = sc_.mission.terrain_mask;
            if (sc_.mission.site == SiteKind::mars) {
                where.surroundings.atmosphere = habitats::mars_atmosphere(
                    sc_.mission.surface_pressure_Pa, sc_.mission.scale_height_km);
            }
        }
        std::vector<habitats::Vector3> loc_dirs;
        if (loc.shielding_table) {
            where.imported = &*loc.shielding_table;
            loc_dirs = where.imported->directions;
        } else {
            std::vector<habitats::Solid> around;
            for (const auto& s : sc_.solids) {
                if (std::find(loc.solids.begin(), loc.solids.end(), s.id) != loc.solids.end()) {
                    around.push_back(s);
                }
            }
            scenes_.push_back(std::make_unique<habitats::Scene>(std::move(around)));
            where.scene = scenes_.back().get();
        }
        geometries_[loc.id] = where;
        const BodyModel& body = body_model(loc.body);
        if (where.imported) {
            // The table's own directions, for both sources.
            const SourceBodyDepths d =
                cached_depths(body, placement_of(where), loc_dirs, loc_dirs, wanted, cache_);
            bodies_[loc.id] = d.spe;
            gcr_bodies_[loc.id] = d.gcr;
        } else {
            loc_dirs = habitats::fibonacci_directions(spe_direction_count(sc_.mission, loc.body));
            const auto key =
                std::make_tuple(loc.body, static_cast<int>(loc.posture), loc.heading_deg);
            auto it = depths_cache.find(key);
            if (it == depths_cache.end()) {
                it = depths_cache
                         .emplace(key, cached_depths(body, placement_of(where), loc_dirs, gcr_dirs,
                                                     wanted, cache_))
                         .first;
            }
            bodies_[loc.id] = it->second.spe;
            gcr_bodies_[loc.id] = it->second.gcr;
        }
        location_directions_[loc.id] = loc_dirs;
    }
    // Per location two independent jobs: the SPE responses, and the GCR: the whole ion field
    // marched along every direction with nuclear reactions and without, once per phi of the
    // mission (location_response.hpp). The jobs are shared among threads, each with its own
    // tables and marches, and merged in location order, so the result does not depend on the
    // thread count.
    std::sort(phis.begin(), phis.end());
    phis.erase(std::unique(phis.begin(), phis.end()), phis.end());
    const std::size_t n_loc = sc_.locations.size();
    std::vector<std::map<std::pair<std::string, double>, exposure::BracketedDose>> per_location(
        n_loc);
    std::vector<std::vector<OrganResponse>> spe_per_location(n_loc);
    // Per location, event and organ: the events' secondaries as a factor on the primary dose.
    std::vector<std::vector<std::vector<exposure::BracketedDose>>> spe_whole(n_loc);
    auto gcr_location = [&](std::size_t i, const GcrMarches& march, const GcrMarches& spe_marches) {
        const auto& loc = sc_.locations[i];
        const LocationGeometry& where = geometries_.at(loc.id);
        const auto& g_dirs = where.imported ? location_directions_.at(loc.id) : gcr_dirs;
        per_location[i] =
            gcr_body_doses(march, materials, where, g_dirs, gcr_bodies_.at(loc.id), phis);
        if (sc_.events.empty()) {
            return;
        }
        // Each event's protons at the site (its fluence scaling applied), marched with and
        // without their secondaries on every kSpeSecondaryStride-th GCR direction.
        std::vector<exposure::IonField> fields;
        for (const auto& ev : sc_.events) {
            fields.push_back(event_incident_field(spe_marches.with_reactions, ev,
                                                  sc_.mission.sep_fluence_exponent));
        }
        spe_whole[i] =
            field_body_doses(spe_marches, materials, where, g_dirs, gcr_bodies_.at(loc.id), fields,
                             where.imported ? 1 : kSpeSecondaryStride);
    };
    auto spe_location = [&](std::size_t i, exposure::TableLibrary& tables) {
        const auto& loc = sc_.locations[i];
        spe_per_location[i] = body_responses(tables, materials, geometries_.at(loc.id),
                                             location_directions_.at(loc.id), bodies_.at(loc.id));
    };
    const std::size_t threads =
        std::clamp<std::size_t>(wanted, 1, std::max<std::size_t>(1, 2 * n_loc));
    std::vector<std::exception_ptr> failures(threads);
    // Locations differ in cost by an order of magnitude (a thin EVA site against a shelter
    // under regolith): each worker takes the next location not yet taken.
    // Jobs 0 .. n-1 are the GCR ones, n .. 2n-1 the SPE ones, taken largest first (by a rough
    // estimate: GCR above SPE, open sky twice the directions of a site with ground), so that
    // the threads finish together.
    std::vector<std::size_t> order(2 * n_loc);
    std::vector<double> estimate(2 * n_loc);
    for (std::size_t i = 0; i < 2 * n_loc; ++i) {
        const auto& loc = sc_.locations[i % n_loc];
        const bool open_sky = loc.deep_space || sc_.mission.site == SiteKind::deep_space;
        order[i] = i;
        estimate[i] = (i < n_loc ? 1.5 : 1.0) * (open_sky ? 2.0 : 1.0);
    }
    std::stable_sort(order.begin(), order.end(),
                     [&](std::size_t a, std::size_t b) { return estimate[a] > estimate[b]; });
    std::atomic<std::size_t> next_job{0};
    std::size_t jobs_done = 0;
    std::mutex progress_mutex;
    auto job_done = [&] {
        if (progress) {
            const std::lock_guard<std::mutex> lock(progress_mutex);
            ++jobs_done;
            progress(static_cast<double>(jobs_done) / static_cast<double>(2 * n_loc));
        }
    };
    auto worker = [&](std::size_t t) {
        try {
            exposure::TableLibrary gcr_tables(gcr_grid());
            exposure::FragmentTransport with_reactions(gcr_tables, gcr_march_options(), cache_);
            exposure::MarchOptions none;
            none.removal = false;
            exposure::FragmentTransport without_reactions(gcr_tables, none, cache_);
            const GcrMarches marches{with_reactions, without_reactions};
            exposure::MarchOptions primaries_only = gcr_march_options();
            primaries_only.secondaries = false;
            exposure::FragmentTransport primaries(gcr_tables, primaries_only, cache_);
            const GcrMarches spe_marches{with_reactions, primaries};
            std::map<std::string, exposure::TableLibrary> spe_tables; // by body model
            for (std::size_t taken = next_job++; taken < 2 * n_loc; taken = next_job++) {
                const std::size_t i = order[taken];
                if (i < n_loc) {
                    gcr_location(i, marches, spe_marches);
                } else {
                    const std::string& id = sc_.locations[i - n_loc].body;
                    auto lib = spe_tables.find(id);
                    if (lib == spe_tables.end()) {
                        lib = spe_tables.try_emplace(id, body_model(id).spe_grid()).first;
                    }
                    spe_location(i - n_loc, lib->second);
                }
                job_done();
            }
        } catch (...) {
            failures[t] = std::current_exception();
        }
    };
    {
        std::vector<std::thread> pool;
        std::size_t started = 1;
        try {
            for (std::size_t t = 1; t < threads; ++t) {
                pool.emplace_back(worker, t);
                ++started;
            }
        } catch (const std::system_error&) {
            // No more threads to be had: the workers started take every location.
        }
        worker(0);
        for (std::size_t t = started; t < threads; ++t) {
            worker(t);
        }
        for (auto& th : pool) {
            th.join();
        }
    }
    for (const auto& f : failures) {
        if (f) {
            std::rethrow_exception(f);
        }
    }
    for (std::size_t i = 0; i < n_loc; ++i) {
        for (auto& r : spe_per_location[i]) {
            const std::string organ = r.organ;
            responses_.emplace(std::make_pair(sc_.locations[i].id, organ), std::move(r));
        }
        for (auto& [key, rates] : per_location[i]) {
            if (!rates.with_removal.physical() || !rates.without_removal.physical()) {
                throw InputError(sc_.locations[i].where, "location",
                                 fmt::format("'{}': the GCR dose rate of organ {} (phi {} MV) is "
                                             "not a finite number >= 0; check the densities, "
                                             "thicknesses and materials of its shielding",
                                             sc_.locations[i].id, key.first, key.second));
            }
            gcr_rates_[{sc_.locations[i].id, key.first, key.second}] = std::move(rates);
        }
    }
    for (std::size_t i = 0; i < n_loc; ++i) {
        const auto& organs = gcr_bodies_.at(sc_.locations[i].id).organs;
        for (std::size_t e = 0; e < spe_whole[i].size(); ++e) {
            for (std::size_t o = 0; o < organs.size(); ++o) {
                const auto& d = spe_whole[i][e][o];
                spe_factors_[{sc_.locations[i].id, organs[o], sc_.events[e].id}] =
                    secondary_factor(d.with_removal, d.without_removal);
            }
        }
    }
    // The 0.01 AU grid of distances the crew reach away from the site (see event_timing).
    const std::vector<long> bins = arrival_bins(sc_);
    // Every event folded once with every response: the ledger asks for these per activity.
    for (const auto& ev : sc_.events) {
        for (const auto& [key, r] : responses_) {
            const auto fluences = event_node_fluences(ev, sc_.mission.sep_fluence_exponent,
                                                      r.response.node_energies_MeV_per_n);
            auto folded = exposure::fold(r.response, fluences);
            // The secondaries: the primary dose with reactions times the whole field's ratio to
            // the primaries at this location and organ (the march of the event's protons).
            folded.with_removal =
                apply_secondary_factor(folded.with_removal, spe_factor(key.first, key.second, ev));
            if (!folded.with_removal.physical() || !folded.without_removal.physical()) {
                throw InputError(ev.where, "event.spectrum",
                                 fmt::format("event '{}': its dose to organ {} at location '{}' "
                                             "is not a finite number >= 0; check the spectrum's "
                                             "parameters and the location's shielding",
                                             ev.id, key.second, key.first));
            }
            event_doses_[{key.first, key.second, ev.id}] = folded.for_limits();
            // Arrival groups, weighted by the removal case that gives the higher dose.
            const bool with =
                folded.with_removal.rbe_weighted_GyEq >= folded.without_removal.rbe_weighted_GyEq;
            const auto& weights = with ? r.response.with_removal : r.response.without_removal;
            std::vector<std::pair<double, double>> nodes; // (energy, dose share)
            for (std::size_t j = 0; j < weights.size(); ++j) {
                const double d =
                    weights[j].rbe_weighted_GyEq * fluences.per_unit_log_energy_per_cm2[j];
                if (d > 0.0) {
                    nodes.emplace_back(r.response.node_energies_MeV_per_n[j], d);
                }
            }
            event_timing_[{key.first, key.second, ev.id}] = arrival_groups(nodes, ev);
            // Crew in space away from the site: the arrival at their distance, on the 0.01 AU
            // grid (a dispersed event only; a fixed arrival does not depend on the distance).
            if (ev.fixed_arrival) {
                continue;
            }
            for (const long bin : bins) {
                const double r_AU = static_cast<double>(bin) / kArrivalBinsPerAU;
                const EventSpec there = ev.seen_at(r_AU, sc_.mission.path_length_at(r_AU));
                event_timing_off_site_[{key.first, key.second, ev.id, bin}] =
                    arrival_groups(nodes, there);
            }
        }
    }
}

ArrivalGroups arrival_groups(std::vector<std::pair<double, double>> nodes, const EventSpec& ev) {
    for (auto& [energy, d] : nodes) {
        energy = ev.delay_h(energy);
    }
    std::sort(nodes.begin(), nodes.end());
    ArrivalGroups g;
    for (const auto& [delay, d] : nodes) {
        const double width_h = std::max(1.0 / 60.0, 0.01 * delay);
        if (g.delay_h.empty() || delay - g.delay_h.back() > width_h) {
            g.delay_h.push_back(delay);
            g.share.push_back(0.0);
        }
        // The group's delay is that of its first (fastest) node: never later than any
        // member's own arrival.
        g.share.back() += d;
    }
    // Shares of the grouped sums (a single group is exactly 1: organs with the same grouping
    // then have equal timings, which the storm sweep reuses).
    double grouped = 0.0;
    for (const double s : g.share) {
        grouped += s;
    }
    for (double& s : g.share) {
        s /= grouped;
    }
    g.prepare(ev.profile);
    return g;
}

exposure::NodeFluences event_node_fluences(const EventSpec& ev, double exponent,
                                           std::span<const double> nodes) {
    auto f = exposure::node_fluences(ev.spectrum, nodes);
    const double scale = ev.fluence_scale(exponent);
    for (std::size_t j = 0; j < f.per_unit_log_energy_per_cm2.size(); ++j) {
        f.per_unit_log_energy_per_cm2[j] *= scale;
        f.extrapolated_per_cm2[j] *= scale;
    }
    return f;
}

void ArrivalGroups::prepare(const EventProfile& p) {
    // The running sums need ascending delays: order the groups (their sum does not depend on it).
    if (!std::is_sorted(delay_h.begin(), delay_h.end())) {
        std::vector<std::pair<double, double>> groups;
        for (std::size_t k = 0; k < delay_h.size(); ++k) {
            groups.emplace_back(delay_h[k], share[k]);
        }
        std::sort(groups.begin(), groups.end());
        for (std::size_t k = 0; k < groups.size(); ++k) {
            delay_h[k] = groups[k].first;
            share[k] = groups[k].second;
        }
    }
    rise_h_ = p.rise_h;
    decay_h_ = p.decay_h;
    const double d = p.decay_h;
    const double c = 1.0 / (1.0 / p.rise_h + 1.0 / p.decay_h);
    const std::size_t n = delay_h.size();
    sum_share_.assign(n, 0.0);
    sum_decay_.assign(n, 0.0);
    sum_fast_.assign(n, 0.0);
    for (std::size_t k = 0; k < n; ++k) {
        const double gap = k == 0 ? 0.0 : delay_h[k] - delay_h[k - 1];
        sum_share_[k] = (k == 0 ? 0.0 : sum_share_[k - 1]) + share[k];
        sum_decay_[k] = (k == 0 ? 0.0 : sum_decay_[k - 1] * std::exp(-gap / d)) + share[k];
        sum_fast_[k] = (k == 0 ? 0.0 : sum_fast_[k - 1] * std::exp(-gap / c)) + share[k];
    }
}

double ArrivalGroups::cumulative(double tau) const {
    // Groups that have arrived: delay < tau (EventProfile::fraction_by is zero at t <= 0).
    const auto k_end = static_cast<std::size_t>(
        std::lower_bound(delay_h.begin(), delay_h.end(), tau) - delay_h.begin());
    if (k_end == 0) {
        return 0.0;
    }
    const std::size_t k = k_end - 1;
    const double d = decay_h_;
    const double c = 1.0 / (1.0 / rise_h_ + 1.0 / decay_h_);
    const double dt = tau - delay_h[k];
    // sum_g share_g [d (1 - e^{-t_g/d}) - c (1 - e^{-t_g/c})] / (d - c), t_g = tau - d_g, with
    // d - c = d^2 / (rise + d) as in EventProfile::fraction_by.
    // Past 40 of the fast time constants its term is below e^-40 of the shares: left out.
    const double fast = dt < 40.0 * c ? std::exp(-dt / c) * sum_fast_[k] : 0.0;
    const double part =
        d * (sum_share_[k] - std::exp(-dt / d) * sum_decay_[k]) - c * (sum_share_[k] - fast);
    return std::clamp(part / (d * d / (rise_h_ + d)), 0.0, sum_share_[k]);
}

double ArrivalGroups::fraction_between(double a_h, double b_h, const EventProfile& p) const {
    if (rise_h_ > 0.0 && p.rise_h == rise_h_ && p.decay_h == decay_h_) {
        return cumulative(b_h) - cumulative(a_h);
    }
    double f = 0.0;
    for (std::size_t k = 0; k < delay_h.size(); ++k) {
        f += share[k] * (p.fraction_by(b_h - delay_h[k]) - p.fraction_by(a_h - delay_h[k]));
    }
    return f;
}

exposure::DoseQuantities Study::spe_factor(const std::string& location, const std::string& organ,
                                           const EventSpec& event) const {
    const auto it = spe_factors_.find({location, organ, event.id});
    return it == spe_factors_.end() ? exposure::DoseQuantities{1.0, 1.0, 1.0} : it->second;
}

exposure::IonField event_incident_field(const exposure::FragmentTransport& march,
                                        const EventSpec& ev, double exponent) {
    exposure::IonField f = march.empty_field();
    const double scale = ev.fluence_scale(exponent);
    const auto& E = march.energies();
    for (std::size_t m = 0; m < E.size(); ++m) {
        f.psi[0][m] = scale * E[m] * ev.spectrum.differential_fluence_per_cm2_MeV(E[m]);
    }
    return f;
}

exposure::DoseQuantities secondary_factor(const exposure::DoseQuantities& whole,
                                          const exposure::DoseQuantities& primaries) {
    auto ratio = [](double a, double b) {
        return b > 0.0 && std::isfinite(a / b) ? a / b : 1.0;
    };
    return {ratio(whole.absorbed_Gy, primaries.absorbed_Gy),
            ratio(whole.dose_equivalent_Sv, primaries.dose_equivalent_Sv),
            ratio(whole.rbe_weighted_GyEq, primaries.rbe_weighted_GyEq)};
}

exposure::DoseQuantities apply_secondary_factor(const exposure::DoseQuantities& primaries,
                                                const exposure::DoseQuantities& factor) {
    return {primaries.absorbed_Gy * factor.absorbed_Gy,
            primaries.dose_equivalent_Sv * factor.dose_equivalent_Sv,
            primaries.rbe_weighted_GyEq * factor.rbe_weighted_GyEq};
}

const ArrivalGroups& Study::event_timing(const std::string& location, const std::string& organ,
                                         const EventSpec& event) const {
    return event_timing_.at({location, organ, event.id});
}

const ArrivalGroups& Study::event_timing(const std::string& location, const std::string& organ,
                                         const EventSpec& event, double r_AU) const {
    if (event.fixed_arrival || r_AU == event.sun_distance_AU) {
        return event_timing(location, organ, event);
    }
    const auto it = event_timing_off_site_.find({location, organ, event.id, arrival_bin(r_AU)});
    if (it == event_timing_off_site_.end()) {
        throw std::logic_error("Study::event_timing: a distance no crew member's track reaches");
    }
    return it->second;
}

long arrival_bin(double r_AU) {
    return std::lround(r_AU * kArrivalBinsPerAU);
}

std::vector<long> arrival_bins(const Scenario& sc) {
    std::vector<long> bins;
    const double site = sc.mission.sun_distance_AU;
    bool away = false;
    for (const auto& track : sc.sun_tracks) {
        for (const auto& piece : track.pieces()) {
            away = away || piece.r_from_AU != site || piece.r_to_AU != site;
            const long a = arrival_bin(piece.r_from_AU);
            const long b = arrival_bin(piece.r_to_AU);
            for (long k = std::min(a, b); k <= std::max(a, b); ++k) {
                bins.push_back(k);
            }
        }
    }
    if (!away) {
        return {}; // everyone at the site: the site's own tables serve
    }
    std::sort(bins.begin(), bins.end());
    bins.erase(std::unique(bins.begin(), bins.end()), bins.end());
    return bins;
}

exposure::DoseQuantities Study::event_dose(const std::string& location, const std::string& organ,
                                           const EventSpec& event, double r_AU) const {
    return event_dose(location, organ, event)
        .scaled(event.distance_factor(r_AU, sc_.mission.sep_fluence_exponent));
}

exposure::BracketedDose Study::gcr_daily_dose(const std::string& location, const std::string& organ,
                                              double phi_MV) const {
    const auto exact = gcr_rates_.find({location, organ, phi_MV});
    if (exact != gcr_rates_.end()) {
        return exact->second;
    }
    // Between two nodes of the kPhiNode_MV grid (phi by date): linear in phi. The dose falls
    // with phi and flattens (convex), so the chord lies above it: never less dose.
    const double lo = std::floor(phi_MV / kPhiNode_MV) * kPhiNode_MV;
    const double hi = std::ceil(phi_MV / kPhiNode_MV) * kPhiNode_MV;
    const auto a = gcr_rates_.find({location, organ, lo});
    const auto b = gcr_rates_.find({location, organ, hi});
    if (a == gcr_rates_.end() || b == gcr_rates_.end()) {
        throw std::out_of_range(fmt::format("GCR rate of {} at {} for phi {} MV was not computed",
                                            organ, location, phi_MV));
    }
    const double w = (phi_MV - lo) / (hi - lo);
    exposure::BracketedDose d = a->second;
    d.with_removal = a->second.with_removal.scaled(1.0 - w);
    d.with_removal += b->second.with_removal.scaled(w);
    d.without_removal = a->second.without_removal.scaled(1.0 - w);
    d.without_removal += b->second.without_removal.scaled(w);
    d.extrapolated_share =
        (1.0 - w) * a->second.extrapolated_share + w * b->second.extrapolated_share;
    return d;
}

const OrganResponse& Study::response(const std::string& location, const std::string& organ) const {
    return responses_.at({location, organ});
}

exposure::DoseQuantities Study::event_dose(const std::string& location, const std::string& organ,
                                           const EventSpec& event) const {
    return event_doses_.at({location, organ, event.id});
}

const LocationGeometry& Study::geometry(const std::string& id) const {
    return geometries_.at(id);
}

const std::vector<habitats::Vector3>& Study::directions(const std::string& id) const {
    return location_directions_.at(id);
}

const BodyDepths& Study::body(const std::string& location) const {
    return bodies_.at(location);
}

bool Study::has_organ(const std::string& location, const std::string& organ) const {
    return responses_.count({location, organ}) > 0;
}

const LocationSpec& Study::location(const std::string& id) const {
    for (const auto& l : sc_.locations) {
        if (l.id == id) {
            return l;
        }
    }
    throw std::logic_error("unknown location " + id);
}

} // namespace crewdose::planner
