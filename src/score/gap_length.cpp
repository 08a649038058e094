// Error by gap length: RMSE on the masked points split by the length of the
// gap each point sits in, so a report can show how a method degrades from
// single missing points to long outages.
//
// A point's gap is the maximal run of consecutive missing values in the
// series the method was given: masked points and the series' own missing
// values together, since a method sees no difference between them. Only the
// masked points of the run are scored (the series' own gaps have no truth).
// Three classes, bounds set by parameters:
//   short   length <= short_max              (default 1: isolated points)
//   medium  short_max < length < long_min    (default 2..6)
//   long    length >= long_min               (default 7 and longer)
// (with long_min <= short_max + 1 the medium class is empty and every gap
// longer than short_max is long).
// A class with no scored point in a trial is n/a for that trial. Masked
// points the method left empty are not scored (the runner counts them).
#include <algorithm>
#include <cmath>
#include <limits>

#include "gapmark/score/metric.hpp"

namespace gapmark {
namespace {

class ErrorByGapLength final : public Metric {
public:
  ErrorByGapLength(std::size_t short_max, std::size_t long_min) : short_max_(short_max), long_min_(long_min) {}

  std::vector<MetricColumn> columns() const override {
    const std::string s = short_max_ == 1 ? "1" : "1.." + std::to_string(short_max_);
    const std::string medium = long_min_ <= short_max_ + 1 ? "(none with these bounds)"
                               : short_max_ + 2 == long_min_
                                   ? std::to_string(short_max_ + 1)
                                   : std::to_string(short_max_ + 1) + ".." + std::to_string(long_min_ - 1);
    return {{"rmse_gap_short", "value", Direction::Lower,
             "root mean squared error on masked points in gaps of length " + s},
            {"rmse_gap_medium", "value", Direction::Lower,
             "root mean squared error on masked points in gaps of length " + medium},
            {"rmse_gap_long", "value", Direction::Lower,
             "root mean squared error on masked points in gaps of length " +
                 std::to_string(std::max(long_min_, short_max_ + 1)) + " or more"}};
  }

  void compute(const ScoreInput& in, std::span<double> out) const override {
    const double nan = std::numeric_limits<double>::quiet_NaN();
    double sq[3] = {0, 0, 0};
    std::size_t count[3] = {0, 0, 0};
    const std::size_t n = in.truth.size();
    if (in.mask == nullptr || in.mask->size() != n || in.filled.size() != n) {
      for (auto& o : out) o = nan;
      return;
    }
    const Mask& mask = *in.mask;
    auto missing = [&](std::size_t i) { return mask[i] != 0 || std::isnan(in.truth[i]); };
    // Calls visit(class, error) for every scored point.
    const auto each_error = [&](const auto& visit) {
      for (std::size_t i = 0; i < n;) {
        if (!missing(i)) {
          ++i;
          continue;
        }
        std::size_t end = i;
        while (end < n && missing(end)) ++end;
        const std::size_t length = end - i;
        const std::size_t cls = length <= short_max_ ? 0 : length < long_min_ ? 1 : 2;
        for (std::size_t k = i; k < end; ++k)
          if (mask[k] && !std::isnan(in.filled[k]) && !std::isnan(in.truth[k])) visit(cls, in.filled[k] - in.truth[k]);
        i = end;
      }
    };
    double largest = 0;
    each_error([&](std::size_t cls, double e) {
      sq[cls] += e * e;
      ++count[cls];
      largest = std::max(largest, std::abs(e));
    });
    // Squares of errors beyond ~1e154 overflow and below ~1e-154 lose digits
    // or vanish: there the errors are first multiplied by a power of two
    // that brings the largest near 1 (exact), and the roots scaled back.
    int exponent = 0;
    if (std::isfinite(largest) && largest > 0 && (largest > 1e100 || largest < 1e-100)) {
      exponent = std::ilogb(largest);
      sq[0] = sq[1] = sq[2] = 0;
      each_error([&](std::size_t cls, double e) {
        const double scaled = std::ldexp(e, -exponent);
        sq[cls] += scaled * scaled;
      });
    }
    for (std::size_t c = 0; c < 3; ++c)
      out[c] = count[c] ? std::ldexp(std::sqrt(sq[c] / static_cast<double>(count[c])), exponent) : nan;
  }

private:
  std::size_t short_max_, long_min_;
};

const Registration<Metric> registration{{
    .name = "by_gap_length",
    .summary = "rmse on the masked points by the length of their gap: rmse_gap_short, rmse_gap_medium, "
               "rmse_gap_long",
    .params = {{.name = "short_max",
                .type = ParamType::Integer,
                .default_value = "1",
                .min = 1,
                .max = 100000,
                .choices = {},
                .help = "longest gap counted as short"},
               {.name = "long_min",
                .type = ParamType::Integer,
                .default_value = "7",
                .min = 2,
                .max = 100000,
                .choices = {},
                .help = "shortest gap counted as long; medium is empty unless long_min >= short_max + 2"}},
    .make = [](const ParamValues& p) {
      return std::make_unique<ErrorByGapLength>(static_cast<std::size_t>(p.integer("short_max")),
                                                static_cast<std::size_t>(p.integer("long_min")));
    },
}};

}  // namespace
}  // namespace gapmark
