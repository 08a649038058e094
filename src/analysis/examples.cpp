#include "gapmark/analysis/examples.hpp"

#include <algorithm>
#include <cmath>
#include <vector>

#include "gapmark/json_number.hpp"
#include "gapmark/error.hpp"
#include "gapmark/fill/checked_fill.hpp"
#include "gapmark/interrupted.hpp"
#include "gapmark/parallel_for.hpp"
#include "gapmark/score/metric_names.hpp"
#include "gapmark/stats/acf.hpp"

namespace gapmark {
namespace {

/// The largest lag: the spec's "acf" metric setting when it gives one, else
/// twice the period, or 24 without a period; at most n - 1.
std::size_t acf_lags(const ExperimentSpec& spec, const Series& series) {
  std::size_t lags = 0;
  for (const auto& m : spec.metrics)
    if (m.entry && m.entry->name == metric_names::acf::kName && m.params.has(metric_names::acf::kLags))
      lags = static_cast<std::size_t>(m.params.integer(metric_names::acf::kLags));
  if (lags == 0) lags = series.period >= 2 ? 2 * series.period : 24;
  return series.values.size() > 1 ? std::min(lags, series.values.size() - 1) : 0;
}

/// Start of the window of `width` points holding the most masked points
/// (the earliest such window).
std::size_t best_window(const Mask& mask, std::size_t width) {
  if (mask.size() <= width) return 0;
  std::size_t count = 0;
  for (std::size_t i = 0; i < width; ++i) count += mask[i];
  std::size_t best = count, start = 0;
  for (std::size_t s = 1; s + width <= mask.size(); ++s) {
    count += mask[s + width - 1];
    count -= mask[s - 1];
    if (count > best) {
      best = count;
      start = s;
    }
  }
  return start;
}

/// ACF r_1..r_L of `values` with the complete series' own gaps left out.
nlohmann::json acf_json(std::span<const double> truth, std::span<const double> values, std::size_t lags) {
  std::vector<double> x(values.begin(), values.end());
  for (std::size_t i = 0; i < x.size(); ++i)
    if (std::isnan(truth[i])) x[i] = std::nan("");
  nlohmann::json out = nlohmann::json::array();
  const auto r = stats::sample_autocorrelation(x, lags);
  for (std::size_t k = 1; k < r.size(); ++k) out.push_back(json_number(r[k]));
  return out;
}

nlohmann::json example_for(const ExperimentSpec& spec, const LoadedData& data, const Summary& summary,
                           std::size_t index, const ExampleOptions& options) {
  const Series& series = data.series[index];
  const auto& plan = spec.schemes.front();
  const Task task{index, 0, 0, 0};
  const double rate = plan.rates.front();
  nlohmann::json ex = {{"series", series.label()}, {"scheme", plan.scheme.label}, {"rate", rate},
                       {"replicate", 0}};

  const CellGroup* group = nullptr;
  for (const auto& g : summary.groups)
    if (g.series == series.label() && g.scheme == plan.scheme.label && g.rate == rate) group = &g;
  if (group == nullptr) {
    ex["note"] = "no summary for this cell";
    return ex;
  }

  // The same mask and fill request as the run's first replicate of this cell.
  const Siblings siblings = task_uses_siblings(spec, task) ? siblings_of(data, index) : Siblings{};
  Mask mask;
  try {
    mask = draw_task_mask(spec, data, task, siblings);
  } catch (const std::exception& e) {
    ex["note"] = std::string("the scheme could not mask this series: ") + e.what();
    return ex;
  }
  const std::vector<double> holed = apply_mask(series.values, mask);
  const FillRequest fill_request = fill_request_for(spec, series, holed, siblings);

  const std::size_t n = series.values.size();
  const std::size_t width = std::min(options.window, n);
  const std::size_t start = best_window(mask, width);
  const std::size_t lags = acf_lags(spec, series);
  ex["start"] = start;
  ex["length"] = width;
  ex["time_first"] = width ? series.axis.format(start) : "";
  ex["time_last"] = width ? series.axis.format(start + width - 1) : "";
  ex["step"] = series.axis.step().iso();
  nlohmann::json truth = nlohmann::json::array(), shown_mask = nlohmann::json::array();
  for (std::size_t i = start; i < start + width; ++i) {
    truth.push_back(json_number(series.values[i]));
    shown_mask.push_back(static_cast<int>(mask[i]));
  }
  ex["truth"] = truth;
  ex["mask"] = shown_mask;

  nlohmann::json methods = nlohmann::json::array();
  nlohmann::json acf_methods = nlohmann::json::array();
  for (const auto& ms : group->methods) {
    if (methods.size() >= options.top) break;  // group->methods are in rank order
    if (ms.failures == ms.trials) continue;  // never filled this cell
    const Bound<FillMethod>* method = nullptr;
    for (const auto& m : spec.methods)
      if (m.label == ms.method) method = &m;
    if (method == nullptr) continue;
    nlohmann::json entry = {{"method", ms.method}, {"rank", ms.rank}};
    if (method->entry->name == "external" && !options.allow_external) {
      entry["status"] = "not run";
      entry["reason"] = "an outside program is not started again without --allow-external";
      entry["filled"] = nullptr;
      methods.push_back(entry);
      continue;
    }
    CheckedFill fill;
    try {
      fill = checked_fill(*method, fill_request, mask);
    } catch (const Interrupted& e) {  // the user stopped an outside program: this window shows no fill
      fill.failure = e.what();
    }
    if (fill.failed()) {
      entry["status"] = trial_status_name(TrialStatus::Failed);
      entry["reason"] = run_failure_reason(fill.failure, fill.need);
      entry["filled"] = nullptr;
      methods.push_back(entry);
      continue;
    }
    const std::vector<double>& filled = fill.values;
    const bool complete = fill.unfilled == 0;
    nlohmann::json values = nlohmann::json::array();
    for (std::size_t i = start; i < start + width; ++i) values.push_back(mask[i] ? json_number(filled[i]) : nullptr);
    entry["status"] = trial_status_name(complete ? TrialStatus::Ok : TrialStatus::Partial);
    entry["filled"] = values;
    methods.push_back(entry);
    if (complete) acf_methods.push_back({{"method", ms.method}, {"values", acf_json(series.values, filled, lags)}});
  }
  ex["methods"] = methods;
  ex["acf"] = {{"lags", lags}, {"truth", acf_json(series.values, series.values, lags)}, {"methods", acf_methods}};
  return ex;
}

}  // namespace

nlohmann::json build_examples(const ExperimentSpec& spec, const LoadedData& data, const Summary& summary,
                              const ExampleOptions& options) {
  std::vector<nlohmann::json> built;
  if (!spec.schemes.empty() && !spec.schemes.front().rates.empty()) {
    built.resize(std::min(data.series.size(), options.max_series));
    parallel_for(built.size(), options.threads,
                 [&](std::size_t s) { built[s] = example_for(spec, data, summary, s, options); });
  }
  nlohmann::json list = nlohmann::json::array();
  for (auto& example : built) list.push_back(std::move(example));
  return {{"window", options.window}, {"top", options.top}, {"series", list}};
}

std::string attach_examples(ResultSet& results, const Summary& summary, const ExperimentSpec& spec,
                            const ExampleOptions& options) {
  results.examples = nullptr;
  LoadedData data;
  try {
    data = load_data(spec);
  } catch (const InputError& e) {
    return std::string("the data cannot be read again: ") + e.what();
  }
  const std::vector<InputFile>& recorded = results.context.inputs;
  for (std::size_t d = 0; d < data.input_sha256.size(); ++d)
    if (d >= recorded.size() || recorded[d].sha256 != data.input_sha256[d])
      return "the data file " + spec.data[d].label + " changed since the run (SHA-256 differs)";
  results.examples = build_examples(spec, data, summary, options);
  return {};
}

}  // namespace gapmark
