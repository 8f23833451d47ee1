// Package optimise chooses the fins of a cylinder: one fin set's pitch,
// height, root and tip thickness and count, or both sets' together, for
// the coolest wall or the least fin mass at or below a limit, within the
// casting limits of a process (fins.Process), at one operating point of
// the estimator (airflow/cylinder). Solve returns the optimum, the
// trade-off front of wall temperature against fin mass among the designs
// it evaluated, and, when no design holds the limit, how close it came.
//
// With a Problem.Step (the command line's --step, 0.5 mm by default) the
// lengths are searched on whole multiples of the step only, the sizes a
// pattern maker works to: the optimum needs no rounding afterwards, it is
// estimated as it would be made and keeps every limit, and no design a
// step away in any combination of a set's variables does better. A step
// of zero searches the lengths continuously.
//
// The search (Minimize, search.go) is a multi-start pattern search: a
// full grid over the box, Halton points (Halton 1960), and for each set
// every pitch, root and tip on the step at the tallest castable fins and
// as many fins as fit; then compass search (Kolda, Lewis & Torczon, SIAM
// Review 45, 2003) from the design as drawn and from the best points kept
// apart from each other (the clustering idea of Rinnooy Kan & Timmer,
// Mathematical Programming 39, 1987), ending in a poll of the whole
// neighbourhood; the best of them wins. It moves in coordinates where the
// fins fill their length and the casting limits are bounds (coords.go),
// with exact penalties for the temperature limits. For one set of five
// variables it evaluates about 6000 designs (a tenth of a second on two
// cores); for both sets about 90 000 (about a second). No direct search
// proves a global optimum: the tests hold it to an exhaustive search of a
// box on the step and to the same answer from boxes of different size.
package optimise
