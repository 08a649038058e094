// `gapmark quick` before the run (see quick_setup.hpp).
#include "gapmark/data/quick_setup.hpp"

#include <algorithm>

#include "gapmark/data/text_columns.hpp"
#include "gapmark/error.hpp"
#include "gapmark/number_format.hpp"

namespace gapmark::data {

namespace {

namespace fs = std::filesystem;

/// --column, or the file's only value column.
std::string choose_column(const RawData& raw, const QuickRequest& request) {
  if (!request.column.empty()) return request.column;
  if (raw.value_columns.size() != 1) {
    std::string names;
    for (const auto& v : raw.value_columns) names += (names.empty() ? "" : ", ") + v;
    throw InputError("--column", "the file has " + std::to_string(raw.value_columns.size()) + " value columns (" + names +
                                     "); choose one: quick recommends per variable");
  }
  return raw.value_columns.front();
}

/// The column's values over every group, one after the other; a cell that
/// is not a number is an error naming its line.
std::vector<double> pooled_values(const QuickSetup& setup, const QuickRequest& request) {
  std::vector<double> pooled;
  for (const auto& s : setup.profile.series) {
    if (s.variable != setup.column) continue;
    if (!s.numeric)
      throw InputError(request.input + ":" + std::to_string(s.first_text_line),
                       "column '" + setup.column + "': not a number: '" + s.first_text + "'");
    pooled.insert(pooled.end(), s.values.begin(), s.values.end());
  }
  return pooled;
}

/// --kind, or a guess from the values and the rows that are not one per step.
void choose_kind(QuickSetup& setup, const QuickRequest& request, const std::vector<double>& pooled) {
  if (!request.kind.empty()) {
    setup.kind = parse_kind(request.kind, "--kind");
    setup.kind_given = true;
    return;
  }
  std::size_t event_rows = 0;
  for (const auto& g : setup.profile.groups) event_rows += g.duplicates + g.off_grid;  // not one row per step
  const KindGuess guess = guess_kind(pooled, event_rows);
  setup.kind = guess.kind;
  setup.kind_reason = guess.reason;
}

/// The run needs a regular grid: every record present, no duplicates. The
/// error names the regularize command, with zero for empty intervals only
/// for a count.
void check_regular_grid(const QuickSetup& setup, const QuickRequest& request) {
  const std::string& column = setup.column;
  const bool count = setup.kind == VariableKind::Count;
  for (const auto& g : setup.profile.groups)
    if (g.missing_records || g.duplicates || g.off_grid)
      throw InputError(request.input,
                       "group '" + g.label + "' has " + std::to_string(g.missing_records) + " missing records, " +
                           std::to_string(g.duplicates) + " duplicates and " + std::to_string(g.off_grid) +
                           " off-grid rows; put it on a grid first: gapmark regularize " + request.input + " --step " +
                           setup.profile.step.iso() +
                           (count ? " --agg " + column + "=sum --empty " + column + "=zero" : " --empty " + column + "=missing") +
                           " --out REGULAR.csv" +
                           (count ? "" : " (an absent record stays unknown; give --kind count if it means zero)"));
}

/// The other value columns that are numbers throughout.
std::vector<std::string> numeric_siblings(const RawData& raw, const QuickSetup& setup) {
  std::vector<std::string> out;
  for (const auto& name : raw.value_columns) {
    if (name == setup.column) continue;
    bool numeric = true, any = false;
    for (const auto& s : setup.profile.series)
      if (s.variable == name) numeric = numeric && s.numeric, any = true;
    if (any && numeric) out.push_back(name);
  }
  return out;
}

/// The spec names the data relative to its folder when that stays close, else absolutely.
std::string data_path_from(const fs::path& dir, const std::string& input) {
  const fs::path data_path = fs::absolute(input).lexically_normal();
  const fs::path relative = data_path.lexically_proximate(fs::absolute(dir).lexically_normal());
  const auto ups = std::count(relative.begin(), relative.end(), fs::path(".."));
  return (relative.is_relative() && ups <= 1 ? relative : data_path).generic_string();
}

QuickPlanInput plan_input(const QuickSetup& setup, const QuickRequest& request, const RawData& raw) {
  QuickPlanInput input;
  input.data_file = data_path_from(request.out, request.input);
  input.column = setup.column;
  input.siblings = setup.siblings;
  input.groups = raw.group_columns;
  input.time_column = request.time_column;
  if (!request.step.empty()) input.step = setup.profile.step;
  input.period = request.period;
  input.kind = setup.kind;
  input.replicates = request.replicates;
  input.seed = request.seed;
  return input;
}

}  // namespace

QuickSetup prepare_quick(const QuickRequest& request) {
  QuickSetup setup;
  RawReadOptions read;
  read.time_column = request.time_column;
  read.group_columns = split_names(request.group);
  const RawData raw = read_raw(request.input, read);
  setup.column = choose_column(raw, request);
  raw.value_index(setup.column);
  ProfileOptions profile_options;
  if (!request.step.empty()) profile_options.step = Step::parse(request.step, "--step");
  profile_options.period = request.period;
  setup.profile = profile_data(raw, profile_options);
  const std::vector<double> pooled = pooled_values(setup, request);
  choose_kind(setup, request, pooled);
  check_regular_grid(setup, request);
  setup.siblings = numeric_siblings(raw, setup);
  setup.spec_path = fs::path(request.out) / "spec.json";
  setup.plan = plan_quick(setup.profile, plan_input(setup, request, raw));
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
