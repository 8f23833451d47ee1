// Package calibrate fits a cylinder design's poorly known parameters to
// measured wall temperatures: the pressure recovery first; with two
// points or more, a factor on the forced convection; with three or more,
// a factor on the heat load (the cooling share). It minimises the sum of
// squared residuals, model less measurement over each point's stated
// uncertainty, within bounds, by the Levenberg-Marquardt method (Levenberg
// 1944; Marquardt 1963; Press et al., Numerical Recipes, 3rd ed. 2007,
// Sec. 15.5.2), with the Jacobian by central differences. It refuses a fit
// the points cannot identify (the smallest singular value of the scaled
// Jacobian under 1e-3 of the largest: two parameters the points move
// together) and says why. The parameters' standard errors come from the
// covariance (J^T J)^-1 scaled by the residual variance when there are more
// points than parameters, by the stated uncertainties otherwise.
//
// A measurement at the spark-plug seat is not the mean fin-root wall the
// estimator gives: the seat runs hotter by an offset the user states
// (Point.Offset), which the fit subtracts.
package calibrate
