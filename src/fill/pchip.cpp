// PCHIP: the monotone piecewise cubic Hermite interpolant of Fritsch and
// Carlson (1980) through the observed points (knots at their indices).
// Inner-knot slopes are the weighted harmonic mean of the neighbouring secant
// slopes, or 0 where they differ in sign or one is 0 (Fritsch & Butland's
// weights, as used by Boost.Math's pchip). The end slopes use the one-sided
// three-point estimate with its shape-preserving limits (set to 0 when its
// sign differs from the end secant; capped at 3 times the end secant when
// the first two secants differ in sign), the end rule of
// scipy.interpolate.PchipInterpolator. Boost.Math's own default end slope is
// the plain end secant, so the end slopes are computed here and handed to
// Boost's constructor. Boost's pchip needs four knots; with two or three the
// same slope rules feed Boost's cubic_hermite (two knots: a straight line).
// Gaps outside the observed span follow the edges policy.
//
// Debian's Boost 1.74 pchip.hpp calls unqualified isnan: <math.h> must come
// first for it to compile.
#include <math.h>  // NOLINT(modernize-deprecated-headers): before pchip.hpp, see above

#include <boost/math/interpolators/cubic_hermite.hpp>
#include <boost/math/interpolators/pchip.hpp>
#include <cmath>
#include <functional>
#include <vector>

#include "knots.hpp"
#include "gapmark/fill/method.hpp"
#include "interpolating_method.hpp"

namespace gapmark {
namespace {

const Needs kNeeds{.min_observed = 2};

int sign(double v) { return (v > 0) - (v < 0); }

/// One-sided three-point slope at an end knot, with the shape-preserving
/// limits. h0, m0: width and secant slope of the end interval; h1, m1: of the
/// interval next to it.
double end_slope(double h0, double h1, double m0, double m1) {
  const double d = ((2.0 * h0 + h1) * m0 - h0 * m1) / (h0 + h1);
  if (sign(d) != sign(m0)) return 0.0;
  if (sign(m0) != sign(m1) && std::abs(d) > 3.0 * std::abs(m0)) return 3.0 * m0;
  return d;
}

/// Slope at an inner knot between intervals (h0, m0) and (h1, m1).
double inner_slope(double h0, double h1, double m0, double m1) {
  if (m0 == 0.0 || m1 == 0.0 || sign(m0) != sign(m1)) return 0.0;
  const double w1 = 2.0 * h1 + h0, w2 = h1 + 2.0 * h0;
  return (w1 + w2) / (w1 / m0 + w2 / m1);
}

std::function<double(double)> pchip_curve(Knots k) {
  using boost::math::interpolators::cubic_hermite;
  using boost::math::interpolators::pchip;
  const std::size_t n = k.size();
  std::vector<double> h(n - 1), m(n - 1);
  for (std::size_t i = 0; i + 1 < n; ++i) {
    h[i] = k.x[i + 1] - k.x[i];
    m[i] = (k.y[i + 1] - k.y[i]) / h[i];
  }
  if (n == 2) {
    cubic_hermite<std::vector<double>> line(std::move(k.x), std::move(k.y), {m[0], m[0]});
    return line;
  }
  const double left = end_slope(h[0], h[1], m[0], m[1]);
  const double right = end_slope(h[n - 2], h[n - 3], m[n - 2], m[n - 3]);
  if (n == 3) {
    std::vector<double> s{left, inner_slope(h[0], h[1], m[0], m[1]), right};
    cubic_hermite<std::vector<double>> curve(std::move(k.x), std::move(k.y), std::move(s));
    return curve;
  }
  pchip<std::vector<double>> curve(std::move(k.x), std::move(k.y), left, right);
  return curve;
}

const Registration<FillMethod> registration{{
    .name = "pchip",
    .summary = "monotone piecewise cubic Hermite through the observed points (no overshoot)",
    .params = {edges_param()},
    .needs = kNeeds,
    .make =
        [](const ParamValues& p) {
          return interpolating_method(
              [](std::span<const double> values) {
                return fill_inside_span(values, pchip_curve(observed_knots(values)));
              },
              p);
        },
}};

}  // namespace
}  // namespace gapmark
