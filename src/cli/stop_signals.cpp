#include "stop_signals.hpp"

#include <unistd.h>

#include <csignal>

#include "commands.hpp"
#include "gapmark/fill/external_program.hpp"

namespace gapmark::cli {
namespace {

std::atomic<bool> g_stop{false};
std::atomic<int> g_signal{0};
std::atomic<int> g_work{0};  // a StoppedWork
static_assert(std::atomic<bool>::is_always_lock_free && std::atomic<int>::is_always_lock_free);

extern "C" void on_stop_signal(int signal) {
  g_signal.store(signal);
  g_stop.store(true);
  interrupt_external_programs();
  static const char tasks[] =
      "\ngapmark: stopping: no new task starts; the tasks running finish and are kept (a second signal quits at "
      "once)\n";
  static const char tasks_with_programs[] =
      "\ngapmark: stopping: no new task starts; outside programs still running are ended now and their tasks left "
      "for --resume; finished tasks are kept (a second signal quits at once)\n";
  static const char merge_with_programs[] =
      "\ngapmark: stopping: outside programs still running are ended now; the merge writes nothing (a second "
      "signal quits at once)\n";
  const auto write_message = [](const char* text, std::size_t size) {
    const ssize_t n = ::write(STDERR_FILENO, text, size);
    (void)n;
  };
  switch (static_cast<StoppedWork>(g_work.load())) {
    case StoppedWork::tasks: write_message(tasks, sizeof tasks - 1); break;
    case StoppedWork::tasks_with_programs: write_message(tasks_with_programs, sizeof tasks_with_programs - 1); break;
    case StoppedWork::merge_with_programs: write_message(merge_with_programs, sizeof merge_with_programs - 1); break;
  }
}

}  // namespace

void catch_stop_signals(StoppedWork work) {
  g_work.store(static_cast<int>(work));
  struct sigaction action {};
  action.sa_handler = on_stop_signal;
  action.sa_flags = SA_RESETHAND;
  sigemptyset(&action.sa_mask);
  sigaction(SIGINT, &action, nullptr);
  sigaction(SIGTERM, &action, nullptr);
}

std::atomic<bool>& stop_flag() { return g_stop; }

int stop_signal() { return g_signal.load(); }

int stopped_exit_status() { return stop_signal() == SIGTERM ? 128 + SIGTERM : kInterrupted; }

}  // namespace gapmark::cli
