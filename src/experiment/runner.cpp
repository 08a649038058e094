#include "gapmark/experiment/runner.hpp"

#include <algorithm>
#include <chrono>
#include <cmath>
#include <exception>
#include <optional>
#include <mutex>

#include "gapmark/error.hpp"
#include "gapmark/fill/checked_fill.hpp"
#include "gapmark/interrupted.hpp"
#include "gapmark/parallel_for.hpp"
#include "gapmark/experiment/checkpoint.hpp"
#include "gapmark/experiment/merge.hpp"
#include "gapmark/experiment/task_slots.hpp"
#include "gapmark/hash.hpp"
#include "gapmark/mask/mask_table.hpp"
#include "gapmark/number_format.hpp"
#include "gapmark/table_io.hpp"
#include "gapmark/version.hpp"

namespace gapmark {

std::vector<Task> build_tasks(const ExperimentSpec& spec, const LoadedData& data) {
  std::vector<Task> tasks;
  for (std::size_t s = 0; s < data.series.size(); ++s)
    for (std::size_t k = 0; k < spec.schemes.size(); ++k)
      for (std::size_t r = 0; r < spec.schemes[k].rates.size(); ++r)
        for (int rep = 0; rep < spec.replicates; ++rep) tasks.push_back({s, k, r, rep});
  return tasks;
}

std::string task_key(const ExperimentSpec& spec, const LoadedData& data, const Task& task) {
  const auto& plan = spec.schemes[task.scheme];
  return mask_key(data.series[task.series].label(), plan.scheme.label, plan.rates[task.rate], task.replicate);
}

namespace {

std::size_t metric_width(const ExperimentSpec& spec) {
  std::size_t w = 0;
  for (const auto& m : spec.metrics) w += m.impl->columns().size();
  return w;
}

TrialRecord blank_record(const ExperimentSpec& spec, const LoadedData& data, const Task& task,
                         std::size_t method) {
  TrialRecord t;
  t.series = data.series[task.series].label();
  t.scheme = spec.schemes[task.scheme].scheme.label;
  t.rate = spec.schemes[task.scheme].rates[task.rate];
  t.replicate = task.replicate;
  t.method = spec.methods[method].label;
  t.metrics.assign(metric_width(spec), std::nan(""));
  return t;
}

/// A metric must give a finite value or NaN ("not applicable"). An infinite
/// value (say, squared errors of values near 1e300 overflowing) is recorded
/// as NaN with a warning that says why.
void check_finite_metrics(const ExperimentSpec& spec, TrialRecord& rec, std::vector<Warning>& warnings) {
  std::size_t offset = 0;
  for (const auto& metric : spec.metrics) {
    for (const auto& column : metric.impl->columns()) {
      double& v = rec.metrics[offset++];
      if (!std::isinf(v)) continue;
      v = std::nan("");
      add_warning(warnings, {"metric-not-finite", rec.method + " " + column.name,
                             "the metric overflowed to infinity and is recorded as n/a",
                             "rescale the data (other units) so that squared values stay far below 1e308"});
    }
  }
}

}  // namespace

Siblings siblings_of(const LoadedData& data, std::size_t series) {
  Siblings out;
  for (std::size_t s = 0; s < data.series.size(); ++s) {
    if (s == series || data.dataset[s] != data.dataset[series]) continue;
    out.names.push_back(data.series[s].label());
    out.values.emplace_back(data.series[s].values);
  }
  return out;
}

bool task_uses_siblings(const ExperimentSpec& spec, const Task& task) {
  if (spec.schemes[task.scheme].scheme.impl->uses_siblings()) return true;
  for (const auto& m : spec.methods)
    if (m.entry && m.entry->needs.siblings) return true;
  return false;
}

MaskRequest mask_request_for(const ExperimentSpec& spec, const LoadedData& data, const Task& task,
                             const Siblings& siblings) {
  const Series& series = data.series[task.series];
  const auto& plan = spec.schemes[task.scheme];
  MaskRequest request{series.values, &series.axis, series.period, spec.holdout, plan.rates[task.rate],
                      spec.source + ": " + plan.scheme.label + ", series '" + series.label() + "'"};
  request.name = series.label();
  request.sibling_names = siblings.names;
  request.siblings = siblings.values;
  return request;
}

Mask draw_task_mask(const ExperimentSpec& spec, const LoadedData& data, const Task& task, const Siblings& siblings) {
  Rng rng(task_seed(spec.seed, task_key(spec, data, task)));
  return spec.schemes[task.scheme].scheme.impl->draw(mask_request_for(spec, data, task, siblings), rng);
}

FillRequest fill_request_for(const ExperimentSpec& spec, const Series& series, std::span<const double> holed,
                             const Siblings& siblings) {
  FillRequest request;
  request.values = holed;
  request.axis = &series.axis;
  request.period = series.period;
  request.siblings = siblings.values;
  request.sibling_names = siblings.names;
  request.working_dir = spec.base_dir.string();  // relative to ours: an outside program starts here
  return request;
}

std::string run_failure_reason(const std::string& failure, UnmetNeed need) {
  switch (need) {
    case UnmetNeed::Period: return failure + "; set \"period\" for the data in the spec";
    case UnmetNeed::Siblings: return failure + "; list several columns of one data set";
    case UnmetNeed::Length:
    case UnmetNeed::Observed:
    case UnmetNeed::None: break;
  }
  return failure;
}

namespace {

/// Gives every record of a task one status and reason.
void fail_all(std::vector<TrialRecord>& records, TrialStatus status, const std::string& reason) {
  for (auto& r : records) {
    r.status = status;
    r.reason = reason;
  }
}

/// Fills in a record from one method's fill of the task's mask, and scores it.
void score_trial(const ExperimentSpec& spec, const Series& series, const Mask& mask, std::size_t masked,
                 CheckedFill&& fill, TrialRecord& rec, std::vector<Warning>& warnings) {
  rec.masked = masked;
  rec.unfilled = fill.unfilled;
  if (fill.failed()) {
    rec.status = TrialStatus::Failed;
    rec.reason = run_failure_reason(fill.failure, fill.need);
    return;
  }
  rec.seconds = fill.seconds;
  if (fill.observed_changed)
    add_warning(warnings, {"observed-changed", rec.method,
                           "the method changed observed values; they were restored before scoring",
                           "fix the method so that it returns observed values unchanged"});
  rec.clipped = fill.clipped;
  if (fill.clipped)
    add_warning(warnings, {"fills-clipped", rec.method,
                           "fills outside the method's bounds were moved to the bound (each trial's \"clipped\" counts them)",
                           "many clipped points mean the method leaves the physical range: try transform=log or another method"});
  rec.fit = std::move(fill.fit);
  // by name, as results.json and the checkpoint hold them, so a resumed run reads back the same record
  std::sort(rec.fit.parameters.begin(), rec.fit.parameters.end());
  rec.status = rec.unfilled == 0        ? TrialStatus::Ok
               : rec.unfilled == masked ? TrialStatus::Failed
                                        : TrialStatus::Partial;
  if (rec.unfilled) rec.reason = std::to_string(rec.unfilled) + " masked points left unfilled";
  const ScoreInput score{series.values, fill.values, fill.variance, &mask, &series.axis, series.period, spec.holdout,
                         fill.draws};
  std::size_t offset = 0;
  for (const auto& metric : spec.metrics) {
    const std::size_t width = metric.impl->columns().size();
    metric.impl->compute(score, std::span<double>(rec.metrics).subspan(offset, width));
    offset += width;
  }
  check_finite_metrics(spec, rec, warnings);
}

}  // namespace

std::vector<TrialRecord> run_task(const ExperimentSpec& spec, const LoadedData& data, const Task& task,
                                  std::vector<Warning>& warnings) {
  const Series& series = data.series[task.series];
  const auto& plan = spec.schemes[task.scheme];
  std::vector<TrialRecord> records;
  for (std::size_t m = 0; m < spec.methods.size(); ++m) records.push_back(blank_record(spec, data, task, m));

  // Siblings cost O(series) per task: gathered once, and only when the scheme or a method reads them.
  const Siblings siblings = task_uses_siblings(spec, task) ? siblings_of(data, task.series) : Siblings{};
  Mask mask;
  try {
    mask = draw_task_mask(spec, data, task, siblings);
  } catch (const std::exception& e) {
    fail_all(records, TrialStatus::MaskFailed, std::string("mask: ") + e.what());
    add_warning(warnings, {"mask-failed", records.front().series + " " + plan.scheme.label,
                           std::string("the scheme could not mask this series: ") + e.what(),
                           "lower the rate, shorten the holdout or choose another scheme for this series"});
    return records;
  }
  std::size_t masked = 0;
  for (auto b : mask) masked += b;
  if (masked < 10)
    add_warning(warnings, {"few-masked-points", series.label() + " " + plan.scheme.label,
                           "only " + std::to_string(masked) + " points masked per replicate",
                           "raise the rate or use a longer series; errors from so few points are noisy"});
  if (masked == 0) {
    fail_all(records, TrialStatus::MaskFailed,
             "the mask hid no points (too few observed values for this rate): nothing to score");
    return records;
  }
  const std::vector<double> holed = apply_mask(series.values, mask);
  FillRequest fill_request = fill_request_for(spec, series, holed, siblings);
  const std::string key = task_key(spec, data, task);
  for (std::size_t m = 0; m < spec.methods.size(); ++m) {
    // a method's own draws: seeded from the task's key and the method, whatever the thread or order
    fill_request.seed = task_seed(spec.seed, key + "|draws|" + spec.methods[m].label);
    score_trial(spec, series, mask, masked, checked_fill(spec.methods[m], fill_request, mask), records[m], warnings);
  }
  return records;
}

namespace {

std::vector<SeriesDescription> describe_series(const ExperimentSpec& spec, const LoadedData& data) {
  std::vector<SeriesDescription> out;
  for (std::size_t i = 0; i < data.series.size(); ++i) {
    const Series& s = data.series[i];
    out.push_back({.label = s.label(),
                   .source = spec.data[data.dataset[i]].label,
                   .points = s.values.size(),
                   .observed = s.observed_count(),
                   .step = s.axis.step().iso(),
                   .start = s.axis.size() ? s.axis.format(0) : "",
                   .period = s.period,
                   .units = s.units});
  }
  return out;
}

}  // namespace

std::size_t run_tasks(const ExperimentSpec& spec, const LoadedData& data, const std::vector<Task>& tasks,
                      const std::vector<std::size_t>& todo, const RunOptions& options, const TaskSink& sink) {
  std::mutex sink_mutex;
  std::size_t done = 0;
  parallel_for(todo.size(), options.threads, [&](std::size_t i) {
    if (options.stop && options.stop->load()) return;  // tasks in flight finish; no new one starts
    std::vector<Warning> warnings;
    std::vector<TrialRecord> records;
    try {
      records = run_task(spec, data, tasks[todo[i]], warnings);
    } catch (const Interrupted&) {
      return;  // stopped by the user: this task stays to do (--resume runs it)
    }
    std::lock_guard lock(sink_mutex);
    sink(todo[i], std::move(records), std::move(warnings));
    ++done;
  });
  return done;
}

ResultSet results_frame(const ExperimentSpec& spec, const LoadedData& data) {
  ResultSet results;
  for (const auto& m : spec.metrics)
    for (auto& c : m.impl->columns()) results.columns.push_back(c);
  results.rank_by = spec.rank_by;
  results.alpha = spec.alpha;
  results.equivalence = spec.equivalence;
  results.series = describe_series(spec, data);
  std::vector<InputFile> inputs;
  for (std::size_t d = 0; d < spec.data.size(); ++d) inputs.push_back({spec.data[d].label, data.input_sha256[d]});
  results.context = {.version = version(),
                     .commit = commit(),
                     .spec_name = spec.name,
                     .spec = spec.json,
                     .spec_sha256 = spec.sha256,
                     .seed = spec.seed,
                     .replicates = spec.replicates,
                     .holdout = spec.holdout,
                     .inputs = inputs};
  return results;
}

ResultSet run_experiment(const ExperimentSpec& spec, const RunOptions& options) {
  const auto started = std::chrono::steady_clock::now();
  const LoadedData data = load_data(spec);
  const std::vector<Task> tasks = build_tasks(spec, data);
  ResultSet results = results_frame(spec, data);

  TaskSlots slots(tasks.size());
  std::vector<std::size_t> todo(tasks.size());
  for (std::size_t i = 0; i < todo.size(); ++i) todo[i] = i;
  std::size_t finished = 0;
  RunOptions inner = options;
  inner.stop = nullptr;  // in memory, a run is all or nothing
  run_tasks(spec, data, tasks, todo, inner,
            [&](std::size_t task, std::vector<TrialRecord>&& records, std::vector<Warning>&& warnings) {
              slots.records[task] = std::move(records);
              slots.warnings[task] = std::move(warnings);
              if (options.progress) options.progress(++finished, tasks.size());
            });
  results.timing.fill_seconds_by_method = gather_task_slots(slots, results);
  results.timing.wall_seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - started).count();
  results.timing.threads = std::max(1u, options.threads);
  return results;
}

namespace {

/// Refuses to continue a checkpoint that is not of this run (one line each).
void check_resumable(const CheckpointScan& scan, const nlohmann::json& header, const std::optional<Shard>& shard) {
  const std::string where = scan.path.string();
  if (scan.spec_sha256 != header.at("spec_sha256").get<std::string>())
    throw InputError(where, "the checkpoint is of another spec (SHA-256 " + scan.spec_sha256.substr(0, 12) +
                                "..., this spec " + header.at("spec_sha256").get<std::string>().substr(0, 12) +
                                "...); start again without --resume, or give another --out");
  const RunContext old_context = header_context(scan.header, where + ":1");
  const RunContext new_context = header_context(header, "checkpoint header");
  if (old_context.inputs != new_context.inputs)
    throw InputError(where, "the data files changed since the checkpoint was written (SHA-256 differs); "
                            "start again without --resume");
  if (old_context.version != new_context.version || old_context.commit != new_context.commit)
    throw InputError(where, "the checkpoint was written by gapmark " + old_context.version + " (" +
                                old_context.commit + "), this is " + version() + " (" + commit() +
                                "); finish it with that build, or start again without --resume");
  if (shard && *shard != scan.shard)
    throw InputError(where, "the checkpoint is of shard " + scan.shard.text() + ", not " + shard->text());
  nlohmann::json expected = header;
  expected["shard"] = scan.header.at("shard");
  if (scan.header.contains("spec_dir")) expected["spec_dir"] = scan.header.at("spec_dir");  // the spec may have moved
  if (expected != scan.header)
    throw InputError(where, "the checkpoint does not match this run (its header differs); start again without --resume");
}

}  // namespace

namespace {

/// The running part of run_into_folder: loads the data, opens (or resumes)
/// the checkpoint and runs the shard's missing tasks. The data are released
/// when it returns, before the results are read back. Returns the header.
nlohmann::json run_missing_tasks(const ExperimentSpec& spec, const RunOptions& options,
                                 const FolderRunOptions& folder, FolderRunStatus& status) {
  const LoadedData data = load_data(spec);
  const std::vector<Task> tasks = build_tasks(spec, data);
  const std::filesystem::path path = folder.dir / kCheckpointFile;
  status.shard = folder.shard.value_or(Shard{});
  std::vector<char> done(tasks.size(), 0);
  nlohmann::json header = checkpoint_header(spec, data, status.shard);
  std::optional<CheckpointWriter> writer;
  if (folder.resume) {
    std::error_code ec;
    if (!std::filesystem::exists(path, ec))
      throw InputError(folder.dir.string(), "nothing to resume: no checkpoint (trials.jsonl) in this folder");
    const CheckpointScan scan = read_checkpoint(path);
    header["shard"] = {{"index", scan.shard.index}, {"count", scan.shard.count}};
    check_resumable(scan, header, folder.shard);
    status.shard = scan.shard;
    for (std::size_t t : scan.done) done[t] = 1;
    status.resumed = scan.done.size();
    prepare_output_folder(folder.dir, folder.outputs);
    writer.emplace(CheckpointWriter::resume(path, scan.valid_bytes));
  } else {
    prepare_output_folder(folder.dir, folder.outputs);
    writer.emplace(CheckpointWriter::create(path, header));
  }

  std::vector<std::size_t> todo;
  for (std::size_t t : status.shard.tasks(tasks.size()))
    if (!done[t]) todo.push_back(t);
  status.total = status.shard.size(tasks.size());
  status.done = status.resumed;
  if (options.progress) options.progress(status.done, status.total);
  WarningCollector warned(status.warnings);
  run_tasks(spec, data, tasks, todo, options,
            [&](std::size_t task, std::vector<TrialRecord>&& records, std::vector<Warning>&& warnings) {
              writer->append(task_line(task, records, warnings));
              for (auto& w : warnings) warned.add(std::move(w));
              ++status.done;
              if (options.progress) options.progress(status.done, status.total);
            });
  writer->sync();
  return header;
}

}  // namespace

FolderRunStatus run_tasks_into_folder(const ExperimentSpec& spec, const RunOptions& options,
                                      const FolderRunOptions& folder) {
  FolderRunStatus status;
  const nlohmann::json header = run_missing_tasks(spec, options, folder, status);
  if (status.complete() && !status.shard.whole())
    status.written.push_back(write_shard_marker(folder.dir, header, status.total));
  return status;
}

}  // namespace gapmark
