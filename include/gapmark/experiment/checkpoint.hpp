#pragma once
// The checkpoint: a JSON Lines file (trials.jsonl) in the output folder that
// a run appends to as tasks finish, so that a killed run loses only the tasks
// in flight and memory holds only the work in flight.
//
// Line 1, the header: what the run is and what every record shares.
//   {"format": "gapmark-checkpoint", "version": 1, "spec_sha256": ...,
//    "shard": {"index": K, "count": N}, "tasks": T (whole grid),
//    "grid": {"schemes": [{"label", "rates"}], "replicates", "methods"},
//    "frame": {"context", "series", "columns", "rank_by", "alpha", "equivalence"}}
// Then one line per finished task, in the order they finished:
//   {"task": i, "trials": [{"status", "reason"?, "masked", "unfilled",
//                           "seconds", "metrics": [number|null ...]}],
//    "warnings": [{"code", "where", "message", "hint"}]}
// Each line is written with one write(2) as soon as its task finishes. A line
// cut short by a crash (no final newline, or not valid JSON) can only be the
// last one; readers ignore it and a resumed run cuts it off before appending.
#include <cstddef>
#include <cstdint>
#include <filesystem>
#include <functional>
#include <mutex>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "gapmark/experiment/record.hpp"
#include "gapmark/experiment/runner.hpp"
#include "gapmark/experiment/shard.hpp"
#include "gapmark/experiment/spec.hpp"

namespace gapmark {

inline constexpr const char* kCheckpointFile = "trials.jsonl";
inline constexpr int kCheckpointVersion = 1;

/// `dir/trials.jsonl` for a folder, or the path itself when it names a file.
std::filesystem::path checkpoint_path(const std::filesystem::path& dir_or_file);

/// The header line's content for a run of `spec` on `data` as shard `shard`.
nlohmann::json checkpoint_header(const ExperimentSpec& spec, const LoadedData& data, const Shard& shard);

/// The run's context a header records; errors name `where` (the file and
/// line) and the member's JSON pointer.
RunContext header_context(const nlohmann::json& header, const std::string& where);
/// The results frame a header records: context, series, columns, rank_by,
/// alpha and equivalence (no trials); errors as for header_context.
ResultSet stored_frame(const nlohmann::json& header, const std::string& where);

/// One task's line (ending in '\n'). Non-finite metric values are written as null.
std::string task_line(std::size_t task, const std::vector<TrialRecord>& trials,
                      const std::vector<Warning>& warnings);

/// Appends lines to a checkpoint; safe to call from several threads.
class CheckpointWriter {
public:
  /// Starts a new checkpoint (truncating any old one) with its header.
  static CheckpointWriter create(const std::filesystem::path& path, const nlohmann::json& header);
  /// Continues a checkpoint: cuts it to `valid_bytes` (dropping a partial last
  /// line) and appends after that.
  static CheckpointWriter resume(const std::filesystem::path& path, std::uint64_t valid_bytes);
  CheckpointWriter(CheckpointWriter&& other) noexcept;
  CheckpointWriter& operator=(CheckpointWriter&&) = delete;
  ~CheckpointWriter();

  /// Writes one whole line; InputError naming the file when the disk refuses
  /// (full, read-only, gone).
  void append(const std::string& line);
  /// Flushes to stable storage (at the end, and every few seconds).
  void sync();

private:
  CheckpointWriter(std::filesystem::path path, int fd) : path_(std::move(path)), fd_(fd) {}
  std::filesystem::path path_;
  int fd_ = -1;
  std::mutex mutex_;
  std::int64_t last_sync_ = 0;
};

/// The task grid a header describes, to turn stored lines back into records.
class CheckpointGrid {
public:
  explicit CheckpointGrid(const nlohmann::json& header, const std::string& where);
  std::size_t tasks() const { return tasks_.size(); }
  std::size_t methods() const { return methods_.size(); }
  std::size_t columns() const { return columns_; }
  /// The records' identifying fields (series, scheme, rate, replicate, method).
  TrialRecord blank(std::size_t task, std::size_t method) const;

private:
  std::vector<std::string> series_, schemes_, methods_;
  std::vector<std::vector<double>> rates_;
  std::vector<Task> tasks_;
  std::size_t columns_ = 0;
};

struct StoredTask {
  std::size_t task = 0;
  std::vector<TrialRecord> trials;
  std::vector<Warning> warnings;
};

/// What a checkpoint holds.
struct CheckpointScan {
  std::filesystem::path path;
  nlohmann::json header;
  Shard shard;
  std::string spec_sha256;
  std::size_t grid_tasks = 0;           ///< tasks in the whole grid
  std::vector<std::size_t> done;        ///< finished task indices, in file order (each once)
  std::uint64_t valid_bytes = 0;        ///< length up to the last complete line
  bool cut_short = false;               ///< a partial last line was found (and ignored)
};

/// Reads only the header line (and checks it): quick, for checks before the
/// whole file is read. `done`, `valid_bytes` and `cut_short` stay empty.
CheckpointScan read_checkpoint_header(const std::filesystem::path& path);

/// Reads a checkpoint. Each complete task line is turned into records and
/// passed to `on_task` when given (in file order); a task seen twice keeps
/// its first line. Errors name the file and line: a bad header, a damaged
/// line before the last, a task outside the grid or the shard.
CheckpointScan read_checkpoint(const std::filesystem::path& path,
                               const std::function<void(StoredTask&&)>& on_task = {});

}  // namespace gapmark
