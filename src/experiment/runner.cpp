#include "gapmark/experiment/runner.hpp"

#include <atomic>
#include <chrono>
#include <cmath>
#include <map>
#include <mutex>
#include <thread>

#include "gapmark/error.hpp"
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

}  // namespace

std::vector<TrialRecord> run_task(const ExperimentSpec& spec, const LoadedData& data, const Task& task,
                                  std::vector<Warning>& warnings) {
  const Series& series = data.series[task.series];
  const auto& plan = spec.schemes[task.scheme];
  std::vector<TrialRecord> records;
  for (std::size_t m = 0; m < spec.methods.size(); ++m) records.push_back(blank_record(spec, data, task, m));

  MaskRequest request{series.values, &series.axis, series.period, spec.holdout, plan.rates[task.rate],
                      spec.source + ": " + plan.scheme.label + ", series '" + series.label() + "'"};
  Rng rng(task_seed(spec.seed, task_key(spec, data, task)));
  Mask mask;
  try {
    mask = plan.scheme.impl->draw(request, rng);
  } catch (const std::exception& e) {
    for (auto& r : records) {
      r.status = "failed";
      r.reason = std::string("mask: ") + e.what();
    }
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
  const std::vector<double> holed = apply_mask(series.values, mask);

  FillRequest fill_request;
  fill_request.values = holed;
  fill_request.axis = &series.axis;
  fill_request.period = series.period;
  for (std::size_t s = 0; s < data.series.size(); ++s) {
    if (s == task.series || data.dataset[s] != data.dataset[task.series]) continue;
    fill_request.siblings.emplace_back(data.series[s].values);
    fill_request.sibling_names.push_back(data.series[s].label());
  }

  for (std::size_t m = 0; m < spec.methods.size(); ++m) {
    const auto& method = spec.methods[m];
    TrialRecord& rec = records[m];
    rec.masked = masked;
    FillResult result;
    const auto start = std::chrono::steady_clock::now();
    try {
      check_needs(method.entry->needs, fill_request);
      result = method.impl->fill(fill_request);
      if (result.values.size() != holed.size())
        throw MethodFailure("returned " + std::to_string(result.values.size()) + " values for " +
                            std::to_string(holed.size()) + " points");
    } catch (const std::exception& e) {
      rec.status = "failed";
      rec.reason = e.what();
      rec.unfilled = masked;
      continue;
    }
    rec.seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
    bool changed = false;
    for (std::size_t i = 0; i < holed.size(); ++i) {
      if (!std::isnan(holed[i]) && result.values[i] != holed[i]) {
        changed = true;
        result.values[i] = holed[i];
      }
      if (mask[i] && !std::isfinite(result.values[i])) {
        result.values[i] = std::nan("");
        ++rec.unfilled;
      }
    }
    if (changed)
      add_warning(warnings, {"observed-changed", method.label,
                             "the method changed observed values; they were restored before scoring",
                             "fix the method so that it returns observed values unchanged"});
    rec.status = rec.unfilled == 0 ? "ok" : rec.unfilled == masked ? "failed" : "partial";
    if (rec.unfilled) rec.reason = std::to_string(rec.unfilled) + " masked points left unfilled";

    ScoreInput score{series.values, result.values, result.variance, &mask, &series.axis, series.period,
                     spec.holdout};
    std::size_t offset = 0;
    for (const auto& metric : spec.metrics) {
      const std::size_t width = metric.impl->columns().size();
      metric.impl->compute(score, std::span<double>(rec.metrics).subspan(offset, width));
      offset += width;
    }
  }
  return records;
}

namespace {

nlohmann::json describe_series(const ExperimentSpec& spec, const LoadedData& data) {
  nlohmann::json out = nlohmann::json::array();
  for (std::size_t i = 0; i < data.series.size(); ++i) {
    const Series& s = data.series[i];
    out.push_back({{"label", s.label()},
                   {"source", spec.data[data.dataset[i]].label},
                   {"points", s.values.size()},
                   {"observed", s.observed_count()},
                   {"step", s.axis.step().iso()},
                   {"start", s.axis.size() ? s.axis.format(0) : ""},
                   {"period", s.period}});
  }
  return out;
}

}  // namespace

ResultSet run_experiment(const ExperimentSpec& spec, const RunOptions& options) {
  const auto started = std::chrono::steady_clock::now();
  const LoadedData data = load_data(spec);
  const std::vector<Task> tasks = build_tasks(spec, data);

  ResultSet results;
  for (const auto& m : spec.metrics)
    for (auto& c : m.impl->columns()) results.columns.push_back(c);
  results.rank_by = spec.rank_by;
  results.alpha = spec.alpha;
  results.series = describe_series(spec, data);
  nlohmann::json inputs = nlohmann::json::array();
  for (std::size_t d = 0; d < spec.data.size(); ++d)
    inputs.push_back({{"file", spec.data[d].label}, {"sha256", data.input_sha256[d]}});
  results.context = {{"tool", "gapmark"},
                     {"version", version()},
                     {"commit", commit()},
                     {"spec_name", spec.name},
                     {"spec", spec.json},
                     {"spec_sha256", spec.sha256},
                     {"seed", spec.seed},
                     {"replicates", spec.replicates},
                     {"holdout", spec.holdout},
                     {"inputs", inputs}};

  std::vector<std::vector<TrialRecord>> slots(tasks.size());
  std::vector<std::vector<Warning>> slot_warnings(tasks.size());
  std::atomic<std::size_t> next{0}, done{0};
  std::mutex progress_mutex;
  auto worker = [&] {
    for (std::size_t i = next++; i < tasks.size(); i = next++) {
      slots[i] = run_task(spec, data, tasks[i], slot_warnings[i]);
      const std::size_t d = ++done;
      if (options.progress) {
        std::lock_guard lock(progress_mutex);
        options.progress(d, tasks.size());
      }
    }
  };
  const unsigned threads = std::max(1u, std::min<unsigned>(options.threads, static_cast<unsigned>(tasks.size())));
  std::vector<std::thread> pool;
  for (unsigned t = 1; t < threads; ++t) pool.emplace_back(worker);
  worker();
  for (auto& t : pool) t.join();

  std::map<std::string, double> method_seconds;
  for (std::size_t i = 0; i < tasks.size(); ++i) {
    for (auto& w : slot_warnings[i]) add_warning(results.warnings, std::move(w));
    for (auto& r : slots[i]) {
      method_seconds[r.method] += r.seconds;
      results.trials.push_back(std::move(r));
    }
  }
  nlohmann::json per_method = nlohmann::json::object();
  for (const auto& [m, s] : method_seconds) per_method[m] = s;
  results.timing = {{"wall_seconds", std::chrono::duration<double>(std::chrono::steady_clock::now() - started).count()},
                    {"fill_seconds_by_method", per_method},
                    {"threads", threads}};
  return results;
}

}  // namespace gapmark
