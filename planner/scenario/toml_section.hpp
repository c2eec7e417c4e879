#pragma once
// Reading one TOML table of a scenario (the loader's and the routine expansion's one reader):
// each error names the file, the line and the key, says what is wrong and what is allowed;
// unknown keys are errors. Included only by planner/scenario/ sources (it includes toml++).
#include "planner/scenario/scenario.hpp"

#include "planner/scenario/toml.hpp"
#include <boost/date_time/gregorian/gregorian_types.hpp>
#include <fmt/format.h>

#include <cmath>
#include <optional>
#include <set>
#include <string>
#include <string_view>
#include <vector>

namespace crewdose::planner::toml_read {

/// Any length or coordinate of the geometry: 10 km.
constexpr double kMaxLength_m = 10000.0;

// A TOML date-time with its offset as a UTC time; nullopt outside the years Boost takes.
inline std::optional<Time> from_toml(const toml::date_time& v) {
    try {
        const boost::gregorian::date day(v.date.year, v.date.month, v.date.day);
        return Time(day, boost::posix_time::hours(v.time.hour) +
                             boost::posix_time::minutes(v.time.minute - v.offset->minutes) +
                             boost::posix_time::seconds(v.time.second) +
                             boost::posix_time::microseconds(v.time.nanosecond / 1000));
    } catch (const std::exception&) {
        return std::nullopt;
    }
}

/// Where a table made at load was written (an instance of a [[routine]]'s activity, whose
/// nodes have no lines of their own): every error names this line and ends with `note`.
struct Origin {
    SourceLocation where;
    std::string note; ///< e.g. " (the instance of 2035-06-10T09:00:00Z of the routine at line 80)"
};

class Section {
  public:
    Section(const toml::table& t, std::string file, std::string name, std::set<std::string> allowed,
            std::optional<Origin> origin = std::nullopt)
        : t_(t), file_(std::move(file)), name_(std::move(name)), allowed_(std::move(allowed)),
          origin_(std::move(origin)) {
        for (const auto& [key, node] : t_) {
            const std::string k(key.str());
            if (!allowed_.count(k)) {
                std::string list;
                for (const auto& a : allowed_) {
                    list += (list.empty() ? "" : ", ") + a;
                }
                throw InputError(at(node), name_ + "." + k,
                                 "unknown key; allowed here: " + list + note());
            }
        }
    }

    [[nodiscard]] SourceLocation where() const { return at(t_); }
    [[nodiscard]] SourceLocation at(const toml::node& n) const {
        return origin_ ? origin_->where
                       : SourceLocation{file_, static_cast<int>(n.source().begin.line)};
    }
    [[nodiscard]] std::string field(const std::string& key) const { return name_ + "." + key; }
    [[nodiscard]] bool has(const std::string& key) const { return t_.contains(key); }
    [[nodiscard]] const toml::node* node(const std::string& key) const { return t_.get(key); }

    [[noreturn]] void fail(const std::string& key, const std::string& problem) const {
        const toml::node* n = t_.get(key);
        throw InputError(n ? at(*n) : where(), field(key), problem + note());
    }

    const toml::node& need(const std::string& key) const {
        const toml::node* n = t_.get(key);
        if (!n) {
            throw InputError(where(), field(key), "is required here" + note());
        }
        return *n;
    }

    [[nodiscard]] std::string text(const std::string& key) const {
        const auto* s = need(key).as_string();
        if (!s) {
            fail(key, "must be a string");
        }
        return s->get();
    }
    [[nodiscard]] std::string text_or(const std::string& key, std::string fallback) const {
        return has(key) ? text(key) : std::move(fallback);
    }

    /// A finite number (TOML's nan and inf are refused: no input may carry a non-finite
    /// value into a dose).
    [[nodiscard]] double number(const std::string& key) const {
        const toml::node& n = need(key);
        double v = 0.0;
        if (const auto* d = n.as_floating_point()) {
            v = d->get();
        } else if (const auto* i = n.as_integer()) {
            v = static_cast<double>(i->get());
        } else {
            fail(key, "must be a number");
        }
        if (!std::isfinite(v)) {
            fail(key, "must be a finite number (nan and inf are not allowed)");
        }
        return v;
    }
    /// A number from `lo` to `hi` inclusive; `unit` ("m", "g/cm3", ...) goes into the message
    /// with the plausible range, which scenarios/README.md repeats.
    [[nodiscard]] double within(const std::string& key, double lo, double hi,
                                std::string_view unit) const {
        const double v = number(key);
        if (!(v >= lo && v <= hi)) {
            fail(key, fmt::format("{} is outside the allowed range {} to {}{}{}", v, lo, hi,
                                  unit.empty() ? "" : " ", unit));
        }
        return v;
    }
    /// A number above `lo` (exclusive) up to `hi`.
    [[nodiscard]] double above(const std::string& key, double lo, double hi,
                               std::string_view unit) const {
        const double v = number(key);
        if (!(v > lo && v <= hi)) {
            fail(key, fmt::format("{} is outside the allowed range: more than {} and at most "
                                  "{}{}{}",
                                  v, lo, hi, unit.empty() ? "" : " ", unit));
        }
        return v;
    }
    [[nodiscard]] bool boolean(const std::string& key) const {
        const auto* b = need(key).as_boolean();
        if (!b) {
            fail(key, "must be true or false");
        }
        return b->get();
    }

    [[nodiscard]] Time time(const std::string& key) const {
        const auto* dt = need(key).as_date_time();
        if (!dt || !dt->get().offset) {
            fail(key, "must be an RFC 3339 date-time with its UTC offset, e.g. "
                      "2031-05-01T06:00:00Z");
        }
        const auto t = from_toml(dt->get());
        if (!t) {
            fail(key, "the year must lie from 1400 to 9999");
        }
        return *t;
    }

    [[nodiscard]] std::vector<double> numbers(const std::string& key, std::size_t count) const {
        const auto* a = need(key).as_array();
        if (!a || (count != 0 && a->size() != count)) {
            fail(key, count ? fmt::format("must be an array of {} numbers", count)
                            : "must be an array of numbers");
        }
        std::vector<double> out;
        for (const auto& e : *a) {
            if (const auto* d = e.as_floating_point()) {
                out.push_back(d->get());
            } else if (const auto* i = e.as_integer()) {
                out.push_back(static_cast<double>(i->get()));
            } else {
                fail(key, "must hold numbers only");
            }
            if (!std::isfinite(out.back())) {
                fail(key, "must hold finite numbers");
            }
        }
        return out;
    }
    [[nodiscard]] habitats::Point3 point(const std::string& key) const {
        const auto v = numbers(key, 3);
        for (const double x : v) {
            if (!(std::abs(x) <= kMaxLength_m)) {
                fail(key, fmt::format("every coordinate must lie within +-{} m of the site origin",
                                      kMaxLength_m));
            }
        }
        return {v[0], v[1], v[2]};
    }
    [[nodiscard]] habitats::Vector3 unit_vector(const std::string& key) const {
        const auto v = numbers(key, 3);
        const habitats::Vector3 d{v[0], v[1], v[2]};
        if (!(habitats::length(d) > 0.0)) {
            fail(key, "must be a non-zero vector");
        }
        return habitats::normalized(d);
    }
    [[nodiscard]] std::vector<std::string> strings(const std::string& key) const {
        const toml::node& n = need(key);
        std::vector<std::string> out;
        if (const auto* s = n.as_string()) {
            out.push_back(s->get());
            return out;
        }
        const auto* a = n.as_array();
        if (!a) {
            fail(key, "must be a string or an array of strings");
        }
        for (const auto& e : *a) {
            const auto* s = e.as_string();
            if (!s) {
                fail(key, "must hold strings only");
            }
            out.push_back(s->get());
        }
        return out;
    }
    [[nodiscard]] const toml::table& table(const std::string& key) const {
        const auto* t = need(key).as_table();
        if (!t) {
            fail(key, "must be a table { ... }");
        }
        return *t;
    }

  private:
    [[nodiscard]] std::string note() const { return origin_ ? origin_->note : std::string(); }

    const toml::table& t_;
    std::string file_;
    std::string name_;
    std::set<std::string> allowed_;
    std::optional<Origin> origin_;
};

// Each [[name]] entry, or an error if `name` is not an array of tables.
inline std::vector<const toml::table*> entries(const toml::table& root, const std::string& name,
                                               const std::string& file) {
    std::vector<const toml::table*> out;
    const toml::node* n = root.get(name);
    if (!n) {
        return out;
    }
    const auto* arr = n->as_array();
    if (!arr || !arr->is_array_of_tables()) {
        throw InputError({file, static_cast<int>(n->source().begin.line)}, name,
                         "must be written as [[" + name + "]] entries");
    }
    for (const auto& e : *arr) {
        out.push_back(e.as_table());
    }
    return out;
}

} // namespace crewdose::planner::toml_read
