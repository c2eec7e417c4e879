#pragma once
// The storm sweep's chart (storm --sweep --chart): the highest share of a 30-day planning limit
// over the crew against the onset t0, read from the sweep's own profile, with the limit, the
// EVAs and rover drives, the no-go onsets and the worst onset.
#include "planner/analyses/storm.hpp"
#include "planner/report/svg_plot.hpp"

#include <string>

namespace crewdose::planner {

/// The kinds of band of the storm chart, in the order of their rows under the plot.
enum class StormBand : std::size_t {
    eva_go = 0,    ///< an EVA or rover drive whose worst onset keeps every limit
    eva_no_go = 1, ///< an EVA or rover drive that some onset inside it breaks (or not swept)
    no_go = 2,     ///< onsets at or above 100 % of a 30-day limit, or not computed
};

/// The figure of a sweep: one chart. x: the onset t0 in days from the sweep's start (`from`);
/// y: per 6-hour bin of onsets (StormSweep::profile), the highest share (%) of a 30-day limit
/// over the crew and the checked organs, drawn as a step across the bin (the bin's value holds
/// for every onset in it). A line at 100 % (the limit); the EVAs and rover drives hatched, go
/// and no-go in their own rows; the bins at or above 100 %, or not computed, hatched as no-go;
/// a marker at the worst onset (StormSweep::worst) labelled with its time and share. Nothing is
/// computed here: every number is the sweep's.
[[nodiscard]] svg::Figure storm_figure(const StormContext& context, const StormSweep& sweep);

/// storm_figure() drawn: one SVG document.
[[nodiscard]] std::string format_storm_chart(const StormContext& context, const StormSweep& sweep);

} // namespace crewdose::planner
