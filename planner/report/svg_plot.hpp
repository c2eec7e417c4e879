#pragma once
// A small SVG writer for line charts: the figure model (panels of charts with series, limit
// lines, shaded bands and event markers) and one function that draws it. No physics, no
// ledger: the report files build a Figure from their results and call render_svg().
//
// Output is deterministic (coordinates with two decimals, ids from the figure's own prefix,
// no time stamp) and self-contained (no scripts, fonts or links). Meaning never rests on
// colour alone: every series has its own dash pattern and a label at its end, limit lines are
// labelled where they are drawn, each kind of band has its own hatching and its own labelled
// row under the plot.
#include <algorithm>
#include <cstddef>
#include <numeric>
#include <string>
#include <utility>
#include <vector>

namespace crewdose::planner::svg {

/// A value that can be drawn: finite and, for a quantity that cannot be negative, not below
/// zero. Anything else was not computed: the line breaks there and the chart says so.
[[nodiscard]] bool drawable(double value, bool non_negative);

/// One curve. `y` values that are not drawable() are never drawn as values.
struct Series {
    std::string label;        ///< legend text and the label at the curve's end
    std::vector<double> x;    ///< in the x axis's unit, ascending
    std::vector<double> y;    ///< in the y axis's unit; same length as x
    bool show_points = false; ///< a small circle at each drawn point
};

/// A series through `rows`, a point (x_of(row), y_of(row)) per row, in ascending x (rows with
/// equal x keep their order): for results kept in the order they were asked for. x_of must give
/// finite values; y_of may give any (a value not drawable() is drawn as "not computed").
template <class Row, class XOf, class YOf>
[[nodiscard]] Series series_by_x(std::string label, const std::vector<Row>& rows, XOf x_of,
                                 YOf y_of, bool show_points = false) {
    std::vector<std::size_t> order(rows.size());
    std::iota(order.begin(), order.end(), std::size_t{0});
    std::stable_sort(order.begin(), order.end(),
                     [&](std::size_t a, std::size_t b) { return x_of(rows[a]) < x_of(rows[b]); });
    Series s;
    s.label = std::move(label);
    s.show_points = show_points;
    for (const std::size_t i : order) {
        s.x.push_back(x_of(rows[i]));
        s.y.push_back(y_of(rows[i]));
    }
    return s;
}

/// A horizontal line at a fixed value (a limit or a target), labelled on the chart.
struct LevelLine {
    double y = 0.0;
    std::string label;
};

/// A shaded stretch of the x axis of one kind (an index into Chart::band_kinds).
struct Band {
    double x0 = 0.0;
    double x1 = 0.0;
    std::size_t kind = 0;
};

/// A vertical line at one x value, labelled on the chart.
struct Marker {
    double x = 0.0;
    std::string label;
};

struct Axis {
    std::string title; ///< with the unit, e.g. "dose (mGy-Eq)"
    /// The axis spans exactly the data (false: widened to the nearest round ticks).
    bool exact = false;
    /// The axis starts at zero (doses: a chart that starts elsewhere exaggerates).
    bool from_zero = false;
};

struct Chart {
    std::string title;
    Axis x;
    Axis y;
    /// The y values are quantities that cannot be negative (a dose): a negative value is
    /// "not computed", like NaN and infinity.
    bool y_non_negative = true;
    std::vector<Series> series;
    std::vector<LevelLine> levels;
    std::vector<std::string> band_kinds; ///< a labelled row under the plot for each
    /// Leave out the row and the legend entry of a kind with no band in this chart (its
    /// pattern stays the one of its index, so kinds look alike across charts). Off: an empty
    /// row says "none" (a storm sweep's NO-GO rows).
    bool hide_empty_band_kinds = false;
    std::vector<Band> bands;
    std::vector<Marker> markers;
    std::vector<std::string> notes; ///< short lines under the chart
};

struct Panel {
    std::string heading;
    std::vector<Chart> charts;
};

struct Figure {
    /// Prefix of every id in the SVG (pattern ids), so that two figures can share one page.
    std::string id = "crewdose";
    std::string title;
    std::vector<std::string> subtitle; ///< lines under the title
    /// A boxed note under the subtitle (the cautions), wrapped to the figure's width.
    std::string boxed_note;
    std::vector<Panel> panels;
};

/// Round tick values for an axis from `lo` to `hi`: steps of 1, 2 or 5 times a power of ten,
/// about `target` of them. Unless `exact`, `lo` and `hi` are widened to the ticks around them.
struct Ticks {
    double lo = 0.0;
    double hi = 1.0;
    double step = 1.0;
    int decimals = 0; ///< for the labels: enough to tell the steps apart
    std::vector<double> values;
};
[[nodiscard]] Ticks choose_ticks(double lo, double hi, bool exact, int target = 6);

/// The tick label of `value`: fixed notation with `decimals` decimals, never "-0".
[[nodiscard]] std::string tick_label(double value, int decimals);

/// `text` with &, <, >, " and ' written as entities and control characters as spaces.
[[nodiscard]] std::string xml_escape(const std::string& text);

/// The whole figure as one SVG document (XML, UTF-8).
[[nodiscard]] std::string render_svg(const Figure& figure);

} // namespace crewdose::planner::svg
