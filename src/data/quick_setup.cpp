// `gapmark quick` before the run (see quick_setup.hpp).
#include "gapmark/data/quick_setup.hpp"

#include <algorithm>

#include "gapmark/data/text_columns.hpp"
#include "gapmark/error.hpp"
#include "gapmark/number_format.hpp"

namespace gapmark::data {

QuickSetup prepare_quick(const QuickRequest& request) {
  namespace fs = std::filesystem;
  QuickSetup setup;
  RawReadOptions read;
  read.time_column = request.time_column;
  read.group_columns = split_names(request.group);
  const RawData raw = read_raw(request.input, read);
  setup.column = request.column;
  if (setup.column.empty()) {
    if (raw.value_columns.size() != 1) {
      std::string names;
      for (const auto& v : raw.value_columns) names += (names.empty() ? "" : ", ") + v;
      throw InputError("--column", "the file has " + std::to_string(raw.value_columns.size()) + " value columns (" + names +
                                       "); choose one: quick recommends per variable");
    }
    setup.column = raw.value_columns.front();
  }
  raw.value_index(setup.column);
  ProfileOptions profile_options;
  if (!request.step.empty()) profile_options.step = Step::parse(request.step, "--step");
  profile_options.period = request.period;
  setup.profile = profile_data(raw, profile_options);
  const std::string& column = setup.column;

  std::vector<double> pooled;
  for (const auto& s : setup.profile.series) {
    if (s.variable != column) continue;
    if (!s.numeric)
      throw InputError(request.input + ":" + std::to_string(s.first_text_line),
                       "column '" + column + "': not a number: '" + s.first_text + "'");
    pooled.insert(pooled.end(), s.values.begin(), s.values.end());
  }
  std::size_t event_rows = 0;
  for (const auto& g : setup.profile.groups) event_rows += g.duplicates + g.off_grid;  // not one row per step

  if (request.kind.empty()) {
    const KindGuess guess = guess_kind(pooled, event_rows);
    setup.kind = guess.kind;
    setup.kind_reason = guess.reason;
  } else {
    setup.kind = parse_kind(request.kind, "--kind");
    setup.kind_given = true;
  }

  // The run needs a regular grid: every record present, no duplicates.
  for (const auto& g : setup.profile.groups)
    if (g.missing_records || g.duplicates || g.off_grid)
      throw InputError(request.input,
                       "group '" + g.label + "' has " + std::to_string(g.missing_records) + " missing records, " +
                           std::to_string(g.duplicates) + " duplicates and " + std::to_string(g.off_grid) +
                           " off-grid rows; put it on a grid first: gapmark regularize " + request.input + " --step " +
                           setup.profile.step.iso() +
                           (setup.kind == VariableKind::Count
                                ? " --agg " + column + "=sum --empty " + column + "=zero"
                                : " --empty " + column + "=missing") +
                           " --out REGULAR.csv" +
                           (setup.kind == VariableKind::Count ? "" : " (an absent record stays unknown; give --kind count if it means zero)"));

  // Siblings: the other value columns that are numbers throughout.
  for (const auto& name : raw.value_columns) {
    if (name == column) continue;
    bool numeric = true, any = false;
    for (const auto& s : setup.profile.series)
      if (s.variable == name) numeric = numeric && s.numeric, any = true;
    if (any && numeric) setup.siblings.push_back(name);
  }

  const fs::path dir = request.out;
  setup.spec_path = dir / "spec.json";
  QuickPlanInput input;
  // The spec names the data relative to its folder when that stays close, else absolutely.
  const fs::path data_path = fs::absolute(request.input).lexically_normal();
  const fs::path relative = data_path.lexically_proximate(fs::absolute(dir).lexically_normal());
  const auto ups = std::count(relative.begin(), relative.end(), fs::path(".."));
  input.data_file = (relative.is_relative() && ups <= 1 ? relative : data_path).generic_string();
  input.column = column;
  input.siblings = setup.siblings;
  input.groups = raw.group_columns;
  input.time_column = request.time_column;
  if (!request.step.empty()) input.step = setup.profile.step;
  input.period = request.period;
  input.kind = setup.kind;
  input.replicates = request.replicates;
  input.seed = request.seed;
  setup.plan = plan_quick(setup.profile, input);
  setup.spec_text = setup.plan.spec.dump(2) + "\n";
  return setup;
}

std::string quick_plan_text(const QuickSetup& setup, const QuickRequest& request) {
  const QuickPlan& plan = setup.plan;
  std::string out = "Profile of '" + setup.column + "' in " + request.input + " (step " + setup.profile.step.iso() + ")\n";
  std::vector<std::vector<std::string>> rows;
  for (const auto& s : setup.profile.series) {
    if (s.variable != setup.column) continue;
    rows.push_back({s.label, std::to_string(s.expected), std::to_string(s.missing()),
                    rounded_percent(double(s.missing()) / double(std::max<std::size_t>(s.expected, 1))),
                    std::to_string(s.gap_count), std::to_string(s.longest_gap)});
  }
  out += aligned_table({"series", "points", "missing", "share", "gaps", "longest gap"}, rows, 1);
  out += "\nKind: " + kind_name(setup.kind) +
         (setup.kind_given ? " (given)"
                           : " (guessed: " + setup.kind_reason + "; give --kind count|level|smooth to set it)") + "\n";
  out += "Masks: " + std::string(plan.replay ? "replay (the real gaps' lengths and start phases), " : "") +
         "blocks (mean length " + short_number(plan.spec["schemes"][plan.replay ? 1 : 0]["length_mean"].get<double>()) +
         "), random; rate " + short_number(plan.mask_rate) + " (observed missing share " + rounded_percent(plan.observed_missing) +
         ", clamped to [0.05, 0.5])" + (plan.replay ? "" : "; no real gaps to replay") + "\n";
  std::string methods;
  for (const auto& m : plan.methods) methods += (methods.empty() ? "" : ", ") + m;
  out += "Methods: " + methods + "\n";
  if (!setup.siblings.empty()) {
    std::string names;
    for (const auto& n : setup.siblings) names += (names.empty() ? "" : ", ") + n;
    out += "Other columns: " + names + " (low-rank learns from them; they are benchmarked too)\n";
  }
  out += "Period: " + (plan.period >= 2 ? std::to_string(plan.period) + (request.period ? " (given)" : " (from the step)")
                                        : std::string("none (give --period N for seasonal-mean)")) + "\n";
  out += "Holdout: last " + std::to_string(plan.holdout) + " points (for the forecast effect); " +
         std::to_string(request.replicates) + " replicates; spec written to " + setup.spec_path.string() + "\n";
  return out;
}

}  // namespace gapmark::data
