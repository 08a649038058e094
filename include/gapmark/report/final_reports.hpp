#pragma once
// The end of every run, one path for `run`, `merge`, `report` and `quick`:
// the summary is computed once (finish_results), the example windows are
// drawn from it, and every registered report is written by one staged
// writer: each file goes to a temporary name as soon as it is rendered, and
// all get their names only when all are written, so a failure never leaves a
// file that looks finished.
#include <filesystem>
#include <string>
#include <vector>

#include "gapmark/analysis/summary.hpp"
#include "gapmark/experiment/record.hpp"
#include "gapmark/experiment/runner.hpp"
#include "gapmark/experiment/spec.hpp"

namespace gapmark {

/// The names of the files write_final_reports writes in an output folder,
/// one per registered reporter.
std::vector<std::string> report_file_names();

/// How the end of a run draws its example windows.
struct FinishOptions {
  unsigned threads = 1;  ///< example windows are built on this many threads
  /// The run's spec as the user named it: its folder is where the data are
  /// read again for the example windows (checked by SHA-256). Null: no
  /// example windows, and a warning says `no_spec` is why.
  const ExperimentSpec* spec = nullptr;
  /// Whether the spec's "external" methods may be started again to draw
  /// their example windows; without it they are left out with a warning.
  bool allow_external = false;
  std::string no_spec = "no spec given (gapmark merge --spec SPEC reads the data again from the spec's folder)";
};

/// Summarizes `results` (once for the whole end of the run) and attaches
/// the example windows drawn from that summary, or a warning saying why
/// there are none. Returns the summary every report is written from.
Summary finish_results(ResultSet& results, const FinishOptions& options);

/// Writes every registered report of `results` and `summary` into `dir`
/// (created if needed). Memory holds the records and one report at a time,
/// even for a very large grid: results.json is serialized piece by piece.
/// The files get their names only when all are written (results.json
/// last); on failure none does. With `threads` above 1, results.json is
/// written on a thread of its own while the other reports are rendered (the
/// bytes are the same either way). Returns the paths written.
std::vector<std::string> write_final_reports(const ResultSet& results, const Summary& summary,
                                             const std::filesystem::path& dir, unsigned threads = 1);
/// The same for results that need their summary (a results file read back).
std::vector<std::string> write_final_reports(const ResultSet& results, const std::filesystem::path& dir,
                                             unsigned threads = 1);

/// Creates the output folder if needed and removes the report files and the
/// shard marker an earlier run left there (prepare_output_folder with
/// report_file_names()).
void prepare_output_folder(const std::filesystem::path& dir);

/// Runs an experiment into an output folder (run_tasks_into_folder) and,
/// when every task of a whole run is done, reads the checkpoint back in task
/// order (merge_checkpoints), finishes the results (finish_results, with
/// the example windows drawn from `spec`'s folder) and writes every report;
/// a shard writes its marker instead. A resumed run refuses a checkpoint of
/// another spec, other data or another build and runs only the missing
/// tasks; its results equal an uninterrupted run's byte for byte outside
/// "timing". Report files and the shard marker of an earlier run in the
/// folder are removed first, so nothing there looks complete until it is.
FolderRunStatus run_into_folder(const ExperimentSpec& spec, const RunOptions& options,
                                const FolderRunOptions& folder);

}  // namespace gapmark
