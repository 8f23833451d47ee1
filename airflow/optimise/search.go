// Minimize is a bounded, derivative-free minimiser for a few mixed
// continuous and integer variables: a full grid to find the basins, then
// compass (pattern) search from the best grid points (Kolda, Lewis &
// Torczon, Optimization by direct search, SIAM Review 45, 2003, Sec. 3),
// halving the continuous steps until they fall below a tolerance. An
// objective of +Inf marks an infeasible point. It suits the fin-design
// objective: a few variables, cheap evaluations, kinks where a fin count
// changes, and hard casting limits.

package optimise

import (
	"math"
	"runtime"
	"sort"
	"sync"
)

// Options tunes Minimize. The zero value is usable.
type Options struct {
	Levels  int     // grid levels per variable (default 5)
	Starts  int     // pattern searches started from the best grid points (default 3)
	Tol     float64 // stop when every continuous step is below Tol (hi - lo) (default 1e-3)
	MaxEval int     // evaluation budget for the pattern searches (default 20000)
	Workers int     // parallel evaluations of the grid (default GOMAXPROCS)
}

// Result is the best point found.
type Result struct {
	X     []float64
	F     float64
	Evals int
}

// Minimize returns the point of the box [lo, hi] with the least f, with
// the variables marked integer taking whole values. f must be safe for
// concurrent use; seen, when not nil, receives every evaluated point (on
// one goroutine at a time).
func Minimize(f func(x []float64) float64, lo, hi []float64, integer []bool, opt Options, seen func(x []float64, fx float64)) Result {
	if opt.Levels < 2 {
		opt.Levels = 5
	}
	if opt.Starts < 1 {
		opt.Starts = 3
	}
	if opt.Tol <= 0 {
		opt.Tol = 1e-3
	}
	if opt.MaxEval <= 0 {
		opt.MaxEval = 20000
	}
	if opt.Workers <= 0 {
		opt.Workers = runtime.GOMAXPROCS(0)
	}
	s := &search{f: f, lo: lo, hi: hi, integer: integer, opt: opt, seen: seen, n: len(lo), budget: opt.MaxEval}
	s.gridLevels()
	pts := s.gridPoints()
	best := Result{X: append([]float64(nil), pts[0].x...), F: pts[0].fx}
	for k := 0; k < opt.Starts && k < len(pts) && !math.IsInf(pts[k].fx, 1); k++ {
		x, fx := s.compass(append([]float64(nil), pts[k].x...), pts[k].fx)
		if fx < best.F {
			best = Result{X: x, F: fx}
		}
	}
	best.Evals = s.evals
	return best
}

// search is one run of Minimize.
type search struct {
	f       func(x []float64) float64
	lo, hi  []float64
	integer []bool
	opt     Options
	seen    func(x []float64, fx float64)
	n       int
	levels  [][]float64 // each variable's grid levels
	mu      sync.Mutex
	evals   int
	budget  int // evaluations left for the pattern searches
}

type point struct {
	x  []float64
	fx float64
}

func (s *search) eval(x []float64) float64 {
	v := s.f(x)
	if math.IsNaN(v) {
		v = math.Inf(1)
	}
	s.mu.Lock()
	s.evals++
	if s.seen != nil {
		s.seen(x, v)
	}
	s.mu.Unlock()
	return v
}

// snap clamps v to variable i's bounds and rounds an integer variable.
func (s *search) snap(i int, v float64) float64 {
	v = math.Min(s.hi[i], math.Max(s.lo[i], v))
	if s.integer != nil && s.integer[i] {
		v = math.Round(v)
	}
	return v
}

func (s *search) isInt(i int) bool { return s.integer != nil && s.integer[i] }

// gridLevels sets each variable's levels, integers deduplicated.
func (s *search) gridLevels() {
	s.levels = make([][]float64, s.n)
	for i := range s.lo {
		m := s.opt.Levels
		if s.lo[i] == s.hi[i] {
			m = 1
		}
		seenV := map[float64]bool{}
		for k := 0; k < m; k++ {
			v := s.lo[i]
			if m > 1 {
				v = s.lo[i] + (s.hi[i]-s.lo[i])*float64(k)/float64(m-1)
			}
			v = s.snap(i, v)
			if !seenV[v] {
				seenV[v] = true
				s.levels[i] = append(s.levels[i], v)
			}
		}
	}
}

// gridPoints evaluates the full grid on the workers and returns its
// points, best first (ties in grid order).
func (s *search) gridPoints() []point {
	total := 1
	for _, l := range s.levels {
		total *= len(l)
	}
	pts := make([]point, total)
	var wg sync.WaitGroup
	next := make(chan int)
	for w := 0; w < s.opt.Workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for idx := range next {
				x := make([]float64, s.n)
				j := idx
				for i := s.n - 1; i >= 0; i-- {
					x[i] = s.levels[i][j%len(s.levels[i])]
					j /= len(s.levels[i])
				}
				pts[idx] = point{x, s.eval(x)}
			}
		}()
	}
	for i := 0; i < total; i++ {
		next <- i
	}
	close(next)
	wg.Wait()
	sort.SliceStable(pts, func(a, b int) bool { return pts[a].fx < pts[b].fx })
	return pts
}

// compass runs the pattern search from x: axis moves, then the diagonals
// of each pair of variables, halving the steps when neither improves,
// until every continuous step is below Tol of its range (integers at 1)
// or the budget is spent.
func (s *search) compass(x []float64, fx float64) ([]float64, float64) {
	step := make([]float64, s.n)
	for i := range step {
		if len(s.levels[i]) > 1 {
			step[i] = (s.hi[i] - s.lo[i]) / float64(s.opt.Levels-1) / 2
		}
		if s.isInt(i) {
			step[i] = math.Max(1, math.Round(step[i]))
		}
	}
	for s.budget > 0 {
		var improved bool
		if x, fx, improved = s.axisMoves(x, fx, step); improved {
			continue
		}
		// axis moves failed: poll the diagonals of each pair of variables,
		// which lets the search slide along a constraint that runs across
		// the axes (such as height over gap)
		if x, fx, improved = s.diagonalMoves(x, fx, step); improved {
			continue
		}
		if s.shrink(step) {
			break
		}
	}
	return x, fx
}

// axisMoves tries a step up and down each variable, taking the first that
// improves.
func (s *search) axisMoves(x []float64, fx float64, step []float64) ([]float64, float64, bool) {
	improved := false
	for i := 0; i < s.n && s.budget > 0; i++ {
		if step[i] == 0 {
			continue
		}
		for _, dir := range []float64{1, -1} {
			y := append([]float64(nil), x...)
			y[i] = s.snap(i, x[i]+dir*step[i])
			if y[i] == x[i] {
				continue
			}
			fy := s.eval(y)
			s.budget--
			if fy < fx {
				x, fx, improved = y, fy, true
				break
			}
		}
	}
	return x, fx, improved
}

// diagonalMoves tries the four diagonal steps of each pair of variables,
// stopping at the first that improves.
func (s *search) diagonalMoves(x []float64, fx float64, step []float64) ([]float64, float64, bool) {
	improved := false
	for i := 0; i < s.n && !improved && s.budget > 0; i++ {
		for j := i + 1; j < s.n && !improved && s.budget > 0; j++ {
			if step[i] == 0 || step[j] == 0 {
				continue
			}
			for _, di := range []float64{1, -1} {
				for _, dj := range []float64{1, -1} {
					if improved || s.budget <= 0 {
						continue
					}
					y := append([]float64(nil), x...)
					y[i] = s.snap(i, x[i]+di*step[i])
					y[j] = s.snap(j, x[j]+dj*step[j])
					if y[i] == x[i] || y[j] == x[j] {
						continue
					}
					fy := s.eval(y)
					s.budget--
					if fy < fx {
						x, fx, improved = y, fy, true
					}
				}
			}
		}
	}
	return x, fx, improved
}

// shrink halves the steps (integers down to 1) and reports whether all
// are done.
func (s *search) shrink(step []float64) bool {
	done := true
	for i := range step {
		if step[i] == 0 {
			continue
		}
		if s.isInt(i) {
			if step[i] > 1 {
				step[i] = math.Max(1, math.Round(step[i]/2))
				done = false
			}
			continue
		}
		if step[i] > s.opt.Tol*(s.hi[i]-s.lo[i]) {
			step[i] /= 2
			done = false
		}
	}
	return done
}
