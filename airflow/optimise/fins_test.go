package optimise

import (
	"math"
	"testing"

	"finmarch/airflow/internal/demotest"
	"finmarch/fins"
)

// Solve keeps every casting limit and bound, and its optimum is no worse
// than the best point of a 9-level grid over the same free variables
// (pitch, height, root thickness; tip and count held) with the same
// limits: the coolest head, and the lightest head fins at or below 205 C.
func TestSolveAgainstGrid(t *testing.T) {
	d := demotest.Upright(t)
	proc, _ := fins.LookupProcess("permanent-mould")
	vars := DefaultVars(d.Case.Head.Set, proc)
	vars[0].Lo, vars[0].Hi = 0.008, 0.012
	vars[1].Lo, vars[1].Hi = 0.030, 0.050
	vars[2].Lo, vars[2].Hi = 0.003, 0.005
	vars[3].Lo, vars[3].Hi = 0.002, 0.002
	vars[4].Lo, vars[4].Hi = 7, 7
	for _, goal := range []Goal{GoalCool, GoalLight} {
		p := Problem{Base: d, Sets: []int{Head}, Vars: [][]Var{vars}, Goal: goal, Limit: 478.15, Process: proc}
		sol, err := Solve(p)
		if err != nil {
			t.Fatal(err)
		}
		if !sol.Found {
			t.Fatalf("%s: no optimum", goal)
		}
		s := p.Set(0, sol.Optimum.X)
		if !proc.Feasible(s) {
			t.Errorf("%s: optimum %+v breaks the casting limits", goal, s)
		}
		for i, v := range vars {
			if x := sol.Optimum.X[i]; x < v.Lo-1e-12 || x > v.Hi+1e-12 {
				t.Errorf("%s: %s %g outside %g to %g", goal, v.Name, x, v.Lo, v.Hi)
			}
		}
		best := math.Inf(1)
		for i := 0; i <= 8; i++ {
			for j := 0; j <= 8; j++ {
				for k := 0; k <= 8; k++ {
					x := []float64{0.008 + 0.0005*float64(i), 0.030 + 0.0025*float64(j), 0.003 + 0.00025*float64(k), 0.002, 7}
					wall, mass, _, ok := p.measure(x, true)
					if !ok || goal == GoalLight && wall > p.Limit {
						continue
					}
					f := wall
					if goal == GoalLight {
						f = mass
					}
					best = math.Min(best, f)
				}
			}
		}
		got := sol.Optimum.Wall
		tol := 0.05 // K: the search's step tolerance, 1e-3 of the box
		if goal == GoalLight {
			got, tol = sol.Optimum.Mass, 1e-3 // kg
			if sol.Optimum.Wall > p.Limit+1e-6 {
				t.Errorf("light: wall %.3f K over the limit", sol.Optimum.Wall)
			}
		}
		if got > best+tol {
			t.Errorf("%s: optimum %.4f, grid best %.4f", goal, got, best)
		}
		// the front is lightest first, each lighter design hotter
		for i := 1; i < len(sol.Front); i++ {
			if !(sol.Front[i].Mass > sol.Front[i-1].Mass && sol.Front[i].Wall < sol.Front[i-1].Wall) {
				t.Errorf("%s: front rows %d and %d not a trade-off", goal, i-1, i)
			}
		}
	}
}

// A limit no design can hold is reported as not found, with the coolest
// feasible design evaluated as how close the search came.
func TestSolveUnreachable(t *testing.T) {
	d := demotest.Upright(t)
	proc, _ := fins.LookupProcess("sand")
	vars := DefaultVars(d.Case.Head.Set, proc)
	FitCount(vars, d.Case.Head.Set)
	sol, err := Solve(Problem{Base: d, Sets: []int{Head}, Vars: [][]Var{vars}, Goal: GoalLight, Limit: 320, Process: proc, Levels: 3})
	if err != nil {
		t.Fatal(err)
	}
	if sol.Found || sol.Closest == nil || !(sol.Closest.Wall > 320) {
		t.Fatalf("found %v, closest %+v", sol.Found, sol.Closest)
	}
}

// Pareto keeps the designs no other beats on both mass and wall, lightest
// first (a hand-made set with a known front), and thins a long front to n
// rows keeping both ends.
func TestPareto(t *testing.T) {
	pts := []Point{{Mass: 1, Wall: 500, Feasible: true}, {Mass: 2, Wall: 450, Feasible: true}, {Mass: 2.5, Wall: 470, Feasible: true},
		{Mass: 3, Wall: 400, Feasible: true}, {Mass: 0.5, Wall: 300}, {Mass: 4, Wall: 400, Feasible: true}}
	f := Pareto(pts, 12)
	if len(f) != 3 || f[0].Mass != 1 || f[1].Mass != 2 || f[2].Mass != 3 {
		t.Errorf("front %+v", f)
	}
	var long []Point
	for i := 0; i < 100; i++ {
		long = append(long, Point{Mass: float64(i), Wall: 1000 - float64(i), Feasible: true})
	}
	f = Pareto(long, 12)
	if len(f) != 12 || f[0].Mass != 0 || f[11].Mass != 99 {
		t.Errorf("thinned front: %d rows from %g to %g", len(f), f[0].Mass, f[len(f)-1].Mass)
	}
}

// On a step, Solve's optimum is the best design of an exhaustive search
// over every pitch, height, root and tip on the step in a box of the
// upright demo's head (die-casting) and every count that fits: the
// coolest head, and the lightest fins at or below 200 C; and every length
// of it is a whole multiple of the step.
func TestSolveOnStepAgainstExhaustive(t *testing.T) {
	d := demotest.Upright(t)
	proc, _ := fins.LookupProcess("die-casting")
	s := d.Case.Head.Set
	vars := DefaultVars(s, proc)
	vars[0].Lo, vars[0].Hi = 0.0055, 0.0075
	vars[1].Lo, vars[1].Hi = 0.024, 0.032
	vars[2].Lo, vars[2].Hi = 0.002, 0.0035
	vars[3].Lo, vars[3].Hi = 0.0015, 0.0025
	FitCount(vars, s)
	for _, goal := range []Goal{GoalCool, GoalLight} {
		p := Problem{Base: d, Sets: []int{Head}, Vars: [][]Var{vars}, Goal: goal, Limit: 473.15, Process: proc, Step: 0.0005}
		sol, err := Solve(p)
		if err != nil || !sol.Found {
			t.Fatalf("%s: %v, found %v", goal, err, sol.Found)
		}
		for i, v := range sol.Optimum.X[:4] {
			if k := v / p.Step; math.Abs(k-math.Round(k)) > 1e-9 {
				t.Errorf("%s: %s %.9f m is not on the step", goal, vars[i].Name, v)
			}
		}
		best, bx := 1e9, []float64(nil)
		for pi := 11; pi <= 15; pi++ {
			for hi := 48; hi <= 64; hi++ {
				for ri := 4; ri <= 7; ri++ {
					for ti := 3; ti <= 5 && ti <= ri; ti++ {
						q := s
						q.Pitch, q.Height, q.RootThickness, q.TipThickness = float64(pi)*0.0005, float64(hi)*0.0005, float64(ri)*0.0005, float64(ti)*0.0005
						if !proc.Feasible(q) {
							continue
						}
						for n := 1; n <= min(int(vars[4].Hi), q.Fitting()); n++ {
							x := []float64{q.Pitch, q.Height, q.RootThickness, q.TipThickness, float64(n)}
							wall, mass, _, ok := p.measure(x, true)
							f := wall
							if goal == GoalLight {
								f = mass
							}
							if ok && (goal == GoalCool || wall <= p.Limit) && f < best {
								best, bx = f, x
							}
						}
					}
				}
			}
		}
		got := sol.Optimum.Wall
		if goal == GoalLight {
			got = sol.Optimum.Mass
		}
		if got > best+1e-9 {
			t.Errorf("%s: optimum %.6f at %v, exhaustive %.6f at %v", goal, got, sol.Optimum.X, best, bx)
		}
		t.Logf("%s: %.4f at %v (exhaustive %.4f), %d evaluations", goal, got, sol.Optimum.X, best, sol.Evals)
	}
}
