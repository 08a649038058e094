#pragma once
// The charts of report.html, drawn as inline SVG by our own code: no
// scripts, fonts or images from elsewhere, so the page opens offline.
#include <cstddef>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "gapmark/analysis/summary.hpp"
#include "gapmark/experiment/example_windows.hpp"
#include "svg.hpp"

namespace gapmark::charts {

/// The plotting area of a chart and its axes.
struct Plot {
  double width = 640, height = 260;
  double left = 62, right = 14, top = 14, bottom = 42;
  svg::Scale x, y;
  double x0() const { return left; }
  double x1() const { return width - right; }
  double y0() const { return height - bottom; }
  double y1() const { return top; }
};

/// Opens an <svg> with a title for screen readers; close with "</svg>".
std::string open_svg(const Plot& plot, const std::string& title);
/// Grid, axes, tick labels and axis titles. `x_names`, when not empty, labels
/// the positions `x_ticks` instead of numbers.
std::string axes(const Plot& plot, const std::vector<double>& x_ticks, const std::vector<std::string>& x_names,
                 const std::vector<double>& y_ticks, const std::string& x_label, const std::string& y_label);
/// Sets plot.y to cover [lo, hi] with a margin and returns the ticks used.
std::vector<double> fit_y(Plot& plot, double lo, double hi);

struct ChartLine {
  std::string name;
  std::vector<double> y, low, high;  ///< one per x; NaN = no value
  svg::Style style;
};

struct LineChart {
  std::string title, x_label, y_label;
  std::vector<double> x;               ///< numeric positions
  std::vector<std::string> x_names;    ///< non-empty: categories, one per x, evenly spaced
  std::vector<ChartLine> lines;
  bool bands = true;                   ///< interval as a shaded band; false: as whiskers
};

/// Lines with interval bands or whiskers. Empty string when nothing to draw.
std::string line_chart(const LineChart& chart);

/// One row of a dot chart: a method's mean and interval.
struct DotRow {
  std::string name;
  double mean = 0, low = 0, high = 0;  ///< NaN = no value
  svg::Style style;
};

struct DotChart {
  std::string title, x_label;
  std::vector<DotRow> rows;  ///< top to bottom
};

/// One row per method, mean as a marker and interval as a whisker, on one
/// horizontal axis. Empty string when nothing to draw.
std::string dot_chart(const DotChart& chart);

/// An example window: the truth, the masked stretches and the fills.
/// `styles[i]` draws example.methods[i].
std::string window_chart(const ExampleWindow& example, const std::vector<svg::Style>& styles,
                         const std::string& y_label = "value");
/// Autocorrelation at lags 1..L of the complete series and of each fill;
/// `styles` as for window_chart (matched by method name).
std::string acf_chart(const ExampleWindow& example, const std::vector<svg::Style>& styles);

/// Methods on a mean-rank axis, one row each, best first; brackets join
/// methods whose mean ranks differ by less than the critical difference.
std::string rank_ladder(const AcrossSeries& across);

/// Groups of consecutive methods (by mean rank) spanning less than `cd`:
/// maximal, at least two members, as [first, last] positions in the sorted order.
std::vector<std::pair<std::size_t, std::size_t>> cliques(const std::vector<double>& sorted_ranks, double cd);

}  // namespace gapmark::charts
