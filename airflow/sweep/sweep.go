package sweep

import (
	"runtime"
	"runtime/debug"
	"strings"
	"sync"

	"finmarch/airflow/cylinder"
)

// Axis is one varied key with its values (SI).
type Axis struct {
	Key    string
	Values []float64
}

// Grid is the Cartesian product of its axes; point i runs the last axis
// fastest.
type Grid []Axis

// Size is the number of points.
func (g Grid) Size() int {
	n := 1
	for _, a := range g {
		n *= len(a.Values)
	}
	return n
}

// Point writes the values of point i into vals (one per axis).
func (g Grid) Point(i int, vals []float64) {
	for k := len(g) - 1; k >= 0; k-- {
		a := g[k]
		vals[k] = a.Values[i%len(a.Values)]
		i /= len(a.Values)
	}
}

// Builder returns the design of one grid point from its values (one per
// axis) and the settings to estimate it with. An error marks the point
// invalid: it breaks a design rule and is not estimated.
type Builder func(vals []float64) (cylinder.Design, cylinder.Settings, error)

// The states of a row besides the estimator's verdicts.
const (
	StatusInvalid = "invalid" // the builder refused the point
	StatusFailed  = "failed"  // the estimator failed on it
)

// Row is one evaluated grid point.
type Row struct {
	Index          int
	Values         []float64 // one per axis
	Evaluated      bool      // the estimator gave an outcome (with or without equilibrium)
	Equilibrium    bool
	Status         string // StatusInvalid, StatusFailed or the outcome's cylinder.Status
	Note           string // why invalid or failed, or the no-equilibrium message (first line)
	HeadWall       float64
	BarrelWall     float64 // K
	HeadMargin     float64
	BarrelMargin   float64 // K
	FinMass        float64 // kg, both sets
	HeatPerFinMass float64 // W/kg
	HeadFins       int
	BarrelFins     int
	// HeadEquilibrium and BarrelEquilibrium say which set has one; without
	// it the set's wall and margin are the search's cap, not temperatures
	HeadEquilibrium, BarrelEquilibrium bool
	// Uncastable lists the casting limits of the design's process that the
	// point's fins break (cylinder.Design.Castability); empty when castable
	Uncastable []string
	// OverRated is set when the road asks more than the engine's rated
	// power or top-gear speed at the point (cylinder.HeatLoad.OverRated):
	// the engine cannot hold it, and the temperatures are what it would
	// need.
	OverRated bool
	// Points is the number of operating points a design's worst-case row
	// stands for (Summary with operating axes); 0 on a row of one point.
	Points int
}

// Within reports whether the row reached an equilibrium within both limits.
func (r Row) Within() bool {
	return r.Evaluated && r.Equilibrium && r.HeadMargin >= 0 && r.BarrelMargin >= 0
}

// Run evaluates every point of g on workers goroutines (0: all cores) and
// hands each row to sink on the calling goroutine as the rows finish (not
// in index order). Each worker has its own builder (newBuilder is called
// once per worker, so a builder may keep scratch state) and its own
// cylinder.Workspace; the estimator is asked for totals only.
func Run(g Grid, workers int, newBuilder func() Builder, sink func(Row)) {
	RunOrdered(g, nil, workers, newBuilder, sink)
}

// RunOrdered is Run with the points handed to the workers in the given
// order (position j of the run is point order(j); nil is index order):
// Grid.Grouped runs the operating points of each design together, so that
// a Summary closes each design soon after it starts.
func RunOrdered(g Grid, order func(int) int, workers int, newBuilder func() Builder, sink func(Row)) {
	if order == nil {
		order = func(j int) int { return j }
	}
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	total := g.Size()
	// points go to the workers in chunks and come back in batches, so the
	// channels carry one message per chunk rather than one per point; a
	// chunk is small enough that every worker gets many
	chunk := min(max(total/(64*workers), 1), 32)
	// The live heap of a sweep is small and steady (each worker's
	// workspace, the caller's best rows and buffers), while every point
	// allocates a few kilobytes that die at once: collecting at 5 times the
	// live heap instead of twice saves about a tenth of the time (our
	// measurement, BenchmarkSweep1000* in cmd/internal/app).
	if total >= 1000 {
		defer debug.SetGCPercent(debug.SetGCPercent(400))
	}
	type span struct{ lo, hi int }
	jobs := make(chan span, 4*workers)
	rows := make(chan []Row, 4*workers)
	var wg sync.WaitGroup
	for w := 0; w < workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			ws := cylinder.NewWorkspace()
			build := newBuilder()
			for sp := range jobs {
				batch := make([]Row, 0, sp.hi-sp.lo)
				for j := sp.lo; j < sp.hi; j++ {
					batch = append(batch, evalPoint(g, order(j), build, ws))
				}
				rows <- batch
			}
		}()
	}
	go func() {
		for lo := 0; lo < total; lo += chunk {
			jobs <- span{lo, min(lo+chunk, total)}
		}
		close(jobs)
		wg.Wait()
		close(rows)
	}()
	for b := range rows {
		for _, r := range b {
			sink(r)
		}
	}
}

func evalPoint(g Grid, i int, build Builder, ws *cylinder.Workspace) Row {
	r := Row{Index: i, Values: make([]float64, len(g))}
	g.Point(i, r.Values)
	d, set, err := build(r.Values)
	if err != nil {
		r.Status, r.Note = StatusInvalid, firstLine(err.Error())
		return r
	}
	set.Workspace, set.TotalsOnly = ws, true
	o, err := d.Evaluate(set)
	if err != nil {
		r.Status, r.Note = StatusFailed, firstLine(err.Error())
		return r
	}
	r.Evaluated, r.Equilibrium = true, o.NoEquilibrium == nil
	r.HeadEquilibrium, r.BarrelEquilibrium = o.Result.Head.Equilibrium, o.Result.Barrel.Equilibrium
	r.HeadFins, r.BarrelFins = d.Case.Head.Set.Count, d.Case.Barrel.Set.Count
	r.Uncastable = d.Castability()
	r.OverRated = o.Load.OverRated
	r.HeadWall, r.BarrelWall = o.Result.Head.WallTemp, o.Result.Barrel.WallTemp
	r.HeadMargin, r.BarrelMargin = o.HeadMargin(), o.BarrelMargin()
	r.FinMass = o.Result.FinMass()
	r.HeatPerFinMass = o.Result.HeatPerFinMass()
	r.Status = string(o.Status())
	if o.NoEquilibrium != nil {
		r.Note = firstLine(o.NoEquilibrium.Error())
	}
	return r
}

func firstLine(s string) string {
	if i := strings.IndexByte(s, '\n'); i >= 0 {
		return s[:i] + " (and more)"
	}
	return s
}
