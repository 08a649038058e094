// Scores of the conditional sample paths a method returns (`draws=M`):
// sample CRPS (energy form, stats/sample_crps.hpp) and the coverage of the
// draws' empirical central interval on the masked points, and the coverage
// of each gap's total: a gap is a run of consecutive masked points; its true
// sum is inside when it lies within the central interval of the M sums the
// draws give for that run. Accumulated quantities (feed dispensed per day,
// counts per shift) need the second: pointwise intervals say nothing about
// the uncertainty of a total, whose draws carry the dependence between
// neighbouring points.
//
// Methods without draws get n/a, never zero; so does a trial where a draw is
// not finite at a masked point, or with no masked point.
#include <algorithm>
#include <cmath>
#include <limits>

#include "gapmark/score/metric.hpp"
#include "gapmark/stats/sample_crps.hpp"

namespace gapmark {
namespace {

class SampleScores final : public Metric {
public:
  explicit SampleScores(double level) : level_(level) {}

  std::vector<MetricColumn> columns() const override {
    return {{"sample_crps", "value", Direction::Lower,
             "mean sample CRPS of the method's draws on the masked points (energy form)"},
            {"sample_coverage", "probability", Direction::None,
             "share of masked points inside the draws' empirical central interval; best equal to the level"},
            {"sample_coverage_error", "probability", Direction::ZeroBest,
             "sample coverage minus the level: below zero the draws are too narrow"},
            {"gap_total_coverage", "probability", Direction::None,
             "share of gaps whose true total lies inside the central interval of the draws' totals"},
            {"gap_total_coverage_error", "probability", Direction::ZeroBest,
             "gap-total coverage minus the level: below zero the draws understate the uncertainty of totals"}};
  }

  void compute(const ScoreInput& in, std::span<double> out) const override {
    std::fill(out.begin(), out.end(), std::numeric_limits<double>::quiet_NaN());
    const std::size_t n = in.truth.size(), m = in.draws.size();
    if (m == 0 || in.mask == nullptr || in.mask->size() != n) return;
    for (const auto& path : in.draws)
      if (path.size() != n) return;
    std::vector<double> sample(m), totals(m);
    std::size_t scored = 0, inside = 0, gaps = 0, gaps_inside = 0;
    double crps_sum = 0, true_total = 0;
    bool in_gap = false;
    const auto close_gap = [&] {
      std::sort(totals.begin(), totals.end());
      const auto iv = stats::sorted_central_interval(totals, level_);
      gaps_inside += (true_total >= iv.low && true_total <= iv.high) ? 1 : 0;
      ++gaps;
      in_gap = false;
    };
    for (std::size_t t = 0; t < n; ++t) {
      const bool scored_point = (*in.mask)[t] && !std::isnan(in.truth[t]);
      if (!scored_point) {
        if (in_gap) close_gap();
        continue;
      }
      if (!in_gap) {
        std::fill(totals.begin(), totals.end(), 0.0);
        true_total = 0;
        in_gap = true;
      }
      for (std::size_t k = 0; k < m; ++k) {
        sample[k] = in.draws[k][t];
        if (!std::isfinite(sample[k])) return;
        totals[k] += sample[k];
      }
      const double y = in.truth[t];
      true_total += y;
      std::sort(sample.begin(), sample.end());
      crps_sum += stats::sorted_sample_crps(sample, y);
      const auto iv = stats::sorted_central_interval(sample, level_);
      inside += (y >= iv.low && y <= iv.high) ? 1 : 0;
      ++scored;
    }
    if (in_gap) close_gap();
    if (scored == 0) return;
    out[0] = crps_sum / static_cast<double>(scored);
    out[1] = static_cast<double>(inside) / static_cast<double>(scored);
    out[2] = out[1] - level_;
    out[3] = static_cast<double>(gaps_inside) / static_cast<double>(gaps);
    out[4] = out[3] - level_;
  }

private:
  double level_;
};

const Registration<Metric> registration{{
    .name = "sample",
    .summary = "scores of the method's draws (methods with draws=M): sample_crps, sample_coverage(_error), "
               "gap_total_coverage(_error)",
    .params = {interval_level_param("probability of the central intervals (of each point's draws, of each gap's totals)")},
    .make = [](const ParamValues& p) { return std::make_unique<SampleScores>(p.real("level")); },
}};

}  // namespace
}  // namespace gapmark
