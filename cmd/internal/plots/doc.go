// Package plots draws finmarch figures with gonum.org/v1/plot: the air
// march along the fin passages, temperatures against road speed with the
// limit, and a comparison of designs. Values arrive in display units; the
// caller converts from SI.
package plots
