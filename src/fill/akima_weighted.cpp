// akima-weighted: Akima interpolation with modified slope weights through the observed points (knots at their
// indices): Akima's (1970) local cubic Hermite scheme, whose knot slopes are
// weighted means of the neighbouring secant slopes, with the modified weights
// w1 = |m[i+1] - m[i]| + |m[i+1] + m[i]|/2, w2 = |m[i-1] - m[i-2]| + |m[i-1] + m[i-2]|/2
// that avoid overshoot on flat stretches. Ends use Akima's quadratic
// extrapolation of two extra secant slopes on each side. The slopes and the
// curve come from Boost.Math (its class for this scheme), which needs at least four knots; with
// fewer observed points the method fails with that reason. Gaps outside the
// observed span follow the edges policy.
#include <algorithm>
#include <boost/math/interpolators/makima.hpp>
#include <cmath>
#include <vector>

#include "knots.hpp"
#include "gapmark/fill/method.hpp"

namespace gapmark {
namespace {

const Needs kNeeds{.min_observed = 4};

class AkimaWeighted final : public FillMethod {
public:
  explicit AkimaWeighted(std::string edges) : edges_(std::move(edges)) {}

  FillResult fill(const FillRequest& request) const override {
    check_needs(kNeeds, request);  // Boost.Math needs four knots
    Knots k = observed_knots(request.values);
    // The slope weights multiply slopes by slopes, which overflows for values
    // beyond ~1e154 and vanishes below ~1e-154. The curve scales with the
    // data, so such values are first multiplied by a power of two (exact)
    // that brings the largest magnitude near 1, and the curve scaled back.
    double largest = 0;
    for (double y : k.y) largest = std::max(largest, std::abs(y));
    const int exponent = largest > 1e100 || (largest > 0 && largest < 1e-100) ? std::ilogb(largest) : 0;
    for (double& y : k.y) y = std::ldexp(y, -exponent);
    const boost::math::interpolators::makima<std::vector<double>> scaled(std::move(k.x), std::move(k.y));
    const auto curve = [&](double t) { return std::ldexp(scaled(t), exponent); };
    FillResult result;
    result.values = fill_inside_span(request.values, curve);
    apply_edges(result.values, edges_);
    return result;
  }

private:
  std::string edges_;
};

const Registration<FillMethod> registration{{
    .name = "akima-weighted",
    .summary = "Akima's cubic with modified slope weights through the observed points (local, little overshoot)",
    .params = {edges_param()},
    .needs = kNeeds,
    .make = [](const ParamValues& p) { return std::make_unique<AkimaWeighted>(p.text("edges")); },
}};

}  // namespace
}  // namespace gapmark
