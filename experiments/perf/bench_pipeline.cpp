// The core pipeline's throughput: scored points per second for the linear
// method on 10,000-point series, through the whole runner (task seeds, mask
// draw, fill, restoring observed values, metrics, records), on one thread.
// Target: at least 1 million scored points per second per core with the
// error metrics. Also shown: the default metrics (error, acf, forecast,
// interval; no holdout, so no forecast fits), and the folder run (the
// checkpoint written and read back, the summary, every report).
//
//   build/perf/bench_pipeline [series=20] [points=10000] [replicates=10]
#include <chrono>
#include <ctime>
#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <string>

#include "gapmark/experiment/runner.hpp"
#include "gapmark/report/final_reports.hpp"
#include "gapmark/number_format.hpp"
#include "gapmark/rng.hpp"

using namespace gapmark;
namespace fs = std::filesystem;

namespace {

/// Invented series (a daily cycle plus noise) written as one wide CSV.
void write_data(const fs::path& path, std::size_t series, std::size_t points) {
  std::ofstream out(path);
  out << "t";
  for (std::size_t s = 0; s < series; ++s) out << ",s" << s;
  out << "\n";
  Rng rng(99);
  for (std::size_t i = 0; i < points; ++i) {
    out << i;
    for (std::size_t s = 0; s < series; ++s)
      out << "," << format_double(10 + std::sin(0.2618 * static_cast<double>(i) + static_cast<double>(s)) + rng.uniform());
    out << "\n";
  }
}

std::string spec_text(const fs::path& data, const std::string& metrics, int replicates) {
  return R"j({"name": "pipeline benchmark (invented data)", "seed": 1, "replicates": )j" + std::to_string(replicates) +
         R"(, "data": [{"file": ")" + data.string() + R"(", "period": 24}],
  "schemes": [{"name": "random", "rates": [0.1, 0.3]}, {"name": "blocks", "length_mean": 12, "rates": [0.2]}],
  "methods": ["linear"])" + metrics + "}";
}

double seconds_since(std::chrono::steady_clock::time_point t0) {
  return std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
}

double cpu_seconds() { return static_cast<double>(std::clock()) / CLOCKS_PER_SEC; }

/// One line: points, wall and CPU seconds, points per second of each; the
/// share of the time spent inside the fill method when known (< 0: not).
void report(const char* what, std::size_t scored, double seconds, double cpu, double fill_seconds) {
  std::printf("  %-40s %8zu points  %6.3f s wall %6.2f M/s   %6.3f s CPU %6.2f M/s", what, scored, seconds,
              static_cast<double>(scored) / seconds / 1e6, cpu, static_cast<double>(scored) / cpu / 1e6);
  if (fill_seconds >= 0) std::printf("   (fill %4.1f%% of the time)", 100 * fill_seconds / seconds);
  std::printf("\n");
}

}  // namespace

int main(int argc, char** argv) {
  const std::size_t series = argc > 1 ? std::strtoul(argv[1], nullptr, 10) : 20;
  const std::size_t points = argc > 2 ? std::strtoul(argv[2], nullptr, 10) : 10000;
  const int replicates = argc > 3 ? std::atoi(argv[3]) : 10;
  const fs::path dir = fs::temp_directory_path() / "gapmark-bench-pipeline";
  fs::create_directories(dir);
  write_data(dir / "data.csv", series, points);
  std::printf("pipeline throughput, linear, %zu series x %zu points, 3 (scheme, rate) cells x %d replicates, "
              "1 thread\n", series, points, replicates);

  RunOptions options;
  options.threads = 1;
  for (const auto& [label, metrics] :
       {std::pair<const char*, std::string>{"in memory, error metrics", R"(, "metrics": ["error"])"},
        {"in memory, default metrics", ""}}) {
    const auto spec = parse_spec(spec_text(dir / "data.csv", metrics, replicates), "bench.json", dir);
    const auto t0 = std::chrono::steady_clock::now();
    const double c0 = cpu_seconds();
    const ResultSet results = run_experiment(spec, options);
    const double seconds = seconds_since(t0), cpu = cpu_seconds() - c0;
    std::size_t scored = 0;
    double fill = 0;
    for (const auto& t : results.trials) {
      scored += t.masked - t.unfilled;
      fill += t.seconds;
    }
    report(label, scored, seconds, cpu, fill);
  }
  {
    const auto spec = parse_spec(spec_text(dir / "data.csv", R"(, "metrics": ["error"])", replicates), "bench.json", dir);
    const auto t0 = std::chrono::steady_clock::now();
    const double c0 = cpu_seconds();
    const FolderRunStatus status = run_into_folder(spec, options, {.dir = dir / "out", .resume = false, .shard = std::nullopt});
    const double seconds = seconds_since(t0), cpu = cpu_seconds() - c0;
    // Scored points: the same masks as the in-memory run.
    const ResultSet results = run_experiment(spec, options);
    std::size_t scored = 0;
    for (const auto& t : results.trials) scored += t.masked - t.unfilled;
    report("folder run (checkpoint, reports), error", scored, seconds, cpu, -1);
    std::printf("  (%zu tasks; the folder run includes loading the %zu x %zu CSV)\n", status.total, series, points);
  }
  return 0;
}
