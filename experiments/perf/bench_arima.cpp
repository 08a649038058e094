// CPU time per arima fill (fit plus smoothing) on invented series of 2,000
// points (an ARMA(1,1) around a slow random-walk level, 10% missing at
// random and one 20-point gap; a daily cycle of period 24 for the seasonal
// rows; fixed seeds). Prints one row per configuration: mean and largest
// CPU milliseconds per fill, likelihood passes per fill. Build in Release.
//
//   build/perf/bench_arima [series]
#include <algorithm>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <ctime>
#include <string>
#include <vector>

#include "gapmark/fill/arima_order_search.hpp"
#include "gapmark/rng.hpp"

namespace ar = gapmark::arima;

namespace {

std::vector<double> invented(std::size_t n, std::size_t period, std::uint64_t seed) {
  gapmark::Rng rng(seed);
  auto normal = [&] {
    const double u1 = 1.0 - rng.uniform(), u2 = rng.uniform();
    return std::sqrt(-2.0 * std::log(u1)) * std::cos(6.283185307179586 * u2);
  };
  std::vector<double> y(n);
  double level = 20, x = 0, e_prev = 0;
  for (std::size_t t = 0; t < n; ++t) {
    const double e = normal();
    x = 0.6 * x + e + 0.3 * e_prev;
    e_prev = e;
    level += 0.05 * normal();
    const double season =
        period ? 3.0 * std::sin(6.283185307179586 * static_cast<double>(t % period) / static_cast<double>(period)) : 0;
    y[t] = rng.bernoulli(0.1) || (t >= 1000 && t < 1020) ? std::nan("") : level + season + x;
  }
  return y;
}

void row(const char* label, std::size_t series, std::size_t period, bool automatic, ar::Order order,
         const ar::SearchBounds& bounds = {}) {
  double total = 0, worst = 0;
  std::size_t passes = 0;
  std::string chosen;
  for (std::size_t i = 0; i < series; ++i) {
    const auto y = invented(2000, period, 4242 + i);
    const std::clock_t start = std::clock();
    ar::Fit f;
    if (automatic) {
      const auto r = ar::search_order(y, period, bounds);
      f = r.best;
      passes += r.evaluations;
    } else {
      order.period = period;
      f = ar::fit(order, y);
      passes += f.evaluations;
    }
    const auto s = ar::smooth_fit(f, y);
    const double ms = 1000.0 * static_cast<double>(std::clock() - start) / CLOCKS_PER_SEC;
    if (s.mean.size() != y.size()) std::exit(1);
    total += ms;
    worst = std::max(worst, ms);
    chosen = f.order.text();
  }
  std::printf("%-34s %7zu %12.1f %12.1f %10zu   %s\n", label, series, total / static_cast<double>(series), worst,
              passes / series, chosen.c_str());
}

}  // namespace

int main(int argc, char** argv) {
  const std::size_t series = argc > 1 ? static_cast<std::size_t>(std::atoi(argv[1])) : 5;
  std::printf("%-34s %7s %12s %12s %10s   %s\n", "configuration (2,000 points)", "series", "mean CPU ms",
              "max CPU ms", "passes", "order (last series)");
  ar::Order o111;
  o111.p = 1;
  o111.d = 1;
  o111.q = 1;
  row("given (1,1,1)", series, 0, false, o111);
  ar::Order o201;
  o201.p = 2;
  o201.q = 1;
  o201.constant = true;
  row("given (2,0,1) with mean", series, 0, false, o201);
  row("automatic, no season", series, 0, true, {});
  ar::Order air;
  air.d = 1;
  air.q = 1;
  air.seasonal_d = 1;
  air.seasonal_q = 1;
  row("given (0,1,1)(0,1,1)24", series, 24, false, air);
  ar::SearchBounds small;
  small.max_seasonal_p = 1;
  small.max_seasonal_q = 1;
  row("automatic, period 24 (P,Q <= 1)", std::min<std::size_t>(series, 2), 24, true, {}, small);
  return 0;
}
