#include "planner/report/events_report.hpp"

#include "planner/report/number_format.hpp"
#include "planner/scenario/event_library.hpp"
#include "planner/scenario/spectrum_spec.hpp"
#include "planner/study/result_guard.hpp"

#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include <array>

namespace crewdose::planner {

namespace {

// J(>10), J(>30), J(>100 MeV) of an entry, protons/cm2, from crewdose's own spectrum code.
std::array<double, 3> fluences(const ReferenceEvent& e) {
    const auto s = parse_spectrum(e.spectrum, "library");
    return {s.integral_fluence_per_cm2(10.0), s.integral_fluence_per_cm2(30.0),
            s.integral_fluence_per_cm2(100.0)};
}

std::string csv_quoted(std::string_view text) {
    std::string out = "\"";
    for (const char c : text) {
        out += c == '"' ? std::string("\"\"") : std::string(1, c);
    }
    return out + "\"";
}

} // namespace

std::string format_events_report(OutputFormat format) {
    const auto& events = reference_events();
    if (format == OutputFormat::json) {
        nlohmann::json list = nlohmann::json::array();
        for (const auto& e : events) {
            const auto J = fluences(e);
            nlohmann::json ej{{"id", e.id},
                              {"title", e.title},
                              {"kind", e.kind},
                              {"spectrum", e.spectrum},
                              {"use_as", fmt::format("library:{}", e.id)},
                              {"spectrum_at_AU", 1.0},
                              {"J_above_10MeV_per_cm2", J[0]},
                              {"J_above_30MeV_per_cm2", J[1]},
                              {"J_above_100MeV_per_cm2", J[2]},
                              {"source", e.source},
                              {"read_in", e.read_in},
                              {"note", e.note}};
            if (e.return_period_years) {
                ej["return_period_years"] = *e.return_period_years;
            }
            list.push_back(ej);
        }
        nlohmann::json gaps = nlohmann::json::array();
        for (const auto& m : missing_reference_events()) {
            gaps.push_back({{"event", m.what}, {"why", m.why}});
        }
        return dump_checked(nlohmann::json{{"events", list}, {"not_in_library", gaps}});
    }
    if (format == OutputFormat::csv) {
        std::string out = "id,kind,return_period_years,J_above_10MeV_per_cm2,"
                          "J_above_30MeV_per_cm2,J_above_100MeV_per_cm2,spectrum,source,read_in,"
                          "note\n";
        for (const auto& e : events) {
            const auto J = fluences(e);
            out += fmt::format("{},{},{},{:.6g},{:.6g},{:.6g},{},{},{},{}\n", e.id, e.kind,
                               e.return_period_years ? fmt::format("{:g}", *e.return_period_years)
                                                     : std::string(),
                               J[0], J[1], J[2], csv_quoted(e.spectrum), csv_quoted(e.source),
                               csv_quoted(e.read_in), csv_quoted(e.note));
        }
        return out;
    }
    std::string out = "crewdose events: reference solar particle events (omnidirectional proton "
                      "fluence, protons/cm2)\n\n";
    out += wrap("Name one in a scenario with spectrum = \"library:ID\" (optionally "
                "\"library:ID,scale=0.5\" or \"library:ID,scale_to=1e9@30\"). Each is a fit of "
                "events seen near Earth, so an event naming one is taken as given at 1 AU "
                "(spectrum_at_AU = 1 unless the scenario says otherwise) and scaled to where each "
                "crew member is. A design event is the fluence of one event exceeded on average "
                "once in its return period: a statistical statement, not a forecast.",
                96);
    out += "\n";
    out += fmt::format("  {:<15} {:<7} {:>12} {:>10} {:>10} {:>10}\n", "id", "kind", "return",
                       "J(>10)", "J(>30)", "J(>100)");
    for (const auto& e : events) {
        const auto J = fluences(e);
        out += fmt::format("  {:<15} {:<7} {:>12} {:>10} {:>10} {:>10}\n", e.id, e.kind,
                           e.return_period_years ? fmt::format("{:g} years", *e.return_period_years)
                                                 : "-",
                           significant(J[0], 3), significant(J[1], 3), significant(J[2], 3));
    }
    out += "\nFits (crewdose's spectrum spelling):\n";
    for (const auto& e : events) {
        out += wrap(fmt::format("  {}: {}: {}", e.id, e.title, e.spectrum), 96, "    ");
    }
    // Each source once, with the entries it covers (entries sharing one are listed together).
    out += "\nSources:\n";
    for (std::size_t i = 0; i < events.size();) {
        std::size_t j = i;
        while (j < events.size() && events[j].source == events[i].source &&
               events[j].read_in == events[i].read_in && events[j].note == events[i].note) {
            ++j;
        }
        const auto& e = events[i];
        const std::string ids =
            j - i == 1 ? std::string(e.id) : fmt::format("{} to {}", e.id, events[j - 1].id);
        out += wrap(fmt::format("  {}: {}; read {}. Note: {}.", ids, e.source, e.read_in, e.note),
                    96, "    ");
        i = j;
    }
    out += "\nNot in the library (known gaps):\n";
    for (const auto& m : missing_reference_events()) {
        out += wrap(fmt::format("  {}: {}.", m.what, m.why), 96, "    ");
    }
    return out;
}

} // namespace crewdose::planner
