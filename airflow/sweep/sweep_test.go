package sweep

import (
	"errors"
	"math"
	"sort"
	"testing"

	"finmarch/airflow/cylinder"
	"finmarch/airflow/internal/demotest"
)

// A library user's builder: head pitch (with as many fins as fit) and road
// speed changed on the case directly; a pitch at or below the root
// thickness is refused.
func pitchSpeed(d cylinder.Design) func() Builder {
	return func() Builder {
		return func(x []float64) (cylinder.Design, cylinder.Settings, error) {
			v := d
			s := &v.Case.Head.Set
			if x[0] <= s.RootThickness {
				return v, cylinder.Settings{}, errors.New("pitch not above the root thickness")
			}
			s.Pitch = x[0]
			s.Count = s.Fitting()
			v.Case.Speed = x[1]
			return v, cylinder.Settings{}, nil
		}
	}
}

// Every point comes back once, with the values of its index (the last axis
// fastest), the same rows on one worker and on two, each row the
// estimator's own outcome for that design, and invalid points marked.
func TestRun(t *testing.T) {
	d := demotest.Upright(t)
	g := Grid{{Key: "head.pitch", Values: []float64{0.003, 0.007, 0.009, 0.012}}, {Key: "air.speed", Values: []float64{15, 30}}}
	if g.Size() != 8 {
		t.Fatalf("size %d", g.Size())
	}
	collect := func(workers int) []Row {
		var rows []Row
		Run(g, workers, pitchSpeed(d), func(r Row) { rows = append(rows, r) })
		sort.Slice(rows, func(i, j int) bool { return rows[i].Index < rows[j].Index })
		return rows
	}
	one, two := collect(1), collect(2)
	if len(one) != 8 || len(two) != 8 {
		t.Fatalf("%d and %d rows", len(one), len(two))
	}
	for i, r := range one {
		if r.Index != i || r.Values[0] != g[0].Values[i/2] || r.Values[1] != g[1].Values[i%2] {
			t.Errorf("row %d: index %d values %v", i, r.Index, r.Values)
		}
		if r.HeadWall != two[i].HeadWall || r.Status != two[i].Status {
			t.Errorf("row %d differs between one and two workers", i)
		}
		if i < 2 {
			if r.Status != StatusInvalid || r.Evaluated {
				t.Errorf("row %d should be invalid: %+v", i, r)
			}
			continue
		}
		v, _, _ := pitchSpeed(d)()(r.Values)
		o, err := v.Evaluate(cylinder.Settings{})
		if err != nil {
			t.Fatal(err)
		}
		if math.Abs(r.HeadWall-o.Result.Head.WallTemp) > 1e-9 || r.Status != string(o.Status()) || r.HeadFins != v.Case.Head.Set.Count {
			t.Errorf("row %d: %.6f K %s, estimator %.6f K %s", i, r.HeadWall, r.Status, o.Result.Head.WallTemp, o.Status())
		}
	}
}

// The summary counts every status, keeps the invalid point of lowest index,
// and its best lists hold the least keys in order (checked against a sort
// of all rows).
func TestSummary(t *testing.T) {
	d := demotest.Upright(t)
	var pitches []float64
	for p := 0.002; p < 0.016; p += 0.0005 {
		pitches = append(pitches, p)
	}
	g := Grid{{Key: "head.pitch", Values: pitches}, {Key: "air.speed", Values: []float64{10, 20, 35}}}
	s := NewSummary(5)
	var all []Row
	Run(g, 2, pitchSpeed(d), func(r Row) { s.Add(r); all = append(all, r) })
	n := 0
	for _, c := range s.Counts {
		n += c
	}
	if n != g.Size() || s.FirstInvalid == nil || s.FirstInvalid.Index != 0 {
		t.Fatalf("counts %v, first invalid %+v", s.Counts, s.FirstInvalid)
	}
	var eq []Row
	for _, r := range all {
		if r.Evaluated && r.Equilibrium {
			eq = append(eq, r)
		}
	}
	sort.Slice(eq, func(i, j int) bool { return eq[i].HeadWall < eq[j].HeadWall })
	got := s.Coolest.Rows()
	if len(got) != 5 {
		t.Fatalf("%d coolest rows", len(got))
	}
	for i := range got {
		if got[i].HeadWall != eq[i].HeadWall {
			t.Errorf("coolest %d: %.3f K, want %.3f K", i, got[i].HeadWall, eq[i].HeadWall)
		}
	}
	for _, r := range s.Lightest.Rows() {
		if !r.Within() {
			t.Errorf("a lightest row is over a limit: %+v", r)
		}
	}
}
