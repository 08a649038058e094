#pragma once
// Ctrl-C (SIGINT) and SIGTERM for the commands that do long work (run,
// merge): the first signal asks the work to stop, ends outside programs at
// once and says so on stderr; a second signal kills at once.
#include <atomic>

namespace gapmark::cli {

/// What the stopped work is, for the message the first signal prints.
enum class StoppedWork {
  tasks,                ///< a run without outside programs: running tasks finish
  tasks_with_programs,  ///< a run that starts outside programs: they are ended now
  merge_with_programs,  ///< a merge drawing example windows with outside programs
};

/// Installs the handlers.
void catch_stop_signals(StoppedWork work);

/// Set by the first signal; the runner polls it between tasks.
std::atomic<bool>& stop_flag();

/// The signal that stopped the work (SIGINT or SIGTERM), 0 when none did.
int stop_signal();

/// The exit status for work stopped by `stop_signal()`: 130 for Ctrl-C,
/// 128 + 15 for SIGTERM (the shell's convention).
int stopped_exit_status();

}  // namespace gapmark::cli
