// Package sweep evaluates a cylinder design over a grid of values of any
// of its keys, on several goroutines, handing back one row per grid point
// as the points finish, and keeps the best rows. A caller supplies the
// builder that turns a point's values into a design (the command line
// applies its design file's keys and rules; a library user changes a
// cylinder.Case directly).
package sweep
