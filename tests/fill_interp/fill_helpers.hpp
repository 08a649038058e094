#pragma once
// Helpers for the fill-method tests: bind a method from its call text through
// the registry (as a spec would) and run it on a vector with NaN gaps.
#include <cmath>
#include <limits>
#include <string>
#include <vector>

#include "gapmark/fill/method.hpp"
#include "gapmark/params.hpp"
#include "gapmark/time_axis.hpp"

namespace gapmark::test {

inline constexpr double NA = std::numeric_limits<double>::quiet_NaN();

inline Bound<FillMethod> bind_method(const std::string& call) {
  return MethodRegistry::global().bind(CallSpec::parse(call, "test"), "test");
}

/// Runs the method named by `call` the way the harness does: needs first, then fill.
inline std::vector<double> run_fill(const std::string& call, const std::vector<double>& values,
                                    std::size_t period = 0) {
  const auto bound = bind_method(call);
  const TimeAxis axis = TimeAxis::index(values.size());
  FillRequest request;
  request.values = values;
  request.axis = &axis;
  request.period = period;
  check_needs(bound.entry->needs, request);
  return bound.impl->fill(request).values;
}

/// |a - b| <= tol * max(|b|, scale): relative, with `scale` as a floor for
/// values near zero.
inline bool close(double a, double b, double tol, double scale) {
  return std::abs(a - b) <= tol * std::max(std::abs(b), scale);
}

}  // namespace gapmark::test
