#pragma once
// Masking a table's columns with one scheme: what `gapmark mask` does. The
// seed of each column's mask is derived exactly as in an experiment, from
// (seed, column label, scheme, rate, replicate), so `gapmark mask` with the
// same seed reproduces the masks of `gapmark run`.
#include <cstdint>
#include <string>
#include <vector>

#include "gapmark/mask/scheme.hpp"
#include "gapmark/table_io.hpp"

namespace gapmark {

struct MaskTableOptions {
  std::uint64_t seed = 1;
  int replicate = 0;
  std::size_t holdout = 0;
  std::size_t period = 0;  ///< 0 = the axis's default
  double rate = 0.1;
};

/// Hides values in the selected columns (cells emptied, values NaN); returns
/// per column the flag cells ("1" where hidden) and the number hidden.
struct MaskTableOutput {
  std::vector<std::vector<std::string>> flags;
  std::vector<std::size_t> hidden;
};
MaskTableOutput mask_table(WideTable& table, const std::vector<std::size_t>& columns,
                           const Bound<MaskScheme>& scheme, const MaskTableOptions& options);

/// The task key both `mask` and `run` derive a mask's seed from.
std::string mask_key(const std::string& series_label, const std::string& scheme_label, double rate,
                     int replicate);

}  // namespace gapmark
