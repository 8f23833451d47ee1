package optimise

import (
	"math"
	"testing"
)

// Rosenbrock's valley, minimum 0 at (1, 1) (Rosenbrock, Computer Journal 3,
// 1960): a hard case for compass search, so the tolerance is loose.
func TestRosenbrock(t *testing.T) {
	f := func(x []float64) float64 { return 100*math.Pow(x[1]-x[0]*x[0], 2) + math.Pow(1-x[0], 2) }
	r := Minimize(f, []float64{-2, -1}, []float64{2, 3}, nil, Options{Levels: 9, Tol: 1e-7, MaxEval: 200000}, nil)
	if math.Abs(r.X[0]-1) > 0.05 || math.Abs(r.X[1]-1) > 0.1 || r.F > 1e-3 {
		t.Errorf("got %v f=%g", r.X, r.F)
	}
}

// A mixed problem with a known answer: (x - 0.3)^2 + (n - 4.6)^2 with n
// whole has its minimum at x = 0.3, n = 5; a constraint x + n/10 <= 0.7
// (infeasible points are +Inf) moves it to x = 0.2, n = 5.
func TestMixedInteger(t *testing.T) {
	f := func(x []float64) float64 { return math.Pow(x[0]-0.3, 2) + math.Pow(x[1]-4.6, 2) }
	r := Minimize(f, []float64{-1, 0}, []float64{1, 10}, []bool{false, true}, Options{Tol: 1e-8}, nil)
	if math.Abs(r.X[0]-0.3) > 1e-6 || r.X[1] != 5 {
		t.Errorf("unconstrained: %v", r.X)
	}
	g := func(x []float64) float64 {
		if x[0]+x[1]/10 > 0.7+1e-12 {
			return math.Inf(1)
		}
		return f(x)
	}
	n := 0
	r = Minimize(g, []float64{-1, 0}, []float64{1, 10}, []bool{false, true}, Options{Tol: 1e-8}, func(x []float64, fx float64) {
		n++
		if x[1] != math.Round(x[1]) || x[0] < -1 || x[0] > 1 {
			t.Fatalf("evaluated outside the box or at a fractional count: %v", x)
		}
	})
	if math.Abs(r.X[0]-0.2) > 1e-5 || r.X[1] != 5 || n != r.Evals {
		t.Errorf("constrained: %v (%d evals, seen %d)", r.X, r.Evals, n)
	}
}

// A fixed variable (lo == hi) stays put.
func TestFixedVariable(t *testing.T) {
	f := func(x []float64) float64 { return x[0]*x[0] + x[1] }
	r := Minimize(f, []float64{-1, 2}, []float64{1, 2}, nil, Options{}, nil)
	if r.X[1] != 2 || math.Abs(r.X[0]) > 1e-3 {
		t.Errorf("%v", r.X)
	}
}

// Two basins: a broad shallow one, (x - 0.75)^2 + (y - 0.75)^2 + 0.5, that
// holds every good point of the 5-level grid, and a narrow deep one,
// 60 ((x - 0.1)^2 + (y - 0.4)^2), between the grid's points (the nearest
// at 1.2). Compass search from the best grid points alone ends in the
// shallow basin at 0.5; the Halton points and the starts kept apart find
// the deep one at 0. The count of evaluations is the distinct points and
// is the same on one worker and on two, as is the answer.
func TestMultiStartFindsNarrowBasin(t *testing.T) {
	f := func(x []float64) float64 {
		a := math.Pow(x[0]-0.75, 2) + math.Pow(x[1]-0.75, 2) + 0.5
		b := 60 * (math.Pow(x[0]-0.1, 2) + math.Pow(x[1]-0.4, 2))
		return math.Min(a, b)
	}
	lo, hi := []float64{0, 0}, []float64{1, 1}
	seen := map[[2]float64]bool{}
	r1 := Minimize(f, lo, hi, nil, Options{Tol: 1e-6, Workers: 1}, func(x []float64, fx float64) {
		k := [2]float64{x[0], x[1]}
		if seen[k] {
			t.Errorf("%v evaluated twice", x)
		}
		seen[k] = true
	})
	if r1.F > 1e-8 || math.Abs(r1.X[0]-0.1) > 1e-3 || math.Abs(r1.X[1]-0.4) > 1e-3 {
		t.Errorf("ended at %v, f = %g; want (0.1, 0.4), 0", r1.X, r1.F)
	}
	if r1.Evals != len(seen) {
		t.Errorf("%d evaluations reported, %d distinct points seen", r1.Evals, len(seen))
	}
	r2 := Minimize(f, lo, hi, nil, Options{Tol: 1e-6, Workers: 2}, nil)
	if r2.Evals != r1.Evals || r2.F != r1.F || r2.X[0] != r1.X[0] || r2.X[1] != r1.X[1] {
		t.Errorf("two workers: %v %g (%d evals); one: %v %g (%d evals)", r2.X, r2.F, r2.Evals, r1.X, r1.F, r1.Evals)
	}
	// the grid's best points alone (the search before the starts were
	// spread) stay in the shallow basin: the case is a real one
	few := Minimize(f, lo, hi, nil, Options{Tol: 1e-6, Sample: 1, Starts: 3}, nil)
	if few.F < 0.4 {
		t.Errorf("three starts from the grid found the narrow basin (%v): the test no longer tells", few.X)
	}
}
