// The example charts of report.html, drawn from results' "examples" block:
// a window of the series with its masked stretches and the leading fills,
// and the autocorrelation of the complete series beside that of each fill.
#include <algorithm>
#include <cmath>

#include "html_charts.hpp"

namespace gapmark::charts {
namespace {

using svg::coord;

std::vector<double> numbers(const nlohmann::json& array) {
  std::vector<double> out;
  if (!array.is_array()) return out;
  for (const auto& v : array) out.push_back(v.is_number() ? v.get<double>() : std::nan(""));
  return out;
}

void widen(double& lo, double& hi, const std::vector<double>& xs) {
  for (double x : xs)
    if (std::isfinite(x)) lo = std::min(lo, x), hi = std::max(hi, x);
}

// Calls visit(i, j) for each masked stretch [i, j) of the window, in order.
template <class Visit>
void for_each_masked_run(const std::vector<double>& mask_values, Visit visit) {
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

}  // namespace

std::string window_chart(const nlohmann::json& example, const std::vector<svg::Style>& styles,
                         const std::string& y_label) {
  const auto truth = numbers(example.value("truth", nlohmann::json::array()));
  const auto mask_values = numbers(example.value("mask", nlohmann::json::array()));
  const std::size_t w = truth.size();
  if (w < 2 || mask_values.size() != w) return "";
  const double start = example.value("start", 0.0);
  std::vector<std::vector<double>> fills;
  std::vector<std::string> names;
  for (const auto& m : example.value("methods", nlohmann::json::array())) {
    fills.push_back(numbers(m.value("filled", nlohmann::json::array())));
    names.push_back(m.value("method", std::string()));
  }
  double lo = HUGE_VAL, hi = -HUGE_VAL;
  widen(lo, hi, truth);
  for (const auto& f : fills) widen(lo, hi, f);
  if (lo > hi) return "";

  Plot plot;
  plot.height = 280;
  plot.x = {start - 0.5, start + static_cast<double>(w) - 0.5, plot.x0(), plot.x1()};
  const auto y_ticks = fit_y(plot, lo, hi);
  const auto x_ticks = svg::nice_ticks(start, start + static_cast<double>(w) - 1, 6);
  std::string out = open_svg(plot, "Example window: true values, hidden points and fills");
  // Masked stretches first, behind everything.
  for_each_masked_run(mask_values, [&](std::size_t i, std::size_t j) {
    const double a = plot.x(start + static_cast<double>(i) - 0.5), b = plot.x(start + static_cast<double>(j) - 0.5);
    out += "<rect x=\"" + coord(a) + "\" y=\"" + coord(plot.y1()) + "\" width=\"" + coord(b - a) + "\" height=\"" +
           coord(plot.y0() - plot.y1()) + "\" fill=\"" + svg::kShade + "\"/>";
  });
  out += axes(plot, x_ticks, {}, y_ticks, "position in the series", y_label);
  std::vector<double> xs(w), ys(w);
  for (std::size_t i = 0; i < w; ++i) {
    xs[i] = plot.x(start + static_cast<double>(i));
    ys[i] = std::isfinite(truth[i]) ? plot.y(truth[i]) : std::nan("");
  }
  out += "<g class=\"truth\"><title>true values</title>" + svg::polyline(xs, ys, {svg::kInk, "", "circle"}, 1.3);
  for (std::size_t i = 0; i < w; ++i)
    if (mask_values[i] == 1 && std::isfinite(ys[i]))
      out += "<circle cx=\"" + coord(xs[i]) + "\" cy=\"" + coord(ys[i]) + "\" r=\"2.6\" fill=\"#fff\" stroke=\"" +
             svg::kInk + "\" stroke-width=\"1.2\"/>";
  out += "</g>";
  // Each fill over each masked stretch, joined to the observed neighbours.
  for (std::size_t m = 0; m < fills.size(); ++m) {
    if (fills[m].size() != w) continue;
    const svg::Style s = m < styles.size() ? styles[m] : svg::style(m);
    out += "<g class=\"fill\"><title>" + svg::escape(names[m]) + "</title>";
    for_each_masked_run(mask_values, [&](std::size_t i, std::size_t j) {
      std::vector<double> px, py;
      if (i > 0 && std::isfinite(truth[i - 1])) px.push_back(xs[i - 1]), py.push_back(ys[i - 1]);
      for (std::size_t k = i; k < j; ++k) {
        px.push_back(xs[k]);
        py.push_back(std::isfinite(fills[m][k]) ? plot.y(fills[m][k]) : std::nan(""));
      }
      if (j < w && std::isfinite(truth[j])) px.push_back(xs[j]), py.push_back(ys[j]);
      out += svg::polyline(px, py, s, 1.8);
      for (std::size_t k = i; k < j; ++k)
        if (std::isfinite(fills[m][k])) out += svg::marker(s, xs[k], plot.y(fills[m][k]), 2.4);
    });
    out += "</g>";
  }
  out += "</svg>";
  return out;
}

std::string acf_chart(const nlohmann::json& example, const std::vector<svg::Style>& styles) {
  if (!example.contains("acf")) return "";
  const auto& acf = example["acf"];
  const auto truth = numbers(acf.value("truth", nlohmann::json::array()));
  const std::size_t lags = truth.size();
  if (lags < 2) return "";
  double lo = 0, hi = 0;
  widen(lo, hi, truth);
  std::vector<std::pair<std::vector<double>, svg::Style>> lines;
  const auto methods = example.value("methods", nlohmann::json::array());
  for (const auto& a : acf.value("methods", nlohmann::json::array())) {
    const std::string name = a.value("method", std::string());
    svg::Style s = svg::style(svg::kStyles);
    for (std::size_t m = 0; m < methods.size() && m < styles.size(); ++m)
      if (methods[m].value("method", std::string()) == name) s = styles[m];
    lines.emplace_back(numbers(a.value("values", nlohmann::json::array())), s);
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
