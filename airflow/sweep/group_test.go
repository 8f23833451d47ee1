package sweep

import (
	"math"
	"sort"
	"testing"

	"finmarch/airflow/internal/demotest"
)

// The grouped order is a permutation of the points that runs each design's
// operating points one after another, designs and operating points each in
// index order; with no operating axis it is the index order.
func TestGroupedOrder(t *testing.T) {
	g := Grid{{Key: "air.speed", Values: []float64{10, 20, 30}}, {Key: "head.pitch", Values: []float64{1, 2}}, {Key: "air.ambient", Values: []float64{280, 300}}, {Key: "head.height", Values: []float64{5, 6, 7}}}
	op := []bool{true, false, true, false}
	order := g.Grouped(op)
	seen := map[int]bool{}
	vals := make([]float64, len(g))
	var prev [2]float64
	for j := 0; j < g.Size(); j++ {
		i := order(j)
		if i < 0 || i >= g.Size() || seen[i] {
			t.Fatalf("position %d: point %d out of range or repeated", j, i)
		}
		seen[i] = true
		g.Point(i, vals)
		design := [2]float64{vals[1], vals[3]}
		// 6 operating points a design: each block of 6 is one design, in order
		if j%6 == 0 {
			if j > 0 && !(design[0] > prev[0] || design[0] == prev[0] && design[1] > prev[1]) {
				t.Errorf("design %v after %v at position %d", design, prev, j)
			}
			prev = design
		} else if design != prev {
			t.Errorf("position %d: design %v inside the block of %v", j, design, prev)
		}
	}
	none := g.Grouped([]bool{false, false, false, false})
	for j := 0; j < g.Size(); j++ {
		if none(j) != j {
			t.Fatalf("no operating axis: position %d runs point %d", j, none(j))
		}
	}
}

// A grouped summary ranks designs by their worst operating point, checked
// against the rows of a plain run folded by hand: the coolest designs by
// their hottest head over the speeds (every speed with an equilibrium),
// the lightest among the designs within both limits at every speed; and in
// the grouped run order few designs are open at once.
func TestGroupedSummary(t *testing.T) {
	d := demotest.Upright(t)
	d.Load.Direct, d.Load.Given.Head, d.Load.Given.Barrel = true, 2300, 1200
	var pitches []float64
	for p := 0.003; p < 0.016; p += 0.001 {
		pitches = append(pitches, p)
	}
	g := Grid{{Key: "head.pitch", Values: pitches}, {Key: "air.speed", Values: []float64{15, 25, 35}}}
	op := []bool{false, true}
	s := NewGroupedSummary(4, g, op)
	var all []Row
	most := 0
	RunOrdered(g, g.Grouped(op), 2, pitchSpeed(d), func(r Row) {
		s.Add(r)
		all = append(all, r)
		most = max(most, s.Open())
	})
	if s.Open() != 0 || len(all) != g.Size() {
		t.Fatalf("%d designs left open, %d rows", s.Open(), len(all))
	}
	if most > 8 {
		t.Errorf("%d designs open at once in the grouped order", most)
	}
	type worst struct {
		head, barrel, mass float64
		eq, within, broken bool
	}
	by := map[float64]*worst{}
	for _, r := range all {
		w := by[r.Values[0]]
		if w == nil {
			w = &worst{head: math.Inf(-1), barrel: math.Inf(-1), eq: true, within: true}
			by[r.Values[0]] = w
		}
		if !r.Evaluated {
			w.broken = true
			continue
		}
		w.head, w.barrel, w.mass = max(w.head, r.HeadWall), max(w.barrel, r.BarrelWall), r.FinMass
		w.eq = w.eq && r.Equilibrium
		w.within = w.within && r.Within()
	}
	var cool, light []float64 // pitches, best first
	for p, w := range by {
		if !w.broken && w.eq {
			cool = append(cool, p)
		}
		if !w.broken && w.eq && w.within {
			light = append(light, p)
		}
	}
	sort.Slice(cool, func(i, j int) bool { return by[cool[i]].head < by[cool[j]].head })
	sort.Slice(light, func(i, j int) bool { return by[light[i]].mass < by[light[j]].mass })
	got := s.Coolest.Rows()
	if len(got) != min(4, len(cool)) || len(got) == 0 {
		t.Fatalf("%d coolest designs, want %d", len(got), min(4, len(cool)))
	}
	for i, r := range got {
		w := by[r.Values[0]]
		if r.Values[0] != cool[i] || r.HeadWall != w.head || r.BarrelWall != w.barrel || r.Points != 3 {
			t.Errorf("coolest %d: pitch %g, head %.3f K, barrel %.3f K over %d points; want pitch %g, %.3f K, %.3f K over 3",
				i, r.Values[0], r.HeadWall, r.BarrelWall, r.Points, cool[i], w.head, w.barrel)
		}
		if r.Values[1] != 15 {
			t.Errorf("coolest %d: the hottest head should be at the lowest speed, not %g m/s", i, r.Values[1])
		}
	}
	lr := s.Lightest.Rows()
	if len(lr) != min(4, len(light)) {
		t.Fatalf("%d lightest designs, want %d", len(lr), min(4, len(light)))
	}
	for i, r := range lr {
		// designs of equal fin mass (the same count, pitches apart) may
		// come in either order: the mass at each rank is what must agree
		if w := by[r.Values[0]]; w == nil || w.mass != by[light[i]].mass || !w.within || !r.Within() {
			t.Errorf("lightest %d: pitch %g, want %g (%.4f kg)", i, r.Values[0], light[i], by[light[i]].mass)
		}
	}
	if len(light) == len(cool) {
		t.Error("every design within its limits at every speed: the test does not tell the lists apart")
	}
}
