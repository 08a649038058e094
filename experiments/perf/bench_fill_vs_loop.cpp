// How close the simplest fills come to the memory floor: the linear and
// carry-forward methods against a plain loop that only reads the same input
// and writes an output array of the same size (allocated per call, as a fill
// allocates its result). Target: each fill within 3x of the loop.
// Prints nanoseconds per point (best of several rounds) and the ratios.
//
//   build/perf/bench_fill_vs_loop [points=1000000] [rounds=15]
#include <algorithm>
#include <chrono>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <string>
#include <vector>

#include "gapmark/fill/method.hpp"
#include "gapmark/rng.hpp"

using namespace gapmark;

namespace {

/// A wavy series with 20% of points missing: scattered holes and blocks.
std::vector<double> holed_series(std::size_t n) {
  std::vector<double> x(n);
  Rng rng(7);
  for (std::size_t i = 0; i < n; ++i) x[i] = 10 + std::sin(0.01 * static_cast<double>(i)) + 0.1 * rng.uniform();
  for (std::size_t i = 0; i < n; ++i)
    if (rng.uniform() < 0.1) x[i] = std::nan("");
  for (std::size_t start = 100; start + 20 < n; start += 200)
    for (std::size_t i = start; i < start + 20; ++i) x[i] = std::nan("");
  return x;
}

template <class F>
double best_seconds(int rounds, F&& f) {
  double best = 1e300;
  for (int r = 0; r < rounds; ++r) {
    const auto t0 = std::chrono::steady_clock::now();
    f();
    best = std::min(best, std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count());
  }
  return best;
}

volatile double g_sink = 0;

}  // namespace

int main(int argc, char** argv) {
  const std::size_t n = argc > 1 ? std::strtoul(argv[1], nullptr, 10) : 1000000;
  const int rounds = argc > 2 ? std::atoi(argv[2]) : 15;
  const std::vector<double> x = holed_series(n);
  const TimeAxis axis = TimeAxis::index(n);
  FillRequest request;
  request.values = x;
  request.axis = &axis;

  const double loop = best_seconds(rounds, [&] {
    std::vector<double> out(n);
    for (std::size_t i = 0; i < n; ++i) out[i] = std::isnan(x[i]) ? 0.0 : x[i];
    g_sink = g_sink + out[n / 2];
  });
  std::printf("fill vs plain loop, %zu points, 20%% missing, best of %d rounds\n", n, rounds);
  std::printf("  %-16s %7.2f ns/point\n", "plain loop", 1e9 * loop / static_cast<double>(n));
  for (const char* name : {"linear", "carry-forward"}) {
    const auto method = MethodRegistry::global().bind(CallSpec::parse(name, "bench"), "bench");
    const double t = best_seconds(rounds, [&] {
      const FillResult r = method.impl->fill(request);
      g_sink = g_sink + r.values[n / 2];
    });
    std::printf("  %-16s %7.2f ns/point   %.2fx the loop (target <= 3x)\n", name,
                1e9 * t / static_cast<double>(n), t / loop);
  }
  return 0;
}
