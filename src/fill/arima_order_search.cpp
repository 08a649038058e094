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

namespace {

struct Differences {
  int d = 0, seasonal_d = 0;
};

/// One seasonal difference when the season is strong, then ordinary
/// differences while the KPSS test rejects level stationarity at 5% (and
/// enough observed values remain); records the strength and the statistics.
Differences choose_differences(std::span<const double> y, std::size_t period, const SearchBounds& bounds,
                               SearchResult& result) {
  Differences out;
  const bool seasonal = period >= 2;
  std::vector<double> work(y.begin(), y.end());
  result.seasonal_strength = seasonal ? seasonal_strength(y, period) : kNaN;
  if (seasonal && bounds.max_seasonal_d >= 1 && result.seasonal_strength > kStrengthThreshold) {
    out.seasonal_d = 1;
    work = difference(work, period);
  }
  while (true) {
    const double stat = kpss_statistic(work);
    result.kpss.push_back(stat);
    if (!(stat > kKpssCritical5) || out.d >= bounds.max_d) break;
    std::vector<double> next = difference(work, 1);
    if (observed_count(next) < 8) break;
    work = std::move(next);
    ++out.d;
  }
  return out;
}

/// A candidate's terms: AR, MA, seasonal AR, seasonal MA, constant.
using Terms = std::tuple<int, int, int, int, bool>;

/// The stepwise search over models with the chosen differences: the
/// models tried with their AICc, and the best so far.
class StepwiseSearch {
public:
  StepwiseSearch(std::span<const double> y, std::size_t period, const SearchBounds& bounds, Differences diff,
                 SearchResult& result)
      : y_(y), period_(period), bounds_(bounds), diff_(diff), result_(result) {}

  /// The starting models: (2,2) with seasonal (1,1), white noise, (1,0)
  /// with seasonal (1,0), (0,1) with seasonal (0,1); with a constant when
  /// the differences allow one, and white noise without it.
  void try_starting_models() {
    const bool with_constant = diff_.d + diff_.seasonal_d <= 1;
    const int s1 = seasonal() ? 1 : 0;
    try_model({std::min(2, bounds_.max_p), std::min(2, bounds_.max_q), std::min(s1, bounds_.max_seasonal_p),
               std::min(s1, bounds_.max_seasonal_q), with_constant},
              nullptr);
    try_model({0, 0, 0, 0, with_constant}, nullptr);
    try_model({std::min(1, bounds_.max_p), 0, std::min(s1, bounds_.max_seasonal_p), 0, with_constant}, nullptr);
    try_model({0, std::min(1, bounds_.max_q), 0, std::min(s1, bounds_.max_seasonal_q), with_constant}, nullptr);
    if (with_constant) try_model({0, 0, 0, 0, false}, nullptr);
  }

  /// Moves to the first neighbour that lowers the AICc, until none does.
  void climb() {
    bool improved = have_best_;
    while (improved) {
      improved = false;
      const Fit current = best_;
      const Order c = current.order;
      const int p = c.p, q = c.q, sp = c.seasonal_p, sq = c.seasonal_q;
      const bool k = c.constant;
      const std::vector<Terms> moves{
          {p, q, sp - 1, sq, k}, {p, q, sp + 1, sq, k}, {p, q, sp, sq - 1, k}, {p, q, sp, sq + 1, k},
          {p, q, sp - 1, sq - 1, k}, {p, q, sp + 1, sq + 1, k},
          {p - 1, q, sp, sq, k}, {p + 1, q, sp, sq, k}, {p, q - 1, sp, sq, k}, {p, q + 1, sp, sq, k},
          {p - 1, q - 1, sp, sq, k}, {p + 1, q + 1, sp, sq, k},
          {p, q, sp, sq, !k}};
      for (const Terms& move : moves)
        if (try_model(move, &current)) {
          improved = true;
          break;
        }
    }
  }

  const Fit* best() const { return have_best_ ? &best_ : nullptr; }

private:
  bool seasonal() const { return period_ >= 2; }

  /// Within the bounds, not tried yet, and the model budget not spent.
  bool allowed(const Terms& t) const {
    const auto& [p, q, sp, sq, constant] = t;
    if (p < 0 || q < 0 || sp < 0 || sq < 0 || p > bounds_.max_p || q > bounds_.max_q) return false;
    if (!seasonal() && (sp > 0 || sq > 0)) return false;
    if (sp > bounds_.max_seasonal_p || sq > bounds_.max_seasonal_q) return false;
    if (p + q + sp + sq > bounds_.max_terms) return false;
    if (constant && diff_.d + diff_.seasonal_d > 1) return false;
    return !tried_.count(t) && result_.models < bounds_.max_models;
  }

  Order order_of(const Terms& t) const {
    Order o;
    o.p = std::get<0>(t);
    o.d = diff_.d;
    o.q = std::get<1>(t);
    o.seasonal_p = std::get<2>(t);
    o.seasonal_d = diff_.seasonal_d;
    o.seasonal_q = std::get<3>(t);
    o.period = seasonal() ? period_ : 0;
    o.constant = std::get<4>(t);
    return o;
  }

  /// Fits the model (from `parent`'s end point when given: the current
  /// best, whose neighbour it is); true when it becomes the best.
  bool try_model(const Terms& t, const Fit* parent) {
    if (!allowed(t)) return false;
    const Order o = order_of(t);
    double aicc = std::numeric_limits<double>::infinity();
    ++result_.models;
    try {
      Fit f = parent ? fit_from(o, y_, warm_start(*parent, o), kNeighbourStep, kScreeningTolerance)
                     : fit(o, y_, kScreeningTolerance);
      result_.evaluations += f.evaluations;
      // a fit on the edge of stationarity or invertibility is not a candidate
      if (!f.at_bound && std::isfinite(f.aicc)) aicc = f.aicc;
      tried_[t] = aicc;
      if (aicc < std::numeric_limits<double>::infinity() && (!have_best_ || aicc < best_.aicc)) {
        best_ = std::move(f);
        have_best_ = true;
        return true;
      }
    } catch (const MethodFailure&) {
      tried_[t] = aicc;
    }
    return false;
  }

  std::span<const double> y_;
  std::size_t period_;
  const SearchBounds& bounds_;
  Differences diff_;
  SearchResult& result_;
  std::map<Terms, double> tried_;
  bool have_best_ = false;
  Fit best_;
};

}  // namespace

SearchResult search_order(std::span<const double> y, std::size_t period, const SearchBounds& bounds) {
  SearchResult result;
  const Differences diff = choose_differences(y, period, bounds, result);
  StepwiseSearch search(y, period, bounds, diff, result);
  search.try_starting_models();
  search.climb();
  const Fit* best = search.best();
  if (best == nullptr) throw MethodFailure("no ARIMA model in the search could be fitted");
  // the chosen order to full precision, from where its screening fit ended
  result.best = fit_from(best->order, y, best->parameters, kRefitStep);
  result.evaluations += result.best.evaluations;
  return result;
}

}  // namespace gapmark::arima
