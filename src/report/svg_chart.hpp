#pragma once
// Our own chart for the reports: horizontal bars, one group per row (an addition, an aroma axis),
// the row's label on its own line above its bars so long names fit a phone, the value written at
// the end of each bar, a value axis with ticks and its unit at the bottom. Up to three series,
// told apart by lightness and by pattern (solid dark, hatched amber, dotted light blue) and
// named in a legend, so the chart reads in greyscale and without telling hues apart. Every chart
// has a <title> and a <desc> (the text alternative) and role="img". The chart takes the column's
// width (up to 36 rem) but its text stays at 13-14 CSS px whatever the width: there is no viewBox;
// labels sit at px positions, and the bars, grid and ticks are placed in percent of a nested plot
// area (76 % of the width, the rest kept for the value written after the longest bar). So a phone
// at 360 px shows the same text size as a laptop, only shorter bars.
#include <string>
#include <vector>

namespace bine::html {

struct ChartRow {
  std::string label;
  std::vector<double> values;      // one per series
  std::vector<std::string> texts;  // the value as written at the bar's end ("23.4 IBU")
  std::vector<std::string> json;   // JSON pointer of each value, or empty
};

struct BarChart {
  std::string id;                   // unique on the page (pattern ids derive from it)
  std::string title;                // chart title, also <title>
  std::string description;          // text alternative, <desc>
  std::string axis_label;           // the value axis with its unit: "IBU", "aroma intensity (0-5 scale)"
  double axis_max = 0.0;            // 0: from the data
  std::vector<std::string> series;  // legend names; one series needs none
  std::vector<ChartRow> rows;
  std::string note;  // a line under the chart (where its values come from), or empty
};

/// The chart as a <figure> holding an inline <svg> and a caption.
std::string bar_chart(const BarChart& chart);

/// A tick step of 1, 2 or 5 times a power of ten giving about `target` ticks up to `max`.
double tick_step(double max, int target);

/// Where a value axis ends for values up to `max`: the first tick (of about five) at or above it;
/// 1 when nothing is above zero. Charts meant to be compared side by side share it (axis_max).
double axis_end(double max);

}  // namespace bine::html
