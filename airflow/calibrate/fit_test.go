package calibrate

import (
	"errors"
	"math"
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
