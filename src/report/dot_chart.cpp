// A dot-and-interval chart: one row per method, its mean as a marker and its
// interval as a whisker on a common horizontal axis. Used where a scheme has
// a single missing rate, so a rate chart would be a cramped strip.
#include <algorithm>
#include <cmath>
#include <optional>
#include <utility>

#include "html_charts.hpp"

namespace gapmark::charts {

using svg::coord;
using svg::escape;

namespace {

constexpr double kRowHeight = 20;

/// The left margin that fits the longest method name (about 7.4 px a
/// character at the chart's 12 px font), within [80, 300].
double name_margin(const std::vector<DotRow>& rows) {
  std::size_t longest = 0;
  for (const auto& r : rows) longest = std::max(longest, r.name.size());
  return std::clamp(18 + 7.4 * static_cast<double>(std::min<std::size_t>(longest, 43)), 80.0, 340.0);
}

/// The name shown for a row: cut to what the margin holds.
std::string shown_name(const std::string& name) {
  return name.size() <= 44 ? name : name.substr(0, 42) + "…";
}

/// The largest mean the axis shows. A method far worse than the rest (a mean
/// more than 3 times the median of the means away from the smallest) would
/// squeeze every other row into one pixel; such rows are drawn at the
/// axis' end with their value written out.
double axis_limit(const std::vector<DotRow>& rows) {
  std::vector<double> means;
  for (const auto& r : rows)
    if (std::isfinite(r.mean)) means.push_back(r.mean);
  if (means.size() < 3) return HUGE_VAL;
  std::sort(means.begin(), means.end());
  const double median = means[means.size() / 2], least = means.front();
  const double reach = 3 * std::max(median - least, std::abs(median) * 0.05);
  return reach > 0 ? least + reach : HUGE_VAL;
}

/// The span of the means and intervals the axis shows (those within
/// `limit`), widened where it is a single value; empty when there is none.
std::optional<std::pair<double, double>> shown_span(const std::vector<DotRow>& rows, double limit) {
  double lo = HUGE_VAL, hi = -HUGE_VAL;
  for (const auto& r : rows) {
    if (!(r.mean <= limit)) continue;
    for (double v : {r.mean, r.low, r.high})
      if (std::isfinite(v) && v <= limit) lo = std::min(lo, v), hi = std::max(hi, v);
  }
  if (rows.empty() || lo > hi) return std::nullopt;
  if (hi == lo) {
    const double pad = lo == 0 ? 1 : std::abs(lo) * 0.1;
    lo -= pad;
    hi += pad;
  }
  return std::pair{lo, hi};
}

double row_y(const Plot& plot, std::size_t i) { return plot.y1() + kRowHeight * (static_cast<double>(i) + 0.5); }

/// Vertical grid lines with their labels, the axis and its title, and the
/// method names down the left.
std::string dot_axes(const DotChart& chart, const Plot& plot, const std::vector<double>& ticks) {
  std::string out = "<g class=\"axes\" font-size=\"12\" fill=\"" + std::string(svg::kInk) + "\">";
  for (double t : ticks) {
    const double x = plot.x(t);
    out += "<line x1=\"" + coord(x) + "\" x2=\"" + coord(x) + "\" y1=\"" + coord(plot.y1()) + "\" y2=\"" +
           coord(plot.y0()) + "\" stroke=\"" + svg::kGrid + "\"/>";
    out += "<text x=\"" + coord(x) + "\" y=\"" + coord(plot.y0() + 16) + "\" text-anchor=\"middle\">" +
           escape(svg::tick_label(t)) + "</text>";
  }
  out += "<line x1=\"" + coord(plot.x0()) + "\" x2=\"" + coord(plot.x1()) + "\" y1=\"" + coord(plot.y0()) +
         "\" y2=\"" + coord(plot.y0()) + "\" stroke=\"" + svg::kAxis + "\"/>";
  out += "<text x=\"" + coord((plot.x0() + plot.x1()) / 2) + "\" y=\"" + coord(plot.height - 6) +
         "\" text-anchor=\"middle\" class=\"axis-title\">" + escape(chart.x_label) + "</text>";
  for (std::size_t i = 0; i < chart.rows.size(); ++i)
    out += "<text x=\"" + coord(plot.x0() - 8) + "\" y=\"" + coord(row_y(plot, i) + 4) + "\" text-anchor=\"end\">" +
           escape(shown_name(chart.rows[i].name)) + "</text>";
  return out + "</g>";
}

/// One method's row: its interval and mean, its value written out at the
/// axis' end when beyond `limit`, or "no value".
std::string dot_row(const DotRow& r, double y, const Plot& plot, double limit) {
  std::string out = "<g class=\"series\"><title>" + escape(r.name) + "</title>";
  if (std::isfinite(r.mean) && r.mean > limit)  // off the axis: a marker at its end, an arrow and the value
    return out + svg::marker(r.style, plot.x1() - 4, y, 4) + "<text x=\"" + coord(plot.x1() - 12) + "\" y=\"" +
           coord(y + 4) + "\" font-size=\"11\" text-anchor=\"end\" fill=\"" + svg::kInk + "\">→ " +
           escape(svg::tick_label(r.mean)) + "</text></g>";
  if (std::isfinite(r.low) && std::isfinite(r.high))
    out += "<line x1=\"" + coord(plot.x(r.low)) + "\" x2=\"" + coord(plot.x(std::min(r.high, plot.x.d1))) +
           "\" y1=\"" + coord(y) + "\" y2=\"" + coord(y) + "\" stroke=\"" + r.style.colour + "\" stroke-width=\"1.8\"/>";
  if (std::isfinite(r.mean))
    out += svg::marker(r.style, plot.x(r.mean), y, 4);
  else
    out += "<text x=\"" + coord(plot.x0() + 4) + "\" y=\"" + coord(y + 4) + "\" font-size=\"11\" fill=\"" + svg::kAxis +
           "\">no value</text>";
  return out + "</g>";
}

}  // namespace

std::string dot_chart(const DotChart& chart) {
  const double limit = axis_limit(chart.rows);
  const auto span = shown_span(chart.rows, limit);
  if (!span) return "";
  const auto [lo, hi] = *span;
  const double pad = (hi - lo) * 0.05;
  const auto ticks = svg::nice_ticks(lo - pad, hi + pad, 5);
  Plot plot;
  plot.left = name_margin(chart.rows);
  plot.top = 10;
  plot.height = plot.top + kRowHeight * static_cast<double>(chart.rows.size()) + plot.bottom;
  plot.x = {std::min(lo - pad, ticks.front()), std::max(hi + pad, ticks.back()), plot.x0(), plot.x1()};
  std::string out = open_svg(plot, chart.title) + dot_axes(chart, plot, ticks);
  for (std::size_t i = 0; i < chart.rows.size(); ++i) out += dot_row(chart.rows[i], row_y(plot, i), plot, limit);
  return out + "</svg>";
}

}  // namespace gapmark::charts
