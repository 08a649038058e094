// Streaming runs: an interrupted run resumed, and a run split into shards and
// merged, give results.json byte for byte equal (outside "timing") to one
// uninterrupted run; the checkpoint survives a cut-short last line and
// refuses what does not belong to it.
#include <doctest/doctest.h>

#include <atomic>
#include <sstream>

#include "gapmark/error.hpp"
#include "gapmark/experiment/checkpoint.hpp"
#include "gapmark/experiment/merge.hpp"
#include "gapmark/analysis/results_json.hpp"
#include "gapmark/experiment/results_io.hpp"
#include "gapmark/experiment/runner.hpp"
#include "gapmark/report/final_reports.hpp"
#include "scale_helpers.hpp"

using namespace gapmark;
using namespace gapmark::scale_testing;

namespace {

struct Fixture {
  fs::path root, data;
  ExperimentSpec spec;
  explicit Fixture(const std::string& name, int seed = 11) {
    root = fresh_dir(name);
    data = root / "sensors.csv";
    write_file(data, invented_csv(3, 400));
    spec = parse_spec(small_spec(data, root / "out", seed), (root / "spec.json").string(), root);
  }
  FolderRunStatus run(const fs::path& dir, unsigned threads = 2, std::optional<Shard> shard = {},
                      bool resume = false, const std::atomic<bool>* stop = nullptr,
                      std::function<void(std::size_t, std::size_t)> progress = {}) const {
    RunOptions options;
    options.threads = threads;
    options.stop = stop;
    options.progress = std::move(progress);
    return run_into_folder(spec, options, {.dir = dir, .resume = resume, .shard = shard});
  }
};

std::size_t count_lines(const fs::path& path) {
  const std::string text = read_file(path);
  return static_cast<std::size_t>(std::count(text.begin(), text.end(), '\n'));
}

/// The message of the InputError `f` throws ("" when it throws none).
template <class F>
std::string input_error(F&& f) {
  try {
    f();
  } catch (const InputError& e) {
    return e.what();
  }
  return "";
}

}  // namespace

TEST_CASE("a folder run equals the in-memory run, at any thread count") {
  const Fixture fx("folder_vs_memory");
  const auto one = fx.run(fx.root / "one", 1);
  REQUIRE(one.complete());
  CHECK(one.total == 3u * 3 * 3);  // series x (scheme, rate) cells x replicates
  fx.run(fx.root / "three", 3);
  CHECK(without_timing(fx.root / "one/results.json") == without_timing(fx.root / "three/results.json"));
  // One line per task after the header.
  CHECK(count_lines(fx.root / "one" / kCheckpointFile) == 1 + one.total);

  RunOptions options;
  options.threads = 2;
  ResultSet memory = run_experiment(fx.spec, options);
  const Summary memory_summary =
      finish_results(memory, FinishOptions{.threads = 2, .spec = &fx.spec, .allow_external = true});
  write_final_reports(memory, memory_summary, fx.root / "memory");
  CHECK(without_timing(fx.root / "memory/results.json") == without_timing(fx.root / "one/results.json"));
  for (const char* file : {"ranking.md", "ranking.csv", "methods.md"})
    CHECK_MESSAGE(read_file(fx.root / "memory" / file) == read_file(fx.root / "one" / file), file);
}

TEST_CASE("an interrupted run, resumed, gives the uninterrupted run's results") {
  const Fixture fx("resume");
  fx.run(fx.root / "whole");

  std::atomic<bool> stop{false};
  const auto first = fx.run(fx.root / "cut", 1, {}, false, &stop, [&](std::size_t done, std::size_t) {
    if (done >= 7) stop = true;
  });
  CHECK_FALSE(first.complete());
  CHECK(first.done == 7);
  CHECK_FALSE(fs::exists(fx.root / "cut/results.json"));  // nothing looks finished
  CHECK(count_lines(fx.root / "cut" / kCheckpointFile) == 1 + 7);

  // A crash in the middle of a write leaves a partial last line.
  {
    std::ofstream out(fx.root / "cut" / kCheckpointFile, std::ios::app | std::ios::binary);
    out << R"({"task": 30, "trials": [{"status": "ok", "mas)";
  }
  const auto scan = read_checkpoint(fx.root / "cut" / kCheckpointFile);
  CHECK(scan.cut_short);
  CHECK(scan.done.size() == 7);

  const auto second = fx.run(fx.root / "cut", 2, {}, true);
  REQUIRE(second.complete());
  CHECK(second.resumed == 7);
  CHECK(without_timing(fx.root / "cut/results.json") == without_timing(fx.root / "whole/results.json"));
  CHECK(read_file(fx.root / "cut/ranking.md") == read_file(fx.root / "whole/ranking.md"));
  // The partial line was cut off, not kept: every line is whole JSON.
  std::istringstream lines(read_file(fx.root / "cut" / kCheckpointFile));
  std::string line;
  std::size_t n = 0;
  while (std::getline(lines, line)) {
    CHECK_FALSE(nlohmann::json::parse(line, nullptr, false).is_discarded());
    ++n;
  }
  CHECK(n == 1 + second.total);

  // Resuming a finished run runs nothing and writes the same results again.
  const auto third = fx.run(fx.root / "cut", 2, {}, true);
  CHECK(third.resumed == third.total);
  CHECK(without_timing(fx.root / "cut/results.json") == without_timing(fx.root / "whole/results.json"));
}

TEST_CASE("a checkpoint refuses another spec, a damaged middle line, a missing folder") {
  const Fixture fx("refuse");
  std::atomic<bool> stop{false};
  fx.run(fx.root / "run", 1, {}, false, &stop, [&](std::size_t done, std::size_t) {
    if (done >= 4) stop = true;
  });
  const Fixture other("refuse_other", 12);  // same data, another seed: another spec
  RunOptions options;
  const std::string message =
      input_error([&] { run_into_folder(other.spec, options, {.dir = fx.root / "run", .resume = true, .shard = std::nullopt}); });
  CHECK(message.find("another spec") != std::string::npos);
  CHECK(message.find('\n') == std::string::npos);
  CHECK(message.find((fx.root / "run" / kCheckpointFile).string()) == 0);

  CHECK(input_error([&] { fx.run(fx.root / "run", 1, Shard{2, 3}, true); }).find("not 2/3") != std::string::npos);
  CHECK(input_error([&] { fx.run(fx.root / "nowhere", 1, {}, true); }).find("nothing to resume") !=
        std::string::npos);

  // Damage the second line: only a last line may be cut short.
  std::string text = read_file(fx.root / "run" / kCheckpointFile);
  const auto second_line = text.find('\n') + 1;
  text.insert(second_line + 10, "#");
  write_file(fx.root / "run" / kCheckpointFile, text);
  CHECK(input_error([&] { read_checkpoint(fx.root / "run" / kCheckpointFile); }).find(":2: damaged line") !=
        std::string::npos);
}

TEST_CASE("shards merged give the single run's results; merge refuses a wrong set of shards") {
  const Fixture fx("shards");
  fx.run(fx.root / "whole");
  std::vector<fs::path> shards;
  std::size_t tasks = 0;
  for (std::size_t k = 1; k <= 3; ++k) {
    const fs::path dir = fx.root / ("shard" + std::to_string(k));
    const auto status = fx.run(dir, 1, Shard{k, 3});
    REQUIRE(status.complete());
    tasks += status.total;
    CHECK(fs::exists(dir / kShardMarkerFile));
    CHECK_FALSE(fs::exists(dir / "results.json"));
    shards.push_back(dir);
  }
  CHECK(tasks == 27);
  // Any order; the example windows read the data from the spec's folder.
  ResultSet merged = merge_checkpoints({shards[2], shards[0], shards[1]}, MergeOptions{.spec = &fx.spec});
  const Summary merged_summary = finish_results(merged, FinishOptions{.spec = &fx.spec});
  write_final_reports(merged, merged_summary, fx.root / "merged");
  CHECK(without_timing(fx.root / "merged/results.json") == without_timing(fx.root / "whole/results.json"));
  for (const char* file : {"ranking.md", "ranking.csv", "methods.md"})
    CHECK_MESSAGE(read_file(fx.root / "merged" / file) == read_file(fx.root / "whole" / file), file);

  CHECK(input_error([&] { merge_checkpoints({shards[0], shards[1]}); }).find("missing shard 3/3") !=
        std::string::npos);
  CHECK(input_error([&] { merge_checkpoints({shards[0], shards[1], shards[2], shards[1]}); })
            .find("shard 2/3 is given twice") != std::string::npos);
  CHECK(input_error([&] { merge_checkpoints({shards[0], fx.root / "whole"}); }).find("different splits") !=
        std::string::npos);
  CHECK(input_error([&] { merge_checkpoints({fx.root / "empty"}); }).find("no checkpoint") != std::string::npos);

  const Fixture other("shards_other", 12);
  other.run(fx.root / "other1", 1, Shard{1, 3});
  CHECK(input_error([&] { merge_checkpoints({fx.root / "other1", shards[1], shards[2]}); }).find("another spec") !=
        std::string::npos);

  std::atomic<bool> stop{false};
  fx.run(fx.root / "half3", 1, Shard{3, 3}, false, &stop, [&](std::size_t done, std::size_t) {
    if (done >= 2) stop = true;
  });
  const std::string unfinished = input_error([&] { merge_checkpoints({shards[0], shards[1], fx.root / "half3"}); });
  CHECK(unfinished.find("shard 3/3 is unfinished: 2 of 9 tasks done") != std::string::npos);
  CHECK(unfinished.find("--shard 3/3 --resume") != std::string::npos);
}

TEST_CASE("results.json written piece by piece equals the reporter's text") {
  const Fixture fx("streamed_json");
  RunOptions options;
  options.threads = 2;
  // A failing method (a period longer than the data needs) adds failed
  // records and NaN metrics; examples exercise an extra top-level member.
  auto spec = parse_spec(small_spec(fx.data, fx.root / "out", 11, R"(["linear", "seasonal-mean", "mean"])"),
                         "spec.json", fx.root);
  ResultSet results = run_experiment(spec, options);
  results.warnings.push_back({"test-warning", "here", "a message", "a hint"});
  results.examples = ExampleWindows{.window = 10, .top = 1, .series = {ExampleWindow{}}};
  results.examples->series[0].note = "a note";
  const Summary summary = summarize(results);
  std::ostringstream streamed;
  write_results_json(streamed, results, summary);
  CHECK(streamed.str() == results_to_json(results, summary).dump(1) + "\n");

  ResultSet empty = results;
  empty.trials.clear();
  const Summary none = summarize(empty);
  std::ostringstream streamed_empty;
  write_results_json(streamed_empty, empty, none);
  CHECK(streamed_empty.str() == results_to_json(empty, none).dump(1) + "\n");

  // The same files whether results.json is written beside the others or after them.
  write_final_reports(results, fx.root / "final", 2);
  write_final_reports(results, summary, fx.root / "plain", 1);
  std::size_t files = 0;
  for (const auto& entry : fs::directory_iterator(fx.root / "plain")) {
    ++files;
    CHECK_MESSAGE(read_file(entry.path()) == read_file(fx.root / "final" / entry.path().filename()),
                  entry.path().filename().string());
  }
  CHECK(files >= 3);
}

TEST_CASE("a task line reads back to the same records, NaN and extreme values included") {
  const Fixture fx("task_line");
  const auto data = load_data(fx.spec);
  const auto header = checkpoint_header(fx.spec, data, Shard{});
  const CheckpointGrid grid(header, "test");
  std::vector<TrialRecord> trials;
  const std::vector<double> values{0.1, -0.0, 1e-300, 4.9e-324, 1.7976931348623157e308, std::nan(""), 2.0 / 3.0};
  for (std::size_t m = 0; m < grid.methods(); ++m) {
    TrialRecord r = grid.blank(5, m);
    r.status = m == 0 ? gapmark::TrialStatus::Failed : gapmark::TrialStatus::Ok;
    r.reason = m == 0 ? "a reason, with \"quotes\"\nand a newline" : "";
    r.masked = 17;
    r.unfilled = m == 0 ? 17 : 0;
    r.seconds = 0.25;
    for (std::size_t c = 0; c < grid.columns(); ++c) r.metrics.push_back(values[(c + m) % values.size()]);
    trials.push_back(r);
  }
  const fs::path path = fx.root / kCheckpointFile;
  {
    auto writer = CheckpointWriter::create(path, header);
    writer.append(task_line(5, trials, {{"code", "where", "message", "hint"}}));
  }
  std::vector<StoredTask> stored;
  read_checkpoint(path, [&](StoredTask&& t) { stored.push_back(std::move(t)); });
  REQUIRE(stored.size() == 1);
  CHECK(stored[0].task == 5);
  REQUIRE(stored[0].trials.size() == trials.size());
  for (std::size_t m = 0; m < trials.size(); ++m) {
    const auto& a = trials[m];
    const auto& b = stored[0].trials[m];
    CHECK(b.name() == a.name());
    CHECK(b.status == a.status);
    CHECK(b.reason == a.reason);
    CHECK(b.unfilled == a.unfilled);
    for (std::size_t c = 0; c < a.metrics.size(); ++c) {
      if (std::isnan(a.metrics[c])) CHECK(std::isnan(b.metrics[c]));
      else CHECK(std::signbit(b.metrics[c]) == std::signbit(a.metrics[c]));
      if (!std::isnan(a.metrics[c])) CHECK(b.metrics[c] == a.metrics[c]);
    }
  }
  REQUIRE(stored[0].warnings.size() == 1);
  CHECK(stored[0].warnings[0].hint == "hint");
}

TEST_CASE("shard K/N: parsing and a share of the grid by index mod N") {
  CHECK(Shard::parse("2/5", "--shard") == Shard{2, 5});
  CHECK(Shard::parse("1/1", "--shard").whole());
  for (const char* bad : {"0/3", "4/3", "3", "a/b", "1/0", "-1/3", "1/3x", "/3", ""})
    CHECK_THROWS_AS(Shard::parse(bad, "--shard"), InputError);
  // Every task in exactly one of N shards; shares differ by at most one.
  for (std::size_t total : {0u, 1u, 7u, 30u}) {
    std::vector<int> owners(total, 0);
    std::size_t smallest = total, largest = 0;
    for (std::size_t k = 1; k <= 4; ++k) {
      const Shard s{k, 4};
      const auto mine = s.tasks(total);
      CHECK(mine.size() == s.size(total));
      smallest = std::min(smallest, mine.size());
      largest = std::max(largest, mine.size());
      for (auto t : mine) {
        CHECK(s.owns(t));
        ++owners[t];
      }
    }
    for (int o : owners) CHECK(o == 1);
    CHECK(largest - smallest <= 1);
  }
}
