#include "shielding_table_file.hpp"

#include "input_error.hpp"
#include "number_parse.hpp"

#include <fmt/format.h>

#include <cmath>
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
                                 fmt::format("'{}' is not a number; a row is 'dx dy dz "
                                             "material=g_cm2 ...'",
                                             token));
            }
        }
        const habitats::Vector3 d{xyz[0], xyz[1], xyz[2]};
        const double len = habitats::length(d);
        if (!(len > 0.0)) {
            throw InputError(at, "direction", "is the zero vector; give any non-zero vector");
        }
        std::vector<habitats::PathSegment> path;
        while (fields >> token) {
            const auto eq = token.find('=');
            if (eq == std::string::npos || eq == 0) {
                throw InputError(at, "layer", fmt::format("'{}' is not material=g_cm2", token));
            }
            const std::string id = token.substr(0, eq);
            double g = 0.0;
            if (!known_material(id)) {
                throw InputError(at, "layer",
                                 fmt::format("unknown material '{}'; see 'crewdose "
                                             "materials' or define it in the scenario",
                                             id));
            }
            if (!parse_number(token.substr(eq + 1), g) || g < 0.0) {
                throw InputError(
                    at, "layer",
                    fmt::format("'{}': the areal density must be a number >= 0 g/cm2", token));
            }
            path.push_back({id, g});
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
                     const std::function<bool(const std::string&)>& known_material) {
    std::ifstream in(path);
    if (!in) {
        throw InputError({path, 0}, "file", "cannot be read");
    }
    std::ostringstream buf;
    buf << in.rdbuf();
    return parse_shielding_table(buf.str(), path, known_material);
}

} // namespace crewdose::planner
