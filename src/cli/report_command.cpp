// `gapmark report`: re-render every report (tables, HTML page, methods text,
// references) from a results.json, without running anything again.
#include <iostream>

#include "commands.hpp"
#include "gapmark/experiment/results_io.hpp"
#include "gapmark/report/final_reports.hpp"
#include "output_rules.hpp"

namespace gapmark::cli {

void add_report(CLI::App& app, Action& action) {
  struct Options {
    std::string results;
    std::string out;
    bool quiet = false;
    bool force = false;
  };
  auto o = std::make_shared<Options>();
  auto* cmd = app.add_subcommand("report", "Write every report again from a results file");
  cmd->add_option("RESULTS", o->results, "A results.json written by `gapmark run`")->required();
  cmd->add_option("--out,-o", o->out, "Output folder")->required();
  cmd->add_flag("--quiet,-q", o->quiet, "Do not list the files written");
  add_force_flag(*cmd, o->force);
  cmd->callback([&action, o] {
    action = [o] {
      const ResultSet results = read_results(o->results);
      check_output_dir(o->out, {o->results}, o->force, "give another --out");
      const auto written = write_final_reports(results, o->out);
      if (!o->quiet)
        for (const auto& path : written) std::cerr << "wrote " << path << "\n";
      return kOk;
    };
  });
}

}  // namespace gapmark::cli
