package cylinder

import (
	"errors"
	"fmt"
	"math"
	"sort"

	"finmarch/airflow/roots"
	"finmarch/fins/validity"
)

// FanPoint is one point of a fan's curve at the curve's speed and air
// density: the volume flow at the fan's inlet and the static pressure it
// raises, with its static efficiency where the maker gives one.
type FanPoint struct {
	Flow       float64 `json:"flow_m3_s"`
	Pressure   float64 `json:"pressure_Pa"`
	Efficiency float64 `json:"efficiency"` // static efficiency, 0 to 1; 0: not given
}

// Fan is a crank-driven fan in a shroud. Its curve, taken at CurveSpeed
// and CurveDensity, is interpolated monotonically (pchip) and scaled to the
// running speed and the air's density by the fan laws: at speed ratio
// r = N/N0 and density ratio d = rho/rho0, flow Q = r Q0, pressure
// p = d r^2 p0, shaft power P = d r^3 P0 (the fan laws for a given fan at
// similar operating points; e.g. ASHRAE Handbook, HVAC Systems and
// Equipment, Ch. "Fans", the fan-law equations; from memory).
type Fan struct {
	Curve        []FanPoint `json:"curve"`
	CurveSpeed   float64    `json:"curve_speed_rev_s"`
	CurveDensity float64    `json:"curve_density_kg_m3"` // 0: 1.2 kg/m3, standard air (common practice for fan ratings)
	// The fan turns at Ratio times the engine speed. The engine speed is
	// EngineSpeed when given (rev/s), else it follows the road speed in top
	// gear, RatedSpeed at TopGearSpeed (m/s), never below IdleSpeed: an
	// assumption of this tool (a lower gear turns the engine faster).
	Ratio        float64 `json:"ratio"`
	EngineSpeed  float64 `json:"engine_speed_rev_s"`
	IdleSpeed    float64 `json:"idle_speed_rev_s"`
	RatedSpeed   float64 `json:"rated_speed_rev_s"`
	TopGearSpeed float64 `json:"top_gear_speed_m_s"`
	// The shroud's own losses (entry, bends, exit), in velocity heads at
	// ShroudArea, and the share of the fan's flow that leaks past the fins.
	ShroudLoss float64 `json:"shroud_loss"`
	ShroudArea float64 `json:"shroud_area_m2"`
	Leakage    float64 `json:"leakage"`
}

func (f *Fan) validate() error {
	if len(f.Curve) < 2 {
		return errors.New("fan curve: at least two points")
	}
	for i, q := range f.Curve {
		if !(q.Flow >= 0) || !(q.Pressure >= 0) || math.IsInf(q.Flow, 0) || math.IsInf(q.Pressure, 0) || !(q.Efficiency >= 0 && q.Efficiency <= 1) {
			return fmt.Errorf("fan curve point %d: flow %g m3/s, pressure %g Pa, efficiency %g: not negative, efficiency 0 to 1", i+1, q.Flow, q.Pressure, q.Efficiency)
		}
		if i > 0 && !(q.Flow > f.Curve[i-1].Flow) {
			return fmt.Errorf("fan curve point %d: flow %g m3/s not above the point before (%g)", i+1, q.Flow, f.Curve[i-1].Flow)
		}
		if i > 0 && q.Pressure > f.Curve[i-1].Pressure {
			return fmt.Errorf("fan curve point %d: pressure %g Pa rises with flow (from %g): give the falling part of the curve, right of its peak", i+1, q.Pressure, f.Curve[i-1].Pressure)
		}
	}
	switch {
	case !(f.CurveSpeed > 0):
		return errors.New("fan: the curve's speed must be positive")
	case !(f.Ratio > 0 && f.Ratio <= 20):
		return fmt.Errorf("fan: ratio %g outside 0 to 20", f.Ratio)
	case !(f.Leakage >= 0 && f.Leakage < 0.9):
		return fmt.Errorf("fan: leakage %g outside 0 to 0.9", f.Leakage)
	case !(f.ShroudLoss >= 0 && f.ShroudLoss < 100) || (f.ShroudLoss > 0 && !(f.ShroudArea > 0)):
		return fmt.Errorf("fan: shroud loss %g velocity heads needs a positive shroud area (%g m2)", f.ShroudLoss, f.ShroudArea)
	case !(f.EngineSpeed > 0) && !(f.IdleSpeed > 0 && f.RatedSpeed > f.IdleSpeed && f.TopGearSpeed > 0):
		return errors.New("fan: give the engine speed, or the idle and rated speeds with the top-gear road speed")
	}
	return nil
}

// Running is the fan's speed at road speed v (m/s), rev/s.
func (f *Fan) Running(v float64) float64 {
	n := f.EngineSpeed
	if n <= 0 {
		n = math.Max(f.IdleSpeed, f.RatedSpeed*v/f.TopGearSpeed)
	}
	return f.Ratio * n
}

func (f *Fan) curveDensity() float64 {
	if f.CurveDensity > 0 {
		return f.CurveDensity
	}
	return 1.2
}

// Pressure is the fan's static pressure at inlet flow q (m3/s) running at
// n rev/s in air of density rho, Pa: the curve by pchip, scaled by the fan
// laws; past the curve's last point the last segment's slope carries on
// (a fan past free delivery resists the flow).
func (f *Fan) Pressure(q, n, rho float64) float64 {
	return f.pressureCurve().pressure(f, q, n, rho)
}

// pressureCurve is the interpolant of the fan's pressure against flow at
// its curve's speed, built once for the many evaluations of a solve.
func (f *Fan) pressureCurve() *monotone {
	x := make([]float64, len(f.Curve))
	y := make([]float64, len(f.Curve))
	for i, p := range f.Curve {
		x[i], y[i] = p.Flow, p.Pressure
	}
	return newMonotone(x, y)
}

// pressure is Fan.Pressure on the fan's interpolant m.
func (m *monotone) pressure(f *Fan, q, n, rho float64) float64 {
	r, d := n/f.CurveSpeed, rho/f.curveDensity()
	return d * r * r * m.at(q/r)
}

// Efficiency is the fan's static efficiency at inlet flow q running at n
// (fan laws: the same at the similar point q/r of the curve), by pchip
// through the points that give one; 0 when none does.
func (f *Fan) Efficiency(q, n float64) float64 {
	var x, y []float64
	for _, p := range f.Curve {
		if p.Efficiency > 0 {
			x, y = append(x, p.Flow), append(y, p.Efficiency)
		}
	}
	if len(x) < 2 {
		return 0
	}
	qs := q / (n / f.CurveSpeed)
	qs = math.Min(math.Max(qs, x[0]), x[len(x)-1]) // no extrapolation of an efficiency
	return newMonotone(x, y).at(qs)
}

// FanPointResult is a fan's operating point.
type FanPointResult struct {
	Speed      float64 `json:"speed_rev_s"`
	Flow       float64 `json:"flow_m3_s"`      // at the fan's inlet
	Pressure   float64 `json:"pressure_Pa"`    // the fan's static pressure
	Shroud     float64 `json:"shroud_loss_Pa"` // lost in the shroud
	Drop       float64 `json:"drop_Pa"`        // across the fins
	MassFlow   float64 `json:"mass_flow_kg_s"` // through the fins
	AirPower   float64 `json:"air_power_W"`    // Q p
	Efficiency float64 `json:"efficiency"`     // 0: not given; the shaft power is then the air power (a lower bound)
	Power      float64 `json:"shaft_power_W"`
	// Warming is the rise of the air the fan moves from the shaft power
	// it dissipates, K: all of it is taken as heat in the fins' inlet air
	Warming float64 `json:"inlet_warming_K"`
}

// fanPoint finds where the fan's curve meets the system's: the pressure
// difference across the fins dp at which the fan, delivering the fins'
// flow at dp plus its leakage, raises exactly dp plus the shroud's loss,
// by Brent's method on dp (the residual falls as dp rises).
func (p *prepared) fanPoint() (FanPointResult, error) {
	f := p.c.Supply.Fan
	rho := p.amb.Rho
	n := f.Running(p.c.Speed)
	op := FanPointResult{Speed: n}
	if !(n > 0) {
		return op, nil
	}
	curve := f.pressureCurve()
	shut := curve.pressure(f, 0, n, rho)
	var ferr error
	at := func(dp float64) (q, pf, shroud float64) {
		w, err := p.totalFlow(dp)
		if err != nil {
			ferr = err
		}
		q = w / (rho * (1 - f.Leakage))
		if f.ShroudLoss > 0 {
			v := q / f.ShroudArea
			shroud = f.ShroudLoss * 0.5 * rho * v * v
		}
		return q, curve.pressure(f, q, n, rho), shroud
	}
	g := func(dp float64) float64 {
		_, pf, shroud := at(dp)
		return pf - shroud - dp
	}
	if shut <= minDrive {
		return op, nil
	}
	dp, err := roots.Brent(g, 0, shut, 1e-10*shut, 200)
	if ferr != nil {
		return op, ferr
	}
	if err != nil {
		return op, fmt.Errorf("fan operating point: %w", err)
	}
	q, pf, shroud := at(dp)
	op.Flow, op.Pressure, op.Shroud, op.Drop = q, pf, shroud, dp
	// the curve's own range, at its speed: past the last point the last
	// segment's straight line is carried on, which the maker did not measure
	r := n / f.CurveSpeed
	p.log.Check("fan curve", "flow at the curve's speed (m3/s)", q/r, f.Curve[0].Flow, f.Curve[len(f.Curve)-1].Flow)
	op.MassFlow = rho * q * (1 - f.Leakage)
	op.AirPower = q * pf
	op.Efficiency = f.Efficiency(q, n)
	op.Power = op.AirPower
	if op.Efficiency > 0 {
		op.Power = op.AirPower / op.Efficiency
	}
	return op, nil
}

// FanOperatingPoint is the fan's operating point for the case (a fan
// supply), with the settings' passage model and losses.
func (c Case) FanOperatingPoint(s Settings) (FanPointResult, error) {
	if c.Supply.Kind != SupplyFan {
		return FanPointResult{}, errors.New("the case has no fan")
	}
	var log validity.Log
	p, err := c.prepare(s, &log)
	if err != nil {
		return FanPointResult{}, err
	}
	return p.fan, nil
}

// SystemPressure is the pressure the fan must raise to deliver inlet flow
// q (m3/s) through the shroud and the fins of the case, Pa: the system
// curve, for plotting against the fan's.
func (c Case) SystemPressure(s Settings, q float64) (float64, error) {
	if c.Supply.Kind != SupplyFan {
		return 0, errors.New("the case has no fan")
	}
	var log validity.Log
	p, err := c.prepare(s, &log)
	if err != nil {
		return 0, err
	}
	f := c.Supply.Fan
	rho := p.amb.Rho
	dp, err := p.dropFor(rho * q * (1 - f.Leakage))
	if err != nil {
		return 0, err
	}
	v := q / math.Max(f.ShroudArea, 1e-300)
	return dp + f.ShroudLoss*0.5*rho*v*v, nil
}

// monotone is the monotone piecewise cubic Hermite interpolant (pchip) of
// (x, y), x increasing (F. N. Fritsch and R. E. Carlson, "Monotone
// piecewise cubic interpolation", SIAM J. Numer. Anal. 17 (1980) 238-246),
// with the interior slopes of Fritsch and Butland's weighted harmonic mean
// and the one-sided three-point end slopes, as scipy's PchipInterpolator
// computes them; it preserves the data's monotonicity. Outside [x0, xn] it
// carries on along the end segment's straight line.
type monotone struct{ x, y, h, d []float64 }

func newMonotone(x, y []float64) *monotone {
	n := len(x)
	m := &monotone{x: x, y: y, h: make([]float64, n-1), d: make([]float64, n)}
	if n == 2 {
		return m // a straight line
	}
	del := make([]float64, n-1)
	for i := 0; i < n-1; i++ {
		m.h[i] = x[i+1] - x[i]
		del[i] = (y[i+1] - y[i]) / m.h[i]
	}
	h := m.h
	for k := 1; k < n-1; k++ {
		if del[k-1]*del[k] <= 0 {
			continue
		}
		w1, w2 := 2*h[k]+h[k-1], h[k]+2*h[k-1]
		m.d[k] = (w1 + w2) / (w1/del[k-1] + w2/del[k])
	}
	m.d[0] = pchipEnd(h[0], h[1], del[0], del[1])
	m.d[n-1] = pchipEnd(h[n-2], h[n-3], del[n-2], del[n-3])
	return m
}

// at evaluates the interpolant at t.
func (m *monotone) at(t float64) float64 {
	x, y, n := m.x, m.y, len(m.x)
	if n == 2 || t <= x[0] || t >= x[n-1] {
		// linear through the end segment (or the only one)
		i := 0
		if t >= x[n-1] {
			i = n - 2
		}
		return y[i] + (y[i+1]-y[i])*(t-x[i])/(x[i+1]-x[i])
	}
	i := max(sort.SearchFloat64s(x, t)-1, 0)
	h := m.h[i]
	s := (t - x[i]) / h
	h00 := (1 + 2*s) * (1 - s) * (1 - s)
	h10 := s * (1 - s) * (1 - s)
	h01 := s * s * (3 - 2*s)
	h11 := s * s * (s - 1)
	return h00*y[i] + h*h10*m.d[i] + h01*y[i+1] + h*h11*m.d[i+1]
}

// pchipEnd is the end slope: the three-point formula, set to zero where it
// has the wrong sign and capped at three times the end secant where the
// secants change sign (scipy's _edge_case).
func pchipEnd(h0, h1, m0, m1 float64) float64 {
	d := ((2*h0+h1)*m0 - h0*m1) / (h0 + h1)
	if m0 == 0 || d == 0 || math.Signbit(d) != math.Signbit(m0) {
		return 0
	}
	if math.Signbit(m0) != math.Signbit(m1) && math.Abs(d) > 3*math.Abs(m0) {
		return 3 * m0
	}
	return d
}
