#pragma once
// Summaries of trial records: per series, scheme and rate (a "condition" of
// a series, a cell group), each method's mean, sd and bootstrap interval of
// every metric over replicates, its mean rank and final rank by the ranking
// metric, and the paired tests that give each method its standing against
// the best: better, equivalent, not distinguishable or worse. Across series,
// mean ranks with one data set per series. The verdict per series
// (analysis/verdict.hpp) is read from these numbers once, here, and every
// output prints it. docs/statistics.md describes every rule below.
#include <cstddef>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "gapmark/analysis/fit_summary.hpp"
#include "gapmark/analysis/verdict.hpp"
#include "gapmark/experiment/record.hpp"

namespace gapmark {

/// Differences of the ranking metric smaller than this fraction of a
/// condition's scale (the median of its finite |values|) count as zero, in
/// the within-replicate ranks and in the paired tests.
inline constexpr double kNoiseRelative = 1e-9;

/// Fewest replicates with n paired differences at which the exact two-sided
/// signed-rank test against the best can reach p < alpha after Holm's
/// correction over methods - 1 comparisons: the smallest n with
/// (methods - 1) * 2 / 2^n < alpha. 0 when there is nothing to compare.
std::size_t replicates_needed(std::size_t methods, double alpha);

struct MetricSummary {
  double mean = 0, sd = 0;          ///< NaN when n = 0 (sd: n < 2)
  double ci_low = 0, ci_high = 0;   ///< percentile bootstrap interval of the mean; NaN when n < 2
  std::size_t n = 0;                ///< replicates with a value
};

/// A method's standing against the best of its condition.
enum class Standing {
  Best,                ///< the reference: first by mean among the methods that filled every trial
  Better,              ///< the paired signed-rank test finds it better than the best by mean
  Equivalent,          ///< paired TOST: within the equivalence margin of the best
  NotDistinguishable,  ///< neither shown different nor shown equivalent
  Worse,               ///< the paired signed-rank test finds it worse
};
const char* standing_name(Standing standing);  ///< "best", "better", "equivalent", "not distinguishable", "worse"

struct MethodSummary {
  std::string method;
  std::vector<MetricSummary> metrics;  ///< one per ResultSet column
  double mean_rank = 0;                ///< mean over replicates of the within-replicate rank
  std::size_t rank = 0;                ///< 1 = best
  Standing standing = Standing::NotDistinguishable;
  double p_vs_best = 0;                ///< Holm-adjusted signed-rank p against the best (NaN for the best)
  double p_equivalent = 0;             ///< Holm-adjusted TOST p (NaN for the best, or when a trial failed)
  double relative_difference = 0;      ///< (mean badness - best's) / |best's|: the effect size (NaN when unknown)
  std::size_t failures = 0;            ///< trials failed or partial
  std::size_t trials = 0;
};

struct CellGroup {
  std::string series, scheme;
  double rate = 0;
  std::size_t replicates = 0;          ///< replicates scored (mask failures left out)
  std::size_t mask_failed = 0;         ///< replicates left out because the scheme could not mask them
  std::size_t replicates_needed = 0;   ///< see replicates_needed()
  double noise = 0;                    ///< differences of the ranking metric at or below this count as zero
  double margin = 0;                   ///< the equivalence margin on the ranking metric, absolute
  std::vector<MethodSummary> methods;  ///< sorted by rank
  double friedman_statistic = 0, friedman_p = 0;  ///< NaN when not computable
  bool underpowered() const { return replicates < replicates_needed; }
};

/// A condition left out of every table, verdict and pooling: no replicate
/// could be masked.
struct ExcludedCondition {
  std::string series, scheme;
  double rate = 0;
  std::string reason;
};

/// Across series: each data set is one series. Per condition (scheme, rate)
/// the methods are ranked within each series by their mean rank in that
/// condition; with several conditions, a series' conditions are combined
/// first (the mean of its per-condition mean ranks), so each series counts
/// once. Friedman and Iman-Davenport tests, Nemenyi critical difference.
struct AcrossSeries {
  std::string scheme;   ///< "" = every condition of a series combined
  double rate = 0;
  std::size_t datasets = 0;  ///< N, the number of series
  std::vector<std::string> methods;
  std::vector<double> mean_ranks;
  double friedman_chi2 = 0, friedman_p = 0, iman_davenport_f = 0, iman_davenport_p = 0;
  double critical_difference = 0;
};

/// Fewest series for the across-series approximations (chi-square, F,
/// studentized range) to be trusted: a rule of thumb (common practice, no source).
inline constexpr std::size_t kFewestSeries = 5;

struct Summary {
  std::string rank_by;
  double alpha = 0.05;
  double equivalence = kDefaultEquivalence;
  std::vector<CellGroup> groups;
  std::vector<ExcludedCondition> excluded;
  std::vector<AcrossSeries> across;
  std::vector<FitSummary> fits;   ///< fitted parameters over the replicates, per series and method
  std::vector<Warning> warnings;  ///< from the analysis (power, few series, excluded conditions, fits)
  RunVerdict verdict;                ///< per series, read once from the numbers above
};

Summary summarize(const ResultSet& results);
nlohmann::json summary_to_json(const Summary& summary, const ResultSet& results);

/// The run's warnings followed by the analysis's, without repeats: what every output lists.
std::vector<Warning> all_warnings(const ResultSet& results, const Summary& summary);

}  // namespace gapmark
