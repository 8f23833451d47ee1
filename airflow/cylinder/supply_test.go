package cylinder

import (
	"encoding/csv"
	"math"
	"os"
	"strconv"
	"strings"
	"testing"
)

// pchip against scipy.interpolate.PchipInterpolator on three fan-shaped
// data sets (testdata/reference/gen_pchip.py), to 1e-12 relative: both
// evaluate the same cubic Hermite polynomials.
func TestPchipAgainstScipy(t *testing.T) {
	sets := map[string][2][]float64{
		"fan":    {{0, 0.02, 0.04, 0.06, 0.08, 0.10}, {620, 600, 540, 430, 260, 0}},
		"flat":   {{0, 0.01, 0.03, 0.05, 0.06}, {300, 300, 280, 150, 0}},
		"uneven": {{0, 0.005, 0.02, 0.021, 0.05, 0.09}, {900, 880, 800, 790, 500, 40}},
	}
	f, err := os.Open("../../testdata/reference/pchip.csv")
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	rows, err := csv.NewReader(f).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	n := 0
	for _, r := range rows[1:] {
		s := sets[r[0]]
		x, _ := strconv.ParseFloat(r[1], 64)
		want, _ := strconv.ParseFloat(r[2], 64)
		got := newMonotone(s[0], s[1]).at(x)
		if math.Abs(got-want) > 1e-12*math.Max(1, math.Abs(want)) {
			t.Errorf("%s at %g: %.15g, scipy %.15g", r[0], x, got, want)
		}
		n++
	}
	if n != 111 {
		t.Errorf("%d reference rows", n)
	}
}

// demoFan is an invented small axial fan: 600 Pa shut-off and 0.1 m3/s free
// delivery at 100 rev/s in standard air, with efficiencies, on the crank
// (ratio 1), idling at 25 rev/s and at 125 rev/s at 120 km/h in top gear.
func demoFan() *Fan {
	return &Fan{Curve: []FanPoint{{0, 620, 0.1}, {0.02, 600, 0.3}, {0.04, 540, 0.45}, {0.06, 430, 0.5}, {0.08, 260, 0.42}, {0.10, 0, 0.1}},
		CurveSpeed: 100, Ratio: 1, IdleSpeed: 25, RatedSpeed: 125, TopGearSpeed: 120 / 3.6, ShroudLoss: 2, ShroudArea: 0.006, Leakage: 0.1}
}

// The fan laws, exact: at speed ratio r and density ratio d the curve's
// point (q, p) moves to (r q, d r^2 p), its efficiency stays, and the
// shaft power at the similar point is d r^3 times; the fan turns with the
// engine, idle speed at a standstill.
func TestFanLaws(t *testing.T) {
	f := demoFan()
	for _, r := range []float64{0.3, 1, 1.7} {
		for _, d := range []float64{0.9, 1} {
			for _, q := range []float64{0, 0.013, 0.05, 0.085} {
				p0 := f.Pressure(q, f.CurveSpeed, 1.2)
				p := f.Pressure(r*q, r*f.CurveSpeed, d*1.2)
				if math.Abs(p-d*r*r*p0) > 1e-9*p0 {
					t.Errorf("r %g d %g q %g: %.9g Pa, want %.9g", r, d, q, p, d*r*r*p0)
				}
				e0, e := f.Efficiency(q, f.CurveSpeed), f.Efficiency(r*q, r*f.CurveSpeed)
				if math.Abs(e-e0) > 1e-12 {
					t.Errorf("efficiency %g against %g at the similar point", e, e0)
				}
				if e0 > 0 {
					if pw, pw0 := r*q*p/e, q*p0/e0; math.Abs(pw-d*r*r*r*pw0) > 1e-9*math.Max(pw0, 1e-9) {
						t.Errorf("shaft power %.6g W, want %.6g", pw, d*r*r*r*pw0)
					}
				}
			}
		}
	}
	if f.Running(0) != 25 || math.Abs(f.Running(120/3.6)-125) > 1e-12 || math.Abs(f.Running(60/3.6)-62.5) > 1e-12 {
		t.Errorf("fan speed %g, %g, %g rev/s", f.Running(0), f.Running(120/3.6), f.Running(60/3.6))
	}
}

// fanCase is the upright demo cylinder in a fan shroud.
func fanCase(t testing.TB, v float64) Case {
	c := demoCase(t, false)
	c.Speed = v
	c.Supply = Supply{Kind: SupplyFan, Fan: demoFan()}
	return c
}

// The operating point against a hand calculation: the system curve built
// point by point from ducted cases of given pressure drop (the passages'
// own hydraulics, apart from the fan code) plus the shroud's loss, met with
// the fan's curve by bisection in the test; the fan's point agrees to 1e-6
// in flow, and a duct of the fan's pressure drop passes the fan's mass flow.
func TestFanOperatingPoint(t *testing.T) {
	c := fanCase(t, 60/3.6)
	op, err := c.FanOperatingPoint(Settings{})
	if err != nil {
		t.Fatal(err)
	}
	f := c.Supply.Fan
	n := f.Running(c.Speed)
	rho := c.Pressure / (287.05 * c.Ambient)
	flowAt := func(dp float64) float64 { // fan inlet flow through the fins at dp
		d := c
		d.Supply = Supply{Kind: SupplyDuct, Drop: dp}
		r, err := d.AtWall(450, 400, Settings{})
		if err != nil {
			t.Fatal(err)
		}
		return r.Supply.MassFlow / (rho * (1 - f.Leakage))
	}
	lo, hi := 1.0, f.Pressure(0, n, rho)
	for i := 0; i < 60; i++ {
		mid := 0.5 * (lo + hi)
		q := flowAt(mid)
		v := q / f.ShroudArea
		if f.Pressure(q, n, rho)-f.ShroudLoss*0.5*rho*v*v-mid > 0 {
			lo = mid
		} else {
			hi = mid
		}
	}
	want := flowAt(0.5 * (lo + hi))
	if math.Abs(op.Flow-want) > 1e-6*want || math.Abs(op.Drop-0.5*(lo+hi)) > 1e-3 {
		t.Errorf("fan %.6g m3/s at %.3f Pa across the fins; by hand %.6g m3/s at %.3f Pa", op.Flow, op.Drop, want, 0.5*(lo+hi))
	}
	if sys, err := c.SystemPressure(Settings{}, op.Flow); err != nil || math.Abs(sys-op.Pressure) > 1e-6*op.Pressure {
		t.Errorf("system curve %.4f Pa at the point, fan %.4f Pa (%v)", sys, op.Pressure, err)
	}
	if math.Abs(op.Power-op.Flow*op.Pressure/op.Efficiency) > 1e-9*op.Power || !(op.Efficiency > 0.3 && op.Efficiency < 0.55) {
		t.Errorf("shaft power %.3f W at efficiency %.3f", op.Power, op.Efficiency)
	}
	t.Logf("60 km/h: fan %.1f rev/s, %.4f m3/s at %.0f Pa (%.0f Pa across the fins), %.1f W shaft", n, op.Flow, op.Pressure, op.Drop, op.Power)
}

// A duct: a given mass flow and the pressure drop it needs are the same
// operating point both ways; inside the duct neither road speed nor tilt
// reaches the fins (no envelope credit, the same passage flow).
func TestDuctSupply(t *testing.T) {
	c := demoCase(t, false)
	c.Supply = Supply{Kind: SupplyDuct, MassFlow: 0.08}
	a, err := c.AtWall(450, 400, Settings{})
	if err != nil {
		t.Fatal(err)
	}
	c.Supply = Supply{Kind: SupplyDuct, Drop: a.Supply.Drop}
	b, err := c.AtWall(450, 400, Settings{})
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(b.Supply.MassFlow-0.08) > 1e-8 || math.Abs(a.Head.ForcedHeat-b.Head.ForcedHeat) > 1e-6*a.Head.ForcedHeat {
		t.Errorf("0.08 kg/s needs %.3f Pa; %.3f Pa passes %.8f kg/s", a.Supply.Drop, a.Supply.Drop, b.Supply.MassFlow)
	}
	c2 := c
	c2.Speed, c2.Tilt = 0, 0.7
	d, err := c2.AtWall(450, 400, Settings{})
	if err != nil {
		t.Fatal(err)
	}
	if b.Head.EnvelopeHeat != 0 || math.Abs(d.Head.ForcedHeat-b.Head.ForcedHeat) > 1e-9*b.Head.ForcedHeat {
		t.Errorf("envelope %g W; forced heat %g W at 0 km/h tilted, %g W at 90 km/h", b.Head.EnvelopeHeat, d.Head.ForcedHeat, b.Head.ForcedHeat)
	}
}

// A fan-cooled engine keeps its forced flow at a standstill: at idle the
// fan, at idle speed, cools the head far below the ram-cooled idle; and the
// fan is not free: its shaft power is crank power, so the load's brake
// power is the road's plus the fan's.
func TestFanCooledIdle(t *testing.T) {
	road := Load{Road: RoadLoad{Mass: 230, CdA: 0.45, CoolShare: 0.18, HeadShare: 0.65, Cylinders: 1, IdleHeat: 500}}
	ram := Design{Case: demoCase(t, false), Load: road, Limits: Limits{Head: 493.15, Barrel: 523.15}}
	ram.Case.Speed = 0
	fan := ram
	fan.Case.Supply = Supply{Kind: SupplyFan, Fan: demoFan()}
	or, err := ram.Evaluate(Settings{})
	if err != nil {
		t.Fatal(err)
	}
	of, err := fan.Evaluate(Settings{})
	if err != nil {
		t.Fatal(err)
	}
	if of.Result.Supply == nil || !(of.Result.Supply.MassFlow > 0) || !(of.Result.Head.WallTemp < or.Result.Head.WallTemp-30) {
		t.Errorf("idle: fan %.1f K (%+v), ram %.1f K", of.Result.Head.WallTemp, of.Result.Supply, or.Result.Head.WallTemp)
	}
	t.Logf("idle: fan-cooled head %.1f C, ram-cooled %.1f C", of.Result.Head.WallTemp-273.15, or.Result.Head.WallTemp-273.15)
	ram.Case.Speed, fan.Case.Speed = 25, 25
	or, _ = ram.Evaluate(Settings{})
	of, err = fan.Evaluate(Settings{})
	if err != nil {
		t.Fatal(err)
	}
	fp := of.Result.Supply.Fan.Power
	if math.Abs(of.Load.BrakePower-(or.Load.BrakePower+fp)) > 1e-9*of.Load.BrakePower || !(fp > 1) {
		t.Errorf("brake power %.2f W with the fan, %.2f W without, fan %.2f W", of.Load.BrakePower, or.Load.BrakePower, fp)
	}
	t.Logf("90 km/h: fan-cooled head %.1f C, ram-cooled %.1f C, fan shaft power %.0f W", of.Result.Head.WallTemp-273.15, or.Result.Head.WallTemp-273.15, fp)
}

// Bad fans and ducts are refused, each saying what is wrong.
func TestSupplyRefused(t *testing.T) {
	bad := func(mod func(*Fan)) *Fan { f := demoFan(); mod(f); return f }
	for _, c := range []struct {
		s    Supply
		want string
	}{
		{Supply{Kind: SupplyFan, Fan: bad(func(f *Fan) { f.Curve = f.Curve[:1] })}, "at least two points"},
		{Supply{Kind: SupplyFan, Fan: bad(func(f *Fan) { f.Curve[2].Flow = 0.01 })}, "not above the point before"},
		{Supply{Kind: SupplyFan, Fan: bad(func(f *Fan) { f.Curve[3].Pressure = 700 })}, "rises with flow"},
		{Supply{Kind: SupplyFan, Fan: bad(func(f *Fan) { f.Curve[0].Flow = -0.01 })}, "not negative"},
		{Supply{Kind: SupplyFan, Fan: bad(func(f *Fan) { f.IdleSpeed = 0 })}, "engine speed"},
		{Supply{Kind: SupplyFan, Fan: bad(func(f *Fan) { f.ShroudArea = 0 })}, "shroud area"},
		{Supply{Kind: SupplyDuct, Drop: 100, MassFlow: 0.1}, "one of them"},
		{Supply{Kind: SupplyDuct, Drop: 100, Series: true}, "longitudinal"},
		{Supply{Kind: "blower"}, "use ram, duct or fan"},
	} {
		cs := demoCase(t, false)
		cs.Supply = c.s
		if _, err := cs.AtWall(450, 400, Settings{}); err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%+v: %v", c.s, err)
		}
	}
}

// A fan driven past the last point of its curve is still answered (the
// last segment carried on) with a range warning naming the curve.
func TestFanPastItsCurve(t *testing.T) {
	c := fanCase(t, 60/3.6)
	c.Supply.Fan.Curve = []FanPoint{{0, 620, 0}, {0.01, 600, 0}, {0.02, 550, 0}} // the curve stops short of free delivery
	r, err := c.AtWall(450, 400, Settings{})
	if err != nil {
		t.Fatal(err)
	}
	found := false
	for _, w := range r.Warnings {
		found = found || w.Correlation == "fan curve"
	}
	if !found || r.Supply == nil || !(r.Supply.Fan.Flow > 0.02*r.Supply.Fan.Speed/c.Supply.Fan.CurveSpeed) {
		t.Errorf("warnings %v, fan %+v", r.Warnings, r.Supply.Fan)
	}
}

// A fan too small for its load: the estimate says there is no equilibrium
// (an outcome, not an error), as a ram-cooled one would.
func TestFanNoEquilibrium(t *testing.T) {
	road := Load{Road: RoadLoad{Mass: 230, CdA: 0.45, CoolShare: 0.18, HeadShare: 0.65, Cylinders: 1, IdleHeat: 500}}
	d := Design{Case: demoCase(t, false), Load: road, Limits: Limits{Head: 493.15, Barrel: 523.15}}
	d.Case.Speed = 40
	d.Case.Supply = Supply{Kind: SupplyFan, Fan: demoFan()}
	d.Case.Supply.Fan.Ratio = 0.2
	o, err := d.Evaluate(Settings{})
	if err != nil || o.NoEquilibrium == nil || o.Status() != StatusNoEquilibrium {
		t.Errorf("err %v, no equilibrium %v, status %s, head %.1f K", err, o.NoEquilibrium, o.Status(), o.Result.Head.WallTemp)
	}
}

// The fan's shaft power warms the air it moves: the fins' inlet air is
// ambient plus P / (rho Q cp), with cp of air near 300 K (1007 J/kg K,
// Cengel's Table A-15, to 0.5 %), and the head's passage heat is taken from
// that inlet (the air's enthalpy balance still holds).
func TestFanWarmsItsAir(t *testing.T) {
	c := fanCase(t, 60/3.6)
	r, err := c.AtWall(450, 400, Settings{})
	if err != nil {
		t.Fatal(err)
	}
	f := r.Supply.Fan
	rho := c.Pressure / (287.05 * c.Ambient)
	want := f.Power / (rho * f.Flow * 1007)
	if !(want > 0.05) || math.Abs(f.Warming-want) > 0.005*want {
		t.Errorf("warming %.4f K, P/(rho Q cp) = %.4f K (%.1f W, %.4f m3/s)", f.Warming, want, f.Power, f.Flow)
	}
	if math.Abs(r.Head.AirIn-(c.Ambient+f.Warming)) > 1e-9 || math.Abs(r.Barrel.AirIn-(c.Ambient+f.Warming)) > 1e-9 {
		t.Errorf("inlet air %.4f / %.4f K, ambient %.2f K + %.4f K", r.Head.AirIn, r.Barrel.AirIn, c.Ambient, f.Warming)
	}
	if r.Head.AirImbalance > 1e-3 {
		t.Errorf("air imbalance %g", r.Head.AirImbalance)
	}
	t.Logf("fan %.1f W shaft into %.4f m3/s: inlet +%.3f K", f.Power, f.Flow, f.Warming)
}
