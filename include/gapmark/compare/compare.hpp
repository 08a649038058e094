#pragma once
// Comparing two results files of the same experiment: did something get
// worse? Cells (series, scheme, rate, method) are matched by name; for each
// compared metric the change in the mean over replicates is reported, and
// trials are paired by replicate (same spec and seed, same masks) for a
// two-sided Wilcoxon signed-rank test on the per-replicate distance from the
// best value (direction-aware: lower, |x| for zero-best, |x - 1| for
// one-best, -x for higher).
//
// Which metrics are compared: those given a tolerance (by name, or all with
// "*"), and the ranking metric (rank_by) with the default tolerance. The
// others are listed as not compared, so that a CI job fails only on what it
// chose to watch.
//
// A metric regresses when it got worse by more than its tolerance AND the
// change is significant at alpha (the current results' alpha) after Holm's
// correction over every test made in the comparison (all cells and metrics).
// With so few pairs that even a difference of the same sign in every pair
// cannot reach alpha after the correction (m * 2 / 2^n >= alpha for m
// candidate tests: fewer than 6 pairs for one test at alpha = 0.05, fewer
// than 11 for 36) the test has no power: with the same seed (deterministic masks, so any
// change comes from the code) the tolerance alone decides; with another seed
// nothing can be concluded and it does not regress. With another seed the
// pairs are independent draws; under "no change" their differences are still
// symmetric about zero, so the test stays valid, with less power. A cell also
// regresses when more of its trials failed than before (same seed only: with
// other masks a count that moves is reported, not failed). Descriptive
// metrics (direction none) are reported but never regress. Wall-clock timing
// is ignored. Two files with no cell in common are refused (InputError).
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
  double p_holm = 0;           ///< p after Holm's correction over every test of the comparison
  Verdict verdict = Verdict::Same;
};

struct CellChange {
  std::string series, scheme, method;
  double rate = 0;
  std::size_t baseline_trials = 0, current_trials = 0;
  std::size_t baseline_failures = 0, current_failures = 0;
  std::vector<MetricChange> metrics;
  bool regressed = false;
  bool more_failures_other_seed = false;  ///< more failed trials, but the masks differ
  std::vector<std::string> reasons;  ///< why it regressed
  /// "method/series/scheme@rate"
  std::string name() const;
};

struct Comparison {
  std::string baseline_source, current_source;
  double alpha = 0.05;
  std::size_t min_pairs = 6;             ///< fewest pairs for which a test has power at alpha after Holm's correction
  Tolerances tolerances;
  std::vector<CellChange> cells;         ///< matched cells, baseline order
  std::vector<std::string> only_in_baseline, only_in_current;  ///< cell names
  std::vector<std::string> metrics_only_in_baseline, metrics_only_in_current;
  std::vector<std::string> notes;        ///< differences in context worth knowing
  std::vector<std::string> regressed;    ///< names of the regressed cells
  std::vector<std::string> compared_metrics, uncompared_metrics;  ///< by the tolerance rule above
  std::size_t tests = 0;                 ///< paired tests made: the size of Holm's family
  bool same_seed = true;
  bool no_change = false;                ///< same cells, metrics and values throughout
};

/// Compares two result sets. Throws InputError when a file holds the same
/// trial twice, or when the files share no cell (naming what differs).
Comparison compare_results(const ResultSet& baseline, const ResultSet& current, const Tolerances& tolerances = {},
                           const std::string& baseline_source = "baseline",
                           const std::string& current_source = "current");

/// The readable report: a summary with the verdict, then the worst `limit`
/// cells (one row each, its worst metric), rounded; limit 0 = every changed
/// metric of every cell.
std::string comparison_text(const Comparison& comparison, std::size_t limit = 20);
/// The same as JSON ("format": "gapmark-comparison").
nlohmann::json comparison_to_json(const Comparison& comparison);

}  // namespace gapmark
