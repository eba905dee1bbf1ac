#include "report/svg_chart.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>

#include "report/output_format.hpp"
#include "report/table.hpp"

namespace bine::html {
namespace {

constexpr double kWidth = 340.0;
constexpr double kLeft = 6.0;
constexpr double kPlotRight = kWidth - 62.0;  // room for the value text after the longest bar
constexpr double kBar = 11.0;
constexpr double kLabel = 15.0;
constexpr double kGap = 9.0;
constexpr std::size_t kLabelChars = 52;

// The row label cut to what fits the width, at a UTF-8 boundary.
std::string fitted(const std::string& label) {
  if (display_width(label) <= kLabelChars) return label;
  std::string out;
  std::size_t points = 0;
  for (char c : label) {
    if ((static_cast<unsigned char>(c) & 0xC0) != 0x80 && ++points > kLabelChars - 1) break;
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
  if (max <= 0.0) return 1.0;
  const double step = tick_step(max, 5);
  return std::ceil(max / step - 1e-9) * step;
}

std::string legend(const BarChart& chart, double& y) {
  std::string out;
  if (chart.series.size() < 2) return out;
  for (std::size_t s = 0; s < chart.series.size(); ++s) {
    out += fmt::format(
        "<rect x=\"{:.1f}\" y=\"{:.1f}\" width=\"18\" height=\"{:.0f}\" {}/>"
        "<text x=\"{:.1f}\" y=\"{:.1f}\" font-size=\"11\">{}</text>\n",
        kLeft, y, kBar, fill_of(chart.id, s), kLeft + 24.0, y + 9.5, html_escape(chart.series[s]));
    y += kBar + 5.0;
  }
  y += 6.0;
  return out;
}

std::string row_bars(const BarChart& chart, const ChartRow& row, double max, double& y) {
  std::string out =
      fmt::format("<text x=\"{:.1f}\" y=\"{:.1f}\" font-size=\"11\" font-weight=\"600\" class=\"label\">{}</text>\n",
                  kLeft, y + 11.0, html_escape(fitted(row.label)));
  y += kLabel;
  const double span = kPlotRight - kLeft;
  for (std::size_t s = 0; s < row.values.size(); ++s) {
    const double v = std::clamp(row.values[s], 0.0, max);
    const double w = span * v / max;
    const std::string text = s < row.texts.size() ? row.texts[s] : fmt::format("{:.1f}", row.values[s]);
    const std::string pointer = s < row.json.size() ? row.json[s] : "";
    const std::string who = chart.series.size() > s ? chart.series[s] + ", " : "";
    out += fmt::format(
        "<rect x=\"{:.1f}\" y=\"{:.1f}\" width=\"{:.1f}\" height=\"{:.0f}\" {}><title>{}{}: {}</title></rect>"
        "<text x=\"{:.1f}\" y=\"{:.1f}\" font-size=\"10\" class=\"label\"{}>{}</text>\n",
        kLeft, y, w, kBar, fill_of(chart.id, s), html_escape(who), html_escape(row.label), html_escape(text),
        kLeft + w + 4.0, y + 9.0, pointer.empty() ? "" : " data-json=\"" + html_escape(pointer) + "\"",
        html_escape(text));
    y += kBar + 2.0;
  }
  y += kGap;
  return out;
}

std::string value_axis(const BarChart& chart, double max, double top, double& y) {
  const double span = kPlotRight - kLeft;
  const double step = tick_step(max, 5);
  std::string out;
  for (int i = 0; i * step <= max * (1.0 + 1e-9); ++i) {
    const double x = kLeft + span * (i * step) / max;
    out += fmt::format(
        "<line x1=\"{0:.1f}\" y1=\"{1:.1f}\" x2=\"{0:.1f}\" y2=\"{2:.1f}\" class=\"grid\"/>"
        "<text x=\"{0:.1f}\" y=\"{3:.1f}\" font-size=\"10\" text-anchor=\"middle\">{4:g}</text>\n",
        x, top, y + 3.0, y + 14.0, rounded(i * step, 6));
  }
  out += fmt::format("<line x1=\"{:.1f}\" y1=\"{:.1f}\" x2=\"{:.1f}\" y2=\"{:.1f}\" class=\"axis\"/>\n", kLeft, y,
                     kPlotRight, y);
  out += fmt::format("<text x=\"{:.1f}\" y=\"{:.1f}\" font-size=\"11\">{}</text>\n", kLeft, y + 29.0,
                     html_escape(fitted(chart.axis_label)));
  y += 36.0;
  return out;
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

std::string bar_chart(const BarChart& chart) {
  const double max = data_max(chart);
  double y = 4.0;
  std::string body = legend(chart, y);
  const double top = y;
  std::string bars;
  for (const auto& row : chart.rows) bars += row_bars(chart, row, max, y);
  const std::string axis = value_axis(chart, max, top, y);
  // Grid and ticks first so bars and labels paint over them.
  body += axis + bars;
  return fmt::format(
      "<figure>\n<figcaption>{}</figcaption>\n<svg xmlns=\"http://www.w3.org/2000/svg\" viewBox=\"0 0 {:.0f} {:.0f}\" "
      "width=\"{:.0f}\" "
      "height=\"{:.0f}\" role=\"img\" aria-labelledby=\"{}-t {}-d\">\n<title id=\"{}-t\">{}</title>\n"
      "<desc id=\"{}-d\">{}</desc>\n{}{}</svg>\n</figure>\n",
      html_escape(chart.title), kWidth, y, kWidth, y, chart.id, chart.id, chart.id, html_escape(chart.title), chart.id,
      html_escape(chart.description), patterns(chart.id), body);
}

}  // namespace bine::html
