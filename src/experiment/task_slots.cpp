#include "gapmark/experiment/task_slots.hpp"

#include <cmath>
#include <map>
#include <utility>

namespace gapmark {
namespace {

std::string warning_key(const Warning& w) { return w.code + '\x1f' + w.where; }

}  // namespace

WarningCollector::WarningCollector(std::vector<Warning>& into) : into_(into) {
  for (const auto& w : into_) seen_.insert(warning_key(w));
}

void WarningCollector::add(Warning warning) {
  if (seen_.insert(warning_key(warning)).second) into_.push_back(std::move(warning));
}

std::map<std::string, double> gather_task_slots(TaskSlots& slots, ResultSet& results) {
  std::size_t count = results.trials.size();
  for (const auto& s : slots.records) count += s.size();
  results.trials.reserve(count);
  WarningCollector warnings(results.warnings);
  std::map<std::string, double> method_seconds;
  for (std::size_t t = 0; t < slots.records.size(); ++t) {
    for (auto& w : slots.warnings[t]) warnings.add(std::move(w));
    for (auto& r : slots.records[t]) {
      if (std::isfinite(r.seconds)) method_seconds[r.method] += r.seconds;
      results.trials.push_back(std::move(r));
    }
    std::vector<TrialRecord>().swap(slots.records[t]);
    std::vector<Warning>().swap(slots.warnings[t]);
  }
  return method_seconds;
}

}  // namespace gapmark
