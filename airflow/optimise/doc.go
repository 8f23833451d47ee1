// Package optimise chooses the fins of a cylinder: one fin set's pitch,
// height, root and tip thickness and count, or both sets' together, for
// the coolest wall or the least fin mass at or below a limit, within the
// casting limits of a process (fins.Process), at one operating point of
// the estimator (airflow/cylinder). Solve returns the optimum, the
// trade-off front of wall temperature against fin mass among the designs
// it evaluated, and, when no design holds the limit, how close it came.
//
// The search is Minimize (search.go): a full grid over the box, then
// compass search from the best grid points (Kolda, Lewis & Torczon,
// SIAM Review 45, 2003), with exact penalties for the limits.
package optimise
