// `gapmark quick`: profile one variable, write a default experiment whose
// masks mimic its own gaps, run it, and print the ranking, a recommendation
// with its reasons, the risks to it, and the caution that follows from the
// variable's kind. The planning is in src/data/quick_setup.cpp and
// quick_risks.cpp; this file parses options and calls them.
#include <algorithm>
#include <filesystem>
#include <iostream>
#include <thread>

#include "commands.hpp"
#include "number_options.hpp"
#include "output_rules.hpp"
#include "gapmark/data/quick_plan.hpp"
#include "gapmark/data/quick_risks.hpp"
#include "gapmark/data/quick_setup.hpp"
#include "gapmark/error.hpp"
#include "gapmark/experiment/runner.hpp"
#include "gapmark/analysis/summary.hpp"
#include "gapmark/report/final_reports.hpp"
#include "gapmark/number_format.hpp"

namespace gapmark::cli {

void add_quick(CLI::App& app, Action& action) {
  struct Options {
    data::QuickRequest request;
    std::string out = "gapmark-quick";
    unsigned threads = 0;
    bool force = false;
  };
  auto o = std::make_shared<Options>();
  auto& r = o->request;
  auto* cmd = app.add_subcommand("quick", "One variable, one command: profile it, benchmark the candidate methods on masks shaped like its gaps, recommend");
  cmd->add_option("INPUT", r.input, "Regular CSV: wide (time, value columns) or long with --group")->required();
  cmd->add_option("--column,-c", r.column, "The variable (needed when the file has several)");
  cmd->add_option("--kind", r.kind, "count (counts, event totals: an absent record may mean zero), level (readings of a state) or smooth (smooth quantities); default: count only when the data show it (many exact zeros, event rows), else unknown")
      ->check(CLI::IsMember({"count", "level", "smooth"}));
  cmd->add_option("--out,-o", o->out, "Folder for spec.json and the results")->capture_default_str();
  cmd->add_option("--group", r.group, "Group columns of a long-layout CSV (COL or COL,COL)");
  cmd->add_option("--time-column", r.time_column, "Name of the time column (default: the first column that is not a group)");
  cmd->add_option("--step", r.step, "The time step (default: inferred)");
  cmd->add_option("--period", r.period, "Seasonal period in time steps (default: from the step: 24 for PT1H, 7 for P1D, 12 for P1M ...)")
      ->check(CLI::Range(2, 1000000));
  cmd->add_option("--replicates", r.replicates, "Masks per scheme")->capture_default_str()->check(CLI::Range(1, 100000));
  cmd->add_option("--seed", r.seed, "Seed of the masks")->capture_default_str()->check(whole_number(0, INT64_MAX));
  cmd->add_option("--threads,-j", o->threads, "Worker threads (default: all cores)");
  add_force_flag(*cmd, o->force);
  cmd->callback([&action, o] {
    action = [o] {
      o->request.out = o->out;
      check_output_folder(o->out);
      check_folder_holds_no_input(o->out, {o->request.input}, "give another --out");
      const data::QuickSetup setup = data::prepare_quick(o->request);
      check_output_file(setup.spec_path, o->force);
      write_file_atomically(setup.spec_path, setup.spec_text);
      std::cout << data::quick_plan_text(setup, o->request) << "\n" << std::flush;

      ExperimentSpec spec = parse_spec(setup.spec_text, setup.spec_path.string(), o->request.out);
      RunOptions run;
      run.threads = o->threads ? o->threads : std::max(1u, std::thread::hardware_concurrency());
      ResultSet results = run_experiment(spec, run);
      const Summary summary =
          finish_results(results, FinishOptions{.threads = run.threads, .spec = &spec, .allow_external = true});
      const auto written = write_final_reports(results, summary, spec.output, run.threads);
      // The verdict of the variable's own series (the file's other columns were scored too, as siblings).
      RunVerdict shown = summary.verdict;
      std::erase_if(shown.series, [&](const SeriesVerdict& v) {
        return v.series != setup.column && v.series.rfind(setup.column + "[", 0) != 0;
      });
      std::cout << "Verdict (as in every report of " << spec.output.string() << "):\n" << verdict_text(shown) << "\n";
      std::cout << data::risks_text(data::quick_risks(setup, results)) << "\n";
      std::cout << "What an absent record means here:\n" << data::kind_caution(setup.kind, setup.column) << "\n";
      std::cout << "Filled values are estimates, not measurements. Where they feed safety decisions, follow the applicable\n"
                   "standards and have a qualified person review the choice.\n\n";
      std::cout << "Reports: " << spec.output.string() << " (" << written.size() << " files). Edit " << setup.spec_path.string()
                << " and rerun with: gapmark run " << setup.spec_path.string() << "\n";
      return kOk;
    };
  });
}

}  // namespace gapmark::cli
