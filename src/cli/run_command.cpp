// `gapmark run`: run an experiment spec and write results.json, the ranked
// tables and the other reports into the output folder.
#include <unistd.h>

#include <chrono>
#include <cstdio>
#include <iostream>
#include <thread>

#include "commands.hpp"
#include "gapmark/experiment/runner.hpp"
#include "gapmark/report/reporter.hpp"

namespace gapmark::cli {
namespace {

/// Progress on stderr: a bar on a terminal, a plain line every few seconds
/// otherwise, nothing with --quiet.
std::function<void(std::size_t, std::size_t)> progress_printer(bool quiet) {
  if (quiet) return {};
  const bool tty = isatty(STDERR_FILENO);
  auto start = std::chrono::steady_clock::now();
  auto last = std::make_shared<std::chrono::steady_clock::time_point>(start);
  return [tty, start, last](std::size_t done, std::size_t total) {
    const auto now = std::chrono::steady_clock::now();
    if (done != total && now - *last < std::chrono::milliseconds(tty ? 100 : 5000)) return;
    *last = now;
    const double elapsed = std::chrono::duration<double>(now - start).count();
    const double rate = elapsed > 0 ? static_cast<double>(done) / elapsed : 0;
    const double left = rate > 0 ? static_cast<double>(total - done) / rate : 0;
    char line[160];
    if (tty) {
      const int width = 30;
      const int filled = static_cast<int>(width * static_cast<double>(done) / static_cast<double>(total));
      std::snprintf(line, sizeof line, "\r[%-*s] %zu/%zu tasks  %.1f/s  %.0fs left ", width,
                    std::string(static_cast<std::size_t>(filled), '#').c_str(), done, total, rate, left);
      std::cerr << line << (done == total ? "\n" : "") << std::flush;
    } else {
      std::snprintf(line, sizeof line, "progress: %zu/%zu tasks, %.1f/s, about %.0fs left\n", done, total, rate, left);
      std::cerr << line;
    }
  };
}

}  // namespace

void add_run(CLI::App& app, Action& action) {
  struct Options {
    std::string spec;
    std::string out;
    unsigned threads = 0;
    bool quiet = false;
  };
  auto o = std::make_shared<Options>();
  auto* cmd = app.add_subcommand("run", "Run an experiment spec: mask, fill, score, rank, report");
  cmd->add_option("SPEC", o->spec, "Experiment spec (JSON)")->required();
  cmd->add_option("--out,-o", o->out, "Output folder (default: the spec's \"output\")");
  cmd->add_option("--threads,-j", o->threads, "Worker threads (default: all cores); results do not depend on it");
  cmd->add_flag("--quiet,-q", o->quiet, "No progress output");
  cmd->callback([&action, o] {
    action = [o] {
      ExperimentSpec spec = load_spec(o->spec);
      if (!o->out.empty()) spec.output = o->out;
      RunOptions options;
      options.threads = o->threads ? o->threads : std::max(1u, std::thread::hardware_concurrency());
      options.progress = progress_printer(o->quiet);
      ResultSet results = run_experiment(spec, options);
      auto written = write_reports(results, spec.output.string());
      if (!o->quiet) {
        for (const auto& w : results.warnings) std::cerr << "warning: " << w.where << ": " << w.message << " (" << w.hint << ")\n";
        std::cerr << "wrote " << written.size() << " files to " << spec.output.string() << "\n";
      }
      return kOk;
    };
  });
}

}  // namespace gapmark::cli
