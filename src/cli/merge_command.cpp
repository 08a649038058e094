// `gapmark merge`: combine the folders of every shard of a run (`gapmark run
// --shard K/N`) into the results and reports a single run would write.
#include <algorithm>
#include <iostream>
#include <thread>

#include "commands.hpp"
#include "gapmark/experiment/merge.hpp"

namespace gapmark::cli {

void add_merge(CLI::App& app, Action& action) {
  struct Options {
    std::vector<std::string> inputs;
    std::string out;
    bool quiet = false;
  };
  auto o = std::make_shared<Options>();
  auto* cmd = app.add_subcommand("merge", "Combine the shard folders of one run into its results and reports");
  cmd->add_option("FOLDER", o->inputs, "The output folder of every shard (any order)")->required();
  cmd->add_option("--out,-o", o->out, "Folder for results.json and the reports")->required();
  cmd->add_flag("--quiet,-q", o->quiet, "Do not report the files written");
  cmd->callback([&action, o] {
    action = [o] {
      std::vector<std::filesystem::path> inputs(o->inputs.begin(), o->inputs.end());
      const unsigned threads = std::max(1u, std::thread::hardware_concurrency());
      ResultSet results = merge_checkpoints(inputs, threads);
      prepare_output_folder(o->out);
      const auto written = write_final_reports(results, o->out, threads);
      if (!o->quiet)
        std::cerr << "merged " << inputs.size() << " folders (" << results.trials.size() << " trials); wrote "
                  << written.size() << " files to " << o->out << "\n";
      return kOk;
    };
  });
}

}  // namespace gapmark::cli
