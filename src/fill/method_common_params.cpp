// The parameters every fill method takes, applied by generic wrappers around
// the method rather than by each method:
//
//   period=N        (methods that use a period) replaces the data's period, so
//                   one spec can compare seasonal-mean:period=24 and :period=168;
//   transform=log|log1p  fills on the transformed scale and maps the fills back
//                   (exp, expm1); variances by the delta method,
//                   Var(x) ~ (dx/dy)^2 Var(y) = exp(2y) Var(y) for both;
//                   a back-transformed fill is the median of a symmetric
//                   fill on the transformed scale, not its mean;
//   bounds=LO,HI    moves filled values below LO up to LO and above HI down to
//                   HI (either side may be empty: open) and counts them.
//
// Observed values always come back exactly as given (a log round trip would
// change their last bits), and sibling series are passed as they are.
#include <algorithm>
#include <cmath>
#include <limits>
#include <utility>

#include "gapmark/error.hpp"
#include "gapmark/fill/method.hpp"
#include "gapmark/number_format.hpp"

namespace gapmark {
namespace {

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

class PeriodOverride final : public FillMethod {
public:
  PeriodOverride(std::unique_ptr<FillMethod> inner, std::size_t period) : inner_(std::move(inner)), period_(period) {}
  FillResult fill(const FillRequest& request) const override {
    FillRequest r = request;
    r.period = period_;
    return inner_->fill(r);
  }

private:
  std::unique_ptr<FillMethod> inner_;
  std::size_t period_;
};

class Transformed final : public FillMethod {
public:
  Transformed(std::unique_ptr<FillMethod> inner, bool log1p) : inner_(std::move(inner)), log1p_(log1p) {}
  FillResult fill(const FillRequest& request) const override {
    const std::string name = log1p_ ? "log1p" : "log";
    std::vector<double> y(request.values.size(), kNaN);
    for (std::size_t i = 0; i < y.size(); ++i) {
      const double v = request.values[i];
      if (std::isnan(v)) continue;
      if (log1p_ ? !(v > -1) : !(v > 0))
        throw MethodFailure("transform=" + name + " needs values " + (log1p_ ? "above -1" : "above 0") +
                            "; point " + std::to_string(i) + " is " + format_double(v) +
                            (log1p_ ? "" : " (transform=log1p takes zeros)"));
      y[i] = log1p_ ? std::log1p(v) : std::log(v);
    }
    FillRequest r = request;
    r.values = y;
    FillResult out = inner_->fill(r);
    if (out.values.size() != y.size()) return out;  // the caller reports the wrong length
    for (std::size_t i = 0; i < y.size(); ++i) {
      if (!std::isnan(request.values[i])) {
        out.values[i] = request.values[i];
        if (!out.variance.empty()) out.variance[i] = 0;
        continue;
      }
      const double f = out.values[i];
      const double back = std::isfinite(f) ? (log1p_ ? std::expm1(f) : std::exp(f)) : kNaN;
      out.values[i] = std::isfinite(back) ? back : kNaN;
      if (!out.variance.empty() && i < out.variance.size()) {
        const double slope = std::isfinite(f) ? std::exp(f) : kNaN;  // d/dy of exp and of expm1
        const double v = slope * slope * out.variance[i];
        out.variance[i] = std::isfinite(out.values[i]) && std::isfinite(v) ? v : kNaN;
      }
    }
    // draws map back exactly: a sample on the transformed scale, transformed, is a sample on the original one
    for (auto& path : out.draws)
      for (std::size_t i = 0; i < path.size() && i < y.size(); ++i) {
        if (!std::isnan(request.values[i])) {
          path[i] = request.values[i];
          continue;
        }
        const double back = std::isfinite(path[i]) ? (log1p_ ? std::expm1(path[i]) : std::exp(path[i])) : kNaN;
        path[i] = std::isfinite(back) ? back : kNaN;
      }
    return out;
  }

private:
  std::unique_ptr<FillMethod> inner_;
  bool log1p_;
};

class Bounded final : public FillMethod {
public:
  Bounded(std::unique_ptr<FillMethod> inner, double lo, double hi) : inner_(std::move(inner)), lo_(lo), hi_(hi) {}
  FillResult fill(const FillRequest& request) const override {
    FillResult out = inner_->fill(request);
    const std::size_t n = std::min(out.values.size(), request.values.size());
    for (std::size_t i = 0; i < n; ++i) {
      if (!std::isnan(request.values[i])) continue;
      double& v = out.values[i];
      if (!std::isfinite(v)) continue;
      if (v < lo_) v = lo_, ++out.clipped;
      else if (v > hi_) v = hi_, ++out.clipped;
    }
    // draws are kept within the same bounds (not counted: `clipped` is about the fill)
    for (auto& path : out.draws)
      for (std::size_t i = 0; i < std::min(path.size(), request.values.size()); ++i)
        if (std::isnan(request.values[i]) && std::isfinite(path[i])) path[i] = std::clamp(path[i], lo_, hi_);
    return out;
  }

private:
  std::unique_ptr<FillMethod> inner_;
  double lo_, hi_;
};

/// "LO,HI" with either side possibly empty (open).
std::pair<double, double> parse_bounds(const std::string& text) {
  const auto comma = text.find(',');
  const std::string where = "bounds";
  if (comma == std::string::npos || text.find(',', comma + 1) != std::string::npos)
    throw InputError(where, "expected LO,HI (either may be empty), found '" + text + "'");
  const auto side = [&](const std::string& s, double open) {
    if (trim(s).empty()) return open;
    const auto v = parse_double(std::string(trim(s)));
    if (!v || !std::isfinite(*v)) throw InputError(where, "expected a number, found '" + s + "' in '" + text + "'");
    return *v;
  };
  const double inf = std::numeric_limits<double>::infinity();
  const double lo = side(text.substr(0, comma), -inf), hi = side(text.substr(comma + 1), inf);
  if (!(lo < hi)) throw InputError(where, "LO must be below HI, found '" + text + "'");
  if (std::isinf(lo) && std::isinf(hi)) throw InputError(where, "give LO, HI or both, found '" + text + "'");
  return {lo, hi};
}

}  // namespace

std::vector<ParamSpec> FillMethod::common_params(const Needs& needs) {
  std::vector<ParamSpec> out;
  if (needs.period || needs.uses_period)
    out.push_back({.name = "period",
                   .type = ParamType::Integer,
                   .default_value = "0",
                   .min = 0,
                   .max = 1e7,
                   .choices = {},
                   .help = "seasonal period in time steps for this method; 0 = the data's period"});
  out.push_back({.name = "bounds",
                 .type = ParamType::Text,
                 .default_value = "",
                 .choices = {},
                 .help = "LO,HI: fills below LO or above HI are moved to the bound and counted (either side may be "
                         "empty, e.g. bounds=0,)"});
  out.push_back({.name = "transform",
                 .type = ParamType::Choice,
                 .default_value = "none",
                 .choices = {"none", "log", "log1p"},
                 .help = "fill on the log (values > 0) or log(1 + x) (values > -1) scale and transform back"});
  return out;
}

std::unique_ptr<FillMethod> FillMethod::wrap(std::unique_ptr<FillMethod> method, const ParamValues& values,
                                             const Needs& needs) {
  if ((needs.period || needs.uses_period) && values.given("period")) {
    const auto period = values.integer("period");
    if (period == 1) throw InputError("period", "a period is 0 (the data's) or at least 2, found 1");
    if (period >= 2) method = std::make_unique<PeriodOverride>(std::move(method), static_cast<std::size_t>(period));
  }
  if (values.text("transform") != "none")
    method = std::make_unique<Transformed>(std::move(method), values.text("transform") == "log1p");
  if (!values.text("bounds").empty()) {
    const auto [lo, hi] = parse_bounds(values.text("bounds"));
    method = std::make_unique<Bounded>(std::move(method), lo, hi);
  }
  return method;
}

std::size_t method_period(const Bound<FillMethod>& method, std::size_t data_period) {
  if (method.params.has("period") && method.params.given("period") && method.params.integer("period") >= 2)
    return static_cast<std::size_t>(method.params.integer("period"));
  return data_period;
}

void check_needs(const Bound<FillMethod>& method, const FillRequest& request) {
  FillRequest r = request;
  r.period = method_period(method, request.period);
  check_needs(method.entry->needs, r);
}

}  // namespace gapmark
