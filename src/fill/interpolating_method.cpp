#include "interpolating_method.hpp"

#include "knots.hpp"

namespace gapmark {
namespace {

class InterpolatingMethod final : public FillMethod {
public:
  InterpolatingMethod(InsideSpanFill inside, std::string edges) : inside_(std::move(inside)), edges_(std::move(edges)) {}

  FillResult fill(const FillRequest& request) const override {
    FillResult result;
    result.values = inside_(request.values);
    apply_edges(result.values, edges_);
    return result;
  }

private:
  InsideSpanFill inside_;
  std::string edges_;
};

}  // namespace

std::unique_ptr<FillMethod> interpolating_method(InsideSpanFill inside, const ParamValues& params) {
  return std::make_unique<InterpolatingMethod>(std::move(inside), params.text("edges"));
}

}  // namespace gapmark
