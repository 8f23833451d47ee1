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
	n := len(lo)
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
	var mu sync.Mutex
	evals := 0
	eval := func(x []float64) float64 {
		v := f(x)
		if math.IsNaN(v) {
			v = math.Inf(1)
		}
		mu.Lock()
		evals++
		if seen != nil {
			seen(x, v)
		}
		mu.Unlock()
		return v
	}
	snap := func(i int, v float64) float64 {
		v = math.Min(hi[i], math.Max(lo[i], v))
		if integer != nil && integer[i] {
			v = math.Round(v)
		}
		return v
	}
	// the grid: each variable's levels, integers deduplicated
	levels := make([][]float64, n)
	total := 1
	for i := range lo {
		m := opt.Levels
		if lo[i] == hi[i] {
			m = 1
		}
		seenV := map[float64]bool{}
		for k := 0; k < m; k++ {
			v := lo[i]
			if m > 1 {
				v = lo[i] + (hi[i]-lo[i])*float64(k)/float64(m-1)
			}
			v = snap(i, v)
			if !seenV[v] {
				seenV[v] = true
				levels[i] = append(levels[i], v)
			}
		}
		total *= len(levels[i])
	}
	type point struct {
		x  []float64
		fx float64
	}
	pts := make([]point, total)
	var wg sync.WaitGroup
	next := make(chan int)
	for w := 0; w < opt.Workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for idx := range next {
				x := make([]float64, n)
				j := idx
				for i := n - 1; i >= 0; i-- {
					x[i] = levels[i][j%len(levels[i])]
					j /= len(levels[i])
				}
				pts[idx] = point{x, eval(x)}
			}
		}()
	}
	for i := 0; i < total; i++ {
		next <- i
	}
	close(next)
	wg.Wait()
	sort.SliceStable(pts, func(a, b int) bool { return pts[a].fx < pts[b].fx })
	best := Result{X: append([]float64(nil), pts[0].x...), F: pts[0].fx}
	budget := opt.MaxEval
	for s := 0; s < opt.Starts && s < len(pts) && !math.IsInf(pts[s].fx, 1); s++ {
		x := append([]float64(nil), pts[s].x...)
		fx := pts[s].fx
		step := make([]float64, n)
		for i := range step {
			if len(levels[i]) > 1 {
				step[i] = (hi[i] - lo[i]) / float64(opt.Levels-1) / 2
			}
			if integer != nil && integer[i] {
				step[i] = math.Max(1, math.Round(step[i]))
			}
		}
		for budget > 0 {
			improved := false
			for i := 0; i < n && budget > 0; i++ {
				if step[i] == 0 {
					continue
				}
				for _, dir := range []float64{1, -1} {
					y := append([]float64(nil), x...)
					y[i] = snap(i, x[i]+dir*step[i])
					if y[i] == x[i] {
						continue
					}
					fy := eval(y)
					budget--
					if fy < fx {
						x, fx, improved = y, fy, true
						break
					}
				}
			}
			if improved {
				continue
			}
			// axis moves failed: poll the diagonals of each pair of
			// variables, which lets the search slide along a constraint
			// that runs across the axes (such as height over gap)
			for i := 0; i < n && !improved && budget > 0; i++ {
				for j := i + 1; j < n && !improved && budget > 0; j++ {
					if step[i] == 0 || step[j] == 0 {
						continue
					}
					for _, di := range []float64{1, -1} {
						for _, dj := range []float64{1, -1} {
							if improved || budget <= 0 {
								continue
							}
							y := append([]float64(nil), x...)
							y[i] = snap(i, x[i]+di*step[i])
							y[j] = snap(j, x[j]+dj*step[j])
							if y[i] == x[i] || y[j] == x[j] {
								continue
							}
							fy := eval(y)
							budget--
							if fy < fx {
								x, fx, improved = y, fy, true
							}
						}
					}
				}
			}
			if improved {
				continue
			}
			done := true
			for i := range step {
				if step[i] == 0 {
					continue
				}
				if integer != nil && integer[i] {
					if step[i] > 1 {
						step[i] = math.Max(1, math.Round(step[i]/2))
						done = false
					}
					continue
				}
				if step[i] > opt.Tol*(hi[i]-lo[i]) {
					step[i] /= 2
					done = false
				}
			}
			if done {
				break
			}
		}
		if fx < best.F {
			best = Result{X: x, F: fx}
		}
	}
	best.Evals = evals
	return best
}
