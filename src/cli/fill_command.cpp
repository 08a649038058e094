// `gapmark fill`: fill the real gaps of a CSV with one method.
#include <iostream>

#include "commands.hpp"
#include "gapmark/error.hpp"
#include "gapmark/fill/fill_table.hpp"
#include "gapmark/wide_write.hpp"
#include "output_rules.hpp"
#include "table_options.hpp"

namespace gapmark::cli {

void add_fill(CLI::App& app, Action& action) {
  struct Options {
    TableOptions table;
    std::string method;
    std::string out;
    bool force = false;
  };
  auto o = std::make_shared<Options>();
  auto* cmd = app.add_subcommand("fill", "Fill the gaps of a CSV with one method; adds a COLUMN_filled flag column per column");
  o->table.declare(*cmd);
  cmd->add_option("--method,-m", o->method, "Method and parameters, e.g. linear or kalman:model=trend")->required();
  cmd->add_option("--out,-o", o->out, "Output CSV")->required();
  add_force_flag(*cmd, o->force);
  cmd->callback([&action, o] {
    action = [o] {
      check_output_file(o->out, o->force);
      check_file_is_no_input(o->out, {o->table.input});
      auto method = MethodRegistry::global().bind(CallSpec::parse(o->method, "--method"), "--method");
      WideTable table = o->table.read();
      auto columns = select_columns(table, o->table.columns);
      auto result = fill_table(table, columns, method, o->table.period);
      std::vector<ExtraColumn> extra;
      for (std::size_t k = 0; k < columns.size(); ++k)
        extra.emplace_back(table.columns[columns[k]] + "_filled", result.flags[k]);
      write_file_atomically(o->out, write_wide_csv(table, extra));
      bool complete = true;
      for (const auto& r : result.reports) {
        std::cerr << r.column << ": filled " << r.filled << " of " << r.gaps << " gaps";
        if (r.clipped) std::cerr << " (" << r.clipped << " moved into the bounds)";
        if (!r.failure.empty()) std::cerr << " (" << method.label << " failed: " << r.failure << ")";
        std::cerr << "\n";
        complete = complete && r.filled == r.gaps;
      }
      if (!complete) std::cerr << "warning: some gaps remain empty; try another method or edges=nearest\n";
      return kOk;
    };
  });
}

}  // namespace gapmark::cli
