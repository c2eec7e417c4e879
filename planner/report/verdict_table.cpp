#include "planner/report/verdict_table.hpp"

#include "planner/report/document_writer.hpp"
#include "planner/report/number_format.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <string_view>

namespace crewdose::planner {
namespace {

report::Tone tone_of(const std::string& status) {
    return status == "exceeded" ? report::Tone::alarm
           : status == "near"   ? report::Tone::caution
           : status == "within" ? report::Tone::good
                                : report::Tone::plain;
}

} // namespace

std::string format_verdict_text(const VerdictTable& table) {
    report::Document doc;
    append_verdict(doc, table);
    return report::write_text(doc);
}

void append_verdict(report::Document& doc, const VerdictTable& table) {
    const std::size_t at = table.headline_words.empty() ? std::string::npos
                                                        : table.headline.find(table.headline_words);
    if (at == std::string::npos) {
        doc.text(table.headline, {}, 100, "  ");
    } else {
        // The headline as a pattern around its answer words, which carry the status's tone.
        const auto escaped = [](std::string_view s) {
            std::string out;
            for (const char c : s) {
                out += c == '{' ? "{{" : c == '}' ? "}}" : std::string(1, c);
            }
            return out;
        };
        const std::string_view h = table.headline;
        report::Field words{"verdict", table.headline_words};
        words.tone = tone_of(table.headline_status);
        doc.text(escaped(h.substr(0, at)) + "{0}" +
                     escaped(h.substr(at + table.headline_words.size())),
                 {words}, 100, "  ");
    }
    report::Table t;
    t.key = "verdict";
    t.in_json = false;
    for (std::size_t k = 0; k < table.columns.size(); ++k) {
        const bool numeric =
            std::any_of(table.rows.begin(), table.rows.end(),
                        [&](const auto& row) { return k < row.size() && row[k].number; });
        report::Column c =
            numeric ? report::number_column("column_" + std::to_string(k), table.columns[k])
                    : report::text_column("column_" + std::to_string(k), table.columns[k]);
        c.in_json = false;
        c.in_csv = false;
        t.columns.push_back(std::move(c));
    }
    for (const auto& row : table.rows) {
        std::vector<report::Value> cells;
        std::vector<report::Tone> tones;
        for (std::size_t k = 0; k < table.columns.size(); ++k) {
            const VerdictCell* cell = k < row.size() ? &row[k] : nullptr;
            cells.emplace_back(cell ? cell->text : std::string());
            tones.push_back(tone_of(cell ? cell->status : std::string()));
        }
        t.rows.push_back(std::move(cells));
        t.tones.push_back(std::move(tones));
    }
    doc.table(std::move(t));
    for (const auto& remark : table.notes) {
        doc.text("  " + remark, {}, 100, "    ");
    }
    if (!table.note.empty()) {
        doc.text("  " + table.note, {}, 100, "    ");
    }
    doc.blank();
}

std::string verdict_dose_text(double dose) {
    return std::isfinite(dose) && dose >= 0.0 ? significant(dose, 3) : "not computed";
}

bool dose_within(double dose, double limit) {
    return std::isfinite(dose) && dose >= 0.0 && dose <= limit;
}

} // namespace crewdose::planner
