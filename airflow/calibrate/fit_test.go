package calibrate

import (
	"errors"
	"math"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"finmarch/airflow/cylinder"
	"finmarch/airflow/internal/demotest"
	"finmarch/airflow/uncertainty"
)

// demo is the upright demo with its road load (the load rises with speed,
// which parts the parameters).
func demo(t testing.TB) cylinder.Design {
	d := demotest.Upright(t)
	d.Load = cylinder.Load{Road: cylinder.RoadLoad{Mass: 230, CdA: 0.45, CoolShare: 0.18, IdleHeat: 500}}
	return d
}

// measure makes a "measured" head temperature with the estimator itself at
// recovery rec, plus noise and a measuring-place offset.
func measure(t testing.TB, d cylinder.Design, rec, v, amb, noise, offset float64) Point {
	t.Helper()
	d.Case.Recovery, d.Case.Speed, d.Case.Ambient = rec, v, amb
	o, err := d.Evaluate(cylinder.Settings{})
	if err != nil {
		t.Fatal(err)
	}
	return Point{Speed: v, Ambient: amb, Pressure: d.Case.Pressure, Temp: o.Result.Head.WallTemp + noise + offset}
}

// A measurement made by the tool itself at a known recovery (0.35) gives it
// back to 1e-3 from a design that assumed 0.5, at a fin root and at a plug
// seat whose stated offset is taken off.
func TestRecoversAKnownRecovery(t *testing.T) {
	d := demo(t)
	for _, off := range []float64{0, 25} {
		p := measure(t, d, 0.35, 90/3.6, 303.15, 0, off)
		p.Offset = off
		f, err := Calibrate(d, cylinder.Settings{}, []Point{p})
		if err != nil {
			t.Fatal(err)
		}
		if r, _ := f.Get(Recovery); math.Abs(r-0.35) > 1e-3 || math.Abs(f.Residuals[0]) > 1e-3 {
			t.Errorf("offset %g: recovery %.5f, residual %.3g", off, r, f.Residuals[0])
		}
	}
}

// Three points with 5 K of noise: the fitted recovery and the residuals are
// reported, and the truth lies within two standard errors of the fit; with
// the plug offset fitted too, the offset comes out near the truth.
func TestThreeNoisyPoints(t *testing.T) {
	d := demo(t)
	noise := []float64{5, -5, 4}
	var pts []Point
	for i, v := range []float64{60, 90, 120} {
		pts = append(pts, measure(t, d, 0.35, v/3.6, 300+float64(i)*5, noise[i], 0))
	}
	f, err := Calibrate(d, cylinder.Settings{}, pts)
	if err != nil {
		t.Fatal(err)
	}
	p := f.Params[0]
	if math.Abs(p.Value-0.35) > 2*p.StdError || !(p.StdError > 0) || len(f.Residuals) != 3 {
		t.Errorf("recovery %.4f +- %.4f against 0.35; residuals %v", p.Value, p.StdError, f.Residuals)
	}
	// the residuals are in kelvin whatever the points' uncertainty: the
	// calibrated design re-evaluated at each point, less the reading
	for i := range pts {
		pts[i].Sigma = 2
	}
	f2, err := Calibrate(d, cylinder.Settings{}, pts)
	if err != nil {
		t.Fatal(err)
	}
	dd, ss := f2.Apply(d, cylinder.Settings{})
	for i, q := range pts {
		dd.Case.Speed, dd.Case.Ambient = q.Speed, q.Ambient
		o, err := dd.Evaluate(ss)
		if err != nil {
			t.Fatal(err)
		}
		if r := o.Result.Head.WallTemp - q.Temp; math.Abs(r-f2.Residuals[i]) > 1e-6 {
			t.Errorf("point %d: residual %.4f K, re-evaluated %.4f K", i+1, f2.Residuals[i], r)
		}
	}
	var plug []Point
	for i, v := range []float64{40, 90, 120} {
		q := measure(t, d, 0.35, v/3.6, 300, noise[i], 20)
		plug = append(plug, q)
	}
	g, err := Calibrate(d, cylinder.Settings{}, plug, Recovery, Offset)
	if err != nil {
		t.Fatal(err)
	}
	r, _ := g.Get(Recovery)
	o, _ := g.Get(Offset)
	if math.Abs(r-0.35) > 2*g.Params[0].StdError || math.Abs(o-20) > 2*g.Params[1].StdError {
		t.Errorf("recovery %.4f +- %.4f, offset %.2f +- %.2f K", r, g.Params[0].StdError, o, g.Params[1].StdError)
	}
}

// A fit the points cannot identify is refused, saying why: the recovery
// and the forced factor from two points (both scale the forced
// coefficient), or more parameters than points.
func TestRefusesWhatThePointsCannotTell(t *testing.T) {
	d := demo(t)
	pts := []Point{measure(t, d, 0.35, 60/3.6, 300, 0, 0), measure(t, d, 0.35, 90/3.6, 300, 0, 0)}
	if _, err := Calibrate(d, cylinder.Settings{}, pts, Recovery, ForcedFactor); !errors.Is(err, ErrNotIdentifiable) {
		t.Errorf("recovery and forced factor from two points: %v", err)
	}
	if _, err := Calibrate(d, cylinder.Settings{}, pts[:1], Recovery, Offset); !errors.Is(err, ErrNotIdentifiable) {
		t.Errorf("two parameters from one point: %v", err)
	}
}

// Points the model cannot meet with plausible values are refused rather
// than fitted at the end of a range: a head reading a few kelvin over the
// ambient at full cruise load would need a recovery far above 1.
func TestRefusesAFitAtItsBound(t *testing.T) {
	d := demo(t)
	p := measure(t, d, 0.35, 100/3.6, 300, 0, 0)
	p.Temp = p.Ambient + 30
	_, err := Calibrate(d, cylinder.Settings{}, []Point{p})
	if !errors.Is(err, ErrAtBound) {
		t.Errorf("head 30 K over the ambient at 100 km/h: %v", err)
	}
}

// firstKelvin is the first figure in kelvin an error states ("... 12.3 K
// ..."), and whether there is one.
func firstKelvin(err error) (float64, bool) {
	m := regexp.MustCompile(`(-?[0-9]+(?:\.[0-9]+)?(?:e-?[0-9]+)?) K\b`).FindStringSubmatch(err.Error())
	if m == nil {
		return 0, false
	}
	v, e := strconv.ParseFloat(m[1], 64)
	return v, e == nil
}

// A reading cooler than the design gives at a pressure recovery of 1 (the
// estimator's own end) needs a recovery above 1, out of reach: the fit is
// refused with ErrAtBound, naming the parameter and its plausible range,
// and the miss it states is the one the design gives at recovery 1,
// evaluated here on its own (Design.Evaluate, by measure): the reading's
// distance below it, by construction. Half a kelvin is stated as such, not
// rounded to "0 K".
func TestNeedsARecoveryAboveOne(t *testing.T) {
	d := demo(t)
	full := measure(t, d, 1, 100/3.6, 300, 0, 0) // the design at recovery 1
	for _, below := range []float64{15, 0.3} {
		p := full
		p.Temp -= below
		_, err := Calibrate(d, cylinder.Settings{}, []Point{p})
		if !errors.Is(err, ErrAtBound) {
			t.Fatalf("%.1f K below the head at recovery 1: %v", below, err)
		}
		want := full.Temp - p.Temp // the model at recovery 1 less the reading
		got, ok := firstKelvin(err)
		if !ok || !(got > 0) || math.Abs(got-want) > 0.05+1e-9 {
			t.Errorf("%.1f K below: the error states a miss of %v K (found %v), the design at recovery 1 misses by %.3f K: %v", below, got, ok, want, err)
		}
		if msg := err.Error(); !strings.Contains(msg, Recovery) || !strings.Contains(msg, "0.05 to 1") || !strings.Contains(msg, "beyond 1") {
			t.Errorf("the error names neither the parameter, its range nor the value out of reach: %v", err)
		}
	}
}

// A reading that needs a forced convection factor above its plausible 3,
// made by the design itself at a factor of 4 (within the estimator's own 0
// to 10), is refused with the value it needs (4, solved for the factor
// alone) and the miss at 3, both checked against the design evaluated here
// at those factors.
func TestSaysWhatTheReadingsNeed(t *testing.T) {
	d := demo(t)
	at := func(f float64) float64 {
		c := d
		c.Case.Recovery, c.Case.Speed, c.Case.Ambient = 0.5, 90/3.6, 300
		o, err := c.Evaluate(cylinder.Settings{ForcedFactor: f})
		if err != nil || o.NoEquilibrium != nil {
			t.Fatalf("forced factor %g: %v %v", f, err, o.NoEquilibrium)
		}
		return o.Result.Head.WallTemp
	}
	p := Point{Speed: 90 / 3.6, Ambient: 300, Pressure: d.Case.Pressure, Temp: at(4)}
	d.Case.Recovery = 0.5
	_, err := Calibrate(d, cylinder.Settings{}, []Point{p}, ForcedFactor)
	if !errors.Is(err, ErrAtBound) {
		t.Fatalf("a reading made at a forced factor of 4: %v", err)
	}
	m := regexp.MustCompile(ForcedFactor + ` of ([0-9.]+)`).FindStringSubmatch(err.Error())
	if m == nil {
		t.Fatalf("no value the reading needs: %v", err)
	}
	if need, _ := strconv.ParseFloat(m[1], 64); math.Abs(need-4) > 2e-3 {
		t.Errorf("the reading needs a forced factor of %s, made at 4: %v", m[1], err)
	}
	if got, ok := firstKelvin(err); !ok || math.Abs(got-(at(3)-p.Temp)) > 0.05+1e-9 {
		t.Errorf("miss %v K, the design at a factor of 3 misses by %.3f K: %v", got, at(3)-p.Temp, err)
	}
}

// headCapped reports whether the design's head finds no equilibrium below
// cylinder.SaneWallLimit at recovery rec, 90 km/h and 35 C.
func headCapped(t testing.TB, d cylinder.Design, rec float64) bool {
	t.Helper()
	d.Case.Recovery, d.Case.Speed, d.Case.Ambient = rec, 25, 308.15
	o, err := d.Evaluate(cylinder.Settings{})
	if err != nil {
		t.Fatal(err)
	}
	return o.NoEquilibrium != nil && o.Result.Head.WallTemp >= cylinder.SaneWallLimit-1e-6
}

// hot is the upright demo with its given head heat raised (by bisection,
// from the model itself) until, at 90 km/h and 35 C, the head loses its
// equilibrium just below the recovery edge: it has one at edge and none at
// 0.9 edge. A reading there is close to the balance's cap, where a fit
// from the default recovery overshoots onto the cap.
func hot(t testing.TB, edge float64) cylinder.Design {
	t.Helper()
	d := demotest.Upright(t)
	at := func(k float64) cylinder.Design {
		c := d
		c.Load.Given.Head *= k
		return c
	}
	lo, hi := 0.1, 50.0
	if headCapped(t, at(lo), 0.9*edge) || !headCapped(t, at(hi), 0.9*edge) {
		t.Fatal("no head heat between 0.1 and 50 times the demo's that loses the equilibrium at this recovery")
	}
	for hi-lo > 1e-6*hi {
		if m := (lo + hi) / 2; headCapped(t, at(m), 0.9*edge) {
			hi = m
		} else {
			lo = m
		}
	}
	c := at(hi)
	if headCapped(t, c, edge) || headCapped(t, c, 0.5) {
		t.Fatal("the raised head heat has no equilibrium at the recovery edge")
	}
	return c
}

// A single hot reading far from the start (the design assumes the default
// recovery 0.5) is fitted, not refused as unidentifiable: on the demo,
// made at recovery 0.1; on the demo with a head heat that loses its
// equilibrium just below 0.1 (hot), made at 0.1, near the balance's cap,
// where the first step from 0.5 overshoots onto the cap. The fit finds the
// recovery back, and the design re-evaluated there reproduces the reading.
func TestFitsAHotReadingFarFromTheStart(t *testing.T) {
	v, amb := 90/3.6, 308.15
	for _, c := range []struct {
		name string
		d    cylinder.Design
	}{{"demo", demo(t)}, {"hot head", hot(t, 0.09)}} {
		d := c.d
		start := measure(t, d, 0.5, v, amb, 0, 0).Temp
		p := measure(t, d, 0.1, v, amb, 0, 0)
		f, err := Calibrate(d, cylinder.Settings{}, []Point{p})
		if err != nil {
			t.Errorf("%s: a reading %.1f K over the start, made at recovery 0.1: %v", c.name, p.Temp-start, err)
			continue
		}
		r, _ := f.Get(Recovery)
		d.Case.Recovery, d.Case.Speed, d.Case.Ambient = r, v, amb
		o, err := d.Evaluate(cylinder.Settings{})
		if err != nil {
			t.Fatal(err)
		}
		if math.Abs(r-0.1) > 1e-3 || math.Abs(o.Result.Head.WallTemp-p.Temp) > 0.01 || math.Abs(f.Residuals[0]) > 0.01 {
			t.Errorf("%s: made at 0.1, fitted %.5f, re-evaluated %.3f K against the reading %.3f K (residual %.3g K)", c.name, r, o.Result.Head.WallTemp, p.Temp, f.Residuals[0])
		}
	}
}

// A reading hotter than any equilibrium of the balance (its fin root, the
// reading less a plug offset of -60 K, over cylinder.SaneWallLimit by
// construction), on a design that loses its equilibrium below a recovery
// of 0.2 (hot), is refused with ErrAtBound, not fitted at the edge of the
// equilibrium with a large residual nor called unidentifiable; the value
// it says the reading needs is that edge: the design evaluated here has an
// equilibrium 1 % above it and none 1 % below.
func TestRefusesAReadingPastTheEquilibrium(t *testing.T) {
	d := hot(t, 0.2)
	p := Point{Speed: 25, Ambient: 308.15, Pressure: d.Case.Pressure, Temp: cylinder.SaneWallLimit - 5, Offset: -60}
	if len(p.Check()) > 0 {
		t.Fatal(p.Check())
	}
	f, err := Calibrate(d, cylinder.Settings{}, []Point{p})
	if !errors.Is(err, ErrAtBound) {
		r, _ := f.Get(Recovery)
		t.Fatalf("a fin root %.0f K over the cap: recovery %.4f, residuals %v: %v", p.Temp-p.Offset-cylinder.SaneWallLimit, r, f.Residuals, err)
	}
	m := regexp.MustCompile(Recovery + ` beyond ([0-9.]+)`).FindStringSubmatch(err.Error())
	if m == nil {
		t.Fatalf("no value the reading needs: %v", err)
	}
	edge, _ := strconv.ParseFloat(m[1], 64)
	if headCapped(t, d, 1.01*edge) || !headCapped(t, d, 0.99*edge) {
		t.Errorf("the reading needs a recovery beyond %g, but that is not where the equilibrium ends: %v", edge, err)
	}
}

// Two parameters that truly move together are still refused: a repeated
// reading at one operating point (the same speed, ambient and pressure)
// moves the recovery and the forced factor along parallel columns of the
// Jacobian, whatever the readings say; the refusal names both.
func TestRefusesParametersThatMoveTogether(t *testing.T) {
	d := demo(t)
	a := measure(t, d, 0.35, 90/3.6, 300, 0, 0)
	b := a
	b.Temp += 2
	_, err := Calibrate(d, cylinder.Settings{}, []Point{a, b}, Recovery, ForcedFactor)
	if !errors.Is(err, ErrNotIdentifiable) || !strings.Contains(err.Error(), Recovery) || !strings.Contains(err.Error(), ForcedFactor) {
		t.Errorf("recovery and forced factor from one operating point: %v", err)
	}
}

// A point the fit misses by more than three of its uncertainties is named
// in the warnings (here one reading 40 K off among four).
func TestWarnsOfAPointItMisses(t *testing.T) {
	d := demo(t)
	var pts []Point
	for _, v := range []float64{50, 70, 90, 110} {
		pts = append(pts, measure(t, d, 0.35, v/3.6, 300, 0, 0))
	}
	pts[2].Temp += 40
	f, err := Calibrate(d, cylinder.Settings{}, pts)
	if err != nil {
		t.Fatal(err)
	}
	if len(f.Warnings) == 0 || !strings.Contains(f.Warnings[0], "point 3") {
		t.Errorf("warnings %q, residuals %v", f.Warnings, f.Residuals)
	}
}

// BenchmarkCalibrateThreePoints fits the recovery to three points.
func BenchmarkCalibrateThreePoints(b *testing.B) {
	d := demo(b)
	var pts []Point
	for i, v := range []float64{60, 90, 120} {
		pts = append(pts, measure(b, d, 0.35, v/3.6, 300+float64(i)*5, 0, 0))
	}
	b.ReportAllocs()
	for b.Loop() {
		if _, err := Calibrate(d, cylinder.Settings{}, pts); err != nil {
			b.Fatal(err)
		}
	}
}

// A point outside the plausible ranges is refused before any fit, naming
// the point and the range.
func TestRefusesAnImplausiblePoint(t *testing.T) {
	d := demo(t)
	good := measure(t, d, 0.35, 90/3.6, 300, 0, 0)
	for _, c := range []struct {
		edit func(*Point)
		want string
	}{
		{func(p *Point) { p.Speed = 500 / 3.6 }, "speed"},
		{func(p *Point) { p.Ambient = 200 }, "ambient"},
		{func(p *Point) { p.Temp = p.Ambient - 1 }, "between the ambient and 500 C"},
		{func(p *Point) { p.Sigma = 150 }, "uncertainty"},
	} {
		p := good
		c.edit(&p)
		if _, err := Calibrate(d, cylinder.Settings{}, []Point{good, p}); err == nil || !strings.Contains(err.Error(), "point 2: ") || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%v; want point 2 and %q", err, c.want)
		}
	}
}

// Narrow: a fitted recovery takes the place of the scatter it absorbed; a
// fitted load factor keeps its own half-width on the cooling share; the
// inputs no fit touches keep theirs.
func TestNarrow(t *testing.T) {
	sp := uncertainty.DefaultSpread()
	f := Fit{Params: []Param{{Name: Recovery, Value: 0.4, StdError: 0.03}}}
	n := f.Narrow(sp)
	if n.Recovery != 0.06 || n.Forced != 0 || n.CoolShare != 0 || n.Thermal != 0 || n.HeadShare != 0 ||
		n.Natural != sp.Natural || n.Conductivity != sp.Conductivity || n.Emissivity != sp.Emissivity {
		t.Errorf("recovery alone: %+v", n)
	}
	f.Params = append(f.Params, Param{Name: LoadFactor, Value: 0.8, StdError: 0.04})
	if n := f.Narrow(sp); math.Abs(n.CoolShare-0.1) > 1e-12 || n.Forced != 0 {
		t.Errorf("recovery and load: %+v", n)
	}
	if n := (Fit{Params: []Param{{Name: Offset, Value: 12, StdError: 2}}}).Narrow(sp); n != sp {
		t.Errorf("an offset narrowed the band: %+v", n)
	}
}

// A stated measuring-place offset carries half its size as its own
// uncertainty (OffsetShare, our assumption), one error shared by the
// readings at that place: one reading at a plug seat stated 30 K over the
// fin root fits the same recovery as the same wall read at the fin root,
// with a standard error larger by about hypot(5, 15)/5 (to 5 %: the
// response to 15 K is not quite linear); three readings at that seat do
// not average the guessed offset away (their standard error keeps the
// single reading's offset part); a measured offset (uncertainty 0) adds
// nothing.
func TestOffsetCarriesItsUncertainty(t *testing.T) {
	d := demo(t)
	var se [2]float64
	for i, off := range []float64{0, 30} {
		p := measure(t, d, 0.35, 90/3.6, 303.15, 0, off)
		p.Offset, p.OffsetSigma = off, -1
		f, err := Calibrate(d, cylinder.Settings{}, []Point{p})
		if err != nil {
			t.Fatal(err)
		}
		r, _ := f.Get(Recovery)
		if math.Abs(r-0.35) > 1e-3 {
			t.Fatalf("offset %g K: recovery %.5f", off, r)
		}
		se[i] = f.Params[0].StdError
	}
	if want := math.Hypot(5, 15) / 5; math.Abs(se[1]/se[0]-want) > 0.05*want {
		t.Errorf("standard error with a 30 K offset %.5f, without %.5f: ratio %.3f, want %.3f", se[1], se[0], se[1]/se[0], want)
	}
	// an offset measured (its uncertainty stated as 0) fits as the
	// fin-root reading does
	p := measure(t, d, 0.35, 90/3.6, 303.15, 0, 30)
	p.Offset, p.OffsetSigma = 30, 0
	f, err := Calibrate(d, cylinder.Settings{}, []Point{p})
	if err != nil {
		t.Fatal(err)
	}
	if e := f.Params[0].StdError; math.Abs(e/se[0]-1) > 0.02 {
		t.Errorf("a measured 30 K offset: standard error %.5f, the fin-root reading's %.5f", e, se[0])
	}
	part := math.Sqrt(se[1]*se[1] - se[0]*se[0]) // the guessed offset's share of one reading's error
	var three []Point
	for _, v := range []float64{70, 90, 110} {
		p := measure(t, d, 0.35, v/3.6, 303.15, 0, 30)
		p.Offset, p.OffsetSigma = 30, -1
		three = append(three, p)
	}
	f3, err := Calibrate(d, cylinder.Settings{}, three)
	if err != nil {
		t.Fatal(err)
	}
	if e := f3.Params[0].StdError; e < 0.8*part {
		t.Errorf("three readings at one guessed seat: standard error %.5f, below the offset's own part %.5f: the shared guess averaged away", e, part)
	}
}
