#include "planner/scenario/toml_text.hpp"

#include "planner/scenario/input_error.hpp"

#include <fmt/format.h>

#include <cstdint>
#include <string>
#include <vector>

namespace crewdose::planner {
namespace {

// Decodes the UTF-8 sequence at text[i]; returns its length (0 when invalid) and the code
// point. Overlong forms, surrogates and code points above U+10FFFF are invalid (RFC 3629).
std::size_t decode(std::string_view text, std::size_t i, char32_t& cp) {
    const auto byte = [&](std::size_t k) {
        return static_cast<unsigned char>(text[k]);
    };
    const unsigned char b0 = byte(i);
    std::size_t len = 0;
    char32_t min = 0;
    if (b0 < 0x80) {
        cp = b0;
        return 1;
    }
    if ((b0 & 0xE0) == 0xC0) {
        len = 2;
        cp = b0 & 0x1Fu;
        min = 0x80;
    } else if ((b0 & 0xF0) == 0xE0) {
        len = 3;
        cp = b0 & 0x0Fu;
        min = 0x800;
    } else if ((b0 & 0xF8) == 0xF0) {
        len = 4;
        cp = b0 & 0x07u;
        min = 0x10000;
    } else {
        return 0;
    }
    if (i + len > text.size()) {
        return 0;
    }
    for (std::size_t k = 1; k < len; ++k) {
        if ((byte(i + k) & 0xC0) != 0x80) {
            return 0;
        }
        cp = (cp << 6) | (byte(i + k) & 0x3Fu);
    }
    if (cp < min || cp > 0x10FFFF || (cp >= 0xD800 && cp <= 0xDFFF)) {
        return 0;
    }
    return len;
}

enum class State { normal, comment, basic, literal, ml_basic, ml_literal };

// Where the text is, as far as keys and values go: toml++ records the raw text of every key it
// reads and tests each character of it for whitespace, so a non-ASCII character inside a
// quoted key reaches the same undefined behaviour as one outside any string.
enum class Nest { header, array, inline_table };

std::string code_point(char32_t cp) {
    return fmt::format("U+{:04X}", static_cast<std::uint32_t>(cp));
}

} // namespace

void check_toml_text(std::string_view text, std::string_view file) {
    int line = 1;
    State state = State::normal;
    bool after_line_end_backslash = false; // in a multi-line basic string
    bool escaped = false;                  // the character before was an escaping backslash
    std::vector<Nest> nest;                // open [header], [array] and {inline table}
    bool key_expected = true;              // a key comes next: a line's start, after '{' or ','
    bool string_is_key = false;            // the string being read is a quoted key
    // The last character outside strings and comments that was not blank: a quote starts a
    // string only where toml++ starts one (a key or a value), not inside a bare word such as
    // -"x, which toml++ scans as part of that word.
    char last = '\n';
    auto fail = [&](const std::string& problem) {
        throw InputError({std::string(file), line}, "syntax", problem);
    };
    auto starts = [&](std::size_t i, std::string_view s) {
        return text.substr(i, s.size()) == s;
    };
    auto end_of_line = [&] {
        last = '\n';
        // Outside arrays and inline tables a line ends a key-value pair or a header.
        if (nest.empty() || nest.back() == Nest::header) {
            nest.clear();
            key_expected = true;
        }
    };
    std::size_t i = 0;
    while (i < text.size()) {
        char32_t cp = 0;
        const std::size_t len = decode(text, i, cp);
        if (len == 0) {
            fail(fmt::format("byte {} is not valid UTF-8; save the file as UTF-8 text", i + 1));
        }
        if ((cp < 0x20 && cp != U'\t' && cp != U'\n' && cp != U'\r') || cp == 0x7F) {
            fail(fmt::format("control character {}; only tab, line feed and carriage return may "
                             "appear",
                             code_point(cp)));
        }
        const bool ascii = cp < 0x80;
        const char c = static_cast<char>(cp);
        const bool in_string = state != State::normal && state != State::comment;
        if (!ascii && in_string && string_is_key) {
            fail(fmt::format("character {} in a quoted key; keys must be ASCII (non-ASCII text "
                             "may appear in string values and in comments)",
                             code_point(cp)));
        }
        if (escaped) {
            // The escaped character itself has no meaning here (toml++ judges the escape).
            escaped = false;
            line += c == '\n' ? 1 : 0;
            i += len;
            continue;
        }
        switch (state) {
        case State::normal:
            if (!ascii) {
                fail(fmt::format("character {} outside a quoted string or a comment; TOML allows "
                                 "non-ASCII characters only inside them",
                                 code_point(cp)));
            }
            if (c == '#') {
                state = State::comment;
            } else if ((c == '"' || c == '\'') &&
                       std::string_view("\n=[,{.").find(last) != std::string_view::npos) {
                string_is_key = key_expected;
                const bool triple = starts(i, std::string(3, c));
                state = c == '"' ? (triple ? State::ml_basic : State::basic)
                                 : (triple ? State::ml_literal : State::literal);
                if (triple) {
                    last = c;
                    i += 3;
                    continue;
                }
            } else if (c == '[') {
                nest.push_back(key_expected && nest.empty() ? Nest::header : Nest::array);
                key_expected = nest.back() == Nest::header;
            } else if (c == ']') {
                if (!nest.empty() && nest.back() != Nest::inline_table) {
                    nest.pop_back();
                }
                key_expected = false;
            } else if (c == '{') {
                nest.push_back(Nest::inline_table);
                key_expected = true;
            } else if (c == '}') {
                if (!nest.empty() && nest.back() == Nest::inline_table) {
                    nest.pop_back();
                }
                key_expected = false;
            } else if (c == '=') {
                key_expected = false;
            } else if (c == ',') {
                key_expected = !nest.empty() && nest.back() == Nest::inline_table;
            } else if (c == '\n') {
                end_of_line();
            }
            if (c == '\n') {
                last = '\n';
            } else if (c != ' ' && c != '\t' && c != '\r') {
                last = c;
            }
            break;
        case State::comment:
            if (c == '\n') {
                state = State::normal;
                end_of_line();
            }
            break;
        case State::basic:
            if (c == '\\' && i + 1 < text.size() && text[i + 1] != '\n') {
                escaped = true; // the next character cannot end the string
                i += 1;
                continue;
            }
            if (c == '"' || c == '\n') {
                state = State::normal; // a string ends at its quote (or, malformed, its line)
                if (c == '\n') {
                    end_of_line();
                }
            }
            break;
        case State::literal:
            if (c == '\'' || c == '\n') {
                state = State::normal;
                if (c == '\n') {
                    end_of_line();
                }
            }
            break;
        case State::ml_basic:
            if (after_line_end_backslash) {
                if (!ascii) {
                    fail(fmt::format("character {} right after a line-ending backslash in a "
                                     "multi-line string; put an ASCII character first",
                                     code_point(cp)));
                }
                if (c != ' ' && c != '\t' && c != '\n' && c != '\r') {
                    after_line_end_backslash = false;
                }
            }
            if (!after_line_end_backslash && c == '\\' && i + 1 < text.size()) {
                // toml++ tests the character after the backslash, and after any blanks that
                // follow it, for whitespace; no escape of TOML is a non-ASCII character, and a
                // backslash followed by blanks must end its line.
                std::size_t next = i + 1;
                while (next < text.size() &&
                       (text[next] == ' ' || text[next] == '\t' || text[next] == '\r')) {
                    ++next;
                }
                if (next < text.size() && static_cast<unsigned char>(text[next]) >= 0x80) {
                    fail("a backslash before a non-ASCII character in a multi-line string is "
                         "not an escape TOML knows");
                }
                // A backslash followed by optional blanks and a line end trims what follows.
                if (next < text.size() && text[next] == '\n') {
                    after_line_end_backslash = true;
                    i += 1;
                    continue;
                }
                escaped = true;
                i += 1;
                continue;
            }
            if (starts(i, "\"\"\"")) {
                i += 3;
                // Up to two more quotes belong to the string.
                for (int q = 0; q < 2 && i < text.size() && text[i] == '"'; ++q) {
                    ++i;
                }
                state = State::normal;
                continue;
            }
            break;
        case State::ml_literal:
            if (starts(i, "'''")) {
                i += 3;
                for (int q = 0; q < 2 && i < text.size() && text[i] == '\''; ++q) {
                    ++i;
                }
                state = State::normal;
                continue;
            }
            break;
        }
        if (c == '\n') {
            ++line;
        }
        i += len;
    }
}

} // namespace crewdose::planner
