package sweep

// Operating points against designs. A grid may vary what the fins are (a
// pitch, a height: the design) and the conditions they meet (a road speed,
// an ambient: the operating point). To choose a design, each design is
// judged by its worst operating point: the hottest head over the speeds
// and ambients swept, and it is within its limits only if it is within
// them at every one.

// digits writes the value index of point i on each axis (the last axis
// fastest).
func (g Grid) digits(i int, d []int) {
	for k := len(g) - 1; k >= 0; k-- {
		n := len(g[k].Values)
		d[k] = i % n
		i /= n
	}
}

// Grouped returns the run order that evaluates the points of each design
// one after another: the point at position j of the run is order(j).
// operating marks the axes that are operating points (one flag per axis).
// The order is a permutation of 0..Size()-1 that keeps the designs in
// their index order and, within a design, its operating points in theirs;
// a point keeps its index (the rows say which point they are).
func (g Grid) Grouped(operating []bool) (order func(int) int) {
	var perm []int // design axes first, then operating axes, each in grid order
	for pass := 0; pass < 2; pass++ {
		for k := range g {
			if operating[k] == (pass == 1) {
				perm = append(perm, k)
			}
		}
	}
	return func(j int) int {
		// j's digits in the permuted grid, the last fastest
		d := make([]int, len(g))
		for p := len(perm) - 1; p >= 0; p-- {
			n := len(g[perm[p]].Values)
			d[perm[p]] = j % n
			j /= n
		}
		i := 0
		for k := range g {
			i = i*len(g[k].Values) + d[k]
		}
		return i
	}
}

// designOf returns the design number of point i (its digits on the axes
// not marked operating) and the number of operating points of each design.
func (g Grid) designOf(operating []bool, i int, d []int) (id, per int) {
	g.digits(i, d)
	per = 1
	for k := range g {
		if operating[k] {
			per *= len(g[k].Values)
			continue
		}
		id = id*len(g[k].Values) + d[k]
	}
	return id, per
}

// group folds the rows of one design as they arrive.
type group struct {
	n      int
	broken bool // a point was invalid or failed: the design is not ranked
	worst  Row  // the design's worst case so far
}

// statusRank orders the verdicts from best to worst.
var statusRank = map[string]int{"fixed walls": 0, "ok": 1, "marginal": 2, "OVER LIMIT": 3, "NO EQUILIBRIUM": 4}

// fold takes row r into the group: the hottest head's point stands for the
// design, with the hottest barrel, the least margins, the worst verdict and
// an equilibrium only if every point has one.
func (gr *group) fold(r Row) {
	gr.n++
	if !r.Evaluated {
		gr.broken = true
		return
	}
	if gr.worst.Points == 0 {
		gr.worst = r
		gr.worst.Points = 1
		return
	}
	w := &gr.worst
	hot := r
	if w.HeadWall >= r.HeadWall {
		hot = *w
	}
	hot.Points = w.Points + 1
	hot.BarrelWall = max(w.BarrelWall, r.BarrelWall)
	hot.HeadMargin, hot.BarrelMargin = min(w.HeadMargin, r.HeadMargin), min(w.BarrelMargin, r.BarrelMargin)
	hot.Equilibrium = w.Equilibrium && r.Equilibrium
	hot.OverRated = w.OverRated || r.OverRated
	hot.HeadEquilibrium = w.HeadEquilibrium && r.HeadEquilibrium
	hot.BarrelEquilibrium = w.BarrelEquilibrium && r.BarrelEquilibrium
	if statusRank[w.Status] > statusRank[r.Status] {
		hot.Status = w.Status
	} else {
		hot.Status = r.Status
	}
	*w = hot
}
