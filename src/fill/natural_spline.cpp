// Natural cubic spline through the observed points (knots at their indices on
// the time axis, so gaps make the knots uneven): a C2 piecewise cubic with
// zero second derivative at the first and last knot. The second derivatives
// at the inner knots solve a symmetric positive definite tridiagonal system,
// solved by LAPACK's dptsv (an L D L' factorisation of the tridiagonal: O(n)).
// Gaps inside the observed span are read off the spline; gaps before the
// first or after the last observation follow the edges policy.
#include <cmath>
#include <limits>
#include <vector>

#include "knots.hpp"
#include "gapmark/fill/method.hpp"
#include "interpolating_method.hpp"

// LAPACK (Fortran interface): solves A X = B for a symmetric positive
// definite tridiagonal A (diagonal d, off-diagonal e); B is overwritten by X.
extern "C" void dptsv_(const int* n, const int* nrhs, double* d, double* e, double* b, const int* ldb, int* info);

namespace gapmark {
namespace {

const Needs kNeeds{.min_observed = 2};

/// Second derivatives of the natural cubic spline through (x, y); zero at both ends.
std::vector<double> natural_second_derivatives(const Knots& k) {
  const std::size_t m = k.size();
  std::vector<double> M(m, 0.0);
  if (m < 3) return M;
  const std::size_t inner = m - 2;
  if (inner > static_cast<std::size_t>(std::numeric_limits<int>::max()))
    throw MethodFailure("natural spline: too many knots for one system");
  // Row i - 1 of the system: h0 M[i-1] + 2 (h0 + h1) M[i] + h1 M[i+1] = 6 (d1 - d0).
  std::vector<double> diagonal(inner), off(inner > 1 ? inner - 1 : 1), rhs(inner);
  for (std::size_t i = 1; i + 1 < m; ++i) {
    const double h0 = k.x[i] - k.x[i - 1], h1 = k.x[i + 1] - k.x[i];
    const double d0 = (k.y[i] - k.y[i - 1]) / h0, d1 = (k.y[i + 1] - k.y[i]) / h1;
    diagonal[i - 1] = 2.0 * (h0 + h1);
    if (i + 2 < m) off[i - 1] = h1;
    rhs[i - 1] = 6.0 * (d1 - d0);
  }
  const int n = static_cast<int>(inner), one = 1;
  int info = 0;
  dptsv_(&n, &one, diagonal.data(), off.data(), rhs.data(), &n, &info);
  if (info != 0) throw MethodFailure("natural spline: the knot system could not be factored");
  for (std::size_t i = 0; i < inner; ++i) {
    if (!std::isfinite(rhs[i]))
      throw MethodFailure("natural spline: the knot system has no finite solution (values too large?)");
    M[i + 1] = rhs[i];
  }
  return M;
}

/// The spline's values at the gap points inside the observed span. Knots are
/// indices, so the gap points between knots j and j+1 are the integers
/// strictly between them: one pass over the intervals, O(n).
std::vector<double> spline_inside_span(std::span<const double> values) {
  const Knots k = observed_knots(values);
  const std::vector<double> M = natural_second_derivatives(k);
  std::vector<double> out(values.begin(), values.end());
  for (std::size_t j = 0; j + 1 < k.size(); ++j) {
    const double x0 = k.x[j], x1 = k.x[j + 1], h = x1 - x0;
    for (auto i = static_cast<std::size_t>(x0) + 1; i < static_cast<std::size_t>(x1); ++i) {
      const double t = static_cast<double>(i) - x0, u = x1 - static_cast<double>(i);
      out[i] = (M[j] * u * u * u + M[j + 1] * t * t * t) / (6.0 * h) + (k.y[j] / h - M[j] * h / 6.0) * u +
               (k.y[j + 1] / h - M[j + 1] * h / 6.0) * t;
    }
  }
  return out;
}

const Registration<FillMethod> registration{{
    .name = "natural-spline",
    .summary = "natural cubic spline through the observed points (smooth, may overshoot)",
    .params = {edges_param()},
    .needs = kNeeds,
    .make = [](const ParamValues& p) { return interpolating_method(spline_inside_span, p); },
}};

}  // namespace
}  // namespace gapmark
