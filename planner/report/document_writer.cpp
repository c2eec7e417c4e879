#include "planner/report/document_writer.hpp"

#include "planner/report/number_format.hpp"
#include "planner/study/result_guard.hpp"

#include <fmt/args.h>
#include <fmt/format.h>
#include <fmt/ranges.h>
#include <nlohmann/json.hpp>

#include <algorithm>
#include <stdexcept>

namespace crewdose::planner::report {

Column number_column(std::string key, std::string header, std::string unit, int min_width,
                     double scale, int digits) {
    Column c;
    c.key = std::move(key);
    c.header = std::move(header);
    c.unit = std::move(unit);
    c.min_width = min_width;
    c.scale = scale;
    c.digits = digits;
    return c;
}

Column text_column(std::string key, std::string header) {
    Column c;
    c.key = std::move(key);
    c.header = std::move(header);
    c.left = true;
    return c;
}

Table csv_only_table(std::string key) {
    Table t;
    t.key = std::move(key);
    t.in_text = false;
    t.in_json = false;
    t.is_csv = true;
    return t;
}

Table text_list(std::string key, std::string title, std::string item_pattern, std::string indent,
                std::string wrap_indent, std::size_t wrap_width) {
    Table t;
    t.key = std::move(key);
    t.title = std::move(title);
    t.in_json = false;
    t.view = Table::View::list;
    t.item_pattern = std::move(item_pattern);
    t.indent = std::move(indent);
    t.wrap_width = wrap_width;
    t.wrap_indent = std::move(wrap_indent);
    return t;
}

Document& Document::text(std::string pattern, std::vector<Field> args, std::size_t wrap_width,
                         std::string wrap_indent) {
    blocks.emplace_back(
        Text{std::move(pattern), std::move(args), wrap_width, std::move(wrap_indent), {}});
    return *this;
}

Document& Document::keyed_text(std::string json_key, std::string pattern, std::size_t wrap_width,
                               std::string wrap_indent) {
    blocks.emplace_back(
        Text{std::move(pattern), {}, wrap_width, std::move(wrap_indent), std::move(json_key)});
    return *this;
}

Document& Document::blank() {
    blocks.emplace_back(Blank{});
    return *this;
}

Document& Document::group(Group g) {
    blocks.emplace_back(std::move(g));
    return *this;
}

Document& Document::table(Table t) {
    blocks.emplace_back(std::move(t));
    return *this;
}

namespace {

// The number a format shows: scaled, finite (a value that was not computed is `nothing`, never
// a NaN: result_guard.hpp), and never a negative zero.
double shown(double value, double scale, std::string_view what) {
    const double v = require_finite(value, what) * scale;
    return v == 0.0 ? 0.0 : v;
}

std::string text_number(double v, int digits, Rounding rounding) {
    if (rounding == Rounding::general) {
        return fmt::format("{:.{}g}", v, digits);
    }
    if (rounding == Rounding::signed_whole) {
        return signed_whole(v);
    }
    if (rounding == Rounding::fixed) {
        const std::string s = fmt::format("{:.{}f}", v, digits);
        // No negative zero after rounding either (-0.04 at one decimal).
        return s.find_first_not_of("-0.") == std::string::npos && s.front() == '-' ? s.substr(1)
                                                                                   : s;
    }
    return significant(v, digits);
}

// A value as text, the way an aligned cell or a pattern argument shows it.
std::string text_of(const Value& value, int digits, Rounding rounding, double scale,
                    const std::string& absent, const std::string& suffix_when_true,
                    const std::string& text_suffix, std::string_view what) {
    return std::visit(
        [&](const auto& v) -> std::string {
            using T = std::decay_t<decltype(v)>;
            if constexpr (std::is_same_v<T, std::monostate>) {
                return absent;
            } else if constexpr (std::is_same_v<T, double>) {
                return text_number(shown(v, scale, what), digits, rounding) + text_suffix;
            } else if constexpr (std::is_same_v<T, std::int64_t>) {
                return fmt::format("{}", v);
            } else if constexpr (std::is_same_v<T, bool>) {
                if (!suffix_when_true.empty()) {
                    return v ? suffix_when_true : std::string();
                }
                return v ? "yes" : "no";
            } else if constexpr (std::is_same_v<T, std::string>) {
                return v;
            } else if constexpr (std::is_same_v<T, List>) {
                return fmt::format("{}", fmt::join(v.items, v.separator));
            } else {
                throw std::logic_error(
                    fmt::format("report: records and objects ({}) have no text form", what));
            }
        },
        value);
}

std::string cell_text(const Column& c, const Value& v) {
    return text_of(v, c.digits, c.rounding, c.scale, c.absent, c.suffix_when_true, c.text_suffix,
                   c.key);
}

std::string field_text(const Field& f) {
    return text_of(f.value, f.digits, f.rounding, f.scale, "not computed", {}, {}, f.key);
}

// Text in its tone's ANSI colour (red, yellow, green), or as it is.
std::string toned(const std::string& text, Tone tone, bool colour) {
    if (!colour || tone == Tone::plain) {
        return text;
    }
    const char* on = tone == Tone::alarm     ? "\033[31m"
                     : tone == Tone::caution ? "\033[33m"
                                             : "\033[32m";
    return on + text + "\033[0m";
}

// Display width of UTF-8 text: its code points (the reports' symbols, such as µ, are one
// column wide).
std::size_t width_of(const std::string& s) {
    return static_cast<std::size_t>(
        std::count_if(s.begin(), s.end(), [](char ch) { return (ch & 0xC0) != 0x80; }));
}

std::string padded(const std::string& s, std::size_t width, bool left) {
    const std::size_t w = width_of(s);
    const std::string pad(width > w ? width - w : 0, ' ');
    return left ? s + pad : pad + s;
}

std::string trimmed_line(std::string line) {
    while (!line.empty() && line.back() == ' ') {
        line.pop_back();
    }
    return line + "\n";
}

// The pattern with its arguments; a pattern without arguments is text as it stands (braces
// and all).
std::string filled(const std::string& pattern, const std::vector<std::string>& args) {
    if (args.empty()) {
        return pattern;
    }
    fmt::dynamic_format_arg_store<fmt::format_context> store;
    for (const auto& a : args) {
        store.push_back(a);
    }
    return fmt::vformat(pattern, store);
}

std::string text_table(const Table& t, bool colour) {
    std::vector<const Column*> cols;
    std::vector<std::size_t> index;
    for (std::size_t c = 0; c < t.columns.size(); ++c) {
        if (t.columns[c].in_text) {
            cols.push_back(&t.columns[c]);
            index.push_back(c);
        }
    }
    std::vector<std::vector<std::string>> cells;
    for (const auto& row : t.rows) {
        if (row.size() != t.columns.size()) {
            throw std::logic_error("report: table " + t.key + " has a row of the wrong length");
        }
        std::vector<std::string> line;
        for (std::size_t k = 0; k < cols.size(); ++k) {
            line.push_back(cell_text(*cols[k], row[index[k]]));
        }
        cells.push_back(std::move(line));
    }
    if (!t.tones.empty() && t.tones.size() != t.rows.size()) {
        throw std::logic_error("report: table " + t.key + " has tones for other rows");
    }
    std::string out = t.title.empty() ? "" : t.title + "\n";
    if (t.view == Table::View::list) {
        for (auto& line : cells) {
            // A column's min_width holds here too, so that short numbers line up.
            for (std::size_t k = 0; k < cols.size(); ++k) {
                line[k] = padded(line[k], static_cast<std::size_t>(std::max(0, cols[k]->min_width)),
                                 cols[k]->left);
            }
            out += wrap(t.indent + filled(t.item_pattern, line), t.wrap_width, t.wrap_indent);
        }
        return out;
    }
    std::vector<std::size_t> widths;
    bool any_unit = false;
    for (std::size_t k = 0; k < cols.size(); ++k) {
        std::size_t w = std::max({static_cast<std::size_t>(std::max(0, cols[k]->min_width)),
                                  width_of(cols[k]->header), width_of(cols[k]->unit)});
        for (const auto& line : cells) {
            w = std::max(w, width_of(line[k]));
        }
        widths.push_back(w);
        any_unit = any_unit || !cols[k]->unit.empty();
    }
    auto line_of = [&](auto&& text_at) {
        std::string line = t.indent;
        for (std::size_t k = 0; k < cols.size(); ++k) {
            if (k > 0) {
                line += std::string(static_cast<std::size_t>(std::max(0, cols[k]->gap)), ' ');
            }
            line += padded(text_at(k), widths[k], cols[k]->left);
        }
        return trimmed_line(line);
    };
    out += line_of([&](std::size_t k) { return cols[k]->header; });
    if (any_unit) {
        out += line_of([&](std::size_t k) { return cols[k]->unit; });
    }
    for (std::size_t r = 0; r < cells.size(); ++r) {
        const auto* tones = t.tones.empty() ? nullptr : &t.tones[r];
        if (tones && tones->size() != t.columns.size()) {
            throw std::logic_error("report: table " + t.key +
                                   " has a tone row of the wrong length");
        }
        // The colour goes around the padded cell, so that it never shifts the alignment; a
        // trailing cell is trimmed first.
        std::string line = t.indent;
        std::string pending;
        for (std::size_t k = 0; k < cols.size(); ++k) {
            if (k > 0) {
                line += std::string(static_cast<std::size_t>(std::max(0, cols[k]->gap)), ' ');
            }
            std::string cell = padded(cells[r][k], widths[k], cols[k]->left);
            if (k + 1 == cols.size()) {
                while (!cell.empty() && cell.back() == ' ') {
                    cell.pop_back();
                }
            }
            line += toned(cell, tones ? (*tones)[index[k]] : Tone::plain, colour);
        }
        out += trimmed_line(line);
    }
    return out;
}

nlohmann::json json_of(const Value& value, double scale, std::string_view what);

nlohmann::json json_of_fields(const std::vector<Field>& fields) {
    nlohmann::json j = nlohmann::json::object();
    for (const auto& f : fields) {
        j[f.key] = json_of(f.value, f.scale, f.key);
    }
    return j;
}

nlohmann::json json_of(const Value& value, double scale, std::string_view what) {
    return std::visit(
        [&](const auto& v) -> nlohmann::json {
            using T = std::decay_t<decltype(v)>;
            if constexpr (std::is_same_v<T, std::monostate>) {
                return nullptr;
            } else if constexpr (std::is_same_v<T, double>) {
                return shown(v, scale, what);
            } else if constexpr (std::is_same_v<T, Records>) {
                nlohmann::json a = nlohmann::json::array();
                for (const auto& item : v.items) {
                    a.push_back(json_of_fields(item));
                }
                return a;
            } else if constexpr (std::is_same_v<T, Object>) {
                return json_of_fields(v.fields);
            } else if constexpr (std::is_same_v<T, List>) {
                return v.items;
            } else {
                return v;
            }
        },
        value);
}

std::string csv_quoted(const std::string& s) {
    if (s.find_first_of(",\" \n\r") == std::string::npos) {
        return s;
    }
    std::string out = "\"";
    for (const char c : s) {
        out += c == '"' ? std::string("\"\"") : std::string(1, c);
    }
    return out + "\"";
}

std::string csv_cell(const Column& c, const Value& value) {
    return std::visit(
        [&](const auto& v) -> std::string {
            using T = std::decay_t<decltype(v)>;
            if constexpr (std::is_same_v<T, std::monostate>) {
                return {};
            } else if constexpr (std::is_same_v<T, double>) {
                return fmt::format("{:.{}g}", shown(v, c.scale, c.key), c.csv_digits);
            } else if constexpr (std::is_same_v<T, std::int64_t>) {
                return fmt::format("{}", v);
            } else if constexpr (std::is_same_v<T, bool>) {
                return v ? "true" : "false";
            } else if constexpr (std::is_same_v<T, std::string>) {
                return csv_quoted(v);
            } else if constexpr (std::is_same_v<T, List>) {
                return csv_quoted(fmt::format("{}", fmt::join(v.items, v.separator)));
            } else {
                throw std::logic_error("report: records and objects have no CSV form (" + c.key +
                                       ")");
            }
        },
        value);
}

} // namespace

std::string write_text(const Document& doc, bool colour) {
    std::string out;
    for (const auto& block : doc.blocks) {
        if (const auto* t = std::get_if<Text>(&block)) {
            std::vector<std::string> args;
            for (const auto& f : t->args) {
                args.push_back(field_text(f));
            }
            const std::string line = filled(t->pattern, args);
            std::string para = line;
            if (t->wrap_width > 0) {
                para = wrap(line, t->wrap_width, t->wrap_indent);
            } else if (line.empty() || line.back() != '\n') {
                para += "\n";
            }
            // Colour goes in after wrapping, so that it never moves a line break: each toned
            // argument's first whole occurrence, in order (one split by a break stays plain).
            std::size_t from = 0;
            for (std::size_t k = 0; colour && k < t->args.size(); ++k) {
                if (t->args[k].tone == Tone::plain || args[k].empty()) {
                    continue;
                }
                const std::size_t at = para.find(args[k], from);
                if (at == std::string::npos) {
                    continue;
                }
                const std::string coloured = toned(args[k], t->args[k].tone, true);
                para.replace(at, args[k].size(), coloured);
                from = at + coloured.size();
            }
            out += para;
        } else if (std::holds_alternative<Blank>(block)) {
            out += "\n";
        } else if (const auto* tab = std::get_if<Table>(&block); tab && tab->in_text) {
            out += text_table(*tab, colour);
        }
    }
    return out;
}

std::string write_json(const Document& doc) {
    nlohmann::json j = nlohmann::json::object();
    for (const auto& block : doc.blocks) {
        if (const auto* g = std::get_if<Group>(&block)) {
            if (g->key.empty()) {
                j.update(json_of_fields(g->fields));
            } else {
                j[g->key] = json_of_fields(g->fields);
            }
        } else if (const auto* p = std::get_if<Text>(&block); p && !p->json_key.empty()) {
            std::vector<std::string> args;
            for (const auto& f : p->args) {
                args.push_back(field_text(f));
            }
            j[p->json_key] = filled(p->pattern, args);
        } else if (const auto* t = std::get_if<Table>(&block); t && t->in_json) {
            nlohmann::json rows = nlohmann::json::array();
            for (const auto& row : t->rows) {
                if (row.size() != t->columns.size()) {
                    throw std::logic_error("report: table " + t->key +
                                           " has a row of the wrong length");
                }
                nlohmann::json r = nlohmann::json::object();
                for (std::size_t c = 0; c < row.size(); ++c) {
                    const auto& col = t->columns[c];
                    if (!col.in_json || (col.omit_absent_in_json &&
                                         std::holds_alternative<std::monostate>(row[c]))) {
                        continue;
                    }
                    r[col.key] = json_of(row[c], col.scale, col.key);
                }
                rows.push_back(std::move(r));
            }
            j[t->key] = std::move(rows);
        }
    }
    return dump_checked(j);
}

std::string write_csv(const Document& doc) {
    const Table* table = nullptr;
    for (const auto& block : doc.blocks) {
        if (const auto* t = std::get_if<Table>(&block); t && t->is_csv) {
            if (table) {
                throw std::logic_error("report: two tables are marked for CSV");
            }
            table = t;
        }
    }
    if (!table) {
        throw std::logic_error("report: no table is marked for CSV");
    }
    std::string out;
    std::string header;
    for (const auto& c : table->columns) {
        if (c.in_csv) {
            header += (header.empty() ? "" : ",") + c.key;
        }
    }
    out += header + "\n";
    for (const auto& row : table->rows) {
        if (row.size() != table->columns.size()) {
            throw std::logic_error("report: table " + table->key +
                                   " has a row of the wrong length");
        }
        std::string line;
        bool first = true;
        for (std::size_t c = 0; c < row.size(); ++c) {
            if (!table->columns[c].in_csv) {
                continue;
            }
            line += (first ? "" : ",") + csv_cell(table->columns[c], row[c]);
            first = false;
        }
        out += line + "\n";
    }
    return out;
}

std::string write(const Document& doc, OutputFormat format, bool colour) {
    switch (format) {
    case OutputFormat::json:
        return write_json(doc);
    case OutputFormat::csv:
        return write_csv(doc);
    case OutputFormat::text:
        return write_text(doc, colour);
    }
    throw std::logic_error("report: unknown output format");
}

} // namespace crewdose::planner::report
