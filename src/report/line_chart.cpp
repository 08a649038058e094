// A line chart of method means with their confidence intervals, as shaded
// bands (numeric x, e.g. missing rate) or whiskers (categories, e.g. gap
// length class). Methods keep their style across every chart of a series.
#include <algorithm>
#include <cmath>
#include <limits>

#include "html_charts.hpp"

namespace gapmark::charts {

using svg::coord;

std::string line_chart(const LineChart& chart) {
  const std::size_t m = chart.x.size();
  double lo = HUGE_VAL, hi = -HUGE_VAL;
  for (const auto& line : chart.lines)
    for (const auto* v : {&line.y, &line.low, &line.high})
      for (double y : *v)
        if (std::isfinite(y)) lo = std::min(lo, y), hi = std::max(hi, y);
  if (m == 0 || lo > hi) return "";

  Plot plot;
  std::vector<double> positions = chart.x, x_ticks;
  std::vector<std::string> x_names = chart.x_names;
  const bool categorical = !x_names.empty() || m == 1;
  if (categorical) {
    if (x_names.empty())
      for (double x : chart.x) x_names.push_back(svg::tick_label(x));
    for (std::size_t i = 0; i < m; ++i) positions[i] = static_cast<double>(i);
    plot.x = {-0.5, static_cast<double>(m) - 0.5, plot.x0(), plot.x1()};
    x_ticks = positions;
  } else {
    const auto [mn, mx] = std::minmax_element(chart.x.begin(), chart.x.end());
    const double pad = (*mx - *mn) * 0.08;
    plot.x = {*mn - pad, *mx + pad, plot.x0(), plot.x1()};
    x_ticks = chart.x;
  }
  const auto y_ticks = fit_y(plot, lo, hi);

  std::string out = open_svg(plot, chart.title);
  out += axes(plot, x_ticks, x_names, y_ticks, chart.x_label, chart.y_label);
  const std::size_t k = chart.lines.size();
  for (std::size_t l = 0; l < k; ++l) {
    const auto& line = chart.lines[l];
    // Whiskers side by side so that they do not hide each other.
    const double dodge =
        chart.bands && m > 1 ? 0.0 : (static_cast<double>(l) - (static_cast<double>(k) - 1) / 2) * 9.0;
    std::vector<double> xs(m), ys(m, std::nan(""));
    for (std::size_t i = 0; i < m; ++i) {
      xs[i] = plot.x(positions[i]) + dodge;
      if (i < line.y.size() && std::isfinite(line.y[i])) ys[i] = plot.y(line.y[i]);
    }
    out += "<g class=\"series\"><title>" + svg::escape(line.name) + "</title>";
    if (chart.bands) {
      // One band per run of points that have both bounds.
      std::string upper, lower;
      std::size_t count = 0;
      auto flush = [&] {
        if (count >= 2)
          out += "<polygon points=\"" + upper + lower + "\" fill=\"" + line.style.colour +
                 "\" fill-opacity=\"0.14\" stroke=\"none\"/>";
        upper.clear();
        lower.clear();
        count = 0;
      };
      for (std::size_t i = 0; i < m; ++i) {
        const bool ok = i < line.low.size() && i < line.high.size() && std::isfinite(line.low[i]) &&
                        std::isfinite(line.high[i]);
        if (!ok) {
          flush();
          continue;
        }
        upper += coord(xs[i]) + "," + coord(plot.y(line.high[i])) + " ";
        lower = coord(xs[i]) + "," + coord(plot.y(line.low[i])) + " " + lower;
        ++count;
      }
      flush();
      // A single point keeps its interval as a whisker.
    }
    for (std::size_t i = 0; i < m; ++i) {
      const bool ok = i < line.low.size() && i < line.high.size() && std::isfinite(line.low[i]) &&
                      std::isfinite(line.high[i]);
      if (!ok || (chart.bands && m > 1)) continue;
      out += "<line x1=\"" + coord(xs[i]) + "\" x2=\"" + coord(xs[i]) + "\" y1=\"" + coord(plot.y(line.low[i])) +
             "\" y2=\"" + coord(plot.y(line.high[i])) + "\" stroke=\"" + line.style.colour +
             "\" stroke-width=\"1.6\"/>";
    }
    out += svg::polyline(xs, ys, line.style, 2);
    for (std::size_t i = 0; i < m; ++i)
      if (std::isfinite(ys[i])) out += svg::marker(line.style, xs[i], ys[i], 3.6);
    out += "</g>";
  }
  out += "</svg>";
  return out;
}

}  // namespace gapmark::charts
