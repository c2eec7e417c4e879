#include "planner/scenario/shielding_table_file.hpp"

#include "planner/scenario/input_error.hpp"
#include "planner/scenario/number_parse.hpp"

#include <fmt/format.h>

#include <cmath>
#include <filesystem>
#include <fstream>
#include <sstream>

namespace crewdose::planner {
namespace {

bool parse_number(const std::string& s, double& v) {
    const auto parsed = parse_finite(s);
    v = parsed.value_or(0.0);
    return parsed.has_value();
}

} // namespace

habitats::DirectionalShielding
parse_shielding_table(const std::string& text, const std::string& file_name,
                      const std::function<bool(const std::string&)>& known_material) {
    habitats::DirectionalShielding table;
    std::istringstream in(text);
    std::string line;
    int number = 0;
    // Until one row has been read the file may be something other than a table (a wrong
    // path): errors then say where, but quote nothing of it.
    bool looks_like_table = false; // a line has begun with three numbers
    auto quoted = [&looks_like_table](const std::string& token) {
        return looks_like_table ? fmt::format("'{}'", token.substr(0, 60))
                                : std::string("this line");
    };
    while (std::getline(in, line)) {
        ++number;
        const SourceLocation at{file_name, number};
        std::istringstream fields(line);
        std::string first;
        if (!(fields >> first) || first[0] == '#') {
            continue;
        }
        double xyz[3] = {0, 0, 0};
        std::string token = first;
        for (int k = 0; k < 3; ++k) {
            if (k > 0 && !(fields >> token)) {
                throw InputError(at, "direction", "needs three numbers dx dy dz before the layers");
            }
            if (!parse_number(token, xyz[k])) {
                throw InputError(at, "direction",
                                 fmt::format("{} does not start with three numbers; a row is "
                                             "'dx dy dz material=g_cm2 ...'",
                                             quoted(token)));
            }
        }
        looks_like_table = true;
        const habitats::Vector3 d{xyz[0], xyz[1], xyz[2]};
        const double len = habitats::length(d);
        if (!(len > 0.0)) {
            throw InputError(at, "direction", "is the zero vector; give any non-zero vector");
        }
        std::vector<habitats::PathSegment> path;
        while (fields >> token) {
            const auto eq = token.find('=');
            if (eq == std::string::npos || eq == 0) {
                throw InputError(at, "layer",
                                 fmt::format("{} is not material=g_cm2", quoted(token)));
            }
            const std::string id = token.substr(0, eq);
            double g = 0.0;
            if (!known_material(id)) {
                throw InputError(at, "layer",
                                 fmt::format("unknown material {}; see 'crewdose "
                                             "materials' or define it in the scenario",
                                             quoted(id)));
            }
            if (!parse_number(token.substr(eq + 1), g) || !(g >= 0.0 && g <= kMaxLayer_g_cm2)) {
                throw InputError(at, "layer",
                                 fmt::format("{}: the areal density must be a number from 0 to "
                                             "{} g/cm2",
                                             quoted(token), kMaxLayer_g_cm2));
            }
            path.push_back({id, g});
        }
        if (table.directions.size() == kMaxShieldingTableRows) {
            throw InputError(at, "table",
                             fmt::format("has more than {} direction rows, the most a location "
                                         "may have",
                                         kMaxShieldingTableRows));
        }
        table.directions.push_back((1.0 / len) * d);
        table.paths.push_back(std::move(path));
    }
    if (table.directions.empty()) {
        throw InputError({file_name, 0}, "table", "has no direction rows");
    }
    return table;
}

habitats::DirectionalShielding
read_shielding_table(const std::string& path,
                     const std::function<bool(const std::string&)>& known_material,
                     const SourceLocation& named_at, const std::string& field) {
    namespace fs = std::filesystem;
    std::error_code ec;
    const auto status = fs::status(path, ec);
    if (ec || !fs::exists(status)) {
        throw InputError(named_at, field, fmt::format("'{}' does not exist", path));
    }
    if (!fs::is_regular_file(status)) {
        throw InputError(named_at, field,
                         fmt::format("'{}' is not a regular file (a shielding table is a text "
                                     "file)",
                                     path));
    }
    const auto size = fs::file_size(path, ec);
    if (ec || size > kMaxShieldingTableBytes) {
        throw InputError(named_at, field,
                         fmt::format("'{}' is larger than {} MiB, the most a shielding table may "
                                     "be",
                                     path, kMaxShieldingTableBytes >> 20));
    }
    std::ifstream in(path, std::ios::binary);
    if (!in) {
        throw InputError(named_at, field, fmt::format("'{}' cannot be read", path));
    }
    std::string text(static_cast<std::size_t>(size), '\0');
    in.read(text.data(), static_cast<std::streamsize>(size));
    text.resize(static_cast<std::size_t>(in.gcount()));
    // A table is plain text: a NUL byte or a byte outside printable ASCII and whitespace says
    // the file is something else, and nothing of it is quoted back.
    for (const char c : text) {
        const auto u = static_cast<unsigned char>(c);
        if (!(u == '\t' || u == '\n' || u == '\r' || (u >= 0x20 && u < 0x7f))) {
            throw InputError(named_at, field,
                             fmt::format("'{}' is not a shielding table: it holds bytes other "
                                         "than printable ASCII text",
                                         path));
        }
    }
    return parse_shielding_table(text, path, known_material);
}

} // namespace crewdose::planner
