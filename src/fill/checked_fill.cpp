#include "gapmark/fill/checked_fill.hpp"

#include <chrono>
#include <cmath>
#include <exception>

#include "gapmark/error.hpp"
#include "gapmark/interrupted.hpp"

namespace gapmark {

CheckedFill checked_fill(const Bound<FillMethod>& method, const FillRequest& request,
                         std::span<const std::uint8_t> targets) {
  const std::span<const double> given = request.values;
  const auto is_target = [&](std::size_t i) { return targets.empty() ? std::isnan(given[i]) : targets[i] != 0; };
  CheckedFill out;
  for (std::size_t i = 0; i < given.size(); ++i) out.targets += is_target(i) ? 1 : 0;
  FillResult result;
  const auto start = std::chrono::steady_clock::now();
  try {
    check_needs(method, request);
    result = method.impl->fill(request);
    if (result.values.size() != given.size())
      throw MethodFailure("returned " + std::to_string(result.values.size()) + " values for " +
                          std::to_string(given.size()) + " points");
  } catch (const MethodFailure& e) {
    out.failure = e.what();
    out.need = e.need();
    out.unfilled = out.targets;
    return out;
  } catch (const Interrupted&) {
    throw;  // not the method's failure: the caller leaves the work undone
  } catch (const std::exception& e) {
    out.failure = e.what();
    out.unfilled = out.targets;
    return out;
  }
  out.seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
  for (std::size_t i = 0; i < given.size(); ++i) {
    if (!std::isnan(given[i]) && result.values[i] != given[i]) {
      out.observed_changed = true;
      result.values[i] = given[i];
    }
    if (is_target(i) && !std::isfinite(result.values[i])) {
      result.values[i] = std::nan("");
      ++out.unfilled;
    }
  }
  out.clipped = result.clipped;
  out.values = std::move(result.values);
  out.variance = std::move(result.variance);
  out.fit = std::move(result.fit);
  out.draws = std::move(result.draws);
  return out;
}

}  // namespace gapmark
