#pragma once
// Fitted parameters over the replicates: per series and method (every
// scheme, rate and replicate of that series pooled), the models chosen and
// how often, each named estimate's median and range, the log-likelihood's,
// and how many fits ended on a bound of their search or did not converge.
// Computed once in summarize(); results.json ("summary"/"fits"), methods.md
// and report.html print it, and its warnings (fit-at-bound,
// fit-not-converged) go to every output's warning list.
#include <cstddef>
#include <nlohmann/json.hpp>
#include <string>
#include <utility>
#include <vector>

#include "gapmark/experiment/record.hpp"

namespace gapmark {

/// One estimate over the fits that have it: median and range (min, max).
struct EstimateRange {
  std::string name;
  double median = 0, low = 0, high = 0;
  std::size_t n = 0;  ///< fits with a finite value
};

struct FitSummary {
  std::string series, method;
  std::size_t fits = 0;                                     ///< trials with a fit on record
  std::vector<std::pair<std::string, std::size_t>> models;  ///< model and how many fits chose it, most often first
  std::vector<EstimateRange> estimates;                     ///< in first-seen order of their names
  EstimateRange log_likelihood;                             ///< n = 0 when no fit has one
  std::size_t at_bound = 0;       ///< fits with an estimate on a bound of its search
  std::size_t not_converged = 0;  ///< fits that stopped on their budget
};

/// Per (series, method) with at least one fit, in the order the trials give
/// them. Adds, per method, one warning when fits hit a bound and one when
/// fits did not converge, each listing the series and counts.
std::vector<FitSummary> summarize_fits(const ResultSet& results, std::vector<Warning>& warnings);

/// "fits" in results.json's summary.
nlohmann::json fits_to_json(const std::vector<FitSummary>& fits);

}  // namespace gapmark
