#include "report/svg_chart.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>

#include "report/html_text.hpp"
#include "report/output_format.hpp"
#include "report/table.hpp"

namespace bine::html {
namespace {

// Positions in CSS px (the outer <svg> has no viewBox) except where a percent of the plot is said.
constexpr double kLeft = 6.0;
constexpr double kPlotPercent = 76.0;  // the plot's share of the chart's width
constexpr double kBar = 13.0;
constexpr double kBarStep = kBar + 3.0;
constexpr double kLabel = 19.0;  // a row label's line, 14 px bold
constexpr double kGap = 10.0;
constexpr double kLegendStep = 18.0;
// What fits a 336 px chart (a 360 px phone) at 14 px: DejaVu Sans Bold is about 0.62 em (8.7 px) a
// character, so (336 - 6) / 8.7 = 37; the legend (regular, 0.56 em) starts 24 px further in.
constexpr std::size_t kLabelChars = 37;
constexpr std::size_t kLegendChars = 38;

// The label cut to `chars` characters, at a UTF-8 boundary.
std::string fitted(const std::string& label, std::size_t chars) {
  if (display_width(label) <= chars) return label;
  std::string out;
  std::size_t points = 0;
  for (char c : label) {
    if ((static_cast<unsigned char>(c) & 0xC0) != 0x80 && ++points > chars - 1) break;
    out += c;
  }
  return out + "\xe2\x80\xa6";
}

std::string patterns(const std::string& id) {
  return fmt::format(
      "<defs><pattern id=\"{0}-p1\" width=\"5\" height=\"5\" patternUnits=\"userSpaceOnUse\" "
      "patternTransform=\"rotate(45)\"><rect width=\"5\" height=\"5\" class=\"s1\"/>"
      "<rect width=\"1.6\" height=\"5\" fill=\"#ffffff\"/></pattern>"
      "<pattern id=\"{0}-p2\" width=\"4\" height=\"4\" patternUnits=\"userSpaceOnUse\">"
      "<rect width=\"4\" height=\"4\" class=\"s2\"/><circle cx=\"2\" cy=\"2\" r=\"0.9\" fill=\"#1d3b53\"/>"
      "</pattern></defs>\n",
      id);
}

std::string fill_of(const std::string& id, std::size_t series) {
  if (series % 3 == 0) return "class=\"s0\"";
  return fmt::format("fill=\"url(#{}-p{})\" stroke=\"#1b1b1b\" stroke-width=\"0.6\"", id, series % 3);
}

// The axis ends at the given maximum, else at the first tick at or above the largest value.
double data_max(const BarChart& chart) {
  if (chart.axis_max > 0.0) return chart.axis_max;
  double max = 0.0;
  for (const auto& row : chart.rows)
    for (double v : row.values) max = std::max(max, v);
  return axis_end(max);
}

std::string legend(const BarChart& chart, double& y) {
  std::string out;
  if (chart.series.size() < 2) return out;
  for (std::size_t s = 0; s < chart.series.size(); ++s) {
    out += fmt::format(
        "<rect x=\"{:.1f}\" y=\"{:.1f}\" width=\"18\" height=\"{:.0f}\" {}/>"
        "<text x=\"{:.1f}\" y=\"{:.1f}\" font-size=\"14\">{}</text>\n",
        kLeft, y, kBar, fill_of(chart.id, s), kLeft + 24.0, y + 11.0,
        html_escape(fitted(chart.series[s], kLegendChars)));
    y += kLegendStep;
  }
  y += 6.0;
  return out;
}

// Percent of the plot's width for value v on an axis ending at max.
double percent(double v, double max) { return 100.0 * std::clamp(v, 0.0, max) / max; }

// One row: its label (outer, px) and its bars with their values (plot, percent).
void row_bars(const BarChart& chart, const ChartRow& row, double max, double& y, std::string& labels,
              std::string& plot) {
  labels +=
      fmt::format("<text x=\"{:.1f}\" y=\"{:.1f}\" font-size=\"14\" font-weight=\"600\" class=\"label\">{}</text>\n",
                  kLeft, y + 14.0, html_escape(fitted(row.label, kLabelChars)));
  y += kLabel;
  for (std::size_t s = 0; s < row.values.size(); ++s) {
    const double w = percent(row.values[s], max);
    const std::string text = s < row.texts.size() ? row.texts[s] : fmt::format("{:.1f}", row.values[s]);
    const std::string pointer = s < row.json.size() ? row.json[s] : "";
    const std::string who = chart.series.size() > s ? chart.series[s] + ", " : "";
    plot += fmt::format(
        "<rect x=\"0\" y=\"{:.1f}\" width=\"{:.2f}%\" height=\"{:.0f}\" {}><title>{}{}: {}</title></rect>"
        "<text x=\"{:.2f}%\" dx=\"4\" y=\"{:.1f}\" font-size=\"13\" class=\"label\"{}>{}</text>\n",
        y, w, kBar, fill_of(chart.id, s), html_escape(who), html_escape(row.label), html_escape(text), w, y + 10.5,
        pointer.empty() ? "" : " data-json=\"" + html_escape(pointer) + "\"", html_escape(text));
    y += kBarStep;
  }
  y += kGap;
}

// Grid lines and tick values (plot, percent), the axis line, and the axis label (outer, px).
std::string value_axis(const BarChart& chart, double max, double top, double& y, std::string& plot) {
  const double step = tick_step(max, 5);
  for (int i = 0; i * step <= max * (1.0 + 1e-9); ++i) {
    const double x = percent(i * step, max);
    plot += fmt::format(
        "<line x1=\"{0:.2f}%\" y1=\"{1:.1f}\" x2=\"{0:.2f}%\" y2=\"{2:.1f}\" class=\"grid\"/>"
        "<text x=\"{0:.2f}%\" y=\"{3:.1f}\" font-size=\"13\" text-anchor=\"middle\">{4:g}</text>\n",
        x, top, y + 3.0, y + 17.0, rounded(i * step, 6));
  }
  plot += fmt::format("<line x1=\"0\" y1=\"{0:.1f}\" x2=\"100%\" y2=\"{0:.1f}\" class=\"axis\"/>\n", y);
  const std::string label = fmt::format("<text x=\"{:.1f}\" y=\"{:.1f}\" font-size=\"14\">{}</text>\n", kLeft, y + 36.0,
                                        html_escape(fitted(chart.axis_label, kLabelChars + 4)));
  y += 44.0;
  return label;
}

}  // namespace

double tick_step(double max, int target) {
  if (max <= 0.0 || target < 1) return 1.0;
  const double raw = max / target;
  const double power = std::pow(10.0, std::floor(std::log10(raw)));
  for (double m : {1.0, 2.0, 5.0})
    if (m * power >= raw) return m * power;
  return 10.0 * power;
}

double axis_end(double max) {
  if (max <= 0.0) return 1.0;
  const double step = tick_step(max, 5);
  return std::ceil(max / step - 1e-9) * step;
}

std::string bar_chart(const BarChart& chart) {
  const double max = data_max(chart);
  double y = 4.0;
  const std::string legend_svg = legend(chart, y);
  const double top = y;
  std::string labels, bars, grid;
  for (const auto& row : chart.rows) row_bars(chart, row, max, y, labels, bars);
  const std::string axis_label = value_axis(chart, max, top, y, grid);
  // Grid and ticks first so bars and labels paint over them.
  const std::string plot = fmt::format(
      "<g transform=\"translate({:.0f} 0)\"><svg x=\"0\" y=\"0\" width=\"{:.0f}%\" height=\"{:.0f}\" "
      "overflow=\"visible\">\n{}{}</svg></g>\n",
      kLeft, kPlotPercent, y, grid, bars);
  const std::string note = chart.note.empty() ? "" : "<p class=\"chart-note\">" + text_html(chart.note) + "</p>\n";
  return fmt::format(
      "<figure>\n<figcaption>{}</figcaption>\n<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"100%\" "
      "height=\"{:.0f}\" role=\"img\" aria-labelledby=\"{}-t {}-d\">\n<title id=\"{}-t\">{}</title>\n"
      "<desc id=\"{}-d\">{}</desc>\n{}{}{}{}{}</svg>\n{}</figure>\n",
      text_html(chart.title), y, chart.id, chart.id, chart.id, html_escape(chart.title), chart.id,
      html_escape(chart.description), patterns(chart.id), legend_svg, plot, labels, axis_label, note);
}

}  // namespace bine::html
