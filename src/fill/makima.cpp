// Modified Akima interpolation through the observed points (knots at their
// indices): Akima's (1970) local cubic Hermite scheme, whose knot slopes are
// weighted means of the neighbouring secant slopes, with the modified weights
// w1 = |m[i+1] - m[i]| + |m[i+1] + m[i]|/2, w2 = |m[i-1] - m[i-2]| + |m[i-1] + m[i-2]|/2
// that avoid overshoot on flat stretches. Ends use Akima's quadratic
// extrapolation of two extra secant slopes on each side. The slopes and the
// curve come from Boost.Math's makima, which needs at least four knots; with
// fewer observed points the method fails with that reason. Gaps outside the
// observed span follow the edges policy.
#include <boost/math/interpolators/makima.hpp>
#include <cmath>
#include <vector>

#include "gapmark/fill/knots.hpp"
#include "gapmark/fill/method.hpp"

namespace gapmark {
namespace {

const Needs kNeeds{.min_observed = 4};

class Makima final : public FillMethod {
public:
  explicit Makima(std::string edges) : edges_(std::move(edges)) {}

  FillResult fill(const FillRequest& request) const override {
    check_needs(kNeeds, request);  // Boost's makima needs four knots
    Knots k = observed_knots(request.values);
    const boost::math::interpolators::makima<std::vector<double>> curve(std::move(k.x), std::move(k.y));
    FillResult result;
    result.values = fill_inside_span(request.values, curve);
    apply_edges(result.values, edges_);
    return result;
  }

private:
  std::string edges_;
};

const Registration<FillMethod> registration{{
    .name = "makima",
    .summary = "modified Akima cubic through the observed points (local, little overshoot)",
    .params = {edges_param()},
    .needs = kNeeds,
    .make = [](const ParamValues& p) { return std::make_unique<Makima>(p.text("edges")); },
}};

}  // namespace
}  // namespace gapmark
