// The across-series chart: each method on a mean-rank axis (1 = best), one
// row per method, best at the top; a bracket at the right joins methods
// whose mean ranks differ by less than the critical difference (Nemenyi),
// i.e. methods the test cannot tell apart over these series. The CD itself
// is drawn as a scale bar above the axis.
#include <algorithm>
#include <cmath>
#include <numeric>

#include "html_charts.hpp"

namespace gapmark::charts {

using svg::coord;
using svg::escape;

std::vector<std::pair<std::size_t, std::size_t>> cliques(const std::vector<double>& sorted_ranks, double cd) {
  std::vector<std::pair<std::size_t, std::size_t>> out;
  if (!std::isfinite(cd) || cd <= 0) return out;
  const std::size_t k = sorted_ranks.size();
  std::size_t last_end = 0;
  for (std::size_t i = 0; i < k; ++i) {
    std::size_t j = i;
    while (j + 1 < k && sorted_ranks[j + 1] - sorted_ranks[i] < cd) ++j;
    // Keep it when it reaches further than every earlier group (else it is contained).
    if (j > i && (out.empty() || j > last_end)) {
      out.emplace_back(i, j);
      last_end = j;
    }
  }
  return out;
}

namespace {

constexpr double kRow = 22, kHead = 64, kNames = 200, kAxisY = 46;

double row_y(std::size_t p) { return kHead + kRow * (static_cast<double>(p) + 0.5); }

/// The methods' indices, lowest mean rank first (ties in listing order).
std::vector<std::size_t> rank_order(const AcrossSeries& across) {
  std::vector<std::size_t> order(across.methods.size());
  std::iota(order.begin(), order.end(), std::size_t{0});
  std::stable_sort(order.begin(), order.end(),
                   [&](auto a, auto b) { return across.mean_ranks[a] < across.mean_ranks[b]; });
  return order;
}

/// The critical difference as a scale bar from rank 1 (cut at the axis' end).
std::string cd_scale_bar(const Plot& plot, double cd, std::size_t k) {
  if (!std::isfinite(cd) || cd <= 0) return "";
  const double a = plot.x(1), b = plot.x(std::min(1 + cd, static_cast<double>(k)));
  return "<path d=\"M" + coord(a) + " 12V20H" + coord(b) + "V12\" fill=\"none\" stroke=\"" + svg::kInk +
         "\" stroke-width=\"1.4\"/>" + "<text x=\"" + coord(plot.x0() - 8) +
         "\" y=\"20\" text-anchor=\"end\">critical difference " + escape(svg::tick_label(cd)) +
         (1 + cd > static_cast<double>(k) ? " (beyond the axis)" : "") + "</text>";
}

/// The rank axis along the top, with grid lines down (every second rank
/// above 16 methods).
std::string rank_axis(const Plot& plot, std::size_t k) {
  std::string out = "<line x1=\"" + coord(plot.x0()) + "\" x2=\"" + coord(plot.x1()) + "\" y1=\"" + coord(kAxisY) +
                    "\" y2=\"" + coord(kAxisY) + "\" stroke=\"" + svg::kAxis + "\"/>";
  const std::size_t every = k > 16 ? 2 : 1;
  for (std::size_t r = 1; r <= k; r += every) {
    const double x = plot.x(static_cast<double>(r));
    out += "<line x1=\"" + coord(x) + "\" x2=\"" + coord(x) + "\" y1=\"" + coord(kAxisY - 4) + "\" y2=\"" +
           coord(plot.height - 8) + "\" stroke=\"" + svg::kGrid + "\"/>";
    out += "<text x=\"" + coord(x) + "\" y=\"" + coord(kAxisY - 8) + "\" text-anchor=\"middle\">" + std::to_string(r) +
           "</text>";
  }
  return out + "<text x=\"" + coord(plot.x0() - 8) + "\" y=\"" + coord(kAxisY + 4) +
         "\" text-anchor=\"end\" class=\"axis-title\">mean rank (1 = best)</text>";
}

/// One row per method, in rank order: a line to its mean rank, a dot, its name and rank.
std::string method_rows(const AcrossSeries& across, const std::vector<std::size_t>& order,
                        const std::vector<double>& sorted, const Plot& plot) {
  std::string out;
  for (std::size_t p = 0; p < order.size(); ++p) {
    const double y = row_y(p);
    const double x = plot.x(sorted[p]);
    out += "<line x1=\"" + coord(plot.x0()) + "\" x2=\"" + coord(x) + "\" y1=\"" + coord(y) + "\" y2=\"" + coord(y) +
           "\" stroke=\"#cdd3d7\" stroke-width=\"1\"/>";
    out += "<circle cx=\"" + coord(x) + "\" cy=\"" + coord(y) + "\" r=\"4.5\" fill=\"" + svg::style(0).colour + "\"/>";
    out += "<text x=\"" + coord(kNames + 6) + "\" y=\"" + coord(y + 4) + "\" text-anchor=\"end\">" +
           escape(across.methods[order[p]]) + " <tspan fill=\"#6b757c\">" + escape(svg::tick_label(sorted[p])) +
           "</tspan></text>";
  }
  return out;
}

/// A bracket at the right per group of methods within the critical difference.
std::string brackets(const AcrossSeries& across, const std::vector<std::size_t>& order,
                     const std::vector<std::pair<std::size_t, std::size_t>>& groups, const Plot& plot) {
  std::string out;
  for (std::size_t g = 0; g < groups.size(); ++g) {
    const double x = plot.x1() + 10 + 10 * static_cast<double>(g);
    const double y1 = row_y(groups[g].first), y2 = row_y(groups[g].second);
    out += "<g><title>not distinguishable: ";
    for (std::size_t p = groups[g].first; p <= groups[g].second; ++p)
      out += (p == groups[g].first ? "" : ", ") + escape(across.methods[order[p]]);
    out += "</title><path d=\"M" + coord(x - 4) + " " + coord(y1) + "H" + coord(x) + "V" + coord(y2) + "H" +
           coord(x - 4) + "\" fill=\"none\" stroke=\"" + svg::style(1).colour +
           "\" stroke-width=\"3\" stroke-linecap=\"round\"/></g>";
  }
  return out;
}

}  // namespace

std::string rank_ladder(const AcrossSeries& across) {
  const std::size_t k = across.methods.size();
  if (k < 2 || across.mean_ranks.size() != k) return "";
  const std::vector<std::size_t> order = rank_order(across);
  std::vector<double> sorted;
  for (auto i : order) sorted.push_back(across.mean_ranks[i]);
  const auto groups = cliques(sorted, across.critical_difference);
  Plot plot;
  plot.height = kHead + kRow * static_cast<double>(k) + 10;
  plot.left = kNames + 14;
  plot.right = 20 + 10 * static_cast<double>(std::max<std::size_t>(groups.size(), 1));
  plot.x = {1, static_cast<double>(k), plot.x0(), plot.x1()};
  return open_svg(plot, "Mean ranks across series with the critical difference") + "<g font-size=\"11\" fill=\"" +
         svg::kInk + "\">" + cd_scale_bar(plot, across.critical_difference, k) + rank_axis(plot, k) +
         method_rows(across, order, sorted, plot) + brackets(across, order, groups, plot) + "</g></svg>";
}

}  // namespace gapmark::charts
