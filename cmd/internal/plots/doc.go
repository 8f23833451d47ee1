// Package plots draws finmarch figures with gonum.org/v1/plot: the air
// march along the fin passages, temperatures against road speed or through
// a ride with the limits, and a comparison of designs. Values arrive in
// display units; the caller converts from SI.
//
// Every figure has one legend, below its panels where no curve can pass;
// a figure keyed by design names each design's colour once and each line
// kind once. Titles and axis labels wrap to the figure, and Figure.Check
// reports a text off the canvas, texts over each other or a line across
// the legend.
package plots
