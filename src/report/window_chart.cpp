// The example charts of report.html, drawn from results' "examples" block:
// a window of the series with its masked stretches and the leading fills,
// and the autocorrelation of the complete series beside that of each fill.
#include <algorithm>
#include <cmath>
#include <cstdint>

#include "html_charts.hpp"

namespace gapmark::charts {
namespace {

using svg::coord;

void widen(double& lo, double& hi, const std::vector<double>& xs) {
  for (double x : xs)
    if (std::isfinite(x)) lo = std::min(lo, x), hi = std::max(hi, x);
}

// Calls visit(i, j) for each masked stretch [i, j) of the window, in order.
template <class Visit>
void for_each_masked_run(const std::vector<std::uint8_t>& mask_values, Visit visit) {
  const std::size_t w = mask_values.size();
  for (std::size_t i = 0; i < w;) {
    if (mask_values[i] != 1) {
      ++i;
      continue;
    }
    std::size_t j = i;
    while (j < w && mask_values[j] == 1) ++j;
    visit(i, j);
    i = j;
  }
}

/// The window's points on the chart: x of every point, y of the truth (NaN where missing).
struct WindowPoints {
  std::vector<double> xs, ys;
};

/// The masked stretches as shaded bands, drawn first, behind everything.
std::string masked_bands(const Plot& plot, const ExampleWindow& example, double start) {
  std::string out;
  for_each_masked_run(example.mask, [&](std::size_t i, std::size_t j) {
    const double a = plot.x(start + static_cast<double>(i) - 0.5), b = plot.x(start + static_cast<double>(j) - 0.5);
    out += "<rect x=\"" + coord(a) + "\" y=\"" + coord(plot.y1()) + "\" width=\"" + coord(b - a) + "\" height=\"" +
           coord(plot.y0() - plot.y1()) + "\" fill=\"" + svg::kShade + "\"/>";
  });
  return out;
}

/// The true values as a line, the hidden ones as rings.
std::string truth_line(const ExampleWindow& example, const WindowPoints& p) {
  std::string out = "<g class=\"truth\"><title>true values</title>" +
                    svg::polyline(p.xs, p.ys, {svg::kInk, "", "circle"}, 1.3);
  for (std::size_t i = 0; i < p.xs.size(); ++i)
    if (example.mask[i] == 1 && std::isfinite(p.ys[i]))
      out += "<circle cx=\"" + coord(p.xs[i]) + "\" cy=\"" + coord(p.ys[i]) + "\" r=\"2.6\" fill=\"#fff\" stroke=\"" +
             svg::kInk + "\" stroke-width=\"1.2\"/>";
  return out + "</g>";
}

/// One method's fill over each masked stretch, joined to the observed neighbours.
std::string fill_line(const Plot& plot, const ExampleWindow& example, const WindowPoints& p,
                      const std::vector<double>& fill, const std::string& name, const svg::Style& s) {
  const std::size_t w = p.xs.size();
  std::string out = "<g class=\"fill\"><title>" + svg::escape(name) + "</title>";
  for_each_masked_run(example.mask, [&](std::size_t i, std::size_t j) {
    std::vector<double> px, py;
    if (i > 0 && std::isfinite(example.truth[i - 1])) px.push_back(p.xs[i - 1]), py.push_back(p.ys[i - 1]);
    for (std::size_t k = i; k < j; ++k) {
      px.push_back(p.xs[k]);
      py.push_back(std::isfinite(fill[k]) ? plot.y(fill[k]) : std::nan(""));
    }
    if (j < w && std::isfinite(example.truth[j])) px.push_back(p.xs[j]), py.push_back(p.ys[j]);
    out += svg::polyline(px, py, s, 1.8);
    for (std::size_t k = i; k < j; ++k)
      if (std::isfinite(fill[k])) out += svg::marker(s, p.xs[k], plot.y(fill[k]), 2.4);
  });
  return out + "</g>";
}

}  // namespace

std::string window_chart(const ExampleWindow& example, const std::vector<svg::Style>& styles,
                         const std::string& y_label) {
  const std::size_t w = example.truth.size();
  if (w < 2 || example.mask.size() != w) return "";
  const auto start = static_cast<double>(example.start);
  double lo = HUGE_VAL, hi = -HUGE_VAL;
  widen(lo, hi, example.truth);
  for (const auto& m : example.methods) widen(lo, hi, m.filled);
  if (lo > hi) return "";

  Plot plot;
  plot.height = 280;
  plot.x = {start - 0.5, start + static_cast<double>(w) - 0.5, plot.x0(), plot.x1()};
  const auto y_ticks = fit_y(plot, lo, hi);
  const auto x_ticks = svg::nice_ticks(start, start + static_cast<double>(w) - 1, 6);
  std::string out = open_svg(plot, "Example window: true values, hidden points and fills");
  out += masked_bands(plot, example, start);
  out += axes(plot, x_ticks, {}, y_ticks, "position in the series", y_label);
  WindowPoints points{std::vector<double>(w), std::vector<double>(w)};
  for (std::size_t i = 0; i < w; ++i) {
    points.xs[i] = plot.x(start + static_cast<double>(i));
    points.ys[i] = std::isfinite(example.truth[i]) ? plot.y(example.truth[i]) : std::nan("");
  }
  out += truth_line(example, points);
  for (std::size_t m = 0; m < example.methods.size(); ++m) {
    if (example.methods[m].filled.size() != w) continue;
    const svg::Style s = m < styles.size() ? styles[m] : svg::style(m);
    out += fill_line(plot, example, points, example.methods[m].filled, example.methods[m].method, s);
  }
  out += "</svg>";
  return out;
}

std::string acf_chart(const ExampleWindow& example, const std::vector<svg::Style>& styles) {
  if (!example.note.empty()) return "";
  const auto& truth = example.acf_truth;
  const std::size_t lags = truth.size();
  if (lags < 2) return "";
  double lo = 0, hi = 0;
  widen(lo, hi, truth);
  std::vector<std::pair<std::vector<double>, svg::Style>> lines;
  for (const auto& a : example.acf_methods) {
    svg::Style s = svg::style(svg::kStyles);
    for (std::size_t m = 0; m < example.methods.size() && m < styles.size(); ++m)
      if (example.methods[m].method == a.method) s = styles[m];
    lines.emplace_back(a.values, s);
    widen(lo, hi, lines.back().first);
  }
  Plot plot;
  plot.x = {0.3, static_cast<double>(lags) + 0.7, plot.x0(), plot.x1()};
  const auto y_ticks = fit_y(plot, lo, hi);
  auto x_ticks = svg::nice_ticks(1, static_cast<double>(lags), 8);
  x_ticks.erase(std::remove_if(x_ticks.begin(), x_ticks.end(),
                               [](double t) { return t < 1 || t != std::floor(t); }),
                x_ticks.end());
  std::string out = open_svg(plot, "Autocorrelation of the complete series and of each fill");
  out += axes(plot, x_ticks, {}, y_ticks, "lag (steps)", "autocorrelation");
  const double zero = plot.y(0);
  const double bar = std::max(1.0, std::min(8.0, (plot.x1() - plot.x0()) / static_cast<double>(lags) * 0.55));
  out += "<g class=\"truth\"><title>complete series</title>";
  for (std::size_t k = 0; k < lags; ++k) {
    if (!std::isfinite(truth[k])) continue;
    const double x = plot.x(static_cast<double>(k + 1)), y = plot.y(truth[k]);
    out += "<rect x=\"" + coord(x - bar / 2) + "\" y=\"" + coord(std::min(y, zero)) + "\" width=\"" + coord(bar) +
           "\" height=\"" + coord(std::abs(zero - y)) + "\" fill=\"#c9ced2\"/>";
  }
  out += "</g>";
  for (std::size_t l = 0; l < lines.size(); ++l) {
    const auto& [values, s] = lines[l];
    std::vector<double> xs, ys;
    for (std::size_t k = 0; k < values.size(); ++k) {
      xs.push_back(plot.x(static_cast<double>(k + 1)));
      ys.push_back(std::isfinite(values[k]) ? plot.y(values[k]) : std::nan(""));
    }
    out += "<g class=\"fill\">" + svg::polyline(xs, ys, s, 1.8);
    const std::size_t every = std::max<std::size_t>(1, values.size() / 24);
    for (std::size_t k = 0; k < values.size(); k += every)
      if (std::isfinite(ys[k])) out += svg::marker(s, xs[k], ys[k], 2.6);
    out += "</g>";
  }
  out += "</svg>";
  return out;
}

}  // namespace gapmark::charts
