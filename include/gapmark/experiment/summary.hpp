#pragma once
// Summaries of trial records: per series, scheme and rate ("a cell group"),
// each method's mean, sd and confidence interval of every metric over
// replicates, its mean rank and final rank by the ranking metric, and the
// statistical tests behind the ranking.
#include <cstddef>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "gapmark/experiment/record.hpp"

namespace gapmark {

struct MetricSummary {
  double mean = 0, sd = 0, ci_low = 0, ci_high = 0;  ///< NaN when n = 0
  std::size_t n = 0;                                  ///< replicates with a value
};

struct MethodSummary {
  std::string method;
  std::vector<MetricSummary> metrics;  ///< one per ResultSet column
  double mean_rank = 0;                ///< mean over replicates of the within-replicate rank
  std::size_t rank = 0;                ///< 1 = best
  bool tied_with_best = false;         ///< not distinguishable from the best at alpha
  double p_vs_best = 0;                ///< Holm-adjusted p-value against the best (NaN for the best)
  std::size_t failures = 0;            ///< trials failed or partial
  std::size_t trials = 0;
};

struct CellGroup {
  std::string series, scheme;
  double rate = 0;
  std::size_t replicates = 0;
  std::vector<MethodSummary> methods;  ///< sorted by rank
  double friedman_statistic = 0, friedman_p = 0;  ///< NaN when not computable
};

/// Across series: mean ranks per method over all (series, scheme, rate)
/// groups, Friedman and Iman-Davenport tests, Nemenyi critical difference.
struct AcrossSeries {
  std::string scheme;   ///< "" = all groups pooled
  double rate = 0;
  std::size_t datasets = 0;
  std::vector<std::string> methods;
  std::vector<double> mean_ranks;
  double friedman_chi2 = 0, friedman_p = 0, iman_davenport_f = 0, iman_davenport_p = 0;
  double critical_difference = 0;
};

struct Summary {
  std::string rank_by;
  double alpha = 0.05;
  std::vector<CellGroup> groups;
  std::vector<AcrossSeries> across;
};

Summary summarize(const ResultSet& results);
nlohmann::json summary_to_json(const Summary& summary, const ResultSet& results);

}  // namespace gapmark
