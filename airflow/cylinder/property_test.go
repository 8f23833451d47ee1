package cylinder

import (
	"errors"
	"math"
	"math/rand/v2"
	"testing"

	"finmarch/airflow"
	"finmarch/fins"
	"finmarch/materials"
)

// randomCase draws a valid design: feasible fin sets of either style, any
// tilt, speed 0 to 200 km/h, ambient -30 to 50 C, altitude 0 to 4000 m.
func randomCase(r *rand.Rand) (Case, Settings, HeatLoad) {
	all := materials.All()
	u := func(lo, hi float64) float64 { return lo + (hi-lo)*r.Float64() }
	set := func(d, l float64) fins.Set {
		s := fins.Set{RootDiameter: d, Length: l, Height: u(0.008, 0.6*d), RootThickness: u(0.0015, 0.006)}
		s.TipThickness = s.RootThickness * u(0.2, 1)
		if r.IntN(2) == 0 {
			s.Style = fins.StyleAnnular
			s.Pitch = s.RootThickness + u(0.002, 0.02)
			n := int((l - s.RootThickness) / s.Pitch)
			s.Count = 1 + r.IntN(max(n, 0)+1)
		} else {
			s.Style = fins.StyleLongitudinal
			circ := math.Pi * d
			n := int(circ / (s.RootThickness + 0.002))
			s.Count = 1 + r.IntN(max(n, 1))
			s.Pitch = u(s.RootThickness+0.002, circ/float64(s.Count))
		}
		return s
	}
	hd, bd := u(0.05, 0.2), u(0.04, 0.15)
	c := Case{
		Tilt: u(0, math.Pi/2), Speed: u(0, 200/3.6), Recovery: u(0.1, 1), Ambient: u(243, 323),
		Pressure: airflow.ISA(u(0, 4000), nil).P,
		Head:     FinSet{Name: "head", Alloy: all[r.IntN(len(all))], Emissivity: u(0.05, 1), Set: set(hd, u(0.02, 0.15))},
		Barrel:   FinSet{Name: "barrel", Alloy: all[r.IntN(len(all))], Emissivity: u(0.05, 1), Set: set(bd, u(0.02, 0.2))},
	}
	s := Settings{Method: MethodChannel, Segments: 5 + r.IntN(60)}
	if r.IntN(3) == 0 {
		c.Speed = 0
		return c, s, HeatLoad{Head: u(0, 300), Barrel: u(0, 150)}
	}
	return c, s, HeatLoad{Head: u(0, 3000), Barrel: u(0, 1500)}
}

// Over thousands of random valid designs: no panic, every output number
// finite, wall above the air it meets, the energy balance held to 1e-6,
// and a missing equilibrium reported as ErrNoEquilibrium, never as another
// failure.
func TestRandomDesigns(t *testing.T) {
	n := 2000
	if testing.Short() {
		n = 200
	}
	r := rand.New(rand.NewPCG(7, 11))
	noEq, loadOff := 0, 0
	for i := 0; i < n; i++ {
		c, set, load := randomCase(r)
		if _, err := c.Head.Set.Geometry(); err != nil {
			t.Fatalf("generator made an invalid head: %v", err)
		}
		res, err := c.Balance(load, set)
		if err != nil {
			if !errors.Is(err, ErrNoEquilibrium) {
				t.Fatalf("case %d: %v\n%+v", i, err, c)
			}
			noEq++
		}
		for _, s := range []SetResult{res.Head, res.Barrel} {
			vals := []float64{s.WallTemp, s.HeatRejected, s.ForcedHeat, s.NaturalHeat, s.RadiationHeat, s.MeanH, s.NaturalH,
				s.FinEfficiency, s.SurfaceEfficiency, s.AirIn, s.AirOut, s.Reynolds, s.FinMass, s.AirImbalance, s.LoadImbalance}
			for _, sg := range s.March {
				vals = append(vals, sg.AirIn, sg.AirOut, sg.H, sg.FinEff, sg.Flux, sg.Heat)
			}
			for _, v := range vals {
				if math.IsNaN(v) || math.IsInf(v, 0) {
					t.Fatalf("case %d %s: non-finite output in %+v", i, s.Name, s)
				}
			}
			// a loaded set sits above ambient; where it meets air from
			// ambient (every set but a series barrel) it sits above that air
			if s.HeatLoad > 0 && !(s.WallTemp > c.Ambient) {
				t.Fatalf("case %d %s: wall %.3f K not above ambient %.3f K", i, s.Name, s.WallTemp, c.Ambient)
			}
			if s.HeatLoad > 0 && !s.Series && !(s.WallTemp > s.AirIn) {
				t.Fatalf("case %d %s: wall %.3f K not above air %.3f K", i, s.Name, s.WallTemp, s.AirIn)
			}
			lo, hi := math.Min(s.AirIn, s.WallTemp), math.Max(s.AirIn, s.WallTemp)
			if !(s.AirOut >= lo-1e-9 && s.AirOut <= hi+1e-9) {
				t.Fatalf("case %d %s: outlet %.3f K outside [%.3f, %.3f]", i, s.Name, s.AirOut, lo, hi)
			}
			if s.AirImbalance > 1e-6 {
				t.Fatalf("case %d %s: air imbalance %.3g", i, s.Name, s.AirImbalance)
			}
			if err == nil && s.HeatLoad > 0 && s.LoadImbalance > 1e-3 {
				loadOff++
				t.Logf("case %d %s: heat rejected %.1f W for a %.1f W load (%.2g)", i, s.Name, s.HeatRejected, s.HeatLoad, s.LoadImbalance)
			}
			if !(s.FinEfficiency > 0 && s.FinEfficiency <= 1+1e-12) {
				t.Fatalf("case %d %s: fin efficiency %g\n%+v\n%+v", i, s.Name, s.FinEfficiency, s, c)
			}
		}
	}
	t.Logf("%d designs, %d without equilibrium below %.0f K, %d sets off their load by more than 1e-3", n, noEq, SaneWallLimit, loadOff)
	// a series barrel with a tiny load behind a hot head can sit where the
	// forced and natural terms cancel and the wall search meets its step
	// tolerance before the heat meets the load (DEVELOPERS.md); the check
	// reports it, and it must stay rare
	if loadOff > n/500 {
		t.Errorf("%d of %d designs off their load by more than 1e-3", loadOff, n)
	}
}
