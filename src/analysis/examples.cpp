#include "gapmark/analysis/examples.hpp"

#include <algorithm>
#include <cmath>
#include <vector>

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
std::vector<double> acf_of(std::span<const double> truth, std::span<const double> values, std::size_t lags) {
  std::vector<double> x(values.begin(), values.end());
  for (std::size_t i = 0; i < x.size(); ++i)
    if (std::isnan(truth[i])) x[i] = std::nan("");
  const auto r = stats::sample_autocorrelation(x, lags);
  return r.size() > 1 ? std::vector<double>(r.begin() + 1, r.end()) : std::vector<double>();
}

/// The summary of the cell (series, scheme, rate); null when there is none.
const CellGroup* find_group(const Summary& summary, const std::string& series, const std::string& scheme, double rate) {
  const CellGroup* group = nullptr;
  for (const auto& g : summary.groups)
    if (g.series == series && g.scheme == scheme && g.rate == rate) group = &g;
  return group;
}

/// The window of `width` points with the most masked points: where it
/// starts, its times, the truth and the mask in it.
void place_window(ExampleWindow& ex, const Series& series, const Mask& mask, std::size_t width) {
  ex.start = best_window(mask, width);
  ex.length = width;
  ex.time_first = width ? series.axis.format(ex.start) : "";
  ex.time_last = width ? series.axis.format(ex.start + width - 1) : "";
  ex.step = series.axis.step().iso();
  for (std::size_t i = ex.start; i < ex.start + width; ++i) {
    ex.truth.push_back(series.values[i]);
    ex.mask.push_back(mask[i] ? 1 : 0);
  }
}

/// A leading method's fill of the example's mask, as in the run: its values
/// at the window's masked points, or why there are none. Sets `complete`
/// when every masked point was filled.
ExampleFill refill(const Bound<FillMethod>& method, const MethodSummary& ms, const FillRequest& request,
                   const Mask& mask, const ExampleWindow& ex, const ExampleOptions& options,
                   std::vector<double>& filled) {
  ExampleFill entry{.method = ms.method, .rank = ms.rank, .status = std::nullopt, .reason = {}, .filled = {}};
  if (method.entry->name == "external" && !options.allow_external) {
    entry.reason = "an outside program is not started again without --allow-external";
    return entry;
  }
  CheckedFill fill;
  try {
    fill = checked_fill(method, request, mask);
  } catch (const Interrupted& e) {  // the user stopped an outside program: this window shows no fill
    fill.failure = e.what();
  }
  if (fill.failed()) {
    entry.status = TrialStatus::Failed;
    entry.reason = run_failure_reason(fill.failure, fill.need);
    return entry;
  }
  entry.status = fill.unfilled == 0 ? TrialStatus::Ok : TrialStatus::Partial;
  for (std::size_t i = ex.start; i < ex.start + ex.length; ++i)
    entry.filled.push_back(mask[i] ? fill.values[i] : std::nan(""));
  filled = std::move(fill.values);
  return entry;
}

/// The spec's bound method labelled `label`; null when there is none.
const Bound<FillMethod>* find_method(const ExperimentSpec& spec, const std::string& label) {
  const Bound<FillMethod>* method = nullptr;
  for (const auto& m : spec.methods)
    if (m.label == label) method = &m;
  return method;
}

ExampleWindow example_for(const ExperimentSpec& spec, const LoadedData& data, const Summary& summary,
                          std::size_t index, const ExampleOptions& options) {
  const Series& series = data.series[index];
  const auto& plan = spec.schemes.front();
  const Task task{index, 0, 0, 0};
  ExampleWindow ex;
  ex.series = series.label();
  ex.scheme = plan.scheme.label;
  ex.rate = plan.rates.front();
  const CellGroup* group = find_group(summary, ex.series, ex.scheme, ex.rate);
  if (group == nullptr) {
    ex.note = "no summary for this cell";
    return ex;
  }
  // The same mask and fill request as the run's first replicate of this cell.
  const Siblings siblings = task_uses_siblings(spec, task) ? siblings_of(data, index) : Siblings{};
  Mask mask;
  try {
    mask = draw_task_mask(spec, data, task, siblings);
  } catch (const std::exception& e) {
    ex.note = std::string("the scheme could not mask this series: ") + e.what();
    return ex;
  }
  const std::vector<double> holed = apply_mask(series.values, mask);
  const FillRequest fill_request = fill_request_for(spec, series, holed, siblings);
  place_window(ex, series, mask, std::min(options.window, series.values.size()));
  ex.lags = acf_lags(spec, series);
  for (const auto& ms : group->methods) {
    if (ex.methods.size() >= options.top) break;  // group->methods are in rank order
    if (ms.failures == ms.trials) continue;  // never filled this cell
    const Bound<FillMethod>* method = find_method(spec, ms.method);
    if (method == nullptr) continue;
    std::vector<double> filled;
    ex.methods.push_back(refill(*method, ms, fill_request, mask, ex, options, filled));
    if (ex.methods.back().status == TrialStatus::Ok)
      ex.acf_methods.push_back({ms.method, acf_of(series.values, filled, ex.lags)});
  }
  ex.acf_truth = acf_of(series.values, series.values, ex.lags);
  return ex;
}

}  // namespace

ExampleWindows build_examples(const ExperimentSpec& spec, const LoadedData& data, const Summary& summary,
                              const ExampleOptions& options) {
  ExampleWindows out{.window = options.window, .top = options.top, .series = {}};
  if (!spec.schemes.empty() && !spec.schemes.front().rates.empty()) {
    out.series.resize(std::min(data.series.size(), options.max_series));
    parallel_for(out.series.size(), options.threads,
                 [&](std::size_t s) { out.series[s] = example_for(spec, data, summary, s, options); });
  }
  return out;
}

std::string attach_examples(ResultSet& results, const Summary& summary, const ExperimentSpec& spec,
                            const ExampleOptions& options) {
  results.examples.reset();
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
