package cylinder

import (
	"errors"
	"testing"
)

// The verdict's thresholds: over a limit below zero margin, marginal under
// MarginalBand (15 K, common practice), ok at or above it; either set
// decides; no equilibrium and fixed walls come first.
func TestStatus(t *testing.T) {
	at := func(h, b float64) Outcome {
		var o Outcome
		o.Limits = Limits{Head: 493.15, Barrel: 453.15}
		o.Result.Head.WallTemp, o.Result.Barrel.WallTemp = 493.15-h, 453.15-b
		return o
	}
	for _, c := range []struct {
		head, barrel float64 // margins, K
		want         Status
	}{{20, 20, StatusOK}, {15, 100, StatusOK}, {14.99, 100, StatusMarginal}, {100, 14.99, StatusMarginal},
		{0, 100, StatusMarginal}, {-0.01, 100, StatusOver}, {100, -3, StatusOver}} {
		if got := at(c.head, c.barrel).Status(); got != c.want {
			t.Errorf("margins %g / %g K: %s, want %s", c.head, c.barrel, got, c.want)
		}
	}
	o := at(100, 100)
	o.NoEquilibrium = ErrNoEquilibrium
	if o.Status() != StatusNoEquilibrium {
		t.Error("no equilibrium not reported")
	}
	o = at(-50, 100)
	o.Fixed = true
	if o.Status() != StatusFixed {
		t.Error("fixed walls not reported")
	}
}

// Evaluate balances the design's load (the same walls as Balance), gives
// the heat at fixed walls (the same as AtWall), and reports the absence of
// an equilibrium in the outcome, not as an error.
func TestEvaluate(t *testing.T) {
	c := demoCase(t, false)
	d := Design{Case: c, Load: Load{Direct: true, Given: demoLoad}, Limits: Limits{Head: 493.15, Barrel: 453.15}}
	o, err := d.Evaluate(Settings{})
	if err != nil {
		t.Fatal(err)
	}
	b := mustBalance(t, c, demoLoad)
	if o.Result.Head.WallTemp != b.Head.WallTemp || o.Load.Head != demoLoad.Head || o.HeadMargin() != 493.15-b.Head.WallTemp {
		t.Errorf("evaluate %.6f K, balance %.6f K", o.Result.Head.WallTemp, b.Head.WallTemp)
	}
	d.Walls = &[2]float64{450, 400}
	f, err := d.Evaluate(Settings{})
	if err != nil {
		t.Fatal(err)
	}
	w, _ := c.AtWall(450, 400, Settings{})
	if !f.Fixed || f.Result.Head.HeatRejected != w.Head.HeatRejected || f.Load != (HeatLoad{}) {
		t.Errorf("fixed walls: %+v", f.Load)
	}
	d.Walls = nil
	d.Load.Given.Head = 40000
	n, err := d.Evaluate(Settings{})
	if err != nil || !errors.Is(n.NoEquilibrium, ErrNoEquilibrium) || n.Status() != StatusNoEquilibrium {
		t.Errorf("no equilibrium: err %v, outcome %v", err, n.NoEquilibrium)
	}
}
