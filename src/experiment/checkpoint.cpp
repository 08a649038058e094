#include "gapmark/experiment/checkpoint.hpp"

#include <fcntl.h>
#include <sys/stat.h>
#include <unistd.h>

#include <cerrno>
#include <chrono>
#include <cmath>
#include <cstring>
#include <fstream>
#include <unordered_set>

#include "gapmark/json_number.hpp"
#include "gapmark/error.hpp"
#include "gapmark/experiment/record_checks.hpp"

namespace gapmark {
namespace {

using nlohmann::json;


std::int64_t now_seconds() {
  return std::chrono::duration_cast<std::chrono::seconds>(std::chrono::steady_clock::now().time_since_epoch())
      .count();
}

[[noreturn]] void fail(const std::filesystem::path& path, const std::string& what, int error) {
  throw InputError(path.string(), what + ": " + std::strerror(error));
}

int open_or_fail(const std::filesystem::path& path, int flags) {
  const auto parent = path.parent_path();
  if (!parent.empty()) {
    std::error_code ec;
    std::filesystem::create_directories(parent, ec);
    if (ec) throw InputError(path.string(), "cannot create folder " + parent.string() + ": " + ec.message());
  }
  // Never through a symbolic link (one planted or carried by git would
  // redirect the truncation), and only into a regular file.
  // O_NONBLOCK: a FIFO at the name must not block the open.
  const int fd = ::open(path.c_str(), flags | O_NOFOLLOW | O_NONBLOCK | O_CLOEXEC, 0666);
  if (fd < 0 && errno == ELOOP)
    throw InputError(path.string(), "is a symbolic link; gapmark never writes through a link (remove it)");
  if (fd < 0) fail(path, "cannot write the checkpoint", errno);
  struct stat st {};
  if (::fstat(fd, &st) != 0 || !S_ISREG(st.st_mode)) {
    ::close(fd);
    throw InputError(path.string(), "is not a regular file; gapmark writes only regular files");
  }
  ::fcntl(fd, F_SETFL, ::fcntl(fd, F_GETFL) & ~O_NONBLOCK);
  return fd;
}

void write_all(int fd, const std::string& text, const std::filesystem::path& path) {
  std::size_t written = 0;
  while (written < text.size()) {
    const ssize_t n = ::write(fd, text.data() + written, text.size() - written);
    if (n < 0) {
      if (errno == EINTR) continue;
      fail(path, "cannot write the checkpoint", errno);
    }
    written += static_cast<std::size_t>(n);
  }
}

}  // namespace

std::filesystem::path checkpoint_path(const std::filesystem::path& dir_or_file) {
  std::error_code ec;
  if (std::filesystem::is_regular_file(dir_or_file, ec)) return dir_or_file;
  return dir_or_file / kCheckpointFile;
}

json checkpoint_header(const ExperimentSpec& spec, const LoadedData& data, const Shard& shard) {
  const ResultSet frame = results_frame(spec, data);
  json schemes = json::array();
  for (const auto& plan : spec.schemes) schemes.push_back({{"label", plan.scheme.label}, {"rates", plan.rates}});
  json methods = json::array();
  for (const auto& m : spec.methods) methods.push_back(m.label);
  return {{"format", "gapmark-checkpoint"},
          {"version", kCheckpointVersion},
          {"spec_sha256", spec.sha256},
          {"spec_dir", std::filesystem::absolute(spec.base_dir).lexically_normal().generic_string()},
          {"shard", {{"index", shard.index}, {"count", shard.count}}},
          {"tasks", build_tasks(spec, data).size()},
          {"grid", {{"schemes", schemes}, {"replicates", spec.replicates}, {"methods", methods}}},
          {"frame",
           {{"context", context_to_json(frame.context)},
            {"series", series_to_json(frame.series)},
            {"columns", columns_to_json(frame.columns)},
            {"rank_by", frame.rank_by},
            {"alpha", frame.alpha},
            {"equivalence", frame.equivalence}}}};
}

namespace {

StoredObject header_frame(const json& header, const std::string& where) {
  return StoredObject(header, where).object("frame");
}

}  // namespace

RunContext header_context(const json& header, const std::string& where) {
  return context_from_json(header_frame(header, where).object("context"));
}

ResultSet stored_frame(const json& header, const std::string& where) {
  const StoredObject frame = header_frame(header, where);
  ResultSet results;
  results.context = context_from_json(frame.object("context"));
  results.series = series_from_json(frame, "series");
  results.columns = columns_from_json(frame, "columns");
  results.rank_by = frame.text("rank_by");
  results.alpha = stored_alpha(frame.at("alpha"), frame.where("alpha"));
  if (frame.has("equivalence")) results.equivalence = frame.number("equivalence");  // absent before the margin existed
  return results;
}

std::string task_line(std::size_t task, const std::vector<TrialRecord>& trials,
                      const std::vector<Warning>& warnings) {
  json t = json::array();
  for (const auto& r : trials) {
    json metrics = json::array();
    for (double v : r.metrics) metrics.push_back(json_number(v));
    json rec = {{"status", trial_status_name(r.status)}, {"masked", r.masked}, {"unfilled", r.unfilled},
                {"seconds", json_number(r.seconds)}, {"metrics", std::move(metrics)}};
    if (!r.reason.empty()) rec["reason"] = r.reason;
    if (r.clipped) rec["clipped"] = r.clipped;
    if (!r.fit.empty()) rec["fit"] = fit_to_json(r.fit);
    t.push_back(std::move(rec));
  }
  json w = json::array();
  for (const auto& x : warnings)
    w.push_back({{"code", x.code}, {"where", x.where}, {"message", x.message}, {"hint", x.hint}});
  json line = {{"task", task}, {"trials", std::move(t)}, {"warnings", std::move(w)}};
  return line.dump() + "\n";
}

// ---------------------------------------------------------------- writer

CheckpointWriter CheckpointWriter::create(const std::filesystem::path& path, const json& header) {
  CheckpointWriter w(path, open_or_fail(path, O_WRONLY | O_CREAT | O_TRUNC));
  w.append(header.dump() + "\n");
  w.sync();
  return w;
}

CheckpointWriter CheckpointWriter::resume(const std::filesystem::path& path, std::uint64_t valid_bytes) {
  CheckpointWriter w(path, open_or_fail(path, O_WRONLY | O_APPEND));
  if (::ftruncate(w.fd_, static_cast<off_t>(valid_bytes)) != 0) fail(path, "cannot cut off a partial line", errno);
  return w;
}

CheckpointWriter::CheckpointWriter(CheckpointWriter&& other) noexcept
    : path_(std::move(other.path_)), fd_(other.fd_), last_sync_(other.last_sync_) {
  other.fd_ = -1;
}

CheckpointWriter::~CheckpointWriter() {
  if (fd_ >= 0) ::close(fd_);
}

void CheckpointWriter::append(const std::string& line) {
  std::lock_guard lock(mutex_);
  write_all(fd_, line, path_);
  // A finished line is in the kernel's hands at once (it survives the
  // process being killed); reaching the disk itself is checked every few
  // seconds, which bounds what a power cut can lose.
  const auto now = now_seconds();
  if (now - last_sync_ >= 5) {
    last_sync_ = now;
    if (::fdatasync(fd_) != 0 && errno != EINVAL && errno != EROFS) fail(path_, "cannot flush the checkpoint", errno);
  }
}

void CheckpointWriter::sync() {
  std::lock_guard lock(mutex_);
  last_sync_ = now_seconds();
  if (::fdatasync(fd_) != 0 && errno != EINVAL && errno != EROFS) fail(path_, "cannot flush the checkpoint", errno);
}

// ---------------------------------------------------------------- grid

CheckpointGrid::CheckpointGrid(const json& header, const std::string& where) {
  try {
    const auto& grid = header.at("grid");
    for (const auto& s : series_from_json(StoredObject(header, where).object("frame"), "series"))
      series_.push_back(s.label);
    for (const auto& k : grid.at("schemes")) {
      schemes_.push_back(k.at("label").get<std::string>());
      rates_.push_back(k.at("rates").get<std::vector<double>>());
    }
    const int replicates = grid.at("replicates").get<int>();
    methods_ = grid.at("methods").get<std::vector<std::string>>();
    columns_ = header.at("frame").at("columns").size();
    for (std::size_t s = 0; s < series_.size(); ++s)
      for (std::size_t k = 0; k < schemes_.size(); ++k)
        for (std::size_t r = 0; r < rates_[k].size(); ++r)
          for (int rep = 0; rep < replicates; ++rep) tasks_.push_back({s, k, r, rep});
    if (header.at("tasks").get<std::size_t>() != tasks_.size())
      throw InputError(where, "header: the grid holds " + std::to_string(tasks_.size()) + " tasks, not " +
                                  header.at("tasks").dump());
  } catch (const json::exception& e) {
    throw InputError(where, std::string("header: malformed grid: ") + e.what());
  }
}

TrialRecord CheckpointGrid::blank(std::size_t task, std::size_t method) const {
  const Task& t = tasks_.at(task);
  TrialRecord r;
  r.series = series_[t.series];
  r.scheme = schemes_[t.scheme];
  r.rate = rates_[t.scheme][t.rate];
  r.replicate = t.replicate;
  r.method = methods_.at(method);
  return r;
}

// ---------------------------------------------------------------- reader

namespace {

StoredTask parse_task(const json& j, const CheckpointGrid& grid, const std::string& where) {
  StoredTask out;
  try {
    out.task = stored_count(j.at("task"), where, "task");
    if (out.task >= grid.tasks())
      throw InputError(where, "task " + std::to_string(out.task) + " is outside the grid of " +
                                  std::to_string(grid.tasks()) + " tasks");
    const auto& trials = j.at("trials");
    if (!trials.is_array() || trials.size() != grid.methods())
      throw InputError(where, std::to_string(trials.size()) + " trials for " + std::to_string(grid.methods()) +
                                  " methods");
    for (std::size_t m = 0; m < trials.size(); ++m) {
      const auto& t = trials[m];
      TrialRecord r = grid.blank(out.task, m);
      r.status = parse_trial_status(t.at("status").get<std::string>(), where);
      if (auto it = t.find("reason"); it != t.end()) r.reason = it->get<std::string>();
      r.masked = stored_count(t.at("masked"), where, "masked");
      r.unfilled = stored_count(t.at("unfilled"), where, "unfilled");
      if (auto it = t.find("clipped"); it != t.end()) r.clipped = stored_count(*it, where, "clipped");
      if (r.unfilled > r.masked) throw InputError(where, "more points unfilled than masked");
      if (auto it = t.find("fit"); it != t.end()) r.fit = fit_from_json(*it, where + ": fit");
      r.seconds = stored_metric(t.at("seconds"), where, "seconds");
      if (r.seconds < 0) throw InputError(where, "seconds: expected a number >= 0 or null");
      const auto& metrics = t.at("metrics");
      if (!metrics.is_array() || metrics.size() != grid.columns())
        throw InputError(where, std::to_string(metrics.size()) + " metric values for " +
                                    std::to_string(grid.columns()) + " columns");
      r.metrics.reserve(metrics.size());
      for (const auto& v : metrics) r.metrics.push_back(stored_metric(v, where, "metrics"));
      out.trials.push_back(std::move(r));
    }
    for (const auto& w : j.at("warnings"))
      out.warnings.push_back({w.at("code").get<std::string>(), w.at("where").get<std::string>(),
                              w.at("message").get<std::string>(), w.at("hint").get<std::string>()});
  } catch (const json::exception& e) {
    throw InputError(where, std::string("malformed task line: ") + e.what());
  }
  return out;
}

}  // namespace

namespace {

CheckpointScan parse_header(const std::filesystem::path& path, std::istream& in, std::string& line) {
  CheckpointScan scan;
  scan.path = path;
  const std::string file = path.string();
  if (!std::getline(in, line) || in.eof())
    throw InputError(file + ":1", "not a gapmark checkpoint (no complete header line)");
  scan.header = json::parse(line, nullptr, false);
  if (scan.header.is_discarded() || !scan.header.is_object() ||
      scan.header.value("format", "") != "gapmark-checkpoint")
    throw InputError(file + ":1", "not a gapmark checkpoint");
  if (scan.header.value("version", 0) != kCheckpointVersion)
    throw InputError(file + ":1", "checkpoint version " + scan.header.value("version", json()).dump() +
                                      " is not supported (this tool writes " +
                                      std::to_string(kCheckpointVersion) + ")");
  try {
    scan.spec_sha256 = scan.header.at("spec_sha256").get<std::string>();
    scan.shard.index = scan.header.at("shard").at("index").get<std::size_t>();
    scan.shard.count = scan.header.at("shard").at("count").get<std::size_t>();
    scan.grid_tasks = scan.header.at("tasks").get<std::size_t>();
  } catch (const json::exception& e) {
    throw InputError(file + ":1", std::string("malformed checkpoint header: ") + e.what());
  }
  if (scan.shard.count < 1 || scan.shard.index < 1 || scan.shard.index > scan.shard.count)
    throw InputError(file + ":1", "malformed checkpoint header: shard " + scan.shard.text());
  return scan;
}

std::ifstream open_checkpoint(const std::filesystem::path& path) {
  std::error_code ec;
  if (std::filesystem::exists(path, ec) && !std::filesystem::is_regular_file(path, ec))
    throw InputError(path.string(), "is not a regular file (a folder, device or FIFO); not a checkpoint");
  std::ifstream in(path, std::ios::binary);
  if (!in) throw InputError(path.string(), "no checkpoint here (cannot read it)");
  return in;
}

}  // namespace

CheckpointScan read_checkpoint_header(const std::filesystem::path& path) {
  std::ifstream in = open_checkpoint(path);
  std::string line;
  return parse_header(path, in, line);
}

CheckpointScan read_checkpoint(const std::filesystem::path& path, const std::function<void(StoredTask&&)>& on_task) {
  std::ifstream in = open_checkpoint(path);
  const std::string file = path.string();
  std::string line;
  CheckpointScan scan = parse_header(path, in, line);
  const CheckpointGrid grid(scan.header, file + ":1");
  scan.valid_bytes = line.size() + 1;

  std::unordered_set<std::size_t> seen;
  std::size_t line_no = 1, damaged_line = 0;
  while (std::getline(in, line)) {
    ++line_no;
    const bool terminated = !in.eof();
    if (damaged_line)
      throw InputError(file + ":" + std::to_string(damaged_line), "damaged line before the end of the checkpoint");
    json j = json::parse(line, nullptr, false);
    if (!terminated || j.is_discarded()) {
      // Cut short by a crash: only acceptable as the last line.
      damaged_line = line_no;
      scan.cut_short = true;
      continue;
    }
    const std::string where = file + ":" + std::to_string(line_no);
    StoredTask task = parse_task(j, grid, where);
    if (!scan.shard.owns(task.task))
      throw InputError(where, "task " + std::to_string(task.task) + " does not belong to shard " + scan.shard.text());
    scan.valid_bytes += line.size() + 1;
    if (!seen.insert(task.task).second) continue;
    scan.done.push_back(task.task);
    if (on_task) on_task(std::move(task));
  }
  return scan;
}

}  // namespace gapmark
