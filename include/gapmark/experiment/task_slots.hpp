#pragma once
// The finished tasks of a run, held by task index until every one is done,
// and how they become a ResultSet's trials, warnings and fill times. A run in
// memory and a merge of checkpoints both go through gather_task_slots, so the
// two count warnings and times the same way.
#include <cstddef>
#include <map>
#include <string>
#include <unordered_set>
#include <vector>

#include "gapmark/experiment/record.hpp"

namespace gapmark {

/// Keeps each warning once per (code, where): the first one added. Warnings
/// already in `into` count as added.
class WarningCollector {
public:
  explicit WarningCollector(std::vector<Warning>& into);
  void add(Warning warning);

private:
  std::vector<Warning>& into_;
  std::unordered_set<std::string> seen_;
};

/// Each task's records and warnings, in the slot of its canonical index.
struct TaskSlots {
  explicit TaskSlots(std::size_t tasks) : records(tasks), warnings(tasks) {}
  std::vector<std::vector<TrialRecord>> records;
  std::vector<std::vector<Warning>> warnings;
};

/// Moves the slots into `results` in task order, freeing each slot as it
/// goes: records onto results.trials, warnings onto results.warnings through
/// a WarningCollector. Returns timing's "fill_seconds_by_method": the fill
/// seconds summed per method over the records with a finite time.
std::map<std::string, double> gather_task_slots(TaskSlots& slots, ResultSet& results);

}  // namespace gapmark
