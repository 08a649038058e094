// Fitted parameters over the replicates (see fit_summary.hpp).
#include "gapmark/analysis/fit_summary.hpp"

#include <algorithm>
#include <cmath>
#include <map>
#include <string>

#include "gapmark/stats/bootstrap.hpp"

namespace gapmark {
namespace {

EstimateRange range_of(const std::string& name, std::vector<double> values) {
  EstimateRange r;
  r.name = name;
  std::erase_if(values, [](double v) { return !std::isfinite(v); });
  r.n = values.size();
  if (values.empty()) {
    r.median = r.low = r.high = std::nan("");
    return r;
  }
  std::sort(values.begin(), values.end());
  r.median = stats::sorted_quantile(values, 0.5);
  r.low = values.front();
  r.high = values.back();
  return r;
}

nlohmann::json num(double v) { return std::isfinite(v) ? nlohmann::json(v) : nlohmann::json(nullptr); }

nlohmann::json range_to_json(const EstimateRange& r) {
  return {{"median", num(r.median)}, {"min", num(r.low)}, {"max", num(r.high)}, {"n", r.n}};
}

std::string count_of(std::size_t k, std::size_t n) { return std::to_string(k) + " of " + std::to_string(n); }

/// What a fit on a bound usually means for this method (by its name).
std::string bound_hint(const std::string& method) {
  const std::string name = method.substr(0, method.find(':'));
  if (name == "kalman")
    return "a variance estimated at zero: the model needs no such component (often no measurement noise, a fixed "
           "slope or season); harmless for the fill, but say so when reporting the model";
  if (name == "arima")
    return "a partial autocorrelation at the edge of stationarity or invertibility: another difference or a "
           "simpler order may fit better";
  if (name == "low-rank")
    return "lambda chosen at an end of its grid: the held-out error was still falling there; give rank or lambda "
           "to choose yourself";
  return "an estimate at the limit of what the method searches; see the fitted models table";
}

/// One warning per method and kind, listing the series with their counts.
void fit_warnings(const std::vector<FitSummary>& fits, std::vector<Warning>& warnings) {
  std::vector<std::string> methods;
  for (const auto& s : fits)
    if (std::find(methods.begin(), methods.end(), s.method) == methods.end()) methods.push_back(s.method);
  for (const auto& method : methods) {
    std::string bound, budget;
    for (const auto& s : fits) {
      if (s.method != method) continue;
      if (s.at_bound) bound += (bound.empty() ? "" : ", ") + count_of(s.at_bound, s.fits) + " on " + s.series;
      if (s.not_converged)
        budget += (budget.empty() ? "" : ", ") + count_of(s.not_converged, s.fits) + " on " + s.series;
    }
    if (!bound.empty())
      add_warning(warnings, {"fit-at-bound", method, "fits ended with an estimate on a bound of the search: " + bound,
                             bound_hint(method)});
    if (!budget.empty())
      add_warning(warnings, {"fit-not-converged", method,
                             "fits stopped on their budget of iterations before meeting their tolerance: " + budget,
                             "their estimates may be off the optimum; a simpler model can help"});
  }
}

}  // namespace

std::vector<FitSummary> summarize_fits(const ResultSet& results, std::vector<Warning>& warnings) {
  using Key = std::pair<std::string, std::string>;
  std::vector<Key> order;
  std::map<Key, std::vector<const ModelFit*>> by_key;
  for (const auto& t : results.trials) {
    if (t.fit.empty()) continue;
    Key key{t.series, t.method};
    auto [it, inserted] = by_key.try_emplace(key);
    if (inserted) order.push_back(key);
    it->second.push_back(&t.fit);
  }
  std::vector<FitSummary> out;
  for (const auto& key : order) {
    const auto& fits = by_key[key];
    FitSummary s;
    s.series = key.first;
    s.method = key.second;
    s.fits = fits.size();
    std::vector<std::string> names;
    std::map<std::string, std::vector<double>> values;
    std::map<std::string, std::size_t> model_counts;
    std::vector<std::string> model_order;
    std::vector<double> log_likelihoods;
    for (const ModelFit* f : fits) {
      if (model_counts[f->model]++ == 0) model_order.push_back(f->model);
      for (const auto& p : f->parameters) {
        auto& v = values[p.first];
        if (v.empty() && std::find(names.begin(), names.end(), p.first) == names.end()) names.push_back(p.first);
        v.push_back(p.second);
      }
      log_likelihoods.push_back(f->log_likelihood);
      s.at_bound += f->at_bound ? 1 : 0;
      s.not_converged += f->converged ? 0 : 1;
    }
    for (const auto& m : model_order) s.models.emplace_back(m, model_counts[m]);
    std::stable_sort(s.models.begin(), s.models.end(),
                     [](const auto& a, const auto& b) { return a.second > b.second; });
    for (const auto& name : names) s.estimates.push_back(range_of(name, values[name]));
    s.log_likelihood = range_of("log_likelihood", log_likelihoods);
    out.push_back(std::move(s));
  }
  fit_warnings(out, warnings);
  return out;
}

nlohmann::json fits_to_json(const std::vector<FitSummary>& fits) {
  nlohmann::json out = nlohmann::json::array();
  for (const auto& s : fits) {
    nlohmann::json models = nlohmann::json::array();
    for (const auto& [model, count] : s.models) models.push_back({{"model", model}, {"fits", count}});
    nlohmann::json estimates = nlohmann::json::array();
    for (const auto& e : s.estimates) {
      nlohmann::json j = range_to_json(e);
      j["name"] = e.name;
      estimates.push_back(j);
    }
    out.push_back({{"series", s.series},
                   {"method", s.method},
                   {"fits", s.fits},
                   {"models", models},
                   {"estimates", estimates},
                   {"log_likelihood", range_to_json(s.log_likelihood)},
                   {"at_bound", s.at_bound},
                   {"not_converged", s.not_converged}});
  }
  return out;
}

}  // namespace gapmark
