// Seasonally adjusted filling:
//   1. fill the gaps provisionally (straight lines, nearest value at the edges);
//   2. estimate the seasonal component of that series by classical additive
//      decomposition (see seasonal_decomposition.hpp; windows that hold
//      provisional values are avoided where a phase has others);
//   3. subtract it from the observed values and fill the adjusted series with
//      the inner method (any registered method, with its default parameters);
//   4. add the seasonal component back at the points the inner method filled.
// Observed values are returned unchanged.
#include <cmath>
#include <memory>
#include <string>
#include <vector>

#include "gapmark/fill/knots.hpp"
#include "gapmark/fill/method.hpp"
#include "gapmark/fill/seasonal_decomposition.hpp"

namespace gapmark {
namespace {

constexpr const char* kName = "seasonal-adjusted";
const Needs kNeeds{.period = true, .min_observed = 2};

class SeasonalAdjusted final : public FillMethod {
public:
  SeasonalAdjusted(const Entry<FillMethod>& inner, const ParamValues& inner_params)
      : inner_entry_(&inner), inner_(inner.make(inner_params)) {}

  FillResult fill(const FillRequest& request) const override {
    check_needs(kNeeds, request);
    const auto& x = request.values;
    const std::size_t n = x.size();
    const std::vector<double> provisional = provisional_linear(x);
    std::unique_ptr<bool[]> stand_in(new bool[n]);
    for (std::size_t i = 0; i < n; ++i) stand_in[i] = std::isnan(x[i]);
    const auto seasonal =
        classical_decomposition(provisional, request.period, {stand_in.get(), n}).seasonal;

    std::vector<double> adjusted(n);
    for (std::size_t i = 0; i < n; ++i) adjusted[i] = x[i] - seasonal[i];  // NaN stays NaN
    FillRequest inner_request = request;
    inner_request.values = adjusted;
    try {
      check_needs(inner_entry_->needs, inner_request);
    } catch (const MethodFailure& e) {
      throw MethodFailure("inner method " + inner_entry_->name + ": " + e.what());
    }
    FillResult inner = inner_->fill(inner_request);
    if (inner.values.size() != n) throw MethodFailure("inner method " + inner_entry_->name + " returned a wrong length");

    FillResult result;
    result.values.assign(x.begin(), x.end());
    for (std::size_t i = 0; i < n; ++i)
      if (std::isnan(x[i]) && !std::isnan(inner.values[i])) result.values[i] = inner.values[i] + seasonal[i];
    if (!inner.variance.empty()) result.variance = std::move(inner.variance);  // adding a fixed component keeps it
    return result;
  }

private:
  const Entry<FillMethod>* inner_entry_;
  std::unique_ptr<FillMethod> inner_;
};

std::unique_ptr<FillMethod> make(const ParamValues& p) {
  const std::string where = std::string(kName) + ": inner";
  const std::string& name = p.text("inner");
  if (name == kName) throw InputError(where, "the inner method cannot be " + std::string(kName) + " itself");
  const auto& entry = MethodRegistry::global().at(name, where);
  return std::make_unique<SeasonalAdjusted>(entry, bind_params(entry.params, CallSpec{name, {}}, where));
}

const Registration<FillMethod> registration{{
    .name = kName,
    .summary = "removes a classical seasonal estimate, fills with an inner method, adds it back",
    .params = {{.name = "inner", .type = ParamType::Text, .default_value = "linear", .choices = {},
                .help = "registered method (default parameters) that fills the adjusted series"}},
    .needs = kNeeds,
    .make = make,
}};

}  // namespace
}  // namespace gapmark
