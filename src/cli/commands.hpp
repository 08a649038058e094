#pragma once
// Each subcommand lives in its own file: it declares its options on the
// shared CLI11 app and, when chosen, calls the library. Nothing more.
#include <CLI/CLI.hpp>
#include <functional>

namespace gapmark::cli {

/// What a chosen subcommand runs; returns the process exit code.
using Action = std::function<int()>;

/// Exit codes scripts can rely on.
inline constexpr int kOk = 0;
inline constexpr int kRegression = 1;   ///< compare: something got worse
inline constexpr int kBadInput = 2;     ///< usage, files, specs
inline constexpr int kInternal = 3;     ///< a bug: please report
inline constexpr int kInterrupted = 130;

void add_methods(CLI::App& app, Action& action);
void add_schemes(CLI::App& app, Action& action);
void add_metrics(CLI::App& app, Action& action);
void add_mask(CLI::App& app, Action& action);
void add_fill(CLI::App& app, Action& action);
void add_run(CLI::App& app, Action& action);
void add_profile(CLI::App& app, Action& action);
void add_regularize(CLI::App& app, Action& action);
void add_quick(CLI::App& app, Action& action);
void add_merge(CLI::App& app, Action& action);
void add_report(CLI::App& app, Action& action);
void add_compare(CLI::App& app, Action& action);

}  // namespace gapmark::cli
