package cylinder

import (
	"errors"
	"math"
	"testing"

	"finmarch/airflow"
	"finmarch/fins"
	"finmarch/materials"
)

// demoCase builds a cylinder like the built-in demo (an invented scenario):
// annular fins upright, or longitudinal fins laid over.
func demoCase(t testing.TB, laidOver bool) Case {
	al, err := materials.Lookup("A356-T6")
	if err != nil {
		t.Fatal(err)
	}
	c := Case{Tilt: 0, Speed: 90 / 3.6, Recovery: 0.5, Ambient: 308.15, Pressure: 101325,
		Head:   FinSet{Name: "head", Alloy: al, Emissivity: 0.2, Set: fins.Set{Style: fins.StyleAnnular, Count: 8, Pitch: 0.009, Height: 0.040, RootThickness: 0.004, TipThickness: 0.002, RootDiameter: 0.12, Length: 0.072}},
		Barrel: FinSet{Name: "barrel", Alloy: al, Emissivity: 0.9, Set: fins.Set{Style: fins.StyleAnnular, Count: 12, Pitch: 0.009, Height: 0.030, RootThickness: 0.0035, TipThickness: 0.0018, RootDiameter: 0.092, Length: 0.108}},
	}
	if laidOver {
		c.Tilt = math.Pi / 2
		c.Head.Set.Style, c.Head.Set.Count, c.Head.Set.Pitch = fins.StyleLongitudinal, 44, 0.0085
		c.Barrel.Set.Style, c.Barrel.Set.Count, c.Barrel.Set.Pitch = fins.StyleLongitudinal, 36, 0.008
	}
	return c
}

var demoLoad = HeatLoad{Head: 2700, Barrel: 1450}

func mustBalance(t testing.TB, c Case, l HeatLoad, s ...Settings) Result {
	t.Helper()
	set := Settings{Method: MethodChannel} // these tests hold the channel march
	if len(s) > 0 {
		set = s[0]
	}
	r, err := c.Balance(l, set)
	if err != nil {
		t.Fatal(err)
	}
	return r
}

// The energy checks: each set rejects its load (the wall search's
// balanceTol, 1e-5 of the load, reported as LoadImbalance), and the air's
// enthalpy rise computed from its inlet and outlet temperatures alone
// (integral of the Cengel cp cubic, times the mass flow of all paths)
// equals the forced heat summed over the segments to 1e-9 (it fails if the
// march's bookkeeping of paths, mass flow or cp goes wrong); the segment
// heats add up to the forced heat.
func TestBalanceAndEnergy(t *testing.T) {
	for _, lo := range []bool{false, true} {
		c := demoCase(t, lo)
		r := mustBalance(t, c, demoLoad)
		for _, s := range []SetResult{r.Head, r.Barrel} {
			// the wall search stops at 1e-5 of the load (balanceTol)
			if math.Abs(s.HeatRejected-s.HeatLoad) > 1e-5*s.HeatLoad {
				t.Errorf("laid over %v %s: rejected %.4f W for load %.4f W", lo, s.Name, s.HeatRejected, s.HeatLoad)
			}
			if !(s.AirImbalance < 1e-9) || !(s.LoadImbalance <= balanceTol) {
				t.Errorf("laid over %v %s: air imbalance %.3g, load imbalance %.3g", lo, s.Name, s.AirImbalance, s.LoadImbalance)
			}
			sum := 0.0
			for _, sg := range s.March {
				sum += sg.Heat
			}
			if math.Abs(sum-s.PassageHeat) > 1e-9*s.PassageHeat {
				t.Errorf("segment heats sum to %.6f, passage heat %.6f", sum, s.PassageHeat)
			}
			if !(s.WallTemp > s.AirOut && s.AirOut > s.AirIn) {
				t.Errorf("%s: wall %.2f K must exceed air out %.2f K above air in %.2f K", s.Name, s.WallTemp, s.AirOut, s.AirIn)
			}
		}
	}
}

// Laid over with longitudinal fins the air warms along the head-then-barrel
// path and the local heat flux falls downstream; the barrel is fed the
// head's outlet air. Upright with annular fins every path starts at
// ambient.
func TestOrientationBehaviour(t *testing.T) {
	lo := mustBalance(t, demoCase(t, true), demoLoad)
	up := mustBalance(t, demoCase(t, false), demoLoad)
	if !lo.Head.Series || !lo.Barrel.Series || up.Head.Series {
		t.Fatal("series path flags wrong")
	}
	if math.Abs(lo.Barrel.AirIn-lo.Head.AirOut) > 1e-9 {
		t.Errorf("barrel inlet %.3f K is not the head outlet %.3f K", lo.Barrel.AirIn, lo.Head.AirOut)
	}
	if up.Barrel.AirIn != up.Ambient || up.Head.AirIn != up.Ambient {
		t.Error("upright paths must be fed with ambient air")
	}
	for _, s := range []SetResult{lo.Head, lo.Barrel} {
		m := s.March
		for i := 1; i < len(m); i++ {
			if !(m[i].AirIn > m[i-1].AirIn) {
				t.Fatalf("%s: air does not warm at segment %d", s.Name, i)
			}
			if !(m[i].Flux < m[i-1].Flux) {
				t.Fatalf("%s: local flux does not fall at segment %d (%.1f after %.1f)", s.Name, i, m[i].Flux, m[i-1].Flux)
			}
		}
	}
	if !(lo.Head.WallTemp > up.Head.WallTemp) {
		t.Errorf("laid-over head %.1f K should run hotter than upright %.1f K at the same speed and load", lo.Head.WallTemp, up.Head.WallTemp)
	}
	if !(lo.Head.PassageVelocity < up.Head.PassageVelocity) {
		t.Error("the series path should carry slower head air")
	}
}

// Exact exponential per segment: the result moves less than 0.5% between
// N = 20 and N = 200 (the project's stated tolerance for the march; measured
// here well below).
func TestSegmentIndependence(t *testing.T) {
	for _, lo := range []bool{false, true} {
		c := demoCase(t, lo)
		a := mustBalance(t, c, demoLoad, Settings{Method: MethodChannel, Segments: 20})
		b := mustBalance(t, c, demoLoad, Settings{Method: MethodChannel, Segments: 200})
		for _, p := range [][2]SetResult{{a.Head, b.Head}, {a.Barrel, b.Barrel}} {
			rise20, rise200 := p[0].WallTemp-c.Ambient, p[1].WallTemp-c.Ambient
			if r := math.Abs(rise20-rise200) / rise200; r > 0.005 {
				t.Errorf("laid over %v %s: wall rise %.3f K at N=20 vs %.3f K at N=200 (%.2f%%)", lo, p[0].Name, rise20, rise200, 100*r)
			}
			if r := math.Abs(p[0].AirOut-p[1].AirOut) / (p[1].AirOut - p[1].AirIn); r > 0.005 {
				t.Errorf("%s: air rise moved %.2f%%", p[0].Name, 100*r)
			}
		}
	}
}

// Trends that must hold (issue: hotter ambient or higher altitude gives a
// hotter head; more fin area at a fixed feasible pitch gives a cooler head;
// zero speed gives a finite idle answer from natural convection).
func TestTrends(t *testing.T) {
	for _, lo := range []bool{false, true} {
		base := mustBalance(t, demoCase(t, lo), demoLoad)
		hot := demoCase(t, lo)
		hot.Ambient += 10
		if r := mustBalance(t, hot, demoLoad); !(r.Head.WallTemp > base.Head.WallTemp+5) {
			t.Errorf("laid over %v: 10 K hotter ambient gave head %.2f K vs %.2f K", lo, r.Head.WallTemp, base.Head.WallTemp)
		}
		high := demoCase(t, lo)
		high.Pressure = airflow.ISA(2000, nil).P
		if r := mustBalance(t, high, demoLoad); !(r.Head.WallTemp > base.Head.WallTemp) {
			t.Errorf("laid over %v: 2000 m gave head %.2f K vs %.2f K", lo, r.Head.WallTemp, base.Head.WallTemp)
		}
		// taller fins on both sets (on the series path the barrel passages
		// meter the air, so taller head fins alone gain little)
		tall := demoCase(t, lo)
		tall.Head.Set.Height *= 1.25
		tall.Barrel.Set.Height *= 1.25
		if r := mustBalance(t, tall, demoLoad); !(r.Head.WallTemp < base.Head.WallTemp) {
			t.Errorf("laid over %v: taller fins gave head %.2f K vs %.2f K", lo, r.Head.WallTemp, base.Head.WallTemp)
		}
		faster := demoCase(t, lo)
		faster.Speed *= 1.3
		if r := mustBalance(t, faster, demoLoad); !(r.Head.WallTemp < base.Head.WallTemp) {
			t.Errorf("laid over %v: more speed at the same load should cool", lo)
		}
		idle := demoCase(t, lo)
		idle.Speed = 0
		r := mustBalance(t, idle, HeatLoad{Head: 300, Barrel: 150})
		for _, s := range []SetResult{r.Head, r.Barrel} {
			if !(s.WallTemp > idle.Ambient && s.WallTemp < SaneWallLimit) || s.ForcedHeat != 0 || !(s.NaturalHeat > 0 && s.RadiationHeat > 0) {
				t.Errorf("idle %s: wall %.1f K, forced %.1f, natural %.1f, radiation %.1f", s.Name, s.WallTemp, s.ForcedHeat, s.NaturalHeat, s.RadiationHeat)
			}
		}
	}
}

// A load no fin set can carry is reported as ErrNoEquilibrium with advice.
func TestNoEquilibrium(t *testing.T) {
	c := demoCase(t, false)
	_, err := c.Balance(HeatLoad{Head: 40000, Barrel: 100}, Settings{Method: MethodChannel})
	if !errors.Is(err, ErrNoEquilibrium) {
		t.Fatalf("want ErrNoEquilibrium, got %v", err)
	}
	if msg := err.Error(); !contains(msg, "head fins") || !contains(msg, "add fin area") {
		t.Errorf("message lacks the set or the advice: %s", msg)
	}
}

func contains(s, sub string) bool {
	for i := 0; i+len(sub) <= len(s); i++ {
		if s[i:i+len(sub)] == sub {
			return true
		}
	}
	return false
}

// AtWall and Balance agree: the heat rejected at the balanced wall
// temperatures is the load.
func TestAtWallMatchesBalance(t *testing.T) {
	c := demoCase(t, true)
	b := mustBalance(t, c, demoLoad)
	w, err := c.AtWall(b.Head.WallTemp, b.Barrel.WallTemp, Settings{Method: MethodChannel})
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(w.Head.HeatRejected-demoLoad.Head) > 1e-5*demoLoad.Head || math.Abs(w.Barrel.HeatRejected-demoLoad.Barrel) > 1e-5*demoLoad.Barrel {
		t.Errorf("at wall: %.4f / %.4f W for loads %.1f / %.1f", w.Head.HeatRejected, w.Barrel.HeatRejected, demoLoad.Head, demoLoad.Barrel)
	}
}

// A fixed h replaces the correlations: with the fin efficiency, NTU and the
// exponential of a single segment the outlet temperature is the closed
// form T_w - (T_w - T_in) exp(-eta_o h A / (mdot cp)) for a constant cp
// (checked loosely, 1e-3, since cp varies slightly with temperature).
func TestFixedHClosedForm(t *testing.T) {
	c := demoCase(t, false)
	c.FixedH = 50
	r, err := c.AtWall(450, 400, Settings{Method: MethodChannel, Segments: 1})
	if err != nil {
		t.Fatal(err)
	}
	s := r.Head
	g, _ := c.Head.Set.Geometry()
	eta := c.Head.Set.FinEfficiency(g, 50, c.Head.Alloy.Conductivity(450), nil)
	etaO := g.SurfaceEfficiency(eta)
	mdot := s.ForcedHeat / (s.AirOut - s.AirIn) / airflow.Properties(0.5*(s.AirIn+s.AirOut), c.Pressure, nil).Cp / float64(s.Paths)
	ntu := etaO * 50 * g.TotalArea / float64(s.Paths) / (mdot * airflow.Properties(0.5*(s.AirIn+s.AirOut), c.Pressure, nil).Cp)
	want := 450 - (450-s.AirIn)*math.Exp(-ntu)
	if math.Abs(s.AirOut-want) > 1e-3*(s.AirOut-s.AirIn) {
		t.Errorf("outlet %.4f K, closed form %.4f K", s.AirOut, want)
	}
	if s.MeanH != 50 || s.Regime != "fixed h" {
		t.Errorf("fixed h not applied: %g %s", s.MeanH, s.Regime)
	}
}

// Road load: P = (0.5 rho CdA v^2 + Crr m g) v, checked by hand at 25 m/s.
func TestRoadLoad(t *testing.T) {
	r := RoadLoad{Mass: 200, CdA: 0.5, Crr: 0.02, Driveline: 0.9, Thermal: 0.25, CoolShare: 0.2, Cylinders: 2, HeadShare: 0.6}
	l, err := r.Heat(25, 1.2)
	if err != nil {
		t.Fatal(err)
	}
	pw := (0.5*1.2*0.5*625 + 0.02*200*airflow.G0) * 25
	if math.Abs(l.WheelPower-pw) > 1e-9 || math.Abs(l.FuelPower-pw/0.9/0.25) > 1e-9 {
		t.Errorf("wheel %.3f (want %.3f), fuel %.3f", l.WheelPower, pw, l.FuelPower)
	}
	q := 0.2 * pw / 0.9 / 0.25 / 2
	if math.Abs(l.Head-0.6*q) > 1e-9 || math.Abs(l.Barrel-0.4*q) > 1e-9 {
		t.Error("split wrong")
	}
	r.Cylinders = -1
	if _, err := r.Heat(25, 1.2); err == nil {
		t.Error("a negative cylinder count accepted")
	}
	// a zero coefficient, efficiency, share or count is its sourced default
	z, err := RoadLoad{Mass: 200, CdA: 0.5}.Heat(25, 1.2)
	if err != nil {
		t.Fatal(err)
	}
	d, _ := RoadLoad{Mass: 200, CdA: 0.5, Crr: DefaultCrr, Driveline: DefaultDriveline, Thermal: DefaultThermal,
		CoolShare: DefaultCoolShare, Cylinders: 1, HeadShare: DefaultHeadShare}.Heat(25, 1.2)
	if z != d {
		t.Errorf("zero fields %+v, defaults %+v", z, d)
	}
	// the idle floor: a load below IdleHeat is raised to it, split alike
	r.Cylinders, r.IdleHeat = 2, 5000
	if l, _ := r.Heat(1, 1.2); math.Abs(l.Head+l.Barrel-5000) > 1e-9 || math.Abs(l.Head-0.6*5000) > 1e-9 {
		t.Errorf("idle floor: %.3f + %.3f W", l.Head, l.Barrel)
	}
}

func BenchmarkEstimateUpright(b *testing.B) {
	c := demoCase(b, false)
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		if _, err := c.Balance(demoLoad, Settings{Method: MethodChannel}); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkEstimateLaidOver(b *testing.B) {
	c := demoCase(b, true)
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		if _, err := c.Balance(demoLoad, Settings{Method: MethodChannel}); err != nil {
			b.Fatal(err)
		}
	}
}

// A shared curve cache gives the same answer as fresh curves, to the last
// bit, and is reused across cases with the same fin sets.
func TestCurveCache(t *testing.T) {
	cache := NewWorkspace()
	for _, lo := range []bool{false, true} {
		for _, v := range []float64{15, 25, 35} {
			c := demoCase(t, lo)
			c.Speed = v
			plain := mustBalance(t, c, demoLoad)
			cached := mustBalance(t, c, demoLoad, Settings{Method: MethodChannel, Workspace: cache})
			if plain.Head.WallTemp != cached.Head.WallTemp || plain.Barrel.WallTemp != cached.Barrel.WallTemp {
				t.Errorf("laid over %v, %g m/s: cached %.9f / %.9f, fresh %.9f / %.9f", lo, v,
					cached.Head.WallTemp, cached.Barrel.WallTemp, plain.Head.WallTemp, plain.Barrel.WallTemp)
			}
		}
	}
	if len(cache.m) != 4 {
		t.Errorf("cache holds %d curves, want 4 (two sets, two designs)", len(cache.m))
	}
}

// With a fixed h the fin efficiency and the conductance per unit length are
// the same everywhere, so the march integrates the ordinary differential
// equation mdot cp(T) dT/dx = (UA/L)(T_w - T), whose exact solution is
//
//	integral from T_in to T_out of cp(T)/(T_w - T) dT = UA/mdot
//
// (closed form up to the quadrature; cp(T) is the Cengel cubic). The march
// takes each segment's cp as its mean, a second-order approximation, so it
// must converge to that solution as N grows: to 1e-4 of the rise at N = 3
// and 1e-7 at N = 400.
func TestMarchClosedFormFixedH(t *testing.T) {
	const tw = 470.0
	for _, c := range []struct {
		n   int
		tol float64
	}{{3, 1e-4}, {40, 1e-6}, {400, 1e-7}} {
		cs := demoCase(t, false)
		cs.FixedH = 70
		r, err := cs.AtWall(tw, 420, Settings{Method: MethodChannel, Segments: c.n})
		if err != nil {
			t.Fatal(err)
		}
		s := r.Head
		g, _ := cs.Head.Set.Geometry()
		etaO := g.SurfaceEfficiency(cs.Head.Set.FinEfficiency(g, 70, cs.Head.Alloy.Conductivity(tw), nil))
		ua := etaO * 70 * g.TotalArea / float64(s.Paths)
		mdot := s.PassageVelocity * airflow.Properties(cs.Ambient, cs.Pressure, nil).Rho * g.PassageArea
		cpT := func(T float64) float64 { return airflow.Properties(T, 1e5, nil).Cp }
		// Simpson's rule for the integral, bisection for T_out
		integral := func(tout float64) float64 {
			const m = 20000
			hq := (tout - s.AirIn) / m
			sum := cpT(s.AirIn)/(tw-s.AirIn) + cpT(tout)/(tw-tout)
			for i := 1; i < m; i++ {
				T := s.AirIn + float64(i)*hq
				w := 2.0
				if i%2 == 1 {
					w = 4
				}
				sum += w * cpT(T) / (tw - T)
			}
			return sum * hq / 3
		}
		lo, hi := s.AirIn, tw-1e-9
		for i := 0; i < 100; i++ {
			mid := (lo + hi) / 2
			if integral(mid) < ua/mdot {
				lo = mid
			} else {
				hi = mid
			}
		}
		tout := (lo + hi) / 2
		d := math.Abs(s.AirOut-tout) / (tout - s.AirIn)
		t.Logf("N=%d: %.2g of the rise", c.n, d)
		if d > c.tol {
			t.Errorf("N=%d: march outlet %.9f K, exact %.9f K (%.2g of the rise, tol %.0e)", c.n, s.AirOut, tout, d, c.tol)
		}
	}
}

// The film powers carried by the binomial series give the march that exact
// logarithms and exponentials at every segment give, to 1e-11 of the heat
// and 1e-9 K of the outlet air (the series is truncated below 2e-14 per
// step and re-anchored every 16 steps; see film.go).
func TestFilmPowers(t *testing.T) {
	for _, lo := range []bool{false, true} {
		for _, n := range []int{8, 40, 200} {
			c := demoCase(t, lo)
			p, err := c.prepare(Settings{Method: MethodChannel, Segments: n}, nil)
			if err != nil {
				t.Fatal(err)
			}
			for i := range p.sets {
				set := &p.sets[i]
				for _, tw := range []float64{340, 420, 520} {
					p.exactFilm = false
					a := p.march(set, tw, c.Ambient, false)
					p.exactFilm = true
					b := p.march(set, tw, c.Ambient, false)
					if rel(a.q, b.q) > 1e-11 || math.Abs(a.tOut-b.tOut) > 1e-9 {
						t.Errorf("laid over %v N=%d %s at %g K: series %.15g W / %.12f K, exact %.15g W / %.12f K",
							lo, n, set.fs.Name, tw, a.q, a.tOut, b.q, b.tOut)
					}
				}
			}
		}
	}
}

// The closed-form mean cp is the difference quotient of the enthalpy (the
// integral of the Cengel cubic) and, at one temperature, the cubic itself
// as Properties gives it.
func TestMeanCp(t *testing.T) {
	for _, t1 := range []float64{250, 300, 420, 700} {
		if got, want := meanCp(t1, t1), airflow.Properties(t1, 1e5, nil).Cp; rel(got, want) > 1e-14 {
			t.Errorf("cp at %g K: %.15g, Properties %.15g", t1, got, want)
		}
		for _, dt := range []float64{0.5, 5, 40} {
			t2 := t1 + dt
			want := (enthalpy(t2) - enthalpy(t1)) / dt
			if got := meanCp(t1, t2); rel(got, want) > 1e-11 {
				t.Errorf("mean cp %g-%g K: %.15g, quotient %.15g", t1, t2, got, want)
			}
		}
	}
}

// parabolaRoot on an exact parabola (closed form): P(T) = 2 + 3 (T - 1) +
// 0.5 (T - 1)^2 through T = 1, 2, 4 takes the value 10 at
// T = 1 - 3 + sqrt(9 + 16) = 3.
func TestParabolaRoot(t *testing.T) {
	p := func(x float64) float64 { return 2 + 3*(x-1) + 0.5*(x-1)*(x-1) }
	xs := [3]float64{4, 2, 1}
	ys := [3]float64{p(4), p(2), p(1)}
	got, ok := parabolaRoot(xs, ys, 3, 10, 2)
	if !ok || math.Abs(got-3) > 1e-12 {
		t.Errorf("root %.15g (ok %v), want 3", got, ok)
	}
	// too few points, a repeated point, or a root far outside the span
	if _, ok := parabolaRoot(xs, ys, 2, 10, 2); ok {
		t.Error("two points accepted")
	}
	if _, ok := parabolaRoot([3]float64{1, 1, 2}, ys, 3, 10, 2); ok {
		t.Error("repeated point accepted")
	}
	if _, ok := parabolaRoot(xs, ys, 3, 1e6, 2); ok {
		t.Error("root far outside the points accepted")
	}
}

// TotalsOnly changes nothing but the profile: the same wall temperatures,
// heats and outlet air to the last bit, and no segments.
func TestTotalsOnly(t *testing.T) {
	for _, lo := range []bool{false, true} {
		c := demoCase(t, lo)
		full := mustBalance(t, c, demoLoad)
		tot := mustBalance(t, c, demoLoad, Settings{Method: MethodChannel, TotalsOnly: true})
		for _, p := range [][2]SetResult{{full.Head, tot.Head}, {full.Barrel, tot.Barrel}} {
			if p[0].WallTemp != p[1].WallTemp || p[0].HeatRejected != p[1].HeatRejected || p[0].AirOut != p[1].AirOut {
				t.Errorf("laid over %v %s: totals-only %.12f K / %.9f W, full %.12f K / %.9f W",
					lo, p[0].Name, p[1].WallTemp, p[1].HeatRejected, p[0].WallTemp, p[0].HeatRejected)
			}
			if len(p[0].March) == 0 || len(p[1].March) != 0 {
				t.Errorf("%s: %d segments in the full result, %d with totals only", p[0].Name, len(p[0].March), len(p[1].March))
			}
		}
	}
}

// The wind cools every orientation: at 90 km/h, with a 600 W head and
// 300 W barrel load that every orientation can reject, each set of both
// styles runs cooler than in still air at the same heat, by at least 10 K
// (the unfavourable extremes are cooled by the fin envelope alone:
// Churchill & Bernstein crossflow over longitudinal fins upright, the flat
// plate along annular fins laid over), and the wall temperature moves
// monotonically with tilt, from the favourable to the unfavourable end
// (no cliff).
func TestWindCoolsEveryOrientation(t *testing.T) {
	l := HeatLoad{Head: 600, Barrel: 300}
	for _, set := range []Settings{{Method: MethodChannel}, {}} {
		windCools(t, l, set)
	}
}

func windCools(t *testing.T, l HeatLoad, set Settings) {
	mustBalance := func(t *testing.T, c Case, l HeatLoad) Result { return mustBalance(t, c, l, set) }
	for _, lo := range []bool{false, true} {
		c := demoCase(t, lo)
		prev := [2]float64{}
		for i, deg := range []float64{0, 15, 30, 45, 60, 75, 90} {
			c.Tilt = deg * math.Pi / 180
			c.Speed = 0 // still air at the same tilt: natural convection depends on it
			still := mustBalance(t, c, l)
			c.Speed = 25
			r := mustBalance(t, c, l)
			for k, p := range [][2]SetResult{{r.Head, still.Head}, {r.Barrel, still.Barrel}} {
				if !(p[0].WallTemp < p[1].WallTemp-10) {
					t.Errorf("laid over %v, tilt %.0f, %s: %.1f K at 90 km/h against %.1f K in still air", lo, deg, p[0].Name, p[0].WallTemp, p[1].WallTemp)
				}
				// annular fins warm as the tilt rises, longitudinal fins cool
				if i > 0 && (!lo && p[0].WallTemp < prev[k]-1e-6 || lo && p[0].WallTemp > prev[k]+1e-6) {
					t.Errorf("laid over %v, %s: %.2f K at %.0f deg after %.2f K", lo, p[0].Name, p[0].WallTemp, deg, prev[k])
				}
				prev[k] = p[0].WallTemp
			}
		}
	}
}

// The top speed at a rated power, against the closed form of a road load
// with no rolling resistance and no grade: P_crank = 0.5 rho CdA v^3 /
// driveline, so v = cbrt(2 P driveline / (rho CdA)); past it the load is
// flagged OverRated, below it not.
func TestTopSpeed(t *testing.T) {
	r := RoadLoad{Mass: 200, CdA: 0.5, Crr: 1e-12, Driveline: 0.9, RatedPower: 20e3}
	v, ok := r.TopSpeed(1.2)
	want := math.Cbrt(2 * 20e3 * 0.9 / (1.2 * 0.5))
	if !ok || math.Abs(v-want) > 1e-6*want {
		t.Errorf("top speed %.6f m/s, closed form %.6f", v, want)
	}
	if l, _ := r.Heat(v*1.01, 1.2); !l.OverRated {
		t.Error("1 % past the top speed not flagged")
	}
	if l, _ := r.Heat(v*0.99, 1.2); l.OverRated {
		t.Error("1 % below the top speed flagged")
	}
	if _, ok := (RoadLoad{Mass: 200, CdA: 0.5}).TopSpeed(1.2); ok {
		t.Error("a top speed with no rated power")
	}
	// a top-gear speed below the power's top speed sets it, and the load
	// past it is flagged as past the rated speed; above it, the power rules
	g := r
	g.TopGearSpeed = 0.8 * v
	if top, ok := g.TopSpeed(1.2); !ok || top != 0.8*v || !g.TopSpeedByGear(1.2) {
		t.Errorf("geared top speed %.3f m/s (by gear %v), want %.3f", top, g.TopSpeedByGear(1.2), 0.8*v)
	}
	if l, _ := g.Heat(0.81*v, 1.2); !l.OverRated || !l.PastRatedSpeed {
		t.Errorf("past the top-gear speed: %+v", l)
	}
	if l, _ := g.Heat(0.79*v, 1.2); l.OverRated {
		t.Error("below the top-gear speed flagged")
	}
	g.TopGearSpeed = 1.2 * v
	if top, _ := g.TopSpeed(1.2); math.Abs(top-v) > 1e-9*v || g.TopSpeedByGear(1.2) {
		t.Errorf("a top-gear speed above the power's top speed: %.3f m/s", top)
	}
	if top, ok := (RoadLoad{Mass: 200, CdA: 0.5, TopGearSpeed: 30}).TopSpeed(1.2); !ok || top != 30 {
		t.Errorf("top-gear speed alone: %.3f %v", top, ok)
	}
}

// Load.Scaled scales the given heats, or the road load's cooling share
// (its default when unset), and leaves the rest of the load alone.
func TestLoadScaled(t *testing.T) {
	g := Load{Direct: true, Given: HeatLoad{Head: 2000, Barrel: 1000}}.Scaled(1.5)
	if g.Given.Head != 3000 || g.Given.Barrel != 1500 {
		t.Errorf("given: %+v", g.Given)
	}
	r := Load{Road: RoadLoad{Mass: 200, CdA: 0.5}}.Scaled(0.5)
	if r.Road.CoolShare != 0.5*DefaultCoolShare || r.Road.Mass != 200 {
		t.Errorf("road, default share: %+v", r.Road)
	}
	if r = (Load{Road: RoadLoad{CoolShare: 0.3}}).Scaled(2); r.Road.CoolShare != 0.6 {
		t.Errorf("road, stated share: %g", r.Road.CoolShare)
	}
}
