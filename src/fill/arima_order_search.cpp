// Automatic ARIMA order (see arima_order_search.hpp).
#include "gapmark/fill/arima_order_search.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <map>
#include <memory>
#include <tuple>

#include "gapmark/error.hpp"
#include "knots.hpp"
#include "gapmark/fill/seasonal_decomposition.hpp"

namespace gapmark::arima {

namespace {
constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();
constexpr double kKpssCritical5 = 0.463;    // Kwiatkowski et al. (1992), Table 1, level, 5%
constexpr double kStrengthThreshold = 0.64;
/// BOBYQA's first steps for a neighbour started from the current model's end
/// point, and for the final fit started from the chosen model's screening fit.
constexpr double kNeighbourStep = 0.1;
constexpr double kRefitStep = 0.02;

std::vector<double> difference(std::span<const double> x, std::size_t lag) {
  std::vector<double> out(x.size(), kNaN);
  for (std::size_t t = lag; t < x.size(); ++t) out[t] = x[t] - x[t - lag];  // NaN if either is missing
  return out;
}

std::size_t observed_count(std::span<const double> x) {
  return static_cast<std::size_t>(std::count_if(x.begin(), x.end(), [](double v) { return !std::isnan(v); }));
}
}  // namespace

double kpss_statistic(std::span<const double> x) {
  std::vector<double> e;
  for (double v : x)
    if (!std::isnan(v)) e.push_back(v);
  const std::size_t n = e.size();
  if (n < 4) return kNaN;
  double mean = 0;
  for (double v : e) mean += v;
  mean /= static_cast<double>(n);
  for (double& v : e) v -= mean;
  const std::size_t lags = static_cast<std::size_t>(4.0 * std::pow(static_cast<double>(n) / 100.0, 0.25));
  double lr = 0;
  for (double v : e) lr += v * v;
  for (std::size_t s = 1; s <= lags && s < n; ++s) {
    double c = 0;
    for (std::size_t t = s; t < n; ++t) c += e[t] * e[t - s];
    lr += 2.0 * (1.0 - static_cast<double>(s) / static_cast<double>(lags + 1)) * c;
  }
  lr /= static_cast<double>(n);
  if (!(lr > 0)) return kNaN;
  double partial = 0, sum = 0;
  for (double v : e) {
    partial += v;
    sum += partial * partial;
  }
  return sum / (static_cast<double>(n) * static_cast<double>(n) * lr);
}

double seasonal_strength(std::span<const double> x, std::size_t period) {
  if (period < 2 || observed_count(x) < 3 * period || x.size() < 3 * period) return kNaN;
  const std::size_t n = x.size();
  std::unique_ptr<bool[]> stand_in(new bool[n]);
  for (std::size_t t = 0; t < n; ++t) stand_in[t] = std::isnan(x[t]);
  const std::vector<double> provisional = provisional_linear(x);
  const SeasonalDecomposition dec = classical_decomposition(provisional, period, {stand_in.get(), n});
  // var(remainder) / var(seasonal + remainder) over observed points with a trend
  double sr = 0, sr2 = 0, sd = 0, sd2 = 0;
  std::size_t m = 0;
  for (std::size_t t = 0; t < n; ++t) {
    if (stand_in[t] || std::isnan(dec.trend[t])) continue;
    const double detrended = x[t] - dec.trend[t], remainder = detrended - dec.seasonal[t];
    sr += remainder;
    sr2 += remainder * remainder;
    sd += detrended;
    sd2 += detrended * detrended;
    ++m;
  }
  if (m < 2 * period) return kNaN;
  const double mm = static_cast<double>(m);
  const double var_r = sr2 / mm - (sr / mm) * (sr / mm), var_d = sd2 / mm - (sd / mm) * (sd / mm);
  if (!(var_d > 0)) return 0;
  return std::clamp(1.0 - var_r / var_d, 0.0, 1.0);
}

SearchResult search_order(std::span<const double> y, std::size_t period, const SearchBounds& bounds) {
  SearchResult result;
  const bool seasonal = period >= 2;
  std::vector<double> work(y.begin(), y.end());

  int big_d = 0;
  result.seasonal_strength = seasonal ? seasonal_strength(y, period) : kNaN;
  if (seasonal && bounds.max_seasonal_d >= 1 && result.seasonal_strength > kStrengthThreshold) {
    big_d = 1;
    work = difference(work, period);
  }
  int d = 0;
  while (true) {
    const double stat = kpss_statistic(work);
    result.kpss.push_back(stat);
    if (!(stat > kKpssCritical5) || d >= bounds.max_d) break;
    std::vector<double> next = difference(work, 1);
    if (observed_count(next) < 8) break;
    work = std::move(next);
    ++d;
  }

  using Key = std::tuple<int, int, int, int, bool>;
  std::map<Key, double> tried;
  bool have_best = false;
  Fit best;
  // parent: the current best, whose end point a neighbour starts from
  auto try_model = [&](int p, int q, int sp, int sq, bool constant, const Fit* parent) -> bool {
    if (p < 0 || q < 0 || sp < 0 || sq < 0 || p > bounds.max_p || q > bounds.max_q) return false;
    if (!seasonal && (sp > 0 || sq > 0)) return false;
    if (sp > bounds.max_seasonal_p || sq > bounds.max_seasonal_q) return false;
    if (p + q + sp + sq > bounds.max_terms) return false;
    if (constant && d + big_d > 1) return false;
    const Key key{p, q, sp, sq, constant};
    if (tried.count(key) || result.models >= bounds.max_models) return false;
    Order o;
    o.p = p;
    o.d = d;
    o.q = q;
    o.seasonal_p = sp;
    o.seasonal_d = big_d;
    o.seasonal_q = sq;
    o.period = seasonal ? period : 0;
    o.constant = constant;
    double aicc = std::numeric_limits<double>::infinity();
    ++result.models;
    try {
      Fit f = parent ? fit_from(o, y, warm_start(*parent, o), kNeighbourStep, kScreeningTolerance)
                     : fit(o, y, kScreeningTolerance);
      result.evaluations += f.evaluations;
      // a fit on the edge of stationarity or invertibility is not a candidate
      if (!f.at_bound && std::isfinite(f.aicc)) aicc = f.aicc;
      tried[key] = aicc;
      if (aicc < std::numeric_limits<double>::infinity() && (!have_best || aicc < best.aicc)) {
        best = std::move(f);
        have_best = true;
        return true;
      }
    } catch (const MethodFailure&) {
      tried[key] = aicc;
    }
    return false;
  };

  const bool with_constant = d + big_d <= 1;
  const int s1 = seasonal ? 1 : 0;
  try_model(std::min(2, bounds.max_p), std::min(2, bounds.max_q), std::min(s1, bounds.max_seasonal_p),
            std::min(s1, bounds.max_seasonal_q), with_constant, nullptr);
  try_model(0, 0, 0, 0, with_constant, nullptr);
  try_model(std::min(1, bounds.max_p), 0, std::min(s1, bounds.max_seasonal_p), 0, with_constant, nullptr);
  try_model(0, std::min(1, bounds.max_q), 0, std::min(s1, bounds.max_seasonal_q), with_constant, nullptr);
  if (with_constant) try_model(0, 0, 0, 0, false, nullptr);

  bool improved = have_best;
  while (improved) {
    improved = false;
    const Fit current = best;
    const Order c = current.order;
    const int p = c.p, q = c.q, sp = c.seasonal_p, sq = c.seasonal_q;
    const bool k = c.constant;
    const std::vector<std::tuple<int, int, int, int, bool>> moves{
        {p, q, sp - 1, sq, k}, {p, q, sp + 1, sq, k}, {p, q, sp, sq - 1, k}, {p, q, sp, sq + 1, k},
        {p, q, sp - 1, sq - 1, k}, {p, q, sp + 1, sq + 1, k},
        {p - 1, q, sp, sq, k}, {p + 1, q, sp, sq, k}, {p, q - 1, sp, sq, k}, {p, q + 1, sp, sq, k},
        {p - 1, q - 1, sp, sq, k}, {p + 1, q + 1, sp, sq, k},
        {p, q, sp, sq, !k}};
    for (const auto& [a, b, e, f, g] : moves)
      if (try_model(a, b, e, f, g, &current)) {
        improved = true;
        break;
      }
  }
  if (!have_best) throw MethodFailure("no ARIMA model in the search could be fitted");
  // the chosen order to full precision, from where its screening fit ended
  result.best = fit_from(best.order, y, best.parameters, kRefitStep);
  result.evaluations += result.best.evaluations;
  return result;
}

}  // namespace gapmark::arima
