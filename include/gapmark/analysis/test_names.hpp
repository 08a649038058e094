#pragma once
// The names of the statistical procedures behind a summary, as methods.md
// writes them and as report/references.cpp maps them to citations: one
// constant each, so the two cannot drift apart.
namespace gapmark::test_names {

inline constexpr const char* kBootstrapInterval = "percentile bootstrap interval of the mean";
inline constexpr const char* kSignedRank = "Wilcoxon signed-rank test against the best, Holm-adjusted";
inline constexpr const char* kEquivalence = "paired two one-sided tests (TOST) against the best, Holm-adjusted";
inline constexpr const char* kFriedman = "Friedman test";
inline constexpr const char* kImanDavenport = "Iman-Davenport test";
inline constexpr const char* kNemenyi = "Nemenyi critical difference";

}  // namespace gapmark::test_names
