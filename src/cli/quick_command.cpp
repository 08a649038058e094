// `gapmark quick`: profile one variable, write a default experiment whose
// masks mimic its own gaps, run it, and print the ranking, a recommendation
// with its reasons, and the caution that follows from the variable's kind.
#include <algorithm>
#include <filesystem>
#include <iostream>
#include <thread>

#include "commands.hpp"
#include "gapmark/data/profile.hpp"
#include "gapmark/data/quick_plan.hpp"
#include "gapmark/data/text_columns.hpp"
#include "gapmark/error.hpp"
#include "gapmark/experiment/runner.hpp"
#include "gapmark/experiment/summary.hpp"
#include "gapmark/report/reporter.hpp"
#include "gapmark/report/table_text.hpp"

namespace gapmark::cli {

void add_quick(CLI::App& app, Action& action) {
  struct Options {
    std::string input, column, kind, out = "gapmark-quick", time_column, step;
    std::vector<std::string> group;
    int replicates = 10;
    std::uint64_t seed = 1;
    unsigned threads = 0;
  };
  auto o = std::make_shared<Options>();
  auto* cmd = app.add_subcommand("quick", "One variable, one command: profile it, benchmark the default methods on masks shaped like its gaps, recommend");
  cmd->add_option("INPUT", o->input, "Regular CSV: wide (time, value columns) or long with --group")->required();
  cmd->add_option("--column,-c", o->column, "The variable (needed when the file has several)");
  cmd->add_option("--kind", o->kind, "count (counts, event totals), level (readings of a state) or smooth (smooth quantities); default: guessed")
      ->check(CLI::IsMember({"count", "level", "smooth"}));
  cmd->add_option("--out,-o", o->out, "Folder for spec.json and the results")->capture_default_str();
  cmd->add_option("--group", o->group, "Group columns of a long-layout CSV (COL or COL,COL)");
  cmd->add_option("--time-column", o->time_column, "Name of the time column (default: the first column that is not a group)");
  cmd->add_option("--step", o->step, "The time step (default: inferred)");
  cmd->add_option("--replicates", o->replicates, "Masks per scheme")->capture_default_str()->check(CLI::Range(1, 100000));
  cmd->add_option("--seed", o->seed, "Seed of the masks")->capture_default_str();
  cmd->add_option("--threads,-j", o->threads, "Worker threads (default: all cores)");
  cmd->callback([&action, o] {
    action = [o] {
      namespace fs = std::filesystem;
      data::RawReadOptions read;
      read.time_column = o->time_column;
      read.group_columns = data::split_names(o->group);
      const data::RawData raw = data::read_raw(o->input, read);
      std::string column = o->column;
      if (column.empty()) {
        if (raw.value_columns.size() != 1) {
          std::string names;
          for (const auto& v : raw.value_columns) names += (names.empty() ? "" : ", ") + v;
          throw InputError("--column", "the file has " + std::to_string(raw.value_columns.size()) + " value columns (" + names +
                                           "); choose one: quick recommends per variable");
        }
        column = raw.value_columns.front();
      }
      raw.value_index(column);
      data::ProfileOptions profile_options;
      if (!o->step.empty()) profile_options.step = Step::parse(o->step, "--step");
      const data::DataProfile profile = data::profile_data(raw, profile_options);

      // The run needs a regular grid: every record present, no duplicates.
      for (const auto& g : profile.groups)
        if (g.missing_records || g.duplicates || g.off_grid)
          throw InputError(o->input, "group '" + g.label + "' has " + std::to_string(g.missing_records) + " missing records, " +
                                         std::to_string(g.duplicates) + " duplicates and " + std::to_string(g.off_grid) +
                                         " off-grid rows; put it on a grid first: gapmark regularize " + o->input +
                                         " --step " + profile.step.iso() + " --empty " + column + "=zero|missing --out REGULAR.csv");

      std::vector<double> pooled;
      std::cout << "Profile of '" << column << "' in " << o->input << " (step " << profile.step.iso() << ")\n";
      std::vector<std::vector<std::string>> rows;
      for (const auto& s : profile.series) {
        if (s.variable != column) continue;
        if (!s.numeric)
          throw InputError(o->input + ":" + std::to_string(s.first_text_line),
                           "column '" + column + "': not a number: '" + s.first_text + "'");
        pooled.insert(pooled.end(), s.values.begin(), s.values.end());
        rows.push_back({s.label, std::to_string(s.expected), std::to_string(s.missing()),
                        data::percent(double(s.missing()) / double(std::max<std::size_t>(s.expected, 1))),
                        std::to_string(s.gap_count), std::to_string(s.longest_gap)});
      }
      std::cout << data::aligned_table({"series", "points", "missing", "share", "gaps", "longest gap"}, rows, 1);

      data::VariableKind kind;
      std::string kind_words;
      if (o->kind.empty()) {
        const auto guess = data::guess_kind(pooled);
        kind = guess.kind;
        kind_words = data::kind_name(kind) + " (guessed: " + guess.reason + "; give --kind to set it)";
      } else {
        kind = data::parse_kind(o->kind, "--kind");
        kind_words = data::kind_name(kind) + " (given)";
      }

      const fs::path dir = o->out;
      const fs::path spec_path = dir / "spec.json";
      data::QuickPlanInput input;
      // The spec names the data relative to its folder when that stays close, else absolutely.
      const fs::path data_path = fs::absolute(o->input).lexically_normal();
      const fs::path relative = data_path.lexically_proximate(fs::absolute(dir).lexically_normal());
      const auto ups = std::count(relative.begin(), relative.end(), fs::path(".."));
      input.data_file = (relative.is_relative() && ups <= 1 ? relative : data_path).generic_string();
      input.column = column;
      input.groups = raw.group_columns;
      input.time_column = o->time_column;
      if (!o->step.empty()) input.step = profile.step;
      input.kind = kind;
      input.replicates = o->replicates;
      input.seed = o->seed;
      const data::QuickPlan plan = data::plan_quick(profile, input);
      const std::string spec_text = plan.spec.dump(2) + "\n";
      write_file_atomically(spec_path, spec_text);

      std::cout << "\nKind: " << kind_words << "\n";
      std::cout << "Masks: " << (plan.replay ? "replay (the real gaps' lengths and start phases), " : "")
                << "blocks (mean length " << plan.spec["schemes"][plan.replay ? 1 : 0]["length_mean"].get<double>() << "), random; rate "
                << short_number(plan.mask_rate) << " (observed missing share " << data::percent(plan.observed_missing)
                << ", clamped to [0.05, 0.5])" << (plan.replay ? "" : "; no real gaps to replay") << "\n";
      std::string methods;
      for (const auto& m : plan.methods) methods += (methods.empty() ? "" : ", ") + m;
      std::cout << "Methods: " << methods << "\n";
      std::cout << "Holdout: last " << plan.holdout << " points (for the forecast effect); " << o->replicates
                << " replicates; spec written to " << spec_path.string() << "\n\n" << std::flush;

      ExperimentSpec spec = parse_spec(spec_text, spec_path.string(), dir);
      RunOptions run;
      run.threads = o->threads ? o->threads : std::max(1u, std::thread::hardware_concurrency());
      const ResultSet results = run_experiment(spec, run);  // with example windows
      const Summary summary = summarize(results);
      const auto written = write_reports(results, spec.output.string());
      std::cout << data::recommendation_text(data::recommend(summary, results)) << "\n";
      std::cout << "What an absent record means here:\n" << data::kind_caution(kind, column) << "\n";
      std::cout << "Filled values are estimates, not measurements. Where they feed safety decisions, follow the applicable\n"
                   "standards and have a qualified person review the choice.\n\n";
      std::cout << "Reports: " << spec.output.string() << " (" << written.size() << " files). Edit " << spec_path.string()
                << " and rerun with: gapmark run " << spec_path.string() << "\n";
      for (const auto& w : results.warnings) std::cerr << "warning: " << w.where << ": " << w.message << " (" << w.hint << ")\n";
      return kOk;
    };
  });
}

}  // namespace gapmark::cli
