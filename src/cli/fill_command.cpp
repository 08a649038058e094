// `gapmark fill`: fill the real gaps of a CSV with one method.
#include <algorithm>
#include <filesystem>
#include <iostream>

#include "commands.hpp"
#include "gapmark/error.hpp"
#include "gapmark/fill/fill_table_report.hpp"
#include "gapmark/wide_write.hpp"
#include "output_rules.hpp"
#include "table_options.hpp"

namespace gapmark::cli {

namespace {

/// The method call with `draws=M` added for --draws M; refused for a method
/// that cannot draw, or one whose call already asks for another number.
CallSpec with_draws(CallSpec call, std::size_t draws) {
  if (draws == 0) return call;
  const auto* entry = MethodRegistry::global().find(call.name);
  if (entry == nullptr) return call;  // binding names the unknown method
  const bool can_draw = std::any_of(entry->params.begin(), entry->params.end(),
                                    [](const ParamSpec& p) { return p.name == "draws"; });
  if (!can_draw)
    throw InputError("--draws", "method '" + call.name + "' gives no draws; kalman and arima do");
  for (const auto& [key, value] : call.args)
    if (key == "draws" && value != std::to_string(draws))
      throw InputError("--draws", "the method call already asks for draws=" + value + "; give the number once");
  if (std::none_of(call.args.begin(), call.args.end(), [](const auto& a) { return a.first == "draws"; }))
    call.args.emplace_back("draws", std::to_string(draws));
  return call;
}

struct FillOptions {
  TableOptions table;
  std::string method;
  std::string out;
  std::string fit;
  std::size_t draws = 0;
  std::uint64_t seed = 1;
  bool force = false;
  bool allow_unfilled = false;
  bool variance = false;
};

/// --out and --fit: new files (or --force), neither an input nor each other.
void check_outputs(const FillOptions& o) {
  check_output_file(o.out, o.force);
  check_file_is_no_input(o.out, {o.table.input});
  if (o.fit.empty()) return;
  if (std::filesystem::weakly_canonical(o.fit) == std::filesystem::weakly_canonical(o.out))
    throw InputError("--fit", "names the same file as --out ('" + o.out + "'); give the fit its own file");
  check_output_file(o.fit, o.force);
  check_file_is_no_input(o.fit, {o.table.input, o.out});
}

}  // namespace

void add_fill(CLI::App& app, Action& action) {
  auto o = std::make_shared<FillOptions>();
  auto* cmd = app.add_subcommand("fill", "Fill the gaps of a CSV with one method; adds a COLUMN_filled flag column per column");
  o->table.declare(*cmd);
  cmd->add_option("--method,-m", o->method, "Method and parameters, e.g. linear or kalman:model=trend")->required();
  cmd->add_option("--out,-o", o->out, "Output CSV")->required();
  cmd->add_option("--fit", o->fit,
                  "Also write what the method estimated per column (variances, coefficients, lambda and rank, "
                  "log-likelihood, AICc, convergence) to this JSON file; the method then runs on columns with "
                  "nothing to fill too");
  cmd->add_option("--draws", o->draws,
                  "Also write M conditional sample paths per column (COLUMN_draw_1 .. COLUMN_draw_M), each the column "
                  "filled anew from the method's model, for multiple imputation (methods with a draws parameter: "
                  "kalman, arima)")
      ->check(whole_number(1, kMaxDraws));
  cmd->add_option("--seed", o->seed, "Seed of the draws (with the column's name); default 1");
  add_force_flag(*cmd, o->force);
  cmd->add_flag("--allow-unfilled", o->allow_unfilled,
                "Write the file even when the method leaves points unfilled (they stay empty); without it that is an "
                "error (exit 2) and nothing is written");
  cmd->add_flag("--variance", o->variance,
                "Add a COLUMN_variance column: the method's predictive variance at each filled point (empty at "
                "observed points, and everywhere for methods that give none)");
  cmd->callback([&action, o] {
    action = [o] {
      check_outputs(*o);
      auto method = MethodRegistry::global().bind(with_draws(CallSpec::parse(o->method, "--method"), o->draws),
                                                  "--method");
      WideTable table = o->table.read();
      auto columns = select_columns(table, o->table.columns);
      const FillTableOutput result = fill_table(table, columns, method, o->table.period, !o->fit.empty(), o->seed);
      const std::size_t unfilled = total_unfilled(result);
      if (unfilled > 0 && !o->allow_unfilled)
        throw InputError(o->table.input, first_unfilled_message(result, method) + " (--allow-unfilled writes the file anyway)");
      const std::string csv =
          write_wide_csv(table, fill_extra_columns(table, columns, result, {.variance = o->variance, .draws = o->draws}));
      if (!o->fit.empty()) write_file_atomically(o->fit, fits_json(method.label, result.reports).dump(2) + "\n");
      write_file_atomically(o->out, csv);
      if (table.added_rows > 0)
        std::cerr << "added " << table.added_rows << (table.added_rows == 1 ? " row for the " : " rows for the ")
                  << table.axis.step().iso() << (table.added_rows == 1 ? " step" : " steps")
                  << " the file had no row for (their values were missing)\n";
      std::cerr << fill_report_text(result, method, {.variance = o->variance, .draws = o->draws}, !o->fit.empty());
      if (unfilled > 0)
        std::cerr << "wrote " << o->out << " with " << unfilled << (unfilled == 1 ? " point" : " points")
                  << " left unfilled (--allow-unfilled)\n";
      return kOk;
    };
  });
}

}  // namespace gapmark::cli
