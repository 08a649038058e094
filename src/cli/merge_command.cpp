// `gapmark merge`: combine the folders of every shard of a run (`gapmark run
// --shard K/N`) into the results and reports a single run would write.
#include <algorithm>
#include <iostream>
#include <optional>
#include <thread>

#include "commands.hpp"
#include "gapmark/experiment/merge.hpp"
#include "gapmark/interrupted.hpp"
#include "gapmark/report/final_reports.hpp"
#include "output_rules.hpp"
#include "stop_signals.hpp"

namespace gapmark::cli {

void add_merge(CLI::App& app, Action& action) {
  struct Options {
    std::vector<std::string> inputs;
    std::string out;
    std::string spec;
    bool quiet = false;
    bool force = false;
    bool allow_external = false;
  };
  auto o = std::make_shared<Options>();
  auto* cmd = app.add_subcommand("merge", "Combine the shard folders of one run into its results and reports");
  cmd->add_option("FOLDER", o->inputs, "The output folder of every shard (any order)")->required();
  cmd->add_option("--out,-o", o->out, "Folder for results.json and the reports")->required();
  cmd->add_option("--spec", o->spec,
                  "The run's spec: its folder is where the data are read again for the example windows (without "
                  "it the reports have none); its SHA-256 must match the shards'");
  cmd->add_flag("--quiet,-q", o->quiet, "Do not report the files written");
  add_force_flag(*cmd, o->force);
  add_consent_flag(*cmd, o->allow_external);
  cmd->callback([&action, o] {
    action = [o] {
      std::vector<std::filesystem::path> inputs(o->inputs.begin(), o->inputs.end());
      const unsigned threads = std::max(1u, std::thread::hardware_concurrency());
      std::optional<ExperimentSpec> spec;
      std::vector<std::filesystem::path> read{};
      for (const auto& input : inputs) read.push_back(checkpoint_path(input));
      if (!o->spec.empty()) {
        spec = load_spec(o->spec);
        read.push_back(o->spec);
      }
      check_output_dir(o->out, read, o->force, "give another --out");
      const OutputDir folder_made(o->out);
      const FolderLock lock(o->out);
      remove_stale_temp_files(o->out);
      // Ctrl-C while outside programs draw the example windows ends them at
      // once and writes nothing; without them the default (quit) is right.
      if (spec && o->allow_external && !external_commands(*spec).empty())
        catch_stop_signals(StoppedWork::merge_with_programs);
      ResultSet results = merge_checkpoints(inputs, MergeOptions{.spec = spec ? &*spec : nullptr});
      Summary summary;
      bool stopped = false;
      try {
        summary = finish_results(
            results, FinishOptions{.threads = threads, .spec = spec ? &*spec : nullptr, .allow_external = o->allow_external});
      } catch (const Interrupted&) {
        stopped = true;  // an outside program drawing an example window was stopped
      }
      if (stopped || stop_flag().load()) {
        std::cerr << "interrupted: nothing written to " << o->out << "; run the merge again\n";
        return stopped_exit_status();
      }
      prepare_output_folder(o->out);
      const auto written = write_final_reports(results, summary, o->out, threads);
      if (!o->quiet)
        std::cerr << "merged " << inputs.size() << " folders (" << results.trials.size() << " trials); wrote "
                  << written.size() << " files to " << o->out << "\n";
      return kOk;
    };
  });
}

}  // namespace gapmark::cli
