#pragma once
// What could make `gapmark quick`'s recommendation wrong for this variable,
// printed next to it: the run's own warnings (too few masked points, ...),
// too few replicates for the number of methods, real gaps clustered where
// the masks do not put them, the value-dependence screen flagging, and fills
// of the real gaps that leave the observed range.
#include <cstddef>
#include <string>
#include <vector>

#include "gapmark/data/quick_setup.hpp"
#include "gapmark/experiment/record.hpp"

namespace gapmark::data {

struct QuickRisk {
  std::string code;     ///< "few-replicates", "clustered-gaps", "value-dependent", "fills-out-of-range", or a run warning's code
  std::string message;  ///< what was found, with its numbers
  std::string advice;   ///< what to do about it
};

/// Fewest replicates at which the paired signed-rank test (exact, two-sided:
/// smallest p = 2 / 2^n) can still reach alpha after Holm's correction over
/// the methods - 1 comparisons with the best (smallest adjusted p =
/// (methods - 1) * 2 / 2^n).
std::size_t fewest_replicates(std::size_t methods, double alpha);

/// A stretch of one series whose missing share stands out: a calendar month
/// (daily or finer steps on a calendar axis) or a tenth of the series.
struct GapCluster {
  std::string series, window;
  std::size_t points = 0, missing = 0;
  double overall = 0;  ///< the series' missing share
};
/// The stretch with the highest missing share, when it is at least 50%, at
/// least twice the series' share, and covers 10 points or more.
std::vector<GapCluster> gap_clusters(const QuickSetup& setup);

/// Fills the real gaps of the variable with each planned method; returns the
/// methods whose fills leave the observed range (with the range they reach).
struct OutOfRange {
  std::string method;
  double low = 0, high = 0;  ///< the fills' range
};
std::vector<OutOfRange> fills_out_of_range(const QuickSetup& setup, double& observed_low, double& observed_high);

std::vector<QuickRisk> quick_risks(const QuickSetup& setup, const ResultSet& results);

/// "Risks:" and one line (with its advice) per risk, or a line saying none was found.
std::string risks_text(const std::vector<QuickRisk>& risks);

}  // namespace gapmark::data
