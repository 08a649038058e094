#pragma once
// Merging checkpoints: the stored task results of one run, or of all shards
// of one, become its records in canonical task order. A single run and a
// merge of its shards go through the same code, so they give the same bytes;
// writing the outputs from them is report/final_reports.hpp.
#include <filesystem>
#include <string>
#include <vector>

#include "gapmark/experiment/checkpoint.hpp"
#include "gapmark/experiment/record.hpp"
#include "gapmark/experiment/spec.hpp"

namespace gapmark {

/// The file a finished shard leaves beside its checkpoint.
inline constexpr const char* kShardMarkerFile = "shard.json";

/// What a merge checks its checkpoints against.
struct MergeOptions {
  /// The run's spec as the user named it: its SHA-256 must be the one the
  /// checkpoints record. Null: not checked. The folder a checkpoint records
  /// is never used: a checkpoint is data and cannot send gapmark to another
  /// folder.
  const ExperimentSpec* spec = nullptr;
};

/// Reads finished checkpoints (folders or trials.jsonl files): one whole run,
/// or every shard 1/N ... N/N of one run, in any order. Checks that they are
/// runs of the same spec, data and build, that no shard is given twice or
/// missing, and that each is finished; errors are one line naming the folder.
/// Returns the results with trials in canonical order; "timing" holds the
/// fill seconds per method. No example windows (finish_results draws them).
ResultSet merge_checkpoints(const std::vector<std::filesystem::path>& inputs, const MergeOptions& options = {});

/// Writes `dir/shard.json` (atomically) for a finished shard whose
/// checkpoint has `header` and holds `tasks` tasks; returns its path.
std::string write_shard_marker(const std::filesystem::path& dir, const nlohmann::json& header, std::size_t tasks);

/// Creates the output folder if needed (an InputError naming it when that is
/// impossible) and removes the files `outputs` (the report files) and the
/// shard marker an earlier run left there, so that nothing in it looks
/// finished before this run is.
void prepare_output_folder(const std::filesystem::path& dir, const std::vector<std::string>& outputs);

}  // namespace gapmark
