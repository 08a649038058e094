#include "gapmark/experiment/merge.hpp"

#include "gapmark/experiment/examples.hpp"

#include <fcntl.h>
#include <unistd.h>

#include <algorithm>
#include <cerrno>
#include <cmath>
#include <cstring>
#include <fstream>
#include <functional>
#include <future>
#include <map>
#include <ostream>
#include <unordered_set>

#include "gapmark/error.hpp"
#include "gapmark/output_file.hpp"
#include "gapmark/experiment/spec_safety.hpp"
#include "gapmark/experiment/record_checks.hpp"
#include "gapmark/experiment/results_io.hpp"
#include "gapmark/report/reporter.hpp"
#include "gapmark/table_io.hpp"

namespace gapmark {
namespace {

using nlohmann::json;
namespace fs = std::filesystem;

std::string short_hash(const std::string& sha) { return sha.substr(0, 12); }

/// Why two checkpoint headers of the same spec are not parts of one run.
std::string header_difference(const json& a, const json& b) {
  const auto& ca = a.at("frame").at("context");
  const auto& cb = b.at("frame").at("context");
  if (ca.value("inputs", json()) != cb.value("inputs", json()))
    return "the data files differ (their SHA-256 do not match)";
  if (ca.value("version", "") != cb.value("version", "") || ca.value("commit", "") != cb.value("commit", ""))
    return "they were run by different gapmark builds (" + ca.value("version", "?") + " " + ca.value("commit", "?") +
           " and " + cb.value("version", "?") + " " + cb.value("commit", "?") + ")";
  return "their headers differ";
}

/// A header with the shard index blanked: equal for all shards of one run.
json run_identity(json header) {
  header["shard"]["index"] = 0;
  header.erase("spec_dir");  // shards may run from different checkouts
  return header;
}

std::string finish_hint(const Shard& shard, const std::string& dir) {
  return "finish it with: gapmark run SPEC " + (shard.whole() ? std::string() : "--shard " + shard.text() + " ") +
         "--resume " + dir;
}

std::vector<MetricColumn> columns_from(const json& header, const std::string& where) {
  std::vector<MetricColumn> out;
  try {
    for (const auto& c : header.at("frame").at("columns"))
      out.push_back({c.at("name").get<std::string>(), c.at("unit").get<std::string>(),
                     direction_from_string(c.at("direction").get<std::string>()), c.at("summary").get<std::string>()});
  } catch (const json::exception& e) {
    throw InputError(where, std::string("header: malformed columns: ") + e.what());
  }
  return out;
}

/// Writes each line of `text` after `prefix` (an element nested that deep).
void write_indented(std::ostream& out, const std::string& text, const std::string& prefix) {
  out << prefix;
  std::size_t from = 0;
  for (std::size_t nl = text.find('\n'); nl != std::string::npos; nl = text.find('\n', from)) {
    out.write(text.data() + from, static_cast<std::streamsize>(nl + 1 - from));
    out << prefix;
    from = nl + 1;
  }
  out.write(text.data() + from, static_cast<std::streamsize>(text.size() - from));
}

/// Where a streamed array goes in the skeleton: after `marker`'s "[".
std::size_t splice_point(const std::string& skeleton, const std::string& marker, std::size_t from) {
  const auto at = skeleton.find(marker, from);
  if (at == std::string::npos) throw std::logic_error("results.json layout changed: '" + marker + "' not found");
  return at + marker.size() - 1;  // between '[' and ']'
}

}  // namespace

ResultSet merge_checkpoints(const std::vector<fs::path>& inputs, const MergeOptions& options) {
  if (inputs.empty()) throw InputError("merge", "no run or shard folders given");
  std::vector<std::string> names;
  std::vector<CheckpointScan> heads;
  for (const auto& input : inputs) {
    names.push_back(input.string());
    const fs::path path = checkpoint_path(input);
    std::error_code ec;
    if (!fs::exists(path, ec))
      throw InputError(input.string(), "no checkpoint (trials.jsonl) here: not the folder of a gapmark run or shard");
    heads.push_back(read_checkpoint_header(path));
  }
  const CheckpointScan& first = heads.front();
  if (options.spec && options.spec->sha256 != first.spec_sha256)
    throw InputError(options.spec->source, "is not the spec of " + names[0] + " (spec SHA-256 " +
                                               short_hash(options.spec->sha256) + "..., the run's " +
                                               short_hash(first.spec_sha256) + "...)");
  const json identity = run_identity(first.header);
  for (std::size_t i = 1; i < heads.size(); ++i) {
    const CheckpointScan& h = heads[i];
    if (h.spec_sha256 != first.spec_sha256)
      throw InputError(names[i], "a run of another spec than " + names[0] + " (spec SHA-256 " +
                                     short_hash(h.spec_sha256) + "... vs " + short_hash(first.spec_sha256) + "...)");
    if (h.shard.count != first.shard.count)
      throw InputError(names[i], "shard " + h.shard.text() + " of a split into " + std::to_string(h.shard.count) +
                                     ", but " + names[0] + " is shard " + first.shard.text() +
                                     ": shards of different splits overlap");
    if (run_identity(h.header) != identity)
      throw InputError(names[i], "not a part of the same run as " + names[0] + ": " +
                                     header_difference(h.header, first.header));
  }
  const std::size_t n = first.shard.count;
  std::vector<std::size_t> owner(n, heads.size());
  for (std::size_t i = 0; i < heads.size(); ++i) {
    const std::size_t k = heads[i].shard.index - 1;
    if (owner[k] != heads.size())
      throw InputError(names[i], "shard " + heads[i].shard.text() + " is given twice (also " + names[owner[k]] + ")");
    owner[k] = i;
  }
  std::string missing;
  for (std::size_t k = 0; k < n; ++k)
    if (owner[k] == heads.size()) missing += (missing.empty() ? "" : ", ") + Shard{k + 1, n}.text();
  if (!missing.empty()) throw InputError("merge", "missing shard " + missing + ": give the folder of every shard");

  const std::size_t total = first.grid_tasks;
  std::vector<std::vector<TrialRecord>> slots(total);
  std::vector<std::vector<Warning>> slot_warnings(total);
  for (std::size_t i = 0; i < heads.size(); ++i) {
    const CheckpointScan scan = read_checkpoint(heads[i].path, [&](StoredTask&& t) {
      slots[t.task] = std::move(t.trials);
      slot_warnings[t.task] = std::move(t.warnings);
    });
    const std::size_t expected = scan.shard.size(total);
    if (scan.done.size() != expected)
      throw InputError(names[i], std::string(scan.shard.whole() ? "the run" : "shard " + scan.shard.text()) +
                                     " is unfinished: " + std::to_string(scan.done.size()) + " of " +
                                     std::to_string(expected) + " tasks done; " + finish_hint(scan.shard, names[i]));
  }

  ResultSet results;
  try {
    const json& frame = first.header.at("frame");
    results.context = frame.at("context");
    results.series = frame.at("series");
    results.columns = columns_from(first.header, names[0]);
    results.rank_by = frame.at("rank_by").get<std::string>();
    results.alpha = stored_alpha(frame.at("alpha"), checkpoint_path(inputs[0]).string() + ":1: /frame");
    results.equivalence = frame.value("equivalence", kDefaultEquivalence);  // absent before the margin existed
  } catch (const json::exception& e) {
    throw InputError(checkpoint_path(inputs[0]).string() + ":1", std::string("malformed checkpoint header: ") + e.what());
  }
  std::size_t records = 0;
  for (const auto& s : slots) records += s.size();
  results.trials.reserve(records);
  std::unordered_set<std::string> warned;
  std::map<std::string, double> method_seconds;
  for (std::size_t t = 0; t < total; ++t) {
    for (auto& w : slot_warnings[t])
      if (warned.insert(w.code + '\x1f' + w.where).second) results.warnings.push_back(std::move(w));
    for (auto& r : slots[t]) {
      if (std::isfinite(r.seconds)) method_seconds[r.method] += r.seconds;
      results.trials.push_back(std::move(r));
    }
    std::vector<TrialRecord>().swap(slots[t]);
    std::vector<Warning>().swap(slot_warnings[t]);
  }
  json per_method = json::object();
  for (const auto& [m, s] : method_seconds) per_method[m] = s;
  results.timing = {{"fill_seconds_by_method", per_method}, {"checkpoints", heads.size()}};
  // Example windows need the data again: read from the folder of the spec
  // the user named (never from a folder a checkpoint records).
  std::string why_not = "no spec given (gapmark merge --spec SPEC reads the data again from the spec's folder)";
  if (options.spec)
    why_not = attach_examples(results, *options.spec,
                              ExampleOptions{.threads = options.threads, .allow_external = options.allow_external});
  if (!why_not.empty())
    results.warnings.push_back({"no-examples", "report", "no example windows in the report: " + why_not,
                                "give the run's spec with --spec, where its data files can be read"});
  else if (!options.allow_external && !external_commands(*options.spec).empty())
    results.warnings.push_back({"examples-without-external", "report",
                                "the example windows leave out the external methods: no outside program is "
                                "started again without --allow-external",
                                "add --allow-external to draw them"});
  return results;
}

void write_results_json(std::ostream& out, const ResultSet& results, const Summary& summary) {
  // The skeleton: every field but the trials and the summary's groups, laid
  // out by results_to_json itself; the two long arrays are spliced in.
  ResultSet frame;
  frame.context = results.context;
  frame.series = results.series;
  frame.columns = results.columns;
  frame.warnings = results.warnings;
  frame.rank_by = results.rank_by;
  frame.alpha = results.alpha;
  frame.equivalence = results.equivalence;
  frame.timing = results.timing;
  frame.examples = results.examples;
  Summary outline = summary;  // everything but the groups, which are spliced in
  outline.groups.clear();
  const std::string skeleton = results_to_json(frame, outline).dump(1) + "\n";

  const std::size_t groups_at = splice_point(skeleton, "\n  \"groups\": []", splice_point(skeleton, "\n \"summary\": {", 0));
  const std::size_t trials_at = splice_point(skeleton, "\n \"trials\": []", 0);

  const auto write_groups = [&] {
    if (summary.groups.empty()) return;
    Summary one = outline;
    one.across.clear();
    out << '\n';
    for (std::size_t i = 0; i < summary.groups.size(); ++i) {
      one.groups.assign(1, summary.groups[i]);
      if (i) out << ",\n";
      write_indented(out, summary_to_json(one, frame).at("groups").at(0).dump(1), "   ");
    }
    out << "\n  ";
  };
  const auto write_trials = [&] {
    if (results.trials.empty()) return;
    out << '\n';
    for (std::size_t i = 0; i < results.trials.size(); ++i) {
      if (i) out << ",\n";
      write_indented(out, trial_to_json(results.trials[i], results.columns).dump(1), "  ");
    }
    out << "\n ";
  };
  struct Splice {
    std::size_t at;
    std::function<void()> write;
  };
  std::vector<Splice> splices{{groups_at, write_groups}, {trials_at, write_trials}};
  if (splices[1].at < splices[0].at) std::swap(splices[0], splices[1]);
  std::size_t from = 0;
  for (const auto& s : splices) {
    out.write(skeleton.data() + from, static_cast<std::streamsize>(s.at - from));
    s.write();
    from = s.at;
  }
  out.write(skeleton.data() + from, static_cast<std::streamsize>(skeleton.size() - from));
}

namespace {

/// Writes a file through a temporary name beside `path` (TempFile): `write`
/// fills the stream; the data are flushed to disk. Returns the temporary
/// name, to be renamed once every file of the set is written. Errors name `path`.
fs::path write_temp(const fs::path& path, const std::function<void(std::ostream&)>& write) {
  TempFile temp(path);
  temp.write_with(write);
  return temp.release();
}

}  // namespace

std::vector<std::string> write_final_reports(const ResultSet& results, const fs::path& dir, unsigned threads) {
  const Summary summary = summarize(results);
  std::error_code ec;
  fs::create_directories(dir, ec);
  if (ec) throw InputError(dir.string(), "cannot create the output folder: " + ec.message());
  // Each report goes to a temporary file as soon as it is rendered (memory
  // holds one report at a time); the names are switched only when all are
  // written, results.json last, so a failure leaves no report behind.
  std::vector<std::pair<fs::path, fs::path>> staged;  // (temporary, final)
  const fs::path json_path = dir / "results.json";
  const auto reporters = ReporterRegistry::global().list();
  const bool json_wanted = std::any_of(reporters.begin(), reporters.end(), [](const auto* entry) {
    return entry->make(ParamValues{})->file_name() == "results.json";
  });
  auto write_json = [&] {
    return write_temp(json_path, [&](std::ostream& out) { write_results_json(out, results, summary); });
  };
  // results.json, the longest to write, on a thread of its own when allowed.
  std::future<fs::path> json_written;
  if (json_wanted && threads > 1) json_written = std::async(std::launch::async, write_json);
  try {
    try {
      for (const auto* entry : reporters) {
        auto reporter = entry->make(ParamValues{});
        if (reporter->file_name() == "results.json") continue;
        const fs::path path = dir / reporter->file_name();
        const std::string text = reporter->render(results, summary);
        staged.emplace_back(write_temp(path, [&](std::ostream& out) { out << text; }), path);
      }
    } catch (...) {
      if (json_written.valid()) try {
          fs::remove(json_written.get(), ec);
        } catch (...) {  // its own failure left no file; the first error is the one reported
        }
      throw;
    }
    if (json_wanted) staged.emplace_back(json_written.valid() ? json_written.get() : write_json(), json_path);
  } catch (...) {
    for (const auto& [temp, path] : staged) fs::remove(temp, ec);
    throw;
  }
  std::vector<std::string> written;
  for (std::size_t i = 0; i < staged.size(); ++i) {
    try {
      rename_over(staged[i].first, staged[i].second);
    } catch (...) {
      for (std::size_t k = i; k < staged.size(); ++k) fs::remove(staged[k].first, ec);
      throw;
    }
    written.push_back(staged[i].second.string());
  }
  return written;
}

std::string write_shard_marker(const fs::path& dir, const json& header, std::size_t tasks) {
  const json& context = header.at("frame").at("context");
  const json marker = {{"format", "gapmark-shard"},
                       {"shard", Shard{header.at("shard").at("index").get<std::size_t>(),
                                       header.at("shard").at("count").get<std::size_t>()}
                                     .text()},
                       {"spec_name", context.value("spec_name", "")},
                       {"spec_sha256", header.at("spec_sha256")},
                       {"tasks", tasks},
                       {"grid_tasks", header.at("tasks")},
                       {"checkpoint", kCheckpointFile}};
  const fs::path path = dir / kShardMarkerFile;
  write_file_atomically(path, marker.dump(1) + "\n");
  return path.string();
}

void prepare_output_folder(const fs::path& dir) {
  std::error_code ec;
  fs::create_directories(dir, ec);
  if (ec || !fs::is_directory(dir, ec))
    throw InputError(dir.string(), "cannot create the output folder: " +
                                       (ec ? ec.message() : std::string("a file of that name is in the way")));
  std::vector<std::string> names{kShardMarkerFile};
  for (const auto* entry : ReporterRegistry::global().list()) names.push_back(entry->make(ParamValues{})->file_name());
  for (const auto& name : names) {
    fs::remove(dir / name, ec);
    if (ec) throw InputError((dir / name).string(), "cannot remove the previous run's file: " + ec.message());
  }
}

}  // namespace gapmark
