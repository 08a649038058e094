#include "gapmark/experiment/run_timing.hpp"

#include <limits>

namespace gapmark {

nlohmann::json timing_to_json(const RunTiming& timing) {
  if (timing.empty()) return nullptr;
  nlohmann::json out = nlohmann::json::object();
  if (timing.wall_seconds) out["wall_seconds"] = *timing.wall_seconds;
  if (timing.fill_seconds_by_method) out["fill_seconds_by_method"] = *timing.fill_seconds_by_method;
  if (timing.threads) out["threads"] = *timing.threads;
  if (timing.resumed_tasks) out["resumed_tasks"] = *timing.resumed_tasks;
  if (timing.checkpoints) out["checkpoints"] = *timing.checkpoints;
  return out;
}

RunTiming timing_from_json(const StoredObject& stored, const std::string& key) {
  RunTiming t;
  if (!stored.has(key) || stored.at(key).is_null()) return t;
  const StoredObject timing = stored.object(key);
  if (timing.has("wall_seconds")) t.wall_seconds = timing.number("wall_seconds");
  if (timing.has("fill_seconds_by_method")) {
    const StoredObject per_method = timing.object("fill_seconds_by_method");
    auto& seconds = t.fill_seconds_by_method.emplace();
    const auto& stored_seconds = timing.at("fill_seconds_by_method");
    for (auto it = stored_seconds.begin(); it != stored_seconds.end(); ++it)
      seconds[it.key()] = per_method.number(it.key());
  }
  if (timing.has("threads")) {
    const std::size_t threads = timing.count("threads");
    if (threads > std::numeric_limits<unsigned>::max()) timing.fail("threads", "too many threads");
    t.threads = static_cast<unsigned>(threads);
  }
  if (timing.has("resumed_tasks")) t.resumed_tasks = timing.count("resumed_tasks");
  if (timing.has("checkpoints")) t.checkpoints = timing.count("checkpoints");
  return t;
}

}  // namespace gapmark
