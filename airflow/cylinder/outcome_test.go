package cylinder

import (
	"encoding/json"
	"errors"
	"math"
	"strconv"
	"strings"
	"testing"

	"finmarch/fins"
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
	b := mustBalance(t, c, demoLoad, Settings{})
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

// No equilibrium is a state: the set says so, with the heat it cannot
// reject at the search's cap, its JSON wall temperature is null (never the
// cap as a temperature), and on a series path the barrel behind such a
// head has no determined wall either.
func TestNoEquilibriumIsAState(t *testing.T) {
	for _, lo := range []bool{false, true} {
		c := demoCase(t, lo)
		r, err := c.Balance(HeatLoad{Head: 40000, Barrel: 300}, Settings{})
		if !errors.Is(err, ErrNoEquilibrium) {
			t.Fatalf("laid over %v: %v", lo, err)
		}
		h := r.Head
		if h.Equilibrium || !(h.Shortfall > 0) || math.Abs(h.HeatLoad-h.HeatRejected-h.Shortfall) > 1e-9 {
			t.Errorf("laid over %v: head %+v", lo, h)
		}
		b, _ := json.Marshal(h)
		var m map[string]any
		if err := json.Unmarshal(b, &m); err != nil {
			t.Fatal(err)
		}
		if v, ok := m["wall_temperature_K"]; !ok || v != nil || m["equilibrium"] != false {
			t.Errorf("laid over %v: JSON wall %v, equilibrium %v", lo, v, m["equilibrium"])
		}
		if r.Barrel.Equilibrium == lo {
			t.Errorf("laid over %v: barrel equilibrium %v (a series barrel behind a head with none has none)", lo, r.Barrel.Equilibrium)
		}
	}
	ok := mustBalance(t, demoCase(t, false), demoLoad)
	b, _ := json.Marshal(ok.Head)
	if !strings.Contains(string(b), `"wall_temperature_K":`+strconv.FormatFloat(ok.Head.WallTemp, 'g', -1, 64)) {
		t.Errorf("an equilibrium's wall missing from %s", b)
	}
}

// Castability names each broken limit with its value: the demo's head
// (40 mm fins on a 5 mm root gap, 8:1) breaks permanent-mould's 7:1 and
// its barrel's 1.8 mm tips its 2 mm minimum; die casting (10:1, 1.2 mm)
// takes both; no process checks nothing.
func TestCastability(t *testing.T) {
	d := Design{Case: demoCase(t, false)}
	if d.Castability() != nil {
		t.Error("no process, yet a finding")
	}
	d.Process, _ = fins.LookupProcess("permanent-mould")
	c := d.Castability()
	if len(c) != 2 || !strings.Contains(c[0], "head fins: height to root gap 8.0, over the permanent-mould limit 7.0") ||
		!strings.Contains(c[1], "barrel fins: tip 1.80 mm, thinner than the permanent-mould minimum 2.00 mm") {
		t.Errorf("%q", c)
	}
	d.Process, _ = fins.LookupProcess("die-casting")
	if c := d.Castability(); c != nil {
		t.Errorf("die casting: %q", c)
	}
}

// Resolved fills each zero that stands for a default, and only those: the
// resolved design evaluates exactly as the original, carries no zero where
// a default exists, and keeps every value that was given.
func TestResolved(t *testing.T) {
	c := demoCase(t, false)
	c.Recovery = 0
	d := Design{Case: c, Load: Load{Road: RoadLoad{Mass: 230, CdA: 0.45, CoolShare: 0.2}}, Limits: Limits{Head: 493.15, Barrel: 523.15}}
	r := d.Resolved()
	rl := r.Load.Road
	if r.Case.Recovery != DefaultRecovery || rl.Crr != DefaultCrr || rl.Driveline != DefaultDriveline || rl.Thermal != DefaultThermal ||
		rl.HeadShare != DefaultHeadShare || rl.Cylinders != 1 || rl.CoolShare != 0.2 || rl.Mass != 230 {
		t.Errorf("resolved %+v, recovery %g", rl, r.Case.Recovery)
	}
	a, err := d.Evaluate(Settings{})
	if err != nil {
		t.Fatal(err)
	}
	b, err := r.Evaluate(Settings{})
	if err != nil {
		t.Fatal(err)
	}
	if a.Result.Head.WallTemp != b.Result.Head.WallTemp || a.Load != b.Load {
		t.Errorf("resolved design evaluates to %g K (%+v), the original to %g K (%+v)", b.Result.Head.WallTemp, b.Load, a.Result.Head.WallTemp, a.Load)
	}
	// the JSON names of the echo: snake_case with SI suffixes
	js, err := json.Marshal(r)
	if err != nil {
		t.Fatal(err)
	}
	for _, k := range []string{`"pressure_recovery":0.8`, `"rolling_resistance":0.02`, `"pitch_m":0.009`, `"style":"annular"`, `"head_K":493.15`} {
		if !strings.Contains(string(js), k) {
			t.Errorf("design JSON lacks %s", k)
		}
	}
}
