// `gapmark mask`: hide values in a CSV with one scheme, so the same masks can
// be fed to any other tool.
#include <iostream>

#include "commands.hpp"
#include "gapmark/error.hpp"
#include "gapmark/mask/mask_table.hpp"
#include "gapmark/number_format.hpp"
#include "gapmark/wide_write.hpp"
#include "number_options.hpp"
#include "output_rules.hpp"
#include "table_options.hpp"

namespace gapmark::cli {

void add_mask(CLI::App& app, Action& action) {
  struct Options {
    TableOptions table;
    std::string scheme;
    std::string out;
    bool force = false;
    std::uint64_t seed = 1;
    int replicate = 0;
    std::size_t holdout = 0;
    bool flags = false;
  };
  auto o = std::make_shared<Options>();
  auto* cmd = app.add_subcommand("mask", "Hide known values in a CSV the way a scheme says, and write the result");
  o->table.declare(*cmd);
  cmd->add_option("--scheme,-s", o->scheme, "Scheme and rate, e.g. random:rate=0.2 or blocks:length_mean=12,rate=0.1")->required();
  cmd->add_option("--out,-o", o->out, "Output CSV")->required();
  add_force_flag(*cmd, o->force);
  cmd->add_option("--seed", o->seed, "Seed; with the same seed `gapmark run` draws the same masks")
      ->capture_default_str()
      ->check(whole_number(0, INT64_MAX));
  cmd->add_option("--replicate", o->replicate, "Replicate number (0-based), as in an experiment")
      ->capture_default_str()
      ->check(whole_number(0, 99999));
  cmd->add_option("--holdout", o->holdout, "Never mask the last N points")->capture_default_str()->check(whole_number(0, 100000000));
  cmd->add_flag("--flags", o->flags, "Add a 0/1 column COLUMN_masked per masked column");
  cmd->callback([&action, o] {
    action = [o] {
      check_output_file(o->out, o->force);
      check_file_is_no_input(o->out, {o->table.input});
      CallSpec call = CallSpec::parse(o->scheme, "--scheme");
      auto rate_text = call.take("rate");
      if (!rate_text) throw InputError("--scheme", "give the rate, e.g. " + call.name + ":rate=0.2");
      auto rate = parse_double(*rate_text);
      if (!rate) throw InputError("--scheme", "rate: expected a number, found '" + *rate_text + "'");
      check_rate(*rate, "--scheme");
      auto scheme = SchemeRegistry::global().bind(call, "--scheme");
      WideTable table = o->table.read();
      auto columns = select_columns(table, o->table.columns);
      MaskTableOptions options{o->seed, o->replicate, o->holdout, o->table.period, *rate};
      auto result = mask_table(table, columns, scheme, options);
      std::vector<ExtraColumn> extra;
      if (o->flags)
        for (std::size_t k = 0; k < columns.size(); ++k)
          extra.emplace_back(table.columns[columns[k]] + "_masked", result.flags[k]);
      write_file_atomically(o->out, write_wide_csv(table, extra));
      for (std::size_t k = 0; k < columns.size(); ++k)
        std::cerr << "masked " << result.hidden[k] << " values in '" << table.columns[columns[k]] << "'\n";
      return kOk;
    };
  });
}

}  // namespace gapmark::cli
