#include "planner/cli/progress.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <cstring>
#include <unistd.h>

namespace crewdose::cli {

namespace {
constexpr auto kQuietFor = std::chrono::seconds(1);
constexpr auto kRedrawEvery = std::chrono::milliseconds(100);
constexpr std::size_t kBarWidth = 20;

bool terminal_wanted() {
    if (isatty(fileno(stderr)) == 0) {
        return false;
    }
    const char* term = std::getenv("TERM");
    return !(term && std::strcmp(term, "dumb") == 0);
}
} // namespace

ProgressLine::ProgressLine(bool quiet)
    : enabled_(!quiet && terminal_wanted()), started_(std::chrono::steady_clock::now()) {}

ProgressLine::~ProgressLine() {
    finish();
}

std::string ProgressLine::render(const std::string& label, double fraction) {
    const double f = std::isfinite(fraction) ? std::clamp(fraction, 0.0, 1.0) : 0.0;
    const auto filled = static_cast<std::size_t>(std::floor(f * kBarWidth));
    return fmt::format("{} {:3.0f} % [{}{}]", label, 100.0 * f, std::string(filled, '#'),
                       std::string(kBarWidth - filled, ' '));
}

void ProgressLine::stage(const std::string& label) {
    {
        const std::lock_guard<std::mutex> lock(mutex_);
        label_ = label;
        last_drawn_ = {};
    }
    update(0.0);
}

void ProgressLine::update(double fraction) {
    if (!enabled_) {
        return;
    }
    const std::lock_guard<std::mutex> lock(mutex_);
    const auto now = std::chrono::steady_clock::now();
    if (now - started_ < kQuietFor || now - last_drawn_ < kRedrawEvery) {
        return;
    }
    last_drawn_ = now;
    const std::string text = render(label_, fraction);
    // Pad over a longer line drawn before, then go back to the line's start.
    const std::size_t pad = width_ > text.size() ? width_ - text.size() : 0;
    std::fprintf(stderr, "\r%s%*s", text.c_str(), static_cast<int>(pad), "");
    std::fflush(stderr);
    width_ = std::max(width_, text.size());
    shown_ = true;
}

void ProgressLine::finish() {
    const std::lock_guard<std::mutex> lock(mutex_);
    if (shown_) {
        std::fprintf(stderr, "\r%*s\r", static_cast<int>(width_), "");
        std::fflush(stderr);
        shown_ = false;
        width_ = 0;
    }
}

} // namespace crewdose::cli
