#include "planner/report/events_report.hpp"

#include "planner/report/document_writer.hpp"
#include "planner/scenario/event_library.hpp"
#include "planner/scenario/spectrum_spec.hpp"

#include <fmt/format.h>

#include <array>

namespace crewdose::planner {

namespace {

// J(>10), J(>30), J(>100 MeV) of an entry, protons/cm2, from crewdose's own spectrum code.
std::array<double, 3> fluences(const ReferenceEvent& e) {
    const auto s = parse_spectrum(e.spectrum, "library");
    return {s.integral_fluence_per_cm2(10.0), s.integral_fluence_per_cm2(30.0),
            s.integral_fluence_per_cm2(100.0)};
}

report::Column column(std::string key, std::string header, bool left) {
    report::Column c;
    c.key = std::move(key);
    c.header = std::move(header);
    c.left = left;
    c.gap = 1;
    c.digits = 3;
    c.csv_digits = 6;
    return c;
}

report::Column hidden(std::string key) {
    auto c = column(std::move(key), "", true);
    c.in_text = false;
    return c;
}

} // namespace

report::Document events_document() {
    const auto& events = reference_events();
    report::Document doc;
    doc.text("crewdose events: reference solar particle events (omnidirectional proton fluence, "
             "protons/cm2)");
    doc.blank();
    doc.text("Name one in a scenario with spectrum = \"library:ID\" (optionally "
             "\"library:ID,scale=0.5\" or \"library:ID,scale_to=1e9@30\"). Each is a fit of "
             "events seen near Earth, so an event naming one is taken as given at 1 AU "
             "(spectrum_at_AU = 1 unless the scenario says otherwise) and scaled to where each "
             "crew member is. A design event is the fluence of one event exceeded on average "
             "once in its return period: a statistical statement, not a forecast.",
             {}, 96);
    doc.blank();

    report::Table t;
    t.key = "events";
    t.is_csv = true;
    auto id = column("id", "id", true);
    id.min_width = 15;
    auto kind = column("kind", "kind", true);
    kind.min_width = 7;
    auto period = column("return_period_years", "return", false);
    period.min_width = 12;
    period.in_text = false;
    period.omit_absent_in_json = true;
    period.rounding = report::Rounding::general;
    auto period_text = column("return_text", "return", false);
    period_text.min_width = 12;
    period_text.in_json = false;
    period_text.in_csv = false;
    auto J = [](std::string key, std::string header) {
        auto c = column(std::move(key), std::move(header), false);
        c.min_width = 10;
        return c;
    };
    auto title = hidden("title");
    title.in_csv = false;
    auto use_as = hidden("use_as");
    use_as.in_csv = false;
    auto at_AU = hidden("spectrum_at_AU");
    at_AU.in_csv = false;
    t.columns = {id,
                 kind,
                 period,
                 period_text,
                 J("J_above_10MeV_per_cm2", "J(>10)"),
                 J("J_above_30MeV_per_cm2", "J(>30)"),
                 J("J_above_100MeV_per_cm2", "J(>100)"),
                 title,
                 hidden("spectrum"),
                 use_as,
                 at_AU,
                 hidden("source"),
                 hidden("read_in"),
                 hidden("note")};
    report::Table fits = report::text_list(
        "fits", "Fits (crewdose's spectrum spelling):", "{}: {}: {}", "  ", "    ", 96);
    fits.columns = {column("id", "", true), column("title", "", true),
                    column("spectrum", "", true)};
    for (const auto& e : events) {
        const auto f = fluences(e);
        report::Value period_value;
        if (e.return_period_years) {
            period_value = *e.return_period_years;
        }
        t.rows.push_back(
            {std::string(e.id), std::string(e.kind), period_value,
             std::string(e.return_period_years ? fmt::format("{:g} years", *e.return_period_years)
                                               : "-"),
             f[0], f[1], f[2], std::string(e.title), std::string(e.spectrum),
             fmt::format("library:{}", e.id), 1.0, std::string(e.source), std::string(e.read_in),
             std::string(e.note)});
        fits.rows.push_back({std::string(e.id), std::string(e.title), std::string(e.spectrum)});
    }
    doc.table(std::move(t));
    doc.blank();
    doc.table(std::move(fits));
    doc.blank();

    // Each source once, with the entries it covers (entries sharing one are listed together):
    // a text view of the events' source columns.
    report::Table sources =
        report::text_list("sources", "Sources:", "{}: {}; read {}. Note: {}.", "  ", "    ", 96);
    sources.columns = {column("ids", "", true), column("source", "", true),
                       column("read_in", "", true), column("note", "", true)};
    for (std::size_t i = 0; i < events.size();) {
        std::size_t j = i;
        while (j < events.size() && events[j].source == events[i].source &&
               events[j].read_in == events[i].read_in && events[j].note == events[i].note) {
            ++j;
        }
        const auto& e = events[i];
        sources.rows.push_back(
            {j - i == 1 ? std::string(e.id) : fmt::format("{} to {}", e.id, events[j - 1].id),
             std::string(e.source), std::string(e.read_in), std::string(e.note)});
        i = j;
    }
    doc.table(std::move(sources));
    doc.blank();

    report::Table gaps = report::text_list(
        "not_in_library", "Not in the library (known gaps):", "{}: {}.", "  ", "    ", 96);
    gaps.in_json = true; // the gaps are in JSON too
    gaps.columns = {column("event", "", true), column("why", "", true)};
    for (const auto& m : missing_reference_events()) {
        gaps.rows.push_back({std::string(m.what), std::string(m.why)});
    }
    doc.table(std::move(gaps));
    return doc;
}

std::string format_events_report(OutputFormat format) {
    return report::write(events_document(), format);
}

} // namespace crewdose::planner
