// How close the simplest fills come to the memory floor: the linear and
// carry-forward methods against a plain loop that only reads the same input
// and writes an output array of the same size (allocated per call, as a fill
// allocates its result). Target: each fill within 3x of the loop.
// Series of 1,000 to 1,000,000 points (in the caches up to main memory).
// Each round takes a series with a fresh gap pattern (copied into the input
// array before the clock starts, so the input is in cache as in a run): one
// pattern timed over and over would be learnt by the branch predictor and
// flatter code that branches per point. Rounds of the three are interleaved
// so that a load from other programs hits all three alike; the best round of
// each is kept. Prints nanoseconds per point and the ratios, and checks that
// every gap was filled.
//
//   build/perf/bench_fill_vs_loop [points (default: 1e3, 1e4, 1e5, 1e6)] [rounds]
#include <algorithm>
#include <chrono>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <cstring>
#include <string>
#include <vector>

#include "gapmark/fill/method.hpp"
#include "gapmark/rng.hpp"

using namespace gapmark;

namespace {

/// A wavy series with about 19% of points missing: 10% scattered holes and
/// a block of 20 in every 200 points (the blocks' offset varies with the seed).
std::vector<double> holed_series(std::size_t n, std::uint64_t seed) {
  std::vector<double> x(n);
  Rng rng(seed);
  for (std::size_t i = 0; i < n; ++i) x[i] = 10 + std::sin(0.01 * static_cast<double>(i)) + 0.1 * rng.uniform();
  for (std::size_t i = 0; i < n; ++i)
    if (rng.uniform() < 0.1) x[i] = std::nan("");
  for (std::size_t start = rng.below(200); start + 20 < n; start += 200)
    for (std::size_t i = start; i < start + 20; ++i) x[i] = std::nan("");
  return x;
}

double seconds(std::chrono::steady_clock::time_point t0) {
  return std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
}

volatile double g_sink = 0;

void measure(std::size_t n, int rounds) {
  // Enough different patterns for a million points in all (at least one).
  std::vector<std::vector<double>> patterns;
  for (std::size_t k = 0; k < std::max<std::size_t>(1, 1000000 / n); ++k) patterns.push_back(holed_series(n, 7 + k));
  std::vector<double> x(n);
  const TimeAxis axis = TimeAxis::index(n);
  FillRequest request;
  request.values = x;
  request.axis = &axis;
  const auto linear = MethodRegistry::global().bind(CallSpec::parse("linear", "bench"), "bench");
  const auto carry = MethodRegistry::global().bind(CallSpec::parse("carry-forward", "bench"), "bench");
  std::size_t missing = 0, total = 0;
  for (const auto& p : patterns) {
    x = p;
    for (double v : x) missing += std::isnan(v) ? 1 : 0;
    total += n;
    for (const auto* m : {&linear, &carry}) {
      const FillResult r = m->impl->fill(request);
      for (double v : r.values)
        if (std::isnan(v)) {
          std::printf("a fill left a gap: the comparison would not be fair\n");
          std::exit(1);
        }
    }
  }

  double loop = 1e300, lin = 1e300, cf = 1e300;
  std::size_t next = 0;
  auto fresh_input = [&] {
    std::memcpy(x.data(), patterns[next].data(), n * sizeof(double));
    next = (next + 1) % patterns.size();
  };
  for (int r = 0; r < rounds; ++r) {
    fresh_input();
    auto t0 = std::chrono::steady_clock::now();
    {
      std::vector<double> out(n);
      for (std::size_t i = 0; i < n; ++i) out[i] = std::isnan(x[i]) ? 0.0 : x[i];
      g_sink = g_sink + out[n / 2];
    }
    loop = std::min(loop, seconds(t0));
    fresh_input();
    t0 = std::chrono::steady_clock::now();
    g_sink = g_sink + linear.impl->fill(request).values[n / 2];
    lin = std::min(lin, seconds(t0));
    fresh_input();
    t0 = std::chrono::steady_clock::now();
    g_sink = g_sink + carry.impl->fill(request).values[n / 2];
    cf = std::min(cf, seconds(t0));
  }
  const double per = 1e9 / static_cast<double>(n);
  std::printf("  %9zu points (%4.1f%% missing, %5d rounds)  loop %5.2f ns/point   linear %5.2f ns  %4.2fx   "
              "carry-forward %5.2f ns  %4.2fx\n",
              n, 100.0 * static_cast<double>(missing) / static_cast<double>(total), rounds, loop * per, lin * per,
              lin / loop, cf * per, cf / loop);
}

}  // namespace

int main(int argc, char** argv) {
  std::vector<std::size_t> sizes{1000, 10000, 100000, 1000000};
  if (argc > 1) sizes = {std::strtoul(argv[1], nullptr, 10)};
  const int fixed_rounds = argc > 2 ? std::atoi(argv[2]) : 0;
  std::printf("fill vs plain loop, a fresh gap pattern each round, best round of each (target: each fill <= 3x the loop)\n");
  for (std::size_t n : sizes) {
    // About 2e8 points per size, at least 15 rounds.
    const int rounds = fixed_rounds > 0 ? fixed_rounds
                                        : static_cast<int>(std::max<std::size_t>(15, 200000000 / std::max<std::size_t>(n, 1) / 3));
    measure(n, rounds);
  }
  return 0;
}
