// A fill method carried out by an outside program, so that an in-house
// method can be benchmarked beside the built-in ones. The exchange is
// described in docs/external-methods.md and implemented in
// external_program.hpp:
//   - the command is split into words (no shell) and started directly, in a
//     process group of its own, with the working directory and environment
//     of gapmark plus GAPMARK_PROTOCOL, GAPMARK_LENGTH, GAPMARK_PERIOD,
//     GAPMARK_STEP (and GAPMARK_INPUT with input=file);
//   - the masked series goes to it as CSV "time,value" on standard input,
//     or (input=file) in a temporary file named by the last argument;
//   - it answers on standard output with the same rows, filled, and may add
//     a variance column;
//   - a timeout (the whole group is killed), a non-zero exit, a signal or an
//     answer that breaks the format is a MethodFailure with a precise reason.
#include <cstdio>
#include <filesystem>
#include <memory>
#include <string>
#include <vector>

#include <signal.h>
#include <string.h>
#include <unistd.h>

#include "gapmark/error.hpp"
#include "gapmark/fill/external_program.hpp"
#include "gapmark/fill/method.hpp"
#include "gapmark/number_format.hpp"

namespace gapmark {
namespace {

/// Standard output allowed per row (a long date-time, two numbers at full
/// precision and some slack), plus a fixed allowance.
constexpr std::size_t kBytesPerRow = 256;
constexpr std::size_t kBaseBytes = 1u << 20;

/// A temporary file holding the input, removed when this goes out of scope.
class InputFile {
public:
  explicit InputFile(const std::string& contents) {
    std::string pattern = (std::filesystem::temp_directory_path() / "gapmark-external-XXXXXX.csv").string();
    const int fd = ::mkstemps(pattern.data(), 4);
    if (fd < 0) throw MethodFailure("cannot create a temporary input file in " +
                                    std::filesystem::temp_directory_path().string());
    path_ = pattern;
    std::size_t done = 0;
    while (done < contents.size()) {
      const ssize_t n = ::write(fd, contents.data() + done, contents.size() - done);
      if (n <= 0) {
        ::close(fd);
        throw MethodFailure("cannot write the temporary input file " + path_);
      }
      done += static_cast<std::size_t>(n);
    }
    ::close(fd);
  }
  ~InputFile() { std::remove(path_.c_str()); }
  InputFile(const InputFile&) = delete;
  InputFile& operator=(const InputFile&) = delete;
  const std::string& path() const { return path_; }

private:
  std::string path_;
};

std::string signal_name(int sig) {
  const char* abbrev = sigabbrev_np(sig);
  return std::to_string(sig) + (abbrev ? std::string(" (SIG") + abbrev + ")" : std::string());
}

class External final : public FillMethod {
public:
  External(std::vector<std::string> argv, double timeout, bool file_input)
      : argv_(std::move(argv)), timeout_(timeout), file_input_(file_input) {}

  FillResult fill(const FillRequest& request) const override {
    const std::size_t n = request.values.size();
    const TimeAxis fallback = TimeAxis::index(n);
    const TimeAxis& axis = request.axis ? *request.axis : fallback;
    const std::string csv = series_csv(request.values, axis);

    ProgramRun run;
    run.argv = argv_;
    run.timeout_seconds = timeout_;
    run.working_dir = request.working_dir;
    run.max_output_bytes = kBaseBytes + kBytesPerRow * (n + 1);
    run.environment = {{"GAPMARK_PROTOCOL", "1"},
                       {"GAPMARK_LENGTH", std::to_string(n)},
                       {"GAPMARK_PERIOD", std::to_string(request.period)},
                       {"GAPMARK_STEP", axis.step().iso()}};
    std::unique_ptr<InputFile> file;
    if (file_input_) {
      file = std::make_unique<InputFile>(csv);
      run.argv.push_back(file->path());
      run.environment.emplace_back("GAPMARK_INPUT", file->path());
    } else {
      run.input = csv;
    }

    const ProgramOutcome outcome = run_program(run);
    const std::string said = first_line(outcome.errors);
    if (!outcome.exited)
      throw MethodFailure("the program was killed by signal " + signal_name(outcome.signal) +
                          (said.empty() ? "" : ": " + said));
    if (outcome.exit_status != 0)
      throw MethodFailure("the program exited with status " + std::to_string(outcome.exit_status) +
                          (said.empty() ? " and wrote nothing on standard error" : ": " + said));
    return read_filled_csv(outcome.output, request.values, axis);
  }

private:
  std::vector<std::string> argv_;
  double timeout_;
  bool file_input_;
};

const Registration<FillMethod> registration{{
    .name = "external",
    .summary = "an outside program fills the series: CSV time,value in, the same rows filled out "
               "(docs/external-methods.md)",
    .params = {{.name = "command", .type = ParamType::Text, .default_value = "",
                .choices = {},
                .help = "program and arguments, split into words like a shell would but never run by one "
                        "(quotes '...' and \"...\", backslash; no $, globs, pipes or redirection)"},
               {.name = "timeout", .type = ParamType::Real, .default_value = "60", .min = 0.001, .max = 86400,
                .choices = {},
                .help = "seconds one call may take; the program and everything it started are then killed"},
               {.name = "input", .type = ParamType::Choice, .default_value = "stdin", .choices = {"stdin", "file"},
                .help = "where the series goes: standard input, or a temporary file named by the last argument "
                        "(and GAPMARK_INPUT)"}},
    .needs = {.uses_period = true},  // GAPMARK_PERIOD
    .make = [](const ParamValues& p) {
      return std::make_unique<External>(split_command(p.text("command"), "external: command"), p.real("timeout"),
                                        p.text("input") == "file");
    },
}};

}  // namespace
}  // namespace gapmark
