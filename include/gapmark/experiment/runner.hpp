#pragma once
// Runs an experiment: loads the data, builds the task grid, masks each task
// (seeded from its key), runs every method on the same mask, scores them,
// and returns the records in canonical order.
#include <cstddef>
#include <functional>
#include <string>
#include <vector>

#include "gapmark/experiment/record.hpp"
#include "gapmark/experiment/spec.hpp"
#include "gapmark/series.hpp"

namespace gapmark {

struct RunOptions {
  unsigned threads = 1;
  /// Called after each finished task with (done, total); may be empty.
  std::function<void(std::size_t, std::size_t)> progress;
};

/// The series a spec names, loaded and checked, with their data set index.
struct LoadedData {
  std::vector<Series> series;
  std::vector<std::size_t> dataset;          ///< dataset[i]: which data source series i came from
  std::vector<std::string> input_sha256;     ///< per data source
};
LoadedData load_data(const ExperimentSpec& spec);

/// One unit of work: a series under one scheme at one rate, one replicate.
struct Task {
  std::size_t series = 0, scheme = 0, rate = 0;
  int replicate = 0;
};
std::vector<Task> build_tasks(const ExperimentSpec& spec, const LoadedData& data);
/// The key a task's seed is derived from: "series\x1fscheme\x1frate\x1freplicate".
std::string task_key(const ExperimentSpec& spec, const LoadedData& data, const Task& task);

/// Runs one task: every method on the same mask. Records in method order.
std::vector<TrialRecord> run_task(const ExperimentSpec& spec, const LoadedData& data,
                                  const Task& task, std::vector<Warning>& warnings);

ResultSet run_experiment(const ExperimentSpec& spec, const RunOptions& options = {});

}  // namespace gapmark
