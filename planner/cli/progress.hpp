#pragma once
// A progress line on standard error for runs that take more than about a second. Shown only
// when standard error is a terminal (never in CI, never into a file or a pipe) and the user did
// not ask for --quiet; it uses no colour or other escape sequence (only a carriage return), so
// NO_COLOR and dumb terminals read it as plain text. The report itself never depends on it.
#include <chrono>
#include <mutex>
#include <string>

namespace crewdose::cli {

class ProgressLine {
  public:
    /// `quiet`: the user's --quiet; the line is also off when standard error is not a terminal
    /// or TERM is "dumb".
    explicit ProgressLine(bool quiet);
    ~ProgressLine();
    ProgressLine(const ProgressLine&) = delete;
    ProgressLine& operator=(const ProgressLine&) = delete;
    ProgressLine(ProgressLine&&) = delete;
    ProgressLine& operator=(ProgressLine&&) = delete;

    /// The stage now running ("computing the locations' responses"); its fraction starts at 0.
    void stage(const std::string& label);
    /// The share of the stage done, 0 to 1 (a NaN or out-of-range value is clamped). Safe to
    /// call from any thread; the line is drawn at most ten times a second and only after the
    /// run has taken a second.
    void update(double fraction);
    /// Clears the line (also done on destruction), so that what follows starts on a clean line.
    void finish();

    /// Whether the line can show at all (terminal, not quiet).
    [[nodiscard]] bool enabled() const noexcept { return enabled_; }

    /// The text drawn for a stage and fraction, without the carriage return: "label  37 %
    /// [#######             ]" (for the tests).
    [[nodiscard]] static std::string render(const std::string& label, double fraction);

  private:
    bool enabled_ = false;
    bool shown_ = false;
    std::size_t width_ = 0;
    std::string label_;
    std::chrono::steady_clock::time_point started_;
    std::chrono::steady_clock::time_point last_drawn_;
    std::mutex mutex_;
};

} // namespace crewdose::cli
