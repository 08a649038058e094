// The frame shared by the report's charts: the <svg> element, grid, axes,
// tick labels and axis titles.
#include <algorithm>
#include <cmath>

#include "html_charts.hpp"

namespace gapmark::charts {

using svg::coord;
using svg::escape;

std::string open_svg(const Plot& plot, const std::string& title) {
  return "<svg class=\"chart\" viewBox=\"0 0 " + coord(plot.width) + " " + coord(plot.height) +
         "\" role=\"img\" aria-label=\"" + escape(title) + "\"><title>" + escape(title) + "</title>";
}

std::vector<double> fit_y(Plot& plot, double lo, double hi) {
  if (!std::isfinite(lo) || !std::isfinite(hi)) lo = 0, hi = 1;
  if (hi == lo) {
    const double pad = lo == 0 ? 1 : std::abs(lo) * 0.1;
    lo -= pad;
    hi += pad;
  }
  const double pad = (hi - lo) * 0.06;
  lo -= pad;
  hi += pad;
  auto ticks = svg::nice_ticks(lo, hi, 5);
  plot.y = {lo, hi, plot.y0(), plot.y1()};
  return ticks;
}

std::string axes(const Plot& plot, const std::vector<double>& x_ticks, const std::vector<std::string>& x_names,
                 const std::vector<double>& y_ticks, const std::string& x_label, const std::string& y_label) {
  std::string out = "<g class=\"axes\" font-size=\"12\" fill=\"" + std::string(svg::kInk) + "\">";
  for (double t : y_ticks) {
    const double y = plot.y(t);
    out += "<line x1=\"" + coord(plot.x0()) + "\" x2=\"" + coord(plot.x1()) + "\" y1=\"" + coord(y) + "\" y2=\"" +
           coord(y) + "\" stroke=\"" + svg::kGrid + "\"/>";
    out += "<text x=\"" + coord(plot.x0() - 6) + "\" y=\"" + coord(y + 3.5) + "\" text-anchor=\"end\">" +
           escape(svg::tick_label(t)) + "</text>";
  }
  out += "<line x1=\"" + coord(plot.x0()) + "\" x2=\"" + coord(plot.x1()) + "\" y1=\"" + coord(plot.y0()) +
         "\" y2=\"" + coord(plot.y0()) + "\" stroke=\"" + svg::kAxis + "\"/>";
  for (std::size_t i = 0; i < x_ticks.size(); ++i) {
    const double x = plot.x(x_ticks[i]);
    out += "<line x1=\"" + coord(x) + "\" x2=\"" + coord(x) + "\" y1=\"" + coord(plot.y0()) + "\" y2=\"" +
           coord(plot.y0() + 4) + "\" stroke=\"" + svg::kAxis + "\"/>";
    const std::string label = i < x_names.size() ? x_names[i] : svg::tick_label(x_ticks[i]);
    out += "<text x=\"" + coord(x) + "\" y=\"" + coord(plot.y0() + 16) + "\" text-anchor=\"middle\">" +
           escape(label) + "</text>";
  }
  out += "<text x=\"" + coord((plot.x0() + plot.x1()) / 2) + "\" y=\"" + coord(plot.height - 6) +
         "\" text-anchor=\"middle\" class=\"axis-title\">" + escape(x_label) + "</text>";
  const double cy = (plot.y0() + plot.y1()) / 2;
  out += "<text transform=\"translate(14 " + coord(cy) + ") rotate(-90)\" text-anchor=\"middle\" class=\"axis-title\">" +
         escape(y_label) + "</text>";
  out += "</g>";
  return out;
}

}  // namespace gapmark::charts
