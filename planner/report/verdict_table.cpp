#include "planner/report/verdict_table.hpp"

#include "planner/report/number_format.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>

namespace crewdose::planner {

std::string format_verdict_text(const VerdictTable& table) {
    std::string out = wrap(table.headline, 100, "  ");
    const std::size_t n = table.columns.size();
    std::vector<std::size_t> width(n, 0);
    std::vector<bool> numeric(n, false);
    for (std::size_t k = 0; k < n; ++k) {
        width[k] = table.columns[k].size();
    }
    for (const auto& row : table.rows) {
        for (std::size_t k = 0; k < std::min(n, row.size()); ++k) {
            width[k] = std::max(width[k], row[k].text.size());
            numeric[k] = numeric[k] || row[k].number;
        }
    }
    auto line = [&](auto&& text_of) {
        std::string l = " ";
        for (std::size_t k = 0; k < n; ++k) {
            const std::string t = text_of(k);
            l += numeric[k] ? fmt::format(" {:>{}}", t, width[k])
                            : fmt::format(" {:<{}}", t, width[k]);
            l += k + 1 < n ? " " : "";
        }
        while (!l.empty() && l.back() == ' ') {
            l.pop_back();
        }
        return l + "\n";
    };
    out += line([&](std::size_t k) { return table.columns[k]; });
    for (const auto& row : table.rows) {
        out += line([&](std::size_t k) { return k < row.size() ? row[k].text : std::string(); });
    }
    for (const auto& remark : table.notes) {
        out += wrap("  " + remark, 100, "    ");
    }
    if (!table.note.empty()) {
        out += wrap("  " + table.note, 100, "    ");
    }
    return out + "\n";
}

std::string verdict_dose_text(double dose) {
    return std::isfinite(dose) && dose >= 0.0 ? significant(dose, 3) : "not computed";
}

bool dose_within(double dose, double limit) {
    return std::isfinite(dose) && dose >= 0.0 && dose <= limit;
}

} // namespace crewdose::planner
