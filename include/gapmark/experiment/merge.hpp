#pragma once
// The end of a run: stored task results (the checkpoint of one run, or the
// checkpoints of all shards of one) become the final results in canonical
// task order, and every report is written from them. A single run and a
// merge of its shards go through the same code, so they give the same bytes.
#include <filesystem>
#include <iosfwd>
#include <string>
#include <vector>

#include "gapmark/experiment/checkpoint.hpp"
#include "gapmark/experiment/record.hpp"
#include "gapmark/analysis/summary.hpp"
#include "gapmark/experiment/spec.hpp"

namespace gapmark {

/// The file a finished shard leaves beside its checkpoint.
inline constexpr const char* kShardMarkerFile = "shard.json";

/// How a merge draws the example windows of the reports.
struct MergeOptions {
  unsigned threads = 1;  ///< example windows are built on this many threads
  /// The run's spec as the user named it: its SHA-256 must be the one the
  /// checkpoints record, and its folder is where the data are read again for
  /// the example windows. Null: no example windows (a warning says why). The
  /// folder a checkpoint records is never used: a checkpoint is data and
  /// cannot send gapmark to another folder.
  const ExperimentSpec* spec = nullptr;
  /// Whether the spec's "external" methods may be started again to draw
  /// their example windows; without it they are left out with a warning.
  bool allow_external = false;
};

/// Reads finished checkpoints (folders or trials.jsonl files): one whole run,
/// or every shard 1/N ... N/N of one run, in any order. Checks that they are
/// runs of the same spec, data and build, that no shard is given twice or
/// missing, and that each is finished; errors are one line naming the folder.
/// Returns the results with trials in canonical order; "timing" holds the
/// fill seconds per method. Example windows as `options` say.
ResultSet merge_checkpoints(const std::vector<std::filesystem::path>& inputs, const MergeOptions& options = {});

/// Writes every registered report into `dir`: the same files as
/// write_reports, but each report goes to a temporary file as soon as it is
/// rendered and results.json is written piece by piece (write_results_json),
/// so memory holds the records and one report at a time even for a very
/// large grid. The files get their names only when all are written
/// (results.json last); on failure none does. With `threads` above 1,
/// results.json is written on a thread of its own while the other reports
/// are rendered (the bytes are the same either way).
std::vector<std::string> write_final_reports(const ResultSet& results, const std::filesystem::path& dir,
                                             unsigned threads = 1);

/// The results-json reporter's text (results_to_json(...).dump(1) and a
/// newline), written trial by trial and group by group.
void write_results_json(std::ostream& out, const ResultSet& results, const Summary& summary);

/// Writes `dir/shard.json` (atomically) for a finished shard whose
/// checkpoint has `header` and holds `tasks` tasks; returns its path.
std::string write_shard_marker(const std::filesystem::path& dir, const nlohmann::json& header, std::size_t tasks);

/// Creates the output folder if needed (an InputError naming it when that is
/// impossible) and removes the report files and shard marker an earlier run
/// left there, so that nothing in it looks finished before this run is.
void prepare_output_folder(const std::filesystem::path& dir);

}  // namespace gapmark
