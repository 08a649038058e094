#pragma once
// Automatic ARIMA order by a bounded stepwise search on AICc (Hyndman &
// Khandakar 2008):
//  1. seasonal differencing D (0 or 1, with a period of at least 2 and three
//     full periods observed): D = 1 when the seasonal strength exceeds 0.64
//     (the strength measure of Wang, Smith & Hyndman 2006, on a classical
//     decomposition; the 2008 paper used the Canova-Hansen test instead);
//  2. differencing d: KPSS tests of level stationarity (Kwiatkowski et al.
//     1992, 5% level, critical value 0.463, Bartlett window of
//     trunc(4 (n/100)^(1/4)) lags) on the seasonally differenced series,
//     differencing again while the test rejects, up to the bound;
//  3. with d and D fixed, four starting models, (2,d,2)(1,D,1),
//     (0,d,0)(0,D,0), (1,d,0)(1,D,0) and (0,d,1)(0,D,1) (seasonal parts only
//     with a period), with a constant when d + D <= 1, and the plain
//     (0,d,0)(0,D,0) without it; the best by AICc is the current model;
//  4. its neighbours: p, q, P, Q each one up or down; p and q together, P and
//     Q together, one up or down; the constant in or out. The first
//     neighbour with a lower AICc becomes the current model and step 4
//     repeats, until no neighbour improves or the model budget is spent.
//     Each neighbour's fit starts where the current model's ended (its
//     partial autocorrelations kept, a new one at zero: see warm_start),
//     and the chosen order's final, tight fit where its screening fit ended.
// Missing values: the tests of steps 1-2 use the observed values only
// (differences across a gap are missing; the KPSS sums run over the
// remaining differences as if consecutive); the fits of steps 3-4 are exact.
#include <cstddef>
#include <span>
#include <vector>

#include "gapmark/fill/arima_fit.hpp"

namespace gapmark::arima {

struct SearchBounds {
  int max_p = 5, max_q = 5;
  int max_seasonal_p = 2, max_seasonal_q = 2;
  int max_d = 2, max_seasonal_d = 1;
  int max_terms = 5;             ///< p + q + P + Q at most
  std::size_t max_models = 60;   ///< fits at most
};

struct SearchResult {
  Fit best;
  std::size_t models = 0;        ///< models fitted
  std::size_t evaluations = 0;   ///< likelihood passes over all fits
  double seasonal_strength = 0;  ///< NaN without a period
  std::vector<double> kpss;      ///< KPSS statistic at each d tried
};

/// KPSS level-stationarity statistic of the non-missing values of x.
double kpss_statistic(std::span<const double> x);
/// Seasonal strength in [0, 1]; NaN when fewer than three periods are observed.
double seasonal_strength(std::span<const double> x, std::size_t period);

/// The search. Throws MethodFailure when no model can be fitted.
SearchResult search_order(std::span<const double> y, std::size_t period, const SearchBounds& bounds);

}  // namespace gapmark::arima
