package calibrate

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"

	"gonum.org/v1/gonum/mat"

	"finmarch/airflow/cylinder"
	"finmarch/airflow/uncertainty"
)

// Point is one measurement: the operating point and the temperature.
type Point struct {
	Speed    float64 // m/s
	Ambient  float64 // K
	Pressure float64 // Pa
	Temp     float64 // K, measured
	Sigma    float64 // K, the measurement's standard uncertainty (0: 5 K)
	Barrel   bool    // measured on the barrel (false: the head)
	Offset   float64 // K, how much hotter the measuring place runs than the mean fin-root wall (a plug seat: stated by the user; 0 at a fin root)
	// OffsetSigma is the offset's own standard uncertainty, K; below 0 (or
	// unset by a caller that gives -1) it is OffsetShare times the offset
	// (a guess); 0 when the offset was measured exactly.
	OffsetSigma float64
}

// Check lists what is wrong with a measured point (nothing when it is
// usable): speed 0 to 400 km/h (111.1 m/s), ambient -50 to 60 C (223.15 to
// 333.15 K), the reading between the ambient and 500 C (773.15 K), an
// uncertainty 0 to 100 K and an offset -100 to 200 K (our plausibility
// bounds; the estimator's own ranges are wider).
func (p Point) Check() []string {
	switch {
	case !(p.Speed >= 0 && p.Speed <= 400/3.6):
		return []string{"speed missing or outside 0 to 400 km/h"}
	case !(p.Ambient >= 223.15 && p.Ambient <= 333.15):
		return []string{"ambient missing or outside -50 to 60 C"}
	case !(p.Temp > p.Ambient && p.Temp < 773.15):
		return []string{"the measured temperature must lie between the ambient and 500 C"}
	case !(p.Sigma >= 0 && p.Sigma < 100) || !(p.Offset > -100 && p.Offset < 200):
		return []string{"uncertainty 0 to 100 K, offset -100 to 200 K"}
	}
	return nil
}

// DefaultSigma is a point's uncertainty when none is given: a thermocouple
// under a plug or on a fin root reads to a few kelvin, and the engine's
// own scatter between runs adds as much (common practice).
const DefaultSigma = 5.0

// Param is one fitted parameter.
type Param struct {
	Name     string  `json:"name"`
	Value    float64 `json:"value"`
	StdError float64 `json:"standard_error"`
	Lo       float64 `json:"plausible_low"`
	Hi       float64 `json:"plausible_high"`
}

// Fit is the result.
type Fit struct {
	Params     []Param
	Residuals  []float64 // K, model plus the measuring place's offset less the measurement, per point
	Chi2       float64   // sum of squared residuals over sigma^2
	Iterations int
	Warnings   []string // points the fit misses by more than three of their uncertainties
}

// Get returns the fitted value of the named parameter and whether it was
// fitted.
func (f Fit) Get(name string) (float64, bool) {
	for _, p := range f.Params {
		if p.Name == name {
			return p.Value, true
		}
	}
	return 0, false
}

// The parameters a fit may take.
const (
	Recovery     = "pressure recovery"
	ForcedFactor = "forced convection factor"
	LoadFactor   = "heat load factor"
	Offset       = "measuring-place offset" // K, added to every point's stated offset
)

// ErrNotIdentifiable is wrapped when the points cannot separate the
// parameters.
var ErrNotIdentifiable = errors.New("the points cannot identify the parameters")

// ErrAtBound is wrapped when the best fit needs a parameter at the end of
// its plausible range: the model cannot meet the points with plausible
// values, and the fitted numbers would mislead.
var ErrAtBound = errors.New("the fit rests on the end of a plausible range")

// Calibrate fits the named parameters (Recovery, ForcedFactor, LoadFactor,
// Offset; the recovery alone when none is named) of the design to the
// points. s are the estimator's settings (its factors are the starting
// point). It needs at least as many points as parameters, and points that
// move the parameters apart (ErrNotIdentifiable otherwise: the recovery and
// the forced factor both scale the forced coefficient, so only points at
// road speeds far apart, where the passage flow changes regime, can part
// them).
func Calibrate(d cylinder.Design, s cylinder.Settings, pts []Point, names ...string) (Fit, error) {
	if len(pts) == 0 {
		return Fit{}, errors.New("calibrate: no measured point")
	}
	if d.Walls != nil {
		return Fit{}, errors.New("calibrate: the design fixes its walls")
	}
	if len(names) == 0 {
		names = []string{Recovery}
	}
	for i, p := range pts {
		if bad := p.Check(); len(bad) > 0 {
			return Fit{}, fmt.Errorf("calibrate: point %d: %s", i+1, strings.Join(bad, "; "))
		}
	}
	if len(names) > len(pts) {
		return Fit{}, fmt.Errorf("%w: %d parameters from %d points; give at least one point a parameter", ErrNotIdentifiable, len(names), len(pts))
	}
	rec := d.Case.Recovery
	if rec == 0 {
		rec = cylinder.DefaultRecovery
	}
	one := func(v float64) float64 {
		if v == 0 {
			return 1
		}
		return v
	}
	known := map[string]Param{
		Recovery:     {Name: Recovery, Value: rec, Lo: 0.05, Hi: 1}, // the design file's own range of air.pressure_recovery, so that a calibrated design parses,
		ForcedFactor: {Name: ForcedFactor, Value: one(s.ForcedFactor), Lo: 0.3, Hi: 3},
		LoadFactor:   {Name: LoadFactor, Value: 1, Lo: 0.3, Hi: 3},
		Offset:       {Name: Offset, Value: 0, Lo: -50, Hi: 100},
	}
	var ps []Param
	seen := map[string]bool{}
	for _, n := range names {
		p, ok := known[n]
		if !ok || seen[n] {
			return Fit{}, fmt.Errorf("calibrate: parameter %q unknown or named twice", n)
		}
		seen[n] = true
		ps = append(ps, p)
	}
	x := make([]float64, len(ps))
	for i, p := range ps {
		x[i] = p.Value
	}
	model := func(x []float64) ([]float64, []bool, error) { return residuals(d, s, pts, ps, x) }
	f, edged, err := levenbergMarquardt(model, x, ps)
	for i := range f.Residuals {
		sig := sigma(pts[i])
		f.Residuals[i] *= sig
		if len(pts) > len(ps) && math.Abs(f.Residuals[i]) > 3*sig {
			f.Warnings = append(f.Warnings, fmt.Sprintf("calibrate: point %d misses by %.1f K, more than three times its uncertainty (%.0f K): check its speed, ambient, place and offset", i+1, f.Residuals[i], sig))
		}
	}
	if err != nil {
		return f, err
	}
	// a parameter the fit leaves at the end of its plausible range, with
	// the points asking for a value past it, means the points ask for more
	// than the model can give with plausible values
	xf := make([]float64, len(f.Params))
	for i, p := range f.Params {
		xf[i] = p.Value
	}
	for k := range f.Params {
		if err := atBound(model, xf, f.Params, k, pts, own(d, f.Params[k]), edged); err != nil {
			return f, err
		}
	}
	offsetErrors(&f, xf, d, s, pts, seen[Offset])
	return f, nil
}

// offsetErrors adds the measuring places' offsets' own uncertainty to the
// standard errors. A guessed offset is one error shared by every reading
// at that place, so it does not average away over points as their scatter
// does: the fit is repeated with every point's offset moved by its own
// uncertainty (offsetSigma) up and down, started from the fit, and half
// each parameter's move between the two is added in quadrature to its
// standard error (to first order the parameters' response to that shared
// error). Nothing is added when the
// offset is itself fitted, or no point has an offset uncertainty.
func offsetErrors(f *Fit, xf []float64, d cylinder.Design, s cylinder.Settings, pts []Point, fitted bool) {
	if fitted {
		return
	}
	refit := func(sign float64) ([]Param, bool) {
		shifted := make([]Point, len(pts))
		moved := false
		for i, p := range pts {
			o := offsetSigma(p)
			moved = moved || o > 0
			p.Offset += sign * o
			shifted[i] = p
		}
		if !moved {
			return nil, false
		}
		g, _, err := levenbergMarquardt(func(x []float64) ([]float64, []bool, error) { return residuals(d, s, shifted, f.Params, x) }, xf, f.Params)
		return g.Params, err == nil && len(g.Params) == len(f.Params)
	}
	up, ok1 := refit(1)
	down, ok2 := refit(-1)
	if !ok1 || !ok2 {
		return
	}
	for k := range f.Params {
		// half the move between the offsets one uncertainty either side:
		// the response's slope, not its curvature
		f.Params[k].StdError = math.Hypot(f.Params[k].StdError, (up[k].Value-down[k].Value)/2)
	}
}

// offsetSigma is a point's offset uncertainty, K: as stated, else
// OffsetShare of the offset.
func offsetSigma(p Point) float64 {
	if p.OffsetSigma >= 0 {
		return p.OffsetSigma
	}
	return OffsetShare * math.Abs(p.Offset)
}

// own is the estimator's own range of a parameter, wider than the
// plausible one: the pressure recovery above 0 (0 stands for the default;
// 1e-3 here) to 1, the forced factor above 0 to 10 (Settings), the load
// factor such that the cooling share stays within 0.01 to 0.9 (a given heat
// load: 1e-3 to 10), the offset -500 to 500 K (no bound of the estimator's;
// past these no measuring place is credible).
func own(d cylinder.Design, p Param) [2]float64 {
	switch p.Name {
	case Recovery:
		return [2]float64{1e-3, 1}
	case ForcedFactor:
		return [2]float64{1e-3, 10}
	case LoadFactor:
		if d.Load.Direct {
			return [2]float64{1e-3, 10}
		}
		cs := d.Load.Road.CoolShare
		if cs == 0 {
			cs = cylinder.DefaultCoolShare
		}
		return [2]float64{0.01 / cs, 0.9 / cs}
	}
	return [2]float64{-500, 500}
}

// atBound returns nil unless the fit leaves parameter k pressing on the
// end of what it may take: an end of its plausible range (the fit within
// 1e-3 of its range of it), or (when the fit refused a step for a point
// that lost its equilibrium: edged) the value past which a point loses its
// equilibrium, with the points asking for a value past it (the sum of
// squares, the other parameters held at their fit, still falls there).
// Otherwise it wraps ErrAtBound, saying the value the points need for that
// parameter alone (the minimum of the sum of squares over the estimator's
// own range, or "beyond" the end of that range, or of the values with an
// equilibrium, when the sum still falls there), and how far, in kelvin,
// the model misses the worst point at the end the fit reached.
func atBound(model modelFunc, x []float64, ps []Param, k int, pts []Point, ownR [2]float64, edged bool) error {
	p := ps[k]
	w, tol := 1e-3*(p.Hi-p.Lo), 1e-6*(p.Hi-p.Lo)
	if !edged && p.Value <= p.Hi-w && p.Value >= p.Lo+w {
		return nil
	}
	_, capFit, err := model(x)
	if err != nil {
		return err
	}
	// the sum of squares with the parameter alone at v; +Inf where the
	// model fails or loses the equilibrium of a point that had one at the
	// fit (past that, the estimator cannot reach)
	sumsq := func(v float64) float64 {
		y := append([]float64(nil), x...)
		y[k] = v
		r, c, err := model(y)
		if err != nil || newlyCapped(capFit, c) {
			return math.Inf(1)
		}
		return dot(r, r)
	}
	var end, far, dir float64
	edge := false // end is where a point loses its equilibrium
	switch {
	case p.Value > p.Hi-w:
		end, far, dir = p.Hi, math.Max(ownR[1], p.Hi), 1
	case p.Value < p.Lo+w:
		end, far, dir = p.Lo, math.Min(ownR[0], p.Lo), -1
	default:
		// within the range: does a point lose its equilibrium just past
		// the fit (probed at 1e-4, 1e-3 and 1e-2 of the range on either
		// side)? Then find where, by bisection
		for _, d := range []float64{1, -1} {
			t := p.Value
			for _, h := range []float64{1e-4, 1e-3, 1e-2} {
				if t = math.Min(p.Hi, math.Max(p.Lo, p.Value+d*h*(p.Hi-p.Lo))); math.IsInf(sumsq(t), 1) {
					break
				}
			}
			if !math.IsInf(sumsq(t), 1) {
				continue
			}
			a, b := p.Value, t
			for math.Abs(b-a) > 1e-3*tol {
				if m := (a + b) / 2; math.IsInf(sumsq(m), 1) {
					b = m
				} else {
					a = m
				}
			}
			end, far, dir, edge = a, a, d, true
			break
		}
		if !edge {
			return nil
		}
	}
	// the points' best value within w inside the end: not at the end, and
	// they ask for nothing past it
	if in := golden(sumsq, math.Min(end, end-dir*w), math.Max(end, end-dir*w), tol); dir*(end-in) > 2*tol {
		return nil
	}
	// the value the points need: step outward from the end, doubling the
	// step, until the sum of squares rises or the estimator's own range
	// ends; then a golden-section search within the bracket
	need, beyond, lost := end, far == end, edge
	if !beyond {
		a, b, sb := end-dir*w, end, sumsq(end)
		for step := w; ; step *= 2 {
			t := b + dir*step
			if dir*(t-far) >= 0 {
				t = far
			}
			st := sumsq(t)
			if st < sb && t == far {
				need, beyond = far, true
				break
			}
			if st >= sb {
				need = golden(sumsq, math.Min(a, t), math.Max(a, t), tol)
				// still falling where the model fails or loses an
				// equilibrium: out of reach
				if math.IsInf(sumsq(need+dir*4*tol), 1) {
					beyond, lost = true, true
				}
				break
			}
			a, b, sb = b, t, st
		}
		if !beyond && dir*(need-end) <= 0 {
			return nil // the points ask for no more than the end
		}
	}
	// the miss at the end, in kelvin, and whether going past the end
	// cools (the model's temperature falls) or heats
	y := append([]float64(nil), x...)
	y[k] = end
	r, _, err := model(y)
	if err != nil {
		return err
	}
	y[k] = end - dir*w
	rIn, _, err := model(y)
	if err != nil {
		return err
	}
	worst, rise := 0, 0.0
	for i := range r {
		if math.Abs(r[i]*sigma(pts[i])) > math.Abs(r[worst]*sigma(pts[worst])) {
			worst = i
		}
		rise += (r[i] - rIn[i]) * sigma(pts[i])
	}
	miss := r[worst] * sigma(pts[worst])
	sense := "hotter"
	if miss < 0 {
		sense = "cooler"
	}
	ask := "more cooling than the model can give"
	if rise > 0 {
		ask = "less cooling than the model gives"
	}
	than := "the reading"
	if len(pts) > 1 {
		than = fmt.Sprintf("point %d, the worst of %d", worst+1, len(pts))
	}
	held := ""
	if len(ps) > 1 {
		held = " (the other parameters held at their fit)"
	}
	u := unit(p.Name)
	est := "the estimate"
	if beyond {
		est = "the closest estimate"
	}
	reach := "the model cannot reach the readings with plausible values"
	if lost {
		reach = "the model cannot reach the readings"
	}
	tail := fmt.Sprintf("%s still runs %s K %s than %s, so %s: check each reading's speed, ambient, place and offset, and the design's load", est, kelvin(miss), sense, than, reach)
	plausible := fmt.Sprintf("its plausible range %s to %s%s", num(p.Lo), num(p.Hi), u)
	switch {
	case !beyond:
		return fmt.Errorf("%w: the readings need a %s of %s%s%s, outside %s; at %s%s, the end of that range, %s",
			ErrAtBound, p.Name, num(need), u, held, plausible, num(end), u, tail)
	case lost:
		return fmt.Errorf("%w: the readings need a %s beyond %s%s%s, past which the model finds no equilibrium below %.0f C (the fins cannot reject the load; %s): they ask for %s with an equilibrium; at %s%s %s",
			ErrAtBound, p.Name, num(need), u, held, cylinder.SaneWallLimit-273.15, plausible, ask, num(need), u, tail)
	}
	if p.Name == Recovery && need == 1 {
		ask += " at full recovery"
	} else {
		ask += fmt.Sprintf(" at a %s of %s%s", p.Name, num(need), u)
	}
	return fmt.Errorf("%w: the readings need a %s beyond %s%s, the end of the estimator's own range%s: they ask for %s; at %s%s, the end of %s, %s",
		ErrAtBound, p.Name, num(need), u, held, ask, num(end), u, plausible, tail)
}

// golden returns the minimum of f within [a, b] to within tol (golden-
// section search; f is unimodal there: it falls from a and rises to b).
func golden(f func(float64) float64, a, b, tol float64) float64 {
	g := (math.Sqrt(5) - 1) / 2
	c, d := b-g*(b-a), a+g*(b-a)
	fc, fd := f(c), f(d)
	for i := 0; i < 200 && b-a > tol; i++ {
		if fc <= fd {
			b, d, fd = d, c, fc
			c = b - g*(b-a)
			fc = f(c)
		} else {
			a, c, fc = c, d, fd
			d = a + g*(b-a)
			fd = f(d)
		}
	}
	if fc <= fd {
		return c
	}
	return d
}

// num prints a parameter's value to four significant figures.
func num(v float64) string { return strconv.FormatFloat(v, 'g', 4, 64) }

// kelvin prints a miss to 0.1 K, a smaller one to two significant
// figures (never "0" for a miss there is).
func kelvin(v float64) string {
	v = math.Abs(v)
	if v < 0.05 {
		return strconv.FormatFloat(v, 'g', 2, 64)
	}
	return strconv.FormatFloat(v, 'f', 1, 64)
}

// unit is the unit a parameter's value is printed with.
func unit(name string) string {
	if name == Offset {
		return " K"
	}
	return ""
}

// sigma is a point's uncertainty, DefaultSigma when none is given.
func sigma(p Point) float64 {
	if p.Sigma > 0 {
		return p.Sigma
	}
	return DefaultSigma
}

// OffsetShare is the share of a point's stated measuring-place offset
// taken as the offset's own standard uncertainty, 0.5 (our assumption: a
// plug seat's excess over the mean fin root, stated without measuring
// both, is known to about half its size), unless the point states it
// (OffsetSigma at or above 0: an offset measured once, plug seat and fin
// root together). It is one error shared by the readings at that place
// (offsetErrors), so a fit through a guessed offset, and the band of the
// calibrated design, are no narrower than the guess allows however many
// readings there are; a reading at a fin root (offset 0) adds nothing.
const OffsetShare = 0.5

// Apply returns the design and settings with the fit's parameters: what a
// calibrated design estimates with (the offset belongs to the measuring
// place, not to the design, and is left out).
func (f Fit) Apply(d cylinder.Design, s cylinder.Settings) (cylinder.Design, cylinder.Settings) {
	x := make([]float64, len(f.Params))
	for i, p := range f.Params {
		x[i] = p.Value
	}
	return apply(d, s, f.Params, x)
}

// apply sets the parameters x on a copy of the design and settings.
func apply(d cylinder.Design, s cylinder.Settings, ps []Param, x []float64) (cylinder.Design, cylinder.Settings) {
	for i, p := range ps {
		switch p.Name {
		case Recovery:
			d.Case.Recovery = x[i]
		case ForcedFactor:
			s.ForcedFactor = x[i]
		case LoadFactor:
			d.Load = d.Load.Scaled(x[i])
		}
	}
	return d, s
}

// modelFunc gives the residuals at the parameters x, (model + offset -
// measured)/sigma at each point, and which points have no equilibrium
// there.
type modelFunc func(x []float64) ([]float64, []bool, error)

// residuals are (model + offset - measured)/sigma at each point. A point
// whose set has no equilibrium counts from the search's cap (a large
// residual) and is marked capped: its temperature sits at the cap and no
// longer moves with the parameters.
func residuals(d cylinder.Design, s cylinder.Settings, pts []Point, ps []Param, x []float64) ([]float64, []bool, error) {
	dd, ss := apply(d, s, ps, x)
	extra := 0.0
	for i, p := range ps {
		if p.Name == Offset {
			extra = x[i]
		}
	}
	ss.TotalsOnly = true
	out := make([]float64, len(pts))
	capped := make([]bool, len(pts))
	for i, p := range pts {
		c := dd
		c.Case.Speed, c.Case.Ambient, c.Case.Pressure = p.Speed, p.Ambient, p.Pressure
		o, err := c.Evaluate(ss)
		if err != nil {
			return nil, nil, fmt.Errorf("point %d: %w", i+1, err)
		}
		r := o.Result.Head
		if p.Barrel {
			r = o.Result.Barrel
		}
		capped[i] = o.NoEquilibrium != nil && r.WallTemp >= cylinder.SaneWallLimit-1e-6
		out[i] = (r.WallTemp + p.Offset + extra - p.Temp) / sigma(p)
	}
	return out, capped, nil
}

// newlyCapped reports whether a point capped in b was not in a.
func newlyCapped(a, b []bool) bool {
	for i := range b {
		if b[i] && !a[i] {
			return true
		}
	}
	return false
}

func count(b []bool) int {
	n := 0
	for _, v := range b {
		if v {
			n++
		}
	}
	return n
}

// levenbergMarquardt minimises the sum of squared residuals within each
// parameter's bounds (steps projected onto the box), the Jacobian by
// central differences of 1e-4 of each parameter's range. A trial step that
// takes a point past its equilibrium is refused like one that raises the
// sum (the capped temperature no longer moves: the fit would stall there
// with a Jacobian of zero); a start at which a point has no equilibrium is
// replaced, when one exists, by the value on a grid of nine points (the
// eighths) of each
// parameter's range (one at a time) with the fewest such points and the
// least sum of squares. edged reports whether a step was refused for a
// point that lost its equilibrium.
func levenbergMarquardt(f modelFunc, x []float64, ps []Param) (fit Fit, edged bool, err error) {
	r, capped, err := f(x)
	if err != nil {
		return Fit{}, false, err
	}
	chi := dot(r, r)
	if count(capped) > 0 {
		for k := range x {
			for j := 0; j <= 8; j++ {
				y := append([]float64(nil), x...)
				y[k] = ps[k].Lo + (ps[k].Hi-ps[k].Lo)*float64(j)/8
				ry, cy, err := f(y)
				if err != nil {
					continue
				}
				if n, n0 := count(cy), count(capped); n < n0 || n == n0 && dot(ry, ry) < chi {
					x, r, capped, chi = y, ry, cy, dot(ry, ry)
				}
			}
		}
	}
	lambda := 1e-3
	n, m := len(r), len(x)
	var jac *mat.Dense
	it := 0
	for ; it < 100; it++ {
		if jac, err = jacobian(f, x, r, capped, ps); err != nil {
			return Fit{}, edged, err
		}
		if err := identifiable(jac, ps, x, capped); err != nil {
			return Fit{Params: ps}, edged, err
		}
		var jtj mat.Dense
		jtj.Mul(jac.T(), jac)
		g := mat.NewVecDense(m, nil)
		g.MulVec(jac.T(), mat.NewVecDense(n, r))
		improved := false
		for try := 0; try < 20; try++ {
			a := mat.DenseCopyOf(&jtj)
			for i := 0; i < m; i++ {
				a.Set(i, i, a.At(i, i)*(1+lambda))
			}
			var step mat.VecDense
			if err := step.SolveVec(a, g); err != nil {
				lambda *= 10
				continue
			}
			y := make([]float64, m)
			for i := range y {
				y[i] = math.Min(ps[i].Hi, math.Max(ps[i].Lo, x[i]-step.AtVec(i)))
			}
			ry, cy, err := f(y)
			if err == nil && newlyCapped(capped, cy) {
				edged = true
			} else if err == nil && dot(ry, ry) < chi {
				x, r, capped, chi = y, ry, cy, dot(ry, ry)
				lambda = math.Max(lambda/10, 1e-12)
				improved = true
				break
			}
			lambda *= 10
		}
		if !improved || math.Sqrt(dot(g.RawVector().Data, g.RawVector().Data)) < 1e-10 {
			break
		}
	}
	out := Fit{Chi2: chi, Iterations: it}
	for i := range ps {
		p := ps[i]
		p.Value = x[i]
		out.Params = append(out.Params, p)
	}
	out.Residuals = append(out.Residuals, r...)
	// standard errors: the covariance (J^T J)^-1, scaled by the residual
	// variance per degree of freedom when the points outnumber the
	// parameters (Numerical Recipes Sec. 15.4.2)
	var jtj, cov mat.Dense
	jtj.Mul(jac.T(), jac)
	if err := cov.Inverse(&jtj); err == nil {
		scale := 1.0
		if n > m {
			scale = math.Max(chi/float64(n-m), 1)
		}
		for i := range out.Params {
			out.Params[i].StdError = math.Sqrt(math.Max(cov.At(i, i), 0) * scale)
		}
	}
	// the points identify a parameter when they pin it to within a quarter
	// of its plausible range (one standard error; our criterion): the
	// recovery and the forced factor from two nearby speeds are each free
	// over several times their range
	for _, p := range out.Params {
		if !(p.StdError <= 0.25*(p.Hi-p.Lo)) && m > 1 {
			return out, edged, fmt.Errorf("%w: they leave the %s free (%.3g +- %.3g, against a plausible %.3g to %.3g); add a point at a road speed or load far from these, or fit fewer parameters",
				ErrNotIdentifiable, p.Name, p.Value, p.StdError, p.Lo, p.Hi)
		}
	}
	return out, edged, nil
}

// jacobian differentiates the residuals r at x by central differences of
// 1e-4 of each parameter's range (one-sided at a bound, and on the side
// where a point keeps its equilibrium when the other side loses it).
func jacobian(f modelFunc, x, r []float64, capped []bool, ps []Param) (*mat.Dense, error) {
	n := len(r)
	j := mat.NewDense(n, len(x), nil)
	for k := range x {
		h := 1e-4 * (ps[k].Hi - ps[k].Lo)
		lo, hi := append([]float64(nil), x...), append([]float64(nil), x...)
		lo[k] = math.Max(ps[k].Lo, x[k]-h)
		hi[k] = math.Min(ps[k].Hi, x[k]+h)
		rl, cl, err := f(lo)
		if err != nil {
			return nil, err
		}
		rh, ch, err := f(hi)
		if err != nil {
			return nil, err
		}
		switch {
		case newlyCapped(capped, ch) && !newlyCapped(capped, cl) && lo[k] < x[k]:
			rh, hi = r, append([]float64(nil), x...)
		case newlyCapped(capped, cl) && !newlyCapped(capped, ch) && hi[k] > x[k]:
			rl, lo = r, append([]float64(nil), x...)
		}
		for i := 0; i < n; i++ {
			j.Set(i, k, (rh[i]-rl[i])/(hi[k]-lo[k]))
		}
	}
	return j, nil
}

// identifiable refuses a parameter the points' temperatures do not move
// with at all (its column of the Jacobian, scaled by its plausible range,
// under 1e-6 of a point's uncertainty), and two or more parameters whose
// range-scaled columns are near-parallel (the smallest singular value
// under 1e-6 of the largest), naming those that the smallest singular
// vector mixes. A single parameter the temperatures move with is always
// identifiable from one point. A fit that is only weakly identified is
// refused after it converges (levenbergMarquardt).
func identifiable(j *mat.Dense, ps []Param, x []float64, capped []bool) error {
	n, m := j.Dims()
	s := mat.NewDense(n, m, nil)
	for k := 0; k < m; k++ {
		norm := 0.0
		for i := 0; i < n; i++ {
			s.Set(i, k, j.At(i, k)*(ps[k].Hi-ps[k].Lo))
			norm = math.Hypot(norm, s.At(i, k))
		}
		if !(norm >= 1e-6) {
			why := ""
			if c := count(capped); c > 0 {
				why = fmt.Sprintf(" (at this value the model finds no equilibrium below %.0f C at %d of the %d points, so their temperature stays at that cap)", cylinder.SaneWallLimit-273.15, c, n)
			}
			return fmt.Errorf("%w: the estimated temperature at these points does not move with the %s at %s%s, so no fit can find it; check the points and the design, or fit another parameter", ErrNotIdentifiable, ps[k].Name, num(x[k]), why)
		}
	}
	if m == 1 {
		return nil
	}
	var svd mat.SVD
	if !svd.Factorize(s, mat.SVDThin) {
		return fmt.Errorf("%w: the fit's matrix cannot be factorised", ErrNotIdentifiable)
	}
	v := svd.Values(nil)
	if v[len(v)-1] < 1e-6*v[0] {
		var vt mat.Dense
		svd.VTo(&vt)
		var names []string
		for k := 0; k < m; k++ {
			if math.Abs(vt.At(k, len(v)-1)) > 0.1 {
				names = append(names, ps[k].Name)
			}
		}
		return fmt.Errorf("%w: these points move the %s together, so no fit can tell them apart; add a point at another road speed or ambient, or fit fewer parameters", ErrNotIdentifiable, strings.Join(names, " and "))
	}
	return nil
}

func dot(a, b []float64) float64 {
	s := 0.0
	for i := range a {
		s += a[i] * b[i]
	}
	return s
}

// Narrow returns the band's spread sp as the fit leaves it: each fitted
// input's half-width narrowed to two standard errors (the recovery's
// absolute, the forced and load factors' relative to their value, the load
// factor on the cooling share); and, when the recovery is fitted, the inputs
// it has absorbed at the measured points (cooling share, thermal efficiency,
// head share and forced convection, unless fitted themselves) set to zero.
// Natural convection, conductivity and emissivity keep their half-widths.
// The offset belongs to the measuring place and narrows nothing. A fit
// of the model's own parameters (not the offset alone) anchors the
// air-side method it was made with, so the draw among methods
// (the model-form term) is switched off: the readings have measured what
// the spread between methods only guessed.
func (f Fit) Narrow(sp uncertainty.Spread) uncertainty.Spread {
	for _, p := range f.Params {
		switch p.Name {
		case Recovery, ForcedFactor, LoadFactor:
			sp.Methods = false
		}
		switch p.Name {
		case Recovery:
			sp.Recovery = 2 * p.StdError
			_, forced := f.Get(ForcedFactor)
			_, load := f.Get(LoadFactor)
			if !forced {
				sp.Forced = 0
			}
			if !load {
				sp.CoolShare = 0
			}
			sp.Thermal, sp.HeadShare = 0, 0
		case ForcedFactor:
			sp.Forced = 2 * p.StdError / p.Value
		case LoadFactor:
			sp.CoolShare = 2 * p.StdError / p.Value
		}
	}
	return sp
}
