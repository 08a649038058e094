#pragma once
// The names other code matches on: a metric's registry name, parameters and
// column names. Each metric's own file declares its columns and parameters
// with these constants, so a rename there reaches every reader.
namespace gapmark::metric_names {

namespace error {
inline constexpr const char* kMae = "mae";
inline constexpr const char* kRmse = "rmse";
inline constexpr const char* kBias = "bias";
inline constexpr const char* kScored = "scored";
}  // namespace error

namespace acf {
inline constexpr const char* kName = "acf";
inline constexpr const char* kLags = "lags";  ///< parameter: the largest lag compared
inline constexpr const char* kRms = "acf_rms";
inline constexpr const char* kMax = "acf_max";
inline constexpr const char* kVarRatio = "var_ratio";
}  // namespace acf

namespace forecast {
inline constexpr const char* kName = "forecast";
inline constexpr const char* kModel = "model";  ///< parameter: the forecaster
inline constexpr const char* kHoltWinters = "holt-winters";
inline constexpr const char* kSeasonalNaive = "seasonal-naive";
inline constexpr const char* kMaseFilled = "mase_filled";
inline constexpr const char* kMaseComplete = "mase_complete";
inline constexpr const char* kMaseCost = "mase_cost";
}  // namespace forecast

namespace interval {
inline constexpr const char* kCoverage = "coverage";
inline constexpr const char* kCoverageError = "coverage_error";
inline constexpr const char* kCrps = "crps";
}  // namespace interval

}  // namespace gapmark::metric_names
