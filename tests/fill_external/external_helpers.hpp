#pragma once
// Helpers for the external-method tests: the helper programs are sh/awk
// scripts beside these tests (always present on Debian, so CI needs nothing
// extra), bound through the registry as a spec would bind them.
#include <cmath>
#include <limits>
#include <string>
#include <vector>

#include "gapmark/fill/method.hpp"
#include "gapmark/params.hpp"
#include "gapmark/time_axis.hpp"

namespace gapmark::test {

inline constexpr double NA = std::numeric_limits<double>::quiet_NaN();

/// "sh '<tests/fill_external>/<script>'" followed by `args`.
inline std::string helper_command(const std::string& script, const std::string& args = "") {
  std::string cmd = "sh '" + std::string(GAPMARK_SOURCE_DIR) + "/tests/fill_external/" + script + "'";
  return args.empty() ? cmd : cmd + " " + args;
}

/// Binds "external" with the given command and extra key=value arguments
/// (the command may hold commas, so the call is built as a spec object would be).
inline Bound<FillMethod> bind_external(const std::string& command,
                                       std::vector<std::pair<std::string, std::string>> extra = {}) {
  CallSpec call;
  call.name = "external";
  call.args.emplace_back("command", command);
  for (auto& kv : extra) call.args.push_back(std::move(kv));
  return MethodRegistry::global().bind(call, "test");
}

inline FillResult run_bound(const Bound<FillMethod>& method, const std::vector<double>& values,
                            const TimeAxis& axis, std::size_t period = 0) {
  FillRequest request;
  request.values = values;
  request.axis = &axis;
  request.period = period;
  check_needs(method.entry->needs, request);
  return method.impl->fill(request);
}

inline FillResult run_bound(const Bound<FillMethod>& method, const std::vector<double>& values) {
  const TimeAxis axis = TimeAxis::index(values.size());
  return run_bound(method, values, axis);
}

/// Bitwise-equal vectors, NaN equal to NaN.
inline bool same_values(const std::vector<double>& a, const std::vector<double>& b) {
  if (a.size() != b.size()) return false;
  for (std::size_t i = 0; i < a.size(); ++i) {
    if (std::isnan(a[i]) && std::isnan(b[i])) continue;
    if (a[i] != b[i]) return false;
  }
  return true;
}

/// A wavy invented series of n points with gaps of varied length.
inline std::vector<double> gappy_series(std::size_t n) {
  std::vector<double> v(n);
  for (std::size_t i = 0; i < n; ++i) {
    const double t = static_cast<double>(i);
    v[i] = 12.5 + 3.0 * std::sin(t / 7.0) + 0.01 * t;
    if (i % 11 == 3 || i % 17 < 3 || i % 97 < 9) v[i] = NA;
  }
  v[0] = NA;  // a leading and a trailing gap for the edge policy
  if (n > 1) v[n - 1] = NA;
  return v;
}

}  // namespace gapmark::test
