// Carrying observations across gaps: forward (last observation carried
// forward, LOCF) and backward (next observation carried backward, NOCB).
// The side a carry cannot reach (before the first observation for forward,
// after the last for backward) follows the edges policy: the nearest
// observed value, or left empty.
#include <algorithm>
#include <cmath>

#include "inner_gaps.hpp"
#include "gapmark/fill/method.hpp"

namespace gapmark {
namespace {

class Carry final : public FillMethod {
public:
  Carry(bool forward, bool edges_nearest) : forward_(forward), edges_nearest_(edges_nearest) {}

  FillResult fill(const FillRequest& request) const override {
    FillResult result;
    auto& v = result.values;
    v.assign(request.values.begin(), request.values.end());
    const std::size_t n = v.size();
    for_each_inner_gap(request.values, [&v, this](std::size_t left, std::size_t right) {
      std::fill(v.begin() + static_cast<std::ptrdiff_t>(left) + 1, v.begin() + static_cast<std::ptrdiff_t>(right),
                forward_ ? v[left] : v[right]);
    });
    // The end the carry runs into: after the last observation going forward,
    // before the first going backward.
    if (forward_) {
      std::size_t last = n;
      while (last > 0 && std::isnan(v[last - 1])) --last;
      if (last > 0) std::fill(v.begin() + static_cast<std::ptrdiff_t>(last), v.end(), v[last - 1]);
    } else {
      std::size_t first = 0;
      while (first < n && std::isnan(v[first])) ++first;
      if (first < n) std::fill(v.begin(), v.begin() + static_cast<std::ptrdiff_t>(first), v[first]);
    }
    if (edges_nearest_) fill_edges_nearest(v);
    return result;
  }

private:
  bool forward_;
  bool edges_nearest_;
};

std::unique_ptr<FillMethod> make(bool forward, const ParamValues& p) {
  return std::make_unique<Carry>(forward, p.text("edges") == "nearest");
}

const Registration<FillMethod> forward_registration{{
    .name = "carry-forward",
    .summary = "last observation carried forward (LOCF): a gap keeps the value before it",
    .params = {edges_param()},
    .make = [](const ParamValues& p) { return make(true, p); },
}};

const Registration<FillMethod> backward_registration{{
    .name = "carry-backward",
    .summary = "next observation carried backward (NOCB): a gap takes the value after it",
    .params = {edges_param()},
    .make = [](const ParamValues& p) { return make(false, p); },
}};

}  // namespace
}  // namespace gapmark
