#pragma once
// The answer first: the short table a text report opens with and an HTML page shows as a
// table (storm, shelter, compare). A headline sentence, one row per crew member or material,
// and a line saying what the columns mean. The builders fill it from their results; the text
// and the HTML (html_page.hpp) draw the same rows, so the two never disagree.
#include "planner/report/document.hpp"

#include <string>
#include <utility>
#include <vector>

namespace crewdose::planner {

struct VerdictCell {
    // Not explicit: a row reads {{"name"}, {"12.5 g/cm2", true}, {"met", false, "within"}}.
    VerdictCell(std::string text_, bool number_ = false, std::string status_ = {}) // NOLINT
        : text(std::move(text_)), number(number_), status(std::move(status_)) {}
    std::string text;
    bool number = false; ///< right-aligned (text) and tabular figures (HTML)
    /// The status this cell states, for the page's colour: "within", "near", "exceeded" or
    /// empty. The words carry the meaning; the colour only repeats them.
    std::string status;
};

struct VerdictTable {
    std::string headline;             ///< "Verdict: ..." or "Answer: ..."
    std::vector<std::string> columns; ///< the headings
    std::vector<std::vector<VerdictCell>> rows;
    /// Remarks on single rows, each a sentence under the table ("not evaluated for b: ...").
    std::vector<std::string> notes;
    std::string note; ///< what the columns mean (may be empty)
    /// The words of the headline that state the answer ("A PLANNING LIMIT IS EXCEEDED") and
    /// their status, for colour on a terminal ("within", "near", "exceeded"; empty: none).
    std::string headline_words;
    std::string headline_status;
};

/// The table as text: the headline wrapped at 100 columns, the columns aligned (two spaces
/// indent), the notes and the note wrapped; ends with a blank line.
[[nodiscard]] std::string format_verdict_text(const VerdictTable& table);

/// The table as blocks of a report Document, text only (JSON and CSV carry the same answer as
/// numbers elsewhere): write_text shows exactly what format_verdict_text returns; with colour,
/// each cell's status is its tone.
void append_verdict(report::Document& doc, const VerdictTable& table);

/// A dose for a verdict cell: "not computed" unless `dose` is a finite number >= 0, else the
/// dose to 3 significant figures.
[[nodiscard]] std::string verdict_dose_text(double dose);

/// True only when `dose` was computed (finite, >= 0) and is at or below `limit`: a dose that
/// is not a number never reads as within.
[[nodiscard]] bool dose_within(double dose, double limit);

} // namespace crewdose::planner
