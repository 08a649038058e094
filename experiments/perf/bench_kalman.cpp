// Time per maximum-likelihood fit plus smoothing of the kalman method's
// models on invented series (random-walk level, slope drift, a season and
// noise, 10% of points missing at random, fixed seed): first CPU time per
// fill at 2,000 hourly points with period 24 for every model, then fit and
// smoothing times at 1,000, 10,000 and 100,000 points. Prints one row per model and length; build in Release.
// Times are wall-clock, best of a few runs (one run for the long seasonal
// cases), with the process CPU time of the same run beside the fit time, as
// the machine may be shared.
//
//   build/perf/bench_kalman [repeats] [fill]   (fill: the per-fill rows at 2,000 points only)
#include <algorithm>
#include <chrono>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <ctime>
#include <string>
#include <vector>

#include "gapmark/fill/state_space.hpp"
#include "gapmark/rng.hpp"

namespace ss = gapmark::state_space;

namespace {

std::vector<double> invented(std::size_t n, std::size_t period, std::uint64_t seed) {
  gapmark::Rng rng(seed);
  auto normal = [&] {
    const double u1 = 1.0 - rng.uniform(), u2 = rng.uniform();
    return std::sqrt(-2.0 * std::log(u1)) * std::cos(6.283185307179586 * u2);
  };
  std::vector<double> y(n);
  double level = 50, slope = 0;
  for (std::size_t t = 0; t < n; ++t) {
    slope += 0.001 * normal();
    level += slope + 0.2 * normal();
    const double season = period ? 2.0 * std::sin(6.283185307179586 * static_cast<double>(t % period) / period) : 0;
    y[t] = rng.bernoulli(0.1) ? std::nan("") : level + season + 0.5 * normal();
  }
  return y;
}

/// The targets' shape: hourly data with a daily cycle (period 24), 2,000
/// points, 10% missing at random; CPU time per fill (fit + smoothing), over
/// `series` series (more for the fast models, so the clock resolves them).
void per_fill(const ss::StructuralModel& model, std::size_t series) {
  double cpu_ms = 0, max_cpu_ms = 0;
  std::size_t evals = 0;
  for (std::size_t i = 0; i < series; ++i) {
    const auto y = invented(2000, 24, 777 + i);
    const std::clock_t start = std::clock();
    const auto fit = ss::fit_variances(model, y);
    const auto smooth = ss::smooth_signal(model, y, fit.variances);
    const double ms = 1000.0 * static_cast<double>(std::clock() - start) / CLOCKS_PER_SEC;
    if (smooth.mean.size() != y.size()) std::exit(1);
    cpu_ms += ms;
    max_cpu_ms = std::max(max_cpu_ms, ms);
    evals += fit.evaluations;
  }
  std::printf("%-26s %8d %8zu %14.3f %14.3f %12.0f\n", model.name().c_str(), 2000, series,
              cpu_ms / static_cast<double>(series), max_cpu_ms,
              static_cast<double>(evals) / static_cast<double>(series));
  std::fflush(stdout);
}

}  // namespace

int main(int argc, char** argv) {
  const int repeats = argc > 1 ? std::max(1, std::atoi(argv[1])) : 3;
  std::printf("Hourly, period 24, n = 2,000, 10%% missing; CPU time per fill (fit + smooth)\n");
  std::printf("%-26s %8s %8s %14s %14s %12s\n", "model", "n", "series", "mean cpu ms", "max cpu ms",
              "mean evals");
  per_fill(ss::StructuralModel::local_level(), 500);
  per_fill(ss::StructuralModel::local_linear_trend(), 50);
  for (std::size_t k : {2, 3, 4, 11}) per_fill(ss::StructuralModel::trigonometric(24, k), 10);
  per_fill(ss::StructuralModel::basic_structural(24), 3);
  if (argc > 2 && std::string(argv[2]) == "fill") return 0;
  std::printf("\n");
  std::printf("%-26s %8s %10s %12s %11s %7s %7s %12s\n", "model", "n", "fit ms", "fit cpu ms", "smooth ms",
              "evals", "starts", "us per eval");
  struct Case {
    ss::StructuralModel model;
    std::size_t period;
  };
  const std::vector<Case> cases{{ss::StructuralModel::local_level(), 0},
                                {ss::StructuralModel::local_linear_trend(), 0},
                                {ss::StructuralModel::basic_structural(4), 4},
                                {ss::StructuralModel::basic_structural(12), 12},
                                {ss::StructuralModel::trigonometric(24, 3), 24}};
  for (const auto& c : cases) {
    for (std::size_t n : {1000, 10000, 100000}) {
      const auto y = invented(n, c.period, 20240 + n);
      double fit_ms = 1e300, fit_cpu_ms = 1e300, smooth_ms = 1e300;
      ss::FitResult fit;
      const int reps = n >= 100000 && c.period ? 1 : repeats;  // best of `reps` runs
      for (int r = 0; r < reps; ++r) {
        auto start = std::chrono::steady_clock::now();
        const std::clock_t cpu_start = std::clock();
        fit = ss::fit_variances(c.model, y);
        const std::clock_t cpu_end = std::clock();
        auto now = std::chrono::steady_clock::now();
        const double ms = std::chrono::duration<double, std::milli>(now - start).count();
        if (ms < fit_ms) {
          fit_ms = ms;
          fit_cpu_ms = 1000.0 * static_cast<double>(cpu_end - cpu_start) / CLOCKS_PER_SEC;
        }
        start = now;
        const auto smooth = ss::smooth_signal(c.model, y, fit.variances);
        now = std::chrono::steady_clock::now();
        smooth_ms = std::min(smooth_ms, std::chrono::duration<double, std::milli>(now - start).count());
        if (smooth.mean.size() != n) return 1;
      }
      std::printf("%-26s %8zu %10.1f %12.1f %11.1f %7zu %7zu %12.1f\n", c.model.name().c_str(), n, fit_ms,
                  fit_cpu_ms, smooth_ms, fit.evaluations, fit.starts,
                  1000.0 * fit_ms / static_cast<double>(fit.evaluations));
      std::fflush(stdout);
    }
  }
  return 0;
}
