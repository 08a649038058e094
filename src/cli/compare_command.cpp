// `gapmark compare`: is the current run worse than a baseline? Prints a
// summary and the worst cells; exit status 1 when a cell regressed, 0 when
// none did, 2 when the files cannot be compared (no cell in common).
#include <iostream>

#include "commands.hpp"
#include "output_rules.hpp"
#include "gapmark/compare/compare.hpp"
#include "gapmark/experiment/results_io.hpp"
#include "gapmark/table_io.hpp"

namespace gapmark::cli {

void add_compare(CLI::App& app, Action& action) {
  struct Options {
    std::string baseline, current, tolerance, tolerance_file, json;
    bool all = false, force = false;
  };
  auto o = std::make_shared<Options>();
  auto* cmd = app.add_subcommand(
      "compare", "Compare two results files of the same spec; exit 1 when a metric got significantly worse");
  cmd->add_option("BASELINE", o->baseline, "The reference results.json")->required();
  cmd->add_option("CURRENT", o->current, "The results.json to check")->required();
  cmd->add_option("--tolerance", o->tolerance,
                  "Metrics to compare and their allowed worsening: \"rmse=5%,mae=0.01,*=1%\" (% = relative; * = every "
                  "metric). Without it only the ranking metric is compared, with a tolerance of 1e-6 relative");
  cmd->add_option("--tolerance-file", o->tolerance_file,
                  "JSON {\"rmse\": {\"relative\": 0.05}, \"mae\": {\"absolute\": 0.01}}; --tolerance wins over it");
  cmd->add_option("--json", o->json, "Also write the comparison as JSON to this file");
  add_force_flag(*cmd, o->force);
  cmd->add_flag("--all", o->all, "Print every changed metric of every cell (default: a summary and the worst 20 cells)");
  cmd->callback([&action, o] {
    action = [o] {
      if (!o->json.empty()) {
        check_output_file(o->json, o->force);
        check_file_is_no_input(o->json, {o->baseline, o->current});
      }
      Tolerances tolerances;
      if (!o->tolerance_file.empty()) tolerances = read_tolerance_file(o->tolerance_file, tolerances);
      if (!o->tolerance.empty()) tolerances = parse_tolerance_text(o->tolerance, "--tolerance", tolerances);
      const ResultSet baseline = read_results(o->baseline);
      const ResultSet current = read_results(o->current);
      std::vector<std::string> names;
      for (const auto& c : baseline.columns) names.push_back(c.name);
      check_tolerance_metrics(tolerances, names, o->tolerance.empty() ? "--tolerance-file" : "--tolerance");
      const Comparison c = compare_results(baseline, current, tolerances, o->baseline, o->current);
      std::cout << comparison_text(c, o->all ? 0 : 20);
      if (!o->json.empty()) write_file_atomically(o->json, comparison_to_json(c).dump(1) + "\n");
      return c.regressed.empty() ? kOk : kRegression;
    };
  });
}

}  // namespace gapmark::cli
