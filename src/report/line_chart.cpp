// A line chart of method means with their confidence intervals, as shaded
// bands (numeric x, e.g. missing rate) or whiskers (categories, e.g. gap
// length class). Methods keep their style across every chart of a series.
#include <algorithm>
#include <cmath>
#include <limits>

#include "html_charts.hpp"

namespace gapmark::charts {

using svg::coord;

namespace {

bool has_interval(const ChartLine& line, std::size_t i) {
  return i < line.low.size() && i < line.high.size() && std::isfinite(line.low[i]) && std::isfinite(line.high[i]);
}

/// Where the x values go: their positions on the axis, the ticks and, for
/// categories, the tick names.
struct XAxis {
  std::vector<double> positions, ticks;
  std::vector<std::string> names;
};

/// Categories (named x, or a single x) sit at 0, 1, 2 ...; numbers keep
/// their values with a margin of 8% on each side.
XAxis lay_out_x(const LineChart& chart, Plot& plot) {
  const std::size_t m = chart.x.size();
  XAxis out{.positions = chart.x, .ticks = {}, .names = chart.x_names};
  if (!out.names.empty() || m == 1) {
    if (out.names.empty())
      for (double x : chart.x) out.names.push_back(svg::tick_label(x));
    for (std::size_t i = 0; i < m; ++i) out.positions[i] = static_cast<double>(i);
    plot.x = {-0.5, static_cast<double>(m) - 0.5, plot.x0(), plot.x1()};
    out.ticks = out.positions;
  } else {
    const auto [mn, mx] = std::minmax_element(chart.x.begin(), chart.x.end());
    const double pad = (*mx - *mn) * 0.08;
    plot.x = {*mn - pad, *mx + pad, plot.x0(), plot.x1()};
    out.ticks = chart.x;
  }
  return out;
}

/// One shaded band per run of at least two points that have both bounds (a
/// single point keeps its interval as a whisker).
std::string interval_bands(const ChartLine& line, const std::vector<double>& xs, const Plot& plot) {
  std::string out, upper, lower;
  std::size_t count = 0;
  auto flush = [&] {
    if (count >= 2)
      out += "<polygon points=\"" + upper + lower + "\" fill=\"" + line.style.colour +
             "\" fill-opacity=\"0.14\" stroke=\"none\"/>";
    upper.clear();
    lower.clear();
    count = 0;
  };
  for (std::size_t i = 0; i < xs.size(); ++i) {
    if (!has_interval(line, i)) {
      flush();
      continue;
    }
    upper += coord(xs[i]) + "," + coord(plot.y(line.high[i])) + " ";
    lower = coord(xs[i]) + "," + coord(plot.y(line.low[i])) + " " + lower;
    ++count;
  }
  flush();
  return out;
}

std::string whiskers(const ChartLine& line, const std::vector<double>& xs, const Plot& plot) {
  std::string out;
  for (std::size_t i = 0; i < xs.size(); ++i)
    if (has_interval(line, i))
      out += "<line x1=\"" + coord(xs[i]) + "\" x2=\"" + coord(xs[i]) + "\" y1=\"" + coord(plot.y(line.low[i])) +
             "\" y2=\"" + coord(plot.y(line.high[i])) + "\" stroke=\"" + line.style.colour +
             "\" stroke-width=\"1.6\"/>";
  return out;
}

/// Line `l` of the chart: its intervals (bands, or whiskers side by side so
/// that they do not hide each other), the line and its markers.
std::string series_lines(const LineChart& chart, std::size_t l, const Plot& plot, const XAxis& x) {
  const std::size_t m = chart.x.size(), k = chart.lines.size();
  const auto& line = chart.lines[l];
  const bool bands = chart.bands && m > 1;
  const double dodge = bands ? 0.0 : (static_cast<double>(l) - (static_cast<double>(k) - 1) / 2) * 9.0;
  std::vector<double> xs(m), ys(m, std::nan(""));
  for (std::size_t i = 0; i < m; ++i) {
    xs[i] = plot.x(x.positions[i]) + dodge;
    if (i < line.y.size() && std::isfinite(line.y[i])) ys[i] = plot.y(line.y[i]);
  }
  std::string out = "<g class=\"series\"><title>" + svg::escape(line.name) + "</title>";
  if (chart.bands) out += interval_bands(line, xs, plot);
  if (!bands) out += whiskers(line, xs, plot);
  out += svg::polyline(xs, ys, line.style, 2);
  for (std::size_t i = 0; i < m; ++i)
    if (std::isfinite(ys[i])) out += svg::marker(line.style, xs[i], ys[i], 3.6);
  return out + "</g>";
}

}  // namespace

std::string line_chart(const LineChart& chart) {
  double lo = HUGE_VAL, hi = -HUGE_VAL;
  for (const auto& line : chart.lines)
    for (const auto* v : {&line.y, &line.low, &line.high})
      for (double y : *v)
        if (std::isfinite(y)) lo = std::min(lo, y), hi = std::max(hi, y);
  if (chart.x.empty() || lo > hi) return "";
  Plot plot;
  const XAxis x = lay_out_x(chart, plot);
  const auto y_ticks = fit_y(plot, lo, hi);
  std::string out = open_svg(plot, chart.title);
  out += axes(plot, x.ticks, x.names, y_ticks, chart.x_label, chart.y_label);
  for (std::size_t l = 0; l < chart.lines.size(); ++l) out += series_lines(chart, l, plot, x);
  return out + "</svg>";
}

}  // namespace gapmark::charts
