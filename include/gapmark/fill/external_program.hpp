#pragma once
// The exchange with an outside fill program (docs/external-methods.md):
//  - running a program with some input on its standard input, collecting
//    its standard output and standard error, with a time limit;
//  - splitting the user's command into words (no shell);
//  - the CSV written to the program and the strict reading of its answer.
//
// Everything here is safe to call from several threads at once: each call
// owns its pipes (opened close-on-exec, so a program started by another
// thread never inherits them) and its child's process group.
#include <cstddef>
#include <span>
#include <string>
#include <string_view>
#include <utility>
#include <vector>

#include "gapmark/fill/method.hpp"
#include "gapmark/time_axis.hpp"

namespace gapmark {

/// Splits a command into words without a shell: blanks separate words;
/// 'single quotes' keep everything literally; "double quotes" keep
/// everything but \" and \\; outside quotes a backslash keeps the next
/// character. Nothing is expanded ($, *, ~, |, ;, > are plain characters).
/// Throws InputError naming `where` for an empty command or an open quote.
std::vector<std::string> split_command(std::string_view command, const std::string& where);

/// What to run and how.
struct ProgramRun {
  std::vector<std::string> argv;   ///< argv[0] is looked up on PATH unless it holds a '/'
  std::vector<std::pair<std::string, std::string>> environment;  ///< set on top of the inherited one
  std::string input;               ///< written to standard input, which is then closed
  double timeout_seconds = 60.0;   ///< the whole run, from start to exit
  std::size_t max_output_bytes = 64u << 20;  ///< more standard output than this is a failure
  std::string working_dir;         ///< where the program runs (argv[0] with a '/' is found from there); empty: here
};

struct ProgramOutcome {
  std::string output;        ///< standard output
  std::string errors;        ///< standard error (its first 64 KiB)
  bool exited = false;       ///< true: ended by exit with exit_status; false: by signal
  int exit_status = 0;
  int signal = 0;
};

/// Ends every running outside program and its descendants at once, and
/// makes every later run_program throw Interrupted. Async-signal-safe: it only
/// sets a flag, which the waiting loops see within 0.1 s.
void interrupt_external_programs() noexcept;
bool external_programs_interrupted() noexcept;

/// Runs the program in a process group of its own. gapmark is made a child
/// subreaper (PR_SET_CHILD_SUBREAPER), so that every process the program
/// starts stays findable, even in a session of its own (setsid) or after its
/// parent exits. When the call ends (exit, timeout, interrupt, error), the
/// program and all its descendants are stopped, killed and reaped; processes
/// orphaned by programs that already exited are ended when no program is
/// running any more. Throws Interrupted after interrupt_external_programs().
/// Throws MethodFailure
/// when it cannot start ("cannot start 'x': ..."), runs past the timeout
/// ("timed out after 1 s"; the whole group is killed) or prints more than
/// max_output_bytes. A non-zero exit is returned, not thrown.
ProgramOutcome run_program(const ProgramRun& run);

/// The first non-blank line of `text`, trimmed and cut to `limit` characters.
std::string first_line(std::string_view text, std::size_t limit = 300);

/// The series as the program reads it: header "time,value", one row per
/// point, times written by the axis, values at round-trip precision, an
/// empty cell where a value is missing; lines end with "\n".
std::string series_csv(std::span<const double> values, const TimeAxis& axis);

/// Reads the program's answer strictly: header "time,value" or
/// "time,value,variance"; exactly one row per input point, in order, each
/// with the input's time text unchanged; values are numbers or empty (left
/// unfilled); variances, when given, are non-negative numbers or empty.
/// "\r\n" line ends and a missing final line end are accepted. Throws
/// MethodFailure naming the output line and what is wrong.
FillResult read_filled_csv(std::string_view output, std::span<const double> values, const TimeAxis& axis);

}  // namespace gapmark
