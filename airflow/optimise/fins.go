package optimise

import (
	"fmt"
	"math"
	"sort"
	"sync"

	"finmarch/airflow/cylinder"
	"finmarch/fins"
)

// Goal is what a fin optimisation minimises.
type Goal string

// The goals.
const (
	GoalCool  Goal = "cool"  // the objective set's wall temperature
	GoalLight Goal = "light" // the varied sets' fin mass, with the wall at or below the limit
)

// The fin sets of a cylinder, as Problem.Sets names them.
const (
	Head   = 0
	Barrel = 1
)

// SetNames are the names of the fin sets by index.
var SetNames = [2]string{"head", "barrel"}

// Var is one variable of a fin set with its bounds.
type Var struct {
	Name    string  // pitch, height, root-thickness, tip-thickness or count
	Key     string  // the design key within the set: pitch, height, root_thickness, tip_thickness, count
	Lo, Hi  float64 // m, or a whole count
	Integer bool
}

// DefaultVars returns the five variables of fin set s, in the order
// pitch, height, root thickness, tip thickness, count, with bounds around
// the design: pitch 0.6 to 1.6 times (above the process's least
// thickness), height 0.5 to 1.5 times (below the root diameter), both
// thicknesses from the least the process casts to twice the root; the
// count's upper bound is set by FitCount once the pitch and root bounds
// are final.
func DefaultVars(s fins.Set, p fins.Process) []Var {
	tmin := p.MinThickness
	return []Var{
		{Name: "pitch", Key: "pitch", Lo: math.Max(0.6*s.Pitch, tmin+1e-3), Hi: 1.6 * s.Pitch},
		{Name: "height", Key: "height", Lo: 0.5 * s.Height, Hi: math.Min(1.5*s.Height, s.RootDiameter)},
		{Name: "root-thickness", Key: "root_thickness", Lo: tmin, Hi: math.Max(2*s.RootThickness, tmin+1e-3)},
		{Name: "tip-thickness", Key: "tip_thickness", Lo: tmin, Hi: math.Max(2*s.RootThickness, tmin+1e-3)},
		{Name: "count", Key: "count", Lo: 1, Integer: true},
	}
}

// FitCount sets the count's upper bound to as many fins as fit at the
// least pitch and root thickness (fins.Fitting).
func FitCount(vars []Var, s fins.Set) {
	vars[4].Hi = float64(fins.Fitting(s.Style, vars[0].Lo, vars[2].Lo, s.Length, s.RootDiameter))
}

// Problem is one fin optimisation.
type Problem struct {
	Base     cylinder.Design   // the design as drawn, at the operating point
	Settings cylinder.Settings // the estimator's settings (Workspace and TotalsOnly are set per evaluation)
	Sets     []int             // the sets varied: Head, Barrel, or Head and Barrel (the head's wall is then the objective)
	Vars     [][]Var           // per varied set, the five variables of DefaultVars in order
	Goal     Goal
	Limit    float64      // K, the objective wall's limit under GoalLight
	Process  fins.Process // casting limits every candidate keeps (the barrel's too, unless BarrelProcess names one)
	// BarrelProcess, when it names one, is the barrel fins' own process
	// (an iron barrel sand cast under a die-cast head).
	BarrelProcess fins.Process
	Levels        int // grid levels per variable before the pattern search (default 5)
	// Step, when above zero, is the size step of the lengths (m): pitch,
	// height and thicknesses are searched on its multiples only, the sizes
	// a pattern maker works to, so that the optimum and every design on
	// the front are designs as they would be made, estimated as they are.
	// Zero searches the lengths continuously.
	Step float64
	// Sample and Starts are Minimize's Halton points and local searches
	// (0: 40 per variable and 4 + 2 per variable).
	Sample, Starts int
	// Variant returns the design to evaluate with the fin sets sets; nil
	// means Base with its fin sets replaced. The command line checks each
	// variant by its design file's rules here.
	Variant func(sets [2]fins.Set) (cylinder.Design, cylinder.Settings, error)
}

// Point is one evaluated design.
type Point struct {
	X        []float64 // the variables of the varied sets, five per set
	Wall     float64   // K, the objective wall
	Mass     float64   // kg, the varied sets' fin mass
	Other    float64   // K, the other wall (the barrel's when both vary)
	Feasible bool      // an equilibrium within the casting limits and the guarded limit
}

// Solution is what Solve found.
type Solution struct {
	Found      bool    // a design within every limit; Optimum holds it
	Optimum    Point   // the best design
	Evals      int     // distinct designs evaluated
	Sample     int     // Halton points evaluated beside the grid
	Starts     int     // local searches run
	Front      []Point // feasible designs no other beats on both mass and wall, lightest first, the optimum among them
	Closest    *Point  // when none holds the limit under GoalLight: the coolest feasible design evaluated
	AsDesigned Point   // the design as drawn (Feasible: it reached an equilibrium), casting limits not applied
	// GuardOther: the other set's limit is kept as a constraint, because
	// both sets vary or the air passes them in series.
	GuardOther bool
	Series     bool    // the air passes the head fins and then the barrel fins
	OtherLimit float64 // K, the guarded limit
	// Broken lists the casting limits the design as drawn breaks,
	// prefixed with the set's name when both vary.
	Broken []string
}

// Primary is the objective set: the first varied.
func (p Problem) Primary() int { return p.Sets[0] }

// Other is the set that is not the objective.
func (p Problem) Other() int { return 1 - p.Sets[0] }

// Both reports whether both fin sets vary.
func (p Problem) Both() bool { return len(p.Sets) == 2 }

// Set returns varied set k (an index into Sets) at x.
func (p Problem) Set(k int, x []float64) fins.Set {
	s := p.base(p.Sets[k])
	y := x[5*k : 5*k+5]
	s.Pitch, s.Height, s.RootThickness, s.TipThickness, s.Count = y[0], y[1], y[2], y[3], int(y[4])
	return s
}

// X returns the variables of the design as drawn.
func (p Problem) X() []float64 {
	var x []float64
	for _, i := range p.Sets {
		s := p.base(i)
		x = append(x, s.Pitch, s.Height, s.RootThickness, s.TipThickness, float64(s.Count))
	}
	return x
}

func (p Problem) base(i int) fins.Set {
	if i == Barrel {
		return p.Base.Case.Barrel.Set
	}
	return p.Base.Case.Head.Set
}

// measure evaluates x: the objective wall, the fin mass of the varied
// sets and the other wall; cast applies the process's limits.
func (p Problem) measure(x []float64, cast bool) (float64, float64, float64, bool) {
	sets := [2]fins.Set{p.Base.Case.Head.Set, p.Base.Case.Barrel.Set}
	for k, i := range p.Sets {
		s := p.Set(k, x)
		if s.TipThickness > s.RootThickness || cast && !p.ProcessOf(i).Feasible(s) {
			return 0, 0, 0, false
		}
		sets[i] = s
	}
	d, set := p.Base, p.Settings
	var err error
	if p.Variant != nil {
		if d, set, err = p.Variant(sets); err != nil {
			return 0, 0, 0, false
		}
	} else {
		d.Case.Head.Set, d.Case.Barrel.Set = sets[0], sets[1]
	}
	set.TotalsOnly, set.Workspace = true, nil
	o, err := d.Evaluate(set)
	if err != nil || o.NoEquilibrium != nil {
		return 0, 0, 0, false
	}
	r, q := o.Result.Head, o.Result.Barrel
	if p.Primary() == Barrel {
		r, q = q, r
	}
	m := r.FinMass
	if p.Both() {
		m += q.FinMass
	}
	return r.WallTemp, m, q.WallTemp, true
}

// OnStep returns the variables of varied set k as the search takes them:
// with a Step, each length's bounds narrowed to the least and greatest
// multiples of the step within them (a count as it is); an error names a
// length whose bounds hold no multiple of the step.
func (p Problem) OnStep(k int) ([]Var, error) {
	vs := append([]Var(nil), p.Vars[k]...)
	if p.Step <= 0 {
		return vs, nil
	}
	for i := range vs {
		v := &vs[i]
		if v.Integer {
			continue
		}
		lo, hi := math.Ceil(v.Lo/p.Step-1e-9), math.Floor(v.Hi/p.Step+1e-9)
		if lo > hi {
			return nil, fmt.Errorf("the %s bounds %.6g to %.6g m hold no multiple of the step %.6g m", v.Name, v.Lo, v.Hi, p.Step)
		}
		v.Lo, v.Hi = p.onStep(lo), p.onStep(hi)
	}
	return vs, nil
}

// onStep is the length of k steps (setMap.length).
func (p Problem) onStep(k float64) float64 { return setMap{step: p.Step}.length(k) }

// Solve searches the problem by Minimize (search.go): the grid, Halton
// points, and compass searches from the design as drawn and from the best
// points found, apart from each other. With a Step the lengths are
// searched on its multiples (as whole numbers of steps), so the optimum
// needs no rounding afterwards: it is estimated as it would be made, it
// keeps every limit, and no design one step away in any combination of
// a set's variables (the final neighbourhood poll) does better.
//
// The objective is the primary set's wall (GoalCool) or the varied sets'
// fin mass with the wall at or below Limit (GoalLight, by an exact penalty
// of 1 kg per kelvin over the limit, far steeper than fin mass trades
// against temperature, a few 10 g per K, so that the optimum sits on the
// limit). The other set's limit is kept when both vary or on a series
// path (both sets longitudinal: the chosen fins change the air the other
// set gets), by a penalty of 10 K per K under GoalCool. Both penalty
// weights are our choice.
//
// The cost, for one set of five variables at the default 5 levels: the
// 3125-point grid (most of it refused at once by the casting limits), 200
// Halton points and 14 local searches of a few hundred designs each,
// about 6000 distinct designs; for both sets (3 levels), the 59049-point
// grid, 400 Halton points and 24 local searches.
func Solve(p Problem) (Solution, error) {
	sol := Solution{Series: p.Base.Case.Series()}
	sol.GuardOther = p.Both() || sol.Series
	sol.OtherLimit = [2]float64{p.Base.Limits.Head, p.Base.Limits.Barrel}[p.Other()]
	// the search's coordinates (coords.go), five per varied set
	var maps []setMap
	var lo, hi []float64
	var integer []bool
	for k := range p.Vars {
		vs, err := p.OnStep(k)
		if err != nil {
			return sol, err
		}
		m := setMap{base: p.base(p.Sets[k]), vars: vs, proc: p.ProcessOf(p.Sets[k]), step: p.Step}
		l, h, in := m.bounds()
		maps, lo, hi, integer = append(maps, m), append(lo, l...), append(hi, h...), append(integer, in...)
	}
	toX := func(z []float64) ([]float64, bool) {
		var x []float64
		for k, m := range maps {
			y, ok := m.x(z[5*k : 5*k+5])
			if !ok {
				return nil, false
			}
			x = append(x, y...)
		}
		return x, true
	}
	var from []float64
	for k, m := range maps {
		from = append(from, m.z(p.X()[5*k:5*k+5])...)
	}
	var mu sync.Mutex
	var pts []Point
	over := func(ot float64) float64 {
		if !sol.GuardOther {
			return 0
		}
		return math.Max(0, ot-sol.OtherLimit)
	}
	obj := func(z []float64) float64 {
		x, ok := toX(z)
		if !ok {
			return math.Inf(1)
		}
		t, m, ot, ok := p.measure(x, true)
		mu.Lock()
		pts = append(pts, Point{X: x, Wall: t, Mass: m, Other: ot, Feasible: ok && over(ot) == 0})
		mu.Unlock()
		switch {
		case !ok:
			return math.Inf(1)
		case p.Goal == GoalCool:
			return t + 10*over(ot)
		case t > p.Limit || over(ot) > 0:
			return m + math.Max(0, t-p.Limit) + over(ot)
		}
		return m
	}
	levels := p.Levels
	if levels == 0 {
		levels = 5
	}
	opt := Options{Levels: levels, Tol: 1e-3, Sample: p.Sample, Starts: p.Starts, From: [][]float64{from}}
	if opt.Sample <= 0 {
		opt.Sample = 40 * len(lo)
	}
	if p.Step > 0 {
		opt.Extra = faces(maps, from)
		// at the finest steps, poll the designs a size step away in the
		// fin variables too: every combination of -1, 0, +1 steps of each
		// set's pitch, height, thicknesses and count
		opt.Neighbours = func(z []float64) [][]float64 {
			x, ok := toX(z)
			if !ok {
				return nil
			}
			var out [][]float64
			for k, m := range maps {
				xk := x[5*k : 5*k+5]
				for c := 1; c < 243; c++ {
					y := append([]float64(nil), xk...)
					for i, cc := 0, c; i < 5; i, cc = i+1, cc/3 {
						d := float64(cc%3 - 1)
						if i < 4 {
							y[i] = m.length(math.Round(y[i]/p.Step) + d)
						} else {
							y[i] += d
						}
					}
					zz := append([]float64(nil), z...)
					copy(zz[5*k:5*k+5], m.z(y))
					out = append(out, zz)
				}
			}
			return out
		}
	}
	res := Minimize(obj, lo, hi, integer, opt, nil)
	sol.Evals, sol.Sample, sol.Starts = res.Evals, opt.Sample, res.Starts
	x, ok := toX(res.X)
	if !ok {
		x = p.X()
	}
	t, m, ot, _ := p.measure(x, true)
	sol.Found = !math.IsInf(res.F, 1) && !(p.Goal == GoalLight && t > p.Limit+1e-6 || over(ot) > 1e-6)
	dt, dm, do, dok := p.measure(p.X(), false)
	sol.AsDesigned = Point{X: p.X(), Wall: dt, Mass: dm, Other: do, Feasible: dok}
	for k := range p.Sets {
		for _, v := range p.ProcessOf(p.Sets[k]).Check(p.base(p.Sets[k])) {
			if v.Slack < -1e-12 {
				c := v.Constraint
				if p.Both() {
					c = SetNames[p.Sets[k]] + " " + c
				}
				sol.Broken = append(sol.Broken, c)
			}
		}
	}
	// the points in a fixed order (they arrive as the workers finish)
	sort.Slice(pts, func(i, j int) bool { return lessX(pts[i].X, pts[j].X) })
	if !sol.Found {
		if p.Goal == GoalLight {
			best := Point{Wall: math.Inf(1)}
			for _, q := range pts {
				if q.Feasible && q.Wall < best.Wall {
					best = q
				}
			}
			if !math.IsInf(best.Wall, 1) {
				sol.Closest = &best
			}
		}
		return sol, nil
	}
	sol.Optimum = Point{X: x, Wall: t, Mass: m, Other: ot, Feasible: true}
	front := Pareto(pts, 12)
	// the optimum always shows, in its place by mass
	k := sort.Search(len(front), func(i int) bool { return front[i].Mass >= m })
	if k >= len(front) || front[k].Mass != m {
		front = append(front[:k], append([]Point{sol.Optimum}, front[k:]...)...)
	}
	sol.Front = front
	return sol, nil
}

// maxFace is the most points of a set's face (see faces).
const maxFace = 20000

// faces lists, for each varied set, every pitch, root and tip on the step
// (tip not above root) at the tallest castable height and as many fins as
// fit (height depth and fins short 0), the other set's coordinates at
// from: where the coolest designs lie, searched at full resolution since
// the basins there are narrow. Beyond maxFace points a set's face is
// thinned to every k-th step.
func faces(maps []setMap, from []float64) [][]float64 {
	var out [][]float64
	for k, m := range maps {
		lo, hi, _ := m.bounds()
		stride := 1.0
		for {
			n := 1.0
			for _, i := range []int{0, 2, 3} {
				n *= math.Floor((hi[i]-lo[i])/stride) + 1
			}
			if n <= 2*maxFace { // tip above root: about half left out
				break
			}
			stride++
		}
		for p := lo[0]; p <= hi[0]; p += stride {
			for r := lo[2]; r <= hi[2]; r += stride {
				for t := lo[3]; t <= math.Min(hi[3], r); t += stride {
					z := append([]float64(nil), from...)
					copy(z[5*k:5*k+5], []float64{p, 0, r, t, 0})
					out = append(out, z)
				}
			}
		}
	}
	return out
}

// lessX orders points by their variables.
func lessX(a, b []float64) bool {
	for i := range a {
		if a[i] != b[i] {
			return a[i] < b[i]
		}
	}
	return false
}

// Pareto returns the feasible points not dominated in (mass, wall),
// lightest first, thinned to at most n rows spread evenly in fin mass (the
// search crowds the front near its optimum), always keeping both ends.
func Pareto(pts []Point, n int) []Point {
	var f []Point
	for _, p := range pts {
		if p.Feasible {
			f = append(f, p)
		}
	}
	sort.SliceStable(f, func(i, j int) bool { return f[i].Mass < f[j].Mass || f[i].Mass == f[j].Mass && f[i].Wall < f[j].Wall })
	var front []Point
	best := math.Inf(1)
	for _, p := range f {
		if p.Wall < best-1e-9 {
			front = append(front, p)
			best = p.Wall
		}
	}
	if len(front) <= n {
		return front
	}
	lo, hi := front[0].Mass, front[len(front)-1].Mass
	out := make([]Point, 0, n)
	j := 0
	for i := 0; i < n; i++ {
		target := lo + (hi-lo)*float64(i)/float64(n-1)
		for j < len(front)-1 && math.Abs(front[j+1].Mass-target) <= math.Abs(front[j].Mass-target) {
			j++
		}
		if len(out) == 0 || out[len(out)-1].Mass != front[j].Mass {
			out = append(out, front[j])
		}
	}
	return out
}

// ProcessOf returns the process set i (Head or Barrel) is made by.
func (p Problem) ProcessOf(i int) fins.Process {
	if i == Barrel && p.BarrelProcess.Name != "" {
		return p.BarrelProcess
	}
	return p.Process
}
