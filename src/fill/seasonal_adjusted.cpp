// Seasonally adjusted filling:
//   1. fill the gaps provisionally (straight lines, nearest value at the edges);
//   2. estimate the seasonal component of that series by classical additive
//      decomposition (windows that hold provisional values are avoided where
//      a phase has others) or by STL without robustness weights (see
//      seasonal_decomposition.hpp);
//   3. subtract it from the observed values and fill the adjusted series with
//      the inner method (any registered method, with its default parameters);
//   4. add the seasonal component back at the points the inner method filled.
// With rounds > 1, steps 2-4 are repeated, each time estimating the season on
// the series as filled by the previous round, so that the provisional straight
// lines bend the seasonal estimate less and less.
// Observed values are returned unchanged.
#include <cmath>
#include <memory>
#include <string>
#include <vector>

#include "knots.hpp"
#include "gapmark/fill/method.hpp"
#include "gapmark/fill/seasonal_decomposition.hpp"

namespace gapmark {
namespace {

constexpr const char* kName = "seasonal-adjusted";
const Needs kNeeds{.period = true, .min_observed = 2};

class SeasonalAdjusted final : public FillMethod {
public:
  SeasonalAdjusted(const Entry<FillMethod>& inner, const ParamValues& inner_params, bool stl, std::size_t rounds)
      : inner_entry_(&inner), inner_(inner.make(inner_params)), stl_(stl), rounds_(rounds) {}

  FillResult fill(const FillRequest& request) const override {
    check_needs(kNeeds, request);
    const auto& x = request.values;
    const std::size_t n = x.size();
    std::unique_ptr<bool[]> stand_in(new bool[n]);
    for (std::size_t i = 0; i < n; ++i) stand_in[i] = std::isnan(x[i]);

    std::vector<double> current = provisional_linear(x), adjusted(n);
    FillResult inner;
    for (std::size_t round = 0; round < rounds_; ++round) {
      const auto seasonal = stl_ ? stl_decomposition(current, request.period).seasonal
                                 : classical_decomposition(current, request.period, {stand_in.get(), n}).seasonal;
      for (std::size_t i = 0; i < n; ++i) adjusted[i] = x[i] - seasonal[i];  // NaN stays NaN
      inner = fill_inner(request, adjusted);
      for (std::size_t i = 0; i < n; ++i)
        if (stand_in[i] && !std::isnan(inner.values[i])) current[i] = inner.values[i] + seasonal[i];
    }

    FillResult result;
    result.values.assign(x.begin(), x.end());
    for (std::size_t i = 0; i < n; ++i)
      if (stand_in[i] && !std::isnan(inner.values[i])) result.values[i] = current[i];
    if (!inner.variance.empty()) result.variance = std::move(inner.variance);  // adding a fixed component keeps it
    return result;
  }

private:
  FillResult fill_inner(const FillRequest& request, const std::vector<double>& adjusted) const {
    FillRequest inner_request = request;
    inner_request.values = adjusted;
    try {
      check_needs(inner_entry_->needs, inner_request);
    } catch (const MethodFailure& e) {
      throw MethodFailure("inner method " + inner_entry_->name + ": " + e.what());
    }
    FillResult inner = inner_->fill(inner_request);
    if (inner.values.size() != adjusted.size())
      throw MethodFailure("inner method " + inner_entry_->name + " returned a wrong length");
    return inner;
  }

  const Entry<FillMethod>* inner_entry_;
  std::unique_ptr<FillMethod> inner_;
  bool stl_;
  std::size_t rounds_;
};

std::unique_ptr<FillMethod> make(const ParamValues& p) {
  const std::string where = std::string(kName) + ": inner";
  const std::string& name = p.text("inner");
  if (name == kName) throw InputError(where, "the inner method cannot be " + std::string(kName) + " itself");
  const auto& entry = MethodRegistry::global().at(name, where);
  return std::make_unique<SeasonalAdjusted>(entry, bind_params(entry.params, CallSpec{name, {}}, where),
                                            p.text("decomposition") == "stl",
                                            static_cast<std::size_t>(p.integer("rounds")));
}

const Registration<FillMethod> registration{{
    .name = kName,
    .summary = "removes a seasonal estimate, fills the rest with an inner method, adds it back",
    .params = {{.name = "inner", .type = ParamType::Text, .default_value = "linear", .choices = {},
                .help = "registered method (default parameters) that fills the adjusted series"},
               {.name = "decomposition", .type = ParamType::Choice, .default_value = "classical",
                .choices = {"classical", "stl"},
                .help = "seasonal estimate: classical moving-average decomposition, or STL (not robust)"},
               {.name = "rounds", .type = ParamType::Integer, .default_value = "3", .min = 1, .max = 20,
                .choices = {},
                .help = "estimate-and-fill rounds; each later one estimates the season on the last filling"}},
    .needs = kNeeds,
    .make = make,
}};

}  // namespace
}  // namespace gapmark
