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
// (Point.Check); more parameters than points; a parameter the points'
// temperatures do not move with at all (its range-scaled column of the
// Jacobian under 1e-6 of a point's uncertainty; one parameter the
// temperature moves with is identifiable from a single point); two or more
// parameters the points move together (the smallest singular value of the
// range-scaled Jacobian under 1e-6 of the largest); a parameter the points
// leave free over more than a quarter of its range (one standard error);
// and a best fit pressing on the end of what a parameter may take
// (ErrAtBound: the model cannot meet the points with plausible values):
// within 1e-3 of the end of its plausible range, or where a point loses its
// equilibrium, with the sum of squares still falling past it. That error
// says the value the points need for that parameter alone (the other
// parameters held at their fit), solved over the estimator's own range,
// which is wider than the plausible one, or "beyond" the end of that range
// (a pressure recovery above 1 is impossible) or of the values with an
// equilibrium; and how many kelvin the model misses the worst point by at
// the end the fit reached. A point missed by more than three of its
// uncertainties is named in Fit.Warnings.
//
// A trial step that takes a point past its equilibrium (the balance finds
// none below cylinder.SaneWallLimit, and the temperature stays at that cap
// however the parameters move) is refused like a step that raises the sum
// of squares, so that a fit started far from the answer (a hot reading
// that needs a recovery of 0.1 against the default 0.8) does not stall on
// the cap; a start without an equilibrium is replaced by the best of a
// grid over each parameter's range when one has it.
//
// A measurement at the spark-plug seat is not the mean fin-root wall the
// estimator gives: the seat runs hotter by an offset the user states
// (Point.Offset), which the fit subtracts, or which it fits (Offset).
package calibrate
