// Linear interpolation between the observations on either side of a gap,
// on the regular time axis (so a gap of k steps is split into k+1 equal
// increments). Edge gaps follow the edges policy.
#include <cmath>

#include "gapmark/fill/method.hpp"

namespace gapmark {
namespace {

class Linear final : public FillMethod {
public:
  explicit Linear(bool edges_nearest) : edges_nearest_(edges_nearest) {}

  FillResult fill(const FillRequest& request) const override {
    FillResult result;
    auto& v = result.values;
    v.assign(request.values.begin(), request.values.end());
    const std::size_t n = v.size();
    std::size_t left = n;  // last observed index seen, n = none yet
    for (std::size_t i = 0; i < n; ++i) {
      if (std::isnan(v[i])) continue;
      if (left != n && i - left > 1) {
        const double a = v[left], b = v[i];
        const double span = static_cast<double>(i - left);
        for (std::size_t j = left + 1; j < i; ++j) {
          const double t = static_cast<double>(j - left) / span;
          v[j] = (1.0 - t) * a + t * b;  // no overflow even for values near the double limits
        }
      }
      left = i;
    }
    if (edges_nearest_) fill_edges_nearest(v);
    return result;
  }

private:
  bool edges_nearest_;
};

const Registration<FillMethod> registration{{
    .name = "linear",
    .summary = "straight line between the observations on either side of each gap",
    .params = {edges_param()},
    .make = [](const ParamValues& p) { return std::make_unique<Linear>(p.text("edges") == "nearest"); },
}};

}  // namespace
}  // namespace gapmark
