// `run --period N`: the spec with every data set's period replaced.
#include <nlohmann/json.hpp>

#include "gapmark/experiment/spec.hpp"

namespace gapmark {

ExperimentSpec with_period(const ExperimentSpec& spec, std::size_t period) {
  nlohmann::json j = spec.json;
  for (auto& d : j.at("data")) {
    if (d.is_string()) d = nlohmann::json{{"file", d}};
    d["period"] = period;
    d.erase("periods");
  }
  ExperimentSpec out = parse_spec(j.dump(2) + "\n", spec.source + " (with --period " + std::to_string(period) + ")",
                                  spec.base_dir);
  return out;
}

}  // namespace gapmark
