// `gapmark run`: run an experiment spec into an output folder. Each finished
// task goes to the folder's checkpoint at once; at the end come results.json,
// the ranked tables and the other reports. `--resume` finishes a killed run,
// `--shard K/N` runs one machine's share (see `gapmark merge`).
#include <unistd.h>

#include <atomic>
#include <chrono>
#include <csignal>
#include <cstdio>
#include <iostream>
#include <optional>
#include <thread>

#include "commands.hpp"
#include "gapmark/report/final_reports.hpp"
#include "gapmark/error.hpp"
#include "gapmark/experiment/runner.hpp"
#include "gapmark/fill/external_program.hpp"
#include "output_rules.hpp"
#include "stop_signals.hpp"

namespace gapmark::cli {
namespace {

std::string duration_text(double seconds) {
  if (!(seconds < 1e7)) return "?";
  const long s = static_cast<long>(seconds + 0.5);
  char text[32];
  if (s >= 3600) std::snprintf(text, sizeof text, "%ldh%02ldm", s / 3600, s / 60 % 60);
  else if (s >= 60) std::snprintf(text, sizeof text, "%ldm%02lds", s / 60, s % 60);
  else std::snprintf(text, sizeof text, "%lds", s);
  return text;
}

/// Quotes a word for a shell command the user may paste.
std::string shell_word(const std::string& word) {
  if (!word.empty() && word.find_first_not_of("abcdefghijklmnopqrstuvwxyzABCDEFGHIJKLMNOPQRSTUVWXYZ0123456789_-./:=+,@") ==
                           std::string::npos)
    return word;
  std::string out = "'";
  for (char c : word) out += c == '\'' ? std::string("'\\''") : std::string(1, c);
  return out + "'";
}

/// Progress on stderr: a bar redrawn in place on a terminal, a plain line
/// every 10 seconds otherwise, nothing with --quiet. The rate and the time
/// left count only this session's tasks (a resumed run starts part done).
std::function<void(std::size_t, std::size_t)> progress_printer(bool quiet) {
  if (quiet) return {};
  struct State {
    bool tty = isatty(STDERR_FILENO) != 0;
    std::chrono::steady_clock::time_point start = std::chrono::steady_clock::now(), last{};
    std::optional<std::size_t> base;
    bool drawn = false;
  };
  auto state = std::make_shared<State>();
  return [state](std::size_t done, std::size_t total) {
    State& s = *state;
    if (!s.base) s.base = done;
    const auto now = std::chrono::steady_clock::now();
    const bool last = done == total;
    if (!last && s.drawn && now - s.last < std::chrono::milliseconds(s.tty ? 200 : 10000)) return;
    if (!s.tty && !s.drawn && !last && now - s.start < std::chrono::seconds(10)) return;
    s.last = now;
    s.drawn = true;
    const double elapsed = std::chrono::duration<double>(now - s.start).count();
    const std::size_t run = done - *s.base;
    const double rate = elapsed > 0 && run > 0 ? static_cast<double>(run) / elapsed : 0;
    const std::string left = rate > 0 ? duration_text(static_cast<double>(total - done) / rate) : "?";
    const double fraction = total ? static_cast<double>(done) / static_cast<double>(total) : 1.0;
    char line[200];
    if (s.tty) {
      const int width = 30;
      const int filled = static_cast<int>(width * fraction);
      std::snprintf(line, sizeof line, "\r[%s%s] %zu/%zu tasks %3.0f%%  %.1f tasks/s  %s left\033[K",
                    std::string(static_cast<std::size_t>(filled), '#').c_str(),
                    std::string(static_cast<std::size_t>(width - filled), '.').c_str(), done, total, 100 * fraction,
                    rate, last ? "0s" : left.c_str());
      std::cerr << line << (last ? "\n" : "") << std::flush;
    } else {
      std::snprintf(line, sizeof line, "progress: %zu/%zu tasks (%.0f%%), %.1f tasks/s, %s left\n", done, total,
                    100 * fraction, rate, last ? "0s" : left.c_str());
      std::cerr << line;
    }
  };
}

void print_warnings(const std::vector<Warning>& warnings) {
  const std::size_t shown = std::min<std::size_t>(warnings.size(), 20);
  for (std::size_t i = 0; i < shown; ++i)
    std::cerr << "warning: " << warnings[i].where << ": " << warnings[i].message << " (" << warnings[i].hint << ")\n";
  if (warnings.size() > shown)
    std::cerr << "... and " << warnings.size() - shown << " more warnings (all are listed in results.json)\n";
}

struct RunCommandOptions {
  std::string spec;
  std::string out;
  std::string resume;
  std::string shard;
  unsigned threads = 0;
  std::size_t period = 0;
  bool quiet = false;
  bool force = false;
  bool allow_external = false;
  CLI::Option* resume_option = nullptr;
};

/// The folder the run writes: the folder --resume names, else --out, else
/// the spec's "output"; --resume and --out may not name two folders.
void choose_output_folder(ExperimentSpec& spec, const RunCommandOptions& o, bool resume) {
  if (resume && !o.resume.empty() && !o.out.empty() &&
      std::filesystem::path(o.resume).lexically_normal() != std::filesystem::path(o.out).lexically_normal())
    throw InputError("--resume", "names folder " + o.resume + " but --out names " + o.out + "; give one");
  if (!o.out.empty()) spec.output = o.out;
  if (resume && !o.resume.empty()) spec.output = o.resume;
  if (o.out.empty() && o.resume.empty() && !spec_output_problem(spec).empty())
    throw InputError("", spec_output_problem(spec));
}

/// The output rules: the folder holds none of the inputs, nor an earlier
/// output unless --force or --resume, and a resumed folder exists.
void check_run_folder(const ExperimentSpec& spec, const RunCommandOptions& o, bool resume) {
  std::vector<std::filesystem::path> inputs{o.spec};
  for (const auto& d : spec.data) inputs.push_back(d.path);
  check_output_dir(spec.output, inputs, o.force || resume, "give another --out");
  if (resume && !std::filesystem::exists(spec.output))
    throw InputError(spec.output.string(), "nothing to resume: no such folder");
}

/// What the user is told when the run stops: how to resume an interrupted
/// run, or the warnings and what was written. Returns the exit status.
int tell_outcome(const FolderRunStatus& status, const ExperimentSpec& spec, const RunCommandOptions& o) {
  if (!status.complete()) {
    std::cerr << (stop_signal() == SIGTERM ? "terminated: " : "interrupted: ") << status.done << " of " << status.total
              << " tasks done; resume with: gapmark run " << shell_word(o.spec)
              << (status.shard.whole() ? "" : " --shard " + status.shard.text()) << " --resume "
              << shell_word(spec.output.string()) << "\n";
    return stopped_exit_status();
  }
  if (o.quiet) return kOk;
  print_warnings(status.warnings);
  if (status.shard.whole())
    std::cerr << "wrote " << status.written.size() << " files to " << spec.output.string() << "\n";
  else
    std::cerr << "shard " << status.shard.text() << " done: " << status.total << " tasks in " << spec.output.string()
              << "; when every shard is done: gapmark merge FOLDER... --out FOLDER\n";
  return kOk;
}

int run_command(const RunCommandOptions& o) {
  ExperimentSpec spec = load_spec(o.spec);
  if (refused_external(spec, o.allow_external, "run it")) return kBadInput;
  if (o.period) spec = with_period(spec, o.period);
  const bool resume = o.resume_option->count() > 0;
  choose_output_folder(spec, o, resume);
  check_run_folder(spec, o, resume);
  const OutputDir folder_made(spec.output);
  const FolderLock lock(spec.output);  // one run per folder, held until the reports are written
  remove_stale_temp_files(spec.output);
  FolderRunOptions folder{spec.output, resume, std::nullopt, {}, {}};
  if (!o.quiet)
    folder.before_reports = [&spec] {
      std::cerr << "all tasks done; summarising and writing the reports to " << spec.output.string() << "\n";
    };
  if (!o.shard.empty()) folder.shard = Shard::parse(o.shard, "--shard");

  RunOptions options;
  options.threads = o.threads ? o.threads : std::max(1u, std::thread::hardware_concurrency());
  options.progress = progress_printer(o.quiet);
  options.stop = &stop_flag();
  catch_stop_signals(external_commands(spec).empty() ? StoppedWork::tasks : StoppedWork::tasks_with_programs);
  return tell_outcome(run_into_folder(spec, options, folder), spec, o);
}

}  // namespace

void add_run(CLI::App& app, Action& action) {
  auto o = std::make_shared<RunCommandOptions>();
  auto* cmd = app.add_subcommand("run", "Run an experiment spec: mask, fill, score, rank, report");
  cmd->add_option("SPEC", o->spec, "Experiment spec (JSON)")->required();
  cmd->add_option("--out,-o", o->out, "Output folder (default: the spec's \"output\")");
  cmd->add_option("--threads,-j", o->threads, "Worker threads (default: all cores); results do not depend on it");
  o->resume_option =
      cmd->add_option("--resume", o->resume,
                      "Finish an interrupted run: only the tasks missing from the folder's checkpoint are run "
                      "(default folder: --out or the spec's \"output\")")
          ->expected(0, 1);
  cmd->add_option("--shard", o->shard,
                  "Run only shard K of N (1-based): the tasks whose index mod N is K-1; combine the shard "
                  "folders with `gapmark merge`");
  cmd->add_option("--period", o->period,
                  "Seasonal period in time steps for every data set, replacing the spec's \"period\" and \"periods\" "
                  "(recorded in results.json; a resume must give the same)")
      ->check(CLI::Range(2, 1000000));
  cmd->add_flag("--quiet,-q", o->quiet, "No progress output");
  add_force_flag(*cmd, o->force);
  add_consent_flag(*cmd, o->allow_external);
  cmd->callback([&action, o] { action = [o] { return run_command(*o); }; });
}

}  // namespace gapmark::cli
