package uncertainty

import (
	"math"
	"testing"

	"finmarch/airflow/cylinder"
	"finmarch/airflow/internal/demotest"
)

// The one-at-a-time study on the upright demo: each end of each input is
// the design evaluated directly with that input moved by its half-width
// (the recovery 0.8 +- 0.3, held to 1; the heat load scaled by 1 +- 0.2;
// the forced coefficient by 1 -+ 0.25, and so on), to 1e-9 K; each input
// moves the head the way the physics says (more recovery, more forced h,
// a higher efficiency: cooler; more cooling share, more head share:
// hotter, and the barrel cooler for the head share); the largest swing
// comes first.
func TestSensitivityIsTheDesignMoved(t *testing.T) {
	d := demotest.Upright(t)
	d.Case.Recovery = 0.8
	d.Load = cylinder.Load{Road: cylinder.RoadLoad{Mass: 230, CdA: 0.45, CoolShare: 0.18, IdleHeat: 500}}
	sp := DefaultSpread()
	ws, err := Sensitivity(d, cylinder.Settings{}, sp)
	if err != nil {
		t.Fatal(err)
	}
	direct := func(mod func(*cylinder.Design, *cylinder.Settings)) float64 {
		v, s := d, cylinder.Settings{OneMethod: true}
		mod(&v, &s)
		o, err := v.Evaluate(s)
		if err != nil {
			t.Fatal(err)
		}
		return o.Result.Head.WallTemp
	}
	by := map[string]Swing{}
	for i, w := range ws {
		by[w.Input] = w
		if i > 0 && w.HeadSwing() > ws[i-1].HeadSwing() {
			t.Errorf("%s swings %.2f K after %s's %.2f K", w.Input, w.HeadSwing(), ws[i-1].Input, ws[i-1].HeadSwing())
		}
	}
	checks := []struct {
		input string
		end   int
		mod   func(*cylinder.Design, *cylinder.Settings)
	}{
		{"pressure recovery", 0, func(v *cylinder.Design, _ *cylinder.Settings) { v.Case.Recovery = 0.5 }},
		{"pressure recovery", 1, func(v *cylinder.Design, _ *cylinder.Settings) { v.Case.Recovery = 1 }},
		{"cooling share", 1, func(v *cylinder.Design, _ *cylinder.Settings) { v.Load = v.Load.Scaled(1.2) }},
		{"forced convection", 0, func(_ *cylinder.Design, s *cylinder.Settings) { s.ForcedFactor = 0.75 }},
	}
	for _, c := range checks {
		w, ok := by[c.input]
		if !ok {
			t.Fatalf("no %s in the study", c.input)
		}
		if want := direct(c.mod); math.Abs(w.Head[c.end]-want) > 1e-9 {
			t.Errorf("%s end %d: head %.6f K, the design moved directly %.6f K", c.input, c.end, w.Head[c.end], want)
		}
	}
	hotter := map[string]bool{"pressure recovery": false, "forced convection": false, "brake thermal efficiency": false, "cooling share": true, "head share": true}
	for in, up := range hotter {
		w := by[in]
		if (w.Head[1] > w.Head[0]) != up {
			t.Errorf("%s: head %.1f K at the low end, %.1f K at the high end", in, w.Head[0], w.Head[1])
		}
	}
	if w := by["head share"]; !(w.Barrel[1] < w.Barrel[0]) {
		t.Errorf("head share: barrel %.1f K at the low end, %.1f K at the high end; more head share leaves the barrel less", w.Barrel[0], w.Barrel[1])
	}
}

// A load given per set has no thermal efficiency or head share to move:
// the study leaves them out rather than show them moving nothing.
func TestSensitivityDirectLoad(t *testing.T) {
	ws, err := Sensitivity(demotest.Upright(t), cylinder.Settings{}, DefaultSpread())
	if err != nil {
		t.Fatal(err)
	}
	for _, w := range ws {
		if w.Input == "head share" || w.Input == "brake thermal efficiency" {
			t.Errorf("%s in the study of a direct load", w.Input)
		}
	}
	if len(ws) != 6 {
		t.Errorf("%d inputs, want 6", len(ws))
	}
}
