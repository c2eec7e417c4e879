#pragma once
#include <string>

namespace crewdose::planner {

/// Writes `contents` to `path` through a temporary file in the same folder and a rename, so a
/// failure never leaves half a file or destroys the old one. InputError (field "--out" or the
/// given field) when the folder cannot be written.
void write_file_atomically(const std::string& path, const std::string& contents,
                           const std::string& field);

} // namespace crewdose::planner
