#include "atomic_file.hpp"

#include "input_error.hpp"

#include <cstdio>
#include <filesystem>
#include <fstream>

namespace crewdose::planner {

void write_file_atomically(const std::string& path, const std::string& contents,
                           const std::string& field) {
    namespace fs = std::filesystem;
    const fs::path target(path);
    const fs::path temp = target.parent_path() / (target.filename().string() + ".crewdose-tmp");
    {
        std::ofstream out(temp, std::ios::binary | std::ios::trunc);
        if (!out) {
            throw InputError({"command line", 0}, field,
                             "cannot write '" + temp.string() +
                                 "'; check the folder exists and "
                                 "is writable");
        }
        out << contents;
        out.flush();
        if (!out) {
            std::error_code ec;
            fs::remove(temp, ec);
            throw InputError({"command line", 0}, field, "writing '" + temp.string() + "' failed");
        }
    }
    std::error_code ec;
    fs::rename(temp, target, ec);
    if (ec) {
        fs::remove(temp, ec);
        throw InputError({"command line", 0}, field,
                         "cannot replace '" + path + "': " + ec.message());
    }
}

} // namespace crewdose::planner
