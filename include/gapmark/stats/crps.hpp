#pragma once
// The continuous ranked probability score of a Gaussian predictive
// distribution N(mu, sigma^2) at an outcome y, in closed form
// (Gneiting & Raftery 2007, J. Amer. Statist. Assoc. 102, eq. 21):
//   CRPS = sigma * ( z (2 Phi(z) - 1) + 2 phi(z) - 1/sqrt(pi) ),  z = (y - mu) / sigma,
// which equals the defining integral  int (F(x) - 1{x >= y})^2 dx.
// With sigma = 0 the distribution is a point mass and CRPS = |y - mu|.
#include <span>

namespace gapmark::stats {

/// CRPS of N(mu, sigma^2) at y. sigma must be >= 0; NaN for a negative or
/// non-finite sigma, or a non-finite mu or y.
double gaussian_crps(double mu, double sigma, double y);

/// Half-width of the central interval of N(0, 1) holding probability `level`:
/// the (1 + level) / 2 quantile. NaN when level is outside (0, 1).
double gaussian_central_half_width(double level);

}  // namespace gapmark::stats
