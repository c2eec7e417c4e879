#pragma once
// Running the crewdose binary (or any shell command) from a test: what every CLI test file needs.
#include <array>
#include <cstdio>
#include <cstdlib>
#include <stdexcept>
#include <string>
#include <sys/wait.h>

/// What a command printed on standard output, and its exit code (-1 if it did not exit
/// normally, for example on a signal).
struct ShellResult {
    int exit_code = -1;
    std::string out;
};

/// Runs `command` with /bin/sh; std::runtime_error if no shell can be started. The command's
/// cache across runs is the tests' own folder under the build tree (tests/CMakeLists.txt),
/// however the test program was started, unless the command sets XDG_CACHE_HOME itself.
inline ShellResult run_shell(const std::string& command) {
    ::setenv("XDG_CACHE_HOME", CREWDOSE_TEST_CACHE_HOME, 1);
    ShellResult r;
    FILE* pipe = popen(command.c_str(), "r");
    if (pipe == nullptr) {
        throw std::runtime_error("cannot start: " + command);
    }
    std::array<char, 4096> buf{};
    std::size_t n = 0;
    while ((n = std::fread(buf.data(), 1, buf.size(), pipe)) > 0) {
        r.out.append(buf.data(), n);
    }
    const int status = pclose(pipe);
    r.exit_code = WIFEXITED(status) ? WEXITSTATUS(status) : -1;
    return r;
}
