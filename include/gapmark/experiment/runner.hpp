#pragma once
// Runs an experiment: loads the data, builds the task grid, masks each task
// (seeded from its key), runs every method on the same mask, scores them,
// and returns the records in canonical order -- in memory (run_experiment),
// or streamed to a checkpoint in an output folder that can be resumed and
// split across machines (run_tasks_into_folder).
#include <atomic>
#include <cstddef>
#include <filesystem>
#include <functional>
#include <optional>
#include <span>
#include <string>
#include <vector>

#include "gapmark/error.hpp"
#include "gapmark/experiment/record.hpp"
#include "gapmark/experiment/shard.hpp"
#include "gapmark/experiment/spec.hpp"
#include "gapmark/fill/method.hpp"
#include "gapmark/mask/scheme.hpp"
#include "gapmark/series.hpp"

namespace gapmark {

struct RunOptions {
  unsigned threads = 1;
  /// Called after each finished task with (done, total); may be empty.
  std::function<void(std::size_t, std::size_t)> progress;
  /// When set and it becomes true (a signal handler), workers start no new
  /// task; the tasks in flight finish and are kept.
  const std::atomic<bool>* stop = nullptr;
};

/// The series a spec names, loaded and checked, with their data set index.
struct LoadedData {
  std::vector<Series> series;
  std::vector<std::size_t> dataset;          ///< dataset[i]: which data source series i came from
  std::vector<std::string> input_sha256;     ///< per data source
};
LoadedData load_data(const ExperimentSpec& spec);

/// One unit of work: a series under one scheme at one rate, one replicate.
struct Task {
  std::size_t series = 0, scheme = 0, rate = 0;
  int replicate = 0;
};
std::vector<Task> build_tasks(const ExperimentSpec& spec, const LoadedData& data);
/// The key a task's seed is derived from: "series\x1fscheme\x1frate\x1freplicate".
std::string task_key(const ExperimentSpec& spec, const LoadedData& data, const Task& task);

/// The other series of a data source, beside one of them: spans into the
/// loaded data (valid while it lives) and their labels.
struct Siblings {
  std::vector<std::string> names;
  std::vector<std::span<const double>> values;
};
/// The siblings of series `series` (the other series of its data source).
Siblings siblings_of(const LoadedData& data, std::size_t series);
/// True when the task's scheme or one of the spec's methods reads siblings.
bool task_uses_siblings(const ExperimentSpec& spec, const Task& task);

/// The scheme's request for a task: the series, its axis, period and holdout,
/// the rate, its name and `siblings`.
MaskRequest mask_request_for(const ExperimentSpec& spec, const LoadedData& data, const Task& task,
                             const Siblings& siblings);
/// The mask of a task: its scheme's draw, seeded from the task's key, so the
/// run and the report's example windows hide the same points. Throws what the
/// scheme throws.
Mask draw_task_mask(const ExperimentSpec& spec, const LoadedData& data, const Task& task, const Siblings& siblings);
/// The request every method of a task fills: the masked values, the series'
/// axis and period, `siblings`, and the spec's folder as working directory.
FillRequest fill_request_for(const ExperimentSpec& spec, const Series& series, std::span<const double> holed,
                             const Siblings& siblings);

/// A failed fill's reason as a run records it: the method's words, and for an
/// unmet need the hint that fits a spec ("set \"period\" for the data in the spec").
std::string run_failure_reason(const std::string& failure, UnmetNeed need);

/// Runs one task: every method on the same mask. Records in method order.
std::vector<TrialRecord> run_task(const ExperimentSpec& spec, const LoadedData& data,
                                  const Task& task, std::vector<Warning>& warnings);

/// Runs the tasks `todo` (indices into `tasks`) on `options.threads` workers
/// and hands each finished task to `sink` (one call at a time, in the order
/// tasks finish). Stops early when `options.stop` turns true, or when a call
/// throws (the first exception is rethrown after the workers end). Returns how
/// many tasks finished.
using TaskSink = std::function<void(std::size_t task, std::vector<TrialRecord>&& records,
                                    std::vector<Warning>&& warnings)>;
std::size_t run_tasks(const ExperimentSpec& spec, const LoadedData& data, const std::vector<Task>& tasks,
                      const std::vector<std::size_t>& todo, const RunOptions& options, const TaskSink& sink);

/// Everything of a ResultSet except trials, warnings and timing: context,
/// series, columns, rank_by, alpha.
ResultSet results_frame(const ExperimentSpec& spec, const LoadedData& data);

/// Runs the whole grid in memory and returns the records in canonical order
/// (no example windows: finish_results draws them).
ResultSet run_experiment(const ExperimentSpec& spec, const RunOptions& options = {});

/// Where and how run_tasks_into_folder (and run_into_folder) runs.
struct FolderRunOptions {
  std::filesystem::path dir;     ///< output folder: checkpoint, then reports or shard marker
  bool resume = false;           ///< continue the checkpoint in `dir` instead of starting again
  std::optional<Shard> shard;    ///< empty: the whole grid (or, on resume, the checkpoint's shard)
  /// Called once every task of a whole run is done, before the checkpoint is
  /// read back and the reports written (which takes a while on large grids);
  /// may be empty.
  std::function<void()> before_reports;
  /// The files a finished run writes in `dir`: those an earlier run left are
  /// removed before this one starts (run_into_folder sets them).
  std::vector<std::string> outputs;
};

struct FolderRunStatus {
  Shard shard;
  std::size_t total = 0;     ///< tasks in this shard
  std::size_t resumed = 0;   ///< found done in the checkpoint at the start
  std::size_t done = 0;      ///< done now, counting those
  std::vector<std::string> written;  ///< report files (whole runs) or the shard marker
  std::vector<Warning> warnings;     ///< a whole run's; a shard's from this session's tasks
  bool complete() const { return done == total; }
};

/// Runs an experiment's tasks into an output folder: each finished task is
/// appended to the checkpoint at once (memory holds only the tasks in
/// flight). A shard that is done writes its marker (see merge.hpp); a whole
/// run stops there, and run_into_folder (report/final_reports.hpp) reads the
/// checkpoint back and writes the outputs. A resumed run refuses a
/// checkpoint of another spec, other data or another build, and runs only
/// the missing tasks. The files `folder.outputs` and the shard marker from an
/// earlier run in `dir` are removed first.
FolderRunStatus run_tasks_into_folder(const ExperimentSpec& spec, const RunOptions& options,
                                      const FolderRunOptions& folder);

}  // namespace gapmark
