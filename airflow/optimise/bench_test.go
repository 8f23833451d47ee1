package optimise

import (
	"testing"

	"finmarch/airflow/internal/demotest"
	"finmarch/fins"
)

// BenchmarkSolve is one optimisation of the upright demo's head fins with
// die-casting limits, default bounds, the coolest head, on a 0.5 mm step.
func BenchmarkSolve(b *testing.B) {
	d := demotest.Upright(b)
	proc, _ := fins.LookupProcess("die-casting")
	vars := DefaultVars(d.Case.Head.Set, proc)
	FitCount(vars, d.Case.Head.Set)
	p := Problem{Base: d, Sets: []int{Head}, Vars: [][]Var{vars}, Goal: GoalCool, Process: proc, Step: 0.0005}
	evals := 0
	for b.Loop() {
		sol, err := Solve(p)
		if err != nil || !sol.Found {
			b.Fatal(err)
		}
		evals = sol.Evals
	}
	b.ReportMetric(float64(evals), "designs/op")
}
