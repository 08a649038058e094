#include "gapmark/compare/compare.hpp"

#include <algorithm>
#include <cmath>
#include <map>
#include <set>
#include <tuple>

#include "gapmark/error.hpp"
#include "gapmark/number_format.hpp"
#include "gapmark/stats/multiple_testing.hpp"
#include "gapmark/stats/signed_rank_power.hpp"
#include "gapmark/stats/wilcoxon.hpp"

namespace gapmark {
namespace {

const double kNaN = std::numeric_limits<double>::quiet_NaN();

using CellKey = std::tuple<std::string, std::string, double, std::string>;  // series, scheme, rate, method

std::string cell_name(const CellKey& k) {
  return std::get<3>(k) + "/" + std::get<0>(k) + "/" + std::get<1>(k) + "@" + format_double(std::get<2>(k));
}

struct Cell {
  std::map<int, const TrialRecord*> by_replicate;
  std::size_t failures = 0;
};

struct Indexed {
  std::vector<CellKey> order;
  std::map<CellKey, Cell> cells;
};

Indexed index_trials(const ResultSet& r, const std::string& source) {
  Indexed out;
  for (const auto& t : r.trials) {
    CellKey key{t.series, t.scheme, t.rate, t.method};
    auto [it, inserted] = out.cells.try_emplace(key);
    if (inserted) out.order.push_back(key);
    if (!it->second.by_replicate.emplace(t.replicate, &t).second)
      throw InputError(source, "trial " + t.name() + " appears twice");
    if (t.status != TrialStatus::Ok) ++it->second.failures;
  }
  return out;
}

double mean_of(const Cell& cell, std::size_t column) {
  double sum = 0;
  std::size_t n = 0;
  for (const auto& [rep, t] : cell.by_replicate)
    if (std::isfinite(t->metrics[column])) sum += t->metrics[column], ++n;
  return n ? sum / static_cast<double>(n) : kNaN;
}

bool same_number(double a, double b) { return (std::isnan(a) && std::isnan(b)) || a == b; }

/// "a, b, c" of the distinct values of one field of the trials, in first-seen order (at most 6).
std::string distinct(const ResultSet& r, std::string TrialRecord::*field) {
  std::vector<std::string> seen;
  for (const auto& t : r.trials)
    if (std::find(seen.begin(), seen.end(), t.*field) == seen.end()) seen.push_back(t.*field);
  std::string out;
  for (std::size_t i = 0; i < seen.size() && i < 6; ++i) out += (i ? ", " : "") + seen[i];
  if (seen.size() > 6) out += " and " + std::to_string(seen.size() - 6) + " more";
  return out.empty() ? "(none)" : out;
}

/// Why two files share no cell: what differs between them.
std::string no_shared_cell(const ResultSet& b, const ResultSet& c, const std::string& baseline_source) {
  std::string out = "no cell in common with " + baseline_source + ", nothing to compare";
  const std::string& hash_b = b.context.spec_sha256;
  const std::string& hash_c = c.context.spec_sha256;
  if (hash_b != hash_c)
    out += "; spec SHA-256 " + (hash_b.empty() ? std::string("(none)") : hash_b.substr(0, 12)) + " vs " +
           (hash_c.empty() ? std::string("(none)") : hash_c.substr(0, 12));
  for (const auto& [what, field] : {std::pair{"series", &TrialRecord::series}, std::pair{"schemes", &TrialRecord::scheme},
                                    std::pair{"methods", &TrialRecord::method}}) {
    const std::string x = distinct(b, field), y = distinct(c, field);
    if (x != y) out += std::string("; ") + what + " " + x + " vs " + y;
  }
  return out + " (compare two runs of the same spec)";
}

}  // namespace

std::string to_string(Verdict v) {
  switch (v) {
    case Verdict::Same: return "same";
    case Verdict::Better: return "better";
    case Verdict::WorseWithinTolerance: return "worse within tolerance";
    case Verdict::WorseNotSignificant: return "worse, not significant";
    case Verdict::Regressed: return "REGRESSED";
    case Verdict::Changed: return "changed";
    case Verdict::NotComparable: return "not comparable";
  }
  return "";
}

std::string CellChange::name() const { return cell_name({series, scheme, rate, method}); }

namespace {

/// Notes on what differs between the two runs' settings and inputs.
void note_context_differences(const ResultSet& baseline, const ResultSet& current, Comparison& out) {
  if (baseline.alpha != current.alpha)
    out.notes.push_back("alpha differs (baseline " + format_double(baseline.alpha) + ", current " +
                        format_double(current.alpha) + "); the current one is used");
  const std::uint64_t seed_b = baseline.context.seed, seed_c = current.context.seed;
  out.same_seed = seed_b == seed_c;
  if (!out.same_seed)
    out.notes.push_back("the seeds differ (baseline " + std::to_string(seed_b) + ", current " + std::to_string(seed_c) +
                        "): replicates do not share masks, so pairs are independent draws (the test stays valid, "
                        "with less power) and too few pairs decide nothing");
  if (baseline.context.spec_sha256 != current.context.spec_sha256)
    out.notes.push_back("the spec files differ (SHA-256); cells are still matched by name");
  if (baseline.context.inputs != current.context.inputs) out.notes.push_back("the input data files differ (names or SHA-256)");
}

/// Metric columns matched by name: (baseline column, current column) of
/// those in both; the lists of compared, uncompared and one-sided metrics.
std::vector<std::pair<std::size_t, std::size_t>> match_columns(const ResultSet& baseline, const ResultSet& current,
                                                               const Tolerances& tolerances, Comparison& out) {
  std::vector<std::pair<std::size_t, std::size_t>> shared;
  std::set<std::string> current_names;
  for (const auto& c : current.columns) current_names.insert(c.name);
  for (std::size_t b = 0; b < baseline.columns.size(); ++b) {
    const auto& name = baseline.columns[b].name;
    if (current_names.count(name)) {
      shared.emplace_back(b, current.column_index(name));
      (tolerances.compares(name, current.rank_by) ? out.compared_metrics : out.uncompared_metrics).push_back(name);
    } else {
      out.metrics_only_in_baseline.push_back(name);
    }
  }
  for (const auto& c : current.columns) {
    bool found = false;
    for (const auto& b : baseline.columns) found = found || b.name == c.name;
    if (!found) out.metrics_only_in_current.push_back(c.name);
  }
  return shared;
}

/// The paired values of one metric by replicate, as distances from the best
/// value: x from the current run, y from the baseline.
struct Pairs {
  std::vector<double> x, y;
};

/// What the comparison of the cells gathers beside the cells themselves.
struct CellTally {
  std::vector<Pairs> pairs;    ///< per metric change, in order
  std::size_t candidates = 0;  ///< compared metrics that changed with a direction
  bool identical = true;
};

/// One metric of one cell: means, change, pairs and the verdict before any test.
MetricChange compare_metric(const Cell& b, const Cell& c, std::size_t bc, std::size_t cc, const MetricColumn& column,
                            const Tolerances& tolerances, const std::string& rank_by, CellTally& tally,
                            Pairs& pairs) {
  MetricChange m;
  m.metric = column.name;
  m.direction = column.direction;
  m.baseline_mean = mean_of(b, bc);
  m.current_mean = mean_of(c, cc);
  m.change = m.current_mean - m.baseline_mean;
  m.relative_change = m.baseline_mean != 0 ? m.change / std::abs(m.baseline_mean) : kNaN;
  m.p = kNaN;
  for (const auto& [rep, tb] : b.by_replicate) {
    auto tc = c.by_replicate.find(rep);
    if (tc == c.by_replicate.end()) continue;
    const double vb = tb->metrics[bc], vc = tc->second->metrics[cc];
    if (!std::isfinite(vb) || !std::isfinite(vc)) continue;
    pairs.x.push_back(badness(vc, column.direction));
    pairs.y.push_back(badness(vb, column.direction));
  }
  m.pairs = pairs.x.size();
  const bool same = same_number(m.baseline_mean, m.current_mean);
  if (!same) tally.identical = false;
  if (!tolerances.compares(m.metric, rank_by)) return m;  // listed as not compared
  if (same) {
    m.verdict = Verdict::Same;
  } else if (std::isnan(m.baseline_mean) || std::isnan(m.current_mean)) {
    m.verdict = Verdict::NotComparable;
  } else if (column.direction == Direction::None) {
    m.verdict = Verdict::Changed;
  } else {
    m.worsening = badness(m.current_mean, column.direction) - badness(m.baseline_mean, column.direction);
    m.allowed = tolerances.of(m.metric).allowed(badness(m.baseline_mean, column.direction));
    ++tally.candidates;
    if (m.worsening < 0) m.verdict = Verdict::Better;
    else if (m.worsening == 0) m.verdict = Verdict::Same;
    else if (m.worsening <= m.allowed) m.verdict = Verdict::WorseWithinTolerance;
    else m.verdict = Verdict::Regressed;  // until the corrected test says otherwise (apply_tests)
  }
  return m;
}

/// One cell present in both runs: its trial and failure counts and its
/// compared metrics (those not compared are left out of the cell).
CellChange compare_cell(const CellKey& key, const Cell& b, const Cell& c, const ResultSet& baseline,
                        const std::vector<std::pair<std::size_t, std::size_t>>& shared,
                        const Tolerances& tolerances, const std::string& rank_by, bool same_seed, CellTally& tally) {
  CellChange cell;
  std::tie(cell.series, cell.scheme, cell.rate, cell.method) = key;
  cell.baseline_trials = b.by_replicate.size();
  cell.current_trials = c.by_replicate.size();
  cell.baseline_failures = b.failures;
  cell.current_failures = c.failures;
  if (cell.current_failures > cell.baseline_failures) {
    const std::string reason =
        "failed trials " + std::to_string(cell.baseline_failures) + " -> " + std::to_string(cell.current_failures);
    if (same_seed) {
      cell.regressed = true;
      cell.reasons.push_back(reason);
    } else {
      cell.more_failures_other_seed = true;
    }
  }
  if (cell.baseline_trials != cell.current_trials || cell.baseline_failures != cell.current_failures)
    tally.identical = false;
  for (const auto& [bc, cc] : shared) {
    Pairs pairs;
    MetricChange m = compare_metric(b, c, bc, cc, baseline.columns[bc], tolerances, rank_by, tally, pairs);
    if (!tolerances.compares(m.metric, rank_by)) continue;
    cell.metrics.push_back(std::move(m));
    tally.pairs.push_back(std::move(pairs));
  }
  return cell;
}

/// The signed-rank tests with power, Holm over every test made (all cells
/// and metrics), and the final verdicts and regressed cells.
void apply_tests(Comparison& out, const std::vector<Pairs>& pairs) {
  std::vector<double> ps;
  std::size_t k = 0;
  for (auto& cell : out.cells)
    for (auto& m : cell.metrics) {
      const Pairs& p = pairs[k++];
      const bool directional = m.verdict == Verdict::Better || m.verdict == Verdict::WorseWithinTolerance ||
                               m.verdict == Verdict::Regressed;
      m.tested = directional && m.pairs >= out.min_pairs;
      if (m.tested) m.p = stats::wilcoxon_signed_rank(p.x, p.y).p;
      ps.push_back(m.tested ? m.p : kNaN);
    }
  const std::vector<double> adjusted = stats::holm_adjust(ps);
  k = 0;
  for (auto& cell : out.cells) {
    for (auto& m : cell.metrics) {
      m.p_holm = adjusted[k++];
      if (m.tested) ++out.tests;
      if (m.verdict != Verdict::Regressed) continue;
      if (m.tested ? !(m.p_holm < out.alpha) : !out.same_seed) {
        m.verdict = Verdict::WorseNotSignificant;
        continue;
      }
      cell.regressed = true;
      cell.reasons.push_back(m.metric + " worse by " + short_number(m.worsening) +
                             (m.tested ? " (Holm-adjusted p = " + short_number(m.p_holm) + ")"
                                       : std::string(" (too few pairs to test; same masks)")));
    }
    if (cell.regressed) out.regressed.push_back(cell.name());
  }
}

}  // namespace

Comparison compare_results(const ResultSet& baseline, const ResultSet& current, const Tolerances& tolerances,
                           const std::string& baseline_source, const std::string& current_source) {
  Comparison out;
  out.baseline_source = baseline_source;
  out.current_source = current_source;
  out.alpha = current.alpha;
  out.tolerances = tolerances;
  note_context_differences(baseline, current, out);
  const auto shared = match_columns(baseline, current, tolerances, out);

  const Indexed base = index_trials(baseline, baseline_source);
  const Indexed cur = index_trials(current, current_source);
  for (const auto& key : cur.order)
    if (!base.cells.count(key)) out.only_in_current.push_back(cell_name(key));
  CellTally tally;
  tally.identical = out.only_in_current.empty() && out.metrics_only_in_baseline.empty() &&
                    out.metrics_only_in_current.empty();
  for (const auto& key : base.order) {
    auto it = cur.cells.find(key);
    if (it == cur.cells.end()) {
      out.only_in_baseline.push_back(cell_name(key));
      tally.identical = false;
      continue;
    }
    out.cells.push_back(compare_cell(key, base.cells.at(key), it->second, baseline, shared, tolerances,
                                     current.rank_by, out.same_seed, tally));
  }
  if (out.cells.empty()) throw InputError(current_source, no_shared_cell(baseline, current, baseline_source));

  // Fewest pairs whose smallest attainable two-sided exact p, 2 / 2^n, can
  // still reach alpha after Holm's correction over the candidate tests (the
  // compared metrics that changed with a direction): candidates * 2 / 2^n < alpha.
  out.min_pairs = stats::fewest_signed_rank_pairs(tally.candidates, out.alpha);
  apply_tests(out, tally.pairs);
  out.no_change = tally.identical;
  return out;
}

}  // namespace gapmark
