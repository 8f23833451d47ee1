// Minimize is a bounded, derivative-free minimiser for a few mixed
// continuous and integer variables, started from many points so that it
// does not stop in the first basin it meets:
//
//  1. a full grid of Levels points per variable, Sample points of a
//     Halton sequence (Halton, Numerische Mathematik 2, 1960) over the
//     box, and the caller's Extra points, evaluated on the workers;
//  2. starting points: the caller's own (Options.From, clipped into the
//     box) and then the best evaluated points that lie at least 0.15 of
//     the box (each variable scaled to its range, the Euclidean distance)
//     from every start already chosen: the clustering idea of multi-level
//     single linkage (Rinnooy Kan & Timmer, Mathematical Programming 39,
//     1987) in its simplest form, so that the starts cover several basins
//     instead of crowding one;
//  3. from each start, compass (pattern) search (Kolda, Lewis & Torczon,
//     Optimization by direct search, SIAM Review 45, 2003, Sec. 3): axis
//     moves, then the diagonals of each pair of variables, halving the
//     continuous steps until they fall below a tolerance (integers down to
//     1); at the finest steps the whole neighbourhood of the point is
//     polled (every combination of -1, 0, +1 steps within each block of
//     Block variables, 3^5 - 1 = 242 points for a fin set, and any points
//     Options.Neighbours adds), which lets the search slide along limits
//     that tie four variables together, and the compass search resumes
//     from the best better point; the local searches run in parallel, each
//     with its own budget;
//  4. the best of the local searches, ties to the earlier start.
//
// Every point is evaluated once (a cache keyed by the point), so the
// count of evaluations is the number of distinct points and does not
// depend on how the workers were scheduled. An objective of +Inf marks an
// infeasible point. It suits the fin-design objective: a few variables,
// cheap evaluations, kinks where a fin count changes, and hard casting
// limits. No direct search proves a global optimum; the starts make
// missing the best basin unlikely, and the tests of the fin optimiser
// hold the answer the same from boxes of different size around it.

package optimise

import (
	"math"
	"runtime"
	"sort"
	"sync"
)

// Options tunes Minimize. The zero value is usable.
type Options struct {
	Levels  int         // grid levels per variable (default 5)
	Sample  int         // Halton points added to the grid (default 40 per variable)
	Starts  int         // local searches, From included (default 4 + 3 per variable)
	Tol     float64     // stop when every continuous step is below Tol (hi - lo) (default 1e-3)
	MaxEval int         // evaluation budget of each local search (default 20000)
	Workers int         // parallel evaluations and local searches (default GOMAXPROCS)
	Block   int         // variables polled together at the finest steps (default 5, at most 6)
	From    [][]float64 // points always started from (clipped into the box)
	Extra   [][]float64 // more points evaluated beside the grid and the Halton points
	// Neighbours, when not nil, gives more points to poll at the finest
	// steps, beside the blocks' neighbourhoods (the fin optimiser's
	// neighbours in the fin variables, which its search coordinates
	// reach otherwise).
	Neighbours func(x []float64) [][]float64
}

// Result is the best point found.
type Result struct {
	X      []float64
	F      float64
	Evals  int // distinct points evaluated
	Starts int // local searches run
}

// Minimize returns the point of the box [lo, hi] with the least f, with
// the variables marked integer taking whole values. f must be safe for
// concurrent use; seen, when not nil, receives every distinct evaluated
// point once (on one goroutine at a time).
func Minimize(f func(x []float64) float64, lo, hi []float64, integer []bool, opt Options, seen func(x []float64, fx float64)) Result {
	n := len(lo)
	if opt.Levels < 2 {
		opt.Levels = 5
	}
	if opt.Sample <= 0 {
		opt.Sample = 40 * n
	}
	if opt.Starts < 1 {
		opt.Starts = 4 + 3*n
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
	if opt.Block <= 0 {
		opt.Block = 5
	}
	opt.Block = min(opt.Block, 6)
	s := &search{f: f, lo: lo, hi: hi, integer: integer, opt: opt, seen: seen, n: n, cache: map[string]float64{}}
	s.gridLevels()
	extra := make([][]float64, len(opt.Extra))
	for k, x := range opt.Extra {
		extra[k] = make([]float64, n)
		for i := range x {
			extra[k][i] = s.snap(i, x[i])
		}
	}
	pts := s.evalAll(append(append(s.gridXs(), s.haltonXs()...), extra...))
	starts := s.chooseStarts(pts)
	type local struct {
		x  []float64
		fx float64
	}
	res := make([]local, len(starts))
	s.parallel(len(starts), func(k int) {
		x, fx := s.compass(starts[k].x, starts[k].fx)
		res[k] = local{x, fx}
	})
	best := Result{X: append([]float64(nil), pts[0].x...), F: pts[0].fx}
	for _, r := range res {
		if r.fx < best.F {
			best.X, best.F = r.x, r.fx
		}
	}
	best.Evals, best.Starts = s.evals, len(starts)
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
	cache   map[string]float64
	evals   int
}

type point struct {
	x  []float64
	fx float64
}

// key is x's bytes, the cache's key.
func key(x []float64) string {
	b := make([]byte, 0, 8*len(x))
	for _, v := range x {
		u := math.Float64bits(v)
		for k := 0; k < 8; k++ {
			b = append(b, byte(u>>(8*k)))
		}
	}
	return string(b)
}

// eval returns f(x), from the cache when x was evaluated before.
func (s *search) eval(x []float64) float64 {
	k := key(x)
	s.mu.Lock()
	v, ok := s.cache[k]
	s.mu.Unlock()
	if ok {
		return v
	}
	v = s.f(x)
	if math.IsNaN(v) {
		v = math.Inf(1)
	}
	s.mu.Lock()
	defer s.mu.Unlock()
	if w, ok := s.cache[k]; ok { // another worker got there first
		return w
	}
	s.cache[k] = v
	s.evals++
	if s.seen != nil {
		s.seen(x, v)
	}
	return v
}

// snap clamps v to variable i's bounds and rounds an integer variable.
func (s *search) snap(i int, v float64) float64 {
	v = math.Min(s.hi[i], math.Max(s.lo[i], v))
	if s.isInt(i) {
		v = math.Round(v)
	}
	return v
}

func (s *search) isInt(i int) bool { return s.integer != nil && s.integer[i] }

// span is variable i's range, 1 for a fixed one.
func (s *search) span(i int) float64 {
	if d := s.hi[i] - s.lo[i]; d > 0 {
		return d
	}
	return 1
}

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

// gridXs lists the full grid's points.
func (s *search) gridXs() [][]float64 {
	total := 1
	for _, l := range s.levels {
		total *= len(l)
	}
	xs := make([][]float64, total)
	for idx := range xs {
		x := make([]float64, s.n)
		j := idx
		for i := s.n - 1; i >= 0; i-- {
			x[i] = s.levels[i][j%len(s.levels[i])]
			j /= len(s.levels[i])
		}
		xs[idx] = x
	}
	return xs
}

// primes are the Halton sequence's bases, one per variable.
var primes = []int{2, 3, 5, 7, 11, 13, 17, 19, 23, 29, 31, 37, 41, 43, 47, 53, 59, 61, 67, 71}

// radical is the radical inverse of k in base b: its digits mirrored
// about the point.
func radical(k, b int) float64 {
	v, f := 0.0, 1.0/float64(b)
	for ; k > 0; k /= b {
		v += float64(k%b) * f
		f /= float64(b)
	}
	return v
}

// haltonXs lists Sample points of the Halton sequence scaled to the box,
// snapped (the first 20 of the sequence skipped: they lie along the
// diagonal in the higher bases).
func (s *search) haltonXs() [][]float64 {
	xs := make([][]float64, s.opt.Sample)
	for k := range xs {
		x := make([]float64, s.n)
		for i := range x {
			u := radical(k+21, primes[i%len(primes)])
			x[i] = s.snap(i, s.lo[i]+u*(s.hi[i]-s.lo[i]))
		}
		xs[k] = x
	}
	return xs
}

// parallel runs do(0..n-1) on the workers.
func (s *search) parallel(n int, do func(k int)) {
	var wg sync.WaitGroup
	next := make(chan int)
	for w := 0; w < min(s.opt.Workers, n); w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for k := range next {
				do(k)
			}
		}()
	}
	for k := 0; k < n; k++ {
		next <- k
	}
	close(next)
	wg.Wait()
}

// evalAll evaluates xs on the workers and returns the points, best first
// (ties in the order given).
func (s *search) evalAll(xs [][]float64) []point {
	pts := make([]point, len(xs))
	s.parallel(len(xs), func(k int) { pts[k] = point{xs[k], s.eval(xs[k])} })
	sort.SliceStable(pts, func(a, b int) bool { return pts[a].fx < pts[b].fx })
	return pts
}

// apart reports whether x lies at least 0.15 of the box from y, by the
// Euclidean distance with each variable scaled to its range (a whole-number
// variable's to at least 10, so that one step of a narrow one is near).
func (s *search) apart(x, y []float64) bool {
	d2 := 0.0
	for i := range x {
		span := s.span(i)
		if s.isInt(i) {
			span = math.Max(span, 10)
		}
		d := (x[i] - y[i]) / span
		d2 += d * d
	}
	return d2 >= 0.15*0.15
}

// chooseStarts returns the caller's points and then the best finite points
// of pts apart from every start chosen before, Starts in all.
func (s *search) chooseStarts(pts []point) []point {
	var starts []point
	for _, x := range s.opt.From {
		y := make([]float64, s.n)
		for i := range y {
			y[i] = s.snap(i, x[i])
		}
		starts = append(starts, point{y, s.eval(y)})
	}
	for _, p := range pts {
		if len(starts) >= s.opt.Starts || math.IsInf(p.fx, 1) {
			break
		}
		ok := true
		for _, q := range starts {
			if !s.apart(p.x, q.x) {
				ok = false
				break
			}
		}
		if ok {
			starts = append(starts, point{append([]float64(nil), p.x...), p.fx})
		}
	}
	return starts
}

// compass runs the pattern search from x: axis moves, then the diagonals
// of each pair of variables, halving the steps when neither improves;
// at the finest steps the neighbourhood poll, and on from any better point
// it finds; until nothing improves or the budget is spent.
func (s *search) compass(x []float64, fx float64) ([]float64, float64) {
	step := make([]float64, s.n)
	for i := range step {
		if len(s.levels[i]) > 1 {
			step[i] = (s.hi[i] - s.lo[i]) / float64(s.opt.Levels-1) / 2
		}
		if s.isInt(i) && step[i] > 0 {
			step[i] = math.Max(1, math.Round(step[i]))
		}
	}
	budget := s.opt.MaxEval
	try := func(y []float64) float64 {
		budget--
		return s.eval(y)
	}
	for budget > 0 {
		var improved bool
		if x, fx, improved = s.axisMoves(x, fx, step, try, &budget); improved {
			continue
		}
		// axis moves failed: poll the diagonals of each pair of variables,
		// which lets the search slide along a constraint that runs across
		// the axes (such as height over gap)
		if x, fx, improved = s.diagonalMoves(x, fx, step, try, &budget); improved {
			continue
		}
		if !s.shrink(step) {
			continue
		}
		// the finest steps: poll the whole neighbourhood
		if x, fx, improved = s.cubeMoves(x, fx, step, try, &budget); !improved {
			break
		}
	}
	return x, fx
}

// axisMoves tries a step up and down each variable, taking the first that
// improves.
func (s *search) axisMoves(x []float64, fx float64, step []float64, try func([]float64) float64, budget *int) ([]float64, float64, bool) {
	improved := false
	for i := 0; i < s.n && *budget > 0; i++ {
		if step[i] == 0 {
			continue
		}
		for _, dir := range []float64{1, -1} {
			y := append([]float64(nil), x...)
			y[i] = s.snap(i, x[i]+dir*step[i])
			if y[i] == x[i] {
				continue
			}
			if fy := try(y); fy < fx {
				x, fx, improved = y, fy, true
				break
			}
		}
	}
	return x, fx, improved
}

// diagonalMoves tries the four diagonal steps of each pair of variables,
// stopping at the first that improves.
func (s *search) diagonalMoves(x []float64, fx float64, step []float64, try func([]float64) float64, budget *int) ([]float64, float64, bool) {
	for i := 0; i < s.n; i++ {
		for j := i + 1; j < s.n; j++ {
			if step[i] == 0 || step[j] == 0 {
				continue
			}
			for _, di := range []float64{1, -1} {
				for _, dj := range []float64{1, -1} {
					if *budget <= 0 {
						return x, fx, false
					}
					y := append([]float64(nil), x...)
					y[i] = s.snap(i, x[i]+di*step[i])
					y[j] = s.snap(j, x[j]+dj*step[j])
					if y[i] == x[i] || y[j] == x[j] {
						continue
					}
					if fy := try(y); fy < fx {
						return y, fy, true
					}
				}
			}
		}
	}
	return x, fx, false
}

// cubeMoves polls every combination of -1, 0 and +1 steps of the
// variables of each block of Block, and moves to the best point that
// improves.
func (s *search) cubeMoves(x []float64, fx float64, step []float64, try func([]float64) float64, budget *int) ([]float64, float64, bool) {
	bx, bf := x, fx
	for b0 := 0; b0 < s.n; b0 += s.opt.Block {
		var free []int
		for i := b0; i < min(b0+s.opt.Block, s.n); i++ {
			if step[i] != 0 {
				free = append(free, i)
			}
		}
		total := 1
		for range free {
			total *= 3
		}
	combos:
		for c := 0; c < total && *budget > 0; c++ {
			y := append([]float64(nil), x...)
			moved := false
			for j, cc := 0, c; j < len(free); j, cc = j+1, cc/3 {
				d := float64(cc%3 - 1)
				if d == 0 {
					continue
				}
				i := free[j]
				if y[i] = s.snap(i, x[i]+d*step[i]); y[i] == x[i] {
					continue combos // at a bound: another combination covers it
				}
				moved = true
			}
			if !moved {
				continue
			}
			if fy := try(y); fy < bf {
				bx, bf = y, fy
			}
		}
	}
	if s.opt.Neighbours != nil {
		for _, y := range s.opt.Neighbours(x) {
			if *budget <= 0 {
				break
			}
			for i := range y {
				y[i] = s.snap(i, y[i])
			}
			if key(y) == key(x) {
				continue
			}
			if fy := try(y); fy < bf {
				bx, bf = y, fy
			}
		}
	}
	return bx, bf, bf < fx
}

// shrink halves the steps (integers down to 1) and reports whether all
// are at their finest.
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
