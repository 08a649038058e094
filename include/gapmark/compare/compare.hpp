#pragma once
// Comparing two results files of the same experiment: did something get
// worse? Cells (series, scheme, rate, method) are matched by name; for each
// metric the change in the mean over replicates is reported, and trials are
// paired by replicate (same spec and seed, same masks) for a two-sided
// Wilcoxon signed-rank test on the per-replicate distance from the best
// value (direction-aware: lower, |x| for zero-best, |x - 1| for one-best,
// -x for higher).
//
// A metric regresses when it got worse by more than its tolerance AND the
// change is significant at alpha (the current results' alpha). With so few
// pairs that even a difference of the same sign in every pair cannot reach
// alpha (2 / 2^n >= alpha: fewer than 6 pairs at alpha = 0.05) the test has
// no power, and the tolerance alone decides. A cell also regresses when more
// of its trials failed than before. Descriptive metrics (direction none) are
// reported but never regress. Wall-clock timing is ignored.
#include <cstddef>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "gapmark/compare/tolerance.hpp"
#include "gapmark/experiment/record.hpp"

namespace gapmark {

enum class Verdict {
  Same,                  ///< equal means
  Better,                ///< closer to the best value
  WorseWithinTolerance,  ///< worse, but no more than allowed
  WorseNotSignificant,   ///< worse beyond tolerance, but the paired test does not confirm it
  Regressed,             ///< worse beyond tolerance and significant (or the test has no power)
  Changed,               ///< a descriptive metric changed
  NotComparable,         ///< a value in one file only
};
std::string to_string(Verdict v);

struct MetricChange {
  std::string metric;
  Direction direction = Direction::Lower;
  double baseline_mean = 0, current_mean = 0;
  double change = 0;           ///< current - baseline
  double relative_change = 0;  ///< change / |baseline|; NaN when the baseline is 0
  double worsening = 0;        ///< distance from best: current - baseline (> 0 = worse)
  double allowed = 0;          ///< the tolerance in the same units as `worsening`
  std::size_t pairs = 0;       ///< replicates with a value in both files
  bool tested = false;         ///< the paired test had power (see above)
  double p = 0;                ///< Wilcoxon two-sided p; NaN when not tested
  Verdict verdict = Verdict::Same;
};

struct CellChange {
  std::string series, scheme, method;
  double rate = 0;
  std::size_t baseline_trials = 0, current_trials = 0;
  std::size_t baseline_failures = 0, current_failures = 0;
  std::vector<MetricChange> metrics;
  bool regressed = false;
  std::vector<std::string> reasons;  ///< why it regressed
  /// "method/series/scheme@rate"
  std::string name() const;
};

struct Comparison {
  std::string baseline_source, current_source;
  double alpha = 0.05;
  std::size_t min_pairs = 6;             ///< fewest pairs for which the test has power at alpha
  Tolerances tolerances;
  std::vector<CellChange> cells;         ///< matched cells, baseline order
  std::vector<std::string> only_in_baseline, only_in_current;  ///< cell names
  std::vector<std::string> metrics_only_in_baseline, metrics_only_in_current;
  std::vector<std::string> notes;        ///< differences in context worth knowing
  std::vector<std::string> regressed;    ///< names of the regressed cells
  bool no_change = false;                ///< same cells, metrics and values throughout
};

/// Compares two result sets. Throws InputError when a file holds the same
/// trial twice.
Comparison compare_results(const ResultSet& baseline, const ResultSet& current, const Tolerances& tolerances = {},
                           const std::string& baseline_source = "baseline",
                           const std::string& current_source = "current");

/// The readable report: a table of the metric changes and a verdict line.
std::string comparison_text(const Comparison& comparison);
/// The same as JSON ("format": "gapmark-comparison").
nlohmann::json comparison_to_json(const Comparison& comparison);

}  // namespace gapmark
