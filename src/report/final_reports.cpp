#include "gapmark/report/final_reports.hpp"

#include <algorithm>
#include <chrono>
#include <functional>
#include <future>
#include <ostream>

#include "gapmark/analysis/examples.hpp"
#include "gapmark/analysis/results_json.hpp"
#include "gapmark/error.hpp"
#include "gapmark/experiment/merge.hpp"
#include "gapmark/experiment/results_io.hpp"
#include "gapmark/experiment/spec_safety.hpp"
#include "gapmark/output_file.hpp"
#include "gapmark/report/reporter.hpp"

namespace gapmark {
namespace fs = std::filesystem;

std::vector<std::string> report_file_names() {
  std::vector<std::string> names;
  for (const auto* entry : ReporterRegistry::global().list()) names.push_back(entry->make(ParamValues{})->file_name());
  return names;
}

Summary finish_results(ResultSet& results, const FinishOptions& options) {
  Summary summary = summarize(results);
  // Example windows need the data again: read from the folder of the spec
  // the user named (never from a folder a checkpoint records).
  std::string why_not = options.no_spec;
  if (options.spec)
    why_not = attach_examples(results, summary, *options.spec,
                              ExampleOptions{.threads = options.threads, .allow_external = options.allow_external});
  if (!why_not.empty())
    results.warnings.push_back({"no-examples", "report", "no example windows in the report: " + why_not,
                                "give the run's spec with --spec, where its data files can be read"});
  else if (!options.allow_external && !external_commands(*options.spec).empty())
    results.warnings.push_back({"examples-without-external", "report",
                                "the example windows leave out the external methods: no outside program is "
                                "started again without --allow-external",
                                "add --allow-external to draw them"});
  return summary;
}

namespace {

/// Writes a file through a temporary name beside `path` (TempFile): `write`
/// fills the stream; the data are flushed to disk. Returns the temporary
/// name, to be renamed once every file of the set is written. Errors name `path`.
fs::path write_temp(const fs::path& path, const std::function<void(std::ostream&)>& write) {
  TempFile temp(path);
  temp.write_with(write);
  return temp.release();
}

/// Gives every staged file its name, in order; on a failure the files not
/// yet renamed are removed and the error goes on.
std::vector<std::string> rename_staged(const std::vector<std::pair<fs::path, fs::path>>& staged) {
  std::error_code ec;
  std::vector<std::string> written;
  for (std::size_t i = 0; i < staged.size(); ++i) {
    try {
      rename_over(staged[i].first, staged[i].second);
    } catch (...) {
      for (std::size_t k = i; k < staged.size(); ++k) fs::remove(staged[k].first, ec);
      throw;
    }
    written.push_back(staged[i].second.string());
  }
  return written;
}

}  // namespace

std::vector<std::string> write_final_reports(const ResultSet& results, const Summary& summary, const fs::path& dir,
                                             unsigned threads) {
  std::error_code ec;
  fs::create_directories(dir, ec);
  if (ec) throw InputError(dir.string(), "cannot create the output folder: " + ec.message());
  // Each report goes to a temporary file as soon as it is rendered (memory
  // holds one report at a time); the names are switched only when all are
  // written, results.json last, so a failure leaves no report behind.
  std::vector<std::pair<fs::path, fs::path>> staged;  // (temporary, final)
  const fs::path json_path = dir / kResultsFile;
  const auto names = report_file_names();
  const bool json_wanted = std::find(names.begin(), names.end(), kResultsFile) != names.end();
  auto write_json = [&] {
    return write_temp(json_path, [&](std::ostream& out) { write_results_json(out, results, summary); });
  };
  // results.json, the longest to write, on a thread of its own when allowed.
  std::future<fs::path> json_written;
  if (json_wanted && threads > 1) json_written = std::async(std::launch::async, write_json);
  try {
    try {
      for (const auto* entry : ReporterRegistry::global().list()) {
        auto reporter = entry->make(ParamValues{});
        if (reporter->file_name() == kResultsFile) continue;
        const fs::path path = dir / reporter->file_name();
        const std::string text = reporter->render(results, summary);
        staged.emplace_back(write_temp(path, [&](std::ostream& out) { out << text; }), path);
      }
    } catch (...) {
      if (json_written.valid()) try {
          fs::remove(json_written.get(), ec);
        } catch (...) {  // its own failure left no file; the first error is the one reported
        }
      throw;
    }
    if (json_wanted) staged.emplace_back(json_written.valid() ? json_written.get() : write_json(), json_path);
  } catch (...) {
    for (const auto& [temp, path] : staged) fs::remove(temp, ec);
    throw;
  }
  return rename_staged(staged);
}

std::vector<std::string> write_final_reports(const ResultSet& results, const fs::path& dir, unsigned threads) {
  return write_final_reports(results, summarize(results), dir, threads);
}

void prepare_output_folder(const fs::path& dir) { prepare_output_folder(dir, report_file_names()); }

FolderRunStatus run_into_folder(const ExperimentSpec& spec, const RunOptions& options, const FolderRunOptions& folder) {
  const auto started = std::chrono::steady_clock::now();
  FolderRunOptions with_outputs = folder;
  with_outputs.outputs = report_file_names();
  FolderRunStatus status = run_tasks_into_folder(spec, options, with_outputs);
  if (!status.complete() || !status.shard.whole()) return status;
  if (folder.before_reports) folder.before_reports();
  const unsigned threads = std::max(1u, options.threads);
  ResultSet results = merge_checkpoints({folder.dir}, MergeOptions{.spec = &spec});
  // The examples re-read the data from this spec's folder (not the one a
  // resumed checkpoint recorded); its outside programs already ran in this run.
  const Summary summary = finish_results(results, FinishOptions{.threads = threads, .spec = &spec, .allow_external = true});
  results.timing.wall_seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - started).count();
  results.timing.threads = threads;
  results.timing.resumed_tasks = status.resumed;
  status.written = write_final_reports(results, summary, folder.dir, threads);
  status.warnings = std::move(results.warnings);
  return status;
}

}  // namespace gapmark
