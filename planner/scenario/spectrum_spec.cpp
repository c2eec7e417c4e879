#include "planner/scenario/spectrum_spec.hpp"

#include "planner/scenario/event_library.hpp"
#include "planner/scenario/input_error.hpp"
#include "planner/scenario/number_parse.hpp"

#include "exposure/parameter_error.hpp"

#include <fmt/format.h>

#include <cmath>
#include <map>
#include <set>
#include <vector>

namespace crewdose::planner {
namespace {

struct Keys {
    std::map<std::string, std::string> values;
    std::vector<std::pair<double, double>> table; // for the table form
};

[[noreturn]] void fail(const SourceLocation& where, std::string_view field,
                       const std::string& problem) {
    throw InputError(where, std::string(field), problem);
}

double to_number(const SourceLocation& where, std::string_view text, std::string_view field,
                 const std::string& key) {
    const auto v = parse_finite(text);
    if (!v) {
        fail(where, field, fmt::format("{}: '{}' is not a number", key, text));
    }
    return *v;
}

double required(const SourceLocation& where, const Keys& k, const std::string& key,
                std::string_view field, std::string_view form) {
    const auto it = k.values.find(key);
    if (it == k.values.end()) {
        fail(where, field,
             fmt::format("the {} form needs {}; see 'crewdose depth --help'", form, key));
    }
    return to_number(where, it->second, field, key);
}

} // namespace

exposure::ProtonSpectrum parse_spectrum(std::string_view text, std::string_view field) {
    return parse_spectrum(text, field, SourceLocation{"command line", 0});
}

exposure::ProtonSpectrum parse_spectrum(std::string_view text, std::string_view field,
                                        const SourceLocation& where) {
    // library:ID[,key=value...]: the reference event's own spelling, then the options given.
    if (text.substr(0, 8) == "library:") {
        const std::string_view rest = text.substr(8);
        const auto comma = rest.find(',');
        const std::string id(rest.substr(0, comma));
        const ReferenceEvent* ev = find_reference_event(id);
        if (!ev) {
            std::string ids;
            for (const auto& e : reference_events()) {
                ids += (ids.empty() ? "" : ", ") + std::string(e.id);
            }
            fail(where, field,
                 fmt::format("'{}' is not in the event library; allowed: {} (see 'crewdose "
                             "events')",
                             id, ids));
        }
        std::string spelled(ev->spectrum);
        if (comma != std::string_view::npos) {
            // Only a scaling may follow: the shape and its normalisation are the source's.
            const std::string_view options = rest.substr(comma + 1);
            std::size_t start = 0;
            while (start <= options.size()) {
                const auto next = options.find(',', start);
                const auto item = options.substr(
                    start, (next == std::string_view::npos ? options.size() : next) - start);
                const auto key = item.substr(0, item.find('='));
                if (key != "scale" && key != "scale_to") {
                    fail(where, field,
                         fmt::format("'{}' after library:{} is not allowed: a library event "
                                     "takes only scale=X (the fluence times X) or scale_to=F@E",
                                     item, id));
                }
                if (next == std::string_view::npos) {
                    break;
                }
                start = next + 1;
            }
            spelled += std::string(rest.substr(comma));
        }
        return parse_spectrum(spelled, field, where);
    }
    const auto colon = text.find(':');
    if (colon == std::string_view::npos) {
        fail(where, field,
             fmt::format("'{}' has no form; write FORM:key=value,... with FORM one of "
                         "band, band-differential, weibull, exp-rigidity, exp-energy, power, "
                         "table, or library:ID (see 'crewdose events')",
                         text));
    }
    const std::string form(text.substr(0, colon));
    const std::string_view rest = text.substr(colon + 1);
    static const std::map<std::string, std::set<std::string>> kKeys{
        {"band", {"J0", "gamma_a", "gamma_b", "R0_GV"}},
        {"band-differential", {"C", "gamma_a", "gamma_b", "R0_GV"}},
        {"weibull", {"J0", "k", "alpha"}},
        {"exp-rigidity", {"J0", "R0_GV"}},
        {"exp-energy", {"J0", "E0_MeV"}},
        {"power", {"J0", "gamma", "E_ref_MeV"}},
        {"table", {}}};
    const auto allowed = kKeys.find(form);
    if (allowed == kKeys.end()) {
        fail(where, field,
             fmt::format("unknown spectrum form '{}'; allowed: band, band-differential, "
                         "weibull, exp-rigidity, exp-energy, power, table",
                         form));
    }
    const std::set<std::string> common{"fit_min_MeV", "fit_max_MeV", "per_sr", "scale_to", "scale"};
    Keys k;
    std::size_t start = 0;
    while (start <= rest.size()) {
        const auto comma = rest.find(',', start);
        const auto item =
            rest.substr(start, (comma == std::string_view::npos ? rest.size() : comma) - start);
        const auto eq = item.find('=');
        if (eq == std::string_view::npos || eq == 0) {
            fail(where, field, fmt::format("'{}' is not key=value", item));
        }
        const std::string key(item.substr(0, eq));
        const std::string value(item.substr(eq + 1));
        if (form == "table" && !common.count(key)) {
            k.table.emplace_back(to_number(where, key, field, "table energy"),
                                 to_number(where, value, field, "J(>" + key + " MeV)"));
        } else {
            if (!allowed->second.count(key) && !common.count(key)) {
                std::string list;
                for (const auto& a : allowed->second) {
                    list += a + ", ";
                }
                fail(where, field,
                     fmt::format("the {} form has no key '{}'; allowed: {}fit_min_MeV, "
                                 "fit_max_MeV, per_sr, scale_to, scale",
                                 form, key, list));
            }
            if (!k.values.emplace(key, value).second) {
                fail(where, field, fmt::format("{} is given twice", key));
            }
        }
        if (comma == std::string_view::npos) {
            break;
        }
        start = comma + 1;
    }

    const double per_sr = [&] {
        const auto it = k.values.find("per_sr");
        if (it == k.values.end() || it->second == "no") {
            return 1.0;
        }
        if (it->second == "yes") {
            return exposure::omnidirectional_from_per_sr(1.0);
        }
        fail(where, field, "per_sr: allowed values are yes and no");
    }();
    exposure::FitRange fit{10.0, 1000.0};
    if (k.values.count("fit_min_MeV")) {
        fit.min_MeV = to_number(where, k.values["fit_min_MeV"], field, "fit_min_MeV");
    }
    if (k.values.count("fit_max_MeV")) {
        fit.max_MeV = to_number(where, k.values["fit_max_MeV"], field, "fit_max_MeV");
    }

    exposure::SpectrumForm shape;
    try {
        if (form == "band") {
            shape = exposure::BandRigidity{per_sr * required(where, k, "J0", field, form),
                                           required(where, k, "gamma_a", field, form),
                                           required(where, k, "gamma_b", field, form),
                                           required(where, k, "R0_GV", field, form)};
        } else if (form == "band-differential") {
            shape =
                exposure::BandDifferentialRigidity{per_sr * required(where, k, "C", field, form),
                                                   required(where, k, "gamma_a", field, form),
                                                   required(where, k, "gamma_b", field, form),
                                                   required(where, k, "R0_GV", field, form)};
        } else if (form == "weibull") {
            shape = exposure::WeibullEnergy{per_sr * required(where, k, "J0", field, form),
                                            required(where, k, "k", field, form),
                                            required(where, k, "alpha", field, form)};
        } else if (form == "exp-rigidity") {
            shape = exposure::ExponentialRigidity{per_sr * required(where, k, "J0", field, form),
                                                  required(where, k, "R0_GV", field, form)};
        } else if (form == "exp-energy") {
            shape = exposure::ExponentialEnergy{per_sr * required(where, k, "J0", field, form),
                                                required(where, k, "E0_MeV", field, form)};
        } else if (form == "power") {
            shape = exposure::PowerLawEnergy{per_sr * required(where, k, "J0", field, form),
                                             required(where, k, "gamma", field, form),
                                             required(where, k, "E_ref_MeV", field, form)};
        } else {
            exposure::TabulatedIntegral t;
            for (const auto& [E, J] : k.table) {
                t.energy_MeV.push_back(E);
                t.J_per_cm2.push_back(per_sr * J);
            }
            shape = std::move(t);
        }
        exposure::ProtonSpectrum spectrum(std::move(shape), fit);
        if (k.values.count("scale_to")) {
            const std::string& v = k.values["scale_to"];
            const auto at = v.find('@');
            if (at == std::string::npos) {
                fail(where, field, "scale_to: write F@E, F protons/cm2 above E MeV, e.g. 1e9@30");
            }
            spectrum = spectrum.scaled_to(
                to_number(where, std::string_view(v).substr(0, at), field, "scale_to fluence"),
                to_number(where, std::string_view(v).substr(at + 1), field, "scale_to energy"));
        }
        if (k.values.count("scale")) {
            if (k.values.count("scale_to")) {
                fail(where, field, "give scale or scale_to, not both");
            }
            const double x = to_number(where, k.values["scale"], field, "scale");
            if (!(x > 0.0 && x <= 1000.0)) {
                fail(where, field,
                     fmt::format("scale: a factor on the fluence, more than 0 and at most 1000, "
                                 "got {}",
                                 k.values["scale"]));
            }
            spectrum = spectrum.scaled_to(x * spectrum.integral_fluence_per_cm2(30.0), 30.0);
        }
        return spectrum;
    } catch (const exposure::ParameterError& e) {
        fail(where, field, fmt::format("{}: {}", e.field(), e.detail()));
    }
}

std::string describe_spectrum(const exposure::ProtonSpectrum& s) {
    const auto& f = s.fit_range();
    return fmt::format("J(>10 MeV) = {:.3g}, J(>30 MeV) = {:.3g}, J(>100 MeV) = {:.3g} "
                       "protons/cm2; fit range {:g} to {:g} MeV",
                       s.integral_fluence_per_cm2(10.0), s.integral_fluence_per_cm2(30.0),
                       s.integral_fluence_per_cm2(100.0), f.min_MeV, f.max_MeV);
}

std::string spectrum_help() {
    return "SPECTRUM is FORM:key=value,... (omnidirectional fluence, protons/cm2):\n"
           "  band:J0=..,gamma_a=..,gamma_b=..,R0_GV=..   Band function in rigidity, J(>R)\n"
           "  band-differential:C=..,gamma_a=..,gamma_b=..,R0_GV=..\n"
           "                                              the same form as dJ/dR, C in\n"
           "                                              protons/(cm2 GV)\n"
           "  weibull:J0=..,k=..,alpha=..                 J(>E) = J0 exp(-k E^alpha)\n"
           "  exp-rigidity:J0=..,R0_GV=..                 J(>R) = J0 exp(-R/R0)\n"
           "  exp-energy:J0=..,E0_MeV=..                  J(>E) = J0 exp(-E/E0)\n"
           "  power:J0=..,gamma=..,E_ref_MeV=..           J(>E) = J0 (E/E_ref)^-gamma\n"
           "  table:10=1e9,30=2e8,100=1e7                 J(>E) at E in MeV, log-log\n"
           "Any form also takes fit_min_MeV=, fit_max_MeV= (fit range, default 10 to 1000;\n"
           "dose from energies outside it is reported as extrapolated), per_sr=yes (the\n"
           "fluence is per steradian of an isotropic field: times 4 pi) and scale_to=F@E\n"
           "(the same shape with F protons/cm2 above E MeV) or scale=X (the fluence times X).\n"
           "library:ID[,scale=X] names a published event of the library ('crewdose events').\n"
           "Example (invented demo values): "
           "band:J0=1e10,gamma_a=1.1,gamma_b=3.5,R0_GV=0.25";
}

} // namespace crewdose::planner
