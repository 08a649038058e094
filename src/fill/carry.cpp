// Carrying observations across gaps: forward (last observation carried
// forward, LOCF) and backward (next observation carried backward, NOCB).
// The side a carry cannot reach (before the first observation for forward,
// after the last for backward) follows the edges policy: the nearest
// observed value, or left empty.
#include <cmath>

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
    if (forward_) {
      for (std::size_t i = 1; i < n; ++i)
        if (std::isnan(v[i])) v[i] = v[i - 1];
    } else {
      for (std::size_t i = n; i-- > 1;)
        if (std::isnan(v[i - 1])) v[i - 1] = v[i];
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
