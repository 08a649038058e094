#include "gapmark/experiment/run_context.hpp"

#include <limits>

namespace gapmark {

nlohmann::json context_to_json(const RunContext& context) {
  nlohmann::json inputs = nlohmann::json::array();
  for (const auto& in : context.inputs) inputs.push_back({{"file", in.file}, {"sha256", in.sha256}});
  return {{"tool", context.tool},
          {"version", context.version},
          {"commit", context.commit},
          {"spec_name", context.spec_name},
          {"spec", context.spec},
          {"spec_sha256", context.spec_sha256},
          {"seed", context.seed},
          {"replicates", context.replicates},
          {"holdout", context.holdout},
          {"inputs", inputs}};
}

RunContext context_from_json(const StoredObject& stored) {
  RunContext c;
  c.tool = stored.text("tool");
  c.version = stored.text("version");
  c.commit = stored.text("commit");
  c.spec_name = stored.text("spec_name");
  (void)stored.object("spec");  // the spec document is an object
  c.spec = stored.at("spec");
  c.spec_sha256 = stored.text("spec_sha256");
  c.seed = stored.count("seed");
  const std::size_t replicates = stored.count("replicates");
  if (replicates > static_cast<std::size_t>(std::numeric_limits<int>::max()))
    stored.fail("replicates", "too many replicates (" + std::to_string(replicates) + ")");
  c.replicates = static_cast<int>(replicates);
  c.holdout = stored.count("holdout");
  for (const auto& in : stored.objects("inputs")) c.inputs.push_back({in.text("file"), in.text("sha256")});
  return c;
}

}  // namespace gapmark
