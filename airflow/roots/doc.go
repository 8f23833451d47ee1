// Package roots finds a root of a function of one variable inside a
// bracket by Brent's method (R. P. Brent, Algorithms for Minimization
// without Derivatives, Prentice-Hall 1973, Ch. 4, procedure zero): inverse
// quadratic interpolation and secant steps, safeguarded by bisection, so it
// converges whenever the bracket holds a sign change and never leaves it.
package roots
