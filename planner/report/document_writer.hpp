#pragma once
// The writers of the report model (document.hpp): one per output format. They scale each
// number to its column's unit and round it; nothing else in a report built on a Document does.
#include "planner/report/document.hpp"
#include "planner/report/output_format.hpp"

#include <string>

namespace crewdose::planner::report {

/// Text: each block in turn; tables aligned on their widest cell, heading and unit lines.
/// `colour` adds ANSI colour to the fields and cells that carry a tone (terminals only).
[[nodiscard]] std::string write_text(const Document& doc, bool colour = false);

/// JSON: one object; each Group an object and each Table an array of row objects under its
/// key; numbers at full precision, scaled to the column's unit as in text (the key names it).
[[nodiscard]] std::string write_json(const Document& doc);

/// CSV: the table marked `is_csv`, a header of column keys, one line per row; text cells
/// quoted when they hold a comma, quote, space or line break.
[[nodiscard]] std::string write_csv(const Document& doc);

/// The writer of `format`; `colour` only for text.
[[nodiscard]] std::string write(const Document& doc, OutputFormat format, bool colour = false);

} // namespace crewdose::planner::report
