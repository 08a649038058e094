#pragma once
// The Friedman test for k treatments (methods) observed in N blocks
// (replicates or data sets). Within each block the lowest value gets rank 1.
#include <cstddef>
#include <span>

namespace gapmark::stats {

struct FriedmanResult {
  double statistic = 0;  ///< chi-squared statistic with the correction for ties
  double df = 0;         ///< k - 1
  double p = 0;          ///< upper tail of chi-squared(k - 1)
  std::size_t blocks = 0, treatments = 0;
};

/// Friedman test on a row-major `blocks` x `treatments` matrix (rows = blocks,
/// columns = treatments). Ranks within each row, ties averaged, and divides
/// the statistic by 1 - sum(t^3 - t) / (N k (k^2 - 1)), the tie correction
/// used by common statistical libraries. statistic and p are NaN when N < 1,
/// k < 2, or every block is tied throughout. No NaN allowed in the matrix.
/// Throws std::invalid_argument when values.size() != blocks * treatments.
FriedmanResult friedman(std::span<const double> values, std::size_t blocks,
                        std::size_t treatments);

struct ImanDavenport {
  double f = 0, df1 = 0, df2 = 0, p = 0;
};

/// The Iman-Davenport statistic from a Friedman chi-squared over N blocks and
/// k treatments: F_F = (N - 1) chi2 / (N (k - 1) - chi2), df (k - 1, (k - 1)(N - 1)),
/// p from the upper tail of F. When chi2 reaches N (k - 1) (every block ranks
/// the treatments alike), F_F = +inf and p = 0. NaN when N < 2, k < 2 or chi2 is NaN.
ImanDavenport iman_davenport(double chi2, std::size_t treatments, std::size_t blocks);

struct FriedmanFromRanks {
  double chi2 = 0, chi2_df = 0, chi2_p = 0;  ///< Friedman chi-squared, df = k - 1
  double f = 0, f_df1 = 0, f_df2 = 0, f_p = 0;  ///< Iman-Davenport F, df (k-1, (k-1)(N-1))
};

/// The Friedman statistic from mean ranks alone (no tie correction):
///   chi2_F = 12 N / (k (k + 1)) * [sum_j R_j^2 - k (k + 1)^2 / 4]
/// and the Iman-Davenport statistic
///   F_F = (N - 1) chi2_F / (N (k - 1) - chi2_F)
/// with its p-value from F(k - 1, (k - 1)(N - 1)). When every block ranks
/// the treatments alike (chi2_F = N (k - 1)), F_F = +inf and f_p = 0.
/// Everything is NaN when k < 2 or N < 1; the F part is NaN when N < 2.
FriedmanFromRanks friedman_from_mean_ranks(std::span<const double> mean_ranks,
                                           std::size_t blocks);

}  // namespace gapmark::stats
