#pragma once
// The report model: what a command reports, as data, apart from how it is laid out. A
// Document is a sequence of blocks: text (a sentence pattern with its values), groups of named
// fields, and tables with named columns and units. One writer per format (document_writer.hpp)
// turns it into text, JSON or CSV; the writers are the only place where a number is scaled to
// its display unit and rounded, so every format of a command shows the same values.
//
// A value is a number, a whole number, a flag, text, a list of words, a list of records or an
// object (JSON only) or nothing.
// "Nothing" is how a builder says "not computed" or "does not apply": it prints as the
// column's `absent` text, JSON null (or no key), an empty CSV cell. A number that is not finite
// never reaches a writer as a number: the writers refuse it (a logic error), so a dose that was
// not computed cannot be printed as one.
#include <cstdint>
#include <string>
#include <variant>
#include <vector>

namespace crewdose::planner::report {

struct Field;

/// Records of named fields, written as a JSON array of objects (e.g. a material's
/// composition inside its row).
struct Records {
    std::vector<std::vector<Field>> items;
};

/// Named fields written as one JSON object (e.g. the three dose quantities of a row).
struct Object {
    std::vector<Field> fields;
};

/// Words, written as a JSON array of strings, and joined by `separator` in text and CSV (e.g.
/// the locations where an organ was not evaluated).
struct List {
    std::vector<std::string> items;
    std::string separator = ", ";
};

using Value =
    std::variant<std::monostate, double, std::int64_t, bool, std::string, Records, Object, List>;

/// How text shows a value on a terminal with colour: the words carry the meaning, the colour
/// only repeats it (no colour anywhere else, and none unless the caller asks for it).
enum class Tone { plain, good, caution, alarm };

/// How a number is rounded in text: `significant` keeps trailing zeros to the given figures
/// (33.70), `general` drops them ({:.Ng}: 1, 10, 0.4732), `fixed` keeps `digits` decimals,
/// `signed_whole` is a whole number with its sign for a change (+3, -12; 0, never -0 or +0;
/// `digits` unused). CSV and JSON are not rounded.
enum class Rounding { significant, general, fixed, signed_whole };

struct Column {
    std::string key;    ///< JSON and CSV name, with the unit in it (e.g. "csda_range_g_cm2")
    std::string header; ///< text heading
    std::string unit;   ///< text unit line; empty for none
    int digits = 4;     ///< significant figures in text
    Rounding rounding = Rounding::significant;
    int csv_digits = 10; ///< significant figures in CSV ({:.Ng})
    double scale = 1.0;  ///< every format shows value * scale (e.g. 1e3: a value in Gy, in mGy)
    bool left = false;   ///< left-aligned (text columns) instead of right-aligned
    int min_width = 0;   ///< text width at least this (aligned and list views)
    int gap = 2;         ///< spaces before the column in text
    std::string absent = "not computed"; ///< text for a value that is nothing
    std::string suffix_when_true;        ///< text: for a flag column, shown when true
    std::string text_suffix;             ///< text: after a number (e.g. "%")
    bool in_text = true;
    bool in_json = true;
    bool in_csv = true;
    bool omit_absent_in_json = false; ///< leave the key out instead of writing null

    /// Which formats show the column.
    Column& shown_in(bool text, bool json, bool csv) {
        in_text = text;
        in_json = json;
        in_csv = csv;
        return *this;
    }
};

/// A right-aligned number column: its key, text heading and unit line, at least `min_width`
/// wide in text, `digits` significant figures there, shown as value * `scale`.
[[nodiscard]] Column number_column(std::string key, std::string header, std::string unit = {},
                                   int min_width = 0, double scale = 1.0, int digits = 4);
/// A left-aligned column (text cells).
[[nodiscard]] Column text_column(std::string key, std::string header = {});

/// A table. In text, `aligned` writes a heading line, a unit line (when any column has a
/// unit) and one line per row; `list` writes one wrapped line per row from `item_pattern`
/// ({0}, {1}, ... are the columns in order, formatted as in an aligned table).
struct Table {
    enum class View { aligned, list };
    std::string key;   ///< JSON key of the array of row objects
    std::string title; ///< text line before the table; empty for none
    std::vector<Column> columns;
    std::vector<std::vector<Value>> rows;
    /// Optional, the shape of `rows`: the tone of each cell in coloured text (aligned view).
    std::vector<std::vector<Tone>> tones;
    View view = View::aligned;
    std::string item_pattern;
    std::string indent = "  ";
    std::size_t wrap_width = 96;
    std::string wrap_indent = "    ";
    bool in_text = true;
    bool in_json = true;
    bool is_csv = false; ///< the table the CSV format writes (one per document)
};

/// A table only the CSV format writes, under `key` (a report whose text and JSON show the same
/// numbers in other shapes).
[[nodiscard]] Table csv_only_table(std::string key);
/// A text-only list: `title`, then one line per row from `item_pattern`, starting with
/// `indent` and wrapped at `wrap_width` columns with `wrap_indent`.
[[nodiscard]] Table text_list(std::string key, std::string title, std::string item_pattern,
                              std::string indent = "  ", std::string wrap_indent = "    ",
                              std::size_t wrap_width = 100);

struct Field {
    std::string key;
    Value value;
    int digits = 4; ///< significant figures where text shows it
    Rounding rounding = Rounding::general;
    double scale = 1.0;      ///< every format shows value * scale (the key names the shown unit)
    Tone tone = Tone::plain; ///< in coloured text, as a pattern argument
};

/// Named fields written as one JSON object under `key`, or at the top level when `key` is
/// empty (nothing in text: a Text block shows what the reader needs).
struct Group {
    std::string key;
    std::vector<Field> fields;
};

/// A text paragraph: `pattern` with {0}, {1}, ... replaced by the formatted fields; wrapped
/// to `wrap_width` (0: written as is). JSON carries it under `json_key` when that is set.
struct Text {
    std::string pattern;
    std::vector<Field> args;
    std::size_t wrap_width = 0;
    std::string wrap_indent;
    std::string json_key;
};

struct Blank {};

using Block = std::variant<Text, Blank, Group, Table>;

struct Document {
    std::vector<Block> blocks;

    Document& text(std::string pattern, std::vector<Field> args = {}, std::size_t wrap_width = 0,
                   std::string wrap_indent = "");
    /// A paragraph that JSON also carries, under `json_key`.
    Document& keyed_text(std::string json_key, std::string pattern, std::size_t wrap_width = 0,
                         std::string wrap_indent = "");
    Document& blank();
    Document& group(Group g);
    Document& table(Table t);
};

} // namespace crewdose::planner::report
