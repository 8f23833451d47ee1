// Package calibrate fits a cylinder design's poorly known parameters to
// measured wall temperatures: the pressure recovery first; with more
// points (at least one a parameter), a factor on the forced convection, a
// factor on the heat load (Load.Scaled: the cooling share or the given
// heats) and an offset of the measuring place. It minimises the sum of
// squared residuals, model plus offset less measurement over each point's
// stated uncertainty, within bounds, by the Levenberg-Marquardt method
// (Levenberg 1944; Marquardt 1963; Press et al., Numerical Recipes, 3rd ed.
// 2007, Sec. 15.5.2), with the Jacobian by central differences. The
// standard errors come from the covariance (J^T J)^-1, scaled by the
// residual variance per degree of freedom when there are more points than
// parameters (Numerical Recipes Sec. 15.4.2), by the stated uncertainties
// otherwise.
//
// It refuses, saying why (our criteria): an implausible point
// (Point.Check); more parameters than points; parameters the points move
// together (the smallest singular value of the range-scaled Jacobian under
// 1e-6 of the largest); a parameter the points leave free over more than a
// quarter of its range (one standard error); and a best fit resting within
// 1e-3 of the end of a parameter's range (ErrAtBound: the model cannot meet
// the points with plausible values). A point missed by more than three of
// its uncertainties is named in Fit.Warnings.
//
// A measurement at the spark-plug seat is not the mean fin-root wall the
// estimator gives: the seat runs hotter by an offset the user states
// (Point.Offset), which the fit subtracts, or which it fits (Offset).
package calibrate
