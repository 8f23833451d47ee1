// Package app is the finmarch command line: subcommands, flags, exit codes,
// and the glue from design files through the physics to the output.
//
// One file per command (demo.go, estimate.go, compare.go, tilt.go,
// march.go, speeds.go, sweep.go, optimise.go, fin.go, plot.go, report.go,
// alloys.go, new.go), each building an output.Doc that app.go's emit
// renders; evaluate.go is the one evaluate-and-check path from a design to
// the estimator (airflow/cylinder) and its exit codes. The physics, the
// sweep engine (airflow/sweep) and the optimiser (airflow/optimise) live
// outside cmd; the command line supplies their design-file variant
// builders (design.Design.With) and prints.
package app
