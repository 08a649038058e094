// Linear interpolation between the observations on either side of a gap,
// on the regular time axis (so a gap of k steps is split into k+1 equal
// increments). Edge gaps follow the edges policy.
#include <cmath>

#include "inner_gaps.hpp"
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
    for_each_inner_gap(request.values, [&v](std::size_t left, std::size_t right) {
      const double a = v[left], b = v[right];
      const double span = static_cast<double>(right - left);
      for (std::size_t j = left + 1; j < right; ++j) {
        const double t = static_cast<double>(j - left) / span;
        v[j] = (1.0 - t) * a + t * b;  // no overflow even for values near the double limits
      }
    });
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
