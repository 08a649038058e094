#include "gapmark/fill/external_program.hpp"

#include <fcntl.h>
#include <poll.h>
#include <signal.h>
#include <spawn.h>
#include <dirent.h>
#include <sys/prctl.h>
#include <sys/types.h>
#include <sys/wait.h>
#include <unistd.h>

#include <algorithm>
#include <atomic>
#include <fstream>
#include <map>
#include <mutex>
#include <set>
#include <cerrno>
#include <chrono>
#include <cmath>
#include <cstring>
#include <string>
#include <system_error>
#include <thread>

#include "gapmark/error.hpp"
#include "gapmark/interrupted.hpp"
#include "gapmark/number_format.hpp"
#include "gapmark/series.hpp"
#include "gapmark/text_safety.hpp"

extern char** environ;

namespace gapmark {

// ---------------------------------------------------------------- command words

std::vector<std::string> split_command(std::string_view command, const std::string& where) {
  std::vector<std::string> words;
  std::string word;
  bool in_word = false;
  for (std::size_t i = 0; i < command.size(); ++i) {
    const char c = command[i];
    if (c == ' ' || c == '\t' || c == '\n' || c == '\r') {
      if (in_word) words.push_back(std::move(word));
      word.clear();
      in_word = false;
      continue;
    }
    in_word = true;
    if (c == '\'') {
      const std::size_t end = command.find('\'', i + 1);
      if (end == std::string_view::npos) throw InputError(where, "unterminated ' quote in the command");
      word.append(command.substr(i + 1, end - i - 1));
      i = end;
    } else if (c == '"') {
      std::size_t j = i + 1;
      for (; j < command.size() && command[j] != '"'; ++j) {
        if (command[j] == '\\' && j + 1 < command.size() && (command[j + 1] == '"' || command[j + 1] == '\\'))
          ++j;
        word += command[j];
      }
      if (j >= command.size()) throw InputError(where, "unterminated \" quote in the command");
      i = j;
    } else if (c == '\\') {
      if (i + 1 >= command.size()) throw InputError(where, "the command ends with a lone backslash");
      word += command[++i];
    } else {
      word += c;
    }
  }
  if (in_word) words.push_back(std::move(word));
  if (words.empty()) throw InputError(where, "the command is empty");
  return words;
}

// ---------------------------------------------------------------- running a program

namespace {

std::string error_text(int err) { return std::system_category().message(err); }

/// A file descriptor closed on destruction.
class Fd {
public:
  Fd() = default;
  explicit Fd(int fd) : fd_(fd) {}
  Fd(const Fd&) = delete;
  Fd& operator=(const Fd&) = delete;
  Fd(Fd&& o) noexcept : fd_(std::exchange(o.fd_, -1)) {}
  Fd& operator=(Fd&& o) noexcept {
    if (this != &o) { reset(); fd_ = std::exchange(o.fd_, -1); }
    return *this;
  }
  ~Fd() { reset(); }
  int get() const { return fd_; }
  bool open() const { return fd_ >= 0; }
  void reset() {
    if (fd_ >= 0) ::close(fd_);
    fd_ = -1;
  }

private:
  int fd_ = -1;
};

/// Moves a descriptor above 2, so that dup2 onto 0, 1 or 2 in the child
/// always makes a fresh, inheritable copy (the parent may run with its
/// standard descriptors closed).
Fd above_standard(int fd) {
  if (fd > 2) return Fd(fd);
  const int moved = ::fcntl(fd, F_DUPFD_CLOEXEC, 3);
  const int err = errno;
  ::close(fd);
  if (moved < 0) throw MethodFailure("cannot set up pipes for the program: " + error_text(err));
  return Fd(moved);
}

struct Pipe {
  Fd read, write;
};

Pipe make_pipe() {
  int fds[2];
  if (::pipe2(fds, O_CLOEXEC) != 0) throw MethodFailure("cannot create a pipe: " + error_text(errno));
  Pipe p;
  p.read = above_standard(fds[0]);
  p.write = above_standard(fds[1]);
  return p;
}

void set_nonblocking(int fd) { ::fcntl(fd, F_SETFL, ::fcntl(fd, F_GETFL) | O_NONBLOCK); }

/// Blocks SIGPIPE in this thread while it writes to the program, so that a
/// program that stops reading makes write() fail with EPIPE instead of
/// ending gapmark; a SIGPIPE raised meanwhile is consumed before the old
/// mask comes back.
class SigpipeGuard {
public:
  SigpipeGuard() {
    sigemptyset(&set_);
    sigaddset(&set_, SIGPIPE);
    sigset_t pending;
    sigpending(&pending);
    was_pending_ = sigismember(&pending, SIGPIPE) == 1;
    pthread_sigmask(SIG_BLOCK, &set_, &old_);
  }
  ~SigpipeGuard() {
    if (!was_pending_) {
      const timespec zero{0, 0};
      while (sigtimedwait(&set_, nullptr, &zero) == SIGPIPE) {
      }
    }
    pthread_sigmask(SIG_SETMASK, &old_, nullptr);
  }
  SigpipeGuard(const SigpipeGuard&) = delete;
  SigpipeGuard& operator=(const SigpipeGuard&) = delete;

private:
  sigset_t set_{}, old_{};
  bool was_pending_ = false;
};

std::atomic<bool> g_interrupted{false};

/// The programs run_program started and has not reaped yet. Any other child
/// of this process is an orphan a program left behind (gapmark is their
/// subreaper). Guarded by g_children_mutex, which is also held around
/// posix_spawn so that a new child is registered before a sweep can see it.
std::mutex g_children_mutex;
std::set<pid_t> g_children;

void become_subreaper() {
  static std::once_flag once;
  std::call_once(once, [] { ::prctl(PR_SET_CHILD_SUBREAPER, 1, 0, 0, 0); });
}

/// Parent of each process, from /proc (empty where /proc is unavailable).
std::map<pid_t, pid_t> parents() {
  std::map<pid_t, pid_t> out;
  DIR* dir = ::opendir("/proc");
  if (dir == nullptr) return out;
  while (const dirent* entry = ::readdir(dir)) {
    const char* name = entry->d_name;
    if (*name < '1' || *name > '9') continue;
    std::ifstream stat(std::string("/proc/") + name + "/stat");
    std::string text;
    if (!std::getline(stat, text)) continue;
    // "pid (comm) state ppid ...": comm may hold spaces and parentheses.
    const auto close = text.rfind(')');
    if (close == std::string::npos || close + 4 >= text.size()) continue;
    const pid_t ppid = static_cast<pid_t>(std::strtol(text.c_str() + close + 4, nullptr, 10));
    out[static_cast<pid_t>(std::strtol(name, nullptr, 10))] = ppid;
  }
  ::closedir(dir);
  return out;
}

/// `root` and every process below it.
std::set<pid_t> tree_of(pid_t root) {
  const auto parent = parents();
  std::set<pid_t> tree{root};
  for (bool grew = true; grew;) {
    grew = false;
    for (const auto& [pid, ppid] : parent)
      if (tree.count(ppid) && tree.insert(pid).second) grew = true;
  }
  return tree;
}

/// Stops `root` and all its descendants (so none can start another), kills
/// them, and waits until each is gone, reaping those that are (or become)
/// this process's children.
void end_tree(pid_t root) {
  std::set<pid_t> frozen;
  for (int round = 0; round < 100; ++round) {  // until no new process appears
    bool grew = false;
    for (pid_t p : tree_of(root))
      if (frozen.insert(p).second) {
        ::kill(p, SIGSTOP);
        grew = true;
      }
    if (!grew) break;
  }
  ::kill(-root, SIGKILL);  // its process group, as before
  for (pid_t p : frozen) ::kill(p, SIGKILL);
  frozen.erase(root);  // the caller reaps the root
  for (int wait = 0; wait < 2000 && !frozen.empty(); ++wait) {
    for (auto it = frozen.begin(); it != frozen.end();) {
      // Ours (orphaned to us) -> reaped here; gone -> its parent reaped it.
      if (::waitpid(*it, nullptr, WNOHANG) == *it || (::kill(*it, 0) != 0 && errno == ESRCH)) it = frozen.erase(it);
      else ++it;
    }
    if (!frozen.empty()) std::this_thread::sleep_for(std::chrono::milliseconds(1));
  }
}

/// Ends the processes orphaned to gapmark by programs that are gone: every
/// child of this process that run_program did not start. Called with the
/// registry locked and no program running.
void end_orphans() {
  const pid_t self = ::getpid();
  for (int round = 0; round < 10; ++round) {
    bool found = false;
    for (const auto& [pid, ppid] : parents())
      if (ppid == self && !g_children.count(pid)) {
        found = true;
        end_tree(pid);
        while (::waitpid(pid, nullptr, 0) < 0 && errno == EINTR) {
        }
      }
    if (!found) break;
  }
}

/// The started child: killed with all its descendants and reaped if it is
/// still there when this goes out of scope.
class Child {
public:
  explicit Child(pid_t pid) : pid_(pid) {}
  Child(const Child&) = delete;
  Child& operator=(const Child&) = delete;
  ~Child() {
    if (pid_ > 0) kill_and_reap();
  }
  /// True once the child has exited; it stays a zombie (not reaped), which
  /// keeps its process-group id from being reused.
  bool exited() const {
    siginfo_t info{};
    return ::waitid(P_PID, static_cast<id_t>(pid_), &info, WEXITED | WNOHANG | WNOWAIT) == 0 &&
           info.si_pid == pid_;
  }
  /// Kills what is left of its tree and reaps the child; returns its wait
  /// status. The last program to end also ends the orphans left behind.
  int kill_and_reap() {
    end_tree(pid_);
    int status = 0;
    while (::waitpid(pid_, &status, 0) < 0 && errno == EINTR) {
    }
    std::lock_guard lock(g_children_mutex);
    g_children.erase(pid_);
    if (g_children.empty()) end_orphans();
    pid_ = -1;
    return status;
  }

private:
  pid_t pid_;
};

class SpawnSetup {
public:
  SpawnSetup() {
    posix_spawn_file_actions_init(&actions);
    posix_spawnattr_init(&attr);
  }
  ~SpawnSetup() {
    posix_spawn_file_actions_destroy(&actions);
    posix_spawnattr_destroy(&attr);
  }
  SpawnSetup(const SpawnSetup&) = delete;
  SpawnSetup& operator=(const SpawnSetup&) = delete;
  posix_spawn_file_actions_t actions{};
  posix_spawnattr_t attr{};
};

std::vector<std::string> child_environment(const ProgramRun& run) {
  std::vector<std::string> env;
  for (char** e = environ; e && *e; ++e) {
    const std::string_view entry(*e);
    const std::string_view name = entry.substr(0, entry.find('='));
    const bool replaced = std::any_of(run.environment.begin(), run.environment.end(),
                                      [&](const auto& kv) { return kv.first == name; });
    if (!replaced) env.emplace_back(entry);
  }
  for (const auto& [name, value] : run.environment) env.push_back(name + "=" + value);
  return env;
}

std::vector<char*> pointers(std::vector<std::string>& words) {
  std::vector<char*> out;
  for (auto& w : words) out.push_back(w.data());
  out.push_back(nullptr);
  return out;
}

constexpr std::size_t kErrorsKept = 64 * 1024;
constexpr std::size_t kChunk = 64 * 1024;

using Clock = std::chrono::steady_clock;

void check_interrupt() {
  if (g_interrupted.load()) throw Interrupted("stopped by an interrupt");
}

/// The child's standard streams on the pipes, its working folder, its own
/// process group, no blocked signals and the usual defaults for those gapmark
/// handles itself.
void configure_spawn(SpawnSetup& setup, const Pipe& in, const Pipe& out, const Pipe& err, const ProgramRun& run) {
  posix_spawn_file_actions_adddup2(&setup.actions, in.read.get(), 0);
  posix_spawn_file_actions_adddup2(&setup.actions, out.write.get(), 1);
  posix_spawn_file_actions_adddup2(&setup.actions, err.write.get(), 2);
  sigset_t no_signals, default_signals;
  sigemptyset(&no_signals);
  sigemptyset(&default_signals);
  sigaddset(&default_signals, SIGPIPE);
  sigaddset(&default_signals, SIGXFSZ);  // gapmark ignores it; the program gets the usual default
  sigaddset(&default_signals, SIGINT);
  sigaddset(&default_signals, SIGTERM);
  posix_spawnattr_setsigmask(&setup.attr, &no_signals);
  posix_spawnattr_setsigdefault(&setup.attr, &default_signals);
  if (!run.working_dir.empty()) posix_spawn_file_actions_addchdir_np(&setup.actions, run.working_dir.c_str());
  posix_spawnattr_setpgroup(&setup.attr, 0);
  posix_spawnattr_setflags(&setup.attr, POSIX_SPAWN_SETPGROUP | POSIX_SPAWN_SETSIGMASK | POSIX_SPAWN_SETSIGDEF);
}

/// Feeds run.input to the program and collects its output and errors until
/// it closes both output pipes; MethodFailure past the deadline or past the
/// output limit, Interrupted when the user stops the work.
void exchange(const ProgramRun& run, Pipe& in, Pipe& out, Pipe& err, Clock::time_point deadline,
              const std::string& timed_out, ProgramOutcome& outcome) {
  std::size_t written = 0;
  char buffer[kChunk];
  while (out.read.open() || err.read.open()) {
    const auto left = std::chrono::duration_cast<std::chrono::milliseconds>(deadline - Clock::now()).count();
    if (left <= 0) throw MethodFailure(timed_out);
    check_interrupt();
    pollfd fds[3];
    nfds_t count = 0;
    int in_slot = -1, out_slot = -1, err_slot = -1;
    if (in.write.open()) { in_slot = static_cast<int>(count); fds[count++] = {in.write.get(), POLLOUT, 0}; }
    if (out.read.open()) { out_slot = static_cast<int>(count); fds[count++] = {out.read.get(), POLLIN, 0}; }
    if (err.read.open()) { err_slot = static_cast<int>(count); fds[count++] = {err.read.get(), POLLIN, 0}; }
    const int ready = ::poll(fds, count, static_cast<int>(std::min<long long>(left, 100)));
    if (ready < 0) {
      if (errno == EINTR) continue;
      throw MethodFailure("waiting for the program failed: " + error_text(errno));
    }
    if (in_slot >= 0 && fds[in_slot].revents != 0) {
      const std::size_t size = std::min(kChunk, run.input.size() - written);
      const ssize_t n = ::write(in.write.get(), run.input.data() + written, size);
      if (n > 0) written += static_cast<std::size_t>(n);
      // EPIPE: the program stopped reading; its exit status and output tell the rest.
      if ((n < 0 && errno != EAGAIN && errno != EINTR) || written == run.input.size()) in.write.reset();
    }
    if (out_slot >= 0 && fds[out_slot].revents != 0) {
      const ssize_t n = ::read(out.read.get(), buffer, sizeof buffer);
      if (n > 0) {
        outcome.output.append(buffer, static_cast<std::size_t>(n));
        if (outcome.output.size() > run.max_output_bytes)
          throw MethodFailure("the program printed more than " + std::to_string(run.max_output_bytes) +
                              " bytes on standard output");
      } else if (n == 0 || (errno != EAGAIN && errno != EINTR)) {
        out.read.reset();
      }
    }
    if (err_slot >= 0 && fds[err_slot].revents != 0) {
      const ssize_t n = ::read(err.read.get(), buffer, sizeof buffer);
      if (n > 0) {
        const std::size_t room = kErrorsKept - std::min(kErrorsKept, outcome.errors.size());
        outcome.errors.append(buffer, std::min(room, static_cast<std::size_t>(n)));
      } else if (n == 0 || (errno != EAGAIN && errno != EINTR)) {
        err.read.reset();
      }
    }
  }
}

}  // namespace

void interrupt_external_programs() noexcept { g_interrupted.store(true); }
bool external_programs_interrupted() noexcept { return g_interrupted.load(); }

ProgramOutcome run_program(const ProgramRun& run) {
  if (run.argv.empty()) throw MethodFailure("no program to run");
  check_interrupt();
  become_subreaper();
  const auto deadline = Clock::now() + std::chrono::duration_cast<Clock::duration>(
                                           std::chrono::duration<double>(run.timeout_seconds));
  const std::string timed_out = "timed out after " + format_double(run.timeout_seconds) + " s";

  Pipe in = make_pipe(), out = make_pipe(), err = make_pipe();
  SpawnSetup setup;
  configure_spawn(setup, in, out, err, run);
  std::vector<std::string> argv_words = run.argv;
  std::vector<std::string> env_words = child_environment(run);
  const std::vector<char*> argv = pointers(argv_words);
  const std::vector<char*> envp = pointers(env_words);

  const SigpipeGuard sigpipe_guard;
  pid_t pid = 0;
  std::unique_lock registry(g_children_mutex);
  const int spawn_error = ::posix_spawnp(&pid, argv[0], &setup.actions, &setup.attr, argv.data(), envp.data());
  if (spawn_error == 0) g_children.insert(pid);
  registry.unlock();
  if (spawn_error != 0)
    throw MethodFailure("cannot start " + quoted_for_message(run.argv[0], 200) + ": " + error_text(spawn_error));
  Child child(pid);
  in.read.reset();
  out.write.reset();
  err.write.reset();
  set_nonblocking(in.write.get());
  set_nonblocking(out.read.get());
  set_nonblocking(err.read.get());
  if (run.input.empty()) in.write.reset();

  ProgramOutcome outcome;
  exchange(run, in, out, err, deadline, timed_out, outcome);
  in.write.reset();
  // Both output pipes are closed: the program is ending or has closed them.
  while (!child.exited()) {
    if (Clock::now() >= deadline) throw MethodFailure(timed_out);
    check_interrupt();
    std::this_thread::sleep_for(std::chrono::milliseconds(1));
  }
  const int status = child.kill_and_reap();  // also ends anything it left running in its group
  outcome.exited = WIFEXITED(status);
  outcome.exit_status = outcome.exited ? WEXITSTATUS(status) : 0;
  outcome.signal = WIFSIGNALED(status) ? WTERMSIG(status) : 0;
  return outcome;
}

std::string first_line(std::string_view text, std::size_t limit) {
  while (!text.empty()) {
    const std::size_t end = text.find('\n');
    const std::string_view line = trim(text.substr(0, end));
    if (!line.empty()) return printable(line, limit);  // escaped: a program may print anything
    if (end == std::string_view::npos) break;
    text.remove_prefix(end + 1);
  }
  return {};
}

// ---------------------------------------------------------------- the CSV exchange

std::string series_csv(std::span<const double> values, const TimeAxis& axis) {
  std::string csv = "time,value\n";
  csv.reserve(values.size() * 24 + 16);
  for (std::size_t i = 0; i < values.size(); ++i) {
    csv += axis.format(i);
    csv += ',';
    if (!std::isnan(values[i])) csv += format_double(values[i]);
    csv += '\n';
  }
  return csv;
}

namespace {

std::string shown(std::string_view text) { return quoted_for_message(text, 60); }

/// Splits the output into lines: "\n" or "\r\n" ends a line; a final line
/// end is optional.
std::vector<std::string_view> output_lines(std::string_view text) {
  std::vector<std::string_view> lines;
  while (!text.empty()) {
    const std::size_t end = text.find('\n');
    std::string_view line = text.substr(0, end);
    if (!line.empty() && line.back() == '\r') line.remove_suffix(1);
    lines.push_back(line);
    if (end == std::string_view::npos) break;
    text.remove_prefix(end + 1);
  }
  return lines;
}

std::vector<std::string_view> fields(std::string_view line) {
  std::vector<std::string_view> out;
  while (true) {
    const std::size_t comma = line.find(',');
    out.push_back(line.substr(0, comma));
    if (comma == std::string_view::npos) break;
    line.remove_prefix(comma + 1);
  }
  return out;
}

/// A cell: empty -> NaN; otherwise a finite number, or a failure naming
/// the line and column.
double cell_number(std::string_view cell, std::size_t line, const char* column, bool non_negative) {
  if (trim(cell).empty()) return kMissing;
  const auto v = parse_double(cell);
  const std::string at = "output line " + std::to_string(line) + ": " + column + " ";
  if (!v || std::isnan(*v))
    throw MethodFailure(at + shown(cell) + " is not a number (leave the cell empty for a point not filled)");
  if (!std::isfinite(*v)) throw MethodFailure(at + shown(cell) + " is not finite");
  if (non_negative && *v < 0) throw MethodFailure(at + shown(cell) + " is negative");
  return *v;
}

}  // namespace

FillResult read_filled_csv(std::string_view output, std::span<const double> values, const TimeAxis& axis) {
  const std::size_t n = values.size();
  const std::vector<std::string_view> lines = output_lines(output);
  if (lines.empty())
    throw MethodFailure("the program printed nothing; expected the header \"time,value\" and " + std::to_string(n) + " rows");
  bool with_variance = false;
  if (lines[0] == "time,value,variance") with_variance = true;
  else if (lines[0] != "time,value")
    throw MethodFailure("output line 1: expected the header \"time,value\" or \"time,value,variance\", found " +
                        shown(lines[0]));
  if (lines.size() - 1 != n)
    throw MethodFailure("the program printed " + std::to_string(lines.size() - 1) + " rows after the header, expected " +
                        std::to_string(n) + " (one per input row, in order)");
  const std::size_t width = with_variance ? 3 : 2;
  FillResult result;
  result.values.resize(n);
  if (with_variance) result.variance.assign(n, 0.0);
  for (std::size_t i = 0; i < n; ++i) {
    const std::size_t line = i + 2;
    const auto cells = fields(lines[i + 1]);
    if (cells.size() != width)
      throw MethodFailure("output line " + std::to_string(line) + ": expected " + std::to_string(width) +
                          " fields, found " + std::to_string(cells.size()));
    const std::string time = axis.format(i);
    if (cells[0] != time)
      throw MethodFailure("output line " + std::to_string(line) + ": time " + shown(cells[0]) +
                          " differs from the input's " + shown(time) + " (keep the input's times and order)");
    result.values[i] = cell_number(cells[1], line, "value", false);
    if (with_variance) {
      const double var = cell_number(cells[2], line, "variance", true);
      result.variance[i] = std::isnan(values[i]) ? var : 0.0;
    }
  }
  return result;
}

}  // namespace gapmark
