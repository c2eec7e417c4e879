#include "planner/report/svg_plot.hpp"

#include "planner/report/number_format.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <array>
#include <cmath>
#include <limits>
#include <optional>
#include <utility>

namespace crewdose::planner::svg {
namespace {

// Layout in SVG user units (pixels at 100 %): a page 960 wide, the plot between kPlotLeft and
// kPlotRight, the labels at the curves' ends to the right of it.
constexpr double kWidth = 960.0;
constexpr double kPlotLeft = 96.0;
constexpr double kPlotRight = 740.0;
constexpr double kPlotHeight = 220.0;
constexpr double kLaneHeight = 14.0;
// Mean advance of a character at 11-12 px in a sans-serif font: only for laying out the legend.
constexpr double kCharWidth = 6.6;
// Characters per line of the wrapped notes: about 900 units at 11 px, 820 at 12 px.
constexpr std::size_t kNoteColumns = 140;
constexpr std::size_t kBoxColumns = 120;

// The Okabe-Ito palette, chosen to stay apart for the common colour-vision deficiencies; the
// dash patterns beside them carry the same distinction without colour (in print, in grey).
constexpr std::array<const char*, 6> kColours{"#0072B2", "#D55E00", "#009E73",
                                              "#CC79A7", "#E69F00", "#56B4E9"};
constexpr std::array<const char*, 6> kDashes{"", "8 4", "2 3", "10 3 2 3", "4 2", "1 3"};
// Limit and target lines: black, long dashes, unlike every series.
constexpr const char* kLevelDash = "16 5";
// A white outline behind labels drawn over the plot, so that lines do not cross their letters.
constexpr const char* kHalo = R"( paint-order="stroke" stroke="#ffffff" stroke-width="3")";

// A coordinate: two decimals (a hundredth of a pixel), never "-0.00".
std::string num(double v) {
    if (std::abs(v) < 0.005) {
        v = 0.0;
    }
    return fmt::format("{:.2f}", v);
}

void text(std::string& out, double x, double y, const std::string& s, const std::string& attrs) {
    out +=
        fmt::format("<text x=\"{}\" y=\"{}\"{}>{}</text>\n", num(x), num(y), attrs, xml_escape(s));
}

std::vector<std::string> lines_of(const std::string& wrapped) {
    std::vector<std::string> lines;
    std::size_t start = 0;
    while (start < wrapped.size()) {
        const auto end = wrapped.find('\n', start);
        lines.push_back(wrapped.substr(start, end - start));
        if (end == std::string::npos) {
            break;
        }
        start = end + 1;
    }
    return lines;
}

std::string band_fill(const std::string& id, std::size_t kind) {
    return fmt::format("url(#{}-band-{})", id, kind);
}

// One hatching per kind of band: diagonal lines, dots, a cross-hatch, vertical lines.
std::string pattern_defs(const std::string& id, std::size_t kinds) {
    std::string out;
    for (std::size_t k = 0; k < kinds; ++k) {
        out += fmt::format(R"(<pattern id="{}-band-{}" width="8" height="8" )"
                           R"(patternUnits="userSpaceOnUse">)",
                           id, k);
        out += R"(<rect width="8" height="8" fill="#eeeeee"/>)";
        switch (k % 4) {
        case 0:
            out += R"(<path d="M-2,2 L2,-2 M0,8 L8,0 M6,10 L10,6" stroke="#444444")"
                   R"( stroke-width="1.2"/>)";
            break;
        case 1:
            out += R"(<circle cx="4" cy="4" r="1.6" fill="#444444"/>)";
            break;
        case 2:
            out += R"(<path d="M0,0 L8,8 M8,0 L0,8" stroke="#444444" stroke-width="0.9"/>)";
            break;
        default:
            out += R"(<path d="M4,0 L4,8" stroke="#444444" stroke-width="1.2"/>)";
            break;
        }
        out += "</pattern>\n";
    }
    return out;
}

std::string dash_attr(std::size_t i) {
    const char* dash = kDashes[i % kDashes.size()];
    return *dash ? fmt::format(" stroke-dasharray=\"{}\"", dash) : std::string();
}

const char* colour(std::size_t i) {
    return kColours[i % kColours.size()];
}

// A short sample of series i's line, from x0 to x1 at height y.
void line_sample(std::string& out, std::size_t i, double x0, double x1, double y) {
    out += fmt::format(R"(<line x1="{}" y1="{}" x2="{}" y2="{}" stroke="{}" stroke-width="2"{}/>)"
                       "\n",
                       num(x0), num(y), num(x1), num(y), colour(i), dash_attr(i));
}

struct Range {
    double lo = std::numeric_limits<double>::infinity();
    double hi = -std::numeric_limits<double>::infinity();
    void add(double v) {
        lo = std::min(lo, v);
        hi = std::max(hi, v);
    }
    [[nodiscard]] bool empty() const { return !(lo <= hi); }
};

// Draws one chart with its top at `top`; returns the height used.
double render_chart(std::string& out, const Chart& c, double top, const std::string& id) {
    double y = top;
    out += "<g class=\"chart\">\n";
    text(out, kPlotLeft, y + 13, c.title,
         R"( class="chart-title" font-size="13" font-weight="bold")");
    y += 24;

    Range xr;
    Range yr;
    for (const auto& s : c.series) {
        for (std::size_t j = 0; j < s.x.size() && j < s.y.size(); ++j) {
            if (std::isfinite(s.x[j])) {
                xr.add(s.x[j]);
                if (drawable(s.y[j], c.y_non_negative)) {
                    yr.add(s.y[j]);
                }
            }
        }
    }
    for (const auto& l : c.levels) {
        if (std::isfinite(l.y)) {
            yr.add(l.y);
        }
    }
    if (xr.empty()) {
        xr.add(0.0);
        xr.add(1.0);
    }
    if (yr.empty()) {
        yr.add(0.0);
        yr.add(1.0);
    }
    if (c.x.from_zero) {
        xr.add(0.0);
    }
    if (c.y.from_zero) {
        yr.add(0.0);
    }
    if (!c.y.exact) {
        // Room above the highest value or limit, so that a line is never drawn on the frame.
        yr.hi += 0.04 * (yr.hi - yr.lo);
    }
    const Ticks xt = choose_ticks(xr.lo, xr.hi, c.x.exact, 8);
    const Ticks yt = choose_ticks(yr.lo, yr.hi, c.y.exact, 6);
    const double plot_top = y;
    const double plot_bottom = y + kPlotHeight;
    const auto X = [&](double v) {
        return kPlotLeft + (v - xt.lo) / (xt.hi - xt.lo) * (kPlotRight - kPlotLeft);
    };
    const auto Y = [&](double v) {
        return plot_bottom - (v - yt.lo) / (yt.hi - yt.lo) * kPlotHeight;
    };
    const auto clamp_x = [&](double v) {
        return std::clamp(v, xt.lo, xt.hi);
    };

    // Shaded bands behind everything, half transparent so that the grid shows through.
    for (const auto& b : c.bands) {
        const double x0 = clamp_x(b.x0);
        const double x1 = clamp_x(b.x1);
        if (!(x1 > x0) || b.kind >= c.band_kinds.size()) {
            continue;
        }
        const double w = std::max(1.0, X(x1) - X(x0));
        out +=
            fmt::format(R"(<rect class="band" x="{}" y="{}" width="{}" height="{}" fill="{}" )"
                        R"(fill-opacity="0.6"/>)"
                        "\n",
                        num(X(x0)), num(plot_top), num(w), num(kPlotHeight), band_fill(id, b.kind));
    }
    // Grid and y ticks.
    for (const double v : yt.values) {
        out += fmt::format(R"(<line class="grid" x1="{}" y1="{}" x2="{}" y2="{}" stroke="#cccccc")"
                           R"( stroke-width="0.8"/>)"
                           "\n",
                           num(kPlotLeft), num(Y(v)), num(kPlotRight), num(Y(v)));
        text(out, kPlotLeft - 6, Y(v), tick_label(v, yt.decimals),
             R"( class="y-tick" font-size="11" text-anchor="end" dominant-baseline="middle")");
    }
    for (const double v : xt.values) {
        out += fmt::format(R"(<line x1="{}" y1="{}" x2="{}" y2="{}" stroke="#000000"/>)"
                           "\n",
                           num(X(v)), num(plot_bottom), num(X(v)), num(plot_bottom + 5));
        text(out, X(v), plot_bottom + 17, tick_label(v, xt.decimals),
             R"( class="x-tick" font-size="11" text-anchor="middle")");
    }
    // Event markers: a dotted vertical line, the label at its top (staggered in three rows so
    // that neighbouring labels do not print over each other).
    for (std::size_t k = 0; k < c.markers.size(); ++k) {
        const auto& m = c.markers[k];
        if (!(m.x >= xt.lo && m.x <= xt.hi)) {
            continue;
        }
        out += fmt::format(R"(<line class="marker" x1="{}" y1="{}" x2="{}" y2="{}" )"
                           R"(stroke="#333333" stroke-width="1.2" stroke-dasharray="3 3"/>)"
                           "\n",
                           num(X(m.x)), num(plot_top), num(X(m.x)), num(plot_bottom));
        const bool left = X(m.x) > (kPlotLeft + kPlotRight) / 2;
        text(out, X(m.x) + (left ? -4.0 : 4.0), plot_top + 13 + 13 * static_cast<double>(k % 3),
             m.label,
             fmt::format(R"( class="marker-label" font-size="11" text-anchor="{}"{})",
                         left ? "end" : "start", kHalo));
    }
    // Limit and target lines, each labelled above its line (below it near the top).
    std::vector<std::string> notes = c.notes;
    for (const auto& l : c.levels) {
        if (!std::isfinite(l.y)) {
            notes.push_back(l.label + ": not computed, not drawn");
            continue;
        }
        const double py = Y(l.y);
        out += fmt::format(R"(<line class="level" x1="{}" y1="{}" x2="{}" y2="{}" )"
                           R"(stroke="#000000" stroke-width="1.6" stroke-dasharray="{}"/>)"
                           "\n",
                           num(kPlotLeft), num(py), num(kPlotRight), num(py), kLevelDash);
        text(out, kPlotRight - 4, py - 13 < plot_top ? py + 13 : py - 5, l.label,
             fmt::format(R"( class="level-label" font-size="11" text-anchor="end"{})", kHalo));
    }
    // The series: a path per series, broken wherever a value was not computed; that stretch
    // is outlined and labelled "not computed".
    std::vector<std::pair<double, std::size_t>> ends; // y of each series' last drawn point
    for (std::size_t i = 0; i < c.series.size(); ++i) {
        const auto& s = c.series[i];
        const std::size_t n = std::min(s.x.size(), s.y.size());
        std::string d;
        std::string points;
        std::size_t run = 0; // points in the current unbroken stretch
        std::size_t missing = 0;
        std::size_t first_missing = n;
        std::size_t last_missing = n;
        std::size_t last_drawn = n;
        std::optional<double> last_y;
        const auto close_run = [&] {
            // A lone point has no line: mark it so that it is seen.
            if (run == 1 && !s.show_points) {
                points += fmt::format(R"(<circle cx="{}" cy="{}" r="2.5" fill="{}"/>)"
                                      "\n",
                                      num(X(s.x[last_drawn])), num(Y(s.y[last_drawn])), colour(i));
            }
            run = 0;
        };
        const auto close_gap = [&] {
            if (first_missing == n) {
                return;
            }
            const double x0 = X(s.x[first_missing]);
            const double x1 = X(s.x[last_missing]);
            out += fmt::format(R"(<rect class="not-computed" x="{}" y="{}" width="{}" )"
                               R"(height="{}" fill="none" stroke="#000000" )"
                               R"(stroke-dasharray="1 2"/>)"
                               "\n",
                               num(x0 - 1), num(plot_top), num(x1 - x0 + 2), num(kPlotHeight));
            text(out, x0 + 3, plot_bottom - 6, "not computed",
                 fmt::format(R"( class="not-computed-label" font-size="11"{})", kHalo));
            first_missing = n;
        };
        for (std::size_t j = 0; j < n; ++j) {
            if (!std::isfinite(s.x[j])) {
                continue;
            }
            if (drawable(s.y[j], c.y_non_negative)) {
                close_gap();
                d += fmt::format("{}{},{}", run == 0 ? (d.empty() ? "M" : " M") : " L",
                                 num(X(s.x[j])), num(Y(s.y[j])));
                ++run;
                last_drawn = j;
                last_y = s.y[j];
                if (s.show_points) {
                    points += fmt::format(R"(<circle cx="{}" cy="{}" r="3" fill="#ffffff" )"
                                          R"(stroke="{}" stroke-width="1.5"/>)"
                                          "\n",
                                          num(X(s.x[j])), num(Y(s.y[j])), colour(i));
                }
            } else {
                if (run > 0) {
                    close_run();
                }
                if (first_missing == n) {
                    first_missing = j;
                }
                last_missing = j;
                ++missing;
            }
        }
        if (run > 0) {
            close_run();
        }
        close_gap();
        if (!d.empty()) {
            out += fmt::format(R"(<path class="series" data-label="{}" d="{}" fill="none" )"
                               R"(stroke="{}" stroke-width="2" stroke-linejoin="round"{}/>)"
                               "\n",
                               xml_escape(s.label), d, colour(i), dash_attr(i));
        }
        out += points;
        if (missing > 0) {
            notes.push_back(fmt::format("{}: {} of {} values not computed; they are not drawn "
                                        "and the line breaks there",
                                        s.label, missing, n));
        }
        if (last_y) {
            ends.emplace_back(Y(*last_y), i);
        }
    }
    out +=
        fmt::format(R"(<rect class="frame" x="{}" y="{}" width="{}" height="{}" fill="none" )"
                    R"(stroke="#000000"/>)"
                    "\n",
                    num(kPlotLeft), num(plot_top), num(kPlotRight - kPlotLeft), num(kPlotHeight));
    // Each series' label at the height of its last drawn point, with a sample of its line;
    // labels closer than a line apart are pushed down, then the lowest back up so that none
    // falls below the plot onto the x axis's tick labels (several curves ending near zero).
    std::sort(ends.begin(), ends.end());
    std::vector<double> label_y;
    double previous = -std::numeric_limits<double>::infinity();
    for (const auto& end : ends) {
        label_y.push_back(std::max(end.first, previous + 13));
        previous = label_y.back();
    }
    double lowest = plot_bottom;
    for (std::size_t k = label_y.size(); k-- > 0;) {
        label_y[k] = std::min(label_y[k], lowest);
        lowest = label_y[k] - 13;
    }
    for (std::size_t k = 0; k < ends.size(); ++k) {
        const std::size_t i = ends[k].second;
        line_sample(out, i, kPlotRight + 4, kPlotRight + 22, label_y[k]);
        text(out, kPlotRight + 26, label_y[k], c.series[i].label,
             R"( class="series-label" font-size="11" dominant-baseline="middle")");
    }
    // Axis titles.
    const double mid_y = (plot_top + plot_bottom) / 2;
    text(out, kPlotLeft - 62, mid_y, c.y.title,
         fmt::format(R"( class="axis-title" font-size="12" text-anchor="middle" )"
                     R"x(transform="rotate(-90 {} {})")x",
                     num(kPlotLeft - 62), num(mid_y)));
    text(out, (kPlotLeft + kPlotRight) / 2, plot_bottom + 34, c.x.title,
         R"( class="axis-title" font-size="12" text-anchor="middle")");
    y = plot_bottom + 44;
    // A labelled row per kind of band, on the plot's x scale: narrow stretches stay visible
    // here, and the row's name says what they are.
    const auto shown = [&](std::size_t k) {
        return !c.hide_empty_band_kinds || std::any_of(c.bands.begin(), c.bands.end(),
                                                       [k](const Band& b) { return b.kind == k; });
    };
    for (std::size_t k = 0; k < c.band_kinds.size(); ++k) {
        if (!shown(k)) {
            continue;
        }
        text(out, kPlotLeft - 6, y + kLaneHeight / 2, c.band_kinds[k],
             R"( class="lane-label" font-size="11" text-anchor="end" dominant-baseline="middle")");
        out += fmt::format(R"(<rect x="{}" y="{}" width="{}" height="{}" fill="none" )"
                           R"(stroke="#999999" stroke-width="0.5"/>)"
                           "\n",
                           num(kPlotLeft), num(y), num(kPlotRight - kPlotLeft), num(kLaneHeight));
        for (const auto& b : c.bands) {
            const double x0 = clamp_x(b.x0);
            const double x1 = clamp_x(b.x1);
            if (b.kind != k || !(x1 > x0)) {
                continue;
            }
            out += fmt::format(R"(<rect class="lane" x="{}" y="{}" width="{}" height="{}" )"
                               R"(fill="{}" stroke="#333333" stroke-width="0.5"/>)"
                               "\n",
                               num(X(x0)), num(y + 1), num(std::max(1.5, X(x1) - X(x0))),
                               num(kLaneHeight - 2), band_fill(id, k));
        }
        y += kLaneHeight + 2;
    }
    // Legend: the series, then the kinds of band.
    y += 8;
    double lx = kPlotLeft;
    const auto place = [&](double width) {
        if (lx + width > kWidth - 16 && lx > kPlotLeft) {
            lx = kPlotLeft;
            y += 16;
        }
        const double at = lx;
        lx += width;
        return at;
    };
    for (std::size_t i = 0; i < c.series.size(); ++i) {
        const auto& label = c.series[i].label;
        const double at = place(38 + kCharWidth * static_cast<double>(label.size()));
        line_sample(out, i, at, at + 26, y + 6);
        text(out, at + 30, y + 6, label,
             R"( class="legend" font-size="11" dominant-baseline="middle")");
    }
    for (std::size_t k = 0; k < c.band_kinds.size(); ++k) {
        if (!shown(k)) {
            continue;
        }
        const std::string label = "shaded: " + c.band_kinds[k];
        const double at = place(34 + kCharWidth * static_cast<double>(label.size()));
        out += fmt::format(R"(<rect x="{}" y="{}" width="22" height="11" fill="{}" )"
                           R"(stroke="#333333" stroke-width="0.5"/>)"
                           "\n",
                           num(at), num(y + 0.5), band_fill(id, k));
        text(out, at + 26, y + 6, label,
             R"( class="legend" font-size="11" dominant-baseline="middle")");
    }
    y += 20;
    for (const auto& note : notes) {
        for (const auto& line : lines_of(wrap(note, kNoteColumns, "  "))) {
            text(out, kPlotLeft, y + 10, line, R"( class="chart-note" font-size="11")");
            y += 14;
        }
    }
    out += "</g>\n";
    return y + 14 - top;
}

} // namespace

bool drawable(double value, bool non_negative) {
    return std::isfinite(value) && (!non_negative || value >= 0.0);
}

Ticks choose_ticks(double lo, double hi, bool exact, int target) {
    Ticks t;
    if (!std::isfinite(lo) || !std::isfinite(hi)) {
        lo = 0.0;
        hi = 1.0;
    }
    if (!(hi > lo)) {
        hi = lo + (lo == 0.0 ? 1.0 : 0.1 * std::abs(lo));
    }
    const double raw = (hi - lo) / std::max(1, target);
    const double magnitude = std::pow(10.0, std::floor(std::log10(raw)));
    const double f = raw / magnitude;
    const double nice = f <= 1.0 ? 1.0 : f <= 2.0 ? 2.0 : f <= 5.0 ? 5.0 : 10.0;
    t.step = nice * magnitude;
    // The small slack keeps a value a rounding error past a tick on that tick.
    constexpr double kSlack = 1e-9;
    if (exact) {
        t.lo = lo;
        t.hi = hi;
    } else {
        t.lo = std::floor(lo / t.step + kSlack) * t.step;
        t.hi = std::ceil(hi / t.step - kSlack) * t.step;
    }
    const auto k0 = static_cast<long long>(std::ceil(t.lo / t.step - kSlack));
    const auto k1 = static_cast<long long>(std::floor(t.hi / t.step + kSlack));
    for (long long k = k0; k <= k1; ++k) {
        const double v = static_cast<double>(k) * t.step;
        t.values.push_back(std::abs(v) < kSlack * t.step ? 0.0 : v);
    }
    t.decimals = std::max(0, -static_cast<int>(std::floor(std::log10(t.step) + kSlack)));
    return t;
}

std::string tick_label(double value, int decimals) {
    if (std::abs(value) < 0.5 * std::pow(10.0, -decimals)) {
        value = 0.0;
    }
    return fmt::format("{:.{}f}", value, decimals);
}

std::string xml_escape(const std::string& s) {
    std::string out;
    out.reserve(s.size());
    for (const char ch : s) {
        switch (ch) {
        case '&':
            out += "&amp;";
            break;
        case '<':
            out += "&lt;";
            break;
        case '>':
            out += "&gt;";
            break;
        case '"':
            out += "&quot;";
            break;
        case '\'':
            out += "&apos;";
            break;
        default:
            // XML 1.0 allows no control characters but tab, newline and return; all of them
            // become spaces (a label is one line).
            out += static_cast<unsigned char>(ch) < 0x20 ? ' ' : ch;
            break;
        }
    }
    return out;
}

std::string render_svg(const Figure& f) {
    std::string body;
    double y = 12;
    text(body, 16, y + 16, f.title, R"( class="figure-title" font-size="16" font-weight="bold")");
    y += 26;
    for (const auto& subtitle : f.subtitle) {
        for (const auto& line : lines_of(wrap(subtitle, kBoxColumns, "  "))) {
            text(body, 16, y + 12, line, R"( class="subtitle" font-size="12")");
            y += 16;
        }
    }
    if (!f.boxed_note.empty()) {
        const auto lines = lines_of(wrap(f.boxed_note, kBoxColumns));
        const double h = 10 + 15 * static_cast<double>(lines.size());
        body += fmt::format(R"(<rect class="note-box" x="12" y="{}" width="{}" height="{}" )"
                            R"(fill="#ffffff" stroke="#000000" stroke-width="1.5"/>)"
                            "\n",
                            num(y + 4), num(kWidth - 24), num(h));
        double ly = y + 4 + 5;
        for (const auto& line : lines) {
            text(body, 20, ly + 11, line, R"( class="note" font-size="12")");
            ly += 15;
        }
        y += h + 16;
    }
    std::size_t band_kinds = 0;
    for (const auto& p : f.panels) {
        body += fmt::format("<g class=\"panel\" data-heading=\"{}\">\n", xml_escape(p.heading));
        body += fmt::format(R"(<line x1="12" y1="{}" x2="{}" y2="{}" stroke="#000000"/>)"
                            "\n",
                            num(y + 4), num(kWidth - 12), num(y + 4));
        text(body, 16, y + 22, p.heading,
             R"( class="panel-heading" font-size="14" font-weight="bold")");
        y += 32;
        for (const auto& c : p.charts) {
            band_kinds = std::max(band_kinds, c.band_kinds.size());
            y += render_chart(body, c, y, f.id);
        }
        body += "</g>\n";
    }
    const double height = std::ceil(y + 8);
    std::string out = "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n";
    out += fmt::format(R"(<svg xmlns="http://www.w3.org/2000/svg" width="{}" height="{}" )"
                       R"(viewBox="0 0 {} {}" font-family="DejaVu Sans, Arial, sans-serif" )"
                       R"(role="img">)"
                       "\n",
                       kWidth, height, kWidth, height);
    out += fmt::format("<title>{}</title>\n", xml_escape(f.title));
    out += "<defs>\n" + pattern_defs(f.id, band_kinds) + "</defs>\n";
    out += fmt::format(R"(<rect width="{}" height="{}" fill="#ffffff"/>)"
                       "\n",
                       kWidth, height);
    return out + body + "</svg>\n";
}

} // namespace crewdose::planner::svg
