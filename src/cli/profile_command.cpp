// `gapmark profile`: what is missing in raw data, and how: missing records
// and missing values apart, duplicates, gap lengths, phases, a screen for
// value-dependent missingness; as text, JSON, and a completeness picture.
#include <iostream>

#include "commands.hpp"
#include "output_rules.hpp"
#include "table_options.hpp"
#include "gapmark/data/completeness_svg.hpp"
#include "gapmark/data/profile.hpp"

namespace gapmark::cli {

void add_profile(CLI::App& app, Action& action) {
  struct Options {
    std::string input;
    std::vector<std::string> group, columns;
    std::string time_column, step, svg;
    std::size_t period = 0;
    bool json = false;
    bool force = false;
  };
  auto o = std::make_shared<Options>();
  auto* cmd = app.add_subcommand("profile", "Profile raw data: missing records and missing values, duplicates, gap lengths, phases");
  cmd->add_option("INPUT", o->input, "CSV, wide (time, value columns) or long (group columns, time, value columns); rows in any order")->required();
  cmd->add_option("--group", o->group, "Group columns of a long-layout CSV (COL or COL,COL)");
  cmd->add_option("--column,-c", o->columns, "A value column to profile (repeat; default: every other column)");
  cmd->add_option("--time-column", o->time_column, "Name of the time column (default: the first column that is not a group)");
  cmd->add_option("--step", o->step, "The expected step, ISO 8601 (PT15M, PT1H, P1D, P1M) or an integer (default: the most common spacing)");
  cmd->add_option("--period", o->period, "Seasonal period in steps (default: from the step); adds missingness by its phase")
      ->check(CLI::Range(2, 1000000));
  cmd->add_flag("--json", o->json, "Write the profile as JSON on stdout");
  cmd->add_option("--svg", o->svg, "Also draw a completeness picture into this SVG file");
  add_force_flag(*cmd, o->force);
  cmd->callback([&action, o] {
    action = [o] {
      if (!o->svg.empty()) {
        check_output_file(o->svg, o->force);
        check_file_is_no_input(o->svg, {o->input});
      }
      const RawData raw = read_raw(o->input, raw_read_options(o->time_column, o->group, o->columns));
      data::ProfileOptions options;
      if (!o->step.empty()) options.step = Step::parse(o->step, "--step");
      options.period = o->period;
      const data::DataProfile profile = data::profile_data(raw, options);
      std::cout << (o->json ? data::profile_json(profile) : data::profile_text(profile));
      if (!o->svg.empty()) {
        write_file_atomically(o->svg, data::completeness_svg(profile));
        if (!o->json) std::cout << "Wrote the completeness picture to " << o->svg << "\n";
      }
      return kOk;
    };
  });
}

}  // namespace gapmark::cli
