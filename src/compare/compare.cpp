#include "gapmark/compare/compare.hpp"

#include <cmath>
#include <map>
#include <set>
#include <tuple>

#include "gapmark/error.hpp"
#include "gapmark/number_format.hpp"
#include "gapmark/stats/wilcoxon.hpp"

namespace gapmark {
namespace {

const double kNaN = std::numeric_limits<double>::quiet_NaN();

/// Distance from the best value: smaller is better.
double badness(double value, Direction d) {
  switch (d) {
    case Direction::Lower: return value;
    case Direction::ZeroBest: return std::abs(value);
    case Direction::OneBest: return std::abs(value - 1.0);
    case Direction::Higher: return -value;
    case Direction::None: return value;
  }
  return value;
}

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
    if (t.status != "ok") ++it->second.failures;
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

Comparison compare_results(const ResultSet& baseline, const ResultSet& current, const Tolerances& tolerances,
                           const std::string& baseline_source, const std::string& current_source) {
  Comparison out;
  out.baseline_source = baseline_source;
  out.current_source = current_source;
  out.alpha = current.alpha;
  out.tolerances = tolerances;
  // Fewest pairs whose smallest attainable two-sided exact p, 2 / 2^n, is below alpha.
  out.min_pairs = 1;
  while (std::ldexp(2.0, -static_cast<int>(out.min_pairs)) >= out.alpha && out.min_pairs < 64) ++out.min_pairs;

  if (baseline.alpha != current.alpha)
    out.notes.push_back("alpha differs (baseline " + format_double(baseline.alpha) + ", current " +
                        format_double(current.alpha) + "); the current one is used");
  const auto seed_b = baseline.context.value("seed", nlohmann::json()), seed_c = current.context.value("seed", nlohmann::json());
  if (seed_b != seed_c)
    out.notes.push_back("the seeds differ (baseline " + seed_b.dump() + ", current " + seed_c.dump() +
                        "): replicates do not share masks, so pairing by replicate is not meaningful");
  if (baseline.context.value("spec_sha256", std::string()) != current.context.value("spec_sha256", std::string()))
    out.notes.push_back("the spec files differ (SHA-256); cells are still matched by name");
  const auto inputs_b = baseline.context.value("inputs", nlohmann::json()), inputs_c = current.context.value("inputs", nlohmann::json());
  if (inputs_b != inputs_c) out.notes.push_back("the input data files differ (names or SHA-256)");

  // Metric columns by name.
  std::vector<std::pair<std::size_t, std::size_t>> shared;  // (baseline column, current column)
  std::set<std::string> current_names;
  for (const auto& c : current.columns) current_names.insert(c.name);
  for (std::size_t b = 0; b < baseline.columns.size(); ++b) {
    const auto& name = baseline.columns[b].name;
    if (current_names.count(name)) shared.emplace_back(b, current.column_index(name));
    else out.metrics_only_in_baseline.push_back(name);
  }
  for (const auto& c : current.columns) {
    bool found = false;
    for (const auto& b : baseline.columns) found = found || b.name == c.name;
    if (!found) out.metrics_only_in_current.push_back(c.name);
  }

  const Indexed base = index_trials(baseline, baseline_source);
  const Indexed cur = index_trials(current, current_source);
  for (const auto& key : cur.order)
    if (!base.cells.count(key)) out.only_in_current.push_back(cell_name(key));

  bool identical = out.only_in_current.empty() && out.metrics_only_in_baseline.empty() &&
                   out.metrics_only_in_current.empty();
  for (const auto& key : base.order) {
    auto it = cur.cells.find(key);
    if (it == cur.cells.end()) {
      out.only_in_baseline.push_back(cell_name(key));
      identical = false;
      continue;
    }
    const Cell& b = base.cells.at(key);
    const Cell& c = it->second;
    CellChange cell;
    std::tie(cell.series, cell.scheme, cell.rate, cell.method) = key;
    cell.baseline_trials = b.by_replicate.size();
    cell.current_trials = c.by_replicate.size();
    cell.baseline_failures = b.failures;
    cell.current_failures = c.failures;
    if (cell.current_failures > cell.baseline_failures) {
      cell.regressed = true;
      cell.reasons.push_back("failed trials " + std::to_string(cell.baseline_failures) + " -> " +
                             std::to_string(cell.current_failures));
    }
    if (cell.baseline_trials != cell.current_trials || cell.baseline_failures != cell.current_failures)
      identical = false;

    for (const auto& [bc, cc] : shared) {
      MetricChange m;
      const auto& column = baseline.columns[bc];
      m.metric = column.name;
      m.direction = column.direction;
      m.baseline_mean = mean_of(b, bc);
      m.current_mean = mean_of(c, cc);
      m.change = m.current_mean - m.baseline_mean;
      m.relative_change = m.baseline_mean != 0 ? m.change / std::abs(m.baseline_mean) : kNaN;
      m.p = kNaN;
      // Pairs by replicate, distance from the best value.
      std::vector<double> x, y;
      for (const auto& [rep, tb] : b.by_replicate) {
        auto tc = c.by_replicate.find(rep);
        if (tc == c.by_replicate.end()) continue;
        const double vb = tb->metrics[bc], vc = tc->second->metrics[cc];
        if (!std::isfinite(vb) || !std::isfinite(vc)) continue;
        x.push_back(badness(vc, column.direction));
        y.push_back(badness(vb, column.direction));
      }
      m.pairs = x.size();
      const bool same = same_number(m.baseline_mean, m.current_mean);
      if (!same) identical = false;
      if (same) {
        m.verdict = Verdict::Same;
      } else if (std::isnan(m.baseline_mean) || std::isnan(m.current_mean)) {
        m.verdict = Verdict::NotComparable;
      } else if (column.direction == Direction::None) {
        m.verdict = Verdict::Changed;
      } else {
        m.worsening = badness(m.current_mean, column.direction) - badness(m.baseline_mean, column.direction);
        m.allowed = tolerances.of(m.metric).allowed(badness(m.baseline_mean, column.direction));
        m.tested = m.pairs >= out.min_pairs;
        if (m.tested) m.p = stats::wilcoxon_signed_rank(x, y).p;
        if (m.worsening < 0) m.verdict = Verdict::Better;
        else if (m.worsening == 0) m.verdict = Verdict::Same;
        else if (m.worsening <= m.allowed) m.verdict = Verdict::WorseWithinTolerance;
        else if (m.tested && !(m.p < out.alpha)) m.verdict = Verdict::WorseNotSignificant;
        else m.verdict = Verdict::Regressed;
      }
      if (m.verdict == Verdict::Regressed) {
        cell.regressed = true;
        cell.reasons.push_back(m.metric + " worse by " + format_double(m.worsening) +
                               (m.tested ? ", p = " + format_double(m.p) : std::string(", too few pairs to test")));
      }
      cell.metrics.push_back(m);
    }
    if (cell.regressed) out.regressed.push_back(cell.name());
    out.cells.push_back(std::move(cell));
  }
  out.no_change = identical;
  return out;
}

}  // namespace gapmark
