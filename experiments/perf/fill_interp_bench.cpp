// Prints how long the interpolating and seasonal fill methods take on an
// invented 100,000-point series (trend + a cycle of 24 steps + a slow wiggle)
// with 20% of its points missing in runs of 1 to 12. Figures only: no pass
// or fail. Usage: fill_interp_bench [points]
#include <chrono>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <random>
#include <string>
#include <vector>

#include "gapmark/fill/method.hpp"
#include "gapmark/time_axis.hpp"

int main(int argc, char** argv) {
  using namespace gapmark;
  const std::size_t n = argc > 1 ? std::strtoull(argv[1], nullptr, 10) : 100000;
  const std::size_t period = 24;
  std::vector<double> values(n);
  for (std::size_t t = 0; t < n; ++t)
    values[t] = 0.001 * static_cast<double>(t) + 3.0 * std::sin(2 * M_PI * static_cast<double>(t % period) / period) +
                0.5 * std::sin(0.013 * static_cast<double>(t));
  std::mt19937_64 gen(20260301);
  std::uniform_int_distribution<std::size_t> start(1, n - 14), length(1, 12);
  std::size_t missing = 0;
  while (missing < n / 5) {
    const std::size_t s = start(gen), l = length(gen);
    for (std::size_t i = s; i < s + l; ++i)
      if (!std::isnan(values[i])) { values[i] = std::nan(""); ++missing; }
  }
  const TimeAxis axis = TimeAxis::index(n);
  FillRequest request;
  request.values = values;
  request.axis = &axis;
  request.period = period;

  std::printf("%zu points, %zu missing, period %zu\n", n, missing, period);
  std::printf("%-28s %10s %10s\n", "method", "ms", "unfilled");
  for (const std::string call : {"natural-spline", "pchip", "akima-weighted", "window-mean", "window-mean:reach=50,weights=triangular",
                                 "seasonal-mean", "seasonal-mean:statistic=median", "seasonal-adjusted",
                                 "seasonal-adjusted:inner=pchip", "seasonal-adjusted:decomposition=stl"}) {
    const auto bound = MethodRegistry::global().bind(CallSpec::parse(call, "bench"), "bench");
    const auto t0 = std::chrono::steady_clock::now();
    const FillResult r = bound.impl->fill(request);
    const auto t1 = std::chrono::steady_clock::now();
    std::size_t unfilled = 0;
    for (double v : r.values) unfilled += std::isnan(v) ? 1 : 0;
    std::printf("%-28s %10.1f %10zu\n", call.c_str(), std::chrono::duration<double, std::milli>(t1 - t0).count(),
                unfilled);
  }
}
