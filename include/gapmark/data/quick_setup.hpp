#pragma once
// `gapmark quick` before the run: read and profile the file, check it is on
// a grid, settle the variable's kind, plan the experiment and write out what
// was planned. The command only parses its options and calls these.
#include <cstddef>
#include <cstdint>
#include <filesystem>
#include <string>
#include <vector>

#include "gapmark/data/profile.hpp"
#include "gapmark/data/quick_plan.hpp"

namespace gapmark::data {

struct QuickRequest {
  std::string input;                 ///< the CSV
  std::string column;                ///< empty: the file's only value column
  std::string kind;                  ///< "count", "level", "smooth" or empty (guessed)
  std::filesystem::path out = "gapmark-quick";
  std::vector<std::string> group;    ///< group columns as given (COL or COL,COL)
  std::string time_column, step;
  std::size_t period = 0;            ///< 0: the grid's default
  int replicates = 10;
  std::uint64_t seed = 1;
};

struct QuickSetup {
  std::string column;
  DataProfile profile;
  VariableKind kind = VariableKind::Unknown;
  bool kind_given = false;
  std::string kind_reason;           ///< why, when guessed
  std::vector<std::string> siblings; ///< the file's other numeric columns
  QuickPlan plan;
  std::filesystem::path spec_path;
  std::string spec_text;             ///< the spec to write (and run)
};

/// Reads, profiles and plans. InputError for a file that is not on a grid
/// (naming the regularize command, with zero advice only for a count) or a
/// column that is absent or not numeric.
QuickSetup prepare_quick(const QuickRequest& request);

/// The profile table of the variable's series and what was planned: kind,
/// masks, methods, holdout, replicates.
std::string quick_plan_text(const QuickSetup& setup, const QuickRequest& request);

}  // namespace gapmark::data
