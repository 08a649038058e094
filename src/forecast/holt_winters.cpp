#include "gapmark/forecast/holt_winters.hpp"

#include <algorithm>
#include <cmath>
#include <exception>
#include <limits>
#include <nlopt.hpp>

namespace gapmark::forecast {

std::optional<HoltWintersState> holt_winters_initial_state(std::span<const double> y,
                                                           std::size_t period) {
  const std::size_t m = period;
  if (m < 2 || y.size() < 2 * m) return std::nullopt;
  double first = 0, second = 0;
  for (std::size_t j = 0; j < m; ++j) {
    if (!std::isfinite(y[j]) || !std::isfinite(y[m + j])) return std::nullopt;
    first += y[j];
    second += y[m + j];
  }
  const double dm = static_cast<double>(m);
  HoltWintersState s;
  s.level = first / dm;
  s.trend = (second / dm - first / dm) / dm;
  s.season.resize(m);
  for (std::size_t j = 0; j < m; ++j) s.season[j] = y[j] - s.level;
  return s;
}

namespace {

/// The recursions; `fitted` may be null when only the SSE and final state
/// are wanted (the optimiser's inner loop). The ring buffer's slot j holds
/// s_{t-m} when point t is processed.
double run_recursions(std::span<const double> y, const HoltWintersSmoothing& p, std::vector<double>& ring,
                      double& level, double& trend, double* fitted) {
  const std::size_t m = ring.size();
  double sse = 0;
  std::size_t j = 0;
  for (std::size_t t = 0; t < y.size(); ++t) {
    double& season = ring[j];
    const double base = level + trend;
    const double forecast = base + season;
    if (fitted) fitted[t] = forecast;
    const double error = y[t] - forecast;
    sse += error * error;
    const double new_level = p.alpha * (y[t] - season) + (1 - p.alpha) * base;
    trend = p.beta * (new_level - level) + (1 - p.beta) * trend;
    season = p.gamma * (y[t] - base) + (1 - p.gamma) * season;
    level = new_level;
    if (++j == m) j = 0;
  }
  return sse;
}

}  // namespace

HoltWintersRun holt_winters_filter(std::span<const double> y, const HoltWintersSmoothing& p,
                                   const HoltWintersState& initial) {
  const std::size_t m = initial.season.size();
  HoltWintersRun run;
  run.fitted.resize(y.size());
  std::vector<double> ring = initial.season;
  double level = initial.level, trend = initial.trend;
  run.sse = run_recursions(y, p, ring, level, trend, run.fitted.data());
  run.final_state.level = level;
  run.final_state.trend = trend;
  run.final_state.season.resize(m);
  for (std::size_t k = 0; k < m; ++k) run.final_state.season[k] = ring[(y.size() + k) % m];
  return run;
}

std::vector<double> holt_winters_forecast(const HoltWintersState& state, std::size_t horizon) {
  const std::size_t m = state.season.size();
  std::vector<double> out(horizon);
  for (std::size_t h = 0; h < horizon; ++h)
    out[h] = state.level + static_cast<double>(h + 1) * state.trend + state.season[h % m];
  return out;
}

namespace {

struct Problem {
  std::span<const double> y;
  const HoltWintersState* initial;
  std::vector<double> ring;  // scratch, reused by every evaluation
};

double sse_of(const std::vector<double>& x, Problem& problem) {
  problem.ring = problem.initial->season;
  double level = problem.initial->level, trend = problem.initial->trend;
  const double sse = run_recursions(problem.y, {x[0], x[1], x[2]}, problem.ring, level, trend, nullptr);
  return std::isfinite(sse) ? sse : std::numeric_limits<double>::max();
}

double objective(const std::vector<double>& x, std::vector<double>& /*grad*/, void* data) {
  return sse_of(x, *static_cast<Problem*>(data));
}

}  // namespace

std::optional<HoltWintersModel> holt_winters_fit(std::span<const double> y, std::size_t period) {
  for (double v : y)
    if (!std::isfinite(v)) return std::nullopt;
  auto initial = holt_winters_initial_state(y, period);
  if (!initial) return std::nullopt;
  Problem problem{y, &*initial, {}};

  // A fixed coarse grid picks the starting point (the SSE surface can have
  // more than one basin); BOBYQA then refines it inside the unit box.
  std::vector<double> best{0.5, 0.1, 0.1};
  double best_value = std::numeric_limits<double>::infinity();
  for (double a : {0.1, 0.3, 0.5, 0.7, 0.9})
    for (double b : {0.01, 0.1, 0.3})
      for (double g : {0.01, 0.1, 0.3, 0.6}) {
        std::vector<double> x{a, b, g};
        const double v = sse_of(x, problem);
        if (v < best_value) {
          best_value = v;
          best = x;
        }
      }

  std::vector<double> x = best;
  try {
    nlopt::opt opt(nlopt::LN_BOBYQA, 3);
    opt.set_lower_bounds({0.0, 0.0, 0.0});
    opt.set_upper_bounds({1.0, 1.0, 1.0});
    opt.set_min_objective(objective, &problem);
    opt.set_xtol_abs(1e-9);
    opt.set_ftol_rel(1e-14);
    opt.set_maxeval(5000);
    double value = 0;
    opt.optimize(x, value);
  } catch (const nlopt::roundoff_limited&) {
    // x holds the best point found; keep it if it is no worse than the grid.
  } catch (const std::exception&) {
    x = best;
  }
  for (double& v : x) v = std::clamp(v, 0.0, 1.0);
  if (sse_of(x, problem) > best_value) x = best;

  HoltWintersModel model;
  model.smoothing = {x[0], x[1], x[2]};
  model.initial = *initial;
  model.run = holt_winters_filter(y, model.smoothing, model.initial);
  if (!std::isfinite(model.run.sse)) return std::nullopt;
  return model;
}

}  // namespace gapmark::forecast
