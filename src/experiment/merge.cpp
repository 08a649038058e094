#include "gapmark/experiment/merge.hpp"

#include <fcntl.h>
#include <unistd.h>

#include <algorithm>
#include <cerrno>
#include <cmath>
#include <cstring>
#include <fstream>

#include "gapmark/error.hpp"
#include "gapmark/experiment/record_checks.hpp"
#include "gapmark/experiment/task_slots.hpp"
#include "gapmark/table_io.hpp"

namespace gapmark {
namespace {

using nlohmann::json;
namespace fs = std::filesystem;

std::string short_hash(const std::string& sha) { return sha.substr(0, 12); }

/// Why two checkpoint headers of the same spec are not parts of one run.
std::string header_difference(const CheckpointScan& a, const CheckpointScan& b) {
  const RunContext ca = header_context(a.header, a.path.string() + ":1");
  const RunContext cb = header_context(b.header, b.path.string() + ":1");
  if (ca.inputs != cb.inputs) return "the data files differ (their SHA-256 do not match)";
  if (ca.version != cb.version || ca.commit != cb.commit)
    return "they were run by different gapmark builds (" + ca.version + " " + ca.commit + " and " + cb.version + " " +
           cb.commit + ")";
  return "their headers differ";
}

/// A header with the shard index blanked: equal for all shards of one run.
json run_identity(json header) {
  header["shard"]["index"] = 0;
  header.erase("spec_dir");  // shards may run from different checkouts
  return header;
}

std::string finish_hint(const Shard& shard, const std::string& dir) {
  return "finish it with: gapmark run SPEC " + (shard.whole() ? std::string() : "--shard " + shard.text() + " ") +
         "--resume " + dir;
}

/// The checkpoint headers of the folders (or files) `names`, in that order.
std::vector<CheckpointScan> read_headers(const std::vector<fs::path>& inputs) {
  std::vector<CheckpointScan> heads;
  for (const auto& input : inputs) {
    const fs::path path = checkpoint_path(input);
    std::error_code ec;
    if (!fs::exists(path, ec))
      throw InputError(input.string(), "no checkpoint (trials.jsonl) here: not the folder of a gapmark run or shard");
    heads.push_back(read_checkpoint_header(path));
  }
  return heads;
}

/// Checks that every checkpoint is a part of the first one's run (and of
/// the spec the user named, when given).
void check_same_run(const std::vector<CheckpointScan>& heads, const std::vector<std::string>& names,
                    const MergeOptions& options) {
  const CheckpointScan& first = heads.front();
  if (options.spec && options.spec->sha256 != first.spec_sha256)
    throw InputError(options.spec->source, "is not the spec of " + names[0] + " (spec SHA-256 " +
                                               short_hash(options.spec->sha256) + "..., the run's " +
                                               short_hash(first.spec_sha256) + "...)");
  const json identity = run_identity(first.header);
  for (std::size_t i = 1; i < heads.size(); ++i) {
    const CheckpointScan& h = heads[i];
    if (h.spec_sha256 != first.spec_sha256)
      throw InputError(names[i], "a run of another spec than " + names[0] + " (spec SHA-256 " +
                                     short_hash(h.spec_sha256) + "... vs " + short_hash(first.spec_sha256) + "...)");
    if (h.shard.count != first.shard.count)
      throw InputError(names[i], "shard " + h.shard.text() + " of a split into " + std::to_string(h.shard.count) +
                                     ", but " + names[0] + " is shard " + first.shard.text() +
                                     ": shards of different splits overlap");
    if (run_identity(h.header) != identity)
      throw InputError(names[i], "not a part of the same run as " + names[0] + ": " + header_difference(h, first));
  }
}

/// Checks that each shard of the split is given exactly once.
void check_every_shard_once(const std::vector<CheckpointScan>& heads, const std::vector<std::string>& names) {
  const std::size_t n = heads.front().shard.count;
  std::vector<std::size_t> owner(n, heads.size());
  for (std::size_t i = 0; i < heads.size(); ++i) {
    const std::size_t k = heads[i].shard.index - 1;
    if (owner[k] != heads.size())
      throw InputError(names[i], "shard " + heads[i].shard.text() + " is given twice (also " + names[owner[k]] + ")");
    owner[k] = i;
  }
  std::string missing;
  for (std::size_t k = 0; k < n; ++k)
    if (owner[k] == heads.size()) missing += (missing.empty() ? "" : ", ") + Shard{k + 1, n}.text();
  if (!missing.empty()) throw InputError("merge", "missing shard " + missing + ": give the folder of every shard");
}

/// Every checkpoint's stored tasks in their slots; each checkpoint must be finished.
TaskSlots read_stored_tasks(const std::vector<CheckpointScan>& heads, const std::vector<std::string>& names) {
  const std::size_t total = heads.front().grid_tasks;
  TaskSlots slots(total);
  for (std::size_t i = 0; i < heads.size(); ++i) {
    const CheckpointScan scan = read_checkpoint(heads[i].path, [&](StoredTask&& t) {
      slots.records[t.task] = std::move(t.trials);
      slots.warnings[t.task] = std::move(t.warnings);
    });
    const std::size_t expected = scan.shard.size(total);
    if (scan.done.size() != expected)
      throw InputError(names[i], std::string(scan.shard.whole() ? "the run" : "shard " + scan.shard.text()) +
                                     " is unfinished: " + std::to_string(scan.done.size()) + " of " +
                                     std::to_string(expected) + " tasks done; " + finish_hint(scan.shard, names[i]));
  }
  return slots;
}

}  // namespace

ResultSet merge_checkpoints(const std::vector<fs::path>& inputs, const MergeOptions& options) {
  if (inputs.empty()) throw InputError("merge", "no run or shard folders given");
  std::vector<std::string> names;
  for (const auto& input : inputs) names.push_back(input.string());
  const std::vector<CheckpointScan> heads = read_headers(inputs);
  check_same_run(heads, names, options);
  check_every_shard_once(heads, names);
  TaskSlots slots = read_stored_tasks(heads, names);
  ResultSet results = stored_frame(heads.front().header, heads.front().path.string() + ":1");
  results.timing.fill_seconds_by_method = gather_task_slots(slots, results);
  results.timing.checkpoints = heads.size();
  return results;
}

std::string write_shard_marker(const fs::path& dir, const json& header, std::size_t tasks) {
  const RunContext context = header_context(header, "checkpoint header");
  const json marker = {{"format", "gapmark-shard"},
                       {"shard", Shard{header.at("shard").at("index").get<std::size_t>(),
                                       header.at("shard").at("count").get<std::size_t>()}
                                     .text()},
                       {"spec_name", context.spec_name},
                       {"spec_sha256", header.at("spec_sha256")},
                       {"tasks", tasks},
                       {"grid_tasks", header.at("tasks")},
                       {"checkpoint", kCheckpointFile}};
  const fs::path path = dir / kShardMarkerFile;
  write_file_atomically(path, marker.dump(1) + "\n");
  return path.string();
}

void prepare_output_folder(const fs::path& dir, const std::vector<std::string>& outputs) {
  std::error_code ec;
  fs::create_directories(dir, ec);
  if (ec || !fs::is_directory(dir, ec))
    throw InputError(dir.string(), "cannot create the output folder: " +
                                       (ec ? ec.message() : std::string("a file of that name is in the way")));
  std::vector<std::string> names{kShardMarkerFile};
  names.insert(names.end(), outputs.begin(), outputs.end());
  for (const auto& name : names) {
    fs::remove(dir / name, ec);
    if (ec) throw InputError((dir / name).string(), "cannot remove the previous run's file: " + ec.message());
  }
}

}  // namespace gapmark
